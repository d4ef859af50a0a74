package dom

import (
	"math/rand/v2"
	"testing"

	"github.com/netsteer/netsteer/matching"
)

// reachAvoiding marks the vertices the root reaches without entering skip
// (skip < 0 avoids nothing).
func reachAvoiding(g *matching.CSR, root, skip int32) []bool {
	seen := make([]bool, g.Rows)
	if root == skip {
		return seen
	}
	seen[root] = true
	q := []int32{root}
	for len(q) > 0 {
		u := q[0]
		q = q[1:]
		for _, v := range g.Row(u) {
			if v != skip && !seen[v] {
				seen[v] = true
				q = append(q, v)
			}
		}
	}
	return seen
}

// The dominator tree against the definition (common practice): d dominates
// v when removing d cuts every path from the root to v; the immediate
// dominator is the strict dominator that all other strict dominators
// dominate. Thousands of random digraphs, including dense, sparse and
// partly unreachable ones.
func TestTreeAgainstDefinition(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 11))
	for trial := 0; trial < 3000; trial++ {
		n := 1 + rng.IntN(12)
		p := []float64{0.08, 0.15, 0.3, 0.5}[rng.IntN(4)]
		var er, ec []int32
		for u := 0; u < n; u++ {
			for v := 0; v < n; v++ {
				if rng.Float64() < p {
					er = append(er, int32(u))
					ec = append(ec, int32(v))
				}
			}
		}
		g := matching.FromEdges(n, n, er, ec)
		pred := matching.Transpose(g)
		root := int32(rng.IntN(n))
		tr := New(g, pred, root)
		reach := reachAvoiding(g, root, -1)
		// dom[d][v]: d dominates v.
		domset := make([][]bool, n)
		for d := 0; d < n; d++ {
			r := reachAvoiding(g, root, int32(d))
			domset[d] = make([]bool, n)
			for v := 0; v < n; v++ {
				domset[d][v] = reach[v] && (v == d || !r[v])
			}
		}
		for v := int32(0); v < int32(n); v++ {
			if !reach[v] {
				if tr.Idom[v] != -1 || tr.Reachable(v) {
					t.Fatalf("trial %d: unreachable %d has idom %d", trial, v, tr.Idom[v])
				}
				continue
			}
			for d := int32(0); d < int32(n); d++ {
				if reach[d] && tr.Dominates(d, v) != domset[d][v] {
					t.Fatalf("trial %d: Dominates(%d,%d) = %v, definition %v", trial, d, v, !domset[d][v], domset[d][v])
				}
			}
			if v == root {
				if tr.Idom[v] != root {
					t.Fatalf("trial %d: idom of root %d", trial, tr.Idom[v])
				}
				continue
			}
			want := int32(-1)
			for d := int32(0); d < int32(n); d++ {
				if d == v || !domset[d][v] {
					continue
				}
				all := true
				for e := int32(0); e < int32(n); e++ {
					if e != v && e != d && domset[e][v] && !domset[e][d] {
						all = false
					}
				}
				if all {
					want = d
				}
			}
			if tr.Idom[v] != want {
				t.Fatalf("trial %d: idom(%d) = %d, want %d", trial, v, tr.Idom[v], want)
			}
			sub := tr.Subtree(v)
			cnt := 0
			for w := 0; w < n; w++ {
				if domset[v][w] {
					cnt++
				}
			}
			if len(sub) != cnt || sub[0] != v {
				t.Fatalf("trial %d: subtree of %d = %v, want %d vertices", trial, v, sub, cnt)
			}
		}
	}
}

// A path of a million vertices: deep trees cost heap, not stack.
func TestDeepPath(t *testing.T) {
	n := 1_000_000
	er := make([]int32, n-1)
	ec := make([]int32, n-1)
	for i := range er {
		er[i], ec[i] = int32(i), int32(i+1)
	}
	g := matching.FromEdges(n, n, er, ec)
	tr := New(g, matching.Transpose(g), 0)
	if tr.Idom[n-1] != int32(n-2) || tr.Size[0] != int32(n) || tr.Pre[n-1] != int32(n-1) {
		t.Fatalf("idom %d size %d pre %d", tr.Idom[n-1], tr.Size[0], tr.Pre[n-1])
	}
}
