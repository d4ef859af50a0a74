// Package fileout writes output files safely: the content goes to a
// temporary file beside the target, which is renamed over the target only
// when everything was written, so a failure never destroys what was there.
package fileout

import (
	"fmt"
	"io"
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
	f, err := os.CreateTemp(dir, "."+filepath.Base(path)+".tmp*")
	if err != nil {
		return fmt.Errorf("fileout: %w", err)
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
		return fmt.Errorf("fileout: %w", err)
	}
	if err := f.Close(); err != nil {
		return fmt.Errorf("fileout: %w", err)
	}
	// Keep the permissions an existing file had; new files get 0644.
	mode := os.FileMode(0o644)
	if st, err := os.Stat(path); err == nil {
		mode = st.Mode().Perm()
	}
	if err := os.Chmod(tmp, mode); err != nil {
		return fmt.Errorf("fileout: %w", err)
	}
	if err := os.Rename(tmp, path); err != nil {
		return fmt.Errorf("fileout: %w", err)
	}
	ok = true
	return nil
}
