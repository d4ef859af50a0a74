package netread

import (
	"bufio"
	"bytes"
	"compress/gzip"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"github.com/netsteer/netsteer/structural"
)

// MaxNameBytes is the longest state name accepted.
const MaxNameBytes = 4096

// Format names an input format.
type Format string

// The formats understood by Read.
const (
	EdgeList     Format = "edges"
	MatrixMarket Format = "mtx"
	DOT          Format = "dot"
)

// Formats lists the accepted format names, for help texts.
var Formats = []Format{EdgeList, MatrixMarket, DOT}

// Error is a problem found in an input file.
type Error struct {
	File string
	Line int // 1-based; 0 when the problem is not tied to a line
	Msg  string
}

func (e *Error) Error() string {
	if e.Line > 0 {
		return fmt.Sprintf("%s:%d: %s", e.File, e.Line, e.Msg)
	}
	return fmt.Sprintf("%s: %s", e.File, e.Msg)
}

func errorf(file string, line int, format string, args ...any) *Error {
	return &Error{File: file, Line: line, Msg: fmt.Sprintf(format, args...)}
}

// Options control reading.
type Options struct {
	// Format forces a format; empty means by extension (.mtx; .dot, .gv;
	// anything else is an edge list), looking through a .gz suffix.
	Format Format
	// Build is passed to structural.Builder.Build.
	Build structural.BuildOptions
	// Weights keeps edge weights (the third column of an edge list, the
	// values of a Matrix Market file, the weight attribute in DOT).
	Weights bool
	// States names extra states that exist even with no edge (from a node
	// table, say). For Matrix Market files they must be indices 1..N.
	States []string
}

// FormatOf returns the format implied by a file name.
func FormatOf(name string) Format {
	name = strings.ToLower(strings.TrimSuffix(strings.ToLower(name), ".gz"))
	switch filepath.Ext(name) {
	case ".mtx":
		return MatrixMarket
	case ".dot", ".gv":
		return DOT
	}
	return EdgeList
}

// ParseFormat checks a format name given by a user.
func ParseFormat(s string) (Format, error) {
	for _, f := range Formats {
		if string(f) == s {
			return f, nil
		}
	}
	switch s {
	case "edgelist", "edge-list", "txt", "tsv", "csv":
		return EdgeList, nil
	case "matrix-market", "mm":
		return MatrixMarket, nil
	case "gv":
		return DOT, nil
	}
	return "", fmt.Errorf("netread: unknown format %q (want edges, mtx or dot)", s)
}

// ReadFile reads the network in path; "-" reads standard input.
func ReadFile(path string, opt Options) (*structural.Network, error) {
	if path == "-" {
		return Read(os.Stdin, "stdin", opt)
	}
	f, err := os.Open(path)
	if err != nil {
		return nil, &Error{File: path, Msg: strings.TrimPrefix(err.Error(), "open "+path+": ")}
	}
	defer f.Close()
	if st, err := f.Stat(); err == nil && st.IsDir() {
		return nil, &Error{File: path, Msg: "is a directory, not a network file"}
	}
	if opt.Format == "" {
		opt.Format = FormatOf(path)
	}
	return Read(f, path, opt)
}

// Read reads a network from r; file names the source in error messages.
// Without opt.Format the input is read as an edge list.
func Read(r io.Reader, file string, opt Options) (*structural.Network, error) {
	br, err := maybeGunzip(r, file)
	if err != nil {
		return nil, err
	}
	switch opt.Format {
	case MatrixMarket:
		return readMatrixMarket(br, file, opt)
	case DOT:
		return readDOT(br, file, opt)
	case EdgeList, "":
		b := structural.NewBuilder()
		if err := readEdgeList(br, file, b, opt.Weights); err != nil {
			return nil, err
		}
		return finish(b, file, opt)
	}
	return nil, &Error{File: file, Msg: fmt.Sprintf("unknown format %q", opt.Format)}
}

// finish adds the extra states and builds the network.
func finish(b *structural.Builder, file string, opt Options) (*structural.Network, error) {
	for _, s := range opt.States {
		if _, err := b.Intern([]byte(s)); err != nil {
			return nil, &Error{File: file, Msg: err.Error()}
		}
	}
	if b.States() == 0 {
		return nil, &Error{File: file, Msg: "empty network: no edges and no states"}
	}
	g, err := b.Build(opt.Build)
	if err != nil {
		return nil, &Error{File: file, Msg: strings.TrimPrefix(err.Error(), "structural: ")}
	}
	return g, nil
}

// gzipReadErr wraps decompression errors with the file name.
type gzipReader struct {
	r    io.Reader
	file string
}

func (g *gzipReader) Read(p []byte) (int, error) {
	n, err := g.r.Read(p)
	if err != nil && err != io.EOF {
		err = &Error{File: g.file, Msg: gzipMsg(err)}
	}
	return n, err
}

// gzipMsg describes a decompression error; a stream cut short says so.
func gzipMsg(err error) string {
	if err == io.ErrUnexpectedEOF {
		return "gzip: the compressed stream ends early (truncated file?)"
	}
	return "gzip: " + err.Error()
}

func maybeGunzip(r io.Reader, file string) (*bufio.Reader, error) {
	br := bufio.NewReaderSize(r, 1<<20)
	magic, _ := br.Peek(2)
	if len(magic) == 2 && magic[0] == 0x1f && magic[1] == 0x8b {
		zr, err := gzip.NewReader(br)
		if err != nil {
			return nil, &Error{File: file, Msg: gzipMsg(err)}
		}
		return bufio.NewReaderSize(&gzipReader{r: zr, file: file}, 1<<20), nil
	}
	return br, nil
}

// lineReader yields lines without their end-of-line bytes, counting them.
type lineReader struct {
	r    *bufio.Reader
	file string
	line int
	long []byte
	max  int
}

// next returns the next line, or io.EOF. The slice is valid until the next
// call.
func (l *lineReader) next() ([]byte, error) {
	l.line++
	s, err := l.r.ReadSlice('\n')
	if err == bufio.ErrBufferFull {
		l.long = append(l.long[:0], s...)
		for err == bufio.ErrBufferFull {
			if len(l.long) > l.max {
				return nil, errorf(l.file, l.line, "line longer than %d bytes", l.max)
			}
			s, err = l.r.ReadSlice('\n')
			l.long = append(l.long, s...)
		}
		s = l.long
	}
	if err != nil && err != io.EOF {
		var e *Error
		if errors.As(err, &e) {
			e.Line = l.line
			return nil, e
		}
		return nil, errorf(l.file, l.line, "%v", err)
	}
	if err == io.EOF && len(s) == 0 {
		return nil, io.EOF
	}
	s = bytes.TrimSuffix(s, []byte{'\n'})
	s = bytes.TrimSuffix(s, []byte{'\r'})
	if len(s) > l.max {
		return nil, errorf(l.file, l.line, "line longer than %d bytes", l.max)
	}
	return s, nil
}
