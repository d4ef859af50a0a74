package netread

import (
	"bufio"
	"bytes"
	"io"
	"math"
	"strconv"

	"github.com/netsteer/netsteer/structural"
)

// Matrix Market limits. A size line's claims are checked against these
// before anything is reserved.
const (
	// mtxMaxLine bounds a line (comments included).
	mtxMaxLine = 1 << 20
	// mtxReserve is the most entries reserved from the size line's claim;
	// beyond it the edge slices grow as entries actually arrive.
	mtxReserve = 1 << 20
	// mtxFreeStates is how many states a file may declare beyond what its
	// entries justify (16 per entry): isolated states are legal, but a
	// claim of 10^9 states for a ten-line file is an error, not a
	// multi-gigabyte allocation.
	mtxFreeStates = 1 << 20
)

// utf8BOM is the UTF-8 byte-order mark.
const utf8BOM = "\xef\xbb\xbf"

// mtxHeader is what the banner and size line say.
type mtxHeader struct {
	field    string // pattern, real or integer
	symmetry string // general, symmetric or skew-symmetric
	n        int64  // rows = columns
	nnz      int64  // stored entries
	sizeLine int
	// names are the state names of the comment lines netsteer writes
	// (see mtxNamesMarker), nil when the file has none; namesLine is the
	// line of the marker.
	names     []string
	nameLines []int32 // the line of each name
	namesLine int
}

// mtxNamesMarker is the comment line after which netsteer's Matrix
// Market writer (netwrite.WriteMatrixMarket) names the states, one comment
// line "% state I NAME" each, I = 1..N in order, NAME as in an edge list.
const mtxNamesMarker = "% state names: state I is the I-th row and column"

// mtxNameLine parses a "% state I NAME" line while names are being read;
// it returns the name, or a message.
func mtxNameLine(line []byte, want int) (string, string) {
	rest, ok := bytes.CutPrefix(bytes.TrimSpace(line), []byte("% state "))
	if !ok {
		return "", "want \"% state " + strconv.Itoa(want) + " NAME\" after the state-names line"
	}
	num, name, _ := bytes.Cut(rest, []byte(" "))
	if string(num) != strconv.Itoa(want) {
		return "", "state name line for " + strconv.Quote(clip(num)) + ", want state " + strconv.Itoa(want) + " (the names go in order)"
	}
	f, msg := SplitFields(name)
	switch {
	case msg != "":
		return "", msg
	case len(f) != 1:
		return "", "want one name after \"% state " + strconv.Itoa(want) + "\", found " + strconv.Itoa(len(f)) + " (quote a name that holds blanks)"
	}
	if msg := NameProblem(f[0]); msg != "" {
		return "", msg
	}
	return f[0], ""
}

// maxStatesFor returns the most states a file with the given number of
// stored entries may declare.
func maxStatesFor(entries int64) int64 {
	if entries > (math.MaxInt64-mtxFreeStates)/16 {
		return math.MaxInt64
	}
	return 16*entries + mtxFreeStates
}

// readMatrixMarket reads a Matrix Market coordinate file: entry (i, j) is
// the edge j -> i between the states named "j" and "i".
func readMatrixMarket(r *bufio.Reader, file string, opt Options) (*parsed, error) {
	lr := &lineReader{r: r, file: file, max: mtxMaxLine}
	h, err := readMTXHeader(lr)
	if err != nil {
		return nil, err
	}
	n := int(h.n)
	b := structural.NewIntBuilder(n, 1)
	if h.names != nil {
		b = structural.NewBuilder()
		for i, name := range h.names {
			v, err := b.Intern([]byte(name))
			if err != nil {
				return nil, errorf(file, int(h.nameLines[i]), "%s", trimStructural(err.Error()))
			}
			if int(v) != i {
				return nil, errorf(file, int(h.nameLines[i]), "state name %q is given to states %d and %d", clip([]byte(name)), v+1, i+1)
			}
		}
	}
	// Which extra states are among the names: one pass, then the names
	// are only in the Builder.
	named := h.names != nil
	extra := map[string]bool{}
	if named && len(opt.States) > 0 {
		for _, s := range opt.States {
			extra[s] = false
		}
		for _, name := range h.names {
			if _, ok := extra[name]; ok {
				extra[name] = true
			}
		}
	}
	h.names, h.nameLines = nil, nil
	expanded := h.symmetry != "general"
	reserve := h.nnz
	if expanded && reserve < math.MaxInt64/2 {
		reserve *= 2
	}
	b.Grow(int(min(reserve, mtxReserve)))
	weighted := opt.Weights && h.field != "pattern"
	var fields [4][]byte
	var count int64
	for {
		line, err := lr.next()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, err
		}
		k := mtxSplit(line, fields[:])
		if k == 0 || line[mtxFirstNonBlank(line)] == '%' {
			continue
		}
		if count == h.nnz {
			return nil, errorf(file, lr.line, "entry beyond the %d the size line (line %d) announces", h.nnz, h.sizeLine)
		}
		count++
		want := 3
		if h.field == "pattern" {
			want = 2
		}
		if k != want {
			if k > want {
				return nil, errorf(file, lr.line, "want %s, found more than %d fields", mtxEntryForm(h.field), want)
			}
			return nil, errorf(file, lr.line, "want %s, found %d %s", mtxEntryForm(h.field), k, mtxPlural(k, "field", "fields"))
		}
		i, ok := mtxIndex(fields[0], h.n)
		if !ok {
			return nil, errorf(file, lr.line, "row index %q is not an integer in 1..%d", clip(fields[0]), h.n)
		}
		j, ok := mtxIndex(fields[1], h.n)
		if !ok {
			return nil, errorf(file, lr.line, "column index %q is not an integer in 1..%d", clip(fields[1]), h.n)
		}
		w := 1.0
		switch h.field {
		case "real":
			w, err = strconv.ParseFloat(string(fields[2]), 64)
			if err != nil || math.IsNaN(w) || math.IsInf(w, 0) {
				return nil, errorf(file, lr.line, "value %q is not a finite number", clip(fields[2]))
			}
		case "integer":
			v, err := strconv.ParseInt(string(fields[2]), 10, 64)
			if err != nil {
				return nil, errorf(file, lr.line, "value %q is not an integer", clip(fields[2]))
			}
			w = float64(v)
		}
		if i == j && h.symmetry == "skew-symmetric" {
			return nil, errorf(file, lr.line, "diagonal entry (%d, %d) in a skew-symmetric matrix", i+1, j+1)
		}
		// A[i][j] != 0: column j acts on row i.
		if located(b, opt) || expanded && i != j && opt.locate > 0 && int64(b.Edges())+1 == opt.locate-1 {
			return nil, &Error{File: file, Line: lr.line, Err: errLocated}
		}
		if weighted {
			b.AddWeightedEdge(j, i, w)
		} else {
			b.AddEdge(j, i)
		}
		if expanded && i != j {
			if h.symmetry == "skew-symmetric" {
				w = -w
			}
			if weighted {
				b.AddWeightedEdge(i, j, w)
			} else {
				b.AddEdge(i, j)
			}
		}
	}
	if count != h.nnz {
		return nil, errorf(file, h.sizeLine, "the size line announces %d entries, the file holds %d", h.nnz, count)
	}
	if h.n > maxStatesFor(count) {
		return nil, errorf(file, h.sizeLine, "%d states for %d entries: more than %d, which the entries can justify", h.n, count, maxStatesFor(count))
	}
	for _, s := range opt.States {
		if named {
			if !extra[s] {
				return nil, &Error{File: file, Msg: "extra state " + strconv.Quote(clip([]byte(s))) + " is not one of the state names of the file"}
			}
			continue
		}
		v, err := strconv.Atoi(s)
		if err != nil || strconv.Itoa(v) != s || v < 1 || int64(v) > h.n {
			return nil, &Error{File: file, Msg: "extra state " + strconv.Quote(clip([]byte(s))) + " is not an index in 1.." + strconv.FormatInt(h.n, 10)}
		}
	}
	g, err := b.Build(opt.Build)
	if err != nil {
		err = &Error{File: file, Msg: trimStructural(err.Error()), Err: err}
		markEdge(err)
		return nil, err
	}
	return &parsed{g: g}, nil
}

// readMTXHeader reads the banner, the comments and the size line, and
// checks the claims against the limits.
func readMTXHeader(lr *lineReader) (mtxHeader, error) {
	var h mtxHeader
	file := lr.file
	line, err := lr.next()
	if err == io.EOF {
		return h, errorf(file, 1, "empty file: want a %%%%MatrixMarket header line")
	}
	if err != nil {
		return h, err
	}
	// A byte-order mark, as some editors write, is not part of the banner.
	line = bytes.TrimPrefix(line, []byte(utf8BOM))
	var f [6][]byte
	k := mtxSplit(line, f[:])
	if k == 0 || !bytes.EqualFold(f[0], []byte("%%MatrixMarket")) {
		return h, errorf(file, lr.line, "missing the %%%%MatrixMarket header line (want %%%%MatrixMarket matrix coordinate real general)")
	}
	if k != 5 {
		return h, errorf(file, lr.line, "header wants 4 words after %%%%MatrixMarket (matrix coordinate FIELD SYMMETRY), found %d", k-1)
	}
	object, format := string(bytes.ToLower(f[1])), string(bytes.ToLower(f[2]))
	h.field, h.symmetry = string(bytes.ToLower(f[3])), string(bytes.ToLower(f[4]))
	if object != "matrix" {
		return h, errorf(file, lr.line, "object %q is not supported; want matrix", clip(f[1]))
	}
	switch format {
	case "coordinate":
	case "array":
		return h, errorf(file, lr.line, "dense array format is not supported; a network needs the sparse coordinate format")
	default:
		return h, errorf(file, lr.line, "format %q is not supported; want coordinate", clip(f[2]))
	}
	switch h.field {
	case "pattern", "real", "integer":
	case "complex":
		return h, errorf(file, lr.line, "complex values are not supported; want pattern, real or integer")
	default:
		return h, errorf(file, lr.line, "field %q is not supported; want pattern, real or integer", clip(f[3]))
	}
	switch h.symmetry {
	case "general", "symmetric", "skew-symmetric":
	case "hermitian":
		return h, errorf(file, lr.line, "hermitian matrices are not supported; want general, symmetric or skew-symmetric")
	default:
		return h, errorf(file, lr.line, "symmetry %q is not supported; want general, symmetric or skew-symmetric", clip(f[4]))
	}
	// Comments, then the size line.
	ended := false // the list of state names has ended
	for {
		line, err = lr.next()
		if err == io.EOF {
			return h, errorf(file, lr.line, "missing the size line (rows columns entries)")
		}
		if err != nil {
			return h, err
		}
		k = mtxSplit(line, f[:4])
		if k > 0 && line[mtxFirstNonBlank(line)] != '%' {
			break
		}
		switch {
		case h.namesLine == 0 && string(bytes.TrimSpace(line)) == mtxNamesMarker:
			h.namesLine, h.names = lr.line, []string{}
		case h.namesLine > 0 && h.names != nil && k > 0:
			if !bytes.HasPrefix(bytes.TrimSpace(line), []byte("% state ")) && len(h.names) > 0 {
				ended = true // any other comment ends the list
				continue
			}
			if ended {
				return h, errorf(file, lr.line, "state name line after the list of names ended")
			}
			name, msg := mtxNameLine(line, len(h.names)+1)
			if msg != "" {
				return h, errorf(file, lr.line, "%s", msg)
			}
			h.names = append(h.names, name)
			h.nameLines = append(h.nameLines, int32(min(lr.line, math.MaxInt32)))
		}
	}
	h.sizeLine = lr.line
	if k != 3 {
		return h, errorf(file, lr.line, "size line wants 3 integers (rows columns entries), found %d %s", min(k, 4), mtxPlural(min(k, 4), "field", "fields"))
	}
	var dims [3]int64
	for i, name := range []string{"rows", "columns", "entries"} {
		v, err := strconv.ParseInt(string(f[i]), 10, 64)
		if err != nil || v < 0 {
			return h, errorf(file, lr.line, "size line: %s %q is not a non-negative integer", name, clip(f[i]))
		}
		dims[i] = v
	}
	rows, cols, nnz := dims[0], dims[1], dims[2]
	if rows != cols {
		return h, errorf(file, lr.line, "matrix is %d x %d; a network needs a square matrix (one row and one column per state)", rows, cols)
	}
	if rows == 0 {
		return h, errorf(file, lr.line, "empty network: the matrix has no rows")
	}
	if rows > structural.MaxStates {
		return h, errorf(file, lr.line, "%d states: more than the %d a network can hold", rows, structural.MaxStates)
	}
	if rows > maxStatesFor(nnz) {
		return h, errorf(file, lr.line, "%d states for %d entries: more than %d, which the entries can justify", rows, nnz, maxStatesFor(nnz))
	}
	if h.names != nil && int64(len(h.names)) != rows {
		return h, errorf(file, h.namesLine, "%d state names for the %d states of the size line (line %d)", len(h.names), rows, h.sizeLine)
	}
	h.n, h.nnz = rows, nnz
	return h, nil
}

// mtxEntryForm describes an entry line for error messages.
func mtxEntryForm(field string) string {
	if field == "pattern" {
		return "\"row column\""
	}
	return "\"row column value\""
}

// mtxIndex parses a 1-based index in 1..n and returns it 0-based.
func mtxIndex(b []byte, n int64) (int32, bool) {
	if len(b) == 0 || len(b) > 19 {
		return 0, false
	}
	var v int64
	for _, c := range b {
		if c < '0' || c > '9' {
			return 0, false
		}
		v = 10*v + int64(c-'0')
	}
	if v < 1 || v > n {
		return 0, false
	}
	return int32(v - 1), true
}

func isMTXBlank(c byte) bool { return c == ' ' || c == '\t' || c == '\r' || c == '\v' || c == '\f' }

// mtxFirstNonBlank returns the index of the first non-blank byte of line, or
// len(line).
func mtxFirstNonBlank(line []byte) int {
	i := 0
	for i < len(line) && isMTXBlank(line[i]) {
		i++
	}
	return i
}

// mtxSplit splits line at blanks into f and returns the number of fields,
// len(f)+1 when there are more than f holds.
func mtxSplit(line []byte, f [][]byte) int {
	k := 0
	i := 0
	for {
		for i < len(line) && isMTXBlank(line[i]) {
			i++
		}
		if i == len(line) {
			return k
		}
		if k == len(f) {
			return k + 1
		}
		s := i
		for i < len(line) && !isMTXBlank(line[i]) {
			i++
		}
		f[k] = line[s:i]
		k++
	}
}

func mtxPlural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}

// trimStructural drops the "structural: " prefix of a Builder error.
func trimStructural(s string) string {
	const p = "structural: "
	if len(s) >= len(p) && s[:len(p)] == p {
		return s[len(p):]
	}
	return s
}
