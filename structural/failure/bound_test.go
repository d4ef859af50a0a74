package failure_test

import (
	"math/rand/v2"
	"reflect"
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/failure"
	"github.com/netsteer/netsteer/structural/internal/testnet"
)

// leafNet draws a small network rich in states with one in-neighbour
// (the leaves the bound counts): each state has, with probability 0.5,
// one in-neighbour other than itself, and otherwise each possible
// in-edge (self-loops included) with probability p.
func leafNet(t *testing.T, rng *rand.Rand, n int, p float64) *structural.Network {
	var es []testnet.Edge
	hub := int32(rng.IntN(n))
	for v := int32(0); int(v) < n; v++ {
		if n > 1 && rng.IntN(2) == 0 {
			u := hub
			if u == v || rng.IntN(3) == 0 {
				u = (v + 1 + int32(rng.IntN(n-1))) % int32(n)
			}
			es = append(es, testnet.Edge{u, v})
			continue
		}
		for u := int32(0); int(u) < n; u++ {
			if rng.Float64() < p {
				es = append(es, testnet.Edge{u, v})
			}
		}
	}
	return testnet.Network(t, n, es)
}

// The lower bounds of the exact search for the device threat (two units
// in every source component, plus the leaf bound: the states whose only
// in-neighbour is one same state compete for it) never exceed the least
// cost of completing a partial assignment, found by exhaustive search
// over every multiset of devices on small random networks (the problem of
// Liu, Mo, Pequito, Sinopoli, Kar & Aguiar, IEEE TCNS 2017; the dilation
// condition of Lin's theorem, IEEE TAC 1974). They are the same on every
// run, and so are whole robust placements.
func TestDeviceBoundAgainstBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(2017, 517))
	trials := 3000
	if testing.Short() {
		trials = 600
	}
	checked, tight := 0, 0
	for trial := 0; trial < trials; trial++ {
		n := 2 + rng.IntN(5)
		g := leafNet(t, rng, n, []float64{0.15, 0.3}[rng.IntN(2)])
		p := structural.Controllability
		if rng.IntN(2) == 0 {
			p = structural.Observability
		}
		spares := rng.IntN(3) > 0
		maxMult := 1
		if spares {
			maxMult = 2
		}
		dev := testnet.RandomDevices(rng, n, 5, 0.1, 0.25)
		// A partial assignment as the search makes one: forbidden states
		// bare, existing ones at least one unit.
		decided := make([]int8, n)
		for v := range decided {
			decided[v] = -1
			switch {
			case !dev.Allowed(int32(v)):
				decided[v] = 0
			case trial%4 == 0:
				// the root: nothing decided
			case rng.IntN(2) == 0:
				lo := 0
				if dev.Has(int32(v)) {
					lo = 1
				}
				decided[v] = int8(lo + rng.IntN(maxMult-lo+1))
			}
		}
		leaf, sum := failure.DeviceBound(g, p, dev, decided, spares)
		for range 8 {
			l2, s2 := failure.DeviceBound(g, p, dev, decided, spares)
			if l2 != leaf || s2 != sum {
				t.Fatalf("trial %d: bounds %v/%v, then %v/%v", trial, leaf, sum, l2, s2)
			}
		}
		// The least cost of the undecided states' devices over every
		// completion of decided that survives the loss of any one unit.
		opt, ok := bruteRobust(testnet.MasksOf(g), g, p, failure.AnyDevice, dev, maxMult, nil, decided)
		if ok {
			checked++
			if leaf > opt || sum > opt {
				t.Fatalf("trial %d: %v, spares %v, decided %v, devices %+v: leaf bound %v, with sources %v, above the least completion %v; edges %v",
					trial, p, spares, decided, dev, leaf, sum, opt, edgesOf(g))
			}
			if sum == opt && leaf > 0 {
				tight++
			}
		}
		if trial%10 == 0 {
			req := failure.RobustRequest{Property: p, Survive: failure.AnyDevice, Devices: dev, Spares: spares}
			a, err := failure.Robust(g, req)
			if err != nil {
				t.Fatal(err)
			}
			b, err := failure.Robust(g, req)
			if err != nil {
				t.Fatal(err)
			}
			if !reflect.DeepEqual(a, b) {
				t.Fatalf("trial %d: two runs differ: %+v and %+v", trial, a, b)
			}
		}
	}
	if checked < trials/4 || tight < trials/50 {
		t.Fatalf("only %d of %d completable, %d tight with a leaf bound: the draw tests little", checked, trials, tight)
	}
	t.Logf("%d completable, %d tight with a leaf bound", checked, tight)
}

func edgesOf(g *structural.Network) [][2]int32 {
	var es [][2]int32
	for u := int32(0); int(u) < g.N(); u++ {
		for _, v := range g.Succ(u) {
			es = append(es, [2]int32{u, v})
		}
	}
	return es
}
