//go:build linux

package main

import (
	"encoding/json"
	"flag"
	"fmt"
	"os"
	"runtime"
	"syscall"
	"time"

	"github.com/netsteer/netsteer/io/netread"
	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural"
)

// threadCPU returns the CPU time used by the calling OS thread.
func threadCPU() time.Duration {
	var ru syscall.Rusage
	syscall.Getrusage(1, &ru) // RUSAGE_THREAD
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}

type timing struct {
	Wall float64 `json:"wall_s"`
	CPU  float64 `json:"cpu_s"`
}

// best runs f runs times and keeps the smallest wall and CPU times.
func best(runs int, f func()) timing {
	var t timing
	for i := 0; i < runs; i++ {
		c0, w0 := threadCPU(), time.Now()
		f()
		w, c := time.Since(w0).Seconds(), (threadCPU() - c0).Seconds()
		if i == 0 || w < t.Wall {
			t.Wall = w
		}
		if i == 0 || c < t.CPU {
			t.CPU = c
		}
	}
	return t
}

// stagesMain times the stages of the read-match-decompose pipeline on one
// network file, in wall time and in CPU time of the timing thread
// (getrusage RUSAGE_THREAD), which other work on a shared machine disturbs
// far less. compare.sh uses it for the matching ratios.
func stagesMain(args []string) {
	flag := flag.NewFlagSet("stages", flag.ExitOnError)
	runs := flag.Int("runs", 3, "repetitions of each stage (the fastest is kept)")
	flag.Parse(args)
	if flag.NArg() != 1 {
		fmt.Fprintln(os.Stderr, "usage: netsteer-bench stages [-runs N] FILE")
		os.Exit(2)
	}
	runtime.LockOSThread()
	var g *structural.Network
	out := map[string]any{}
	// Reading uses several goroutines: its CPU time here is the calling
	// thread's share only, so only its wall time is meaningful.
	out["read"] = best(1, func() {
		in, err := netread.ReadFile(flag.Arg(0), netread.Options{})
		if err != nil {
			fmt.Fprintln(os.Stderr, err)
			os.Exit(2)
		}
		g = in.Network
	})
	var m *matching.Matching
	out["match"] = best(*runs, func() { m = matching.Maximum(g.Out(), g.In()) })
	out["components"] = best(*runs, func() { structural.SCC(g.Out()) })
	out["nodes"], out["edges"], out["matching_size"] = g.N(), g.Edges(), m.Size
	json.NewEncoder(os.Stdout).Encode(out)
}
