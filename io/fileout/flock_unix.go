//go:build linux || darwin || freebsd || netbsd || openbsd || dragonfly

package fileout

import (
	"errors"
	"os"
	"strconv"
	"syscall"
)

// flockFile opens (or creates) the lock file lp and takes an exclusive
// flock on it without waiting. It returns ErrLocked, with the holder's
// process id when recorded, if another open file holds it.
func flockFile(lp string) (*os.File, int, error) {
	for try := 0; try < 8; try++ {
		f, err := os.OpenFile(lp, os.O_RDWR|os.O_CREATE, 0o644)
		if err != nil {
			return nil, 0, err
		}
		if err := syscall.Flock(int(f.Fd()), syscall.LOCK_EX|syscall.LOCK_NB); err != nil {
			pid := readPid(f)
			f.Close()
			if errors.Is(err, syscall.EWOULDBLOCK) {
				return nil, pid, ErrLocked
			}
			return nil, 0, err
		}
		// The holder before us may have removed the file after we opened
		// it: then this lock guards nothing; start again.
		fs, err1 := f.Stat()
		ps, err2 := os.Stat(lp)
		if err1 == nil && err2 == nil && os.SameFile(fs, ps) {
			f.Truncate(0)
			f.WriteAt([]byte(strconv.Itoa(os.Getpid())+"\n"), 0)
			return f, 0, nil
		}
		f.Close()
	}
	return nil, 0, errors.New("lock file keeps changing")
}
