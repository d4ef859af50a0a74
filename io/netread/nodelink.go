package netread

import (
	"bufio"
	"encoding/json"
	"errors"
	"io"
	"slices"
	"strings"
)

// JSON limits.
const (
	maxJSONToken = 1 << 20
	maxJSONDepth = 1000
)

// lineTracker counts line breaks in what a decoder reads, so that its
// byte offsets can be turned into lines: it keeps only the offsets of the
// line breaks the decoder has read but not yet passed.
type lineTracker struct {
	r     io.Reader
	off   int64   // bytes handed out
	queue []int64 // offsets of line breaks; queue[head:] not yet passed
	head  int
	base  int // line breaks passed
}

func (t *lineTracker) Read(p []byte) (int, error) {
	n, err := t.r.Read(p)
	if t.head > 0 && t.head >= len(t.queue)/2 {
		// Drop what was passed, in amortised constant time per entry.
		t.queue = t.queue[:copy(t.queue, t.queue[t.head:])]
		t.head = 0
	}
	for i := 0; i < n; i++ {
		if p[i] == '\n' {
			t.queue = append(t.queue, t.off+int64(i))
		}
	}
	t.off += int64(n)
	return n, err
}

// lineAt returns the 1-based line of offset off; offsets asked must not
// decrease.
func (t *lineTracker) lineAt(off int64) int {
	for t.head < len(t.queue) && t.queue[t.head] < off {
		t.head++
		t.base++
	}
	return t.base + 1
}

// readJSON reads node-link JSON as networkx writes it: an object with
// "directed" (false when absent, as networkx reads it), "nodes" (objects
// with an "id", a string or a number, the state's name; "label" and
// "group" give labels and groups) and "links" or "edges" (objects with
// "source" and "target" ids and optionally the weight key). Every id an
// edge names must be a node.
func readJSON(r *bufio.Reader, file string, opt Options) (*parsed, error) {
	lt := &lineTracker{r: r}
	lim := &tokenLimit{r: lt, max: maxJSONToken, file: file, what: "a JSON"}
	dec := json.NewDecoder(lim)
	lim.pos = dec.InputOffset
	dec.UseNumber()
	line := func() int { return lt.lineAt(dec.InputOffset()) }
	fail := func(format string, args ...any) error { return errorf(file, line(), format, args...) }
	gb := newGraphBuilder(file, opt)
	wkey := weightKey(opt)
	next := func() (json.Token, error) {
		tok, err := dec.Token()
		if err == nil {
			return tok, nil
		}
		var e *Error
		var se *json.SyntaxError
		switch {
		case errors.As(err, &e):
			e.Line = line()
			return nil, e
		case errors.As(err, &se):
			return nil, fail("JSON: %s", clip([]byte(se.Error())))
		case err == io.EOF || err == io.ErrUnexpectedEOF:
			return nil, fail("the JSON ends early")
		}
		return nil, readError(file, line(), err)
	}
	// skip skips one value whose first token is tok.
	skip := func(tok json.Token) error {
		d, ok := tok.(json.Delim)
		if !ok || d == '}' || d == ']' {
			return nil
		}
		depth := 1
		for depth > 0 {
			t, err := next()
			if err != nil {
				return err
			}
			if d, ok := t.(json.Delim); ok {
				switch d {
				case '{', '[':
					depth++
					if depth > maxJSONDepth {
						return fail("values nested more than %d deep", maxJSONDepth)
					}
				default:
					depth--
				}
			}
		}
		return nil
	}
	// scalar returns a string or number as text.
	scalar := func(what string) (string, error) {
		t, err := next()
		if err != nil {
			return "", err
		}
		switch v := t.(type) {
		case string:
			return v, nil
		case json.Number:
			return string(v), nil
		}
		return "", fail("%s: want a string or a number", what)
	}
	// object reads {key: value, ...}, calling f at each key.
	object := func(what string, f func(key string) error) error {
		t, err := next()
		if err != nil {
			return err
		}
		if d, ok := t.(json.Delim); !ok || d != '{' {
			return fail("%s: want an object", what)
		}
		for dec.More() {
			t, err := next()
			if err != nil {
				return err
			}
			if err := f(t.(string)); err != nil {
				return err
			}
		}
		_, err = next()
		return err
	}
	array := func(what string, f func() error) error {
		t, err := next()
		if err != nil {
			return err
		}
		if d, ok := t.(json.Delim); !ok || d != '[' {
			return fail("%s: want an array", what)
		}
		for dec.More() {
			if err := f(); err != nil {
				return err
			}
		}
		_, err = next()
		return err
	}
	skipNext := func() error {
		t, err := next()
		if err != nil {
			return err
		}
		return skip(t)
	}
	text := func(what string) (string, error) {
		s, err := scalar(what)
		if err != nil {
			return "", err
		}
		if len(s) > maxLabelBytes {
			return "", fail("%s of %d bytes; the limit is %d", what, len(s), maxLabelBytes)
		}
		s = strings.NewReplacer("\r\n", " ", "\n", " ", "\r", " ", "\t", " ").Replace(s)
		if msg := controlMsg(s); msg != "" {
			return "", fail("%s: %s", what, strings.Replace(msg, "a node name", "the value", 1))
		}
		return s, nil
	}
	type rawEdge struct {
		u, v int32
		w    float64
		hasW bool
	}
	var (
		directed, haveDirected bool
		edges, second          []rawEdge
		haveNodes, haveLinks   bool
		linksKey               string
	)
	err := object("the document", func(key string) error {
		switch key {
		case "directed":
			t, err := next()
			if err != nil {
				return err
			}
			b, ok := t.(bool)
			if !ok {
				return fail("directed: want true or false")
			}
			directed, haveDirected = b, true
		case "nodes":
			if haveNodes {
				return fail("a second \"nodes\" array")
			}
			haveNodes = true
			return array("nodes", func() error {
				v := int32(-1)
				var label, group string
				var hasLabel, hasGroup bool
				start := line()
				err := object("a node", func(key string) error {
					var err error
					switch key {
					case "id":
						var id string
						if id, err = scalar("id"); err != nil {
							return err
						}
						v, err = gb.declare([]byte(id), line())
					case "label":
						label, err = text("label")
						hasLabel = true
					case "group":
						group, err = text("group")
						hasGroup = true
					default:
						err = skipNext()
					}
					return err
				})
				if err != nil {
					return err
				}
				if v < 0 {
					return errorf(file, start, "a node without an id")
				}
				if hasLabel {
					setAt(&gb.labels, v, label)
				}
				if hasGroup {
					setAt(&gb.groups, v, group)
				}
				return nil
			})
		case "links", "edges":
			// Writers may give the edges under both keys, for readers that
			// expect either; the second list must then repeat the first.
			into := &edges
			if haveLinks {
				if key == linksKey {
					return fail("two %q arrays; want one", key)
				}
				second = []rawEdge{}
				into = &second
			}
			haveLinks, linksKey = true, key
			return array(key, func() error {
				e := rawEdge{u: -1, v: -1}
				start := line()
				err := object("an edge", func(key string) error {
					switch key {
					case "source", "target":
						id, err := scalar(key)
						if err != nil {
							return err
						}
						s, err := gb.ref([]byte(id), line())
						if err != nil {
							return err
						}
						if key == "source" {
							e.u = s
						} else {
							e.v = s
						}
					case wkey:
						w, err := scalar(key)
						if err != nil {
							return err
						}
						x, msg := checkWeight(w)
						if msg != "" {
							return fail("%s", msg)
						}
						e.w, e.hasW = x, true
					default:
						return skipNext()
					}
					return nil
				})
				if err != nil {
					return err
				}
				if e.u < 0 || e.v < 0 {
					return errorf(file, start, "an edge without source and target")
				}
				*into = append(*into, e)
				return nil
			})
		default:
			return skipNext()
		}
		return nil
	})
	if err != nil {
		return nil, err
	}
	if _, err := dec.Token(); err != io.EOF {
		return nil, fail("data after the JSON object")
	}
	if !haveNodes {
		return nil, &Error{File: file, Line: 1, Msg: "not node-link JSON: no \"nodes\" array"}
	}
	_ = haveDirected
	if second != nil && !slices.Equal(edges, second) {
		return nil, &Error{File: file, Msg: "the \"links\" and \"edges\" arrays differ; want one list of edges"}
	}
	for _, e := range edges {
		gb.edge(e.u, e.v, e.w, e.hasW, !directed)
	}
	return gb.finish(opt)
}
