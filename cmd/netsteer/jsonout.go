package main

import (
	"bufio"
	"encoding/json"
	"fmt"
	"strconv"
	"unicode/utf8"
)

// jsonw writes one JSON object key by key, streaming long arrays of names
// without building them in memory. Errors stick and are reported by end.
type jsonw struct {
	w     *bufio.Writer
	first bool
	err   error
}

func newJSON(w *bufio.Writer) *jsonw {
	w.WriteByte('{')
	return &jsonw{w: w, first: true}
}

func (j *jsonw) key(k string) {
	if !j.first {
		j.w.WriteString(",")
	}
	j.first = false
	j.w.WriteString("\n  ")
	j.w.Write(appendJSONString(nil, k))
	j.w.WriteString(": ")
}

// val writes any value through encoding/json.
func (j *jsonw) val(k string, v any) {
	j.key(k)
	b, err := json.Marshal(v)
	if err != nil && j.err == nil {
		j.err = err
	}
	j.w.Write(b)
}

func (j *jsonw) int(k string, v int) {
	j.key(k)
	j.w.WriteString(strconv.Itoa(v))
}

func (j *jsonw) float(k string, v float64) {
	j.key(k)
	j.w.Write(strconv.AppendFloat(nil, v, 'g', -1, 64))
}

func (j *jsonw) bool(k string, v bool) {
	j.key(k)
	j.w.WriteString(strconv.FormatBool(v))
}

// timings writes the "timings" object: seconds per stage, in stage order.
func (j *jsonw) timings(stages []stage) {
	j.key("timings")
	j.w.WriteByte('{')
	for i, s := range stages {
		if i > 0 {
			j.w.WriteString(", ")
		}
		j.w.Write(appendJSONString(nil, s.name))
		fmt.Fprintf(j.w, ": %.6f", s.d.Seconds())
	}
	j.w.WriteByte('}')
}

// names writes an array of state names.
func (j *jsonw) names(k string, ids []int32, name func(int32) string) {
	j.key(k)
	writeNameArray(j.w, ids, name)
}

// nameLists writes an array of arrays of state names.
func (j *jsonw) nameLists(k string, lists [][]int32, name func(int32) string) {
	j.key(k)
	j.w.WriteByte('[')
	for i, l := range lists {
		if i > 0 {
			j.w.WriteByte(',')
		}
		j.w.WriteString("\n    ")
		writeNameArray(j.w, l, name)
	}
	if len(lists) > 0 {
		j.w.WriteString("\n  ")
	}
	j.w.WriteByte(']')
}

func writeNameArray(w *bufio.Writer, ids []int32, name func(int32) string) {
	w.WriteByte('[')
	var buf []byte
	for i, id := range ids {
		if i > 0 {
			w.WriteString(", ")
		}
		buf = appendJSONString(buf[:0], name(id))
		w.Write(buf)
	}
	w.WriteByte(']')
}

// end closes the object and flushes.
func (j *jsonw) end() error {
	j.w.WriteString("\n}\n")
	if err := j.w.Flush(); err != nil {
		return err
	}
	return j.err
}

// appendJSONString appends s as a JSON string. Invalid UTF-8 bytes become
// U+FFFD, as encoding/json does.
func appendJSONString(b []byte, s string) []byte {
	const hex = "0123456789abcdef"
	b = append(b, '"')
	for i := 0; i < len(s); {
		c := s[i]
		if c < utf8.RuneSelf {
			switch {
			case c == '"' || c == '\\':
				b = append(b, '\\', c)
			case c == '\n':
				b = append(b, '\\', 'n')
			case c == '\r':
				b = append(b, '\\', 'r')
			case c == '\t':
				b = append(b, '\\', 't')
			case c < 0x20 || c == '<' || c == '>' || c == '&':
				b = append(b, '\\', 'u', '0', '0', hex[c>>4], hex[c&0xf])
			default:
				b = append(b, c)
			}
			i++
			continue
		}
		r, size := utf8.DecodeRuneInString(s[i:])
		if r == utf8.RuneError && size == 1 {
			b = append(b, `\ufffd`...)
		} else if r == '\u2028' || r == '\u2029' {
			b = append(b, '\\', 'u', '2', '0', '2', hex[r&0xf])
		} else {
			b = append(b, s[i:i+size]...)
		}
		i += size
	}
	return append(b, '"')
}
