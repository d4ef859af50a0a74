package placement

import (
	"fmt"
	"math/rand/v2"
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/internal/testnet"
)

// The count formula m + beta - alpha (Pequito, Kar & Aguiar, IEEE TAC
// 2016) against brute force over all subsets with the Lin's-theorem oracle,
// with and without forbidden states, for actuators and sensors; and against
// the cost engine with unit costs.
func TestCountBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 3))
	for i := 0; i < 500; i++ {
		n := 1 + rng.IntN(9)
		g := testnet.Random(t, rng, n, []float64{0.08, 0.15, 0.3}[i%3])
		o := testnet.NewOracle(g)
		d := testnet.RandomDevices(rng, n, 0, []float64{0, 0.2, 0.4}[i%3], 0)
		for _, sensors := range []bool{false, true} {
			prop := structural.Controllability
			if sensors {
				prop = structural.Observability
			}
			label := fmt.Sprintf("trial %d (n=%d, sensors=%v)", i, n, sensors)
			c, err := Count(g, prop, d.Forbidden)
			if err != nil {
				t.Fatal(err)
			}
			want := testnet.BruteForce(o, sensors, d)
			if c.Feasible != want.Feasible {
				t.Fatalf("%s: feasible %v, brute force %v", label, c.Feasible, want.Feasible)
			}
			if !want.Feasible {
				continue
			}
			if c.Count != want.Count || len(c.Devices.IDs()) != c.Count {
				t.Fatalf("%s: m+beta-alpha = %d+%d-%d = %d with %d devices, brute force %d",
					label, c.Unmatched, c.SourceComponents, c.Alpha, c.Count, len(c.Devices.IDs()), want.Count)
			}
			s := testnet.MaskOf(c.Devices.IDs())
			if sensors && !o.Observable(s) || !sensors && !o.Controllable(s) {
				t.Fatalf("%s: set %v fails Lin's theorem", label, c.Devices.IDs())
			}
			pl, err := Place(g, prop, d)
			if err != nil {
				t.Fatal(err)
			}
			if len(pl.Devices.IDs()) != c.Count {
				t.Fatalf("%s: cost engine places %d, formula %d", label, len(pl.Devices.IDs()), c.Count)
			}
		}
	}
}

// Perfect matchings and several source components (common practice: a
// directed cycle is controlled from any one state; each separate source
// part needs its own actuator).
func TestCountShapes(t *testing.T) {
	ring := func(n int) [][2]int {
		var e [][2]int
		for i := 0; i < n; i++ {
			e = append(e, [2]int{i, (i + 1) % n})
		}
		return e
	}
	for _, tc := range []struct {
		name               string
		n                  int
		edges              [][2]int
		m, beta, alpha, nd int
	}{
		{"single cycle", 5, ring(5), 0, 1, 0, 1},
		{"self-loop", 1, [][2]int{{0, 0}}, 0, 1, 0, 1},
		{"three disjoint cycles", 7, [][2]int{{0, 1}, {1, 0}, {2, 3}, {3, 4}, {4, 2}, {5, 6}, {6, 5}}, 0, 3, 0, 3},
		// Two cycles feeding a chain: the chain's head is matched from a
		// cycle, one state stays unmatched and can move into a source cycle.
		{"cycles feed a chain", 6, [][2]int{{0, 1}, {1, 0}, {2, 3}, {3, 2}, {1, 4}, {3, 4}, {4, 5}}, 1, 2, 1, 2},
		// Two roots with no in-edge, each its own source component, both
		// unmatched: alpha = beta.
		{"two roots", 4, [][2]int{{0, 2}, {1, 2}, {2, 3}}, 2, 2, 2, 2},
		{"isolated states", 3, nil, 3, 3, 3, 3},
	} {
		g := plNet(t, tc.n, tc.edges)
		c, err := Count(g, structural.Controllability, nil)
		if err != nil {
			t.Fatal(err)
		}
		if c.Unmatched != tc.m || c.SourceComponents != tc.beta || c.Alpha != tc.alpha || c.Count != tc.nd {
			t.Errorf("%s: m, beta, alpha, count = %d, %d, %d, %d; want %d, %d, %d, %d",
				tc.name, c.Unmatched, c.SourceComponents, c.Alpha, c.Count, tc.m, tc.beta, tc.alpha, tc.nd)
		}
		o := testnet.NewOracle(g)
		if want := testnet.BruteForce(o, false, structural.Devices{}); want.Count != tc.nd {
			t.Errorf("%s: brute force finds %d, table says %d", tc.name, want.Count, tc.nd)
		}
	}
}
