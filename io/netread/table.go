package netread

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"strconv"
	"strings"

	"github.com/netsteer/netsteer/structural"
)

// Separator is the field separator of an edge list or delimited table.
type Separator byte

// The separators. DetectSeparator, the zero value, decides by content
// (see Columns); Whitespace means runs of spaces and tabs.
const (
	DetectSeparator Separator = 0
	Comma           Separator = ','
	Tab             Separator = '\t'
	Semicolon       Separator = ';'
	Whitespace      Separator = ' '
)

// ParseSeparator reads a separator name: comma, tab, semicolon,
// whitespace (or space), or auto; the characters themselves are accepted
// too.
func ParseSeparator(s string) (Separator, error) {
	switch strings.ToLower(s) {
	case "", "auto", "detect":
		return DetectSeparator, nil
	case "comma", ",":
		return Comma, nil
	case "tab", "\t", `\t`:
		return Tab, nil
	case "semicolon", ";":
		return Semicolon, nil
	case "whitespace", "space", " ", "blank":
		return Whitespace, nil
	}
	return 0, fmt.Errorf("netread: unknown separator %q (want comma, tab, semicolon, whitespace or auto)", s)
}

// String names the separator.
func (s Separator) String() string {
	switch s {
	case DetectSeparator:
		return "auto"
	case Comma:
		return "comma"
	case Tab:
		return "tab"
	case Semicolon:
		return "semicolon"
	case Whitespace:
		return "whitespace"
	}
	return strconv.QuoteRune(rune(s))
}

// Columns selects the columns of a delimited table: the source, the
// target and optionally the weight of each edge, either by header name
// (the first non-comment row is then the header) or by 1-based position
// (the file has no header). Other columns are ignored. Exactly one of
// Names and Positions is set, with two or three entries.
//
// Rows are split at the separator (Options.Separator, or detected: from
// the header, the separator under which every named column is found; by
// position, the one of comma, tab and semicolon the first row holds, else
// white space; a row that could be split two ways is refused). Fields may
// be double-quoted as in CSV ("" for a quote inside); blanks around fields
// are dropped. A row holding a single name declares an isolated state.
type Columns struct {
	Names     []string
	Positions []int
}

// maxColumn bounds a column position.
const maxColumn = 1 << 12

// ParseColumns reads "SOURCE,TARGET[,WEIGHT]": three or two header names,
// or 1-based positions when every entry is a number.
func ParseColumns(s string) (*Columns, error) {
	parts := strings.Split(s, ",")
	if len(parts) < 2 || len(parts) > 3 {
		return nil, fmt.Errorf("netread: columns %q: want SOURCE,TARGET or SOURCE,TARGET,WEIGHT", s)
	}
	c := &Columns{}
	digits := 0
	for i := range parts {
		parts[i] = strings.TrimSpace(parts[i])
		if parts[i] == "" {
			return nil, fmt.Errorf("netread: columns %q: empty column name", s)
		}
		if _, err := strconv.Atoi(parts[i]); err == nil {
			digits++
		}
	}
	switch digits {
	case len(parts):
		for _, p := range parts {
			v, _ := strconv.Atoi(p)
			c.Positions = append(c.Positions, v)
		}
	case 0:
		c.Names = parts
	default:
		return nil, fmt.Errorf("netread: columns %q: give all columns by name or all by position", s)
	}
	return c, c.check()
}

func (c *Columns) check() error {
	n := len(c.Names) + len(c.Positions)
	if (c.Names == nil) == (c.Positions == nil) || n < 2 || n > 3 {
		return fmt.Errorf("netread: columns: want two or three names, or two or three positions")
	}
	for i, p := range c.Positions {
		if p < 1 || p > maxColumn {
			return fmt.Errorf("netread: column position %d: want 1 to %d", p, maxColumn)
		}
		for _, q := range c.Positions[:i] {
			if p == q {
				return fmt.Errorf("netread: column %d chosen twice", p)
			}
		}
	}
	for i, a := range c.Names {
		for _, b := range c.Names[:i] {
			if strings.EqualFold(a, b) {
				return fmt.Errorf("netread: column %q chosen twice", a)
			}
		}
	}
	return nil
}

// lineFormat says how the lines of an edge list or table are split.
type lineFormat struct {
	// plain is the edge-list format: white space or one comma between
	// one to three fields (the block parser's fast path).
	plain bool
	sep   byte // otherwise: ',', ';', '\t' or ' ' (runs of blanks)
	// src, dst and wt are 0-based columns (wt < 0: none); optWeight
	// means no columns were chosen: two fields or three with a weight.
	src, dst, wt int
	optWeight    bool
	need         int // fields an edge row needs
}

var plainFormat = &lineFormat{plain: true, src: 0, dst: 1, wt: 2, optWeight: true, need: 2}

func sepFormat(sep byte) *lineFormat {
	return &lineFormat{sep: sep, src: 0, dst: 1, wt: 2, optWeight: true, need: 2}
}

// sepName describes a separator byte in messages.
func sepName(sep byte) string { return Separator(sep).String() }

// firstRows returns the first non-comment lines in the buffered start of
// the input, with their 1-based line numbers, up to max of them.
func firstRows(r *bufio.Reader, max int) ([][]byte, []int) {
	p, _ := r.Peek(r.Size())
	complete := len(p) < r.Size() // the whole rest of the input
	var rows [][]byte
	var nums []int
	for line := 1; len(p) > 0 && len(rows) < max; line++ {
		var l []byte
		if i := bytes.IndexByte(p, '\n'); i >= 0 {
			l, p = p[:i], p[i+1:]
		} else if complete {
			l, p = p, nil
		} else {
			break
		}
		l = bytes.TrimSuffix(l, []byte{'\r'})
		if len(l) > maxTableLineBytes {
			break
		}
		j := 0
		for j < len(l) && isSpace(l[j]) {
			j++
		}
		if j == len(l) || l[j] == '#' || l[j] == '%' {
			continue
		}
		rows = append(rows, l)
		nums = append(nums, line)
	}
	return rows, nums
}

// maxTableLineBytes bounds a line of a table read by columns, which may
// hold many more fields than an edge list.
const maxTableLineBytes = 1 << 16

// chooseFormat decides how to split the lines, from the options and the
// first rows. It returns the format and the line of a header row to skip
// (0: none).
func chooseFormat(r *bufio.Reader, file string, opt Options) (*lineFormat, int, error) {
	sep := byte(opt.Separator)
	switch opt.Separator {
	case DetectSeparator, Comma, Tab, Semicolon, Whitespace:
	default:
		return nil, 0, &Error{File: file, Msg: fmt.Sprintf("unknown separator %q", rune(sep))}
	}
	c := opt.Columns
	if c == nil {
		if sep != 0 {
			lf := sepFormat(sep)
			return lf, 0, checkFirstRow(r, file, lf)
		}
		lf := detectPlain(r)
		if lf.plain {
			return lf, 0, nil // the block parser checks the header
		}
		return lf, 0, checkFirstRow(r, file, lf)
	}
	if err := c.check(); err != nil {
		return nil, 0, &Error{File: file, Msg: strings.TrimPrefix(err.Error(), "netread: "), Err: err}
	}
	if c.Positions != nil {
		lf := &lineFormat{src: c.Positions[0] - 1, dst: c.Positions[1] - 1, wt: -1}
		if len(c.Positions) == 3 {
			lf.wt = c.Positions[2] - 1
		}
		lf.need = max(lf.src, lf.dst, lf.wt) + 1
		if sep == 0 {
			rows, nums := firstRows(r, 100)
			for k, row := range rows {
				if !hasSeparator(row) {
					continue
				}
				s, err := detectByCount(row, lf.need)
				if err != nil {
					return nil, 0, errorf(file, nums[k], "%s", err)
				}
				sep = s
				break
			}
			if sep == 0 {
				sep = ' '
			}
		}
		lf.sep = sep
		return lf, 0, checkFirstRow(r, file, lf)
	}
	// By name: the first non-comment row is the header.
	rows, nums := firstRows(r, 1)
	if len(rows) == 0 {
		return nil, 0, &Error{File: file, Line: 1, Msg: "no header row: the columns are chosen by name, so the first row must name them"}
	}
	head, line := rows[0], nums[0]
	cands := []byte{sep}
	if sep == 0 {
		cands = []byte{'\t', ';', ',', ' '}
	}
	type found struct {
		sep byte
		idx [3]int
	}
	var hits []found
	var best [][]byte
	for _, s := range cands {
		fields, msg := splitSep(head, s, nil)
		if msg != "" {
			continue
		}
		if len(fields) > len(best) {
			best = fields
		}
		idx := [3]int{-1, -1, -1}
		ok := true
		for k, name := range c.Names {
			idx[k] = headerIndex(fields, name)
			if idx[k] == -2 {
				return nil, 0, errorf(file, line, "column %q appears twice in the header", clip([]byte(name)))
			}
			ok = ok && idx[k] >= 0
		}
		if !ok {
			continue
		}
		present := s == ' ' || sep != 0 || hasUnquoted(head, s)
		if !present {
			continue
		}
		hits = append(hits, found{s, idx})
	}
	if len(hits) == 0 {
		var names []string
		for _, f := range best {
			names = append(names, strconv.Quote(clip(f)))
		}
		return nil, 0, errorf(file, line, "the header row has no column %s (its columns: %s)", missingNames(c.Names, best), clipList(names))
	}
	if len(hits) > 1 && hits[0].sep != ' ' && hits[1].sep != ' ' {
		return nil, 0, errorf(file, line, "the header row splits into the chosen columns at both %s and %s; set the separator", sepName(hits[0].sep), sepName(hits[1].sep))
	}
	h := hits[0]
	lf := &lineFormat{sep: h.sep, src: h.idx[0], dst: h.idx[1], wt: h.idx[2]}
	lf.need = max(lf.src, lf.dst, lf.wt) + 1
	return lf, line, nil
}

// missingNames lists the chosen names not in fields.
func missingNames(names []string, fields [][]byte) string {
	var out []string
	for _, n := range names {
		if headerIndex(fields, n) < 0 {
			out = append(out, strconv.Quote(clip([]byte(n))))
		}
	}
	return strings.Join(out, " or ")
}

// clipList joins items, at most 20 of them.
func clipList(items []string) string {
	if len(items) > 20 {
		return strings.Join(items[:20], ", ") + fmt.Sprintf(" and %d more", len(items)-20)
	}
	return strings.Join(items, ", ")
}

// headerIndex finds a column name in a header: exactly, else ignoring
// case and surrounding blanks. It returns -1 when absent, -2 when two
// columns match.
func headerIndex(fields [][]byte, name string) int {
	for i, f := range fields {
		if string(f) == name {
			return i
		}
	}
	at := -1
	for i, f := range fields {
		if strings.EqualFold(strings.TrimSpace(string(f)), strings.TrimSpace(name)) {
			if at >= 0 {
				return -2
			}
			at = i
		}
	}
	return at
}

// hasSeparator reports whether a row holds, outside quotes, any
// separator: a comma, semicolon, tab or space between fields.
func hasSeparator(row []byte) bool {
	t := bytes.TrimSpace(row)
	return hasUnquoted(t, ',') || hasUnquoted(t, ';') || hasUnquoted(t, '\t') || hasUnquoted(t, ' ')
}

// hasUnquoted reports whether c occurs in row outside double quotes.
func hasUnquoted(row []byte, c byte) bool {
	in := false
	for _, b := range row {
		switch {
		case b == '"':
			in = !in
		case b == c && !in:
			return true
		}
	}
	return false
}

// detectByCount picks the separator under which row has at least need
// fields: the one of comma, tab and semicolon the row holds, else white
// space.
func detectByCount(row []byte, need int) (byte, error) {
	var ok []byte
	for _, s := range []byte{',', '\t', ';'} {
		if !hasUnquoted(row, s) {
			continue
		}
		if f, msg := splitSep(row, s, nil); msg == "" && len(f) >= need {
			ok = append(ok, s)
		}
	}
	switch len(ok) {
	case 1:
		return ok[0], nil
	case 0:
		if f, msg := splitSep(row, ' ', nil); msg == "" && len(f) >= need {
			return ' ', nil
		}
		return 0, fmt.Errorf("the first row splits into fewer than %d fields at every separator; set the separator or choose other columns", need)
	}
	return 0, fmt.Errorf("the first row can be split at %s and at %s; set the separator", sepName(ok[0]), sepName(ok[1]))
}

// detectPlain keeps the edge-list format unless its first row would be an
// error there and one separator alone reads it: a single field holding a
// semicolon (a semicolon-separated file), or more than three fields that
// a comma, tab or semicolon alone splits into two or three (names with
// blanks).
func detectPlain(r *bufio.Reader) *lineFormat {
	rows, _ := firstRows(r, 1)
	if len(rows) == 0 {
		return plainFormat
	}
	row := rows[0]
	var t tokenizer
	t.unlimited = true
	f, msg := t.split(row)
	switch {
	case msg != "":
		return plainFormat
	case len(f) == 1:
		if hasUnquoted(row, ';') {
			if g, msg := splitSep(row, ';', nil); msg == "" && len(g) >= 2 {
				return sepFormat(';')
			}
		}
		return plainFormat
	case len(f) <= 3:
		return plainFormat
	}
	var ok []byte
	for _, s := range []byte{';', '\t', ','} {
		if !hasUnquoted(row, s) {
			continue
		}
		if g, msg := splitSep(row, s, nil); msg == "" && len(g) >= 2 && len(g) <= 3 {
			ok = append(ok, s)
		}
	}
	if len(ok) == 1 {
		return sepFormat(ok[0])
	}
	return plainFormat
}

// checkFirstRow refuses a header row where none is expected: the selected
// fields of the first row looking like column names (see headerMsg).
func checkFirstRow(r *bufio.Reader, file string, lf *lineFormat) error {
	rows, nums := firstRows(r, 1)
	if len(rows) == 0 {
		return nil
	}
	f, msg := splitSep(rows[0], lf.sep, nil)
	if msg != "" || len(f) < lf.need {
		return nil
	}
	sel := [][]byte{f[lf.src], f[lf.dst]}
	switch {
	case lf.wt >= 0 && lf.wt < len(f) && !lf.optWeight:
		sel = append(sel, f[lf.wt])
	case lf.optWeight && len(f) == 3:
		sel = append(sel, f[2])
	case lf.optWeight && len(f) > 3:
		sel = f
	}
	if isHeader(sel) {
		return errorf(file, nums[0], "%s", headerText(rows[0]))
	}
	return nil
}

// splitSep splits a table row at sep (' ' meaning runs of blanks), with
// CSV quoting; fields are appended to dst, quoted ones unescaped into
// fresh storage. A comment or blank line has no fields.
func splitSep(line []byte, sep byte, dst [][]byte) ([][]byte, string) {
	var t tokenizer
	return t.splitSep(line, sep, dst)
}

func isBlankIn(c, sep byte) bool {
	if c == sep {
		return false
	}
	return c == ' ' || c == '\t' || c == '\v' || c == '\f' || c == '\r'
}

// splitSep is splitSep with the tokenizer's buffers.
func (t *tokenizer) splitSep(line []byte, sep byte, dst [][]byte) ([][]byte, string) {
	t.buf = t.buf[:0]
	spans := t.spans[:0]
	i, n := 0, len(line)
	for i < n && isSpace(line[i]) {
		i++
	}
	if i == n || line[i] == '#' || line[i] == '%' {
		return dst[:0], ""
	}
	blank := func(c byte) bool {
		if sep == ' ' {
			return c == ' ' || c == '\t' || c == '\v' || c == '\f' || c == '\r'
		}
		return isBlankIn(c, sep)
	}
	isSep := func(c byte) bool {
		if sep == ' ' {
			return blank(c)
		}
		return c == sep
	}
	for {
		for i < n && blank(line[i]) {
			i++
		}
		var sp span
		if i < n && line[i] == '"' {
			i++
			sp.quoted = true
			sp.start = len(t.buf)
			closed := false
			for i < n {
				c := line[i]
				if c == '"' {
					if i+1 < n && line[i+1] == '"' {
						t.buf = append(t.buf, '"')
						i += 2
						continue
					}
					i++
					closed = true
					break
				}
				t.buf = append(t.buf, c)
				i++
			}
			if !closed {
				return nil, "unterminated quoted field"
			}
			sp.end = len(t.buf)
			for i < n && blank(line[i]) {
				i++
			}
			if i < n && !isSep(line[i]) {
				return nil, "text right after a closing quote"
			}
		} else {
			sp.start = i
			for i < n && !isSep(line[i]) {
				if line[i] == '"' {
					return nil, "quote inside an unquoted field (quote the whole field and double inner quotes)"
				}
				i++
			}
			sp.end = i
			for sp.end > sp.start && blank(line[sp.end-1]) {
				sp.end--
			}
		}
		spans = append(spans, sp)
		if sep == ' ' {
			for i < n && blank(line[i]) {
				i++
			}
			if i == n {
				break
			}
			continue
		}
		if i == n {
			break
		}
		i++ // the separator
		if i == n {
			spans = append(spans, span{start: i, end: i})
			break
		}
	}
	t.spans = spans
	dst = dst[:0]
	for _, sp := range spans {
		if sp.quoted {
			dst = append(dst, t.buf[sp.start:sp.end])
		} else {
			dst = append(dst, line[sp.start:sp.end])
		}
	}
	return dst, ""
}

// tableLine adds the edge (or isolated state) of one table row, or
// returns a message.
func (blk *block) tableLine(line []byte, weights bool) string {
	lf := blk.lf
	fields, msg := blk.tok.splitSep(line, lf.sep, blk.tok.fields)
	blk.tok.fields = fields[:0]
	if msg != "" {
		return msg
	}
	switch {
	case len(fields) == 0:
		return ""
	case len(fields) == 1:
		if msg := controlMsg(fields[0]); msg != "" {
			return msg
		}
		// A single field declares an isolated state, unless it holds
		// another separator unquoted: then the separator set is most
		// likely not the file's.
		for _, c := range []byte{',', '\t', ';'} {
			if c != lf.sep && !(lf.sep == ' ' && c == '\t') && hasUnquoted(line, c) {
				return "one field " + strconv.Quote(clip(fields[0])) + " holding a " + sepName(c) + " unquoted, where the separator is " + sepName(lf.sep) + ": quote it to declare an isolated state, or set the separator to " + sepName(c)
			}
		}
		return blk.addFields(fields, weights)
	case lf.optWeight && len(fields) > 3:
		return "want \"source target [weight]\" separated by " + sepName(lf.sep) + ", found " + strconv.Itoa(len(fields)) + " fields (choose columns to read a wider table)"
	case len(fields) < lf.need:
		return "row of " + strconv.Itoa(len(fields)) + " fields; the columns chosen need " + strconv.Itoa(lf.need)
	}
	var sel [3][]byte
	sel[0], sel[1] = fields[lf.src], fields[lf.dst]
	for _, f := range sel[:2] {
		if msg := controlMsg(f); msg != "" {
			return msg
		}
	}
	k := 2
	switch {
	case lf.optWeight && len(fields) == 3:
		sel[2] = fields[2]
		k = 3
	case !lf.optWeight && lf.wt >= 0:
		sel[2] = fields[lf.wt]
		k = 3
	}
	return blk.addFields(sel[:k], weights)
}

// readEdges reads an edge list or delimited table.
func readEdges(r *bufio.Reader, file string, opt Options) (*parsed, error) {
	b := structural.NewBuilder()
	if err := readEdgeList(r, file, b, opt); err != nil {
		return nil, err
	}
	g, err := finish(b, file, opt)
	if err != nil {
		markEdge(err)
		return nil, err
	}
	return &parsed{g: g}, nil
}

// markEdge records, in an *Error from Build about a non-finite weight,
// the edge a second pass can find the line of (see Options.locate).
func markEdge(err error) {
	var e *Error
	var we *structural.WeightError
	if errors.As(err, &e) && errors.As(err, &we) && we.Edge >= 0 {
		e.edge = we.Edge + 1
	}
}
