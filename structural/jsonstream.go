package structural

import (
	"bytes"
	"io"
	"runtime"
	"slices"
	"sync"
	"unicode/utf8"

	"github.com/netsteer/netsteer/structural/internal/names"
)

// JSONWriter is a value whose JSON can be large (a name per state or per
// edge): WriteJSON writes it to w in pieces, never holding it whole, as
// the same compact JSON its MarshalJSON returns.
//
// WriteJSONIndent writes the same JSON laid out for people, as if the
// value began at the given depth of nesting: each key of an object, and
// each element of an array of objects or arrays, on a line of its own,
// two spaces a level; an array of scalars on one line, its elements
// separated by ", "; ": " after a key; an empty object or array as {} or
// []. That is the layout of textout.IndentJSON, which a program writing
// large results streams this way, formatting on all cores.
type JSONWriter interface {
	WriteJSON(w io.Writer) error
	WriteJSONIndent(w io.Writer, depth int) error
}

// chunkBytes is the size at which a jsonChunks writes its buffer out.
const chunkBytes = 1 << 15

// jsonChunks appends JSON to a buffer and writes it to w whenever it holds
// chunkBytes, keeping the first write error.
type jsonChunks struct {
	w   io.Writer
	b   []byte
	err error
}

// newChunks returns a jsonChunks for about hint bytes of JSON.
func newChunks(w io.Writer, hint int) *jsonChunks {
	return &jsonChunks{w: w, b: make([]byte, 0, min(max(hint, 64), chunkBytes)+4096)}
}

// maybeFlush writes the buffer out once it is full.
func (c *jsonChunks) maybeFlush() {
	if len(c.b) >= chunkBytes {
		c.flush()
	}
}

func (c *jsonChunks) flush() error {
	if c.err == nil && len(c.b) > 0 {
		_, c.err = c.w.Write(c.b)
	}
	c.b = c.b[:0]
	return c.err
}

// marshalVia returns the bytes a JSONWriter writes: MarshalJSON and
// WriteJSON share one route, so they cannot differ.
func marshalVia(v JSONWriter) ([]byte, error) {
	var buf bytes.Buffer
	if err := v.WriteJSON(&buf); err != nil {
		return nil, err
	}
	return buf.Bytes(), nil
}

// layout is how a JSONWriter lays its value out: compact, or indented
// with the value at depth (see JSONWriter).
type layout struct {
	indent bool
	depth  int
}

// inner is the layout of the elements of a container at l.
func (l layout) inner() layout { return layout{l.indent, l.depth + 1} }

// sep appends what separates two elements of an array of scalars.
func (l layout) sep(b []byte) []byte {
	if l.indent {
		return append(b, ',', ' ')
	}
	return append(b, ',')
}

// line appends what precedes element k of an object, or of an array of
// containers, at l.
func (l layout) line(b []byte, k int) []byte {
	if k > 0 {
		b = append(b, ',')
	}
	if l.indent {
		b = newlineAt(b, l.depth+1)
	}
	return b
}

// end appends c, the end of an object or of an array of containers at l
// that has n elements.
func (l layout) end(b []byte, n int, c byte) []byte {
	if l.indent && n > 0 {
		b = newlineAt(b, l.depth)
	}
	return append(b, c)
}

// key appends the key k of an object member.
func (l layout) key(b []byte, k string) []byte {
	b = append(AppendJSONString(b, k), ':')
	if l.indent {
		b = append(b, ' ')
	}
	return b
}

func newlineAt(b []byte, depth int) []byte {
	b = append(b, '\n')
	for range depth {
		b = append(b, ' ', ' ')
	}
	return b
}

// jsonPlain[c] says byte c stands for itself in a JSON string as
// AppendJSONString writes it.
var jsonPlain = func() (t [256]bool) {
	for c := 0x20; c < utf8.RuneSelf; c++ {
		t[c] = c != '"' && c != '\\' && c != '<' && c != '>' && c != '&'
	}
	return t
}()

// appendJSONName appends the name of state v of t as a JSON string,
// written in place (a name needing no escapes, which is most, is copied
// once).
func appendJSONName(b []byte, t *names.Table, v int32) []byte {
	b = append(b, '"')
	at := len(b)
	b = t.Append(b, v)
	for _, c := range b[at:] {
		if !jsonPlain[c] {
			name := append([]byte(nil), b[at:]...)
			return AppendJSONString(b[:at-1], name)
		}
	}
	return append(b, '"')
}

// shortNames holds the names of a network's states in slots of 16 bytes,
// so that writing a name costs one memory access and a fixed copy (the
// edges of a role list name states in no order, each many times): a name
// needing no JSON escapes and at most 15 bytes long, its length in the last
// byte; 255 there marks a name written from the table.
type shortNames [][16]byte

const longName = 255

// newShortNames fills the slots of the n states of t, on all cores.
func newShortNames(t *names.Table, n int) shortNames {
	s := make(shortNames, n)
	workers := min(runtime.GOMAXPROCS(0), max(n>>16, 1))
	var wg sync.WaitGroup
	for w := range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			var name []byte
			for v := w * n / workers; v < (w+1)*n/workers; v++ {
				name = t.Append(name[:0], int32(v))
				slot := &s[v]
				slot[15] = longName
				if len(name) > 15 {
					continue
				}
				plain := true
				for _, c := range name {
					plain = plain && jsonPlain[c]
				}
				if plain {
					copy(slot[:], name)
					slot[15] = byte(len(name))
				}
			}
		}()
	}
	wg.Wait()
	return s
}

// appendJSON appends the name of state v (of t) as a JSON string.
func (s shortNames) appendJSON(b []byte, t *names.Table, v int32) []byte {
	slot := &s[v]
	n := int(slot[15])
	if n == longName {
		return appendJSONName(b, t, v)
	}
	if cap(b)-len(b) < 18 {
		b = slices.Grow(b, 18)
	}
	at := len(b)
	b = b[:at+17]
	b[at] = '"'
	*(*[16]byte)(b[at+1:]) = *slot
	b = b[:at+1+n]
	return append(b, '"')
}

// states appends the array of the names of ids.
func (c *jsonChunks) states(l layout, ids []int32, t *names.Table) {
	c.b = append(c.b, '[')
	for i, v := range ids {
		if i > 0 {
			c.b = l.sep(c.b)
		}
		c.b = appendJSONName(c.b, t, v)
		c.maybeFlush()
	}
	c.b = append(c.b, ']')
}

// WriteJSON writes the states' names as a JSON array of strings.
func (s States) WriteJSON(w io.Writer) error { return s.write(w, layout{}) }

// WriteJSONIndent writes the array of WriteJSON laid out (JSONWriter).
func (s States) WriteJSONIndent(w io.Writer, depth int) error {
	return s.write(w, layout{true, depth})
}

func (s States) write(w io.Writer, l layout) error {
	c := newChunks(w, 2+12*len(s.ids))
	c.states(l, s.ids, s.names)
	return c.flush()
}

// WriteJSON writes the design as an array of signals, each the array of
// the names of its states.
func (d Design) WriteJSON(w io.Writer) error { return d.write(w, layout{}) }

// WriteJSONIndent writes the array of WriteJSON laid out (JSONWriter).
func (d Design) WriteJSONIndent(w io.Writer, depth int) error {
	return d.write(w, layout{true, depth})
}

func (d Design) write(w io.Writer, l layout) error {
	c := newChunks(w, 2+16*len(d.signals))
	c.b = append(c.b, '[')
	for i, s := range d.signals {
		c.b = l.line(c.b, i)
		c.states(l.inner(), s, d.names)
	}
	c.b = l.end(c.b, len(d.signals), ']')
	return c.flush()
}

// WriteJSON writes an object mapping each role to its states' names.
func (r *NodeRoles) WriteJSON(w io.Writer) error { return r.write(w, layout{}) }

// WriteJSONIndent writes the object of WriteJSON laid out (JSONWriter).
func (r *NodeRoles) WriteJSONIndent(w io.Writer, depth int) error {
	return r.write(w, layout{true, depth})
}

func (r *NodeRoles) write(w io.Writer, l layout) error {
	const per = 1 << 14 // states a block
	nb := (len(r.Of) + per - 1) / per
	sep := l.sep(nil)
	return writeRoles(w, l, NodeRoleOrder, nb, len(sep), false, func(role Role, i int, b []byte) []byte {
		t := r.g.names
		for v := i * per; v < min((i+1)*per, len(r.Of)); v++ {
			if r.Of[v] == role {
				b = appendJSONName(append(b, sep...), t, int32(v))
			}
		}
		return b
	})
}

// WriteJSON writes an object mapping each role to its edges, each as a
// [source, target] pair of names, in the order of Out().
func (r *LinkRoles) WriteJSON(w io.Writer) error { return r.write(w, layout{}) }

// WriteJSONIndent writes the object of WriteJSON laid out (JSONWriter).
func (r *LinkRoles) WriteJSONIndent(w io.Writer, depth int) error {
	return r.write(w, layout{true, depth})
}

func (r *LinkRoles) write(w io.Writer, l layout) error {
	g := r.g
	// Blocks of about 2^13 edges, cut between source states.
	const per = 1 << 13
	cuts := []int32{0}
	for u := int32(0); int(u) < g.N(); u++ {
		if g.out.Ptr[u+1]-g.out.Ptr[cuts[len(cuts)-1]] >= per {
			cuts = append(cuts, u+1)
		}
	}
	if cuts[len(cuts)-1] != int32(g.N()) {
		cuts = append(cuts, int32(g.N()))
	}
	// Each pair on a line of its own: ",\n" and the indent before it,
	// less the comma before a role's first.
	before := l.inner().line(nil, 1)
	sep := l.inner().inner().sep(nil)
	t := g.names
	short := newShortNames(t, g.N())
	return writeRoles(w, l, LinkRoleOrder, len(cuts)-1, 1, true, func(role Role, i int, b []byte) []byte {
		var from []byte // '[', the name of u and the separator
		for u := cuts[i]; u < cuts[i+1]; u++ {
			lo := g.out.Ptr[u]
			from = from[:0]
			for k, v := range g.out.Row(u) {
				if r.Of[lo+int64(k)] != role {
					continue
				}
				if len(from) == 0 {
					from = append(short.appendJSON(append(from, '['), t, u), sep...)
				}
				b = append(append(b, before...), from...)
				b = short.appendJSON(b, t, v)
				b = append(b, ']')
			}
		}
		return b
	})
}

// writeRoles writes {"role": [elements], ...} for each role, laid out by
// l, the elements of a role formatted block by block by format, each with
// what comes before it in a role's list but the first (the first has its
// first strip bytes cut), on all cores, and written in block order. lines
// says the elements are containers, each on a line of its own.
func writeRoles(w io.Writer, l layout, roles []Role, nb, strip int, lines bool, format func(role Role, i int, b []byte) []byte) error {
	c := newChunks(w, 0)
	c.b = append(c.b, '{')
	for k, role := range roles {
		c.b = l.line(c.b, k)
		c.b = l.key(c.b, role.String())
		c.b = append(c.b, '[')
		if err := c.flush(); err != nil {
			return err
		}
		first := true
		err := orderedBlocks(nb, func(i int, b []byte) []byte { return format(role, i, b) }, func(b []byte) error {
			if len(b) == 0 {
				return nil
			}
			if first {
				b, first = b[strip:], false
			}
			_, err := w.Write(b)
			return err
		})
		if err != nil {
			return err
		}
		if lines {
			n := 1
			if first {
				n = 0
			}
			c.b = l.inner().end(c.b, n, ']')
		} else {
			c.b = append(c.b, ']')
		}
	}
	c.b = l.end(c.b, len(roles), '}')
	return c.flush()
}

// orderedBlocks formats blocks 0..nb-1 with format, up to GOMAXPROCS at
// once, and hands them to write in order. Blocks are dispatched in order,
// each with one of 2·workers buffers, which write returns: the blocks not
// yet written are consecutive and fewer than the slots, so each has its
// own. The first error of write stops it.
func orderedBlocks(nb int, format func(i int, b []byte) []byte, write func([]byte) error) error {
	workers := min(runtime.GOMAXPROCS(0), nb)
	if workers <= 1 {
		var b []byte
		for i := 0; i < nb; i++ {
			b = format(i, b[:0])
			if err := write(b); err != nil {
				return err
			}
		}
		return nil
	}
	window := 2 * workers
	slots := make([]chan []byte, window)
	for i := range slots {
		slots[i] = make(chan []byte, 1)
	}
	free := make(chan []byte, window)
	for i := 0; i < window; i++ {
		free <- nil
	}
	type job struct {
		i int
		b []byte
	}
	jobs := make(chan job)
	stop := make(chan struct{})
	var wg sync.WaitGroup
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for j := range jobs {
				slots[j.i%window] <- format(j.i, j.b[:0])
			}
		}()
	}
	go func() {
		defer close(jobs)
		for i := 0; i < nb; i++ {
			var b []byte
			select {
			case b = <-free:
			case <-stop:
				return
			}
			select {
			case jobs <- job{i, b}:
			case <-stop:
				return
			}
		}
	}()
	var err error
	for i := 0; i < nb && err == nil; i++ {
		b := <-slots[i%window]
		err = write(b)
		free <- b
	}
	if err != nil {
		close(stop)
	}
	wg.Wait()
	return err
}
