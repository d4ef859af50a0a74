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
// the same length (one component): the call stack lives on the heap. The
// chain also goes through forwardBackward.
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
	// forwardBackward: the pivot is the second state, its forward search
	// a path of n-1 states; the order stays topological.
	c = forwardBackward(g, matching.Transpose(g))
	if c.Count != n || c.Of[0] != int32(n-1) || c.Of[n-1] != 0 {
		t.Fatalf("chain, forward-backward: %d components, head in %d, tail in %d", c.Count, c.Of[0], c.Of[n-1])
	}
	for v := 1; v < n; v++ {
		if c.Of[v-1] <= c.Of[v] || c.Source[c.Of[v]] {
			t.Fatalf("chain, forward-backward: state %d in component %d after %d (source %v)", v, c.Of[v], c.Of[v-1], c.Source[c.Of[v]])
		}
	}
}

// TestForwardBackwardAgainstGonum checks forwardBackward as
// TestSCCAgainstGonum checks SCC (partition against gonum's
// topo.TarjanSCC, numbering topological, sources by a direct scan), on
// random digraphs from 1 to 3,000 states whose densities give no giant
// component, a small one, or one holding most states, and on digraphs
// built around a cycle with chains entering and leaving it.
func TestForwardBackwardAgainstGonum(t *testing.T) {
	r := rand.New(rand.NewPCG(15, 16))
	for trial := 0; trial < 600; trial++ {
		n := 1 + r.IntN(60)
		if trial%10 == 0 {
			n = 500 + r.IntN(2500)
		}
		var er, ec []int32
		switch trial % 3 {
		case 0, 1: // random, mean degree 0 to 4
			m := r.IntN(4*n + 1)
			for k := 0; k < m; k++ {
				er, ec = append(er, int32(r.IntN(n))), append(ec, int32(r.IntN(n)))
			}
		case 2: // a cycle on a random part, random chords, chains in and out
			perm := r.Perm(n)
			c := 1 + r.IntN(n)
			for i := 0; i < c; i++ {
				er, ec = append(er, int32(perm[i])), append(ec, int32(perm[(i+1)%c]))
			}
			for i := c; i < n; i++ {
				j := perm[r.IntN(i)]
				if r.IntN(2) == 0 {
					er, ec = append(er, int32(j)), append(ec, int32(perm[i]))
				} else {
					er, ec = append(er, int32(perm[i])), append(ec, int32(j))
				}
			}
			for k := r.IntN(n/4 + 1); k > 0; k-- {
				er, ec = append(er, int32(r.IntN(n))), append(ec, int32(r.IntN(n)))
			}
		}
		dg := simple.NewDirectedGraph()
		for i := 0; i < n; i++ {
			dg.AddNode(simple.Node(i))
		}
		for i, u := range er {
			if u != ec[i] {
				dg.SetEdge(simple.Edge{F: simple.Node(u), T: simple.Node(ec[i])})
			}
		}
		g := matching.FromEdges(n, n, er, ec)
		c := forwardBackward(g, matching.Transpose(g))
		want := topo.TarjanSCC(dg)
		if c.Count != len(want) {
			t.Fatalf("trial %d (n=%d): got %d components, want %d (gonum)", trial, n, c.Count, len(want))
		}
		size := make([]int, c.Count)
		for _, comp := range want {
			k := c.Of[comp[0].ID()]
			for _, v := range comp {
				if c.Of[v.ID()] != k {
					t.Fatalf("trial %d: states %d and %d split, gonum joins them", trial, comp[0].ID(), v.ID())
				}
			}
			size[k] += len(comp)
		}
		for k, sz := range size {
			if sz == 0 {
				t.Fatalf("trial %d: component %d is empty", trial, k)
			}
		}
		wantSrc := make([]bool, c.Count)
		for k := range wantSrc {
			wantSrc[k] = true
		}
		for i, u := range er {
			cu, cv := c.Of[u], c.Of[ec[i]]
			if cu != cv && cu < cv {
				t.Fatalf("trial %d: edge %d -> %d goes from component %d to %d (want higher to lower)", trial, u, ec[i], cu, cv)
			}
			if cu != cv {
				wantSrc[cv] = false
			}
		}
		for k := range wantSrc {
			if c.Source[k] != wantSrc[k] {
				t.Fatalf("trial %d: component %d source %v, want %v", trial, k, c.Source[k], wantSrc[k])
			}
		}
	}
}
