package structural_test

import (
	"fmt"
	"math/bits"
	"math/rand/v2"
	"testing"

	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/internal/testnet"
)

// plKuhn is a plain augmenting-path maximum matching (Kuhn's method, from
// memory) on the bipartite graph of g, skipping one row, one column and
// one edge when asked (-1 for none). It is the recomputation reference.
func plKuhn(g *structural.Network, skipRow, skipCol int32, skipEdge [2]int32) int {
	n := g.N()
	colMate := make([]int32, n)
	for i := range colMate {
		colMate[i] = -1
	}
	var try func(u int32, seen []bool) bool
	try = func(u int32, seen []bool) bool {
		for _, v := range g.Succ(u) {
			if v == skipCol || seen[v] || u == skipEdge[0] && v == skipEdge[1] {
				continue
			}
			seen[v] = true
			if colMate[v] < 0 || try(colMate[v], seen) {
				colMate[v] = u
				return true
			}
		}
		return false
	}
	size := 0
	for u := int32(0); int(u) < n; u++ {
		if u != skipRow && try(u, make([]bool, n)) {
			size++
		}
	}
	return size
}

var noEdge = [2]int32{-1, -1}

// Node roles against the definition (Jia et al., Nature Communications
// 4:2002, 2013): enumerate every minimum driver set, i.e. every set of
// N - |M*| states whose complement can be matched (Hall's condition checked
// exhaustively), and see which states are in all, some or none.
func TestNodeRolesEnumeration(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 2))
	for i := 0; i < 300; i++ {
		n := 1 + rng.IntN(9)
		g := testnet.Random(t, rng, n, []float64{0.1, 0.2, 0.35}[i%3])
		o := testnet.NewOracle(g)
		size := plKuhn(g, -1, -1, noEdge)
		nd := n - size
		in := make([]int, n) // sets containing each state
		sets := 0
		for f := uint32(0); f <= o.Full(); f++ {
			if bits.OnesCount32(f) != nd {
				continue
			}
			x := o.Full() &^ f
			ok := true
			for y := x; y > 0 && ok; y = (y - 1) & x {
				ok = bits.OnesCount32(o.InNeighbours(y)) >= bits.OnesCount32(y)
			}
			if !ok {
				continue
			}
			sets++
			for v := 0; v < n; v++ {
				if f&(1<<v) != 0 {
					in[v]++
				}
			}
		}
		roles := structural.StateRoles(g).Of
		for v := 0; v < n; v++ {
			want := structural.Redundant
			switch {
			case nd > 0 && in[v] == sets:
				want = structural.Critical
			case in[v] > 0:
				want = structural.Intermittent
			}
			if roles[v] != want {
				t.Fatalf("trial %d: state %d is %v, enumeration of %d driver sets says %v", i, v, roles[v], sets, want)
			}
		}
	}
}

// Node and link roles by recomputation (remove a node's in-edges or a link,
// or force a link into the matching, and recount with a plain matching):
// the definitions of Liu et al. (Nature 473:167, 2011) and Jia et al.
// (2013), on networks too large to enumerate.
func TestRolesRecomputation(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 8))
	for i := 0; i < 200; i++ {
		n := 10 + rng.IntN(30)
		g := testnet.Random(t, rng, n, (1+rng.Float64()*2)/float64(n))
		size := plKuhn(g, -1, -1, noEdge)
		roles := structural.StateRoles(g).Of
		for v := int32(0); int(v) < n; v++ {
			// In some maximum matching's unmatched set: removing column v
			// keeps the matching size.
			some := plKuhn(g, -1, v, noEdge) == size
			every := true
			for _, u := range g.Pred(v) {
				if plKuhn(g, u, v, noEdge)+1 == size {
					every = false
				}
			}
			want := structural.Redundant
			switch {
			case every:
				want = structural.Critical
			case some:
				want = structural.Intermittent
			}
			if roles[v] != want {
				t.Fatalf("trial %d: state %d is %v, recomputation says %v", i, v, roles[v], want)
			}
		}
		links := structural.EdgeRoles(g).Of
		for u := int32(0); int(u) < n; u++ {
			for k, v := range g.Succ(u) {
				want := structural.Ordinary
				switch {
				case plKuhn(g, -1, -1, [2]int32{u, v}) < size:
					want = structural.Critical
				case plKuhn(g, u, v, noEdge)+1 < size:
					want = structural.Redundant
				}
				if got := links[g.Out().Ptr[u]+int64(k)]; got != want {
					t.Fatalf("trial %d: link %d -> %d is %v, recomputation says %v", i, u, v, got, want)
				}
			}
		}
	}
}

// The alternating digraph's components read through the matching are
// those of the digraph built row by row (the way roles were computed
// before), on random networks: same numbering, same source flags.
func TestSCCThroughMatchesBuilt(t *testing.T) {
	rng := rand.New(rand.NewPCG(8, 8))
	for trial := 0; trial < 200; trial++ {
		n := 1 + rng.IntN(60)
		g := testnet.Random(t, rng, n, rng.Float64()*4/float64(n))
		m := g.Matching()
		in := g.In()
		h := matching.CSR{Rows: n, Cols: n, Ptr: make([]int64, n+1)}
		for v := 0; v < n; v++ {
			for _, u := range in.Row(int32(v)) {
				if x := m.RowMate[u]; x >= 0 && x != int32(v) {
					h.Adj = append(h.Adj, x)
				}
			}
			h.Ptr[v+1] = int64(len(h.Adj))
		}
		want := structural.SCC(&h)
		got := structural.SCCThrough(in, m.RowMate, nil)
		if fmt.Sprint(got) != fmt.Sprint(want) {
			t.Fatalf("trial %d: %+v, want %+v", trial, got, want)
		}
	}
}
