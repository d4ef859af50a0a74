// Package source holds what the io readers share about their raw input:
// a reader that hashes and counts the bytes read through it, a reader that
// bounds line length, and the clipping of echoed values in messages.
package source

import (
	"crypto/sha256"
	"fmt"
	"hash"
	"io"
	"unicode/utf8"
)

// Digest hashes (SHA-256) and counts the bytes read through it, so that
// what a reader parsed is certified exactly: standard input and FIFOs
// included, without reopening anything.
type Digest struct {
	r io.Reader
	h hash.Hash
	n int64
}

// NewDigest returns a Digest reading from r.
func NewDigest(r io.Reader) *Digest { return &Digest{r: r, h: sha256.New()} }

func (d *Digest) Read(p []byte) (int, error) {
	n, err := d.r.Read(p)
	if n > 0 {
		d.h.Write(p[:n])
		d.n += int64(n)
	}
	return n, err
}

// Sum returns the SHA-256 of the bytes read so far.
func (d *Digest) Sum() [32]byte {
	var s [32]byte
	d.h.Sum(s[:0])
	return s
}

// Size returns the number of bytes read so far.
func (d *Digest) Size() int64 { return d.n }

// Drain reads the rest of the input, so that Sum covers all of it.
func (d *Digest) Drain() error {
	_, err := io.Copy(io.Discard, d)
	return err
}

// LineTooLong is the error of a LineLimit reader.
type LineTooLong struct {
	Line int // 1-based
	Max  int
}

func (e *LineTooLong) Error() string {
	return fmt.Sprintf("line longer than %d bytes", e.Max)
}

// LineLimit returns a reader that fails with *LineTooLong as soon as a
// line (bytes between line feeds) exceeds max bytes, so that a file with
// no line breaks (/dev/zero, say) stops after max bytes whatever reads it.
func LineLimit(r io.Reader, max int) io.Reader { return &lineLimit{r: r, max: max, line: 1} }

type lineLimit struct {
	r    io.Reader
	max  int
	cur  int // bytes of the current line so far
	line int
	err  error
}

func (l *lineLimit) Read(p []byte) (int, error) {
	if l.err != nil {
		return 0, l.err
	}
	// Never hand out more than the rest of the allowance plus one line
	// break, so that the check fires before the caller buffers more.
	if room := l.max - l.cur + 1; len(p) > room && room > 0 {
		p = p[:room]
	}
	n, err := l.r.Read(p)
	for i := 0; i < n; i++ {
		if p[i] == '\n' {
			l.cur = 0
			l.line++
			continue
		}
		l.cur++
		if l.cur > l.max {
			l.err = &LineTooLong{Line: l.line, Max: l.max}
			return i, l.err
		}
	}
	return n, err
}

// Clip shortens s for an error message to at most max bytes (cut at a
// UTF-8 boundary), marking the cut with "...".
func Clip(s string, max int) string {
	if len(s) <= max {
		return s
	}
	cut := max
	for cut > 0 && !utf8.RuneStart(s[cut]) {
		cut--
	}
	return s[:cut] + "..."
}
