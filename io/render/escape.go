package render

import (
	"strings"
	"unicode/utf8"
)

// maxLabelRunes bounds the name shown inside a node; the whole name goes
// to the tooltip.
const maxLabelRunes = 36

// maxTooltipRunes bounds a tooltip.
const maxTooltipRunes = 300

// clean makes s printable in any XML document: invalid UTF-8 becomes
// U+FFFD, and control characters (which XML 1.0 forbids, even as character
// references) become their visible Unicode control pictures (U+2400 block:
// a tab shows as ␉). When max > 0 the result is cut to max runes with an
// ellipsis.
func clean(s string, max int) string {
	ok := true
	n := 0
	for i := 0; i < len(s); i++ {
		c := s[i]
		if c < 0x20 || c == 0x7f || c >= utf8.RuneSelf {
			ok = false
			break
		}
		n++
	}
	if ok && (max <= 0 || n <= max) {
		return s
	}
	var b strings.Builder
	b.Grow(len(s))
	count := 0
	for i := 0; i < len(s); {
		if max > 0 && count == max {
			b.WriteString("…")
			break
		}
		r, size := utf8.DecodeRuneInString(s[i:])
		i += size
		count++
		switch {
		case r == utf8.RuneError && size == 1:
			b.WriteRune(utf8.RuneError)
		case r < 0x20:
			b.WriteRune(0x2400 + r)
		case r == 0x7f:
			b.WriteRune(0x2421)
		case r >= 0x80 && r < 0xa0, r == 0xfffe, r == 0xffff:
			// C1 controls and non-characters: not allowed (or
			// discouraged) in XML.
			b.WriteRune(utf8.RuneError)
		default:
			b.WriteRune(r)
		}
	}
	return b.String()
}

// dotLabel returns s as a quoted DOT string for a label attribute. Inside
// Graphviz a quoted label goes through two decodings: the DOT lexer turns \"
// into a quote, then label expansion turns \\ into a backslash, expands
// escapes such as \N and \G, and decodes HTML entities. So backslashes are
// doubled, quotes escaped and ampersands written as &amp;; the name then
// shows verbatim and reaches the SVG as escaped text.
func dotLabel(s string) string {
	return quote(clean(s, maxLabelRunes), `\\`)
}

// dotTooltip is dotLabel for a tooltip, which Graphviz expands twice: a
// backslash needs four.
func dotTooltip(s string) string {
	return quote(clean(s, maxTooltipRunes), `\\\\`)
}

// dotPlain quotes a string that needs no escape processing: it is written
// as a label too, so it gets the same treatment.
func dotPlain(s string) string { return quote(clean(s, 0), `\\`) }

func quote(s, backslash string) string {
	var b strings.Builder
	b.Grow(len(s) + 2)
	b.WriteByte('"')
	for i := 0; i < len(s); i++ {
		switch c := s[i]; c {
		case '\\':
			b.WriteString(backslash)
		case '"':
			b.WriteString(`\"`)
		case '&':
			b.WriteString("&amp;")
		default:
			b.WriteByte(c)
		}
	}
	b.WriteByte('"')
	return b.String()
}

// htmlText escapes s for a Graphviz HTML-like label: XML escapes, and a
// doubled backslash, since HTML-like labels still expand \N and friends.
func htmlText(s string) string {
	s = clean(s, 0)
	var b strings.Builder
	b.Grow(len(s))
	for i := 0; i < len(s); i++ {
		switch c := s[i]; c {
		case '&':
			b.WriteString("&amp;")
		case '<':
			b.WriteString("&lt;")
		case '>':
			b.WriteString("&gt;")
		case '"':
			b.WriteString("&quot;")
		case '\'':
			b.WriteString("&#39;")
		case '\\':
			b.WriteString(`\\`)
		default:
			b.WriteByte(c)
		}
	}
	return b.String()
}

// Shown returns the text a picture shows for name s: what a test should
// look for in the SVG (after XML decoding). Names longer than the label
// limit are cut with an ellipsis.
func Shown(s string) string { return clean(name(s), maxLabelRunes) }
