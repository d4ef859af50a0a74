package words

import (
	"fmt"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

// Quote returns a state name as reports print it: verbatim when it reads
// unambiguously in a comma-separated list, otherwise double-quoted
// CSV-style (inner quotes doubled), as design files accept it. Characters a
// terminal would not show (control and format characters, bidirectional
// controls among them, and invalid UTF-8) are written as Go escapes inside
// the quotes, so a name never corrupts a report or hides its difference
// from another.
func Quote(s string) string {
	if Plain(s) {
		return s
	}
	var b strings.Builder
	b.WriteByte('"')
	for i := 0; i < len(s); {
		r, size := utf8.DecodeRuneInString(s[i:])
		switch {
		case r == utf8.RuneError && size == 1:
			fmt.Fprintf(&b, `\x%02x`, s[i])
		case r == '"':
			b.WriteString(`""`)
		case r == ' ' || unicode.IsPrint(r) && !unicode.Is(unicode.Cf, r):
			b.WriteString(s[i : i+size])
		default:
			q := strconv.QuoteRune(r)
			b.WriteString(q[1 : len(q)-1])
		}
		i += size
	}
	b.WriteByte('"')
	return b.String()
}

// Plain reports whether s prints unquoted: not empty, no comment mark at
// its start, and only printable characters other than white space, commas,
// quotes and format characters.
func Plain(s string) bool {
	if s == "" || s[0] == '#' || s[0] == '%' {
		return false
	}
	for _, r := range s {
		if r == utf8.RuneError || r == ',' || r == '"' || unicode.IsSpace(r) || !unicode.IsPrint(r) || unicode.Is(unicode.Cf, r) {
			return false
		}
	}
	return true
}

// Escape returns s with the characters Quote escapes written as Go escapes,
// without quoting: for labels in pictures and pages.
func Escape(s string) string {
	q := Quote(s)
	if q == s {
		return s
	}
	return strings.ReplaceAll(q[1:len(q)-1], `""`, `"`)
}

// Plural returns one when n is 1, else many.
func Plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}

// Count returns "n things", singular when n is 1.
func Count(n int, one, many string) string { return strconv.Itoa(n) + " " + Plural(n, one, many) }

// List joins up to max items (all when max < 0 or all is set), noting how
// many more there are with the hint ("(12 more; HINT)").
func List(items []string, max int, all bool, hint string) string {
	if all || max < 0 || len(items) <= max {
		return strings.Join(items, ", ")
	}
	more := fmt.Sprintf("(%d more", len(items)-max)
	if hint != "" {
		more += "; " + hint
	}
	return strings.Join(items[:max], ", ") + " " + more + ")"
}

// Wrap breaks text into lines of at most width columns (longer words stay
// whole), the first line prefixed by first and the others by rest. A
// double-quoted name is one word, so a name is never split.
func Wrap(text string, width int, first, rest string) string {
	var b strings.Builder
	line, prefix := 0, first
	for i, w := range fields(text) {
		n := utf8.RuneCountInString(w)
		if i == 0 {
			b.WriteString(prefix)
			line = utf8.RuneCountInString(prefix)
		} else if line+1+n > width {
			b.WriteString("\n")
			b.WriteString(rest)
			line = utf8.RuneCountInString(rest)
		} else {
			b.WriteByte(' ')
			line++
		}
		b.WriteString(w)
		line += n
	}
	b.WriteByte('\n')
	return b.String()
}

// fields splits text at white space outside double quotes.
func fields(text string) []string {
	var out []string
	start, quoted := -1, false
	for i, r := range text {
		switch {
		case r == '"':
			quoted = !quoted
			if start < 0 {
				start = i
			}
		case unicode.IsSpace(r) && !quoted:
			if start >= 0 {
				out = append(out, text[start:i])
				start = -1
			}
		default:
			if start < 0 {
				start = i
			}
		}
	}
	if start >= 0 {
		out = append(out, text[start:])
	}
	return out
}
