package structural

import (
	"errors"
	"math"
	"runtime"
	"slices"

	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/matching/bigmem"
	"github.com/netsteer/netsteer/structural/internal/names"
)

// BuildOptions change how a Builder turns its edges into a Network.
type BuildOptions struct {
	// Undirected reads every edge u v as the two couplings u -> v and v -> u.
	Undirected bool
	// SelfDynamics adds a self-loop to every state (nodal dynamics).
	SelfDynamics bool
}

// Builder collects named states and edges and builds a Network. The zero
// value is not usable; call NewBuilder or NewIntBuilder.
type Builder struct {
	names *names.Interner
	// Edges are kept in segments, so that growing never copies them: the
	// full ones in segs, the one being filled in src, dst and w (w only
	// once an edge has had a weight).
	segs     []segment
	sealed   int // edges in segs
	src, dst []int32
	w        []float64
	weighted bool
}

// NewBuilder returns a Builder whose states are named by Intern.
func NewBuilder() *Builder { return &Builder{names: names.NewInterner()} }

// NewIntBuilder returns a Builder for n states named base..base+n-1.
func NewIntBuilder(n, base int) *Builder { return &Builder{names: names.NewIntInterner(n, base)} }

// WithEdges returns a network on the states of g (the same names, in the
// same order) whose edges are src[i] -> dst[i], with weights w when not
// nil. The slices are taken over.
func (g *Network) WithEdges(src, dst []int32, w []float64) (*Network, error) {
	if len(src) != len(dst) || w != nil && len(w) != len(src) {
		return nil, errors.New("structural: WithEdges: slices differ in length")
	}
	n := int32(g.N())
	for i, u := range src {
		if u < 0 || u >= n || dst[i] < 0 || dst[i] >= n {
			return nil, errors.New("structural: WithEdges: edge out of range")
		}
	}
	b := &Builder{names: names.Sealed(g.names), src: src, dst: dst, w: w, weighted: w != nil}
	return b.Build(BuildOptions{})
}

// AddEdges records the edges src[i] -> dst[i] (with weights w, when not
// nil), taking the slices over without copying them.
func (b *Builder) AddEdges(src, dst []int32, w []float64) {
	if len(src) == 0 {
		return
	}
	if w != nil && !b.weighted {
		b.AddWeightedEdge(src[0], dst[0], w[0])
		src, dst, w = src[1:], dst[1:], w[1:]
	}
	if b.weighted && w == nil {
		w = ones(len(src), len(src))
	}
	if len(b.src) > 0 {
		b.segs = append(b.segs, segment{b.src, b.dst, b.w})
		b.sealed += len(b.src)
	}
	b.segs = append(b.segs, segment{src, dst, w})
	b.sealed += len(src)
	b.src, b.dst, b.w = nil, nil, nil
}

// Grow reserves room for n more edges.
func (b *Builder) Grow(n int) {
	if n > 0 && cap(b.src)-len(b.src) < n {
		b.newSegment(n)
	}
}

// releaseEdges is the number of added edges from which Build collects them
// as soon as the rows are built (about 32 MiB of them).
const releaseEdges = 1 << 22

// segment is a run of edges.
type segment struct {
	src, dst []int32
	w        []float64
}

// maxSegment is the size of a segment once segments stop doubling.
const maxSegment = 1 << 20

// newSegment seals the segment being filled and starts one with room for
// at least min edges.
func (b *Builder) newSegment(min int) {
	size := max(min, 1024, minInt(2*cap(b.src), maxSegment))
	if len(b.src) > 0 {
		b.segs = append(b.segs, segment{b.src, b.dst, b.w})
		b.sealed += len(b.src)
	}
	b.src = bigmem.Make[int32](0, size)
	b.dst = bigmem.Make[int32](0, size)
	b.w = nil
	if b.weighted {
		b.w = bigmem.Make[float64](0, size)
	}
}

func minInt(a, b int) int {
	if a < b {
		return a
	}
	return b
}

// Intern returns the index of the named state, adding it when new. The
// bytes are copied. Names are kept verbatim.
func (b *Builder) Intern(name []byte) (int32, error) { return b.names.Intern(name) }

// InternInt returns the index of the state named by the canonical decimal
// form of v ("0", "7", "1200"), adding it when new. It is equivalent to
// Intern(strconv.AppendUint(nil, uint64(v), 10)) and much faster for
// integer-named inputs (a dense table indexed by value instead of a hash).
// v must be below 2^31-1.
func (b *Builder) InternInt(v uint32) (int32, error) { return b.names.InternInt(v) }

// InternNewInts adds the states named by the canonical decimal forms of
// vs, in order, as InternInt of each in turn would, for a reader that
// numbers integer names in bulk: the first gets state States(). None may
// be interned yet and no two may be equal; each must be below 2^31-1.
// After an error the Builder must not be used.
func (b *Builder) InternNewInts(vs []uint32) error { return b.names.InternNewInts(vs) }

// LookupInt returns the state named by the canonical decimal form of v if
// the Builder has it in its dense table, as InternInt would, without adding
// it. It may be called from any number of goroutines while one other
// goroutine calls InternInt and Intern: it then sees a subset of the names
// interned so far, so a reader that parses ahead of the goroutine interning
// in order can resolve the names already known and leave the rest to it.
func (b *Builder) LookupInt(v uint32) (int32, bool) { return b.names.LookupInt(v) }

// States returns the number of states so far.
func (b *Builder) States() int { return b.names.Len() }

// Edges returns the number of edges added so far, repeats included.
func (b *Builder) Edges() int { return b.sealed + len(b.src) }

// AddEdge records u -> v.
func (b *Builder) AddEdge(u, v int32) {
	if len(b.src) == cap(b.src) {
		b.newSegment(0)
	}
	b.src = append(b.src, u)
	b.dst = append(b.dst, v)
	if b.weighted {
		b.w = append(b.w, 1)
	}
}

// AddWeightedEdge records u -> v with weight w. Once a weighted edge is
// added, every edge carries a weight (1 for those added without). Build
// refuses a weight, or a sum of repeated entries, that is not finite.
func (b *Builder) AddWeightedEdge(u, v int32, w float64) {
	if !b.weighted {
		b.weighted = true
		for i := range b.segs {
			b.segs[i].w = ones(len(b.segs[i].src), len(b.segs[i].src))
		}
		b.w = ones(len(b.src), cap(b.src))
	}
	if len(b.src) == cap(b.src) {
		b.newSegment(0)
	}
	b.src = append(b.src, u)
	b.dst = append(b.dst, v)
	b.w = append(b.w, w)
}

// ones returns n weights of 1 with room for c.
func ones(n, c int) []float64 {
	w := make([]float64, n, c)
	for i := range w {
		w[i] = 1
	}
	return w
}

// Build returns the Network. The Builder must not be used afterwards. It
// fails with ErrEmpty for no states and with a *WeightError when the
// weights of an edge (repeated entries add up) are not a finite sum.
func (b *Builder) Build(opt BuildOptions) (*Network, error) {
	n := b.names.Len()
	if n == 0 {
		return nil, ErrEmpty
	}
	b.names.Release()
	inputEdges := b.Edges() // the edges added by the caller, before those Build adds
	if opt.Undirected {
		// Every edge u -> v, u != v, gains v -> u. The loop runs over a
		// copy of the segment list, which grows meanwhile.
		segs := append(append([]segment(nil), b.segs...), segment{b.src, b.dst, b.w})
		for _, sg := range segs {
			for i, u := range sg.src {
				if v := sg.dst[i]; u != v {
					if sg.w != nil {
						b.AddWeightedEdge(v, u, sg.w[i])
					} else {
						b.AddEdge(v, u)
					}
				}
			}
		}
	}
	if opt.SelfDynamics {
		// Only states without a loop of their own get one, so an input
		// loop keeps its weight and is not counted as a repeat.
		has := make([]bool, n)
		for _, sg := range append(b.segs, segment{b.src, b.dst, b.w}) {
			for i, u := range sg.src {
				if u == sg.dst[i] {
					has[u] = true
				}
			}
		}
		for u := 0; u < n; u++ {
			if !has[u] {
				b.AddEdge(int32(u), int32(u))
			}
		}
	}
	if int64(b.Edges()) >= 1<<40 {
		return nil, errors.New("structural: too many edges")
	}
	segs := append(b.segs, segment{b.src, b.dst, b.w})
	b.segs, b.src, b.dst, b.w = nil, nil, nil, nil
	m := b.sealed + len(segs[len(segs)-1].src)
	var src, dst [][]int32
	var w [][]float64
	for _, sg := range segs {
		src, dst = append(src, sg.src), append(dst, sg.dst)
		if b.weighted {
			w = append(w, sg.w)
		}
	}
	// A repeated edge's weights can add up to a non-finite number only
	// when the sum of all |weights| is not finite; then (rarely) the
	// edges as added are kept, to name the entry that overflowed.
	var kept []segment
	if b.weighted {
		total := 0.0
		for _, sg := range segs {
			for _, x := range sg.w {
				total += math.Abs(x)
			}
		}
		if math.IsInf(total, 0) || math.IsNaN(total) {
			kept = segs
		}
	}
	g := &Network{}
	weightError := func(u, v int32, sum float64, entries int) error {
		return &WeightError{From: g.names.Name(u), To: g.names.Name(v), Sum: sum, Entries: entries,
			Edge: inputEdge(kept, inputEdges, u, v, entries)}
	}
	// The in-rows are built from the edges at the same time as the
	// out-rows, on another core, with the name index.
	inDone := make(chan struct{})
	go func() {
		defer close(inDone)
		inPtr, inAdj, _ := sortBySource(n, m, dst, src, nil)
		q := dedupe(inPtr, inAdj)
		g.in = matching.CSR{Rows: n, Cols: n, Ptr: inPtr, Adj: trim(inAdj, q)}
		g.names = b.names.Seal()
	}()
	outPtr, outAdj, outW := sortBySource(n, m, src, dst, w)
	<-inDone
	src, dst, w, segs = nil, nil, nil, nil
	if m >= releaseEdges {
		// The edges as added (8 bytes each, 16 with weights) are garbage
		// now. Collecting them at once lets the arrays of the matching and
		// components that follow reuse their memory instead of growing
		// the process by as much before the next collection would come.
		runtime.GC()
	}
	// Merge repeats in place.
	merged, loops := 0, 0
	var q int64
	for u := 0; u < n; u++ {
		lo, hi := outPtr[u], outPtr[u+1]
		outPtr[u] = q
		entries := 0 // of the edge at q-1
		for k := lo; k < hi; k++ {
			if k > lo && outAdj[k] == outAdj[k-1] {
				merged++
				entries++
				if outW != nil {
					outW[q-1] += outW[k]
					if x := outW[q-1]; math.IsInf(x, 0) || math.IsNaN(x) {
						return nil, weightError(int32(u), outAdj[k], x, entries)
					}
				}
				continue
			}
			if outAdj[k] == int32(u) {
				loops++
			}
			outAdj[q] = outAdj[k]
			entries = 1
			if outW != nil {
				outW[q] = outW[k]
				if x := outW[q]; math.IsInf(x, 0) || math.IsNaN(x) {
					return nil, weightError(int32(u), outAdj[k], x, 1)
				}
			}
			q++
		}
	}
	outPtr[n] = q
	outAdj = trim(outAdj, q)
	if outW != nil {
		if int(q) < len(outW)-len(outW)/8 {
			outW = append([]float64(nil), outW[:q]...)
		}
		outW = outW[:q:q]
	}
	g.out = matching.CSR{Rows: n, Cols: n, Ptr: outPtr, Adj: outAdj}
	g.outW = outW
	g.selfLoops = loops
	g.duplicatesMerged = merged
	return g, nil
}

// inputEdge returns the index, among the edges the caller added, of the
// entries-th entry of u -> v in segs (the edges as added, then those Build
// added: the mirrors of the non-loop input edges when undirected, then
// self-loops); a mirror gives the input edge it mirrors. It returns -1
// when segs is nil or the entry is a self-loop Build added.
func inputEdge(segs []segment, inputEdges int, u, v int32, entries int) int64 {
	if segs == nil {
		return -1
	}
	k, seen := int64(0), 0
	found := int64(-1)
	for _, sg := range segs {
		for i, a := range sg.src {
			if a == u && sg.dst[i] == v {
				if seen++; seen == entries {
					found = k
				}
			}
			k++
			if found >= 0 {
				break
			}
		}
		if found >= 0 {
			break
		}
	}
	if found < int64(inputEdges) || u == v {
		if found >= int64(inputEdges) {
			return -1 // a self-loop of SelfDynamics
		}
		return found
	}
	// The mirror of the t-th non-loop input edge.
	t := found - int64(inputEdges)
	k = 0
	for _, sg := range segs {
		for i, a := range sg.src {
			if k == int64(inputEdges) {
				return -1
			}
			if a != sg.dst[i] {
				if t == 0 {
					return k
				}
				t--
			}
			k++
		}
	}
	return -1
}

// dedupe drops repeated entries from the sorted rows in place, updating
// ptr, and returns the number of entries kept.
func dedupe(ptr []int64, adj []int32) int64 {
	n := len(ptr) - 1
	var q int64
	for u := 0; u < n; u++ {
		lo, hi := ptr[u], ptr[u+1]
		ptr[u] = q
		for k := lo; k < hi; k++ {
			if k > lo && adj[k] == adj[k-1] {
				continue
			}
			adj[q] = adj[k]
			q++
		}
	}
	ptr[n] = q
	return q
}

// trim returns adj[:q], copied when many entries were dropped so that the
// tail's memory is released.
func trim(adj []int32, q int64) []int32 {
	if int(q) < len(adj)-len(adj)/8 {
		return append([]int32(nil), adj[:q]...)
	}
	return adj[:q:q]
}

// sortBySource returns the edges as rows by source: a counting sort by
// source, stable in input order, then each row sorted by target, stably,
// so repeated edges stay in input order and their weights add up in it.
func sortBySource(n, m int, src, dst [][]int32, w [][]float64) ([]int64, []int32, []float64) {
	// ptr[u+2] counts u's edges; after the prefix sum ptr[u+1] is where
	// row u starts, and the scatter advances it to where row u ends.
	ptr := bigmem.Make[int64](n+2, n+2)
	for _, seg := range src {
		for _, u := range seg {
			ptr[u+2]++
		}
	}
	for u := 2; u <= n; u++ {
		ptr[u] += ptr[u-1]
	}
	adj := bigmem.Make[int32](m, m)
	var ow []float64
	if w != nil {
		ow = bigmem.Make[float64](m, m)
	}
	for s, seg := range src {
		ds := dst[s][:len(seg)]
		if w != nil {
			ws := w[s][:len(seg)]
			for i, u := range seg {
				p := ptr[u+1]
				adj[p] = ds[i]
				ow[p] = ws[i]
				ptr[u+1] = p + 1
			}
			continue
		}
		for i, u := range seg {
			p := ptr[u+1]
			adj[p] = ds[i]
			ptr[u+1] = p + 1
		}
	}
	ptr = ptr[:n+1]
	var rs radixSorter
	for u := 0; u < n; u++ {
		lo, hi := ptr[u], ptr[u+1]
		if hi-lo < 2 {
			continue
		}
		row := adj[lo:hi]
		var rw []float64
		if ow != nil {
			rw = ow[lo:hi]
		}
		switch {
		case len(row) <= 24:
			if rw == nil {
				insertionSort(row)
			} else {
				sortWeighted(row, rw)
			}
		case len(row) < 256 && rw == nil:
			slices.Sort(row)
		default:
			// Hubs: a stable LSD radix sort keeps scale-free inputs as
			// cheap per edge as uniform ones.
			rs.sort(row, rw, n)
		}
	}
	return ptr, adj, ow
}

// radixSorter sorts rows by bytes, least significant first, stably,
// reusing its buffers.
type radixSorter struct {
	a []int32
	w []float64
}

// sort sorts a (and w with it, when not nil); values are below n.
func (s *radixSorter) sort(a []int32, w []float64, n int) {
	if cap(s.a) < len(a) {
		s.a = make([]int32, len(a))
	}
	ta := s.a[:len(a)]
	var tw []float64
	if w != nil {
		if cap(s.w) < len(w) {
			s.w = make([]float64, len(w))
		}
		tw = s.w[:len(w)]
	}
	for shift := uint(0); shift < 32 && n>>shift > 0; shift += 8 {
		var count [257]int
		for _, x := range a {
			count[int(uint32(x)>>shift&0xff)+1]++
		}
		if count[int(uint32(a[0])>>shift&0xff)+1] == len(a) {
			continue // one digit for all: nothing moves
		}
		for i := 1; i < 257; i++ {
			count[i] += count[i-1]
		}
		for i, x := range a {
			d := uint32(x) >> shift & 0xff
			p := count[d]
			count[d] = p + 1
			ta[p] = x
			if w != nil {
				tw[p] = w[i]
			}
		}
		copy(a, ta)
		if w != nil {
			copy(w, tw)
		}
	}
}

func insertionSort(a []int32) {
	for i := 1; i < len(a); i++ {
		x := a[i]
		j := i
		for j > 0 && a[j-1] > x {
			a[j] = a[j-1]
			j--
		}
		a[j] = x
	}
}

// sortWeighted insertion-sorts a short row by target, stably, carrying the
// weights along.
func sortWeighted(a []int32, w []float64) {
	for i := 1; i < len(a); i++ {
		x, y := a[i], w[i]
		j := i
		for j > 0 && a[j-1] > x {
			a[j], w[j] = a[j-1], w[j-1]
			j--
		}
		a[j], w[j] = x, y
	}
}
