package fileout

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"sync"
)

// ErrLocked is wrapped by the error of a write refused because another
// process is writing the same target.
var ErrLocked = errors.New("another process is writing this file")

// Lock is the advisory lock of a target's writers.
type Lock struct {
	key    string
	forget func()
}

// held counts the locks this process holds, by target, so that Write
// within a Lock does not refuse its own process.
var held = struct {
	sync.Mutex
	n     map[string]int
	files map[string]*os.File
}{n: map[string]int{}, files: map[string]*os.File{}}

// LockFile takes the lock of path's writers until Unlock: a second process's
// Write or Lock of the same path is refused (where the system has flock;
// elsewhere Lock always succeeds). "-" and "" are not locked.
func LockFile(path string) (*Lock, error) {
	if path == "-" || path == "" {
		return &Lock{}, nil
	}
	target := path
	if t, err := filepath.EvalSymlinks(path); err == nil {
		target = t
	}
	return lockFor(path, target)
}

// lockFor locks target (path as the user named it, for messages).
func lockFor(path, target string) (*Lock, error) {
	abs, err := filepath.Abs(target)
	if err != nil {
		abs = target
	}
	held.Lock()
	defer held.Unlock()
	if held.n[abs] > 0 {
		held.n[abs]++
		return &Lock{key: abs}, nil
	}
	lp := filepath.Join(filepath.Dir(abs), "."+filepath.Base(abs)+".lock")
	f, pid, err := flockFile(lp)
	switch {
	case errors.Is(err, ErrLocked):
		who := ""
		if pid > 0 {
			who = " (process " + strconv.Itoa(pid) + ")"
		}
		return nil, fmt.Errorf("%s: cannot write: another process%s is writing it; try again when it is done: %w", path, who, ErrLocked)
	case err != nil:
		// No lock where the directory refuses a lock file; the write
		// itself will say why, if it fails too.
		f = nil
	}
	held.n[abs] = 1
	l := &Lock{key: abs}
	if f != nil {
		held.files[abs] = f
		// A signal that ends the process during a write removes the
		// lock file too.
		l.forget = register(lp)
	}
	return l, nil
}

// Unlock releases the lock.
func (l *Lock) Unlock() error {
	if l == nil || l.key == "" {
		return nil
	}
	held.Lock()
	defer held.Unlock()
	held.n[l.key]--
	if held.n[l.key] > 0 {
		return nil
	}
	delete(held.n, l.key)
	f := held.files[l.key]
	delete(held.files, l.key)
	l.key = ""
	if f == nil {
		return nil
	}
	// Remove the lock file while holding the lock: a waiter that opened
	// it sees the path gone and tries again (see flockFile).
	os.Remove(f.Name())
	if l.forget != nil {
		l.forget()
	}
	return f.Close()
}

// readPid reads the process id a lock file records.
func readPid(f *os.File) int {
	b := make([]byte, 32)
	n, _ := f.ReadAt(b, 0)
	pid, _ := strconv.Atoi(strings.TrimSpace(string(b[:n])))
	return pid
}
