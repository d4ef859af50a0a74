package netread

import (
	"bytes"
)

// sniffBytes is how much of the (decompressed) input Sniff is shown.
const sniffBytes = 64 << 10

// Sniff returns the format the start of an input announces, or "" when it
// announces none (then the extension decides, and an edge list is the
// default). Only unmistakable openings count:
//
//	Matrix Market  the banner %%MatrixMarket
//	GraphML        <?xml, <!-- or <graphml
//	node-link JSON {
//	Pajek          a first line *Vertices, *Network, *Arcs, *Edges, *Arcslist,
//	               *Edgeslist or *Matrix (any case), after % comments
//	GML            a key "graph" followed by "[", after # comments and
//	               key-value pairs such as Creator "..." or Version 1
//	DOT            [strict] graph|digraph [ID] {, after comments
//
// No edge list starts so: the first line of each would be an error, or an
// edge between states named like these keywords and brackets.
func Sniff(p []byte) Format {
	p = bytes.TrimPrefix(p, []byte(utf8BOM))
	i := skipBlank(p, 0)
	if i == len(p) {
		return ""
	}
	rest := p[i:]
	switch {
	case hasPrefixFold(rest, "%%MatrixMarket"):
		return MatrixMarket
	case bytes.HasPrefix(rest, []byte("<?xml")), bytes.HasPrefix(rest, []byte("<!--")), bytes.HasPrefix(rest, []byte("<graphml")):
		return GraphML
	case rest[0] == '{':
		return NodeLinkJSON
	}
	if sniffPajek(p) {
		return Pajek
	}
	if sniffGML(p) {
		return GML
	}
	if sniffDOT(p) {
		return DOT
	}
	return ""
}

// jsonObjectStart reports whether p opens a JSON object: '{', then blanks,
// then a member name or the closing brace.
func jsonObjectStart(p []byte) bool {
	p = bytes.TrimPrefix(p, []byte(utf8BOM))
	i := skipBlank(p, 0)
	if i == len(p) || p[i] != '{' {
		return false
	}
	i = skipBlank(p, i+1)
	return i == len(p) || p[i] == '"' || p[i] == '}'
}

func skipBlank(p []byte, i int) int {
	for i < len(p) && (p[i] == ' ' || p[i] == '\t' || p[i] == '\r' || p[i] == '\n' || p[i] == '\f' || p[i] == '\v') {
		i++
	}
	return i
}

func hasPrefixFold(p []byte, s string) bool {
	return len(p) >= len(s) && bytes.EqualFold(p[:len(s)], []byte(s))
}

// skipLine returns the index after the line break at or after i.
func skipLine(p []byte, i int) int {
	if k := bytes.IndexByte(p[i:], '\n'); k >= 0 {
		return i + k + 1
	}
	return len(p)
}

var pajekSections = []string{"*vertices", "*network", "*arcslist", "*edgeslist", "*arcs", "*edges", "*matrix"}

// sniffPajek: after % comment lines, a line starting with a section word.
func sniffPajek(p []byte) bool {
	i := skipBlank(p, 0)
	for i < len(p) && p[i] == '%' {
		i = skipBlank(p, skipLine(p, i))
	}
	if i == len(p) || p[i] != '*' {
		return false
	}
	for _, s := range pajekSections {
		if hasPrefixFold(p[i:], s) {
			j := i + len(s)
			return j == len(p) || !isWordByte(p[j])
		}
	}
	return false
}

func isWordByte(c byte) bool {
	return c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c >= '0' && c <= '9' || c == '_'
}

// sniffGML: # comment lines and key-value pairs (values numbers or
// strings), then the key graph and a "[".
func sniffGML(p []byte) bool {
	i := 0
	for pairs := 0; pairs < 32; pairs++ {
		i = skipBlank(p, i)
		for i < len(p) && p[i] == '#' {
			i = skipBlank(p, skipLine(p, i))
		}
		j := i
		for j < len(p) && isWordByte(p[j]) {
			j++
		}
		if j == i || p[i] >= '0' && p[i] <= '9' {
			return false
		}
		key := p[i:j]
		i = skipBlank(p, j)
		if i == len(p) {
			return false
		}
		if p[i] == '[' {
			return string(key) == "graph"
		}
		// A value: a string or a number, on the same logical pair.
		switch {
		case p[i] == '"':
			k := bytes.IndexByte(p[i+1:], '"')
			if k < 0 {
				return false
			}
			i += k + 2
		case p[i] == '-' || p[i] == '+' || p[i] == '.' || p[i] >= '0' && p[i] <= '9':
			for i < len(p) && !isBlankByte(p[i]) {
				i++
			}
		default:
			return false
		}
	}
	return false
}

func isBlankByte(c byte) bool {
	return c == ' ' || c == '\t' || c == '\r' || c == '\n' || c == '\f' || c == '\v'
}

// sniffDOT: comments, then [strict] graph|digraph [ID] {.
func sniffDOT(p []byte) bool {
	i := 0
	skip := func() {
		for {
			i = skipBlank(p, i)
			switch {
			case i < len(p) && p[i] == '#', i+1 < len(p) && p[i] == '/' && p[i+1] == '/':
				i = skipLine(p, i)
			case i+1 < len(p) && p[i] == '/' && p[i+1] == '*':
				k := bytes.Index(p[i+2:], []byte("*/"))
				if k < 0 {
					i = len(p)
					return
				}
				i += k + 4
			default:
				return
			}
		}
	}
	word := func() string {
		j := i
		for j < len(p) && isWordByte(p[j]) {
			j++
		}
		w := string(bytes.ToLower(p[i:j]))
		i = j
		return w
	}
	skip()
	w := word()
	if w == "strict" {
		skip()
		w = word()
	}
	if w != "graph" && w != "digraph" {
		return false
	}
	skip()
	if i < len(p) && p[i] == '{' {
		return true
	}
	// An ID: a word, a number, a quoted string or an HTML string.
	switch {
	case i < len(p) && p[i] == '"':
		k := i + 1
		for k < len(p) && p[k] != '"' {
			if p[k] == '\\' {
				k++
			}
			k++
		}
		i = k + 1
	case i < len(p) && p[i] == '<':
		k := bytes.IndexByte(p[i:], '{')
		if k < 0 {
			return false
		}
		i += k
	default:
		j := i
		for j < len(p) && (isWordByte(p[j]) || p[j] == '.' || p[j] == '-' || p[j] >= 0x80) {
			j++
		}
		if j == i {
			return false
		}
		i = j
	}
	skip()
	return i < len(p) && p[i] == '{'
}
