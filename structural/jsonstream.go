package structural

import (
	"bytes"
	"io"
	"runtime"
	"sync"
)

// JSONWriter is a value whose JSON can be large (a name per state or per
// edge): WriteJSON writes it to w in pieces, never holding it whole, as
// the same compact JSON its MarshalJSON returns.
type JSONWriter interface {
	WriteJSON(w io.Writer) error
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

// states appends the array of the names of ids.
func (c *jsonChunks) states(ids []int32, g func(b []byte, v int32) []byte) {
	c.b = append(c.b, '[')
	var name []byte
	for i, v := range ids {
		if i > 0 {
			c.b = append(c.b, ',')
		}
		name = g(name[:0], v)
		c.b = AppendJSONString(c.b, name)
		c.maybeFlush()
	}
	c.b = append(c.b, ']')
}

// WriteJSON writes the states' names as a JSON array of strings.
func (s States) WriteJSON(w io.Writer) error {
	c := newChunks(w, 2+12*len(s.ids))
	c.states(s.ids, s.names.Append)
	return c.flush()
}

// WriteJSON writes the design as an array of signals, each the array of
// the names of its states.
func (d Design) WriteJSON(w io.Writer) error {
	c := newChunks(w, 2+16*len(d.signals))
	c.b = append(c.b, '[')
	for i, s := range d.signals {
		if i > 0 {
			c.b = append(c.b, ',')
		}
		c.states(s, d.names.Append)
	}
	c.b = append(c.b, ']')
	return c.flush()
}

// WriteJSON writes an object mapping each role to its states' names.
func (r *NodeRoles) WriteJSON(w io.Writer) error {
	const per = 1 << 14 // states a block
	nb := (len(r.Of) + per - 1) / per
	return writeRoles(w, NodeRoleOrder, nb, func(role Role, i int, b []byte) []byte {
		var name []byte
		for v := i * per; v < min((i+1)*per, len(r.Of)); v++ {
			if r.Of[v] == role {
				name = r.g.AppendName(name[:0], int32(v))
				b = AppendJSONString(append(b, ','), name)
			}
		}
		return b
	})
}

// WriteJSON writes an object mapping each role to its edges, each as a
// [source, target] pair of names, in the order of Out().
func (r *LinkRoles) WriteJSON(w io.Writer) error {
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
	return writeRoles(w, LinkRoleOrder, len(cuts)-1, func(role Role, i int, b []byte) []byte {
		var name []byte
		for u := cuts[i]; u < cuts[i+1]; u++ {
			lo := g.out.Ptr[u]
			for k, v := range g.out.Row(u) {
				if r.Of[lo+int64(k)] != role {
					continue
				}
				b = append(b, ',', '[')
				name = g.AppendName(name[:0], u)
				b = AppendJSONString(b, name)
				b = append(b, ',')
				name = g.AppendName(name[:0], v)
				b = AppendJSONString(b, name)
				b = append(b, ']')
			}
		}
		return b
	})
}

// writeRoles writes {"role": [elements], ...} for each role, the elements
// of a role formatted block by block (each with a leading comma) by
// format, on all cores, and written in block order.
func writeRoles(w io.Writer, roles []Role, nb int, format func(role Role, i int, b []byte) []byte) error {
	c := newChunks(w, 0)
	c.b = append(c.b, '{')
	for k, role := range roles {
		if k > 0 {
			c.b = append(c.b, ',')
		}
		c.b = AppendJSONString(c.b, role.String())
		c.b = append(c.b, ':', '[')
		if err := c.flush(); err != nil {
			return err
		}
		first := true
		err := orderedBlocks(nb, func(i int, b []byte) []byte { return format(role, i, b) }, func(b []byte) error {
			if len(b) == 0 {
				return nil
			}
			if first {
				b, first = b[1:], false
			}
			_, err := w.Write(b)
			return err
		})
		if err != nil {
			return err
		}
		c.b = append(c.b, ']')
	}
	c.b = append(c.b, '}')
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
