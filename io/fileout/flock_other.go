//go:build !(linux || darwin || freebsd || netbsd || openbsd || dragonfly)

package fileout

import (
	"errors"
	"os"
)

// flockFile has no flock to use here: writers are not locked.
func flockFile(string) (*os.File, int, error) { return nil, 0, errors.New("no flock") }
