package netread

import (
	"bufio"
	"bytes"
	"compress/gzip"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"slices"
	"strings"

	"github.com/netsteer/netsteer/io/internal/source"
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
	GraphML      Format = "graphml"
	GML          Format = "gml"
	Pajek        Format = "pajek"
	NodeLinkJSON Format = "json"
)

// Formats lists the accepted format names, for help texts.
var Formats = []Format{EdgeList, MatrixMarket, DOT, GraphML, GML, Pajek, NodeLinkJSON}

// Error is a problem found in an input file. It prints as "FILE:LINE:
// message" (or "FILE: message" when no line is at fault).
type Error struct {
	File string
	Line int // 1-based; 0 when the problem is not tied to a line
	Msg  string
	// Err is the cause when there is one (an *fs.PathError for a file
	// that cannot be opened, say), so that errors.Is(err, fs.ErrNotExist)
	// works; nil otherwise.
	Err error
	// edge is 1 + the index of the edge a *structural.WeightError is
	// about, when a second pass can find its line; 0 otherwise.
	edge int64
}

// errLocated ends a second pass at the edge sought (see Options.locate).
var errLocated = errors.New("netread: edge located")

// located reports whether edge k (0-based, in the order added to b) is the
// one opt.locate seeks: the next edge added when b holds k edges.
func located(b *structural.Builder, opt Options) bool {
	return opt.locate > 0 && int64(b.Edges()) == opt.locate-1
}

func (e *Error) Error() string {
	msg := e.Msg
	if msg == "" && e.Err != nil {
		msg = e.Err.Error()
	}
	if e.Line > 0 {
		return fmt.Sprintf("%s:%d: %s", e.File, e.Line, msg)
	}
	return fmt.Sprintf("%s: %s", e.File, msg)
}

// Unwrap returns the cause.
func (e *Error) Unwrap() error { return e.Err }

func errorf(file string, line int, format string, args ...any) *Error {
	return &Error{File: file, Line: line, Msg: fmt.Sprintf(format, args...)}
}

// Options control reading.
type Options struct {
	// Format forces a format. Empty means: by content when the content
	// says (a Matrix Market banner, a DOT graph, GraphML, GML, Pajek or
	// node-link JSON; with Columns or Separator set, such content is an
	// error), else an edge list or table when Columns or Separator is
	// set, else by the file name's extension (looking through a .gz
	// suffix; see FormatOf), else an edge list.
	Format Format
	// Build is passed to structural.Builder.Build.
	Build structural.BuildOptions
	// Weights keeps edge weights (the third column of an edge list, the
	// values of a Matrix Market file, the WeightKey attribute of DOT,
	// GraphML, GML and node-link JSON, the value on a Pajek arc).
	Weights bool
	// WeightKey names the edge attribute that holds the weight in DOT,
	// GraphML (the key's attr.name), GML and node-link JSON; empty means
	// "weight".
	WeightKey string
	// States names extra states that exist even with no edge (from a node
	// table, say). For Matrix Market files they must be indices 1..N.
	States []string
	// StatesFrom, when not nil, gives more such states: it is called once,
	// after the edges are read (before them for Matrix Market files), so
	// that a caller can read a node table while the network is read. Its
	// error is returned as it is.
	StatesFrom func() ([]string, error)
	// Columns selects the source, target and weight columns of a
	// delimited table (edge lists only); nil keeps the plain edge-list
	// format. See Columns.
	Columns *Columns
	// Separator sets the field separator of an edge list or table; the
	// zero value detects it (see Separator).
	Separator Separator
	// MaxInflateRatio bounds gzip decompression: reading stops with an
	// error once the decompressed data exceed InflateAllowance bytes and
	// this many times the compressed bytes read so far. 0 means
	// DefaultMaxInflateRatio; a negative value removes the bound.
	MaxInflateRatio float64
	// Stdin is what the path "-" reads. nil means os.Stdin.
	Stdin io.Reader
	// locate, when > 0, makes the edge-list and Matrix Market readers
	// stop with errLocated at the line of edge locate-1 (in the order
	// edges are added to the Builder): a second pass that finds the line
	// of an edge Build refused.
	locate int64
}

// Input is a network as read, with what the file said besides the edges
// and a digest of the bytes it came from.
type Input struct {
	Network *structural.Network
	// Format is the format actually read: forced by Options.Format,
	// recognised by content, or implied by the extension.
	Format Format
	// Labels holds a display label per state index ("" where none), from
	// DOT label attributes, GraphML, GML and node-link JSON label data or
	// Pajek vertex labels that are not used as names; nil when the file
	// has none.
	Labels []string
	// Groups holds a group per state index likewise (DOT, GraphML, GML
	// and node-link JSON "group" attributes); nil when the file has none.
	Groups []string
	// SHA256 is the digest of the bytes read, before decompression: the
	// whole file (or standard input) on success.
	SHA256 [32]byte
	// Size is the number of bytes read, before decompression.
	Size int64
}

// FormatOf returns the format implied by a file name: .mtx Matrix Market;
// .dot and .gv DOT; .graphml and .xml GraphML; .gml GML; .net and .paj
// Pajek; .json node-link JSON; anything else an edge list. A .gz suffix
// is looked through.
func FormatOf(name string) Format {
	name = strings.TrimSuffix(strings.ToLower(name), ".gz")
	switch filepath.Ext(name) {
	case ".mtx":
		return MatrixMarket
	case ".dot", ".gv":
		return DOT
	case ".graphml", ".xml":
		return GraphML
	case ".gml":
		return GML
	case ".net", ".paj":
		return Pajek
	case ".json":
		return NodeLinkJSON
	}
	return EdgeList
}

// ParseFormat checks a format name given by a user, in any case.
func ParseFormat(s string) (Format, error) {
	s = strings.ToLower(s) // any case: MTX, GraphML
	for _, f := range Formats {
		if string(f) == s {
			return f, nil
		}
	}
	switch s {
	case "edgelist", "edge-list", "txt", "tsv", "csv", "table":
		return EdgeList, nil
	case "matrix-market", "mm":
		return MatrixMarket, nil
	case "gv":
		return DOT, nil
	case "xml":
		return GraphML, nil
	case "net", "paj":
		return Pajek, nil
	case "node-link", "nodelink":
		return NodeLinkJSON, nil
	}
	return "", fmt.Errorf("netread: unknown format %q (want edges, mtx, dot, graphml, gml, pajek or json)", s)
}

// formatTitle names a format in messages.
func formatTitle(f Format) string {
	switch f {
	case MatrixMarket:
		return "Matrix Market"
	case DOT:
		return "DOT"
	case GraphML:
		return "GraphML"
	case GML:
		return "GML"
	case Pajek:
		return "Pajek"
	case NodeLinkJSON:
		return "node-link JSON"
	}
	return string(f)
}

// Open opens path for one of the io readers: "-" is stdin (os.Stdin when
// stdin is nil) and is named "stdin" in messages. what says what the file
// should be, for the message about a directory ("network file", say). A
// file that cannot be opened gives an *Error wrapping the cause.
func Open(path string, stdin io.Reader, what string) (io.ReadCloser, string, error) {
	if path == "-" {
		if stdin == nil {
			stdin = os.Stdin
		}
		return io.NopCloser(stdin), "stdin", nil
	}
	f, err := os.Open(path)
	if err != nil {
		msg := err.Error()
		var pe *fs.PathError
		if errors.As(err, &pe) {
			msg = pe.Err.Error()
		}
		return nil, path, &Error{File: path, Msg: msg, Err: err}
	}
	if st, err := f.Stat(); err == nil && st.IsDir() {
		f.Close()
		return nil, path, &Error{File: path, Msg: "is a directory, not a " + what}
	}
	return f, path, nil
}

// ReadFile reads the network in path; "-" reads opt.Stdin.
func ReadFile(path string, opt Options) (*Input, error) {
	f, name, err := Open(path, opt.Stdin, "network file")
	if err != nil {
		return nil, err
	}
	defer f.Close()
	in, err := Read(f, name, opt)
	var e *Error
	if err != nil && path != "-" && errors.As(err, &e) && e.edge > 0 && e.Line == 0 {
		// An edge whose repeated weights add up to a non-finite number
		// is found when the network is built, after reading; a second
		// pass over the file finds its line.
		e.Line = locateLine(path, opt, e.edge)
	}
	return in, err
}

// locateLine reads path again up to the edge with 1-based index edge and
// returns its line, or 0.
func locateLine(path string, opt Options, edge int64) int {
	f, err := os.Open(path)
	if err != nil {
		return 0
	}
	defer f.Close()
	if st, err := f.Stat(); err != nil || !st.Mode().IsRegular() {
		return 0 // a FIFO or device cannot be read twice
	}
	opt.locate = edge
	_, err = Read(f, path, opt)
	var e *Error
	if errors.As(err, &e) && errors.Is(e.Err, errLocated) {
		return e.Line
	}
	return 0
}

// Read reads a network from r; file names the source in error messages,
// and its extension chooses the format when neither opt.Format nor the
// content does.
func Read(r io.Reader, file string, opt Options) (*Input, error) {
	d := source.NewDigest(r)
	br, err := maybeGunzip(d, file, opt)
	if err != nil {
		return nil, err
	}
	// A byte-order mark, as some editors write, belongs to no format.
	if p, _ := br.Peek(len(utf8BOM)); string(p) == utf8BOM {
		br.Discard(len(utf8BOM))
	}
	in := &Input{Format: opt.Format}
	table := opt.Columns != nil || opt.Separator != DetectSeparator
	if in.Format == "" {
		p, _ := br.Peek(sniffBytes)
		in.Format = Sniff(p)
		if in.Format == NodeLinkJSON && table && !jsonObjectStart(p) {
			in.Format = "" // a table whose first field starts with '{'
		}
		if in.Format != "" && table {
			// The content announces another format: columns and a
			// separator would misread it, line by line, as a table.
			return nil, &Error{File: file, Msg: fmt.Sprintf("the content is %s, not an edge list or table; columns and separators apply only to edge lists and tables (force the format \"edges\" to read it as one anyway)", formatTitle(in.Format))}
		}
		switch {
		case in.Format != "":
		case table:
			in.Format = EdgeList // columns or a separator say it is a table
		default:
			in.Format = FormatOf(file)
		}
	}
	if in.Format != EdgeList && table {
		return nil, &Error{File: file, Msg: fmt.Sprintf("columns and separators apply to edge lists and tables; this is read as %s", in.Format)}
	}
	if in.Format == MatrixMarket && opt.StatesFrom != nil {
		more, err := opt.StatesFrom()
		if err != nil {
			return nil, err
		}
		opt.States, opt.StatesFrom = append(slices.Clip(opt.States), more...), nil
	}
	var res *parsed
	switch in.Format {
	case MatrixMarket:
		res, err = readMatrixMarket(br, file, opt)
	case DOT:
		res, err = readDOT(br, file, opt)
	case GraphML:
		res, err = readGraphML(br, file, opt)
	case GML:
		res, err = readGML(br, file, opt)
	case Pajek:
		res, err = readPajek(br, file, opt)
	case NodeLinkJSON:
		res, err = readJSON(br, file, opt)
	case EdgeList:
		res, err = readEdges(br, file, opt)
	default:
		return nil, &Error{File: file, Msg: fmt.Sprintf("unknown format %q", opt.Format)}
	}
	if err != nil {
		return nil, err
	}
	// Every reader stops at the end of its input; make sure of it, so that
	// the digest covers every byte.
	if p, err := br.Peek(1); len(p) > 0 {
		return nil, &Error{File: file, Msg: "data after the end of the network"}
	} else if err != nil && err != io.EOF {
		return nil, readError(file, 0, err)
	}
	if err := d.Drain(); err != nil {
		return nil, readError(file, 0, err)
	}
	in.Network, in.Labels, in.Groups = res.g, res.labels, res.groups
	in.SHA256, in.Size = d.Sum(), d.Size()
	return in, nil
}

// parsed is what a format reader returns.
type parsed struct {
	g              *structural.Network
	labels, groups []string
}

// readError turns a read failure into an *Error at line (0: none),
// keeping an *Error the input layers made (gzip, limits) as it is.
func readError(file string, line int, err error) *Error {
	var e *Error
	if errors.As(err, &e) {
		if e.Line == 0 {
			e.Line = line
		}
		return e
	}
	return &Error{File: file, Line: line, Msg: oneLineMsg(err.Error()), Err: err}
}

// finish adds the extra states and builds the network.
func finish(b *structural.Builder, file string, opt Options) (*structural.Network, error) {
	if opt.StatesFrom != nil {
		more, err := opt.StatesFrom()
		if err != nil {
			return nil, err
		}
		opt.States = append(slices.Clip(opt.States), more...)
	}
	for _, s := range opt.States {
		if _, err := b.Intern([]byte(s)); err != nil {
			return nil, &Error{File: file, Msg: trimStructural(err.Error()), Err: err}
		}
	}
	if b.States() == 0 {
		return nil, &Error{File: file, Msg: "empty network: no edges and no states"}
	}
	g, err := b.Build(opt.Build)
	if err != nil {
		return nil, &Error{File: file, Msg: trimStructural(err.Error()), Err: err}
	}
	return g, nil
}

// padded returns s extended with "" to n entries, or nil when s holds
// nothing but "".
func padded(s []string, n int) []string {
	any := false
	for _, x := range s {
		any = any || x != ""
	}
	if !any {
		return nil
	}
	if len(s) < n {
		s = append(s, make([]string, n-len(s))...)
	}
	return s[:n]
}

// Gzip bounds. A stream may expand to InflateAllowance bytes freely, and
// beyond that to MaxInflateRatio times the compressed bytes read so far.
// Real edge lists compress 2 to 5 times (a random network of 10^5 states
// and integer names, 4.7 MB of text: 2.4 times with gzip -9, 2.7 with
// gzip -1; 10^8 edges read well within the bound); a stream of blank lines
// compresses a thousand times and is stopped soon after the allowance.
const (
	DefaultMaxInflateRatio = 100
	InflateAllowance       = 256 << 20
)

// inflateAllowance is InflateAllowance; tests lower it.
var inflateAllowance int64 = InflateAllowance

// gzipReader wraps decompression errors with the file name and enforces
// the inflation bound.
type gzipReader struct {
	r     io.Reader
	raw   *source.Digest
	file  string
	ratio float64 // < 0: no bound
	out   int64
}

func (g *gzipReader) Read(p []byte) (int, error) {
	n, err := g.r.Read(p)
	g.out += int64(n)
	if g.ratio >= 0 && g.out > inflateAllowance && float64(g.out) > g.ratio*float64(g.raw.Size()) {
		return 0, &Error{File: g.file, Msg: fmt.Sprintf("gzip: the data expand more than %g times past the first %d MiB (%d MiB from %d KiB so far): refused as a likely decompression bomb; raise the bound (MaxInflateRatio; --max-inflate RATIO or none on the command line) to read it",
			g.ratio, inflateAllowance>>20, g.out>>20, g.raw.Size()>>10)}
	}
	if err != nil && err != io.EOF {
		err = &Error{File: g.file, Msg: gzipMsg(err), Err: err}
	}
	return n, err
}

// gzipMsg describes a decompression error; a stream cut short says so.
func gzipMsg(err error) string {
	if err == io.ErrUnexpectedEOF {
		return "gzip: the compressed stream ends early (truncated file?)"
	}
	return "gzip: " + oneLineMsg(err.Error())
}

// readBuffer is the size of the input buffers: it holds what Sniff and
// the table's first rows look at (large reads pass through it).
const readBuffer = 256 << 10

// maybeGunzip returns a buffered reader of the decompressed input when
// it starts with the gzip magic bytes, of the input itself otherwise.
func maybeGunzip(raw *source.Digest, file string, opt Options) (*bufio.Reader, error) {
	br := bufio.NewReaderSize(raw, readBuffer)
	magic, _ := br.Peek(2)
	if len(magic) == 2 && magic[0] == 0x1f && magic[1] == 0x8b {
		zr, err := gzip.NewReader(br)
		if err != nil {
			return nil, &Error{File: file, Msg: gzipMsg(err), Err: err}
		}
		ratio := opt.MaxInflateRatio
		if ratio == 0 {
			ratio = DefaultMaxInflateRatio
		}
		return bufio.NewReaderSize(&gzipReader{r: zr, raw: raw, file: file, ratio: ratio}, readBuffer), nil
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
		return nil, readError(l.file, l.line, err)
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
