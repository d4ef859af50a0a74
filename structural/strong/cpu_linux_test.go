//go:build linux

package strong

import (
	"syscall"
	"time"
)

// threadCPU returns the CPU time the calling thread has used, so that
// benchmarks on a shared machine can report it beside the wall time. The
// caller locks its goroutine to the thread.
func threadCPU() time.Duration {
	var ru syscall.Rusage
	const rusageThread = 1 // RUSAGE_THREAD
	if err := syscall.Getrusage(rusageThread, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}
