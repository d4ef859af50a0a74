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
	return h.designMatching(d.signals, nil), nil
}

// designMatching returns the kept matching for inputs, or computes it from
// b = inNeighbourCSR(h, inputs) (built here when nil) and keeps it.
func (h *Network) designMatching(inputs [][]int32, b *matching.CSR) *matching.Matching {
	dm := &h.dm
	dm.mu.Lock()
	defer dm.mu.Unlock()
	if len(inputs) > 0 && dm.m != nil && dm.sig == &inputs[0] && dm.len == len(inputs) {
		return dm.m
	}
	if b == nil {
		b = inNeighbourCSR(h, inputs)
	}
	// Started from the network's maximum matching (kept for later
	// questions): the design's signals then only augment it, where a
	// matching from nothing spends long searches on some networks (2.5x
	// the time on one of the comparison workloads).
	m := warmStart(h, b)
	matching.Augment(b, inNeighbourCSRT(h, inputs), m)
	if len(inputs) > 0 {
		dm.sig, dm.len, dm.m = &inputs[0], len(inputs), m
	}
	return m
}

// warmStart returns the network's maximum matching as a matching of b =
// inNeighbourCSR(h, inputs): row v matched to the state feeding it, the
// signals' columns free.
func warmStart(h *Network, b *matching.CSR) *matching.Matching {
	base := h.Matching()
	n := h.N()
	m := &matching.Matching{RowMate: make([]int32, b.Rows), ColMate: make([]int32, b.Cols), Size: base.Size}
	copy(m.RowMate, base.ColMate[:n])
	copy(m.ColMate, base.RowMate[:n])
	for c := n; c < b.Cols; c++ {
		m.ColMate[c] = -1
	}
	return m
}
