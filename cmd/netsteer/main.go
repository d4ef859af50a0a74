package main

import "os"

func main() {
	e := &env{
		Stdin:       os.Stdin,
		Stdout:      os.Stdout,
		Stderr:      os.Stderr,
		StderrIsTTY: isTerminal(os.Stderr),
		Width:       terminalWidth(os.Stdout),
	}
	os.Exit(run(e, os.Args[1:]))
}

// isTerminal reports whether f is a character device (a terminal).
func isTerminal(f *os.File) bool {
	st, err := f.Stat()
	return err == nil && st.Mode()&os.ModeCharDevice != 0
}
