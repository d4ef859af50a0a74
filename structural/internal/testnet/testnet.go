package testnet

import (
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/mat"

	"github.com/netsteer/netsteer/structural"
)

// Edge is u -> v (u acts on v): {u, v}.
type Edge [2]int32

// Network builds a network of n states named 0..n-1.
func Network(t testing.TB, n int, edges []Edge) *structural.Network {
	t.Helper()
	b := structural.NewIntBuilder(n, 0)
	for _, e := range edges {
		b.AddEdge(e[0], e[1])
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatalf("Build: %v", err)
	}
	return g
}

// RandomValue draws a parameter well inside floating-point range and away
// from zero: uniform on [-2, -0.5] U [0.5, 2].
func RandomValue(rng *rand.Rand) float64 {
	x := 0.5 + 1.5*rng.Float64()
	if rng.IntN(2) == 0 {
		return -x
	}
	return x
}

// RealiseA returns a random A with A[v][u] != 0 exactly for the edges u -> v
// of g.
func RealiseA(rng *rand.Rand, g *structural.Network) *mat.Dense {
	n := g.N()
	a := mat.NewDense(n, n, nil)
	for u := 0; u < n; u++ {
		for _, v := range g.Succ(int32(u)) {
			a.Set(int(v), u, RandomValue(rng))
		}
	}
	return a
}

// RealiseB returns a random n x len(inputs) B whose column i is nonzero
// exactly on inputs[i].
func RealiseB(rng *rand.Rand, n int, inputs [][]int32) *mat.Dense {
	if len(inputs) == 0 {
		return nil
	}
	b := mat.NewDense(n, len(inputs), nil)
	for i, in := range inputs {
		for _, v := range in {
			b.Set(int(v), i, RandomValue(rng))
		}
	}
	return b
}

// DenseB returns a random n x m B with every entry nonzero.
func DenseB(rng *rand.Rand, n, m int) *mat.Dense {
	b := mat.NewDense(n, m, nil)
	for i := 0; i < n; i++ {
		for j := 0; j < m; j++ {
			b.Set(i, j, RandomValue(rng))
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

// KalmanRank returns the numerical rank of the Kalman matrix
// [B AB ... A^(n-1)B] and whether a singular value fell in the grey band.
// Each column of each block is scaled to unit length before the next
// multiplication by A, which scales the Kalman columns by positive factors
// (leaving the rank alone) and keeps the entries near one. Exact zero
// columns (no walk from the input) stay exact zeros.
func KalmanRank(a, b *mat.Dense) (int, bool) {
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

// SampledRank returns the Kalman rank of a random realisation of g with
// inputs drawn by mkB, redrawing borderline samples.
func SampledRank(t testing.TB, rng *rand.Rand, g *structural.Network, mkB func() *mat.Dense) int {
	t.Helper()
	for try := 0; try < 6; try++ {
		r, grey := KalmanRank(RealiseA(rng, g), mkB())
		if !grey && r >= 0 {
			return r
		}
	}
	t.Fatalf("six borderline Kalman samples in a row on %d states", g.N())
	return -1
}

// Pattern builds the network whose edge u -> v is present when bit
// v*n+u of mask is set (A[v][u] != 0), self-loops included.
func Pattern(t testing.TB, n int, mask uint64) *structural.Network {
	var es []Edge
	for v := 0; v < n; v++ {
		for u := 0; u < n; u++ {
			if mask>>(uint(v*n+u))&1 != 0 {
				es = append(es, Edge{int32(u), int32(v)})
			}
		}
	}
	return Network(t, n, es)
}

// Random builds a network of n states where each ordered pair
// (self-loops included) is an edge with probability p.
func Random(t testing.TB, rng *rand.Rand, n int, p float64) *structural.Network {
	var es []Edge
	for u := 0; u < n; u++ {
		for v := 0; v < n; v++ {
			if rng.Float64() < p {
				es = append(es, Edge{int32(u), int32(v)})
			}
		}
	}
	return Network(t, n, es)
}

// Design returns the design of g whose signal i touches signals[i].
func Design(t testing.TB, g *structural.Network, signals [][]int32) structural.Design {
	t.Helper()
	d, err := structural.NewDesign(g, signals, nil)
	if err != nil {
		t.Fatalf("NewDesign: %v", err)
	}
	return d
}

// Check judges the design signals of g for property p, failing the test on
// an error.
func Check(t testing.TB, g *structural.Network, p structural.Property, signals [][]int32) *structural.Verdict {
	t.Helper()
	v, err := structural.Check(g, p, Design(t, g, signals))
	if err != nil {
		t.Fatalf("Check: %v", err)
	}
	return v
}

// Dimension returns the generic controllable (observable) dimension of the
// design signals of g, failing the test on an error.
func Dimension(t testing.TB, g *structural.Network, p structural.Property, signals [][]int32) int {
	t.Helper()
	d, err := structural.Dimension(g, p, Design(t, g, signals))
	if err != nil {
		t.Fatalf("Dimension: %v", err)
	}
	return d
}
