package structural

import (
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/graph/simple"
	"gonum.org/v1/gonum/graph/topo"

	"github.com/netsteer/netsteer/matching"
)

// TestSCCAgainstGonum compares the partition with gonum's topo.TarjanSCC
// (the reference library named in the issue), checks that every edge
// between components goes from a higher number to a lower one, and checks
// Sources against a direct scan, on random digraphs of several densities.
func TestSCCAgainstGonum(t *testing.T) {
	r := rand.New(rand.NewPCG(5, 6))
	for trial := 0; trial < 400; trial++ {
		n := 1 + r.IntN(60)
		m := r.IntN(3 * n)
		var er, ec []int32
		dg := simple.NewDirectedGraph()
		for i := 0; i < n; i++ {
			dg.AddNode(simple.Node(i))
		}
		for k := 0; k < m; k++ {
			u, v := int32(r.IntN(n)), int32(r.IntN(n))
			er, ec = append(er, u), append(ec, v)
			if u != v {
				dg.SetEdge(simple.Edge{F: simple.Node(u), T: simple.Node(v)})
			}
		}
		g := matching.FromEdges(n, n, er, ec)
		c := SCC(g)
		want := topo.TarjanSCC(dg)
		if c.Count != len(want) {
			t.Fatalf("trial %d: got %d components, want %d (gonum)", trial, c.Count, len(want))
		}
		for _, comp := range want {
			k := c.Of[comp[0].ID()]
			for _, v := range comp {
				if c.Of[v.ID()] != k {
					t.Fatalf("trial %d: states %d and %d split, gonum joins them", trial, comp[0].ID(), v.ID())
				}
			}
		}
		for i, u := range er {
			if cu, cv := c.Of[u], c.Of[ec[i]]; cu != cv && cu < cv {
				t.Fatalf("trial %d: edge %d -> %d goes from component %d to %d (want higher to lower)", trial, u, ec[i], cu, cv)
			}
		}
		got := c.Source
		wantSrc := make([]bool, c.Count)
		for k := range wantSrc {
			wantSrc[k] = true
		}
		for i, u := range er {
			if c.Of[u] != c.Of[ec[i]] {
				wantSrc[c.Of[ec[i]]] = false
			}
		}
		for k := range got {
			if got[k] != wantSrc[k] {
				t.Fatalf("trial %d: component %d source %v, want %v", trial, k, got[k], wantSrc[k])
			}
		}
	}
}

// TestSCCLongChainAndCycle runs a 10^7-state directed chain (10^7
// singleton components, a depth-first path of 10^7 states) and a cycle of
// the same length (one component): the call stack lives on the heap.
func TestSCCLongChainAndCycle(t *testing.T) {
	n := 10_000_000
	if testing.Short() {
		n = 1_000_000
	}
	g := &matching.CSR{Rows: n, Cols: n, Ptr: make([]int64, n+1), Adj: make([]int32, n)}
	for i := 0; i < n; i++ {
		g.Adj[i] = int32(i + 1)
		g.Ptr[i+1] = int64(i + 1)
	}
	g.Adj[n-1] = 0 // cycle
	c := SCC(g)
	if c.Count != 1 {
		t.Fatalf("cycle: got %d components, want 1", c.Count)
	}
	g.Adj = g.Adj[:n-1]
	g.Ptr[n] = int64(n - 1)
	c = SCC(g)
	if c.Count != n {
		t.Fatalf("chain: got %d components, want %d", c.Count, n)
	}
	// The head is the only source; it completes last.
	if c.Of[0] != int32(n-1) || c.Of[n-1] != 0 {
		t.Fatalf("chain: head in component %d, tail in %d; want %d and 0", c.Of[0], c.Of[n-1], n-1)
	}
	src := c.Source
	for k, s := range src {
		if s != (k == n-1) {
			t.Fatalf("chain: component %d source %v", k, s)
		}
	}
}
