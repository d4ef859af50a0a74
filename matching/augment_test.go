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

// AugmentWithout grows a matching that avoids some columns to a maximum
// matching of the graph without them: its size is what plain Kuhn
// augmentation (kuhn) finds on that subgraph built explicitly, the result
// is a matching of g using none of the removed columns, and the removed
// columns' mates read -1. Starts: empty, a random greedy
// matching of the subgraph, and, with kuhnEdgeFactor negative, the
// Pothen–Fan phases alone.
func TestAugmentWithout(t *testing.T) {
	r := rand.New(rand.NewPCG(27, 5))
	for trial := 0; trial < 600; trial++ {
		rows, cols := 1+r.IntN(40), 1+r.IntN(40)
		g := randomGraph(r, rows, cols, 0.02+0.2*r.Float64())
		without := make([]bool, cols)
		share := r.Float64() / 2
		for c := range without {
			without[c] = r.Float64() < share
		}
		var er, ec []int32
		for i := 0; i < rows; i++ {
			for _, c := range g.Row(int32(i)) {
				if !without[c] {
					er, ec = append(er, int32(i)), append(ec, c)
				}
			}
		}
		sub := FromEdges(rows, cols, er, ec)
		m := &Matching{RowMate: make([]int32, rows), ColMate: make([]int32, cols)}
		for i := range m.RowMate {
			m.RowMate[i] = -1
		}
		for c := range m.ColMate {
			m.ColMate[c] = -1
		}
		if trial%2 == 1 {
			for i := 0; i < rows; i++ {
				for _, c := range sub.Row(int32(i)) {
					if m.ColMate[c] < 0 && r.IntN(2) == 0 {
						m.RowMate[i], m.ColMate[c] = c, int32(i)
						m.Size++
						break
					}
				}
			}
		}
		if trial%3 == 2 {
			old := kuhnEdgeFactor
			kuhnEdgeFactor = -1
			AugmentWithout(g, nil, m, without)
			kuhnEdgeFactor = old
		} else {
			AugmentWithout(g, nil, m, without)
		}
		if err := checkMatching(sub, m); err != nil {
			t.Fatalf("trial %d: %v", trial, err)
		}
		for c, x := range without {
			if x && m.ColMate[c] != -1 {
				t.Fatalf("trial %d: removed column %d has mate %d", trial, c, m.ColMate[c])
			}
		}
		if want := kuhn(sub); m.Size != want {
			t.Fatalf("trial %d: size %d, Kuhn finds %d on the subgraph", trial, m.Size, want)
		}
	}
}
