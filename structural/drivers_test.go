package structural_test

import (
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/internal/testnet"
)

func TestMinimumDriversShapes(t *testing.T) {
	// Small shapes whose driver count is common practice (a path is one
	// stem, a cycle needs one signal; an out-star needs the hub and every
	// leaf but one).
	cases := []struct {
		name  string
		n     int
		edges []testnet.Edge
		want  int
	}{
		{"isolated states", 3, nil, 3},
		{"chain", 4, []testnet.Edge{{0, 1}, {1, 2}, {2, 3}}, 1},
		{"cycle", 3, []testnet.Edge{{0, 1}, {1, 2}, {2, 0}}, 1},
		{"self-loops only", 3, []testnet.Edge{{0, 0}, {1, 1}, {2, 2}}, 1},
		{"out-star", 5, []testnet.Edge{{0, 1}, {0, 2}, {0, 3}, {0, 4}}, 4},
		{"in-star", 5, []testnet.Edge{{1, 0}, {2, 0}, {3, 0}, {4, 0}}, 4},
		{"two source cycles", 5, []testnet.Edge{{0, 1}, {1, 0}, {2, 3}, {3, 2}, {0, 4}, {2, 4}}, 1},
	}
	for _, c := range cases {
		g := testnet.Network(t, c.n, c.edges)
		ds := structural.Drivers(g)
		if got := ds.Drivers.Len(); got != c.want {
			t.Errorf("%s: got %d drivers, want %d", c.name, got, c.want)
		}
		if len(ds.Inputs.Signals()) != ds.Drivers.Len() {
			t.Errorf("%s: got %d inputs for %d drivers", c.name, len(ds.Inputs.Signals()), ds.Drivers.Len())
		}
		for i, in := range ds.Inputs.Signals() {
			if in[0] != ds.Drivers.At(i) {
				t.Errorf("%s: input %d starts with %d, want its driver %d", c.name, i, in[0], ds.Drivers.At(i))
			}
		}
		if v := testnet.Check(t, g, structural.Controllability, ds.Inputs.Signals()); !v.Holds {
			t.Errorf("%s: the returned design is not controllable: %+v", c.name, v)
		}
	}
}

// fewestInputs returns the least m for which A (a random realisation of g)
// with a random fully dense n x m B is controllable by the Kalman rank test.
//
// Structural controllability is monotone in the pattern of B: if some
// realisation of a pattern has full Kalman rank, a pattern with more
// nonzero entries contains realisations arbitrarily close to it, which have
// full rank too (rank is lower semicontinuous). A fully dense B with m
// columns contains every B pattern with m columns, so the fewest independent
// inputs over all input patterns is the least m that works with a dense B:
// one rank test per m instead of a search over all 2^(n m) patterns.
func fewestInputs(t testing.TB, rng *rand.Rand, g *structural.Network) int {
	n := g.N()
	for m := 1; m <= n; m++ {
		if testnet.SampledRank(t, rng, g, func() *mat.Dense { return testnet.DenseB(rng, n, m) }) == n {
			return m
		}
	}
	t.Fatalf("a dense %d x %d B does not control %d states", n, n, n)
	return -1
}

// checkAgainstKalman compares driver_count with the brute-force fewest
// inputs and checks that the returned design passes the rank test.
func checkAgainstKalman(t *testing.T, rng *rand.Rand, g *structural.Network, label string) {
	t.Helper()
	n := g.N()
	ds := structural.Drivers(g)
	if want := fewestInputs(t, rng, g); ds.Drivers.Len() != want {
		t.Fatalf("%s: driver_count %d, fewest inputs by Kalman rank %d", label, ds.Drivers.Len(), want)
	}
	if r := testnet.SampledRank(t, rng, g, func() *mat.Dense { return testnet.RealiseB(rng, n, ds.Inputs.Signals()) }); r != n {
		t.Fatalf("%s: the returned design %v has Kalman rank %d, want %d", label, ds.Inputs.Signals(), r, n)
	}
	if v := testnet.Check(t, g, structural.Controllability, ds.Inputs.Signals()); !v.Holds || v.Dimension != n {
		t.Fatalf("%s: Check on the returned design: controllable %v, dimension %d", label, v.Holds, v.Dimension)
	}
}

// TestDriversKalmanExhaustive: every network pattern on up to 4 states,
// self-loops included (2^(n^2) patterns: 65,536 for n = 4). Independent
// route: Kalman's rank condition on random realisations (gonum/mat SVD);
// the count N_D = max(N - |M*|, 1) is Liu, Slotine & Barabasi, Nature
// 473:167 (2011).
func TestDriversKalmanExhaustive(t *testing.T) {
	rng := rand.New(rand.NewPCG(2011, 473))
	maxN := 4
	if testing.Short() {
		maxN = 3
	}
	for n := 1; n <= maxN; n++ {
		for mask := uint64(0); mask < 1<<(n*n); mask++ {
			checkAgainstKalman(t, rng, testnet.Pattern(t, n, mask), "pattern")
		}
	}
}

// TestDriversKalmanRandom: random patterns on 5 and 6 states at several
// densities, same independent route as above.
func TestDriversKalmanRandom(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	for trial := 0; trial < 1500; trial++ {
		n := 5 + trial%2
		p := []float64{0.08, 0.15, 0.25, 0.4, 0.6}[trial%5]
		checkAgainstKalman(t, rng, testnet.Random(t, rng, n, p), "random")
	}
}

// chainNetwork returns the directed chain 0 -> 1 -> ... -> n-1.
func chainNetwork(tb testing.TB, n int) *structural.Network {
	b := structural.NewIntBuilder(n, 0)
	b.Grow(n - 1)
	for v := 0; v+1 < n; v++ {
		b.AddEdge(int32(v), int32(v+1))
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		tb.Fatal(err)
	}
	return g
}

// TestDriversDeepChain runs MinimumDrivers and Check on a 10^7-state
// directed chain: one driver, its head (a path is one stem; common
// practice). Every search in them is iterative, so a path of that depth
// costs heap, not goroutine stack. In -short mode the chain has 10^6
// states.
func TestDriversDeepChain(t *testing.T) {
	n := 10_000_000
	if testing.Short() {
		n = 1_000_000
	}
	g := chainNetwork(t, n)
	ds := structural.Drivers(g)
	if ds.Drivers.Len() != 1 || ds.Drivers.At(0) != 0 {
		t.Fatalf("chain: drivers %v, want [0]", ds.Drivers)
	}
	if v := testnet.Check(t, g, structural.Controllability, ds.Inputs.Signals()); !v.Holds || v.Dimension != n {
		t.Fatalf("chain: controllable %v, dimension %d; want true, %d", v.Holds, v.Dimension, n)
	}
}
