package numeric

import (
	"math/rand/v2"

	"github.com/netsteer/netsteer/matching"
)

// Pattern is the structure that every sample of a system shares.
type Pattern struct {
	// Out is the network's out-CSR: row u lists the states v with
	// A[v][u] != 0 (the edges u -> v, self-loops included).
	Out *matching.CSR
	// Signals lists, for each input (column of B) or output (row of C),
	// the states it drives or senses.
	Signals [][]int32
}

// N returns the number of states.
func (p *Pattern) N() int { return p.Out.Rows }

// Exact holds values in GF(p) for a pattern, in the field's Montgomery form:
// A[k] is the entry of the edge Out.Adj[k], B[j][i] the entry of signal j at
// state Signals[j][i].
type Exact struct {
	F Field
	A []uint64
	B [][]uint64
}

// Real holds real values for a pattern, aligned as in Exact.
type Real struct {
	A []float64
	B [][]float64
}

// DrawExact draws every structural nonzero uniformly from the nonzero
// elements of f: first A's, then B's, from rng.
func DrawExact(p *Pattern, f Field, rng *rand.Rand) *Exact {
	x := &Exact{F: f, A: make([]uint64, len(p.Out.Adj))}
	for k := range x.A {
		x.A[k] = 1 + rng.Uint64N(f.P-1)
	}
	x.B = drawExactSignals(p.Signals, f, rng)
	return x
}

func drawExactSignals(signals [][]int32, f Field, rng *rand.Rand) [][]uint64 {
	b := make([][]uint64, len(signals))
	for j, s := range signals {
		b[j] = make([]uint64, len(s))
		for i := range s {
			b[j][i] = 1 + rng.Uint64N(f.P-1)
		}
	}
	return b
}

// DrawReal draws every structural nonzero with a magnitude uniform in
// [0.5, 1.5) and a random sign: values of one order of magnitude, well
// inside floating-point range, so that the margins measure the wiring and
// not the spread of the numbers.
func DrawReal(p *Pattern, rng *rand.Rand) *Real {
	x := &Real{A: make([]float64, len(p.Out.Adj))}
	for k := range x.A {
		x.A[k] = drawReal(rng)
	}
	x.B = drawRealSignals(p.Signals, rng)
	return x
}

func drawReal(rng *rand.Rand) float64 {
	v := 0.5 + rng.Float64()
	if rng.IntN(2) == 0 {
		return -v
	}
	return v
}

func drawRealSignals(signals [][]int32, rng *rand.Rand) [][]float64 {
	b := make([][]float64, len(signals))
	for j, s := range signals {
		b[j] = make([]float64, len(s))
		for i := range s {
			b[j][i] = drawReal(rng)
		}
	}
	return b
}

// Dense returns A (transposed when transpose is set) and B as dense
// row-major matrices: a is n×n, b is n×m with m the number of signals.
func (x *Real) Dense(p *Pattern, transpose bool) (a, b []float64) {
	n, m := p.N(), len(p.Signals)
	a = make([]float64, n*n)
	g := p.Out
	for u := 0; u < n; u++ {
		for k := g.Ptr[u]; k < g.Ptr[u+1]; k++ {
			v := int(g.Adj[k])
			if transpose {
				a[u*n+v] += x.A[k]
			} else {
				a[v*n+u] += x.A[k]
			}
		}
	}
	b = make([]float64, n*m)
	for j, s := range p.Signals {
		for i, st := range s {
			b[int(st)*m+j] += x.B[j][i]
		}
	}
	return a, b
}
