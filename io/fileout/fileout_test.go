package fileout

import (
	"errors"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// A failed write names the file asked for, not the temporary one, on one
// line, and leaves an existing file as it was.
func TestWriteErrors(t *testing.T) {
	dir := t.TempDir()
	sub := filepath.Join(dir, "sub")
	if err := os.Mkdir(sub, 0o755); err != nil {
		t.Fatal(err)
	}
	plain := filepath.Join(dir, "plain")
	if err := os.WriteFile(plain, []byte("old"), 0o644); err != nil {
		t.Fatal(err)
	}
	fill := func(w io.Writer) error { _, err := io.WriteString(w, "new"); return err }
	for _, tc := range []struct {
		path, want string
	}{
		{filepath.Join(dir, "missing", "out.csv"), "out.csv: cannot write: directory " + filepath.Join(dir, "missing") + " does not exist"},
		{sub, sub + ": is a directory, not a file"},
		{filepath.Join(plain, "out.csv"), "cannot write: " + plain + " is not a directory"},
	} {
		err := Write(tc.path, nil, fill)
		if err == nil {
			t.Errorf("Write(%s): got no error, want %q", tc.path, tc.want)
			continue
		}
		if msg := err.Error(); !strings.Contains(msg, tc.want) || strings.Contains(msg, ".tmp") || strings.Contains(msg, "\n") {
			t.Errorf("Write(%s): got %q, want a line holding %q and no temporary name", tc.path, msg, tc.want)
		}
	}
	// A fill that fails leaves the old file.
	boom := errors.New("boom")
	if err := Write(plain, nil, func(w io.Writer) error { io.WriteString(w, "partial"); return boom }); err != boom {
		t.Fatalf("got %v, want the fill's error", err)
	}
	if b, _ := os.ReadFile(plain); string(b) != "old" {
		t.Errorf("after a failed write the file holds %q, want %q", b, "old")
	}
	if ents, _ := os.ReadDir(dir); len(ents) != 2 {
		t.Errorf("after the failures the directory holds %d entries, want 2 (no temporary files left)", len(ents))
	}
}

// TestSamePath checks SamePath on names of one file spelled differently,
// existing or not, and on different files.
func TestSamePath(t *testing.T) {
	dir := t.TempDir()
	t.Chdir(dir)
	if err := os.WriteFile("a.html", nil, 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.Symlink("a.html", "link.html"); err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		a, b string
		want bool
	}{
		{"a.html", "a.html", true},
		{"a.html", "./a.html", true},
		{"a.html", filepath.Join(dir, "a.html"), true},
		{"link.html", "a.html", true},       // one file, by the symbolic link
		{"new.pdf", "sub/../new.pdf", true}, // neither exists yet
		{"new.pdf", "new.html", false},
		{"a.html", "new.html", false},
		{"-", "-", false},
		{"", "", false},
	} {
		if got := SamePath(c.a, c.b); got != c.want {
			t.Errorf("SamePath(%q, %q) = %v, want %v", c.a, c.b, got, c.want)
		}
	}
}
