package structural

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/stat/distuv"

	"github.com/netsteer/netsteer/matching"
)

// DegreeDist is a degree distribution: P[k] is the probability that a state
// has degree k. It need not be normalised; CavityDriverFraction normalises
// it.
type DegreeDist []float64

// Mean returns the mean degree of d (normalised).
func (d DegreeDist) Mean() float64 {
	var s, m float64
	for k, p := range d {
		s += p
		m += float64(k) * p
	}
	if s == 0 {
		return 0
	}
	return m / s
}

// PoissonDegrees returns the Poisson distribution with the given mean, the
// large-N degree distribution of a directed Erdős–Rényi network on either
// side, truncated far in the tail (below 1e-17).
func PoissonDegrees(mean float64) DegreeDist {
	if mean <= 0 {
		return DegreeDist{1}
	}
	p := distuv.Poisson{Lambda: mean}
	kmax := int(mean + 12*math.Sqrt(mean) + 40)
	d := make(DegreeDist, kmax+1)
	for k := range d {
		d[k] = p.Prob(float64(k))
	}
	return d
}

// FixedDegrees returns the distribution of a regular side: every state has
// degree k.
func FixedDegrees(k int) DegreeDist {
	d := make(DegreeDist, k+1)
	d[k] = 1
	return d
}

// DegreeDistributions returns the empirical out- and in-degree
// distributions of g, self-loops counted on both sides.
func DegreeDistributions(g *Network) (out, in DegreeDist) {
	return histogram(&g.out), histogram(&g.in)
}

func histogram(c *matching.CSR) DegreeDist {
	if c.Rows == 0 {
		return DegreeDist{1}
	}
	var counts DegreeDist
	for r := 0; r < c.Rows; r++ {
		k := c.Degree(int32(r))
		for len(counts) <= k {
			counts = append(counts, 0)
		}
		counts[k]++
	}
	for k := range counts {
		counts[k] /= float64(c.Rows)
	}
	return counts
}

// genfunc evaluates a probability generating function and its derivative
// over the nonzero terms of a degree distribution.
type genfunc struct {
	k    []float64
	p    []float64
	mean float64 // G'(1)
}

func newGenfunc(d DegreeDist) (genfunc, error) {
	var g genfunc
	var sum float64
	for k, p := range d {
		if p < 0 || math.IsNaN(p) || math.IsInf(p, 0) {
			return g, fmt.Errorf("structural: degree probability P(%d) = %v", k, p)
		}
		if p > 0 {
			g.k = append(g.k, float64(k))
			g.p = append(g.p, p)
			sum += p
		}
	}
	if sum == 0 {
		return g, errors.New("structural: empty degree distribution")
	}
	for i := range g.p {
		g.p[i] /= sum
		g.mean += g.k[i] * g.p[i]
	}
	return g, nil
}

// G returns sum_k P(k) s^k.
func (g *genfunc) G(s float64) float64 {
	var v float64
	for i, k := range g.k {
		v += g.p[i] * math.Pow(s, k)
	}
	return v
}

// H returns G'(s)/G'(1), the generating function of the excess degree (the
// degree of the state an edge leads to, less that edge).
func (g *genfunc) H(s float64) float64 {
	var v float64
	for i, k := range g.k {
		if k > 0 {
			v += g.p[i] * k * math.Pow(s, k-1)
		}
	}
	return v / g.mean
}

// CavityDriverFraction returns the cavity prediction of the driver-node
// fraction n_D = N_D/N of a large random directed network with out-degree
// distribution out and in-degree distribution in, drawn independently of
// each other (Liu, Slotine & Barabási, Nature 473:167, 2011, Eq. 3 and
// Supplementary Section IV).
//
// With G_o, G_i the out- and in-degree generating functions, H_x(s) =
// G_x'(s)/G_x'(1) and c the mean degree, it solves a = H_o(1 - H_i(1 - a)),
// sets b = H_i(1 - a) and returns
//
//	n_D = G_i(1 - a) + G_o(1 - b) - 1 + c a b,
//
// the largest value over the fixed points a in [0, 1] (above the core
// percolation threshold there are three; the outer two give the same n_D).
// The two means must agree (every edge has one tail and one head); a
// network with no edges gives 1.
func CavityDriverFraction(out, in DegreeDist) (float64, error) {
	gO, err := newGenfunc(out)
	if err != nil {
		return 0, err
	}
	gI, err := newGenfunc(in)
	if err != nil {
		return 0, err
	}
	if gO.mean == 0 && gI.mean == 0 {
		return 1, nil
	}
	if gO.mean == 0 || gI.mean == 0 || math.Abs(gO.mean-gI.mean) > 1e-6*math.Max(gO.mean, gI.mean) {
		return 0, fmt.Errorf("structural: mean out-degree %.6g differs from mean in-degree %.6g", gO.mean, gI.mean)
	}
	c := (gO.mean + gI.mean) / 2
	f := func(a float64) float64 { return gO.H(1 - gI.H(1-a)) }
	nD := func(a float64) float64 {
		b := gI.H(1 - a)
		return gI.G(1-a) + gO.G(1-b) - 1 + c*a*b
	}
	roots := fixedPoints(f)
	best := math.Inf(-1)
	for _, a := range roots {
		if v := nD(a); v > best {
			best = v
		}
	}
	// Rounding can push n_D a hair outside [0, 1].
	return math.Min(1, math.Max(0, best)), nil
}

// fixedPoints returns fixed points of the increasing map f of [0, 1] into
// itself: the limits of monotone iteration from 0 and from 1 (the least
// and the greatest), and every sign change of f(a) - a on a fine grid,
// refined by bisection.
func fixedPoints(f func(float64) float64) []float64 {
	var roots []float64
	for _, a0 := range []float64{0, 1} {
		a := a0
		for it := 0; it < 100000; it++ {
			next := f(a)
			if math.Abs(next-a) < 1e-15 {
				a = next
				break
			}
			a = next
		}
		roots = append(roots, a)
	}
	const grid = 512
	prevA, prevG := 0.0, f(0)
	for i := 1; i <= grid; i++ {
		a := float64(i) / grid
		g := f(a) - a
		if (prevG > 0 && g < 0) || (prevG < 0 && g > 0) {
			lo, hi := prevA, a
			for it := 0; it < 60; it++ {
				mid := (lo + hi) / 2
				if (f(mid)-mid > 0) == (prevG > 0) {
					lo = mid
				} else {
					hi = mid
				}
			}
			roots = append(roots, (lo+hi)/2)
		}
		prevA, prevG = a, g
	}
	return roots
}

// ExpectedDriverFraction returns the degree-preserving expectation of g's
// driver fraction: the cavity prediction for g's own in- and out-degree
// sequences (CavityDriverFraction of DegreeDistributions(g)), what a
// degree-preserving randomisation of g is expected to need.
func ExpectedDriverFraction(g *Network) (float64, error) {
	out, in := DegreeDistributions(g)
	return CavityDriverFraction(out, in)
}
