package bip

import (
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/netsteer/netsteer/matching"
)

// size returns the size of a maximum matching of g restricted to the
// columns on, from matching.Maximum (an independent implementation).
func size(g *Graph, off []bool) int {
	var er, ec []int32
	for r := 0; r < g.N; r++ {
		for _, c := range g.Rows.Row(int32(r)) {
			if !off[c] {
				er = append(er, int32(r))
				ec = append(ec, c)
			}
		}
	}
	return matching.Maximum(matching.FromEdges(g.N, g.N+g.K, er, ec), nil).Size
}

func matched(a *Aug) int {
	k := 0
	for r, c := range a.RowMate {
		if c >= 0 {
			k++
			if a.ColMate[c] != int32(r) || a.Off[c] {
				panic("inconsistent matching")
			}
		}
	}
	return k
}

// Switching columns off, re-augmenting, testing and adding columns, then
// undoing, against matching.Maximum on the restricted graphs.
func TestAugAgainstMaximum(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 5))
	for trial := 0; trial < 2000; trial++ {
		n := 1 + rng.IntN(9)
		k := rng.IntN(5)
		var er, ec []int32
		for v := 0; v < n; v++ {
			for u := 0; u < n; u++ {
				if rng.Float64() < 0.25 {
					er = append(er, int32(v))
					ec = append(ec, int32(u))
				}
			}
		}
		in := matching.FromEdges(n, n, er, ec)
		sig := make([][]int32, k)
		for i := range sig {
			for v := 0; v < n; v++ {
				if rng.Float64() < 0.3 {
					sig[i] = append(sig[i], int32(v))
				}
			}
		}
		g := New(in, sig)
		m := g.Match()
		a := NewAug(g, m)
		mark := a.Mark()
		var freed []int32
		for c := 0; c < n+k; c++ {
			if rng.Float64() < 0.4 {
				if r := a.Disable(int32(c)); r >= 0 {
					freed = append(freed, r)
				}
			}
		}
		a.AugmentRows(freed)
		if got, want := matched(a), size(g, a.Off); got != want {
			t.Fatalf("trial %d: after AugmentRows %d matched, maximum %d", trial, got, want)
		}
		for c := 0; c < n+k; c++ {
			if !a.Off[c] {
				continue
			}
			off := slices.Clone(a.Off)
			off[c] = false
			want := size(g, off) > size(g, a.Off)
			if got := a.CanAugmentCol(int32(c)); got != want {
				t.Fatalf("trial %d: CanAugmentCol(%d) = %v, want %v", trial, c, got, want)
			}
		}
		for c := 0; c < n+k; c++ {
			if a.Off[c] && rng.IntN(2) == 0 {
				a.Enable(int32(c))
				a.AugmentCol(int32(c))
				if got, want := matched(a), size(g, a.Off); got != want {
					t.Fatalf("trial %d: after AugmentCol(%d) %d matched, maximum %d", trial, c, got, want)
				}
			}
		}
		a.Undo(mark)
		if !slices.Equal(a.RowMate, m.RowMate) || !slices.Equal(a.ColMate, m.ColMate) || slices.Contains(a.Off, true) {
			t.Fatalf("trial %d: Undo did not restore the matching", trial)
		}
	}
}
