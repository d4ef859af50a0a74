package netread

import (
	"bufio"
	"bytes"
	"fmt"
	"io"
	"math"
	"regexp"
	"slices"
	"strconv"
	"strings"

	"gonum.org/v1/gonum/graph/formats/dot"
	"gonum.org/v1/gonum/graph/formats/dot/ast"

	"github.com/netsteer/netsteer/io/internal/source"
	"github.com/netsteer/netsteer/structural"
)

// DOT limits. The DOT grammar is parsed by gonum's parser, which holds the
// whole file and its syntax tree in memory and checks edge chains and
// nested subgraphs recursively; these bounds keep both in reach.
const (
	// MaxDOTBytes is the largest DOT input read (after decompression).
	// Larger networks belong in an edge list or a Matrix Market file.
	MaxDOTBytes = 64 << 20
	// maxDOTDepth bounds the nesting of braces.
	maxDOTDepth = 1000
	// maxDOTChain bounds the edge operators of one chain a -> b -> c ...,
	// summed over the chains that enclose a nested subgraph.
	maxDOTChain = 100000
	// dotFreeEdges is how many edges subgraph operands ({a b} -> {c d})
	// may expand to beyond 16 per byte of input.
	dotFreeEdges = 1 << 22
)

// readDOT reads a DOT graph: "u -> v" is the edge u -> v, "u -- v" in an
// undirected graph the two couplings u -> v and v -> u.
func readDOT(r *bufio.Reader, file string, opt Options) (*parsed, error) {
	src, err := io.ReadAll(io.LimitReader(r, MaxDOTBytes+1))
	if err != nil {
		return nil, readError(file, 0, err)
	}
	if len(src) > MaxDOTBytes {
		return nil, &Error{File: file, Msg: fmt.Sprintf("DOT input larger than %d MiB; write big networks as an edge list or a Matrix Market file", MaxDOTBytes>>20)}
	}
	src = bytes.TrimPrefix(src, []byte(utf8BOM))
	// gonum's lexer ends a // or # comment at a newline only.
	if len(src) == 0 || src[len(src)-1] != '\n' {
		src = append(src, '\n')
	}
	sc, e := scanDOT(src, file)
	if e != nil {
		return nil, e
	}
	if len(sc.graphs) == 0 {
		if len(sc.ids) == 0 && len(sc.ops) == 0 {
			return nil, &Error{File: file, Msg: "empty network: no graph in the file"}
		}
		// Text, but no graph: most likely not a DOT file at all.
		line := sc.ops
		if len(sc.ids) > 0 {
			line = sc.ids
		}
		return nil, errorf(file, int(line[0]), "not a DOT graph: want \"digraph { u -> v; ... }\" (is this an edge list? then read it as one)")
	}
	if len(sc.graphs) > 1 {
		return nil, errorf(file, int(sc.graphs[1]), "a second graph; a DOT file must hold one network")
	}
	f, err := parseDOT(src)
	if err != nil {
		return nil, dotParseError(file, err)
	}
	if len(f.Graphs) != 1 {
		return nil, &Error{File: file, Msg: fmt.Sprintf("%d graphs in the file; a DOT file must hold one network", len(f.Graphs))}
	}
	g := f.Graphs[0]
	d := &dotReader{file: file, b: structural.NewBuilder(), weights: opt.Weights, directed: g.Directed, weightKey: weightKey(opt)}
	d.maxEdges = 16*int64(len(src)) + dotFreeEdges
	// Lines come from the scan when its token counts agree with the tree.
	var ids, ops int
	countDOT(g.Stmts, &ids, &ops)
	if g.ID != "" {
		ids++
	}
	if ids == len(sc.ids) && ops == len(sc.ops) {
		d.ids, d.ops = sc.ids, sc.ops
	}
	if g.ID != "" {
		d.idk++
	}
	if err := d.stmts(g.Stmts, dotScope{}, 0); err != nil {
		return nil, err
	}
	if !g.Directed {
		opt.Build.Undirected = true
	}
	net, err := finish(d.b, file, opt)
	if err != nil {
		return nil, err
	}
	return &parsed{g: net, labels: padded(d.labels, net.N()), groups: padded(d.groups, net.N())}, nil
}

// weightKey returns the name of the weight attribute.
func weightKey(opt Options) string {
	if opt.WeightKey != "" {
		return opt.WeightKey
	}
	return "weight"
}

// maxEchoBytes bounds a piece of the input echoed in a message.
const maxEchoBytes = 200

// parseDOT runs gonum's parser, turning a panic into an error.
func parseDOT(src []byte) (f *ast.File, err error) {
	defer func() {
		if p := recover(); p != nil {
			f, err = nil, fmt.Errorf("DOT parser failed: %v", p)
		}
	}()
	return dot.ParseBytes(src)
}

// gonum's syntax errors read "LINE:COLUMN: error: message".
var dotErrPos = regexp.MustCompile(`^(\d+):(\d+): error: `)

// dotParseError turns an error of gonum's parser into an *Error, keeping
// the line it names.
func dotParseError(file string, err error) *Error {
	msg := source.Clip(oneLineMsg(err.Error()), maxEchoBytes)
	if m := dotErrPos.FindStringSubmatch(msg); m != nil {
		line, _ := strconv.Atoi(m[1])
		rest := msg[len(m[0]):]
		return &Error{File: file, Line: line, Msg: fmt.Sprintf("DOT syntax (column %s): %s", m[2], rest)}
	}
	return &Error{File: file, Msg: "DOT: " + msg}
}

// oneLineMsg replaces line breaks so that an error prints on one line.
func oneLineMsg(s string) string {
	return strings.NewReplacer("\r\n", " ", "\n", " ", "\r", " ").Replace(s)
}

// dotScope holds the edge defaults of a graph or subgraph ("edge [weight=2]").
type dotScope struct {
	weight    float64
	hasWeight bool
}

// dotReader walks the syntax tree. Every ID and edge operator is met in
// source order, so the k-th ID is the k-th ID token of the scan.
type dotReader struct {
	file     string
	b        *structural.Builder
	weights  bool
	directed bool
	ids, ops []int32 // lines of ID tokens and edge operators, or nil
	idk, opk int     // tokens consumed so far
	// mentions holds every node mentioned inside the current top-level
	// statement, in source order; an operand of an edge is a range of it.
	mentions []int32
	edges    int64 // edges added
	maxEdges int64
	// weightKey names the weight attribute; labels and groups hold the
	// label and group attributes of node statements, by state.
	weightKey      string
	labels, groups []string
}

// idLine returns the line of the last ID consumed, or 0.
func (d *dotReader) idLine() int {
	if d.ids == nil || d.idk == 0 || d.idk > len(d.ids) {
		return 0
	}
	return int(d.ids[d.idk-1])
}

// opLine returns the line of the last edge operator consumed, or 0.
func (d *dotReader) opLine() int {
	if d.ops == nil || d.opk == 0 || d.opk > len(d.ops) {
		return 0
	}
	return int(d.ops[d.opk-1])
}

// stmts reads a statement list; depth is 0 for the graph's own list.
func (d *dotReader) stmts(list []ast.Stmt, sc dotScope, depth int) error {
	for _, s := range list {
		switch s := s.(type) {
		case *ast.NodeStmt:
			id, err := d.node(s.Node)
			if err != nil {
				return err
			}
			if err := d.nodeAttrs(id, s.Attrs); err != nil {
				return err
			}
		case *ast.EdgeStmt:
			if err := d.edgeStmt(s, sc, depth); err != nil {
				return err
			}
		case *ast.AttrStmt:
			w, ok, err := d.attrs(s.Attrs, s.Kind == ast.EdgeKind)
			if err != nil {
				return err
			}
			if ok {
				sc.weight, sc.hasWeight = w, true
			}
		case *ast.Attr:
			d.idk += 2 // a graph attribute
		case *ast.Subgraph:
			if err := d.subgraph(s, sc, depth); err != nil {
				return err
			}
		}
		if depth == 0 {
			d.mentions = d.mentions[:0]
		}
	}
	return nil
}

// subgraph reads a subgraph; the nodes it mentions are appended to
// d.mentions.
func (d *dotReader) subgraph(s *ast.Subgraph, sc dotScope, depth int) error {
	if s.ID != "" {
		d.idk++
	}
	return d.stmts(s.Stmts, sc, depth+1)
}

// vertex reads an edge operand and returns its range in d.mentions.
func (d *dotReader) vertex(v ast.Vertex, sc dotScope, depth int) (int, int, error) {
	start := len(d.mentions)
	switch v := v.(type) {
	case *ast.Node:
		if _, err := d.node(v); err != nil {
			return 0, 0, err
		}
	case *ast.Subgraph:
		if err := d.subgraph(v, sc, depth); err != nil {
			return 0, 0, err
		}
	}
	return start, len(d.mentions), nil
}

// edgeStmt reads "A -> B -> C [attrs]", where each operand is a node or a
// subgraph standing for all the nodes it mentions.
func (d *dotReader) edgeStmt(s *ast.EdgeStmt, sc dotScope, depth int) error {
	// Operand k is mentions[bounds[k]:bounds[k+1]]: the ranges follow each
	// other because operands are read in order.
	var small [8]int
	bounds := small[:0]
	lo, hi, err := d.vertex(s.From, sc, depth)
	if err != nil {
		return err
	}
	bounds = append(bounds, lo, hi)
	var firstOp int
	for e := s.To; e != nil; e = e.To {
		d.opk++
		if firstOp == 0 {
			firstOp = d.opLine()
		}
		if e.Directed != d.directed {
			if d.directed {
				return errorf(d.file, d.opLine(), "\"--\" in a digraph; write u -> v")
			}
			return errorf(d.file, d.opLine(), "\"->\" in an undirected graph; write u -- v")
		}
		lo, hi, err := d.vertex(e.Vertex, sc, depth)
		if err != nil {
			return err
		}
		if lo != bounds[len(bounds)-1] {
			// Not reached: operands are read back to back.
			return errorf(d.file, d.opLine(), "internal error: operand ranges out of order")
		}
		bounds = append(bounds, hi)
	}
	w, ok, err := d.attrs(s.Attrs, true)
	if err != nil {
		return err
	}
	if !ok {
		w, ok = sc.weight, sc.hasWeight
	}
	weighted := ok && d.weights
	for k := 0; k+2 < len(bounds); k++ {
		from := d.mentions[bounds[k]:bounds[k+1]]
		to := d.mentions[bounds[k+1]:bounds[k+2]]
		if len(from) > 1 {
			slices.Sort(from)
		}
		if len(to) > 1 {
			slices.Sort(to)
		}
		nf, nt := dotDistinct(from), dotDistinct(to)
		if int64(nf) > (d.maxEdges-d.edges)/max(int64(nt), 1) {
			return errorf(d.file, firstOp, "subgraph operands expand to more than %d edges, more than the size of the file justifies", d.maxEdges)
		}
		d.edges += int64(nf) * int64(nt)
		for i, u := range from {
			if i > 0 && u == from[i-1] {
				continue
			}
			for j, v := range to {
				if j > 0 && v == to[j-1] {
					continue
				}
				if weighted {
					d.b.AddWeightedEdge(u, v, w)
				} else {
					d.b.AddEdge(u, v)
				}
			}
		}
	}
	return nil
}

// dotDistinct counts the distinct values of a sorted slice.
func dotDistinct(s []int32) int {
	n := 0
	for i := range s {
		if i == 0 || s[i] != s[i-1] {
			n++
		}
	}
	return n
}

// node interns a node and records its mention.
func (d *dotReader) node(n *ast.Node) (int32, error) {
	d.idk++
	line := d.idLine()
	if p := n.Port; p != nil {
		if p.ID != "" && p.CompassPoint != ast.CompassPointNone {
			d.idk += 2
		} else {
			d.idk++
		}
	}
	name := dotUnquote(n.ID)
	switch {
	case len(name) == 0:
		return -1, errorf(d.file, line, "empty node name")
	case len(name) > MaxNameBytes:
		return -1, errorf(d.file, line, "node name of %d bytes; the limit is %d", len(name), MaxNameBytes)
	case strings.ContainsAny(name, "\r\n"):
		return -1, errorf(d.file, line, "node name %q holds a line break", clip([]byte(name)))
	}
	if msg := controlMsg(name); msg != "" {
		return -1, errorf(d.file, line, "%s", msg)
	}
	id, err := d.b.Intern([]byte(name))
	if err != nil {
		return -1, errorf(d.file, line, "%s", trimStructural(err.Error()))
	}
	d.mentions = append(d.mentions, id)
	return id, nil
}

// attrs reads an attribute list. When edge is set it returns the weight
// attribute, if any, checked to be a finite nonzero number.
func (d *dotReader) attrs(list []*ast.Attr, edge bool) (float64, bool, error) {
	var w float64
	var has bool
	for _, a := range list {
		d.idk += 2
		if !edge || dotUnquote(a.Key) != d.weightKey {
			continue
		}
		val := dotUnquote(a.Val)
		v, err := strconv.ParseFloat(val, 64)
		if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
			return 0, false, errorf(d.file, d.idLine(), "weight %q is not a finite number", clip([]byte(val)))
		}
		if v == 0 {
			return 0, false, errorf(d.file, d.idLine(), "weight 0 is no coupling; leave the edge out")
		}
		w, has = v, true
	}
	return w, has, nil
}

// nodeAttrs reads the attribute list of a node statement, keeping its
// label and group (a later statement overrides an earlier one, as in
// Graphviz).
func (d *dotReader) nodeAttrs(id int32, list []*ast.Attr) error {
	for _, a := range list {
		d.idk += 2
		var dst *[]string
		switch dotUnquote(a.Key) {
		case "label":
			dst = &d.labels
		case "group":
			dst = &d.groups
		default:
			continue
		}
		// A quoted value may run over lines; keep it on one.
		val := strings.NewReplacer("\r\n", " ", "\n", " ", "\r", " ").Replace(dotUnquote(a.Val))
		if len(val) > maxLabelBytes {
			return errorf(d.file, d.idLine(), "%s of %d bytes; the limit is %d", dotUnquote(a.Key), len(val), maxLabelBytes)
		}
		if msg := controlMsg(val); msg != "" {
			return errorf(d.file, d.idLine(), "%s: %s", dotUnquote(a.Key), strings.Replace(msg, "a node name", "the value", 1))
		}
		setAt(dst, id, val)
	}
	return nil
}

// maxLabelBytes is the longest label or group kept.
const maxLabelBytes = 4 * MaxNameBytes

// setAt sets (*s)[i] = v, growing *s as needed.
func setAt(s *[]string, i int32, v string) {
	if int(i) >= len(*s) {
		*s = append(*s, make([]string, int(i)+1-len(*s))...)
	}
	(*s)[i] = v
}

// countDOT counts the IDs and edge operators of a statement list, the way
// dotReader consumes them.
func countDOT(list []ast.Stmt, ids, ops *int) {
	node := func(n *ast.Node) {
		*ids++
		if p := n.Port; p != nil {
			if p.ID != "" && p.CompassPoint != ast.CompassPointNone {
				*ids += 2
			} else {
				*ids++
			}
		}
	}
	vertex := func(v ast.Vertex) {
		switch v := v.(type) {
		case *ast.Node:
			node(v)
		case *ast.Subgraph:
			if v.ID != "" {
				*ids++
			}
			countDOT(v.Stmts, ids, ops)
		}
	}
	for _, s := range list {
		switch s := s.(type) {
		case *ast.NodeStmt:
			node(s.Node)
			*ids += 2 * len(s.Attrs)
		case *ast.EdgeStmt:
			vertex(s.From)
			for e := s.To; e != nil; e = e.To {
				*ops++
				vertex(e.Vertex)
			}
			*ids += 2 * len(s.Attrs)
		case *ast.AttrStmt:
			*ids += 2 * len(s.Attrs)
		case *ast.Attr:
			*ids += 2
		case *ast.Subgraph:
			vertex(s)
		}
	}
}

// dotUnquote returns the text of a DOT ID: a double-quoted string loses its
// quotes and \" stands for a quote (DOT's only escape; \\ stays as it is);
// identifiers, numerals and HTML strings <...> are kept verbatim.
func dotUnquote(id string) string {
	if len(id) < 2 || id[0] != '"' || id[len(id)-1] != '"' {
		return id
	}
	s := id[1 : len(id)-1]
	if !strings.Contains(s, `\"`) {
		return s
	}
	var b strings.Builder
	b.Grow(len(s))
	for i := 0; i < len(s); i++ {
		if s[i] == '\\' && i+1 < len(s) {
			if s[i+1] == '"' {
				b.WriteByte('"')
				i++
				continue
			}
			b.WriteByte('\\')
			b.WriteByte(s[i+1])
			i++
			continue
		}
		b.WriteByte(s[i])
	}
	return b.String()
}

// dotScan is what a light pass over the DOT text finds before gonum's
// parser runs: the line of every ID token and edge operator in order (the
// syntax tree has no positions), and the line of each graph.
type dotScan struct {
	ids, ops, graphs []int32
}

type dotTok int

const (
	dotNone dotTok = iota
	dotID
	dotOp
	dotOpen  // {
	dotClose // }
	dotColon // :
	dotEq    // =
	dotKwSub // subgraph
	dotOther // anything else
)

// dotKeyword reports the keywords of gonum's DOT lexer (only these
// spellings are keywords; "nOde" is an identifier).
func dotKeyword(w []byte) string {
	switch string(w) {
	case "node", "Node", "NODE":
		return "node"
	case "edge", "Edge", "EDGE":
		return "edge"
	case "graph", "Graph", "GRAPH":
		return "graph"
	case "digraph", "Digraph", "diGraph", "DiGraph", "DIGRAPH":
		return "digraph"
	case "subgraph", "Subgraph", "subGraph", "SubGraph", "SUBGRAPH":
		return "subgraph"
	case "strict", "Strict", "STRICT":
		return "strict"
	}
	return ""
}

func isDOTLetter(c byte) bool {
	return c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c == '_' || c >= 0x80
}

func isDOTDigit(c byte) bool { return c >= '0' && c <= '9' }

// scanDOT tokenizes src the way gonum's lexer does, recording positions
// and enforcing the nesting and chain limits that keep the parser's
// recursion shallow. On input the parser rejects, the scan may differ; the
// parser's own error is reported then, unless a limit fires first.
func scanDOT(src []byte, file string) (*dotScan, *Error) {
	sc := &dotScan{}
	line := int32(1)
	n := len(src)
	// Per brace level: edge operators in the current chain, and whether the
	// last token ended an operand.
	type level struct {
		chain   int
		operand bool
	}
	levels := []level{{}}
	total := 0 // chain operators summed over the open levels
	prev := dotNone
	directed := true
	resetChain := func() {
		lv := &levels[len(levels)-1]
		total -= lv.chain
		lv.chain = 0
	}
	i := 0
	for i < n {
		c := src[i]
		switch {
		case c == '\n':
			line++
			i++
			continue
		case c == ' ' || c == '\t' || c == '\r':
			i++
			continue
		case c == '#' || c == '/' && i+1 < n && src[i+1] == '/':
			for i < n && src[i] != '\n' {
				i++
			}
			continue
		case c == '/' && i+1 < n && src[i+1] == '*':
			start := line
			i += 2
			for i < n && !(src[i] == '*' && i+1 < n && src[i+1] == '/') {
				if src[i] == '\n' {
					line++
				}
				i++
			}
			if i >= n {
				return nil, errorf(file, int(start), "unterminated /* comment")
			}
			i += 2
			continue
		}
		lv := &levels[len(levels)-1]
		tok := dotOther
		start := line
		switch {
		case c == '"':
			i++
			for i < n && src[i] != '"' {
				if src[i] == '\\' && i+1 < n {
					i++
				}
				if src[i] == '\n' {
					line++
				}
				i++
			}
			if i >= n {
				return nil, errorf(file, int(start), "unterminated quoted string")
			}
			i++
			tok = dotID
		case c == '<':
			depth := 0
			for i < n {
				if src[i] == '<' {
					depth++
				} else if src[i] == '>' {
					depth--
				} else if src[i] == '\n' {
					line++
				}
				i++
				if depth == 0 {
					break
				}
			}
			tok = dotID
		case c == '-' && i+1 < n && (src[i+1] == '>' || src[i+1] == '-'):
			if got := src[i+1] == '>'; len(sc.graphs) > 0 && got != directed {
				if directed {
					return nil, errorf(file, int(line), "\"--\" in a digraph; write u -> v")
				}
				return nil, errorf(file, int(line), "\"->\" in an undirected graph; write u -- v")
			}
			i += 2
			tok = dotOp
		case isDOTDigit(c) || c == '.' || c == '-':
			j := i
			if src[j] == '-' {
				j++
			}
			digits := 0
			for j < n && isDOTDigit(src[j]) {
				j++
				digits++
			}
			if j < n && src[j] == '.' {
				j++
				for j < n && isDOTDigit(src[j]) {
					j++
					digits++
				}
			}
			if digits > 0 {
				i = j
				tok = dotID
			} else {
				i++
			}
		case isDOTLetter(c):
			j := i
			for j < n && (isDOTLetter(src[j]) || isDOTDigit(src[j])) {
				j++
			}
			switch dotKeyword(src[i:j]) {
			case "":
				tok = dotID
			case "subgraph":
				tok = dotKwSub
			case "graph", "digraph":
				if len(levels) == 1 {
					sc.graphs = append(sc.graphs, line)
					directed = src[i] == 'd' || src[i] == 'D'
				}
				tok = dotOther
			}
			i = j
		default:
			i++
			switch c {
			case '{':
				tok = dotOpen
			case '}':
				tok = dotClose
			case ':':
				tok = dotColon
			case '=':
				tok = dotEq
			}
		}
		switch tok {
		case dotID:
			sc.ids = append(sc.ids, start)
			switch {
			case prev == dotKwSub:
				// A subgraph's name: the operand is still to come.
				tok = dotKwSub
			case prev == dotColon || prev == dotEq:
				lv.operand = true
			default:
				if lv.operand {
					resetChain() // two operands in a row: a new statement
				}
				lv.operand = true
			}
		case dotOp:
			sc.ops = append(sc.ops, start)
			lv.chain++
			total++
			lv.operand = false
			if total > maxDOTChain {
				return nil, errorf(file, int(line), "edge chain of more than %d steps; split it into statements", maxDOTChain)
			}
		case dotKwSub:
			if lv.operand {
				resetChain()
			}
			lv.operand = false
		case dotOpen:
			if prev != dotKwSub && lv.operand {
				resetChain()
			}
			lv.operand = false
			if len(levels) > maxDOTDepth {
				return nil, errorf(file, int(line), "braces nested more than %d deep", maxDOTDepth)
			}
			levels = append(levels, level{})
		case dotClose:
			if len(levels) > 1 {
				total -= levels[len(levels)-1].chain
				levels = levels[:len(levels)-1]
				levels[len(levels)-1].operand = true
			}
		case dotColon, dotEq:
		default:
			// ; [ ] , keywords and invalid bytes end a statement.
			resetChain()
			lv.operand = false
		}
		prev = tok
	}
	return sc, nil
}
