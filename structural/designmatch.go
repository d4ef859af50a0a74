package structural

import (
	"sync"

	"github.com/netsteer/netsteer/matching"
)

// designMatch keeps the last matching of [A B] a network computed, for the
// design it was computed for.
type designMatch struct {
	mu  sync.Mutex
	sig *[]int32 // the design's first signal: its identity
	len int
	m   *matching.Matching
}

// DesignMatching returns a maximum matching of the bipartite graph of
// [A B] for design d (of [A; C]^T for Observability, on the transposed
// network): rows are the states, each needing a distinct in-neighbour;
// columns are the states 0..N-1 and the design's signals N+i (RowMate[v]
// is the state or signal feeding v, or -1). It is the matching whose size
// is Check's TermRank. The network keeps it for the last design asked, so
// that Check and a completion of the same design (structural/placement)
// compute it once; a design is told by its signal slices, which must not
// change once the design is made (see NewDesign). It is shared and must
// not be modified.
func DesignMatching(g *Network, p Property, d Design) (*matching.Matching, error) {
	if !d.Of(g) {
		return nil, ErrForeignDesign
	}
	h := g.on(p)
	var b *matching.CSR
	return h.designMatching(d.signals, &b), nil
}

// designMatching returns the kept matching for inputs, or computes it and
// keeps it. *b is inNeighbourCSR(h, inputs) or nil; when the augmenting
// searches need it and it is nil, it is built and left in *b.
func (h *Network) designMatching(inputs [][]int32, b **matching.CSR) *matching.Matching {
	dm := &h.dm
	dm.mu.Lock()
	defer dm.mu.Unlock()
	if len(inputs) > 0 && dm.m != nil && dm.sig == &inputs[0] && dm.len == len(inputs) {
		return dm.m
	}
	// Started from the network's maximum matching (kept for later
	// questions): the design's signals then only augment it, where a
	// matching from nothing spends long searches on some networks (2.5x
	// the time on one of the comparison workloads).
	n := h.N()
	m := warmStart(h, n+len(inputs))
	matchSignals(m, n, inputs)
	if m.Size < n {
		if *b == nil {
			*b = inNeighbourCSR(h, inputs)
		}
		matching.Augment(*b, inNeighbourCSRT(h, inputs), m)
	}
	if len(inputs) > 0 {
		dm.sig, dm.len, dm.m = &inputs[0], len(inputs), m
	}
	return m
}

// warmStart returns the network's maximum matching as a matching of the
// bipartite graph of [A B] with cols columns (inNeighbourCSR): row v
// matched to the state feeding it, the signals' columns free.
func warmStart(h *Network, cols int) *matching.Matching {
	base := h.Matching()
	n := h.N()
	m := &matching.Matching{RowMate: make([]int32, n), ColMate: make([]int32, cols), Size: base.Size}
	copy(m.RowMate, base.ColMate[:n])
	copy(m.ColMate, base.RowMate[:n])
	for c := n; c < cols; c++ {
		m.ColMate[c] = -1
	}
	return m
}

// matchSignals matches each signal's column, in order, to the first state
// it drives that m leaves unmatched: edges of [A B] that need no search.
// A design built on the states a maximum matching leaves unmatched (a
// driver set) is then matched completely, and the augmenting searches
// have nothing left to do, where otherwise they would search from every
// free row and free column.
func matchSignals(m *matching.Matching, n int, inputs [][]int32) {
	for i, in := range inputs {
		c := int32(n + i)
		for _, v := range in {
			if m.RowMate[v] < 0 {
				m.RowMate[v], m.ColMate[c] = c, v
				m.Size++
				break
			}
		}
	}
}
