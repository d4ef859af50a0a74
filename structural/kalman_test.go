package structural_test

// Test helpers: small networks from edge lists, and a numeric Kalman rank
// test on random real realisations of a structure (gonum/mat). This is the
// independent route the structural answers are checked against: for almost
// all parameter values the rank of [B AB ... A^(n-1)B] equals its generic
// value, so a random realisation reveals it with probability one.

import (
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/mat"

	"github.com/netsteer/netsteer/structural"
)

// edge is u -> v (u acts on v).
type edge struct{ u, v int32 }

// network builds a network of n states named 0..n-1.
func network(t testing.TB, n int, edges []edge) *structural.Network {
	t.Helper()
	b := structural.NewIntBuilder(n, 0)
	for _, e := range edges {
		b.AddEdge(e.u, e.v)
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatalf("Build: %v", err)
	}
	return g
}

// randomValue draws a parameter well inside floating-point range and away
// from zero: uniform on [-2, -0.5] U [0.5, 2].
func randomValue(rng *rand.Rand) float64 {
	x := 0.5 + 1.5*rng.Float64()
	if rng.IntN(2) == 0 {
		return -x
	}
	return x
}

// realiseA returns a random A with A[v][u] != 0 exactly for the edges u -> v
// of g.
func realiseA(rng *rand.Rand, g *structural.Network) *mat.Dense {
	n := g.N()
	a := mat.NewDense(n, n, nil)
	for u := 0; u < n; u++ {
		for _, v := range g.Out.Row(int32(u)) {
			a.Set(int(v), u, randomValue(rng))
		}
	}
	return a
}

// realiseB returns a random n x len(inputs) B whose column i is nonzero
// exactly on inputs[i].
func realiseB(rng *rand.Rand, n int, inputs [][]int32) *mat.Dense {
	if len(inputs) == 0 {
		return nil
	}
	b := mat.NewDense(n, len(inputs), nil)
	for i, in := range inputs {
		for _, v := range in {
			b.Set(int(v), i, randomValue(rng))
		}
	}
	return b
}

// denseB returns a random n x m B with every entry nonzero.
func denseB(rng *rand.Rand, n, m int) *mat.Dense {
	b := mat.NewDense(n, m, nil)
	for i := 0; i < n; i++ {
		for j := 0; j < m; j++ {
			b.Set(i, j, randomValue(rng))
		}
	}
	return b
}

// Relative thresholds on singular values. A structurally zero singular
// value comes out near 1e-16 of the largest; a generically nonzero one of
// these small well-scaled matrices is far above 1e-7. Anything between is
// a borderline sample and is redrawn.
const (
	rankTol    = 1e-9
	greyBottom = 1e-13
	greyTop    = 1e-7
)

// kalmanRank returns the numerical rank of the Kalman matrix
// [B AB ... A^(n-1)B] and whether a singular value fell in the grey band.
// Each column of each block is scaled to unit length before the next
// multiplication by A, which scales the Kalman columns by positive factors
// (leaving the rank alone) and keeps the entries near one. Exact zero
// columns (no walk from the input) stay exact zeros.
func kalmanRank(a, b *mat.Dense) (int, bool) {
	n, _ := a.Dims()
	if b == nil {
		return 0, false
	}
	_, m := b.Dims()
	k := mat.NewDense(n, n*m, nil)
	cur := mat.DenseCopyOf(b)
	col := make([]float64, n)
	for blk := 0; blk < n; blk++ {
		for j := 0; j < m; j++ {
			mat.Col(col, j, cur)
			if nrm := floats.Norm(col, 2); nrm > 0 {
				floats.Scale(1/nrm, col)
			}
			cur.SetCol(j, col)
			k.SetCol(blk*m+j, col)
		}
		var next mat.Dense
		next.Mul(a, cur)
		cur = &next
	}
	var svd mat.SVD
	if !svd.Factorize(k, mat.SVDNone) {
		return -1, true
	}
	s := svd.Values(nil)
	if len(s) == 0 || s[0] == 0 {
		return 0, false
	}
	rank, grey := 0, false
	for _, x := range s {
		r := x / s[0]
		if r > rankTol {
			rank++
		}
		if r > greyBottom && r < greyTop {
			grey = true
		}
	}
	return rank, grey
}

// sampledRank returns the Kalman rank of a random realisation of g with
// inputs drawn by mkB, redrawing borderline samples.
func sampledRank(t testing.TB, rng *rand.Rand, g *structural.Network, mkB func() *mat.Dense) int {
	t.Helper()
	for try := 0; try < 6; try++ {
		r, grey := kalmanRank(realiseA(rng, g), mkB())
		if !grey && r >= 0 {
			return r
		}
	}
	t.Fatalf("six borderline Kalman samples in a row on %d states", g.N())
	return -1
}

// patternNetwork builds the network whose edge u -> v is present when bit
// v*n+u of mask is set (A[v][u] != 0), self-loops included.
func patternNetwork(t testing.TB, n int, mask uint64) *structural.Network {
	var es []edge
	for v := 0; v < n; v++ {
		for u := 0; u < n; u++ {
			if mask>>(uint(v*n+u))&1 != 0 {
				es = append(es, edge{int32(u), int32(v)})
			}
		}
	}
	return network(t, n, es)
}

// randomNetwork builds a network of n states where each ordered pair
// (self-loops included) is an edge with probability p.
func randomNetwork(t testing.TB, rng *rand.Rand, n int, p float64) *structural.Network {
	var es []edge
	for u := 0; u < n; u++ {
		for v := 0; v < n; v++ {
			if rng.Float64() < p {
				es = append(es, edge{int32(u), int32(v)})
			}
		}
	}
	return network(t, n, es)
}
