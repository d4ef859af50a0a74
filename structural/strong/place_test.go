package strong

import (
	"encoding/json"
	"fmt"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/internal/testnet"
)

// denseKinds returns the kinds of A (kind[v][u] for A[v][u]) that g and c
// describe, read through the network's public methods only.
func denseKinds(g *structural.Network, c Class) [][]Kind {
	n := g.N()
	k := make([][]Kind, n)
	for v := range k {
		k[v] = make([]Kind, n)
		k[v][v] = c.Diagonal.kind()
	}
	out := g.Out()
	for u := 0; u < n; u++ {
		for i, v := range g.Succ(int32(u)) {
			k[v][u] = Nonzero
			if c.MayBeZero != nil && c.MayBeZero[out.Ptr[u]+int64(i)] {
				k[v][u] = Arbitrary
			}
		}
	}
	return k
}

// naiveStrong is a second, deliberately plain statement of the test of
// Jia et al. (2021): dense kinds, the diagonal shifted for the second
// colouring, each colouring by repeated scans of every column. It shares
// nothing with the package but the Kind constants.
func naiveStrong(g *structural.Network, c Class, p structural.Property, signals [][]int32) bool {
	n := g.N()
	a := denseKinds(g, c)
	if p == structural.Observability {
		t := make([][]Kind, n)
		for v := range t {
			t[v] = make([]Kind, n)
			for u := range t[v] {
				t[v][u] = a[u][v]
			}
		}
		a = t
	}
	shifted := make([][]Kind, n)
	for v := range shifted {
		shifted[v] = slices.Clone(a[v])
		switch a[v][v] {
		case Zero:
			shifted[v][v] = Nonzero
		default:
			shifted[v][v] = Arbitrary
		}
	}
	for _, m := range [][][]Kind{a, shifted} {
		black := make([]bool, n)
		for changed := true; changed; {
			changed = false
			// State columns, then signal columns.
			for col := 0; col < n+len(signals); col++ {
				white, last := 0, -1
				lastKind := Zero
				for r := 0; r < n; r++ {
					var k Kind
					if col < n {
						k = m[r][col]
					} else if slices.Contains(signals[col-n], int32(r)) {
						k = Nonzero
					}
					if k != Zero && !black[r] {
						white++
						last, lastKind = r, k
					}
				}
				if white == 1 && lastKind == Nonzero {
					black[last] = true
					changed = true
				}
			}
		}
		if slices.Contains(black, false) {
			return false
		}
	}
	return true
}

// bruteCheapest tries every set of allowed states and returns the least
// cost, then fewest devices, that naiveStrong accepts.
func bruteCheapest(g *structural.Network, c Class, p structural.Property, base [][]int32, dev structural.Devices) (feasible bool, cost structural.Cost, count int) {
	n := g.N()
	var free []int32
	var signals [][]int32
	signals = append(signals, base...)
	for v := int32(0); int(v) < n; v++ {
		switch {
		case dev.Has(v):
			signals = append(signals, []int32{v})
		case dev.Allowed(v):
			free = append(free, v)
		}
	}
	for mask := 0; mask < 1<<len(free); mask++ {
		sig := slices.Clone(signals)
		var cst structural.Cost
		k := 0
		for i, v := range free {
			if mask>>i&1 != 0 {
				sig = append(sig, []int32{v})
				cst += dev.CostOf(v)
				k++
			}
		}
		if feasible && (cst > cost || cst == cost && k >= count) {
			continue
		}
		if naiveStrong(g, c, p, sig) {
			feasible, cost, count = true, cst, k
		}
	}
	return
}

// verifyPlacement checks a placement's set with Check and naiveStrong and
// that it honours the devices.
func verifyPlacement(t *testing.T, label string, g *structural.Network, c Class, p structural.Property, base [][]int32, dev structural.Devices, pl *Placement) {
	t.Helper()
	for _, v := range pl.Added.IDs() {
		if !dev.Allowed(v) || dev.Has(v) {
			t.Fatalf("%s: device added on %d, forbidden or existing", label, v)
		}
	}
	for v := int32(0); int(v) < g.N(); v++ {
		if dev.Has(v) && !slices.Contains(pl.Devices.IDs(), v) {
			t.Fatalf("%s: existing device on %d dropped", label, v)
		}
	}
	if pl.Cost != costOf(dev, pl.Added.IDs()) || pl.Gap != pl.Cost-pl.LowerBound || pl.LowerBound > pl.Cost {
		t.Fatalf("%s: cost %v, bound %v, gap %v inconsistent", label, pl.Cost, pl.LowerBound, pl.Gap)
	}
	sig := slices.Clone(base)
	for _, v := range pl.Devices.IDs() {
		sig = append(sig, []int32{v})
	}
	if !naiveStrong(g, c, p, sig) {
		t.Fatalf("%s: the placement %v does not make the design strong", label, pl.Devices.IDs())
	}
	d := testnet.Design(t, g, sig)
	r, err := Check(g, Request{Property: p, Design: d, Class: c})
	if err != nil || !r.Holds {
		t.Fatalf("%s: Check disagrees with the placement: %v", label, err)
	}
}

// TestPlaceKnownZeroForcingNumbers: with the free diagonal and unit costs
// the fewest actuators for strong structural controllability of a simple
// undirected graph is its zero forcing number (Monshizadeh et al. 2014).
// Values from the AIM Minimum Rank - Special Graphs Work Group, Linear
// Algebra Appl. 428 (2008), from memory: Z(P_n) = 1, Z(C_n) = 2,
// Z(K_1,k) = k-1, Z(K_n) = n-1, Z(K_m,n) = m+n-2, Z(Q_3) = 4, Z(W_n) = 3
// (wheel), and Z = 5 for the Petersen graph.
func TestPlaceKnownZeroForcingNumbers(t *testing.T) {
	bip := func(m, n int) [][2]int32 {
		var e [][2]int32
		for i := 0; i < m; i++ {
			for j := 0; j < n; j++ {
				e = append(e, [2]int32{int32(i), int32(m + j)})
			}
		}
		return e
	}
	var cube [][2]int32
	for v := int32(0); v < 8; v++ {
		for b := int32(1); b < 8; b <<= 1 {
			if v&b == 0 {
				cube = append(cube, [2]int32{v, v | b})
			}
		}
	}
	wheel := cycle(6)
	for i := int32(0); i < 6; i++ {
		wheel = append(wheel, [2]int32{6, i})
	}
	var pet [][2]int32
	for i := int32(0); i < 5; i++ {
		pet = append(pet, [2]int32{i, (i + 1) % 5}, [2]int32{i, i + 5}, [2]int32{5 + i, 5 + (i+2)%5})
	}
	for _, c := range []struct {
		name  string
		n     int
		edges [][2]int32
		z     int
	}{
		{"P7", 7, path(7), 1}, {"C8", 8, cycle(8), 2}, {"K1,5", 6, star(5), 4}, {"K6", 6, complete(6), 5},
		{"K3,4", 7, bip(3, 4), 5}, {"Q3", 8, cube, 4}, {"W7", 7, wheel, 3}, {"Petersen", 10, pet, 5},
	} {
		g := build(t, c.n, c.edges, true)
		pl, err := Place(g, PlaceRequest{})
		if err != nil {
			t.Fatal(err)
		}
		if !pl.Feasible || !pl.Optimal || pl.Added.Len() != c.z || pl.Cost != structural.Cost(c.z)*structural.Unit {
			t.Errorf("%s: %d devices (optimal %v, bound %v), want Z = %d", c.name, pl.Added.Len(), pl.Optimal, pl.LowerBound, c.z)
		}
		verifyPlacement(t, c.name, g, Class{}, structural.Controllability, nil, structural.Devices{}, pl)
		ps, err := Place(g, PlaceRequest{Property: structural.Observability})
		if err != nil || ps.Added.Len() != c.z {
			t.Errorf("%s: %d sensors, want %d (%v)", c.name, ps.Added.Len(), c.z, err)
		}
	}
}

// randomDevices draws costs 0..3 units (a third of the time unit costs),
// forbidden and existing states.
func randomDevices(rng *rand.Rand, n int) structural.Devices {
	d := structural.Devices{Forbidden: make([]bool, n), Existing: make([]bool, n)}
	if rng.IntN(3) != 0 {
		d.Cost = make([]structural.Cost, n)
		for v := range d.Cost {
			d.Cost[v] = structural.Cost(rng.IntN(4)) * structural.Unit / 2
		}
	}
	for v := 0; v < n; v++ {
		switch x := rng.IntN(10); {
		case x == 0:
			d.Forbidden[v] = true
		case x == 1:
			d.Existing[v] = true
		}
	}
	return d
}

// TestPlaceBruteForce: on random networks of 2 to 9 states, random
// classes, devices, base designs and properties, the exact search's
// placement is proved optimal and matches the cheapest set found by
// trying every subset of the allowed states (feasibility by naiveStrong,
// least cost then fewest devices); the heuristic alone gives a working
// set, a lower bound at most the optimum, and never claims optimality
// wrongly. Source: brute force over subsets.
func TestPlaceBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 7))
	trials := 1500
	if testing.Short() {
		trials = 300
	}
	var infeasible, heuristicOptimal int
	for trial := 0; trial < trials; trial++ {
		n := 2 + rng.IntN(8)
		g := testnet.Random(t, rng, n, 0.15+0.35*rng.Float64())
		c := Class{Diagonal: Diagonal(rng.IntN(3))}
		if rng.IntN(3) == 0 {
			c.MayBeZero = make([]bool, g.Edges())
			for i := range c.MayBeZero {
				c.MayBeZero[i] = rng.IntN(4) == 0
			}
		}
		var base [][]int32
		if rng.IntN(4) == 0 {
			base = [][]int32{{int32(rng.IntN(n)), int32(rng.IntN(n))}}
		}
		dev := randomDevices(rng, n)
		p := structural.Property(rng.IntN(2))
		feasible, cost, count := bruteCheapest(g, c, p, base, dev)
		for _, exactStates := range []int{0, -1} {
			pl, err := Place(g, PlaceRequest{Property: p, Class: c, Devices: dev, Design: testnet.Design(t, g, base), ExactStates: exactStates})
			if err != nil {
				t.Fatal(err)
			}
			if pl.Feasible != feasible {
				t.Fatalf("trial %d: feasible %v, brute force %v (blocked %v)", trial, pl.Feasible, feasible, pl.Blocked.IDs())
			}
			if !feasible {
				if pl.Blocked.Len() == 0 {
					t.Fatalf("trial %d: infeasible without blocked states", trial)
				}
				infeasible++
				break
			}
			verifyPlacement(t, fmt.Sprintf("trial %d (exact %d)", trial, exactStates), g, c, p, base, dev, pl)
			if pl.LowerBound > cost {
				t.Fatalf("trial %d (exact %d): lower bound %v above the optimum %v", trial, exactStates, pl.LowerBound, cost)
			}
			if pl.Optimal && (pl.Cost != cost || pl.Added.Len() != count) {
				t.Fatalf("trial %d (exact %d): optimal claimed at %v (%d devices), brute force %v (%d)", trial, exactStates, pl.Cost, pl.Added.Len(), cost, count)
			}
			if exactStates == 0 && (!pl.Optimal || pl.Cost != cost || pl.Added.Len() != count) {
				t.Fatalf("trial %d: search found %v with %d devices (optimal %v, %s), brute force %v with %d", trial, pl.Cost, pl.Added.Len(), pl.Optimal, pl.BoundFrom, cost, count)
			}
			if exactStates < 0 && pl.Cost == cost {
				heuristicOptimal++
			}
		}
	}
	t.Logf("%d trials, %d infeasible; the heuristic alone reached the optimum cost in %d of the %d others", trials, infeasible, heuristicOptimal, trials-infeasible)
}

// TestPlaceInfeasible: an out-star whose leaves may not take actuators:
// the centre forces at most one leaf (common practice).
func TestPlaceInfeasible(t *testing.T) {
	g := build(t, 4, star(3), false)
	dev := structural.Devices{Forbidden: []bool{false, true, true, false}}
	pl, err := Place(g, PlaceRequest{Devices: dev})
	if err != nil {
		t.Fatal(err)
	}
	if pl.Feasible || !slices.Equal(pl.Blocked.IDs(), []int32{1, 2}) || pl.Added.Len() != 0 {
		t.Fatalf("feasible %v blocked %v added %v", pl.Feasible, pl.Blocked.IDs(), pl.Added.IDs())
	}
	b, _ := json.Marshal(pl)
	if !strings.Contains(string(b), `"blocked":["1","2"]`) || !strings.Contains(string(b), `"feasible":false`) {
		t.Fatalf("JSON %s", b)
	}
}

// TestPlaceBudget: a search cut short still returns a working placement,
// a valid lower bound and the gap; on random networks of 20 to 60 states
// the search either proves its answer or says it did not.
func TestPlaceBudget(t *testing.T) {
	rng := rand.New(rand.NewPCG(8, 8))
	trials := 30
	if testing.Short() {
		trials = 8
	}
	for trial := 0; trial < trials; trial++ {
		n := 20 + rng.IntN(41)
		g := testnet.Random(t, rng, n, 2.5/float64(n))
		c := Class{Diagonal: Diagonal(rng.IntN(3))}
		for _, budget := range []int64{1, 0} {
			pl, err := Place(g, PlaceRequest{Class: c, SearchNodes: budget})
			if err != nil {
				t.Fatal(err)
			}
			verifyPlacement(t, "budget", g, c, structural.Controllability, nil, structural.Devices{}, pl)
			if pl.Optimal && pl.Gap != 0 {
				t.Fatalf("trial %d: optimal %v with gap %v", trial, pl.Optimal, pl.Gap)
			}
			if budget == 0 {
				t.Logf("N=%d E=%d: %d devices, optimal %v, bound %v (%s), %d nodes, %d forts", n, g.Edges(), pl.Added.Len(), pl.Optimal, pl.LowerBound, pl.BoundFrom, pl.SearchNodes, pl.Forts)
			}
		}
	}
}

// TestSearchCutShortBound: the lower bound of a search stopped after a
// node or two (disjoint forts, and the fractional fort cover by linear
// programming) never exceeds the optimum found by trying every subset.
// Source: brute force over subsets.
func TestSearchCutShortBound(t *testing.T) {
	rng := rand.New(rand.NewPCG(10, 10))
	better := 0
	trials := 400
	if testing.Short() {
		trials = 100
	}
	for trial := 0; trial < trials; trial++ {
		n := 3 + rng.IntN(7)
		g := testnet.Random(t, rng, n, 0.15+0.35*rng.Float64())
		c := Class{Diagonal: Diagonal(rng.IntN(3))}
		dev := randomDevices(rng, n)
		p := structural.Property(rng.IntN(2))
		feasible, cost, _ := bruteCheapest(g, c, p, nil, dev)
		if !feasible {
			continue
		}
		s := newSystem(g, p, c, testnet.Design(t, g, nil))
		var existing []int32
		for v := int32(0); int(v) < n; v++ {
			if dev.Has(v) {
				existing = append(existing, v)
			}
		}
		start := heuristic(s, dev, existing, nil)
		x := newExact(s, dev, existing)
		_, proved, lb := x.search(start, int64(1+rng.IntN(3)))
		if lb > cost {
			t.Fatalf("trial %d: bound %v above the optimum %v (proved %v, %d forts)", trial, lb, cost, proved, len(x.forts))
		}
		if lp := x.lpBound(); lp > cost {
			t.Fatalf("trial %d: LP bound %v above the optimum %v", trial, lp, cost)
		} else if root, _, _ := x.bound(make([]uint64, x.w), make([]uint64, x.w)); lp > structural.Cost(root/int64(n+1)) {
			better++
		}
	}
	t.Logf("the fractional fort cover beat the disjoint-fort bound in %d trials", better)
}

// TestPlaceAlwaysExact pins what the documentation promises about the
// search (README, "netsteer help actuators"): it runs only on networks of
// at most ExactStates states, and on those, with at most AlwaysExact
// allowed states, it runs to the end whatever the node budget, proving
// the optimum found by trying every subset. Source: brute force over
// subsets.
func TestPlaceAlwaysExact(t *testing.T) {
	rng := rand.New(rand.NewPCG(18, 18))
	searched := 0
	for trial := 0; trial < 60; trial++ {
		n := 6 + rng.IntN(5)
		g := testnet.Random(t, rng, n, 0.1+0.3*rng.Float64())
		c := Class{Diagonal: Diagonal(rng.IntN(3))}
		dev := randomDevices(rng, n)
		p := structural.Property(rng.IntN(2))
		feasible, cost, count := bruteCheapest(g, c, p, nil, dev)
		if !feasible {
			continue
		}
		for _, exactStates := range []int{n, n - 1} {
			pl, err := Place(g, PlaceRequest{Property: p, Class: c, Devices: dev, ExactStates: exactStates, SearchNodes: 1})
			if err != nil {
				t.Fatal(err)
			}
			verifyPlacement(t, fmt.Sprintf("trial %d (exact %d)", trial, exactStates), g, c, p, nil, dev, pl)
			if exactStates < n {
				if pl.Method != "heuristic" || pl.SearchNodes != 0 {
					t.Fatalf("trial %d: %d states above the limit %d, yet %s with %d nodes", trial, n, exactStates, pl.Method, pl.SearchNodes)
				}
				continue
			}
			if pl.Method == "search" {
				searched++
			}
			if !pl.Optimal || pl.Cost != cost || pl.Added.Len() != count {
				t.Fatalf("trial %d: %s, %d nodes: %v with %d devices (optimal %v, %s), brute force %v with %d",
					trial, pl.Method, pl.SearchNodes, pl.Cost, pl.Added.Len(), pl.Optimal, pl.BoundFrom, cost, count)
			}
		}
	}
	if searched < 10 {
		t.Fatalf("only %d searches: the draw tests little", searched)
	}
}
