//go:build !linux

package main

import (
	"fmt"
	"os"
)

// stagesMain needs per-thread CPU times, which only Linux gives here.
func stagesMain(args []string) {
	fmt.Fprintln(os.Stderr, "netsteer-bench stages: needs Linux (getrusage RUSAGE_THREAD)")
	os.Exit(2)
}
