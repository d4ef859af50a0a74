package structural_test

import (
	"math"
	"math/rand/v2"
	"testing"

	"github.com/netsteer/netsteer/structural"
)

// cavityER is the cavity prediction of the driver fraction of a directed
// Erdos-Renyi network with mean total degree k (Liu, Slotine & Barabasi,
// Nature 473:167, 2011, Eq. 3 in the symmetric case): with c = k/2 and t
// the smallest root of t = exp(-c exp(-c t)),
// n_D = t + exp(-c t) - 1 + c t exp(-c t). The map is increasing, so
// iterating it from 0 climbs to the smallest fixed point.
func cavityER(k float64) float64 {
	c := k / 2
	t := 0.0
	for i := 0; i < 100000; i++ {
		next := math.Exp(-c * math.Exp(-c*t))
		if math.Abs(next-t) < 1e-15 {
			t = next
			break
		}
		t = next
	}
	return t + math.Exp(-c*t) - 1 + c*t*math.Exp(-c*t)
}

// drawnER returns a directed network of n states from l independent
// uniform ordered pairs; a pair u == u adds nothing and repeats merge. The
// draws are independent, so N_D is a function of l independent variables,
// each of which moves it by at most one (one edge more or less changes a
// maximum matching by at most one).
func drawnER(t testing.TB, n, l int, rng *rand.Rand) *structural.Network {
	b := structural.NewIntBuilder(n, 0)
	b.Grow(l)
	for i := 0; i < l; i++ {
		u, v := rng.IntN(n), rng.IntN(n)
		if u != v {
			b.AddEdge(int32(u), int32(v))
		}
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	return g
}

// TestCavityERSampled compares the driver fraction of generated directed
// ER networks of 10^5 states with the cavity prediction (Liu et al. 2011,
// Eq. 3, symmetric case; about 0.456 at <k> = 2 and 0.072 at <k> = 6), with
// L = <k> N / 2 edges (<k> counts in- and out-links).
//
// Tolerance from the sampling error: the mean of r replicates is a
// function of r L independent draws, each moving it by at most 1/(r N), so
// McDiarmid's inequality bounds P(|mean - E mean| >= eps) by
// 2 exp(-2 eps^2 r N^2 / L). Choosing the bound 10^-6 gives
// eps = sqrt(L ln(2*10^6) / (2 r)) / N: 0.0043 at <k> = 2 and 0.0074 at
// <k> = 6 for r = 4. The finite-size bias of E n_D at N = 10^5 is not
// bounded here and is assumed small against these (the sampled means land
// within 0.001 of the prediction). The replicates' own spread is logged and
// must lie within the Efron-Stein bound sd(n_D) <= sqrt(L/2)/N.
func TestCavityERSampled(t *testing.T) {
	const (
		n = 100_000
		r = 4
	)
	for _, c := range []struct{ k, about float64 }{{2, 0.456}, {6, 0.072}} {
		want := cavityER(c.k)
		if math.Abs(want-c.about) > 0.0005 {
			t.Fatalf("<k> = %v: Eq. 3 gives %.4f, the paper's curve about %.3f", c.k, want, c.about)
		}
		l := int(c.k * n / 2)
		rng := rand.New(rand.NewPCG(473, uint64(c.k)))
		var sum, sumSq float64
		for i := 0; i < r; i++ {
			g := drawnER(t, n, l, rng)
			nd := float64(len(structural.Drivers(g).Drivers.IDs())) / n
			sum += nd
			sumSq += nd * nd
		}
		mean := sum / r
		sd := math.Sqrt(math.Max(0, (sumSq-r*mean*mean)/(r-1)))
		eps := math.Sqrt(float64(l)*math.Log(2e6)/(2*r)) / n
		t.Logf("<k> = %v: cavity %.5f, sampled mean %.5f (sd %.5f over %d), tolerance %.4f", c.k, want, mean, sd, r, eps)
		if math.Abs(mean-want) > eps {
			t.Errorf("<k> = %v: sampled n_D %.5f, cavity %.5f, beyond the tolerance %.4f", c.k, mean, want, eps)
		}
		if bound := math.Sqrt(float64(l)/2) / n; sd > bound {
			t.Errorf("<k> = %v: replicate sd %.5f above the Efron-Stein bound %.5f", c.k, sd, bound)
		}
	}
}
