package structural

import (
	"math/bits"

	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/matching/bigmem"
)

// Components is a partition of the states into strongly connected
// components. Of[v] is the component of state v. Components are numbered in
// a reverse topological order of the condensation: an edge between two
// components always goes from a higher number to a lower one (SCC numbers
// them in the order Tarjan's algorithm completes them).
type Components struct {
	Of    []int32
	Count int
	// Source[k] reports whether component k is a source component: no
	// edge enters it from another component.
	Source []bool
}

// sccFrame is a state on the depth-first call stack.
type sccFrame struct {
	pos  int64 // next edge of v to scan
	v    int32
	root bool // no edge found yet to a state visited before v
}

// SCC returns the strongly connected components of the directed graph g
// (row u lists the targets of u). It runs Pearce's space-efficient variant
// of Tarjan's algorithm (D. J. Pearce, Inf. Process. Lett. 116(1):47, 2016)
// with an explicit call stack: one int32 per state serves as visit index,
// low link and, once the state's component is complete, its component
// number, so each edge costs one random access. Components come out in
// Tarjan's completion order. While scanning, every edge that reaches a
// completed component is an edge between components, so the source
// components are found on the way. O(V + E) time; about 4 bytes per state
// plus the stacks.
func SCC(g *matching.CSR) *Components { return scc(g, nil, nil) }

// sccThrough returns the components of the digraph read from g through
// mate: state v has an arc to mate[u] for every u in row v of g, except
// where mate[u] is negative or v itself, and except arcs from or into a
// state marked in skip (nil: none), which is left a component of its own.
// Without skip they are those SCC gives for that digraph built row by row,
// without building it.
func sccThrough(g *matching.CSR, mate []int32, skip []bool) *Components {
	return scc(g, mate, skip)
}

func scc(g *matching.CSR, mate []int32, skip []bool) *Components {
	s := newPearce(g, mate, skip)
	return s.rest()
}

// pearce is the state of Pearce's algorithm on g read through mate and
// skip (see sccThrough), kept between searches so that searches may be
// started from chosen roots, and states may be completed by other means
// (see forwardBackward).
type pearce struct {
	n    int
	ptr  []int64
	adj  []int32
	mate []int32
	skip []bool
	// rindex[v]: 0 unvisited; 1..index-1 while v's component is open (the
	// smallest index v reaches); once complete, c: N, N-1, ... in
	// completion order. An open index never exceeds the number of open
	// states, so it stays at or below c and every completed state's value
	// is above it.
	rindex    []int32
	notSource []bool // by c
	call      []sccFrame
	stack     []int32
	index, c  int32
}

func newPearce(g *matching.CSR, mate []int32, skip []bool) *pearce {
	n := g.Rows
	// Both stacks can hold every state (a chain); the capacity is reserved
	// up front, so deep searches never copy them, and memory is touched only
	// as deep as the search goes.
	return &pearce{
		n: n, ptr: g.Ptr, adj: g.Adj, mate: mate, skip: skip,
		rindex:    bigmem.Make[int32](n, n),
		notSource: make([]bool, n+1),
		call:      bigmem.Make[sccFrame](0, n),
		stack:     bigmem.Make[int32](0, n),
		index:     1,
		c:         int32(n),
	}
}

// from completes the components of every state reachable from r, an
// unvisited state, that no earlier search completed.
func (s *pearce) from(r int32) {
	rindex, notSource := s.rindex, s.notSource
	call, stack := s.call, s.stack
	index, c := s.index, s.c
	ptr, adj, mate, skip := s.ptr, s.adj, s.mate, s.skip
	rindex[r] = index
	index++
	pos := ptr[r]
	if skip != nil && skip[r] {
		pos = ptr[r+1] // no arcs
	}
	call = append(call, sccFrame{pos: pos, v: r, root: true})
	for len(call) > 0 {
		f := &call[len(call)-1]
		v := f.v
		end := ptr[v+1]
		rv := rindex[v]
		descended := false
		for f.pos < end {
			w := adj[f.pos]
			f.pos++
			if mate != nil {
				if w = mate[w]; w < 0 || w == v {
					continue
				}
			}
			if skip != nil && skip[w] {
				continue
			}
			rw := rindex[w]
			if rw == 0 {
				rindex[w] = index
				index++
				call = append(call, sccFrame{pos: ptr[w], v: w, root: true})
				descended = true
				break
			}
			if rw > c {
				notSource[rw] = true // w's component is complete: v's is another
			} else if rw < rv {
				rv = rw
				f.root = false
			}
		}
		rindex[v] = rv
		if descended {
			continue
		}
		root := f.root
		call = call[:len(call)-1]
		if root {
			index--
			for len(stack) > 0 && rv <= rindex[stack[len(stack)-1]] {
				w := stack[len(stack)-1]
				stack = stack[:len(stack)-1]
				rindex[w] = c
				index--
			}
			rindex[v] = c
			c--
		} else {
			stack = append(stack, v)
		}
		// Back in the parent: the edge to v is scanned now.
		if len(call) > 0 {
			p := &call[len(call)-1]
			rw := rindex[v]
			if rw > c {
				notSource[rw] = true
			} else if rw < rindex[p.v] {
				rindex[p.v] = rw
				p.root = false
			}
		}
	}
	s.call, s.stack, s.index, s.c = call, stack, index, c
}

// rest searches from every state still unvisited, in increasing order, and
// returns the components.
func (s *pearce) rest() *Components {
	for r := 0; r < s.n; r++ {
		if s.rindex[r] == 0 {
			s.from(int32(r))
		}
	}
	return s.finish()
}

// finish numbers the components in completion order, every state being
// complete, and returns them.
func (s *pearce) finish() *Components {
	count := s.n - int(s.c)
	last := int32(s.n)
	rindex := s.rindex
	for v, x := range rindex {
		rindex[v] = last - x
	}
	src := make([]bool, count)
	for k := range src {
		src[k] = !s.notSource[last-int32(k)]
	}
	return &Components{Of: rindex, Count: count, Source: src}
}

// forwardBackward returns the components of the digraph out (in its
// transpose), as SCC(out) does up to the numbering: components are
// numbered in a reverse topological order of the condensation, though not
// always Tarjan's. Most states of a large network usually lie in one giant
// component, which it finds by two breadth-first searches from a pivot,
// forward along out and backward along in (the forward–backward method of
// Fleischer, Hendrickson & Pinar, IRREGULAR 2000; the pivot of largest
// in-degree times out-degree, after Hong, Rodia & Olukotun, SC 2013): the
// giant component is what both reach. Breadth-first order lets the memory
// accesses of many states overlap and its visit marks are bits, where a
// depth-first search waits on one random access after another. The rest
// goes to Pearce's algorithm in an order that keeps the numbering
// topological: first the states that do not reach the pivot (no edge
// leaves them for the others), then the giant component as one, then the
// states that reach it. If the forward search reaches fewer than an
// eighth of the states, it stops there and Pearce's algorithm does it
// all. O(V + E) time; 4 bytes per state beside SCC's, and two bits.
func forwardBackward(out, in *matching.CSR) *Components {
	n := out.Rows
	if n == 0 {
		return scc(out, nil, nil)
	}
	pivot, best := 0, int64(-1)
	for v := 0; v < n; v++ {
		if d := (out.Ptr[v+1] - out.Ptr[v] + 1) * (in.Ptr[v+1] - in.Ptr[v] + 1); d > best {
			pivot, best = v, d
		}
	}
	s := newPearce(out, nil, nil)
	queue := s.stack[:0] // its capacity, before Pearce's searches use it
	fw, nf := bfsBits(out, in, int32(pivot), queue)
	if nf < n/8 {
		return s.rest()
	}
	bw, _ := bfsBits(in, out, int32(pivot), queue)
	// The states that do not reach the pivot: no edge leaves them for one
	// that does.
	for r := 0; r < n; r++ {
		if bw[r>>6]&(1<<(r&63)) == 0 && s.rindex[r] == 0 {
			s.from(int32(r))
		}
	}
	// Those the pivot reaches lie downstream of the giant component, so
	// none is a source.
	for i, w := range fw {
		for x := w &^ bw[i]; x != 0; x &= x - 1 {
			s.notSource[s.rindex[i<<6+bits.TrailingZeros64(x)]] = true
		}
	}
	for i, w := range fw {
		for x := w & bw[i]; x != 0; x &= x - 1 {
			s.rindex[i<<6+bits.TrailingZeros64(x)] = s.c
		}
	}
	s.c--
	// The states upstream: every edge from them to a completed state is
	// seen, so the sources come out as in SCC.
	return s.rest()
}

// fbEdges is the size from which a network's components are found by
// forwardBackward; smaller networks are cheap either way and keep
// Tarjan's numbering.
const fbEdges = 1 << 16

// bfsBits returns the states reachable from root along g, root included,
// as bits, and their number; gt is the transpose of g, and queue's
// capacity must hold every state.
//
// The search is direction-optimizing (Beamer, Asanović & Patterson, SC
// 2012), for reachability only: it expands a queue while the frontier is
// small, and once the frontier's edges exceed a fourteenth of those of the
// unreached states it sweeps the unreached states in order instead,
// marking each that has a reached in-neighbour (along gt, a sequential
// read; marks count in the same sweep). When a sweep marks fewer than a
// twenty-fourth of the states, their queue goes on as before, and the
// search does not sweep again. Each sweep but the last marks more than
// N/24 states, so there are at most 25, and each reads the rows of
// unreached states once: O(V + E).
func bfsBits(g, gt *matching.CSR, root int32, queue []int32) ([]uint64, int) {
	const alpha, beta = 14, 24
	n := g.Rows
	seen := make([]uint64, (n+63)>>6)
	seen[root>>6] |= 1 << (root & 63)
	queue = append(queue[:0], root)
	ptr, adj := g.Ptr, g.Adj
	tptr, tadj := gt.Ptr, gt.Adj
	count := 1
	unreached := int64(len(adj)) - (ptr[root+1] - ptr[root]) // edges of unreached states
	head := 0
	swept := false // sweeps are tried once, so the search cannot go back and forth
	for head < len(queue) {
		// One level: queue[head:end] are expanded, the next level appended.
		end := len(queue)
		var next int64 // edges of the next level
		for ; head < end; head++ {
			u := queue[head]
			for _, w := range adj[ptr[u]:ptr[u+1]] {
				if b := uint64(1) << (w & 63); seen[w>>6]&b == 0 {
					seen[w>>6] |= b
					queue = append(queue, w)
					next += ptr[w+1] - ptr[w]
				}
			}
		}
		count += len(queue) - end
		unreached -= next
		if swept || next <= unreached/alpha {
			continue
		}
		swept = true
		// Sweeps: the queue is spent (every reached state's edges will be
		// read from the other side), and a sweep's marks form the queue
		// should the search go back to expanding.
		for {
			queue = queue[:0]
			for i, word := range seen {
				for x := ^word; x != 0; x &= x - 1 {
					v := i<<6 + bits.TrailingZeros64(x)
					if v >= n {
						break
					}
					for _, u := range tadj[tptr[v]:tptr[v+1]] {
						if seen[u>>6]&(1<<(u&63)) != 0 {
							seen[i] |= 1 << (v & 63)
							queue = append(queue, int32(v))
							break
						}
					}
				}
			}
			count += len(queue)
			if len(queue) <= n/beta {
				break
			}
		}
		head = 0
	}
	return seen, count
}
