//go:build linux || darwin || freebsd || netbsd || openbsd

package main

import (
	"os"

	"golang.org/x/sys/unix"
)

// terminalWidth returns the width of the terminal f is, or 100 when f is
// not a terminal.
func terminalWidth(f *os.File) int {
	if ws, err := unix.IoctlGetWinsize(int(f.Fd()), unix.TIOCGWINSZ); err == nil && ws.Col >= 40 {
		return int(ws.Col)
	}
	return 100
}
