//go:build !(linux || darwin || freebsd || netbsd || openbsd)

package main

import "os"

// terminalWidth returns 100: the width is only read from Unix terminals.
func terminalWidth(*os.File) int { return 100 }
