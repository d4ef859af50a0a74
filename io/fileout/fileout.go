// Package fileout writes output files safely: the content goes to a
// temporary file beside the target, which is renamed over the target only
// when everything was written, so a failure never destroys what was there.
package fileout

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
)

// Write creates path by calling fill with a writer on a temporary file in
// the same directory, then renaming it. "-" writes to stdout instead.
func Write(path string, stdout io.Writer, fill func(w io.Writer) error) error {
	if path == "-" || path == "" {
		return fill(stdout)
	}
	dir := filepath.Dir(path)
	if st, err := os.Stat(path); err == nil && st.IsDir() {
		return fmt.Errorf("%s: is a directory, not a file", path)
	}
	f, err := os.CreateTemp(dir, "."+filepath.Base(path)+".tmp*")
	if err != nil {
		return createError(path, dir, err)
	}
	tmp := f.Name()
	ok := false
	defer func() {
		if !ok {
			f.Close()
			os.Remove(tmp)
		}
	}()
	if err := fill(f); err != nil {
		return err
	}
	if err := f.Sync(); err != nil {
		return writeError(path, err)
	}
	if err := f.Close(); err != nil {
		return writeError(path, err)
	}
	// Keep the permissions an existing file had; new files get 0644.
	mode := os.FileMode(0o644)
	if st, err := os.Stat(path); err == nil {
		mode = st.Mode().Perm()
	}
	if err := os.Chmod(tmp, mode); err != nil {
		return writeError(path, err)
	}
	if err := os.Rename(tmp, path); err != nil {
		return writeError(path, err)
	}
	ok = true
	return nil
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
