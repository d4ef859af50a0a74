//go:build unix

package netread

import "syscall"

// processCPU returns the CPU time (user and system) of this process so far,
// in nanoseconds: on a shared machine it varies far less than wall time.
func processCPU() int64 {
	var ru syscall.Rusage
	if syscall.Getrusage(syscall.RUSAGE_SELF, &ru) != nil {
		return 0
	}
	return ru.Utime.Nano() + ru.Stime.Nano()
}
