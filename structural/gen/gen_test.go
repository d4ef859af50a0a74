package gen

import (
	"fmt"
	"math"
	"sort"
	"testing"

	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural"
)

// edgeList is a Sink that keeps edges, for tests.
type edgeList struct{ u, v []int32 }

func (e *edgeList) AddEdge(u, v int32) { e.u = append(e.u, u); e.v = append(e.v, v) }

// checkSimple fails when the edges hold a self-loop or a repeat, or a state
// out of range.
func checkSimple(t *testing.T, name string, n int, e *edgeList) {
	t.Helper()
	seen := make(map[[2]int32]bool, len(e.u))
	for i := range e.u {
		u, v := e.u[i], e.v[i]
		if u < 0 || v < 0 || int(u) >= n || int(v) >= n {
			t.Fatalf("%s: edge %d -> %d out of range [0,%d)", name, u, v, n)
		}
		if u == v {
			t.Fatalf("%s: self-loop at %d", name, u)
		}
		if seen[[2]int32{u, v}] {
			t.Fatalf("%s: repeated edge %d -> %d", name, u, v)
		}
		seen[[2]int32{u, v}] = true
	}
}

func degrees(n int, e *edgeList) (out, in []int) {
	out, in = make([]int, n), make([]int, n)
	for i := range e.u {
		out[e.u[i]]++
		in[e.v[i]]++
	}
	return out, in
}

// G(N, L) has exactly L edges by definition (Erdős & Rényi 1959), none
// repeated, and no self-loops in the directed variant used here.
func TestERExactEdges(t *testing.T) {
	for _, tc := range []struct {
		n int
		l int64
	}{{1, 0}, {2, 2}, {5, 20}, {5, 13}, {100, 0}, {1000, 5000}, {300, 80000}, {20000, 150000}} {
		var e edgeList
		if err := ER(tc.n, tc.l, NewRand(1), &e); err != nil {
			t.Fatalf("ER(%d, %d): %v", tc.n, tc.l, err)
		}
		if int64(len(e.u)) != tc.l {
			t.Errorf("ER(%d, %d): got %d edges, want %d", tc.n, tc.l, len(e.u), tc.l)
		}
		checkSimple(t, fmt.Sprintf("ER(%d,%d)", tc.n, tc.l), tc.n, &e)
	}
	if err := ER(5, 21, NewRand(1), &edgeList{}); err == nil {
		t.Error("ER(5, 21): got no error for more edges than n(n-1)")
	}
}

// G(N, L) is uniform over the L-subsets of the N(N-1) possible edges
// (definition). With N = 3 and L = 2 there are C(6,2) = 15 subsets; a
// chi-square test over 30000 draws (14 degrees of freedom, 0.1% critical
// value 36.1; statistical tables) checks that each is equally likely.
func TestERUniform(t *testing.T) {
	counts := map[string]int{}
	rng := NewRand(7)
	const draws = 30000
	for i := 0; i < draws; i++ {
		var e edgeList
		if err := ER(3, 2, rng, &e); err != nil {
			t.Fatal(err)
		}
		counts[fmt.Sprint(e.u, e.v)]++
	}
	if len(counts) != 15 {
		t.Fatalf("got %d distinct edge sets, want 15", len(counts))
	}
	chi := 0.0
	want := float64(draws) / 15
	for _, c := range counts {
		chi += (float64(c) - want) * (float64(c) - want) / want
	}
	if chi > 36.1 {
		t.Errorf("chi-square %.1f > 36.1: edge sets not uniform", chi)
	}
	// The dense branch (complement sampling) must be uniform too.
	counts = map[string]int{}
	for i := 0; i < draws; i++ {
		var e edgeList
		if err := ER(3, 4, rng, &e); err != nil {
			t.Fatal(err)
		}
		counts[fmt.Sprint(e.u, e.v)]++
	}
	chi = 0
	for _, c := range counts {
		chi += (float64(c) - want) * (float64(c) - want) / want
	}
	if len(counts) != 15 || chi > 36.1 {
		t.Errorf("dense ER(3, 4): %d edge sets, chi-square %.1f", len(counts), chi)
	}
}

// The same seed gives the same network (reproducibility contract).
func TestSameSeedSameEdges(t *testing.T) {
	for _, m := range Models {
		p := Defaults(m, 2000)
		var a, b edgeList
		if err := p.Generate(NewRand(42), &a); err != nil {
			t.Fatalf("%s: %v", m, err)
		}
		if err := p.Generate(NewRand(42), &b); err != nil {
			t.Fatal(err)
		}
		if fmt.Sprint(a) != fmt.Sprint(b) {
			t.Errorf("%s: same seed, different edges", m)
		}
		checkSimple(t, m, p.Nodes, &a)
		if h := p.EdgeHint(); (m != "small-world" && m != "scale-free") && h != int64(len(a.u)) {
			t.Errorf("%s: EdgeHint %d, emitted %d", m, h, len(a.u))
		}
	}
}

// Random regular networks have every degree exactly d on the fixed side
// (definition); the free side of an out-regular network has mean d.
func TestRegularDegrees(t *testing.T) {
	for _, tc := range []struct {
		n, d int
		side Side
	}{{10, 9, Both}, {50, 3, Both}, {20000, 4, Both}, {7, 1, Both}, {20000, 3, Out}, {20000, 2, In}} {
		var e edgeList
		if err := Regular(tc.n, tc.d, tc.side, NewRand(3), &e); err != nil {
			t.Fatalf("Regular(%d,%d,%v): %v", tc.n, tc.d, tc.side, err)
		}
		checkSimple(t, "regular", tc.n, &e)
		out, in := degrees(tc.n, &e)
		for v := 0; v < tc.n; v++ {
			if tc.side != In && out[v] != tc.d {
				t.Fatalf("Regular(%d,%d,%v): out-degree of %d is %d", tc.n, tc.d, tc.side, v, out[v])
			}
			if tc.side != Out && in[v] != tc.d {
				t.Fatalf("Regular(%d,%d,%v): in-degree of %d is %d", tc.n, tc.d, tc.side, v, in[v])
			}
		}
	}
}

// Static model degree exponents (Goh, Kahng & Kim 2001: P(k) ~ k^-γ with
// γ = 1 + 1/α), estimated by the discrete maximum-likelihood approximation
// of Clauset, Shalizi & Newman (SIAM Review 51:661, 2009, Eq. 3.7) above
// k_min = 8; "roughly" means within 0.3.
func TestScaleFreeExponents(t *testing.T) {
	const n = 100000
	var e edgeList
	if err := ScaleFree(n, 4*n, 2.5, 3.2, NewRand(11), &e); err != nil {
		t.Fatal(err)
	}
	if len(e.u) != 4*n {
		t.Fatalf("got %d edges, want %d", len(e.u), 4*n)
	}
	checkSimple(t, "scale-free", n, &e)
	out, in := degrees(n, &e)
	for _, tc := range []struct {
		name string
		deg  []int
		want float64
	}{{"out", out, 2.5}, {"in", in, 3.2}} {
		got := mleExponent(tc.deg, 8)
		if math.Abs(got-tc.want) > 0.3 {
			t.Errorf("%s-degree exponent: got %.2f, want %.2f ± 0.3", tc.name, got, tc.want)
		}
	}
	// In- and out-degrees are drawn independently: their correlation over
	// states is near zero.
	if r := correlation(out, in); math.Abs(r) > 0.05 {
		t.Errorf("in/out degree correlation %.3f, want about 0", r)
	}
}

func mleExponent(deg []int, kmin int) float64 {
	var s float64
	m := 0
	for _, k := range deg {
		if k >= kmin {
			s += math.Log(float64(k) / (float64(kmin) - 0.5))
			m++
		}
	}
	return 1 + float64(m)/s
}

func correlation(a, b []int) float64 {
	var ma, mb float64
	for i := range a {
		ma += float64(a[i])
		mb += float64(b[i])
	}
	ma /= float64(len(a))
	mb /= float64(len(b))
	var sab, saa, sbb float64
	for i := range a {
		x, y := float64(a[i])-ma, float64(b[i])-mb
		sab += x * y
		saa += x * x
		sbb += y * y
	}
	return sab / math.Sqrt(saa*sbb)
}

// A ring lattice without rewiring is u -> u+1..u+k (Watts & Strogatz 1998);
// rewiring keeps every out-degree at k.
func TestSmallWorld(t *testing.T) {
	var e edgeList
	if err := SmallWorld(10, 2, 0, false, NewRand(1), &e); err != nil {
		t.Fatal(err)
	}
	want := "{[0 0 1 1 2 2 3 3 4 4 5 5 6 6 7 7 8 8 9 9] [1 2 2 3 3 4 4 5 5 6 6 7 7 8 8 9 9 0 0 1]}"
	if got := fmt.Sprint(e); got != want {
		t.Errorf("ring: got %s, want %s", got, want)
	}
	for _, two := range []bool{false, true} {
		e = edgeList{}
		if err := SmallWorld(5000, 4, 0.3, two, NewRand(2), &e); err != nil {
			t.Fatal(err)
		}
		checkSimple(t, "small-world", 5000, &e)
		out, _ := degrees(5000, &e)
		for v, k := range out {
			if k != 4 {
				t.Fatalf("two-way %v: out-degree of %d is %d, want 4", two, v, k)
			}
		}
	}
}

// Grid edges against a count by coordinates (independent route).
func TestGrid(t *testing.T) {
	for _, tc := range []struct {
		n, w int
		dirs string
	}{{12, 4, "right,down"}, {13, 4, "all"}, {1, 1, "all"}, {10, 3, "left,up"}, {7, 7, "east"}, {9, 1, "south,north"}} {
		d, err := ParseDirections(tc.dirs)
		if err != nil {
			t.Fatal(err)
		}
		var e edgeList
		if err := Grid(tc.n, tc.w, d, &e); err != nil {
			t.Fatal(err)
		}
		checkSimple(t, "grid", tc.n, &e)
		// Brute force: every ordered pair at lattice distance one in an
		// allowed direction.
		var want int64
		for a := 0; a < tc.n; a++ {
			for b := 0; b < tc.n; b++ {
				ra, ca, rb, cb := a/tc.w, a%tc.w, b/tc.w, b%tc.w
				switch {
				case d&Right != 0 && ra == rb && cb == ca+1,
					d&Left != 0 && ra == rb && cb == ca-1,
					d&Down != 0 && ca == cb && rb == ra+1,
					d&Up != 0 && ca == cb && rb == ra-1:
					want++
				}
			}
		}
		if int64(len(e.u)) != want || GridEdges(tc.n, tc.w, d) != want {
			t.Errorf("grid n=%d w=%d %s: emitted %d, GridEdges %d, want %d", tc.n, tc.w, tc.dirs, len(e.u), GridEdges(tc.n, tc.w, d), want)
		}
	}
}

// In an out-tree every state has one leader, so a maximum matching pairs
// each leader with one follower and N_D = N - #leaders = #leaves (common
// practice: each unmatched follower heads its own stem).
func TestTreeDrivers(t *testing.T) {
	for _, tc := range []struct{ n, b int }{{1, 2}, {2, 1}, {15, 2}, {100, 3}, {1000, 0}} {
		p := Params{Model: "tree", Nodes: tc.n, Branching: tc.b}
		g, err := p.Network(NewRand(5))
		if err != nil {
			t.Fatal(err)
		}
		if g.N() != tc.n || g.Edges() != tc.n-1 {
			t.Fatalf("tree n=%d: N=%d L=%d", tc.n, g.N(), g.Edges())
		}
		leaves := 0
		for v := 0; v < tc.n; v++ {
			if len(g.Succ(int32(v))) == 0 {
				leaves++
			}
		}
		nd := structural.Drivers(g).Count()
		if nd != leaves {
			t.Errorf("tree n=%d b=%d: N_D = %d, want #leaves %d", tc.n, tc.b, nd, leaves)
		}
	}
}

// nodes is N, isolated states included: an ER network at <k> = 1 keeps
// all of them (about e^-1 of the states have no edge; common practice).
func TestNetworkKeepsIsolatedStates(t *testing.T) {
	p := Params{Model: "er", Nodes: 10000, MeanDegree: 1}
	g, err := p.Network(NewRand(9))
	if err != nil {
		t.Fatal(err)
	}
	isolated := 0
	for v := int32(0); v < 10000; v++ {
		if len(g.Succ(v))+len(g.Pred(v)) == 0 {
			isolated++
		}
	}
	if g.N() != 10000 || g.Edges() != 5000 {
		t.Fatalf("got N=%d L=%d, want 10000 and 5000", g.N(), g.Edges())
	}
	if f := float64(isolated) / 10000; math.Abs(f-math.Exp(-1)) > 0.02 {
		t.Errorf("isolated fraction %.3f, want about e^-1 = 0.368", f)
	}
}

func TestRadixSort(t *testing.T) {
	rng := NewRand(1)
	for _, n := range []int{0, 1, 255, 256, 1000, 70000} {
		for _, max := range []uint64{0, 1, 1 << 16, 1<<40 + 3, math.MaxUint64} {
			a := make([]uint64, n)
			for i := range a {
				if max == math.MaxUint64 {
					a[i] = rng.Uint64()
				} else {
					a[i] = rng.Uint64N(max + 1)
				}
			}
			want := append([]uint64(nil), a...)
			sort.Slice(want, func(i, j int) bool { return want[i] < want[j] })
			radixSort(a, nil, max)
			if fmt.Sprint(a) != fmt.Sprint(want) {
				t.Fatalf("radixSort n=%d max=%d: wrong order", n, max)
			}
		}
	}
}

// measuredFraction returns N_D/N = (N - |M*|)/N of a generated network
// (Liu, Slotine & Barabási 2011; N_D = max(N - |M*|, 1) is the same here
// since these networks are far from perfect matchings).
func measuredFraction(t *testing.T, p Params, seed uint64) (float64, *structural.Network) {
	t.Helper()
	g, err := p.Network(NewRand(seed))
	if err != nil {
		t.Fatal(err)
	}
	m := matching.Maximum(g.Out(), g.In())
	return float64(g.N()-m.Size) / float64(g.N()), g
}
