package netread

import (
	"bytes"
	"fmt"
	"strconv"

	"github.com/netsteer/netsteer/io/internal/source"
)

// maxLineBytes bounds an edge-list line: two quoted names at the limit,
// doubled quotes and a weight.
const maxLineBytes = 4*MaxNameBytes + 256

// clip shortens a field for an error message (see Clip).
func clip(b []byte) string {
	if len(b) > 40 {
		return source.Clip(string(b[:min(len(b), 48)]), 40)
	}
	return string(b)
}

// tokenizer splits edge-list lines. Fields are separated by white space or
// one comma (with optional white space around it). A field that starts with
// a double quote runs to the matching quote, "" standing for one quote
// inside. A line whose first non-blank byte is '#' or '%' is a comment.
type tokenizer struct {
	fields    [][]byte
	buf       []byte // unescaped quoted fields
	unlimited bool   // allow any number of fields (design files)
	spans     []span
}

// span locates one field: in buf when quoted, else in the line.
type span struct {
	quoted     bool
	start, end int
}

func isSpace(c byte) bool { return c == ' ' || c == '\t' || c == '\v' || c == '\f' || c == '\r' }

// split returns the fields of line, or an error message.
func (t *tokenizer) split(line []byte) ([][]byte, string) {
	t.fields = t.fields[:0]
	t.buf = t.buf[:0]
	i, n := 0, len(line)
	for i < n && isSpace(line[i]) {
		i++
	}
	if i == n || line[i] == '#' || line[i] == '%' {
		return t.fields, ""
	}
	// Quoted fields are unescaped into buf; record offsets first, since buf
	// may move while it grows.
	limit := 3
	if t.unlimited {
		limit = int(^uint(0) >> 1)
	}
	spans := t.spans[:0]
	for {
		// At the start of a field.
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
				return nil, "unterminated quoted name"
			}
			sp.end = len(t.buf)
			if i < n && !isSpace(line[i]) && line[i] != ',' {
				return nil, "text right after a closing quote"
			}
		} else {
			sp.start = i
			for i < n && !isSpace(line[i]) && line[i] != ',' {
				if line[i] == '"' {
					return nil, "quote inside an unquoted name (quote the whole name and double inner quotes)"
				}
				i++
			}
			sp.end = i
		}
		if len(spans) == limit {
			return nil, "want \"source target [weight]\", found more than 3 fields (choose columns to read a wider table)"
		}
		spans = append(spans, sp)
		// Separator: white space, optionally one comma.
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
				// A trailing comma leaves an empty last field.
				if len(spans) == limit {
					return nil, "want \"source target [weight]\", found more than 3 fields (choose columns to read a wider table)"
				}
				spans = append(spans, span{start: i, end: i})
				break
			}
		}
	}
	t.spans = spans
	for _, sp := range spans {
		if sp.quoted {
			t.fields = append(t.fields, t.buf[sp.start:sp.end])
		} else {
			t.fields = append(t.fields, line[sp.start:sp.end])
		}
	}
	return t.fields, ""
}

// SplitFields splits one line the way edge lists are split (white space or
// a comma between fields, double-quoted names, '#' and '%' comments), with
// no limit on the number of fields. It returns an error message for a
// malformed line.
// Every field is a name, so a control character in any field is an error
// (see controlMsg).
func SplitFields(line []byte) ([]string, string) {
	var t tokenizer
	t.unlimited = true
	f, msg := t.split(line)
	if msg != "" {
		return nil, msg
	}
	for _, b := range f {
		if msg := controlMsg(b); msg != "" {
			return nil, msg
		}
	}
	out := make([]string, len(f))
	for i, b := range f {
		out[i] = string(b)
	}
	return out, msg
}

// isControl reports the bytes a name may not hold: C0 controls other than
// tab, and DEL. (Unquoted, tab and the other white-space controls separate
// fields; quoted, a tab is kept.)
func isControl(c byte) bool { return c < 0x20 && c != '\t' || c == 0x7f }

// controlMsg returns the error message for a name that holds a control
// character, or "".
func controlMsg[T string | []byte](name T) string {
	for i := 0; i < len(name); i++ {
		if c := name[i]; isControl(c) {
			return fmt.Sprintf("control character 0x%02x in a node name", c)
		}
	}
	return ""
}

// headerPairs are the column names that make a first line a CSV header
// (compared without regard to case); headerWeights are the names of a third
// column. The list is kept short on purpose: a first edge between two
// states with other names is always read as an edge.
var (
	headerPairs   = [][2]string{{"source", "target"}, {"from", "to"}, {"src", "dst"}, {"tail", "head"}}
	headerWeights = []string{"weight", "value", "w"}
)

// headerMsg returns the error message for the first non-comment line of an
// edge list when it looks like a CSV header, or "".
func headerMsg(line []byte) string {
	if len(line) > maxLineBytes {
		return ""
	}
	var t tokenizer
	t.unlimited = true
	f, msg := t.split(line)
	if msg != "" || !isHeader(f) {
		return ""
	}
	return headerText(line)
}

// isHeader reports whether the fields of a first line are column names.
// They are when
//   - the first two fields are one of headerPairs, unless there are exactly
//     three fields and the third is a number (an edge with a weight), or
//   - there are exactly three fields and the third is one of headerWeights
//     (no edge has a weight that is a word).
func isHeader(f [][]byte) bool {
	if len(f) < 2 {
		return false
	}
	header := false
	for _, p := range headerPairs {
		if bytes.EqualFold(f[0], []byte(p[0])) && bytes.EqualFold(f[1], []byte(p[1])) {
			header = true
		}
	}
	if len(f) == 3 {
		if _, err := strconv.ParseFloat(string(f[2]), 64); err == nil {
			header = false
		}
		for _, w := range headerWeights {
			if bytes.EqualFold(f[2], []byte(w)) {
				header = true
			}
		}
	}
	return header
}

// headerText is the message for a header row where none is expected.
func headerText(line []byte) string {
	return strconv.Quote(clip(bytes.TrimSpace(line))) + " looks like a header row; choose the columns by name to read it, or comment it out with #"
}

// NameProblem says what is wrong with a state name read from a table or
// design file ("" when nothing is): empty, longer than MaxNameBytes, or
// holding a control character (a byte below 0x20 other than tab, or 0x7f),
// as the network readers refuse them.
func NameProblem(name string) string {
	switch {
	case name == "":
		return "empty node name"
	case len(name) > MaxNameBytes:
		return "node name of " + strconv.Itoa(len(name)) + " bytes; the limit is " + strconv.Itoa(MaxNameBytes)
	}
	return controlMsg(name)
}

// Clip shortens a value echoed in a message to at most 40 bytes (cut at
// a character boundary, marked "..."), so that a 10 MB cell is not
// repeated whole.
func Clip(s string) string { return source.Clip(s, 40) }
