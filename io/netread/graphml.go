package netread

import (
	"bufio"
	"encoding/xml"
	"errors"
	"fmt"
	"io"
	"strings"
)

// GraphML limits.
const (
	// maxXMLToken bounds one XML token (a start tag with its attributes,
	// a run of text): the decoder holds a token whole.
	maxXMLToken = 1 << 20
	// maxXMLDepth bounds element nesting.
	maxXMLDepth = 256
)

// tokenLimit fails a read when the decoder has been handed more than max
// bytes past the end of its last token: one token would be larger.
type tokenLimit struct {
	r    io.Reader
	pos  func() int64 // the decoder's offset
	fed  int64
	max  int64
	file string
	what string
}

func (t *tokenLimit) Read(p []byte) (int, error) {
	if t.pos != nil && t.fed-t.pos() > t.max {
		return 0, &Error{File: t.file, Msg: fmt.Sprintf("%s token longer than %d bytes", t.what, t.max)}
	}
	if len(p) > 64<<10 {
		p = p[:64<<10]
	}
	n, err := t.r.Read(p)
	t.fed += int64(n)
	return n, err
}

// graphmlKey is a <key> declaration.
type graphmlKey struct {
	role string // "label", "group", "weight" or "" (ignored)
	def  string // the <default> value
	has  bool   // a default was given
}

// readGraphML reads a GraphML document: one <graph>, its <node> elements
// (ids are the state names) and <edge> elements, directed as the graph's
// edgedefault says unless the edge's own directed attribute says
// otherwise. Data whose key has attr.name label or group (for nodes) give
// the labels and groups; the key named by Options.WeightKey (for edges)
// gives the weights.
func readGraphML(r *bufio.Reader, file string, opt Options) (*parsed, error) {
	lim := &tokenLimit{r: r, max: maxXMLToken, file: file, what: "an XML"}
	dec := xml.NewDecoder(lim)
	// The decoder's offset moves within a token; the limit counts from
	// the end of the last token returned.
	var tokEnd int64
	lim.pos = func() int64 { return tokEnd }
	dec.Strict = true
	gb := newGraphBuilder(file, opt)
	wkey := weightKey(opt)
	keys := map[string]*graphmlKey{}
	// The key whose default applies, per role: the last declared, since
	// each sets the same value (so a node or edge costs O(1), whatever the
	// number of keys).
	defaults := map[string]*graphmlKey{}
	line := func() int { l, _ := dec.InputPos(); return l }
	fail := func(format string, args ...any) (*parsed, error) {
		return nil, errorf(file, line(), format, args...)
	}
	var (
		depth      int
		stack      []string // element names
		graphs     int
		undirected bool  // the graph's edgedefault
		noDefault  int   // the line of a <graph> without edgedefault (0: it has one)
		inNode     int32 // the node being read, or -1
		inEdge     bool
		edgeU      int32
		edgeV      int32
		edgeUndir  bool
		edgeW      float64
		edgeHasW   bool
		edgeLine   int
		dataKey    *graphmlKey
		dataText   []byte
		keyDecl    *graphmlKey
		inDefault  bool
		rootSeen   bool
	)
	inNode = -1
	attr := func(se xml.StartElement, name string) (string, bool) {
		for _, a := range se.Attr {
			if a.Name.Local == name && (a.Name.Space == "" || a.Name.Space == se.Name.Space) {
				return a.Value, true
			}
		}
		return "", false
	}
	setValue := func(k *graphmlKey, val string) error {
		switch {
		case inNode >= 0 && (k.role == "label" || k.role == "group"):
			val = strings.TrimSpace(val)
			if len(val) > maxLabelBytes {
				return errorf(file, line(), "%s of %d bytes; the limit is %d", k.role, len(val), maxLabelBytes)
			}
			val = strings.NewReplacer("\r\n", " ", "\n", " ", "\r", " ", "\t", " ").Replace(val)
			if msg := controlMsg(val); msg != "" {
				return errorf(file, line(), "%s: %s", k.role, strings.Replace(msg, "a node name", "the value", 1))
			}
			if k.role == "label" {
				setAt(&gb.labels, inNode, val)
			} else {
				setAt(&gb.groups, inNode, val)
			}
		case inEdge && k.role == "weight":
			w, msg := checkWeight(strings.TrimSpace(val))
			if msg != "" {
				return errorf(file, line(), "%s", msg)
			}
			edgeW, edgeHasW = w, true
		}
		return nil
	}
	for {
		tok, err := dec.Token()
		tokEnd = dec.InputOffset()
		if err == io.EOF {
			break
		}
		if err != nil {
			var se *xml.SyntaxError
			var e *Error
			switch {
			case errors.As(err, &e):
				e.Line = line()
				return nil, e
			case errors.As(err, &se):
				return nil, errorf(file, se.Line, "XML: %s", clip([]byte(oneLineMsg(se.Msg))))
			}
			return nil, readError(file, line(), err)
		}
		switch t := tok.(type) {
		case xml.StartElement:
			depth++
			if depth > maxXMLDepth {
				return fail("elements nested more than %d deep", maxXMLDepth)
			}
			name := t.Name.Local
			parent := ""
			if len(stack) > 0 {
				parent = stack[len(stack)-1]
			}
			stack = append(stack, name)
			switch {
			case depth == 1:
				if rootSeen {
					return fail("a second root element <%s> after </graphml>", clip([]byte(name)))
				}
				if name != "graphml" {
					return fail("not a GraphML document: the root element is <%s>, want <graphml>", clip([]byte(name)))
				}
				rootSeen = true
			case name == "key" && parent == "graphml":
				id, _ := attr(t, "id")
				an, _ := attr(t, "attr.name")
				for_, _ := attr(t, "for")
				k := &graphmlKey{}
				switch {
				case (for_ == "node" || for_ == "all") && (an == "label" || an == "group"):
					k.role = an
				case (for_ == "edge" || for_ == "all") && an == wkey:
					k.role = "weight"
				}
				if for_ == "all" && an == wkey && (an == "label" || an == "group") {
					k.role = an
				}
				keys[id] = k
				keyDecl = k
			case name == "default" && parent == "key":
				inDefault = true
				dataText = dataText[:0]
			case name == "graph" && parent == "graphml":
				graphs++
				if graphs > 1 {
					return fail("a second <graph>; a GraphML file must hold one network")
				}
				// edgedefault is required by the GraphML schema
				// (graphml-structure.xsd, element graph: use="required";
				// the GraphML Primer, section 2.3: "the default direction
				// must be specified"). Readers disagree on a file without
				// it: networkx's read_graphml (GraphMLReader.make_graph,
				// networkx 3.6) reads it as undirected. So neither way is
				// picked silently: without it, every edge must carry its
				// own directed attribute.
				ed, ok := attr(t, "edgedefault")
				switch {
				case !ok:
					noDefault = line()
				case ed == "directed":
				case ed == "undirected":
					undirected = true
				default:
					return fail("edgedefault %q: want directed or undirected", clip([]byte(ed)))
				}
			case name == "graph":
				return fail("nested graphs are not supported")
			case name == "hyperedge":
				return fail("hyperedges are not supported")
			case name == "node" && parent == "graph":
				id, ok := attr(t, "id")
				if !ok {
					return fail("<node> without an id")
				}
				v, err := gb.declare([]byte(id), line())
				if err != nil {
					return nil, err
				}
				inNode = v
				// Defaults of label and group keys apply to every node.
				for _, role := range []string{"label", "group"} {
					if k := defaults[role]; k != nil {
						if err := setValue(k, k.def); err != nil {
							return nil, err
						}
					}
				}
			case name == "edge" && parent == "graph":
				edgeLine = line()
				src, ok1 := attr(t, "source")
				dst, ok2 := attr(t, "target")
				if !ok1 || !ok2 {
					return fail("<edge> without source and target")
				}
				if edgeU, err = gb.ref([]byte(src), edgeLine); err != nil {
					return nil, err
				}
				if edgeV, err = gb.ref([]byte(dst), edgeLine); err != nil {
					return nil, err
				}
				edgeUndir = undirected
				if d, ok := attr(t, "directed"); ok {
					switch d {
					case "true":
						edgeUndir = false
					case "false":
						edgeUndir = true
					default:
						return fail("directed %q: want true or false", clip([]byte(d)))
					}
				} else if noDefault > 0 {
					return nil, errorf(file, noDefault, "<graph> has no edgedefault, and the <edge> at line %d no directed attribute: say edgedefault=\"directed\" or \"undirected\" (GraphML requires it; readers differ on a file without it)", edgeLine)
				}
				inEdge, edgeHasW = true, false
				if k := defaults["weight"]; k != nil {
					if err := setValue(k, k.def); err != nil {
						return nil, err
					}
				}
			case name == "data" && (parent == "node" && inNode >= 0 || parent == "edge" && inEdge):
				id, _ := attr(t, "key")
				k, ok := keys[id]
				if !ok {
					return fail("<data> refers to key %q, which is not declared", clip([]byte(id)))
				}
				dataKey = k
				dataText = dataText[:0]
			}
		case xml.CharData:
			if depth == 0 && len(strings.TrimSpace(string(t))) > 0 {
				return fail("text outside the <graphml> element")
			}
			if (dataKey != nil && len(stack) > 0 && stack[len(stack)-1] == "data") || inDefault {
				if len(dataText)+len(t) <= maxLabelBytes+1 {
					dataText = append(dataText, t...)
				} else {
					dataText = append(dataText, t[:maxLabelBytes+1-len(dataText)]...)
				}
			}
		case xml.EndElement:
			depth--
			name := stack[len(stack)-1]
			stack = stack[:len(stack)-1]
			switch {
			case name == "default" && inDefault:
				inDefault = false
				if keyDecl != nil {
					keyDecl.def, keyDecl.has = string(dataText), true
					if keyDecl.role != "" {
						defaults[keyDecl.role] = keyDecl
					}
				}
			case name == "key":
				keyDecl = nil
			case name == "data" && dataKey != nil:
				if err := setValue(dataKey, string(dataText)); err != nil {
					return nil, err
				}
				dataKey = nil
			case name == "node" && len(stack) > 0 && stack[len(stack)-1] == "graph":
				inNode = -1
			case name == "edge" && inEdge:
				gb.edge(edgeU, edgeV, edgeW, edgeHasW, edgeUndir)
				inEdge = false
			}
		}
	}
	if !rootSeen {
		return nil, &Error{File: file, Line: 1, Msg: "not a GraphML document: no <graphml> element"}
	}
	if graphs == 0 {
		return nil, &Error{File: file, Msg: "empty network: no <graph> in the GraphML document"}
	}
	return gb.finish(opt)
}
