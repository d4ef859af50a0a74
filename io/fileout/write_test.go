//go:build linux

package fileout

import (
	"errors"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

func fillWith(s string) func(io.Writer) error {
	return func(w io.Writer) error { _, err := io.WriteString(w, s); return err }
}

// Devices are written in place, never renamed over (issue 11: as root,
// -o /dev/null became a regular file); a write error on /dev/full names
// /dev/full.
func TestDevicesInPlace(t *testing.T) {
	if err := Write("/dev/null", nil, fillWith("x")); err != nil {
		t.Fatal(err)
	}
	st, err := os.Stat("/dev/null")
	if err != nil || st.Mode()&os.ModeCharDevice == 0 {
		t.Fatalf("/dev/null is now %v (%v)", st.Mode(), err)
	}
	if _, err := os.Stat("/dev/full"); err == nil {
		err := Write("/dev/full", nil, fillWith(strings.Repeat("x", 1<<16)))
		if err == nil || !strings.HasPrefix(err.Error(), "/dev/full: cannot write: no space left on device") {
			t.Errorf("got %v", err)
		}
	}
}

// A FIFO is written in place and stays a FIFO.
func TestFIFOInPlace(t *testing.T) {
	p := filepath.Join(t.TempDir(), "pipe")
	if err := syscall.Mkfifo(p, 0o644); err != nil {
		t.Skip("no mkfifo:", err)
	}
	got := make(chan string)
	go func() {
		b, _ := os.ReadFile(p)
		got <- string(b)
	}()
	if err := Write(p, nil, fillWith("through the pipe")); err != nil {
		t.Fatal(err)
	}
	if s := <-got; s != "through the pipe" {
		t.Errorf("read %q", s)
	}
	if st, err := os.Lstat(p); err != nil || st.Mode()&os.ModeNamedPipe == 0 {
		t.Errorf("the FIFO is now %v", st.Mode())
	}
}

// A read-only file is refused and kept; a write error inside fill names
// the target, not the temporary file; a symbolic link is followed and
// kept.
func TestReadOnlyAndLinks(t *testing.T) {
	dir := t.TempDir()
	ro := filepath.Join(dir, "ro.txt")
	os.WriteFile(ro, []byte("keep"), 0o444)
	err := Write(ro, nil, fillWith("new"))
	if err == nil || !strings.Contains(err.Error(), "ro.txt: cannot write: the file is read-only") {
		t.Errorf("got %v", err)
	}
	if b, _ := os.ReadFile(ro); string(b) != "keep" {
		t.Errorf("read-only file now holds %q", b)
	}
	tw := &targetWriter{w: failWriter{}, path: "out.csv"}
	if _, err := tw.Write([]byte("x")); err == nil || err.Error() != "out.csv: cannot write: no space left on device" {
		t.Errorf("got %v", err)
	}
	real := filepath.Join(dir, "real.txt")
	link := filepath.Join(dir, "link.txt")
	os.WriteFile(real, []byte("old"), 0o600)
	if err := os.Symlink(real, link); err != nil {
		t.Fatal(err)
	}
	if err := Write(link, nil, fillWith("via link")); err != nil {
		t.Fatal(err)
	}
	b, _ := os.ReadFile(real)
	st, _ := os.Lstat(link)
	rs, _ := os.Stat(real)
	if string(b) != "via link" || st.Mode()&os.ModeSymlink == 0 || rs.Mode().Perm() != 0o600 {
		t.Errorf("real holds %q, link is %v, mode %v", b, st.Mode(), rs.Mode().Perm())
	}
	if ents, _ := os.ReadDir(dir); len(ents) != 3 {
		t.Errorf("directory holds %d entries, want 3 (no temporary or lock files)", len(ents))
	}
}

type failWriter struct{}

func (failWriter) Write([]byte) (int, error) {
	return 0, &os.PathError{Op: "write", Path: "/x/.out.csv.tmp123", Err: syscall.ENOSPC}
}

// SameFile catches the same file by another name: a hard link or a
// symbolic link.
func TestSameFile(t *testing.T) {
	dir := t.TempDir()
	a := filepath.Join(dir, "net.edges")
	os.WriteFile(a, []byte("a b\n"), 0o644)
	hard := filepath.Join(dir, "hard.edges")
	soft := filepath.Join(dir, "soft.edges")
	other := filepath.Join(dir, "other.edges")
	os.WriteFile(other, []byte("a b\n"), 0o644)
	if err := os.Link(a, hard); err != nil {
		t.Fatal(err)
	}
	if err := os.Symlink(a, soft); err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		out  string
		ins  []string
		want string
	}{
		{hard, []string{other, a}, a},
		{soft, []string{a}, a},
		{a, []string{"-", soft}, soft},
		{other, []string{a, hard}, ""},
		{filepath.Join(dir, "new.txt"), []string{a}, ""},
		{"-", []string{a}, ""},
	} {
		if got := SameFile(c.out, c.ins...); got != c.want {
			t.Errorf("SameFile(%s, %v) = %q, want %q", c.out, c.ins, got, c.want)
		}
	}
}

// helper modes of the test binary, for the tests that need a second
// process.
func TestMain(m *testing.M) {
	switch os.Getenv("FILEOUT_HELPER") {
	case "hold":
		// Hold the lock of the named file until stdin closes.
		l, err := LockFile(os.Getenv("FILEOUT_PATH"))
		if err != nil {
			os.Stdout.WriteString("error " + err.Error() + "\n")
			os.Exit(1)
		}
		os.Stdout.WriteString("locked\n")
		io.Copy(io.Discard, os.Stdin)
		l.Unlock()
		os.Exit(0)
	case "block":
		// Start a write that never ends.
		Write(os.Getenv("FILEOUT_PATH"), nil, func(w io.Writer) error {
			io.WriteString(w, "partial")
			os.Stdout.WriteString("writing\n")
			select {}
		})
		os.Exit(0)
	}
	os.Exit(m.Run())
}

// helper starts the test binary in a helper mode and waits for its first
// line.
func helper(t *testing.T, mode, path string) (*exec.Cmd, io.WriteCloser, string) {
	t.Helper()
	cmd := exec.Command(os.Args[0], "-test.run=^$")
	cmd.Env = append(os.Environ(), "FILEOUT_HELPER="+mode, "FILEOUT_PATH="+path)
	in, _ := cmd.StdinPipe()
	out, _ := cmd.StdoutPipe()
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	buf := make([]byte, 256)
	n, _ := out.Read(buf)
	return cmd, in, strings.TrimSpace(string(buf[:n]))
}

// A second process writing the same target is refused while the first
// holds it (issue 11: two sweeps on one -o lost rows), and can write once
// it is done.
func TestLockRefusesSecondWriter(t *testing.T) {
	p := filepath.Join(t.TempDir(), "rows.csv")
	cmd, in, first := helper(t, "hold", p)
	if first != "locked" {
		t.Fatalf("helper said %q", first)
	}
	err := Write(p, nil, fillWith("mine"))
	if !errors.Is(err, ErrLocked) || !strings.Contains(err.Error(), "rows.csv: cannot write: another process (process ") {
		t.Errorf("got %v, want a refusal naming the other process", err)
	}
	in.Close()
	cmd.Wait()
	if err := Write(p, nil, fillWith("mine")); err != nil {
		t.Errorf("after the other process: %v", err)
	}
	// In one process, a held lock does not refuse its own writes.
	l, err := LockFile(p)
	if err != nil {
		t.Fatal(err)
	}
	if err := Write(p, nil, fillWith("again")); err != nil {
		t.Errorf("own lock: %v", err)
	}
	l.Unlock()
}

// SIGINT and SIGTERM during a write remove the temporary file (and the
// lock file) and end the process by the signal.
func TestSignalRemovesTemporary(t *testing.T) {
	for _, s := range []syscall.Signal{syscall.SIGINT, syscall.SIGTERM} {
		dir := t.TempDir()
		p := filepath.Join(dir, "out.json")
		cmd, _, first := helper(t, "block", p)
		if first != "writing" {
			t.Fatalf("helper said %q", first)
		}
		if ents, _ := os.ReadDir(dir); len(ents) != 2 {
			t.Fatalf("while writing: %d entries, want the temporary and the lock file", len(ents))
		}
		cmd.Process.Signal(s)
		err := cmd.Wait()
		var ee *exec.ExitError
		if !errors.As(err, &ee) {
			t.Fatalf("%v: helper ended with %v", s, err)
		}
		if ws, ok := ee.Sys().(syscall.WaitStatus); !ok || !ws.Signaled() || ws.Signal() != s {
			t.Errorf("%v: helper ended with %v, want death by the signal", s, err)
		}
		deadline := time.Now().Add(2 * time.Second)
		for {
			ents, _ := os.ReadDir(dir)
			if len(ents) == 0 {
				break
			}
			if time.Now().After(deadline) {
				t.Errorf("%v: %d files left behind (%s...)", s, len(ents), ents[0].Name())
				break
			}
			time.Sleep(20 * time.Millisecond)
		}
	}
}
