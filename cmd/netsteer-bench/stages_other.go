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

// scaleMain and runStageMain need /proc and getrusage, which only Linux
// gives here.
func scaleMain(args []string) {
	fmt.Fprintln(os.Stderr, "netsteer-bench scale: needs Linux (/proc/self/status, getrusage)")
	os.Exit(2)
}

func runStageMain(args []string) { scaleMain(args) }
