package source

import (
	"bytes"
	"crypto/sha256"
	"errors"
	"io"
	"strings"
	"testing"
)

func TestDigest(t *testing.T) {
	data := bytes.Repeat([]byte("pump valve\n"), 1000)
	d := NewDigest(bytes.NewReader(data))
	io.CopyN(io.Discard, d, 100)
	if err := d.Drain(); err != nil {
		t.Fatal(err)
	}
	if d.Sum() != sha256.Sum256(data) || d.Size() != int64(len(data)) {
		t.Errorf("digest of %d bytes wrong", d.Size())
	}
}

func TestLineLimit(t *testing.T) {
	ok := strings.Repeat("x", 10) + "\n" + strings.Repeat("y", 10) + "\n"
	if b, err := io.ReadAll(LineLimit(strings.NewReader(ok), 10)); err != nil || string(b) != ok {
		t.Errorf("lines at the limit: %q, %v", b, err)
	}
	long := "ok\n" + strings.Repeat("z", 11) + "\nmore\n"
	b, err := io.ReadAll(LineLimit(strings.NewReader(long), 10))
	var lt *LineTooLong
	if !errors.As(err, &lt) || lt.Line != 2 || len(b) > 3+10 {
		t.Errorf("got %q, %v", b, err)
	}
}

func TestClip(t *testing.T) {
	for _, c := range []struct {
		in   string
		max  int
		want string
	}{
		{"short", 40, "short"},
		{strings.Repeat("a", 50), 40, strings.Repeat("a", 40) + "..."},
		{strings.Repeat("a", 39) + "ü", 40, strings.Repeat("a", 39) + "..."}, // not inside the two bytes of ü
	} {
		if got := Clip(c.in, c.max); got != c.want {
			t.Errorf("Clip(%q) = %q, want %q", c.in, got, c.want)
		}
	}
}
