package transform

import (
	"fmt"
	"math"
	"math/rand/v2"
	"sort"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/structural"
)

func testRand(seed uint64) *rand.Rand { return rand.New(rand.NewPCG(seed, seed^0x5bd1e995)) }

// randomNetwork builds a G(n, m)-like network with a few self-loops, by
// plain rejection sampling (independent of structural/gen).
func randomNetwork(t testing.TB, n, m, loops int, seed uint64) *structural.Network {
	t.Helper()
	rng := testRand(seed)
	b := structural.NewIntBuilder(n, 1)
	seen := map[[2]int32]bool{}
	for len(seen) < m {
		u, v := int32(rng.IntN(n)), int32(rng.IntN(n))
		if u == v || seen[[2]int32{u, v}] {
			continue
		}
		seen[[2]int32{u, v}] = true
		b.AddEdge(u, v)
	}
	for i := 0; i < loops; i++ {
		b.AddEdge(int32(i), int32(i))
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	return g
}

func edgeNames(g *structural.Network) map[string]bool {
	out := map[string]bool{}
	for u := int32(0); int(u) < g.N(); u++ {
		for _, v := range g.Succ(u) {
			out[g.Name(u)+" "+g.Name(v)] = true
		}
	}
	return out
}

func TestEdgeSetAgainstMap(t *testing.T) {
	rng := testRand(3)
	s := newEdgeSet(500)
	ref := map[[2]int32]bool{}
	for i := 0; i < 200000; i++ {
		u, v := int32(rng.IntN(40)), int32(rng.IntN(40))
		switch rng.IntN(3) {
		case 0:
			if len(ref) < 900 {
				s.add(u, v)
				ref[[2]int32{u, v}] = true
			}
		case 1:
			s.remove(u, v)
			delete(ref, [2]int32{u, v})
		}
		if s.has(u, v) != ref[[2]int32{u, v}] {
			t.Fatalf("step %d: has(%d,%d) = %v, map says %v", i, u, v, s.has(u, v), ref[[2]int32{u, v}])
		}
	}
}

// Degree-preserving randomisation keeps every in- and out-degree (Maslov &
// Sneppen 2002, definition) and the self-loops, and actually moves edges.
func TestSwapEdgesKeepsDegrees(t *testing.T) {
	g := randomNetwork(t, 3000, 12000, 5, 1)
	h, err := SwapEdges(g, 10, testRand(2))
	if err != nil {
		t.Fatal(err)
	}
	if h.N() != g.N() || h.Edges() != g.Edges() || h.SelfLoops() != g.SelfLoops() || h.DuplicatesMerged() != 0 {
		t.Fatalf("got N=%d L=%d loops=%d merged=%d; want N=%d L=%d loops=%d merged=0",
			h.N(), h.Edges(), h.SelfLoops(), h.DuplicatesMerged(), g.N(), g.Edges(), g.SelfLoops())
	}
	for v := int32(0); int(v) < g.N(); v++ {
		if len(g.Succ(v)) != len(h.Succ(v)) || len(g.Pred(v)) != len(h.Pred(v)) {
			t.Fatalf("state %s: degrees (%d,%d) became (%d,%d)", g.Name(v), len(g.Succ(v)), len(g.Pred(v)), len(h.Succ(v)), len(h.Pred(v)))
		}
	}
	before := edgeNames(g)
	same := 0
	for e := range edgeNames(h) {
		if before[e] {
			same++
		}
	}
	if frac := float64(same) / float64(g.Edges()); frac > 0.05 {
		t.Errorf("%.2f of the edges stayed after 10 swaps per edge; want nearly none", frac)
	}
}

// A degree-preserving randomisation of a structured network needs about
// the driver fraction the cavity method predicts for its degree sequence
// (Liu, Slotine & Barabási 2011, Table 1: n_D of degree-preserving
// randomised networks follows the degree distribution).
func TestSwapEdgesReachesDegreeExpectation(t *testing.T) {
	// A random out-tree laid over a random in-tree: uneven degrees, built
	// by plain code here.
	const n = 60000
	rng := testRand(9)
	b := structural.NewIntBuilder(n, 0)
	for i := 1; i < n; i++ {
		b.AddEdge(int32(rng.IntN(i)), int32(i))
		b.AddEdge(int32(i), int32(rng.IntN(i)))
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	want, err := structural.ExpectedDriverFraction(g)
	if err != nil {
		t.Fatal(err)
	}
	h, err := SwapEdges(g, 10, testRand(10))
	if err != nil {
		t.Fatal(err)
	}
	got := float64(structural.Drivers(h).Count()) / n
	t.Logf("before %.4f, after %.4f, expectation %.4f", float64(structural.Drivers(g).Count())/n, got, want)
	if math.Abs(got-want) > 0.006 {
		t.Errorf("randomised: n_D %.4f, degree-preserving expectation %.4f", got, want)
	}
}

func TestRewireKeepsNAndL(t *testing.T) {
	g := randomNetwork(t, 500, 3000, 3, 4)
	for _, p := range []float64{0, 0.5, 1} {
		h, err := RewireEdges(g, p, testRand(5))
		if err != nil {
			t.Fatal(err)
		}
		if h.N() != g.N() || h.Edges() != g.Edges() || h.SelfLoops() != 3 || h.DuplicatesMerged() != 0 {
			t.Errorf("p=%v: N=%d L=%d loops=%d merged=%d", p, h.N(), h.Edges(), h.SelfLoops(), h.DuplicatesMerged())
		}
		before := edgeNames(g)
		moved := 0
		for e := range edgeNames(h) {
			if !before[e] {
				moved++
			}
		}
		// A moved edge lands on an old place with probability about L/N^2
		// = 0.012, so about p L edges are new (binomial, 4 sd).
		want := p * float64(g.Edges()-3) * (1 - 0.012)
		if math.Abs(float64(moved)-want) > 4*math.Sqrt(want+1)+5 {
			t.Errorf("p=%v: %d edges moved, want about %.0f", p, moved, want)
		}
	}
}

func TestDropEdges(t *testing.T) {
	g := randomNetwork(t, 2000, 20000, 0, 6)
	h, err := DropEdges(g, 0.3, testRand(7))
	if err != nil {
		t.Fatal(err)
	}
	// Binomial(20000, 0.7): mean 14000, sd 65.
	if h.N() != g.N() || math.Abs(float64(h.Edges())-14000) > 4*65 {
		t.Errorf("got N=%d L=%d, want N=%d and L about 14000", h.N(), h.Edges(), g.N())
	}
	before := edgeNames(g)
	for e := range edgeNames(h) {
		if !before[e] {
			t.Fatalf("edge %s was not in the network", e)
		}
	}
}

func TestRemoveAndAttack(t *testing.T) {
	g := randomNetwork(t, 1000, 4000, 0, 8)
	h, err := RemoveStates(g, 0.25, testRand(1))
	if err != nil {
		t.Fatal(err)
	}
	if h.N() != 750 {
		t.Fatalf("remove 0.25 of 1000: got N=%d, want 750", h.N())
	}
	checkInduced(t, g, h)
	a, err := AttackStates(g, 0.1, testRand(2))
	if err != nil {
		t.Fatal(err)
	}
	if a.N() != 900 {
		t.Fatalf("attack 0.1 of 1000: got N=%d, want 900", a.N())
	}
	checkInduced(t, g, a)
	// Every removed state had at least the degree of every survivor.
	minGone, maxKept := math.MaxInt, 0
	for v := int32(0); int(v) < g.N(); v++ {
		d := len(g.Succ(v)) + len(g.Pred(v))
		if _, ok := a.Lookup(g.Name(v)); ok {
			maxKept = max(maxKept, d)
		} else {
			minGone = min(minGone, d)
		}
	}
	if minGone < maxKept {
		t.Errorf("attack removed a state of degree %d but kept one of degree %d", minGone, maxKept)
	}
	if _, err := RemoveStates(g, 1, testRand(1)); err == nil {
		t.Error("removing every state: got no error")
	}
}

// checkInduced checks that h is the subnetwork of g induced by h's states.
func checkInduced(t *testing.T, g, h *structural.Network) {
	t.Helper()
	want := 0
	for u := int32(0); int(u) < g.N(); u++ {
		if _, ok := h.Lookup(g.Name(u)); !ok {
			continue
		}
		for _, v := range g.Succ(u) {
			if _, ok := h.Lookup(g.Name(v)); ok {
				want++
			}
		}
	}
	before := edgeNames(g)
	for e := range edgeNames(h) {
		if !before[e] {
			t.Fatalf("edge %s is new", e)
		}
	}
	if h.Edges() != want {
		t.Errorf("got %d edges, want the %d among the survivors", h.Edges(), want)
	}
}

func TestAddSelfLoops(t *testing.T) {
	g := randomNetwork(t, 100, 300, 4, 2)
	h, err := AddSelfLoops(g, 1, testRand(1))
	if err != nil {
		t.Fatal(err)
	}
	if h.SelfLoops() != 100 || h.Edges() != g.Edges()+96 {
		t.Errorf("p=1: loops %d L %d, want 100 and %d", h.SelfLoops(), h.Edges(), g.Edges()+96)
	}
	// With a self-loop on every state the identity is a perfect matching:
	// one driver (common practice: nodal dynamics make N_D = 1).
	if nd := structural.Drivers(h).Count(); nd != 1 {
		t.Errorf("all self-loops: N_D = %d, want 1", nd)
	}
}

func TestReplicate(t *testing.T) {
	b := structural.NewBuilder()
	for _, e := range [][2]string{{"hub", "x"}, {"hub", "y"}} {
		u, _ := b.Intern([]byte(e[0]))
		v, _ := b.Intern([]byte(e[1]))
		b.AddEdge(u, v)
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		k    int
		c    Coupling
		want string
	}{
		{2, Coupling{Pattern: "chain", States: []string{"hub"}}, "[hub@1 hub@2 hub@1 x@1 hub@1 y@1 hub@2 x@2 hub@2 y@2]"},
		{3, Coupling{Pattern: "ring", States: []string{"x"}}, "[hub@1 x@1 hub@1 y@1 hub@2 x@2 hub@2 y@2 hub@3 x@3 hub@3 y@3 x@1 x@2 x@2 x@3 x@3 x@1]"},
		{2, Coupling{Pattern: "none"}, "[hub@1 x@1 hub@1 y@1 hub@2 x@2 hub@2 y@2]"},
		{3, Coupling{Pattern: "star", TwoWay: true, States: []string{"y"}}, "[hub@1 x@1 hub@1 y@1 hub@2 x@2 hub@2 y@2 hub@3 x@3 hub@3 y@3 y@1 y@2 y@1 y@3 y@2 y@1 y@3 y@1]"},
	} {
		h, err := Replicate(g, tc.k, tc.c)
		if err != nil {
			t.Fatal(err)
		}
		var got []string
		for e := range edgeNames(h) {
			got = append(got, e)
		}
		wantEdges := splitPairs(tc.want)
		sort.Strings(got)
		sort.Strings(wantEdges)
		if fmt.Sprint(got) != fmt.Sprint(wantEdges) || h.N() != 3*tc.k {
			t.Errorf("k=%d %+v: got N=%d edges %v, want %v", tc.k, tc.c, h.N(), got, wantEdges)
		}
	}
	if _, err := Replicate(g, 2, Coupling{States: []string{"nope"}}); err == nil {
		t.Error("unknown coupling state: got no error")
	}
}

// splitPairs turns "[a b c d]" into ["a b", "c d"].
func splitPairs(s string) []string {
	var f []string
	cur := ""
	for _, r := range s[1 : len(s)-1] {
		if r == ' ' {
			f = append(f, cur)
			cur = ""
			continue
		}
		cur += string(r)
	}
	f = append(f, cur)
	var out []string
	for i := 0; i+1 < len(f); i += 2 {
		out = append(out, f[i]+" "+f[i+1])
	}
	return out
}

func TestParseTransform(t *testing.T) {
	for _, tc := range []struct {
		in  string
		ok  bool
		val float64
	}{{"dropout=0.1", true, 0.1}, {"swap=10", true, 10}, {"replicate=3", true, 3}, {"replicate=2.5", false, 0},
		{"dropout=1.5", false, 0}, {"bogus=1", false, 0}, {"dropout", false, 0}, {"loops=x", false, 0}} {
		tr, err := Parse(tc.in)
		if (err == nil) != tc.ok || (tc.ok && tr.Value != tc.val) {
			t.Errorf("Parse(%q) = %+v, %v", tc.in, tr, err)
		}
	}
}

// Two-way couplings of many copies are linear in the copies (the reverse
// pairs were once deduplicated in quadratic time: 200,000 copies took
// hours), never repeat a coupling, and a fleet beyond the edge limit is
// refused before anything is built. Edge counts by hand: k copies of m
// edges plus the couplings times the coupled states.
func TestReplicateScale(t *testing.T) {
	b := structural.NewBuilder()
	u, _ := b.Intern([]byte("tank"))
	b.AddEdge(u, u)
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		k    int
		c    Coupling
		want int // edges
	}{
		{200000, Coupling{Pattern: "chain", TwoWay: true}, 200000 + 2*199999},
		{2, Coupling{Pattern: "ring", TwoWay: true}, 2 + 2},
		{3, Coupling{Pattern: "ring", TwoWay: true}, 3 + 6},
		{4, Coupling{Pattern: "star", TwoWay: true}, 4 + 6},
		{4, Coupling{Pattern: "all", TwoWay: true}, 4 + 12},
	} {
		h, err := Replicate(g, tc.k, tc.c)
		if err != nil {
			t.Fatalf("%d copies, %+v: %v", tc.k, tc.c, err)
		}
		if h.Edges() != tc.want || h.DuplicatesMerged() != 0 {
			t.Errorf("%d copies, %+v: got %d edges (%d repeats merged), want %d and none", tc.k, tc.c, h.Edges(), h.DuplicatesMerged(), tc.want)
		}
	}
	if _, err := Replicate(g, 100000, Coupling{Pattern: "all"}); err == nil || !strings.Contains(err.Error(), "exceed") {
		t.Errorf("100000 copies coupled all to all (10^10 edges): got %v, want an edge-limit error", err)
	}
}
