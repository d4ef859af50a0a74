// Package fileout writes output files safely.
//
// A regular file (new or existing) is written to a temporary file beside
// it, which is renamed over the target only when everything was written,
// so a failure never destroys what was there; permissions of an existing
// file are kept, a read-only one is refused, and a symbolic link is
// followed (the file it points to is replaced, the link kept). Anything
// else that exists (a device such as /dev/null or /dev/full, /dev/stdout,
// a FIFO) is written in place: it is never renamed over.
//
// Errors name the file asked for, never the temporary one, a full disk
// included. While a write is in progress, SIGINT and SIGTERM remove the
// temporary file and then end the process as the signal would have.
//
// Writers of one target exclude each other: Write holds an advisory lock
// (flock on a lock file beside the target, where the system has flock)
// while it writes, and Lock holds it for longer, so that a second process
// writing the same output is refused with a clear message. SameFile tells
// whether an output is one of the inputs (device and inode, after
// following symbolic links, so hard links count too).
package fileout

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"sync"
)

// Write creates path by calling fill with a writer on a temporary file in
// the same directory, then renaming it; see the package comment. "-" or ""
// writes to stdout instead.
func Write(path string, stdout io.Writer, fill func(w io.Writer) error) error {
	if path == "-" || path == "" {
		return fill(stdout)
	}
	target := path
	st, err := os.Stat(path) // follows links
	switch {
	case err == nil && st.IsDir():
		return fmt.Errorf("%s: is a directory, not a file", path)
	case err == nil && !st.Mode().IsRegular():
		return writeInPlace(path, fill)
	case err == nil:
		if t, err := filepath.EvalSymlinks(path); err == nil {
			target = t
		}
		if err := checkWritable(path, target, st); err != nil {
			return err
		}
	default:
		st = nil // missing (or its directory is): creating says why
	}
	lk, err := lockFor(path, target)
	if err != nil {
		return err
	}
	defer lk.Unlock()
	dir := filepath.Dir(target)
	f, err := os.CreateTemp(dir, "."+filepath.Base(target)+".tmp*")
	if err != nil {
		return createError(path, dir, err)
	}
	tmp := f.Name()
	forget := register(tmp)
	ok := false
	defer func() {
		forget()
		if !ok {
			f.Close()
			os.Remove(tmp)
		}
	}()
	tw := &targetWriter{w: f, path: path}
	if err := fill(tw); err != nil {
		if tw.err != nil {
			return tw.err
		}
		return err
	}
	if tw.err != nil {
		return tw.err
	}
	if err := f.Sync(); err != nil {
		return writeError(path, err)
	}
	if err := f.Close(); err != nil {
		return writeError(path, err)
	}
	// Keep the permissions an existing file had; new files get 0644.
	mode := os.FileMode(0o644)
	if st != nil {
		mode = st.Mode().Perm()
	}
	if err := os.Chmod(tmp, mode); err != nil {
		return writeError(path, err)
	}
	if interrupted(tmp) {
		return fmt.Errorf("%s: not written: interrupted", path)
	}
	if err := os.Rename(tmp, target); err != nil {
		return writeError(path, err)
	}
	ok = true
	return nil
}

// checkWritable refuses an existing file that is read-only: no write
// permission bit at all (which root would ignore), or one this process may
// not open for writing.
func checkWritable(path, target string, st fs.FileInfo) error {
	if st.Mode().Perm()&0o222 == 0 {
		return fmt.Errorf("%s: cannot write: the file is read-only (mode %v); not replaced", path, st.Mode().Perm())
	}
	f, err := os.OpenFile(target, os.O_WRONLY, 0)
	if err != nil {
		if errors.Is(err, fs.ErrPermission) {
			return fmt.Errorf("%s: cannot write: permission denied; not replaced", path)
		}
		return writeError(path, err)
	}
	return f.Close()
}

// writeInPlace writes to an existing file that is not a regular file.
func writeInPlace(path string, fill func(io.Writer) error) error {
	f, err := os.OpenFile(path, os.O_WRONLY, 0)
	if err != nil {
		return writeError(path, err)
	}
	tw := &targetWriter{w: f, path: path}
	err = fill(tw)
	if tw.err != nil {
		err = tw.err
	}
	if cerr := f.Close(); err == nil && cerr != nil {
		err = writeError(path, cerr)
	}
	return err
}

// targetWriter reports write errors (a full disk, say) under the target's
// name and remembers the first.
type targetWriter struct {
	w    io.Writer
	path string
	err  error
}

func (t *targetWriter) Write(p []byte) (int, error) {
	if t.err != nil {
		return 0, t.err
	}
	n, err := t.w.Write(p)
	if err != nil {
		t.err = writeError(t.path, err)
	}
	return n, t.err
}

// createError explains why no file can be made in dir, naming the file the
// user asked for rather than the temporary one.
func createError(path, dir string, err error) error {
	switch st, serr := os.Stat(dir); {
	case errors.Is(serr, fs.ErrNotExist):
		return fmt.Errorf("%s: cannot write: directory %s does not exist", path, dir)
	case serr == nil && !st.IsDir():
		return fmt.Errorf("%s: cannot write: %s is not a directory", path, dir)
	case errors.Is(err, fs.ErrPermission):
		return fmt.Errorf("%s: cannot write: permission denied in %s", path, dir)
	}
	return writeError(path, err)
}

// writeError reports err for path without the temporary file's name.
func writeError(path string, err error) error {
	var pe *fs.PathError
	var le *os.LinkError
	switch {
	case errors.As(err, &pe):
		err = pe.Err
	case errors.As(err, &le):
		err = le.Err
	}
	return fmt.Errorf("%s: cannot write: %w", path, err)
}

// SameFile returns the first of inputs that is the same file as out
// (device and inode after following symbolic links), or "" when none is or
// out does not exist. "-" and "" are skipped.
func SameFile(out string, inputs ...string) string {
	if out == "-" || out == "" {
		return ""
	}
	so, err := os.Stat(out)
	if err != nil {
		return ""
	}
	for _, in := range inputs {
		if in == "-" || in == "" {
			continue
		}
		if si, err := os.Stat(in); err == nil && os.SameFile(so, si) {
			return in
		}
	}
	return ""
}

// SamePath reports whether a and b name one file: the same file when both
// exist, else the same absolute path once cleaned (a file about to be
// written twice). "-" and "" name no file.
func SamePath(a, b string) bool {
	if a == "-" || a == "" || b == "-" || b == "" {
		return false
	}
	if SameFile(a, b) != "" {
		return true
	}
	pa, errA := filepath.Abs(a)
	pb, errB := filepath.Abs(b)
	return errA == nil && errB == nil && pa == pb
}

// The registry of temporary files being written, removed on SIGINT or
// SIGTERM (see signal.go).
var temps = struct {
	sync.Mutex
	files map[string]bool // path -> removed by a signal
}{files: map[string]bool{}}

// register records a temporary file and returns the function that
// forgets it.
func register(tmp string) func() {
	temps.Lock()
	defer temps.Unlock()
	if len(temps.files) == 0 {
		watchSignals()
	}
	temps.files[tmp] = false
	return func() {
		temps.Lock()
		defer temps.Unlock()
		delete(temps.files, tmp)
		if len(temps.files) == 0 {
			unwatchSignals()
		}
	}
}

// interrupted reports whether a signal removed tmp.
func interrupted(tmp string) bool {
	temps.Lock()
	defer temps.Unlock()
	return temps.files[tmp]
}

// cleanup removes every registered temporary file.
func cleanup() {
	temps.Lock()
	defer temps.Unlock()
	for tmp := range temps.files {
		os.Remove(tmp)
		temps.files[tmp] = true
	}
}
