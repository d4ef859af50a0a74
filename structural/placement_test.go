package structural

import (
	"fmt"
	"math/bits"
	"math/rand/v2"
	"slices"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// plNet builds a network on states 0..n-1 from edge pairs u -> v.
func plNet(t testing.TB, n int, edges [][2]int) *Network {
	t.Helper()
	b := NewIntBuilder(n, 0)
	for _, e := range edges {
		b.AddEdge(int32(e[0]), int32(e[1]))
	}
	g, err := b.Build(BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	return g
}

// plRandom draws a directed network on n states, each ordered pair (self
// pairs included) present with probability q.
func plRandom(t testing.TB, rng *rand.Rand, n int, q float64) *Network {
	var edges [][2]int
	for u := 0; u < n; u++ {
		for v := 0; v < n; v++ {
			if rng.Float64() < q {
				edges = append(edges, [2]int{u, v})
			}
		}
	}
	return plNet(t, n, edges)
}

// plOracle decides structural controllability and observability of small
// networks with dedicated devices plainly from Lin's theorem (C.-T. Lin,
// "Structural controllability", IEEE TAC 19(3):201-208, 1974): every state
// reached from a driven state, and no dilation, checked by Hall's condition
// on every subset of states (exhaustively, 2^n subsets). It shares no code
// with the placement algorithms.
type plOracle struct {
	n              int
	in, out        []uint32 // in[v]: bitmask of the u with u -> v
	nbrIn, nbrOut  []uint32 // union of in (out) masks over each subset
	popX           []uint8
	full           uint32
	oracleForTests bool
}

func newPlOracle(g *Network) *plOracle {
	n := g.N()
	o := &plOracle{n: n, in: make([]uint32, n), out: make([]uint32, n), full: 1<<n - 1}
	for u := 0; u < n; u++ {
		for _, v := range g.Out.Row(int32(u)) {
			o.in[v] |= 1 << u
			o.out[u] |= 1 << v
		}
	}
	o.nbrIn = make([]uint32, 1<<n)
	o.nbrOut = make([]uint32, 1<<n)
	o.popX = make([]uint8, 1<<n)
	for x := uint32(1); x <= o.full; x++ {
		low := bits.TrailingZeros32(x)
		rest := x & (x - 1)
		o.nbrIn[x] = o.nbrIn[rest] | o.in[low]
		o.nbrOut[x] = o.nbrOut[rest] | o.out[low]
		o.popX[x] = uint8(bits.OnesCount32(x))
	}
	return o
}

// closure returns the states reached from s along the arcs in adj.
func (o *plOracle) closure(s uint32, adj []uint32) uint32 {
	seen := s
	for {
		next := seen
		for v := 0; v < o.n; v++ {
			if seen&(1<<v) != 0 {
				next |= adj[v]
			}
		}
		if next == seen {
			return seen
		}
		seen = next
	}
}

// controllable reports whether dedicated actuators on s make the network
// structurally controllable.
func (o *plOracle) controllable(s uint32) bool {
	if o.closure(s, o.out) != o.full {
		return false
	}
	for x := uint32(1); x <= o.full; x++ {
		if int(o.popX[x]) > bits.OnesCount32(o.nbrIn[x])+bits.OnesCount32(x&s) {
			return false
		}
	}
	return true
}

// observable reports whether dedicated sensors on s make the network
// structurally observable (the dual statement: every state reaches a
// sensor, and no set has fewer out-neighbours and sensors than members).
func (o *plOracle) observable(s uint32) bool {
	if o.closure(s, o.in) != o.full {
		return false
	}
	for x := uint32(1); x <= o.full; x++ {
		if int(o.popX[x]) > bits.OnesCount32(o.nbrOut[x])+bits.OnesCount32(x&s) {
			return false
		}
	}
	return true
}

// plBrute is the exhaustive answer to a placement problem.
type plBrute struct {
	feasible bool
	cost     int64
	count    int      // added devices
	optimal  []uint32 // every cheapest complete set (least cost, then fewest)
}

func bruteForce(o *plOracle, sensors bool, d Devices) plBrute {
	var must, banned uint32
	for v := 0; v < o.n; v++ {
		if d.Existing != nil && d.Existing[v] {
			must |= 1 << v
		}
		if d.Forbidden != nil && d.Forbidden[v] {
			banned |= 1 << v
		}
	}
	best := plBrute{}
	for s := uint32(0); s <= o.full; s++ {
		if s&must != must || s&banned != 0 {
			continue
		}
		ok := o.controllable(s)
		if sensors {
			ok = o.observable(s)
		}
		if !ok {
			continue
		}
		var c int64
		k := 0
		for v := 0; v < o.n; v++ {
			if s&(1<<v) != 0 && must&(1<<v) == 0 {
				k++
				if d.Cost == nil {
					c++
				} else {
					c += d.Cost[v]
				}
			}
		}
		switch {
		case !best.feasible || c < best.cost || c == best.cost && k < best.count:
			best = plBrute{feasible: true, cost: c, count: k, optimal: []uint32{s}}
		case c == best.cost && k == best.count:
			best.optimal = append(best.optimal, s)
		}
		if s == o.full {
			break
		}
	}
	return best
}

func maskOf(ids []int32) uint32 {
	var m uint32
	for _, v := range ids {
		m |= 1 << v
	}
	return m
}

// randomDevices draws a device table: costs in 1..maxCost (or nil),
// some forbidden and some existing states.
func randomDevices(rng *rand.Rand, n int, maxCost int64, pForbid, pExist float64) Devices {
	var d Devices
	if maxCost > 0 {
		d.Cost = make([]int64, n)
		for v := range d.Cost {
			d.Cost[v] = 1 + rng.Int64N(maxCost)
		}
	}
	if pForbid > 0 {
		d.Forbidden = make([]bool, n)
		for v := range d.Forbidden {
			d.Forbidden[v] = rng.Float64() < pForbid
		}
	}
	if pExist > 0 {
		d.Existing = make([]bool, n)
		for v := range d.Existing {
			if (d.Forbidden == nil || !d.Forbidden[v]) && rng.Float64() < pExist {
				d.Existing[v] = true
			}
		}
	}
	return d
}

// checkPlacement compares a placement with the exhaustive answer.
func checkPlacement(t *testing.T, label string, o *plOracle, sensors bool, d Devices, pl *Placement) plBrute {
	t.Helper()
	want := bruteForce(o, sensors, d)
	if pl.Feasible != want.feasible {
		t.Fatalf("%s: feasible = %v, brute force says %v", label, pl.Feasible, want.feasible)
	}
	if !want.feasible {
		return want
	}
	s := maskOf(pl.Devices)
	ok := o.controllable(s)
	if sensors {
		ok = o.observable(s)
	}
	if !ok {
		t.Fatalf("%s: returned set %v fails Lin's theorem", label, pl.Devices)
	}
	if pl.Cost != want.cost || len(pl.Added) != want.count {
		t.Fatalf("%s: cost %d with %d added, brute force %d with %d", label, pl.Cost, len(pl.Added), want.cost, want.count)
	}
	pl.p.checkReducedCosts(t, label)
	return want
}

// checkReducedCosts verifies the optimality certificate: every residual
// arc, the terminal's included, has a non-negative reduced cost.
func (p *placer) checkReducedCosts(t *testing.T, label string) {
	t.Helper()
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
		g := plRandom(t, rng, n, q)
		o := newPlOracle(g)
		c := configs[i%len(configs)]
		d := randomDevices(rng, n, c.maxCost, c.pForbid, c.pExist)
		for _, sensors := range []bool{false, true} {
			place := PlaceActuators
			if sensors {
				place = PlaceSensors
			}
			pl, err := place(g, d)
			if err != nil {
				t.Fatal(err)
			}
			label := fmt.Sprintf("trial %d (n=%d, sensors=%v)", i, n, sensors)
			want := checkPlacement(t, label, o, sensors, d, pl)
			trials++
			if !want.feasible {
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
		g := plRandom(t, rng, n, 0.3)
		o := newPlOracle(g)
		s := uint32(rng.IntN(1 << n))
		want := o.controllable(s)
		got := plKalman(rng, g, s)
		if got != want {
			t.Fatalf("trial %d: n=%d S=%b: Kalman says %v, oracle %v", i, n, s, got, want)
		}
		agree++
	}
	_ = agree
}

func plKalman(rng *rand.Rand, g *Network, s uint32) bool {
	n := g.N()
	a := mat.NewDense(n, n, nil)
	for u := 0; u < n; u++ {
		for _, v := range g.Out.Row(int32(u)) {
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
		g    *Network
		want int
	}{{"cycle", cycle, 1}, {"chain", chain, 1}, {"star", star, 3}, {"two cycles", twoCycles, 2}} {
		pl, err := PlaceActuators(tc.g, Devices{})
		if err != nil {
			t.Fatal(err)
		}
		if !pl.Feasible || len(pl.Devices) != tc.want {
			t.Errorf("%s: got %v (feasible %v), want %d actuators", tc.name, pl.Devices, pl.Feasible, tc.want)
		}
	}
	pl, _ := PlaceActuators(chain, Devices{})
	if !slices.Equal(pl.Devices, []int32{0}) {
		t.Errorf("chain: got %v, want [0]", pl.Devices)
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
		g := plRandom(t, rng, n, 0.25)
		o := newPlOracle(g)
		d := randomDevices(rng, n, 3, 0.1, 0.1)
		for v := range d.Cost {
			d.Cost[v] *= 5e16 // the sum fits, times n+1 it often does not
		}
		pl, err := PlaceActuators(g, d)
		if err != nil {
			t.Fatal(err)
		}
		if !pl.FewestDevices {
			fallback++
		}
		want := bruteForce(o, false, d)
		if pl.Feasible != want.feasible || want.feasible && pl.Cost != want.cost {
			t.Fatalf("trial %d: feasible %v cost %d, brute force %v cost %d", i, pl.Feasible, pl.Cost, want.feasible, want.cost)
		}
		if want.feasible && !o.controllable(maskOf(pl.Devices)) {
			t.Fatalf("trial %d: set %v fails", i, pl.Devices)
		}
	}
	if fallback < 20 {
		t.Fatalf("only %d of 100 trials without the exact tie-break", fallback)
	}
	g := plNet(t, 3, [][2]int{{0, 1}, {1, 2}})
	for _, tc := range []struct {
		name string
		d    Devices
	}{
		{"overflow", Devices{Cost: []int64{1 << 62, 1 << 62, 1}}},
		{"negative", Devices{Cost: []int64{1, -1, 1}}},
		{"short", Devices{Forbidden: []bool{true}}},
		{"contradiction", Devices{Forbidden: []bool{false, true, false}, Existing: []bool{false, true, false}}},
	} {
		if _, err := PlaceActuators(g, tc.d); err == nil {
			t.Errorf("%s: no error", tc.name)
		}
	}
}

// Long chains and deep alternating paths: every traversal is iterative
// (common practice for 10^7-state networks; here 3*10^5 to keep the test
// short).
func TestPlacementLongChain(t *testing.T) {
	const n = 300_000
	b := NewIntBuilder(n, 0)
	for v := 0; v+1 < n; v++ {
		b.AddEdge(int32(v+1), int32(v)) // the head is the last state
	}
	g, err := b.Build(BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	d := Devices{Cost: make([]int64, n)}
	for v := range d.Cost {
		d.Cost[v] = int64(1 + v%7)
	}
	for _, dd := range []Devices{{}, d} {
		pl, err := PlaceActuators(g, dd)
		if err != nil {
			t.Fatal(err)
		}
		if !pl.Feasible || len(pl.Devices) != 1 || pl.Devices[0] != n-1 {
			t.Fatalf("chain: got %d devices (first %v), want the head %d", len(pl.Devices), pl.Devices[:min(3, len(pl.Devices))], n-1)
		}
		if r := pl.Roles(3); len(r) != 1 || !r[0].Forced {
			t.Fatalf("chain head roles: %+v", r)
		}
	}
	s, err := PlaceSensors(g, Devices{})
	if err != nil || len(s.Devices) != 1 || s.Devices[0] != 0 {
		t.Fatalf("chain sensors: %v %v", s.Devices, err)
	}
}
