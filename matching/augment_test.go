package matching

import (
	"math/rand/v2"
	"testing"
)

// Augment completes a matching of a subgraph to a maximum matching of the
// whole graph: its size is the one plain Kuhn augmentation gives (kuhn,
// the independent route of the other tests), the result is a matching of
// g, and every row and column matched at the start is still matched
// (augmenting paths never free a matched vertex; Berge 1957).
func TestAugmentFromSubgraph(t *testing.T) {
	r := rand.New(rand.NewPCG(17, 4))
	for trial := 0; trial < 300; trial++ {
		rows, cols := 1+r.IntN(40), 1+r.IntN(40)
		g := randomGraph(r, rows, cols, 0.02+0.2*r.Float64())
		// A subgraph: a random share of the edges.
		var er, ec []int32
		keep := r.Float64()
		for i := 0; i < rows; i++ {
			for _, c := range g.Row(int32(i)) {
				if r.Float64() < keep {
					er, ec = append(er, int32(i)), append(ec, c)
				}
			}
		}
		sub := FromEdges(rows, cols, er, ec)
		m := Maximum(sub, nil)
		startRow := append([]int32(nil), m.RowMate...)
		startCol := append([]int32(nil), m.ColMate...)
		before := m.Size
		added := Augment(g, nil, m)
		if err := checkMatching(g, m); err != nil {
			t.Fatalf("trial %d: %v", trial, err)
		}
		if want := kuhn(g); m.Size != want || added != m.Size-before {
			t.Fatalf("trial %d: size %d (added %d from %d), Kuhn finds %d", trial, m.Size, added, before, want)
		}
		for i, c := range startRow {
			if c >= 0 && m.RowMate[i] < 0 {
				t.Fatalf("trial %d: row %d was matched and is free", trial, i)
			}
		}
		for c, i := range startCol {
			if i >= 0 && m.ColMate[c] < 0 {
				t.Fatalf("trial %d: column %d was matched and is free", trial, c)
			}
		}
	}
}
