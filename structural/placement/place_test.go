package placement

import (
	"fmt"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/internal/testnet"
	"gonum.org/v1/gonum/mat"
)

// plNet builds a network on states 0..n-1 from edge pairs u -> v.
func plNet(t testing.TB, n int, edges [][2]int) *structural.Network {
	t.Helper()
	b := structural.NewIntBuilder(n, 0)
	for _, e := range edges {
		b.AddEdge(int32(e[0]), int32(e[1]))
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	return g
}

// checkPlacement compares a placement with the exhaustive answer.
func checkPlacement(t *testing.T, label string, o *testnet.Oracle, sensors bool, d structural.Devices, pl *Placement) testnet.Brute {
	t.Helper()
	want := testnet.BruteForce(o, sensors, d)
	if pl.Feasible != want.Feasible {
		t.Fatalf("%s: feasible = %v, brute force says %v", label, pl.Feasible, want.Feasible)
	}
	if !want.Feasible {
		return want
	}
	s := testnet.MaskOf(pl.Devices.IDs())
	ok := o.Controllable(s)
	if sensors {
		ok = o.Observable(s)
	}
	if !ok {
		t.Fatalf("%s: returned set %v fails Lin's theorem", label, pl.Devices.IDs())
	}
	if pl.Cost != testnet.Units(d, want.Cost) || len(pl.Added.IDs()) != want.Count {
		t.Fatalf("%s: cost %d with %d added, brute force %d with %d", label, pl.Cost, len(pl.Added.IDs()), want.Cost, want.Count)
	}
	pl.p.checkReducedCosts(t, label)
	return want
}

// checkReducedCosts verifies the optimality certificate: every residual
// arc, the terminal's included, has a non-negative reduced cost.
func (p *placer) checkReducedCosts(t *testing.T, label string) {
	t.Helper()
	p.potentials() // computed when routing or Roles needed them
	n := int32(p.n)
	bad := func(x, y int32, c int64) {
		if rc := c + p.pot[x] - p.pot[y]; rc < 0 {
			t.Fatalf("%s: arc %d -> %d has reduced cost %d", label, x, y, rc)
		}
	}
	for x := int32(0); x < 2*n+1+int32(p.nsrc); x++ {
		deg := p.degree(x)
		for k := int64(0); k < deg; k++ {
			if y, c, ok := p.arcAt(x, k); ok {
				bad(x, y, c)
			}
		}
	}
	for v := int32(0); v < n; v++ {
		if !p.isForbidden(v) && !(p.actuated(v) && p.qOf(v) < 0) {
			bad(2*n, v, p.w[v]) // pool -> column
		}
		if p.rowMate[v] < 0 {
			bad(2*n, n+v, 0) // supply -> free row
		}
	}
}

// Source: brute force over every subset of states with the Lin's-theorem
// oracle above.
func TestPlacementBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(4, 1))
	type config struct {
		maxCost         int64
		pForbid, pExist float64
	}
	configs := []config{{0, 0, 0}, {5, 0, 0}, {0, 0.3, 0}, {4, 0.25, 0.2}, {3, 0, 0.3}, {1, 0.5, 0}}
	trials := 0
	infeasible := 0
	for i := 0; i < 400; i++ {
		n := 2 + rng.IntN(8)
		q := []float64{0.1, 0.2, 0.35}[i%3]
		g := testnet.Random(t, rng, n, q)
		o := testnet.NewOracle(g)
		c := configs[i%len(configs)]
		d := testnet.RandomDevices(rng, n, c.maxCost, c.pForbid, c.pExist)
		for _, sensors := range []bool{false, true} {
			prop := structural.Controllability
			if sensors {
				prop = structural.Observability
			}
			pl, err := Place(g, prop, d)
			if err != nil {
				t.Fatal(err)
			}
			label := fmt.Sprintf("trial %d (n=%d, sensors=%v)", i, n, sensors)
			want := checkPlacement(t, label, o, sensors, d, pl)
			trials++
			if !want.Feasible {
				infeasible++
			}
		}
	}
	if infeasible == 0 || infeasible == trials {
		t.Fatalf("%d of %d trials infeasible: the sample does not exercise both outcomes", infeasible, trials)
	}
}

// The oracle itself against the Kalman rank condition on random real
// parameters (rank [B AB ... A^(n-1)B] = n; common practice, any control
// text), for tiny systems where floating point is reliable.
func TestPlOracleKalman(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 9))
	agree := 0
	for i := 0; i < 300; i++ {
		n := 1 + rng.IntN(5)
		g := testnet.Random(t, rng, n, 0.3)
		o := testnet.NewOracle(g)
		s := uint32(rng.IntN(1 << n))
		want := o.Controllable(s)
		got := plKalman(rng, g, s)
		if got != want {
			t.Fatalf("trial %d: n=%d S=%b: Kalman says %v, oracle %v", i, n, s, got, want)
		}
		agree++
	}
	_ = agree
}

func plKalman(rng *rand.Rand, g *structural.Network, s uint32) bool {
	n := g.N()
	a := mat.NewDense(n, n, nil)
	for u := 0; u < n; u++ {
		for _, v := range g.Succ(int32(u)) {
			a.Set(int(v), u, 0.5+rng.Float64())
		}
	}
	var cols []int
	for v := 0; v < n; v++ {
		if s&(1<<v) != 0 {
			cols = append(cols, v)
		}
	}
	if len(cols) == 0 {
		return false
	}
	b := mat.NewDense(n, len(cols), nil)
	for i, v := range cols {
		b.Set(v, i, 0.5+rng.Float64())
	}
	ctrb := mat.NewDense(n, n*len(cols), nil)
	blk := mat.DenseCopyOf(b)
	for k := 0; k < n; k++ {
		for i := 0; i < n; i++ {
			for j := 0; j < len(cols); j++ {
				ctrb.Set(i, k*len(cols)+j, blk.At(i, j))
			}
		}
		var next mat.Dense
		next.Mul(a, blk)
		blk = &next
	}
	var svd mat.SVD
	if !svd.Factorize(ctrb, mat.SVDNone) {
		panic("svd failed")
	}
	vals := svd.Values(nil)
	rank := 0
	for _, x := range vals {
		if x > 1e-9*vals[0] {
			rank++
		}
	}
	return rank == n
}

// Known shapes (common practice): a chain needs its head, a cycle one
// actuator anywhere, a star out of a hub all leaves but one plus the hub.
func TestPlacementShapes(t *testing.T) {
	cycle := plNet(t, 4, [][2]int{{0, 1}, {1, 2}, {2, 3}, {3, 0}})
	chain := plNet(t, 4, [][2]int{{0, 1}, {1, 2}, {2, 3}})
	star := plNet(t, 4, [][2]int{{0, 1}, {0, 2}, {0, 3}})
	twoCycles := plNet(t, 5, [][2]int{{0, 1}, {1, 0}, {2, 3}, {3, 4}, {4, 2}})
	for _, tc := range []struct {
		name string
		g    *structural.Network
		want int
	}{{"cycle", cycle, 1}, {"chain", chain, 1}, {"star", star, 3}, {"two cycles", twoCycles, 2}} {
		pl, err := Place(tc.g, structural.Controllability, structural.Devices{})
		if err != nil {
			t.Fatal(err)
		}
		if !pl.Feasible || len(pl.Devices.IDs()) != tc.want {
			t.Errorf("%s: got %v (feasible %v), want %d actuators", tc.name, pl.Devices.IDs(), pl.Feasible, tc.want)
		}
	}
	pl, _ := Place(chain, structural.Controllability, structural.Devices{})
	if !slices.Equal(pl.Devices.IDs(), []int32{0}) {
		t.Errorf("chain: got %v, want [0]", pl.Devices.IDs())
	}
}

// Costs too large for the exact tie-break still give the least cost
// (brute force as above); costs whose sum overflows, negative costs and
// contradictory or mis-sized tables are errors.
func TestPlacementLargeCostsAndErrors(t *testing.T) {
	rng := rand.New(rand.NewPCG(2, 2))
	fallback := 0
	for i := 0; i < 100; i++ {
		n := 4 + rng.IntN(4)
		g := testnet.Random(t, rng, n, 0.25)
		o := testnet.NewOracle(g)
		d := testnet.RandomDevices(rng, n, 3, 0.1, 0.1)
		for v := range d.Cost {
			d.Cost[v] *= 5e16 // the sum fits, times n+1 it often does not
		}
		pl, err := Place(g, structural.Controllability, d)
		if err != nil {
			t.Fatal(err)
		}
		if !pl.FewestDevices {
			fallback++
		}
		want := testnet.BruteForce(o, false, d)
		if pl.Feasible != want.Feasible || want.Feasible && pl.Cost != testnet.Units(d, want.Cost) {
			t.Fatalf("trial %d: feasible %v cost %d, brute force %v cost %d", i, pl.Feasible, pl.Cost, want.Feasible, want.Cost)
		}
		if want.Feasible && !o.Controllable(testnet.MaskOf(pl.Devices.IDs())) {
			t.Fatalf("trial %d: set %v fails", i, pl.Devices.IDs())
		}
	}
	if fallback < 20 {
		t.Fatalf("only %d of 100 trials without the exact tie-break", fallback)
	}
	g := plNet(t, 3, [][2]int{{0, 1}, {1, 2}})
	for _, tc := range []struct {
		name string
		d    structural.Devices
	}{
		{"overflow", structural.Devices{Cost: []structural.Cost{1 << 62, 1 << 62, 1}}},
		{"negative", structural.Devices{Cost: []structural.Cost{1, -1, 1}}},
		{"short", structural.Devices{Forbidden: []bool{true}}},
		{"contradiction", structural.Devices{Forbidden: []bool{false, true, false}, Existing: []bool{false, true, false}}},
	} {
		if _, err := Place(g, structural.Controllability, tc.d); err == nil {
			t.Errorf("%s: no error", tc.name)
		}
	}
}

// Long chains and deep alternating paths: every traversal is iterative
// (common practice for 10^7-state networks; here 3*10^5 to keep the test
// short).
func TestPlacementLongChain(t *testing.T) {
	const n = 300_000
	b := structural.NewIntBuilder(n, 0)
	for v := 0; v+1 < n; v++ {
		b.AddEdge(int32(v+1), int32(v)) // the head is the last state
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	d := structural.Devices{Cost: make([]structural.Cost, n)}
	for v := range d.Cost {
		d.Cost[v] = structural.Cost(1 + v%7)
	}
	for _, dd := range []structural.Devices{{}, d} {
		pl, err := Place(g, structural.Controllability, dd)
		if err != nil {
			t.Fatal(err)
		}
		if !pl.Feasible || len(pl.Devices.IDs()) != 1 || pl.Devices.IDs()[0] != n-1 {
			t.Fatalf("chain: got %d devices (first %v), want the head %d", len(pl.Devices.IDs()), pl.Devices.IDs()[:min(3, len(pl.Devices.IDs()))], n-1)
		}
		if r := pl.Roles(3); len(r) != 1 || !r[0].Forced {
			t.Fatalf("chain head roles: %+v", r)
		}
	}
	s, err := Place(g, structural.Observability, structural.Devices{})
	if err != nil || s.Devices.Len() != 1 || s.Devices.At(0) != 0 {
		t.Fatalf("chain sensors: %v %v", s.Devices.IDs(), err)
	}
}
