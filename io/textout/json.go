package textout

import (
	"bufio"
	"io"
	"reflect"
)

// JSON writes v as JSON laid out by IndentJSON, with a final newline:
// what --format json prints. It streams (see jsonstream.go): memory stays
// small whatever the size of the output.
func JSON(w io.Writer, v any) error {
	bw := bufio.NewWriterSize(w, 1<<16)
	e := &encoder{w: &indenter{w: bw}}
	e.value(reflect.ValueOf(v))
	if e.err != nil {
		return e.err
	}
	bw.WriteByte('\n')
	return bw.Flush()
}

// IndentJSON lays out compact JSON one key per line, two spaces a level,
// keeping arrays that hold no object or array on one line (lists of names
// stay readable and grep-able).
func IndentJSON(src []byte) []byte {
	out := make([]byte, 0, len(src)+len(src)/4)
	depth := 0
	newline := func() {
		out = append(out, '\n')
		for i := 0; i < depth; i++ {
			out = append(out, ' ', ' ')
		}
	}
	flat := 0 // > 0 inside an array of scalars
	for i := 0; i < len(src); i++ {
		c := src[i]
		switch {
		case c == '"':
			j := i + 1
			for ; src[j] != '"'; j++ {
				if src[j] == '\\' {
					j++
				}
			}
			out = append(out, src[i:j+1]...)
			i = j
		case flat > 0:
			out = append(out, c)
			if c == ',' {
				out = append(out, ' ')
			}
			if c == ']' {
				flat--
			}
		case c == '[' && scalarArray(src[i:]):
			out = append(out, c)
			flat++
		case c == '{' || c == '[':
			out = append(out, c)
			if src[i+1] == '}' || src[i+1] == ']' {
				out = append(out, src[i+1])
				i++
				continue
			}
			depth++
			newline()
		case c == '}' || c == ']':
			depth--
			newline()
			out = append(out, c)
		case c == ',':
			out = append(out, c)
			newline()
		case c == ':':
			out = append(out, ':', ' ')
		default:
			out = append(out, c)
		}
	}
	return out
}

// scalarArray reports whether the array starting at s[0] holds no object
// or array.
func scalarArray(s []byte) bool {
	for i := 1; i < len(s); i++ {
		switch s[i] {
		case '"':
			for i++; s[i] != '"'; i++ {
				if s[i] == '\\' {
					i++
				}
			}
		case '{', '[':
			return false
		case ']':
			return true
		}
	}
	return true
}
