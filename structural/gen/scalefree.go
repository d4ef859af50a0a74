package gen

import (
	"math"
	"math/rand/v2"
)

// ScaleFree emits a directed network of n states and exactly l edges from
// the static model of Goh, Kahng & Kim (Phys. Rev. Lett. 87:278701, 2001),
// directed as in Liu, Slotine & Barabási (2011, Supplementary Section V):
// state i gets an out-weight i^-αout and an in-weight π(i)^-αin, with
// αx = 1/(γx - 1) and π a random permutation, so that in- and out-degrees
// are independent. Edges u -> v are drawn with probability proportional to
// the product of u's out-weight and v's in-weight, self-loops and repeats
// rejected, until l distinct edges are placed. The degrees then follow
// power laws with exponents γout and γin (for large n); an infinite
// exponent gives equal weights, the ER network. Exponents must exceed 2.
//
// Edges are emitted sorted by source, then target. Time O(n + l) expected
// (Walker's alias tables), memory about 24 bytes per edge plus 24 per state.
func ScaleFree(n int, l int64, gammaOut, gammaIn float64, rng *rand.Rand, sink Sink) error {
	if n < 2 || n > maxStates {
		return errorf("nodes %d out of range [2, %d]", n, maxStates)
	}
	for _, g := range []float64{gammaOut, gammaIn} {
		if !(g > 2) {
			return errorf("degree exponent %v must be greater than 2", g)
		}
	}
	m := uint64(n) * uint64(n-1)
	if l < 0 || uint64(l) > m/2 || l > maxEdges {
		return errorf("%d edges are too many for a static-model network of %d states (at most %d)", l, n, min(m/2, uint64(maxEdges)))
	}
	if l == 0 {
		return nil
	}
	wOut := staticWeights(n, gammaOut, nil)
	perm := make([]int32, n)
	permute(rng, perm)
	wIn := staticWeights(n, gammaIn, perm)
	aOut := newAlias(wOut)
	aIn := newAlias(wIn)
	wOut, wIn, perm = nil, nil, nil
	nn := uint64(n)
	codes, err := distinct(int(l), nn*nn-1, func() uint64 {
		for {
			u := aOut.draw(rng)
			v := aIn.draw(rng)
			if u != v {
				return uint64(u)*nn + uint64(v)
			}
		}
	})
	if err != nil {
		return err
	}
	for _, x := range codes {
		sink.AddEdge(int32(x/nn), int32(x%nn))
	}
	return nil
}

// staticWeights returns w[i] = r(i)^-α with α = 1/(γ-1) and rank r(i) =
// i+1, or perm[i]+1 when perm is given.
func staticWeights(n int, gamma float64, perm []int32) []float64 {
	alpha := 0.0
	if !math.IsInf(gamma, 1) {
		alpha = 1 / (gamma - 1)
	}
	w := make([]float64, n)
	for i := range w {
		r := i + 1
		if perm != nil {
			r = int(perm[i]) + 1
		}
		w[i] = math.Pow(float64(r), -alpha)
	}
	return w
}

// alias is Walker's alias table for drawing an index with probability
// proportional to its weight in O(1) (Vose's construction).
type alias struct {
	prob  []float64
	alias []int32
}

func newAlias(w []float64) *alias {
	n := len(w)
	var sum float64
	for _, x := range w {
		sum += x
	}
	a := &alias{prob: make([]float64, n), alias: make([]int32, n)}
	small := make([]int32, 0, n)
	large := make([]int32, 0, n)
	for i, x := range w {
		a.prob[i] = x * float64(n) / sum
		if a.prob[i] < 1 {
			small = append(small, int32(i))
		} else {
			large = append(large, int32(i))
		}
	}
	for len(small) > 0 && len(large) > 0 {
		s := small[len(small)-1]
		small = small[:len(small)-1]
		g := large[len(large)-1]
		a.alias[s] = g
		a.prob[g] -= 1 - a.prob[s]
		if a.prob[g] < 1 {
			large = large[:len(large)-1]
			small = append(small, g)
		}
	}
	for _, i := range large {
		a.prob[i] = 1
	}
	for _, i := range small { // rounding leftovers
		a.prob[i] = 1
	}
	return a
}

func (a *alias) draw(rng *rand.Rand) int32 {
	i := rng.IntN(len(a.prob))
	if rng.Float64() < a.prob[i] {
		return int32(i)
	}
	return a.alias[i]
}
