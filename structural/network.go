package structural

import (
	"runtime"
	"sync"

	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural/internal/names"
)

// MaxStates is the largest number of states a Network can hold (int32
// indices).
const MaxStates = names.MaxStates

// Network is a directed network of states; see the package comment for the
// edge convention. A Network is immutable once built and safe for
// concurrent use; the maximum matching, the strongly connected components
// and the transpose are computed on first use and kept.
type Network struct {
	// out holds row u = the states u acts on; in holds row v = the states
	// acting on v. Rows are sorted and free of duplicates.
	out, in matching.CSR
	// outW, when not nil, holds the weight of each edge of out (aligned
	// with out.Adj). Merged duplicate edges have their weights summed.
	outW             []float64
	selfLoops        int
	duplicatesMerged int
	names            *names.Table

	matchOnce sync.Once
	match     *matching.Matching
	compOnce  sync.Once
	comps     *Components
	altOnce   sync.Once
	alt       *alternating
	dm        designMatch
	tOnce     sync.Once
	t         *Network
	// of is the network this one is the transpose of, nil otherwise.
	of *Network
}

// N returns the number of states.
func (g *Network) N() int { return g.out.Rows }

// Edges returns the number of distinct edges, self-loops included.
func (g *Network) Edges() int { return len(g.out.Adj) }

// SelfLoops returns the number of states with a self-loop.
func (g *Network) SelfLoops() int { return g.selfLoops }

// DuplicatesMerged returns the number of input edges dropped as repeats
// when the network was built.
func (g *Network) DuplicatesMerged() int { return g.duplicatesMerged }

// Name returns the name of state v.
func (g *Network) Name(v int32) string { return g.names.Name(v) }

// AppendName appends the name of state v to b.
func (g *Network) AppendName(b []byte, v int32) []byte { return g.names.Append(b, v) }

// Lookup returns the index of the state with the given name.
func (g *Network) Lookup(name string) (int32, bool) { return g.names.Lookup(name) }

// IntNames reports whether state v is named by the decimal integer v+base
// (Matrix Market indices, generated networks), and the base.
func (g *Network) IntNames() (base int, ok bool) { return g.names.IntBase() }

// Succ returns the states u acts on, in increasing order. The slice is
// shared with the network and must not be modified.
func (g *Network) Succ(u int32) []int32 { return g.out.Row(u) }

// Pred returns the states acting on v, in increasing order. The slice is
// shared with the network and must not be modified.
func (g *Network) Pred(v int32) []int32 { return g.in.Row(v) }

// HasEdge reports whether u acts on v.
func (g *Network) HasEdge(u, v int32) bool {
	_, ok := g.edgeIndex(u, v)
	return ok
}

// edgeIndex returns the position of the edge u -> v in out.Adj.
func (g *Network) edgeIndex(u, v int32) (int64, bool) {
	lo, hi := g.out.Ptr[u], g.out.Ptr[u+1]
	for lo < hi {
		mid := lo + (hi-lo)/2
		switch x := g.out.Adj[mid]; {
		case x == v:
			return mid, true
		case x < v:
			lo = mid + 1
		default:
			hi = mid
		}
	}
	return -1, false
}

// Weight returns the weight of the edge u -> v (1 when the network is
// unweighted) and whether the edge exists.
func (g *Network) Weight(u, v int32) (float64, bool) {
	k, ok := g.edgeIndex(u, v)
	if !ok {
		return 0, false
	}
	if g.outW == nil {
		return 1, true
	}
	return g.outW[k], true
}

// Weighted reports whether the network was built with edge weights.
func (g *Network) Weighted() bool { return g.outW != nil }

// Out returns the out-rows as a compressed sparse row matrix: row u lists
// the states u acts on. The arrays are shared with the network and must
// not be modified; hot loops in other packages read them directly.
func (g *Network) Out() *matching.CSR { c := g.out; return &c }

// In returns the in-rows (row v lists the states acting on v); as Out.
func (g *Network) In() *matching.CSR { c := g.in; return &c }

// Weights returns the weight of every edge, aligned with Out().Adj, or nil
// for an unweighted network. The slice is shared and must not be modified.
func (g *Network) Weights() []float64 { return g.outW }

// Matching returns a maximum matching of the network's bipartite
// representation (row u, the out-copy of u, is adjacent to column v, the
// in-copy of v, for every edge u -> v), computed once. The columns left
// unmatched are driver nodes. It is shared and must not be modified.
func (g *Network) Matching() *matching.Matching {
	g.matchOnce.Do(func() {
		if g.of != nil {
			// A matching of A^T is a matching of A with the sides swapped.
			m := g.of.Matching()
			g.match = &matching.Matching{RowMate: m.ColMate, ColMate: m.RowMate, Size: m.Size}
			return
		}
		g.match = matching.Maximum(&g.out, &g.in)
	})
	return g.match
}

// Components returns the strongly connected components, computed once.
// They are shared and must not be modified.
func (g *Network) Components() *Components {
	g.compOnce.Do(func() {
		if g.Edges() >= fbEdges {
			g.comps = forwardBackward(&g.out, &g.in)
		} else {
			g.comps = scc(&g.out, nil, nil)
		}
	})
	return g.comps
}

// MatchingAndComponents returns Matching() and Components(), computing
// them at the same time on two goroutines when neither is kept yet and
// the network is large (both read the same rows and are bound by memory
// latency, so on two cores they take about the time of the matching
// alone).
func (g *Network) MatchingAndComponents() (*matching.Matching, *Components) {
	if g.Edges() >= parallelEdges && runtime.GOMAXPROCS(0) > 1 {
		done := make(chan struct{})
		go func() {
			defer close(done)
			g.Components()
		}()
		m := g.Matching()
		<-done
		return m, g.Components()
	}
	return g.Matching(), g.Components()
}

// parallelEdges is the size from which MatchingAndComponents runs both
// at once.
const parallelEdges = 1 << 16

// Transpose returns the network with every edge reversed (A^T), sharing
// g's names and adjacency; only the weights, if any, are copied into the
// new edge order. Controllability of the transpose is observability of g.
// It is computed once.
func (g *Network) Transpose() *Network {
	if g.of != nil {
		return g.of
	}
	g.tOnce.Do(func() {
		t := &Network{out: g.in, in: g.out, selfLoops: g.selfLoops, duplicatesMerged: g.duplicatesMerged, names: g.names, of: g}
		if g.outW != nil {
			// In row v lists the sources u of v in increasing u, the order
			// in which scanning out row by row meets them.
			n := g.N()
			pos := make([]int64, n)
			copy(pos, g.in.Ptr[:n])
			t.outW = make([]float64, len(g.outW))
			for u := 0; u < n; u++ {
				for k := g.out.Ptr[u]; k < g.out.Ptr[u+1]; k++ {
					v := g.out.Adj[k]
					t.outW[pos[v]] = g.outW[k]
					pos[v]++
				}
			}
		}
		g.t = t
	})
	return g.t
}

// on returns the network on which property p is controllability: g itself,
// or its transpose for observability.
func (g *Network) on(p Property) *Network {
	if p == Observability {
		return g.Transpose()
	}
	return g
}

// sameStates reports whether h has the states of g (the same name table).
func (g *Network) sameStates(h *Network) bool { return g.names == h.names }
