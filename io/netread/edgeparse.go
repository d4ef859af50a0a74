package netread

import (
	"bufio"
	"bytes"
	"errors"
	"io"
	"math"
	"runtime"
	"strconv"
	"sync/atomic"

	"github.com/netsteer/netsteer/structural"
)

// Edge lists are read in blocks of whole lines. One goroutine reads blocks
// (and so runs gzip decompression, when the input is compressed), parser
// goroutines turn each block into tokens, and the calling goroutine interns
// the tokens block by block in file order, so states are numbered by first
// appearance exactly as a line-by-line reader would number them; the
// parallel and sequential paths build identical networks. A line is parsed
// without allocation: a canonical decimal name becomes its state when the
// Builder already has it (structural.Builder.LookupInt; it was interned from
// an earlier block) and its value otherwise (interned in order by
// InternInt), other names are copied into the block's arena, and any line
// that is not two or three plain fields goes through the general tokenizer,
// which produces the error messages. While every block holds only
// canonical decimal names, the merge keeps them as values and numbers the
// states on all cores at the end instead (intnumber.go), with the same
// numbering.

// blockBytes is the size of a parse block; it must exceed maxLineBytes.
var blockBytes = 1 << 20

// parseWorkers is the number of parser goroutines for inputs of more than
// one block; 0 means one per CPU, 1 parses in the reading goroutine's turn
// (sequentially).
var parseWorkers = 0

// block is a run of whole lines and what its parse produced.
type block struct {
	data    []byte // whole lines, the last one possibly without '\n'
	tooLong bool   // data starts a line longer than maxLineBytes
	readErr error  // the read failed after data

	lines int       // lines in data
	toks  []int32   // two per edge: a known state (>= 0) or ^index into pend
	pend  []int64   // names to intern in order: a value (>= 0) or ^index into the arena
	ws    []float64 // one per edge when weights are kept; NaN for none
	arena []byte    // names that are not canonical decimals
	offs  []int32   // name i is arena[offs[2i]:offs[2i+1]]
	err   *Error    // first problem, Line counted within the block
	done  chan struct{}
	buf   []byte // backing store of data
	tok   tokenizer
	b     *structural.Builder // for LookupInt while parsing; nil in lineOfEdge
	lf    *lineFormat
	run   *intRun // the records as values, while integer names are collected
}

// isoTok in place of an edge's target marks a line that declares an
// isolated state (a single name).
const isoTok = math.MinInt32

// readEdgeList parses "source target [weight]" lines, or the rows of a
// table (see Columns), into b.
func readEdgeList(r *bufio.Reader, file string, b *structural.Builder, opt Options) error {
	// A byte-order mark, as some editors write, is not part of the first
	// name; r reads decompressed bytes, so this holds for gzip input too.
	if p, _ := r.Peek(len(utf8BOM)); string(p) == utf8BOM {
		r.Discard(len(utf8BOM))
	}
	weights := opt.Weights
	lf, head, err := chooseFormat(r, file, opt)
	if err != nil {
		return err
	}
	hd := headerState{locate: opt.locate}
	err = readRows(r, file, b, lf, head, weights, &hd)
	if err == nil && !lf.plain && !hd.edges && hd.firstIso > 0 {
		// Every row was a single field: the columns (or the separator)
		// do not describe this file.
		return errorf(file, hd.firstIso, "no row of the file has the %d fields separated by %s an edge needs (this, the first row, has one; so do the others): the columns or the separator do not fit the file", lf.need, sepName(lf.sep))
	}
	return err
}

// readRows reads the rows of readEdgeList in the format lf, after head
// lines.
func readRows(r *bufio.Reader, file string, b *structural.Builder, lf *lineFormat, head int, weights bool, hd *headerState) error {
	var err error
	// Lines up to the header row (comments, then the header) are read
	// here; the blocks start after them.
	line0 := 0
	for line0 < head {
		if _, err := r.ReadSlice('\n'); err != nil {
			break
		}
		line0++
	}
	hd.done = !lf.plain
	rd := &blockReader{r: r}
	newBlock := func(b *structural.Builder) *block {
		blk := newBlockSized(b, blockBytes)
		blk.lf = lf
		return blk
	}
	// An input that fits in the read buffer gets a first block its size.
	var first *block
	if p, err := r.Peek(r.Size()); err != nil && len(p) < blockBytes {
		first = newBlockSized(b, len(p)+1)
		first.lf = lf
	} else {
		first = newBlock(b)
	}
	rd.fill(first)
	if first.readErr != nil || rd.eof || parseWorkers == 1 {
		// Small input, or sequential on request: parse in turn.
		line := line0
		blk := first
		for {
			parseBlock(blk, weights)
			stop, err := mergeBlock(blk, file, b, weights, &line, hd)
			if stop || err != nil {
				return err
			}
			if rd.eof {
				return nil
			}
			rd.fill(blk)
		}
	}
	workers := parseWorkers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	nblocks := 2*workers + 2
	free := make(chan *block, nblocks)
	work := make(chan *block, nblocks)
	order := make(chan *block, nblocks)
	quit := make(chan struct{})
	for i := 1; i < nblocks; i++ {
		free <- newBlock(b)
	}
	// Integer names are numbered in parallel at the end (intnumber.go)
	// while every block holds only them: plain edge lists only (a table's
	// rows are checked for their fields by mergeBlock), and not when a
	// second read looks for the line of an edge (Options.locate), which
	// mergeBlock counts.
	col := intCollector{on: intNumbering && b.States() == 0 && lf.plain && hd.locate == 0}
	var collecting atomic.Bool
	collecting.Store(col.on)
	for i := 0; i < workers; i++ {
		go func() {
			for blk := range work {
				parseBlock(blk, weights)
				if collecting.Load() && blk.err == nil {
					blk.run = blk.intRun(weights)
				}
				blk.done <- struct{}{}
			}
		}()
	}
	go func() {
		defer close(work)
		defer close(order)
		blk := first
		for {
			order <- blk
			work <- blk
			if rd.eof || blk.readErr != nil || blk.tooLong {
				return
			}
			select {
			case blk = <-free:
			case <-quit:
				return
			}
			rd.fill(blk)
		}
	}()
	line := line0
	for blk := range order {
		<-blk.done
		if err == nil && col.on {
			if err = hd.check(blk, file, line); err != nil {
				close(quit)
				free <- blk
				continue
			}
			if col.take(blk) {
				line += blk.lines
				free <- blk
				continue
			}
			collecting.Store(false)
			if err = col.flush(b); err != nil {
				err = errorf(file, line, "%v", err)
				close(quit)
				free <- blk
				continue
			}
		}
		if err == nil {
			var stop bool
			stop, err = mergeBlock(blk, file, b, weights, &line, hd)
			if stop && err == nil {
				err = errStop
			}
			if err != nil {
				close(quit)
			}
		}
		free <- blk
	}
	if err == errStop {
		err = nil
	}
	if err == nil && col.on {
		if err = col.flush(b); err != nil {
			err = errorf(file, line, "%v", err)
		}
	}
	return err
}

var errStop = errors.New("stop")

// newBlockSized returns a block of size bytes.
func newBlockSized(b *structural.Builder, size int) *block {
	// A line of an edge is at least 4 bytes ("1 2\n"): toks rarely grows
	// past this capacity (lines of one short name can make it), of which
	// only the part used is ever touched.
	return &block{buf: make([]byte, size), done: make(chan struct{}, 1), b: b,
		toks: make([]int32, 0, size/2+2)}
}

// blockReader cuts its input into blocks of whole lines.
type blockReader struct {
	r     io.Reader
	carry []byte // the start of a line cut by the previous block
	eof   bool
}

// fill reads the next block into blk.
func (rd *blockReader) fill(blk *block) {
	blk.tooLong, blk.readErr = false, nil
	buf := blk.buf
	n := copy(buf, rd.carry)
	rd.carry = rd.carry[:0]
	for n < len(buf) {
		k, err := rd.r.Read(buf[n:])
		n += k
		if err == io.EOF {
			rd.eof = true
			break
		}
		if err != nil {
			blk.readErr = err
			break
		}
	}
	data := buf[:n]
	switch {
	case blk.readErr != nil:
		// The line being read when the input failed is not parsed.
		data = data[:bytes.LastIndexByte(data, '\n')+1]
	case !rd.eof:
		cut := bytes.LastIndexByte(data, '\n')
		if cut < 0 {
			// A full block without a line end: the line is too long.
			blk.tooLong = true
		} else {
			rd.carry = append(rd.carry, data[cut+1:]...)
			data = data[:cut+1]
		}
	}
	blk.data = data
}

// parseBlock tokenizes blk.data.
func parseBlock(blk *block, weights bool) {
	blk.lines = 0
	blk.toks = blk.toks[:0]
	blk.pend = blk.pend[:0]
	blk.ws = blk.ws[:0]
	blk.arena = blk.arena[:0]
	blk.offs = blk.offs[:0]
	blk.err = nil
	blk.run = nil
	data := blk.data
	for len(data) > 0 {
		var line []byte
		if i := bytes.IndexByte(data, '\n'); i >= 0 {
			line, data = data[:i], data[i+1:]
		} else {
			line, data = data, nil
		}
		blk.lines++
		if blk.tooLong && data == nil {
			blk.err = errorf("", blk.lines, "line longer than %d bytes", blk.maxLine())
			return
		}
		if n := len(line); n > 0 && line[n-1] == '\r' {
			line = line[:n-1]
		}
		if len(line) > blk.maxLine() {
			blk.err = errorf("", blk.lines, "line longer than %d bytes", blk.maxLine())
			return
		}
		if msg := blk.parseLine(line, weights); msg != "" {
			blk.err = errorf("", blk.lines, "%s", msg)
			return
		}
	}
}

// maxLine is the longest line of the block's format.
func (blk *block) maxLine() int {
	if blk.lf == nil || blk.lf.plain {
		return maxLineBytes
	}
	return maxTableLineBytes
}

// parseLine adds the edge on one line, if any, or returns a message.
func (blk *block) parseLine(line []byte, weights bool) string {
	if blk.lf != nil && !blk.lf.plain {
		return blk.tableLine(line, weights)
	}
	// Fast path: two or three unquoted fields.
	i, n := 0, len(line)
	for i < n && isSpace(line[i]) {
		i++
	}
	if i == n || line[i] == '#' || line[i] == '%' {
		return ""
	}
	var f [3][]byte
	nf := 0
	for {
		start := i
		for i < n {
			// White space, and any control character, ends the fast
			// path's field; a control character is then at the start
			// of the next field, which sends the line to slowLine.
			c := line[i]
			if c <= ' ' || c == ',' || c == '"' || c == 0x7f {
				break
			}
			i++
		}
		if i == start || i < n && line[i] == '"' || nf == 3 {
			return blk.slowLine(line, weights)
		}
		f[nf] = line[start:i]
		nf++
		for i < n && isSpace(line[i]) {
			i++
		}
		if i == n {
			break
		}
		if line[i] == ',' {
			i++
			for i < n && isSpace(line[i]) {
				i++
			}
			if i == n {
				return blk.slowLine(line, weights)
			}
		}
	}
	if nf < 2 {
		return blk.slowLine(line, weights)
	}
	return blk.addFields(f[:nf], weights)
}

// slowLine handles any line through the general tokenizer.
func (blk *block) slowLine(line []byte, weights bool) string {
	fields, msg := blk.tok.split(line)
	if msg != "" {
		return msg
	}
	for k := 0; k < len(fields) && k < 2; k++ {
		if msg := controlMsg(fields[k]); msg != "" {
			return msg
		}
	}
	switch len(fields) {
	case 0:
		return ""
	case 1:
		// A single name declares an isolated state, unless it holds a
		// semicolon: then the file is most likely separated by them.
		if bytes.IndexByte(line, ';') >= 0 && hasUnquoted(line, ';') {
			return "one name " + strconv.Quote(clip(fields[0])) + " holding a semicolon: quote it to declare an isolated state, or set the separator to semicolon"
		}
	case 2, 3:
	default:
		return "want \"source target [weight]\", found " + strconv.Itoa(len(fields)) + " fields"
	}
	return blk.addFields(fields, weights)
}

// addFields checks the fields of an edge line and records the edge; a
// single field declares an isolated state.
func (blk *block) addFields(fields [][]byte, weights bool) string {
	ends := fields
	if len(ends) > 2 {
		ends = ends[:2]
	}
	for _, f := range ends {
		if len(f) == 0 {
			return "empty node name"
		}
		if len(f) > MaxNameBytes {
			return "node name of " + strconv.Itoa(len(f)) + " bytes; the limit is " + strconv.Itoa(MaxNameBytes)
		}
	}
	w := math.NaN()
	if len(fields) == 3 {
		x, err := strconv.ParseFloat(string(fields[2]), 64)
		if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
			return "weight " + strconv.Quote(clip(fields[2])) + " is not a finite number"
		}
		if x == 0 {
			return "weight 0 is no coupling; leave the edge out"
		}
		w = x
	}
	for _, f := range ends {
		if v, ok := decimalValue(f); ok {
			// A name already interned (in an earlier block) resolves
			// now, in parallel; the rest waits for the in-order merge.
			if blk.b != nil {
				if id, ok := blk.b.LookupInt(v); ok {
					blk.toks = append(blk.toks, id)
					continue
				}
			}
			blk.toks = append(blk.toks, ^int32(len(blk.pend)))
			blk.pend = append(blk.pend, int64(v))
			continue
		}
		blk.toks = append(blk.toks, ^int32(len(blk.pend)))
		blk.pend = append(blk.pend, ^int64(len(blk.offs)/2))
		blk.offs = append(blk.offs, int32(len(blk.arena)))
		blk.arena = append(blk.arena, f...)
		blk.offs = append(blk.offs, int32(len(blk.arena)))
	}
	if len(ends) == 1 {
		blk.toks = append(blk.toks, isoTok)
	}
	if weights {
		blk.ws = append(blk.ws, w)
	}
	return ""
}

// decimalValue returns the value of a canonical decimal name ("0", "17",
// not "017") below 2^31-1; structural.Builder.Intern gives such a name the
// same state as InternInt of its value.
func decimalValue(f []byte) (uint32, bool) {
	n := len(f)
	if n == 0 || n > 10 || f[0] == '0' && n > 1 {
		return 0, false
	}
	var v uint64
	for _, c := range f {
		d := c - '0'
		if d > 9 {
			return 0, false
		}
		v = v*10 + uint64(d)
	}
	return uint32(v), v < math.MaxInt32
}

// headerState follows the search for the first non-comment line, which
// must not be a CSV header (see headerMsg).
type headerState struct {
	done bool
	// firstIso is the line of the first row of a table that declares an
	// isolated state (0: none yet); edges tells whether a row has given
	// an edge.
	firstIso int
	edges    bool
	locate   int64 // Options.locate
}

// check looks for the first non-comment line in blk, unless an earlier
// block held it, and returns an error when that line is a header. line
// counts the lines before blk.
func (h *headerState) check(blk *block, file string, line int) error {
	if h.done {
		return nil
	}
	data := blk.data
	for k := 1; len(data) > 0; k++ {
		var l []byte
		if i := bytes.IndexByte(data, '\n'); i >= 0 {
			l, data = data[:i], data[i+1:]
		} else {
			l, data = data, nil
		}
		if blk.tooLong && data == nil {
			return nil // the block's error stands
		}
		l = bytes.TrimSuffix(l, []byte{'\r'})
		if len(l) > maxLineBytes {
			return nil // parseBlock reports it
		}
		j := 0
		for j < len(l) && isSpace(l[j]) {
			j++
		}
		if j == len(l) || l[j] == '#' || l[j] == '%' {
			continue
		}
		h.done = true
		if msg := headerMsg(l); msg != "" {
			return errorf(file, line+k, "%s", msg)
		}
		return nil
	}
	return nil
}

// mergeBlock interns blk's tokens into b in order and reports whether
// reading stops here (the end of the input, or an error). line counts the
// lines before blk and is advanced past it; hd checks the first
// non-comment line.
func mergeBlock(blk *block, file string, b *structural.Builder, weights bool, line *int, hd *headerState) (bool, error) {
	if err := hd.check(blk, file, *line); err != nil {
		return true, err
	}
	toks := blk.toks
	for e := 0; e+1 < len(toks); e += 2 {
		u, err := blk.intern(b, toks[e])
		if err != nil {
			return true, errorf(file, *line+blk.lineOfEdge(e/2, weights), "%v", err)
		}
		if toks[e+1] == isoTok {
			if hd.firstIso == 0 && !blk.lf.plain {
				hd.firstIso = *line + blk.lineOfEdge(e/2, weights)
			}
			continue
		}
		hd.edges = true
		if hd.locate > 0 && int64(b.Edges()) == hd.locate-1 {
			return true, &Error{File: file, Line: *line + blk.lineOfEdge(e/2, weights), Err: errLocated}
		}
		v, err := blk.intern(b, toks[e+1])
		if err != nil {
			return true, errorf(file, *line+blk.lineOfEdge(e/2, weights), "%v", err)
		}
		if weights {
			if w := blk.ws[e/2]; !math.IsNaN(w) {
				b.AddWeightedEdge(u, v, w)
				continue
			}
		}
		b.AddEdge(u, v)
	}
	if blk.err != nil {
		blk.err.File = file
		blk.err.Line += *line
		return true, blk.err
	}
	*line += blk.lines
	if blk.readErr != nil {
		var e *Error
		if errors.As(blk.readErr, &e) {
			e.Line = *line + 1
			return true, e
		}
		return true, errorf(file, *line+1, "%v", blk.readErr)
	}
	return false, nil
}

func (blk *block) intern(b *structural.Builder, t int32) (int32, error) {
	if t >= 0 {
		return t, nil
	}
	p := blk.pend[^t]
	if p >= 0 {
		return b.InternInt(uint32(p))
	}
	k := 2 * int(^p)
	return b.Intern(blk.arena[blk.offs[k]:blk.offs[k+1]])
}

// lineOfEdge returns the line, counted within blk, that holds edge k.
func (blk *block) lineOfEdge(k int, weights bool) int {
	scratch := &block{lf: blk.lf} // no Builder: every name stays pending
	data, line := blk.data, 0
	for len(data) > 0 {
		var l []byte
		if i := bytes.IndexByte(data, '\n'); i >= 0 {
			l, data = data[:i], data[i+1:]
		} else {
			l, data = data, nil
		}
		line++
		scratch.parseLine(bytes.TrimSuffix(l, []byte{'\r'}), weights)
		if len(scratch.toks)/2 > k {
			break
		}
	}
	return line
}
