package netread

import (
	"bufio"
	"bytes"
	"html"
	"io"
	"strconv"
	"strings"

	"github.com/netsteer/netsteer/structural"
)

// GML limits.
const (
	maxGMLToken = 1 << 20 // a string or number
	maxGMLDepth = 100     // nested lists
)

// gmlTok is a GML token.
type gmlTok int

const (
	gmlEOF gmlTok = iota
	gmlKey
	gmlNum
	gmlStr
	gmlOpen
	gmlClose
)

// gmlLexer tokenizes GML: keys, numbers, "strings" (HTML entities
// decoded, as the common writers encode), [ and ], # comments.
type gmlLexer struct {
	r    *bufio.Reader
	file string
	line int
	text []byte // the token's text (a string decoded)
	tok  gmlTok
}

func (l *gmlLexer) next() error {
	l.text = l.text[:0]
	for {
		c, err := l.r.ReadByte()
		if err == io.EOF {
			l.tok = gmlEOF
			return nil
		}
		if err != nil {
			return readError(l.file, l.line, err)
		}
		switch {
		case c == '\n':
			l.line++
		case c == ' ' || c == '\t' || c == '\r' || c == '\f' || c == '\v':
		case c == '#':
			for {
				c, err := l.r.ReadByte()
				if err != nil || c == '\n' {
					if c == '\n' {
						l.line++
					}
					break
				}
			}
		case c == '[':
			l.tok = gmlOpen
			return nil
		case c == ']':
			l.tok = gmlClose
			return nil
		case c == '"':
			start := l.line
			for {
				c, err := l.r.ReadByte()
				if err == io.EOF {
					return errorf(l.file, start, "unterminated string")
				}
				if err != nil {
					return readError(l.file, l.line, err)
				}
				if c == '"' {
					break
				}
				if c == '\n' {
					l.line++
				}
				if len(l.text) >= maxGMLToken {
					return errorf(l.file, start, "string longer than %d bytes", maxGMLToken)
				}
				l.text = append(l.text, c)
			}
			if bytes.IndexByte(l.text, '&') >= 0 {
				l.text = append(l.text[:0], html.UnescapeString(string(l.text))...)
			}
			l.tok = gmlStr
			return nil
		case c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c == '_' || c >= '0' && c <= '9' || c == '-' || c == '+' || c == '.':
			l.text = append(l.text, c)
			for {
				c, err := l.r.ReadByte()
				if err != nil {
					break
				}
				if !(isWordByte(c) || c == '-' || c == '+' || c == '.') {
					l.r.UnreadByte()
					break
				}
				if len(l.text) >= maxGMLToken {
					return errorf(l.file, l.line, "token longer than %d bytes", maxGMLToken)
				}
				l.text = append(l.text, c)
			}
			if f := l.text[0]; f >= 'a' && f <= 'z' || f >= 'A' && f <= 'Z' || f == '_' {
				// INF and NAN are numbers some writers use.
				switch string(bytes.ToUpper(l.text)) {
				case "INF", "NAN":
					l.tok = gmlNum
				default:
					l.tok = gmlKey
				}
				return nil
			}
			l.tok = gmlNum
			return nil
		default:
			return errorf(l.file, l.line, "unexpected character %q", c)
		}
	}
}

// gmlNode is what a node list says.
type gmlNode struct {
	label, name, group string
	hasLabel, hasName  bool
	line               int
}

// readGML reads a GML graph as the common network libraries write it: a
// "graph [ ... ]" with "directed 1" (without it, the graph is undirected,
// as those libraries read it), "node [ id ... label ... ]" and
// "edge [ source ... target ... ]". A state is named by its label when
// every node has one and they are distinct (networkx's convention), else by
// its name attribute likewise (igraph's), else by its id; labels not used
// as names are returned as labels, group attributes as groups.
func readGML(r *bufio.Reader, file string, opt Options) (*parsed, error) {
	l := &gmlLexer{r: r, file: file, line: 1}
	ids := structural.NewBuilder() // node ids, in order of first mention
	var (
		nodes     []gmlNode
		declared  []bool
		eSrc      []int32
		eDst      []int32
		eW        []float64
		eHasW     []bool
		pending   = map[int32]mention{}
		directed  = false
		graphs    int
		wkey      = weightKey(opt)
		idText    []byte
		textScrap []byte
	)
	fail := func(format string, args ...any) (*parsed, error) {
		return nil, errorf(file, l.line, format, args...)
	}
	// idOf interns a node id (a number, normalised, or a string).
	idOf := func() (int32, string) {
		idText = append(idText[:0], l.text...)
		if l.tok == gmlNum {
			if v, err := strconv.ParseInt(string(idText), 10, 64); err == nil {
				idText = strconv.AppendInt(idText[:0], v, 10)
			}
		}
		if msg := nameMsg(idText); msg != "" {
			return -1, msg
		}
		v, err := ids.Intern(idText)
		if err != nil {
			return -1, trimStructural(err.Error())
		}
		for int(v) >= len(nodes) {
			nodes = append(nodes, gmlNode{})
			declared = append(declared, false)
		}
		return v, ""
	}
	// skipValue skips the value after a key.
	skipValue := func() error {
		if err := l.next(); err != nil {
			return err
		}
		switch l.tok {
		case gmlNum, gmlStr:
			return nil
		case gmlOpen:
			depth := 1
			for depth > 0 {
				if err := l.next(); err != nil {
					return err
				}
				switch l.tok {
				case gmlOpen:
					depth++
					if depth > maxGMLDepth {
						return errorf(file, l.line, "lists nested more than %d deep", maxGMLDepth)
					}
				case gmlClose:
					depth--
				case gmlEOF:
					return errorf(file, l.line, "the file ends inside a list")
				}
			}
			return nil
		}
		return errorf(file, l.line, "want a value after the key")
	}
	// scalar reads the value after a key as text.
	scalar := func(key string) error {
		if err := l.next(); err != nil {
			return err
		}
		if l.tok != gmlNum && l.tok != gmlStr {
			return errorf(file, l.line, "%s: want a number or a string", key)
		}
		return nil
	}
	// list reads "[ key value ... ]", calling f at each key; f reads or
	// skips the value.
	list := func(f func(key string) error) error {
		if err := l.next(); err != nil {
			return err
		}
		if l.tok != gmlOpen {
			return errorf(file, l.line, "want [ after the key")
		}
		for {
			if err := l.next(); err != nil {
				return err
			}
			switch l.tok {
			case gmlClose:
				return nil
			case gmlKey:
				if err := f(string(l.text)); err != nil {
					return err
				}
			case gmlEOF:
				return errorf(file, l.line, "the file ends inside a list (a ] is missing)")
			default:
				return errorf(file, l.line, "want a key, found %q", clip(l.text))
			}
		}
	}
	text := func(what string) (string, error) {
		textScrap = append(textScrap[:0], l.text...)
		if len(textScrap) > maxLabelBytes {
			return "", errorf(file, l.line, "%s of %d bytes; the limit is %d", what, len(textScrap), maxLabelBytes)
		}
		s := strings.NewReplacer("\r\n", " ", "\n", " ", "\r", " ", "\t", " ").Replace(string(textScrap))
		if msg := controlMsg(s); msg != "" {
			return "", errorf(file, l.line, "%s: %s", what, strings.Replace(msg, "a node name", "the value", 1))
		}
		return s, nil
	}
	node := func() error {
		var nd gmlNode
		nd.line = l.line
		id := int32(-1)
		err := list(func(key string) error {
			switch key {
			case "id":
				if err := scalar(key); err != nil {
					return err
				}
				v, msg := idOf()
				if msg != "" {
					return errorf(file, l.line, "%s", msg)
				}
				if declared[v] {
					return errorf(file, l.line, "node id %q declared twice", clip(idText))
				}
				id = v
			case "label", "name", "group":
				if err := scalar(key); err != nil {
					return err
				}
				s, err := text(key)
				if err != nil {
					return err
				}
				switch key {
				case "label":
					nd.label, nd.hasLabel = s, true
				case "name":
					nd.name, nd.hasName = s, true
				default:
					nd.group = s
				}
			default:
				return skipValue()
			}
			return nil
		})
		if err != nil {
			return err
		}
		if id < 0 {
			return errorf(file, nd.line, "node without an id")
		}
		nodes[id], declared[id] = nd, true
		delete(pending, id)
		return nil
	}
	edge := func() error {
		line := l.line
		src, dst := int32(-1), int32(-1)
		w, hasW := 0.0, false
		err := list(func(key string) error {
			switch {
			case key == "source" || key == "target":
				if err := scalar(key); err != nil {
					return err
				}
				v, msg := idOf()
				if msg != "" {
					return errorf(file, l.line, "%s", msg)
				}
				if !declared[v] {
					if _, ok := pending[v]; !ok {
						pending[v] = mention{l.line, string(idText)}
					}
				}
				if key == "source" {
					src = v
				} else {
					dst = v
				}
			case key == wkey:
				if err := scalar(key); err != nil {
					return err
				}
				x, msg := checkWeight(string(l.text))
				if msg != "" {
					return errorf(file, l.line, "%s", msg)
				}
				w, hasW = x, true
			default:
				return skipValue()
			}
			return nil
		})
		if err != nil {
			return err
		}
		if src < 0 || dst < 0 {
			return errorf(file, line, "edge without source and target")
		}
		eSrc, eDst = append(eSrc, src), append(eDst, dst)
		if opt.Weights {
			eW, eHasW = append(eW, w), append(eHasW, hasW)
		}
		return nil
	}
	for {
		if err := l.next(); err != nil {
			return nil, err
		}
		if l.tok == gmlEOF {
			break
		}
		if l.tok != gmlKey {
			return fail("want a key, found %q", clip(l.text))
		}
		if string(l.text) != "graph" {
			if err := skipValue(); err != nil {
				return nil, err
			}
			continue
		}
		graphs++
		if graphs > 1 {
			return fail("a second graph; a GML file must hold one network")
		}
		err := list(func(key string) error {
			switch key {
			case "directed":
				if err := scalar(key); err != nil {
					return err
				}
				switch string(l.text) {
				case "0":
					directed = false
				case "1":
					directed = true
				default:
					return errorf(file, l.line, "directed %q: want 0 or 1", clip(l.text))
				}
			case "node":
				return node()
			case "edge":
				return edge()
			default:
				return skipValue()
			}
			return nil
		})
		if err != nil {
			return nil, err
		}
	}
	if graphs == 0 {
		return nil, &Error{File: file, Line: l.line, Msg: "not a GML graph: no \"graph [ ... ]\""}
	}
	var first *mention
	for _, m := range pending {
		if first == nil || m.line < first.line || m.line == first.line && m.id < first.id {
			first = &m
		}
	}
	if first != nil {
		return nil, errorf(file, first.line, "edge names node id %q, which is never declared", clip([]byte(first.id)))
	}
	// Names: labels, else name attributes, else ids.
	distinct := func(get func(*gmlNode) (string, bool)) bool {
		seen := structural.NewBuilder()
		for i := range nodes {
			s, ok := get(&nodes[i])
			if !ok || nameMsg([]byte(s)) != "" {
				return false
			}
			if v, err := seen.Intern([]byte(s)); err != nil || int(v) != i {
				return false
			}
		}
		return true
	}
	byLabel := distinct(func(n *gmlNode) (string, bool) { return n.label, n.hasLabel })
	byName := !byLabel && distinct(func(n *gmlNode) (string, bool) { return n.name, n.hasName })
	b := ids // named by id: the id table is the name table
	if byLabel || byName {
		b = structural.NewBuilder()
		for i := range nodes {
			name := nodes[i].name
			if byLabel {
				name = nodes[i].label
			}
			if _, err := b.Intern([]byte(name)); err != nil {
				return nil, errorf(file, nodes[i].line, "%s", trimStructural(err.Error()))
			}
		}
	}
	var labels, groups []string
	for i := range nodes {
		if !byLabel && nodes[i].hasLabel {
			setAt(&labels, int32(i), nodes[i].label)
		}
		if nodes[i].group != "" {
			setAt(&groups, int32(i), nodes[i].group)
		}
	}
	undirected := !directed
	for k := range eSrc {
		u, v := eSrc[k], eDst[k]
		add := func(a, c int32) {
			if opt.Weights && eHasW[k] {
				b.AddWeightedEdge(a, c, eW[k])
			} else {
				b.AddEdge(a, c)
			}
		}
		add(u, v)
		if undirected && u != v {
			add(v, u)
		}
	}
	g, err := finish(b, file, opt)
	if err != nil {
		return nil, err
	}
	return &parsed{g: g, labels: padded(labels, g.N()), groups: padded(groups, g.N())}, nil
}
