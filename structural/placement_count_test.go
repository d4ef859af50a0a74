package structural

import (
	"fmt"
	"math/rand/v2"
	"testing"
)

// The count formula m + beta - alpha (Pequito, Kar & Aguiar, IEEE TAC
// 2016) against brute force over all subsets with the Lin's-theorem oracle,
// with and without forbidden states, for actuators and sensors; and against
// the cost engine with unit costs.
func TestCountBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 3))
	for i := 0; i < 500; i++ {
		n := 1 + rng.IntN(9)
		g := plRandom(t, rng, n, []float64{0.08, 0.15, 0.3}[i%3])
		o := newPlOracle(g)
		d := randomDevices(rng, n, 0, []float64{0, 0.2, 0.4}[i%3], 0)
		for _, sensors := range []bool{false, true} {
			count, place := CountActuators, PlaceActuators
			if sensors {
				count, place = CountSensors, PlaceSensors
			}
			label := fmt.Sprintf("trial %d (n=%d, sensors=%v)", i, n, sensors)
			c, err := count(g, d.Forbidden)
			if err != nil {
				t.Fatal(err)
			}
			want := bruteForce(o, sensors, d)
			if c.Feasible != want.feasible {
				t.Fatalf("%s: feasible %v, brute force %v", label, c.Feasible, want.feasible)
			}
			if !want.feasible {
				continue
			}
			if c.Count != want.count || len(c.Devices) != c.Count {
				t.Fatalf("%s: m+beta-alpha = %d+%d-%d = %d with %d devices, brute force %d",
					label, c.Unmatched, c.SourceComponents, c.Alpha, c.Count, len(c.Devices), want.count)
			}
			s := maskOf(c.Devices)
			if sensors && !o.observable(s) || !sensors && !o.controllable(s) {
				t.Fatalf("%s: set %v fails Lin's theorem", label, c.Devices)
			}
			pl, err := place(g, d)
			if err != nil {
				t.Fatal(err)
			}
			if len(pl.Devices) != c.Count {
				t.Fatalf("%s: cost engine places %d, formula %d", label, len(pl.Devices), c.Count)
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
		c, err := CountActuators(g, nil)
		if err != nil {
			t.Fatal(err)
		}
		if c.Unmatched != tc.m || c.SourceComponents != tc.beta || c.Alpha != tc.alpha || c.Count != tc.nd {
			t.Errorf("%s: m, beta, alpha, count = %d, %d, %d, %d; want %d, %d, %d, %d",
				tc.name, c.Unmatched, c.SourceComponents, c.Alpha, c.Count, tc.m, tc.beta, tc.alpha, tc.nd)
		}
		o := newPlOracle(g)
		if want := bruteForce(o, false, Devices{}); want.count != tc.nd {
			t.Errorf("%s: brute force finds %d, table says %d", tc.name, want.count, tc.nd)
		}
	}
}
