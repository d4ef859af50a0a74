package numeric

import (
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/netsteer/netsteer/matching"
)

// randomPattern returns a random pattern on n states with edge probability
// q (self-loops included) and m signals of one or two states each.
func randomPattern(rng *rand.Rand, n int, q float64, m int) *Pattern {
	var er, ec []int32
	for u := 0; u < n; u++ {
		for v := 0; v < n; v++ {
			if rng.Float64() < q {
				er = append(er, int32(u))
				ec = append(ec, int32(v))
			}
		}
	}
	p := &Pattern{Out: matching.FromEdges(n, n, er, ec)}
	for j := 0; j < m; j++ {
		s := []int32{int32(rng.IntN(n))}
		if n > 1 && rng.IntN(3) == 0 {
			if t := int32(rng.IntN(n)); t != s[0] {
				s = append(s, t)
			}
		}
		p.Signals = append(p.Signals, s)
	}
	return p
}

// kalmanRank is the floating-point rank of [B AB ... A^(n-1)B] (transpose:
// of Aᵀ) by gonum's SVD. ok is false when a singular value lies in the
// grey band between 1e-13 and 1e-7 of the largest, where a floating-point
// rank decision is not trustworthy.
func kalmanRank(p *Pattern, x *Real, transpose bool) (rank int, ok bool) {
	n, m := p.N(), len(p.Signals)
	if m == 0 {
		return 0, true
	}
	ad, bd := x.Dense(p, transpose)
	a := mat.NewDense(n, n, ad)
	blk := mat.NewDense(n, m, bd)
	k := mat.NewDense(n, n*m, nil)
	for i := 0; i < n; i++ {
		k.Slice(0, n, i*m, (i+1)*m).(*mat.Dense).Copy(blk)
		next := mat.NewDense(n, m, nil)
		next.Mul(a, blk)
		blk = next
	}
	var svd mat.SVD
	if !svd.Factorize(k, mat.SVDNone) {
		return -1, false
	}
	s := svd.Values(nil)
	if s[0] == 0 {
		return 0, true
	}
	ok = true
	for _, v := range s {
		if v > 1e-7*s[0] {
			rank++
		} else if v > 1e-13*s[0] {
			ok = false
		}
	}
	return rank, ok
}

// smallIntegers fills a Real sample with values in {-2, -1, 1, 2}: small
// integers make exact cancellations frequent, so the rank is often below
// the generic one, and keep the Kalman matrix exact in float64 for n <= 6.
func smallIntegers(p *Pattern, rng *rand.Rand) *Real {
	vals := []float64{-2, -1, 1, 2}
	x := &Real{A: make([]float64, len(p.Out.Adj)), B: make([][]float64, len(p.Signals))}
	for k := range x.A {
		x.A[k] = vals[rng.IntN(4)]
	}
	for j, s := range p.Signals {
		x.B[j] = make([]float64, len(s))
		for i := range s {
			x.B[j][i] = vals[rng.IntN(4)]
		}
	}
	return x
}

// The exact dimension over GF(p) equals gonum/mat's floating-point rank of
// the Kalman matrix on the same small-integer samples (reference library:
// gonum mat.SVD). Over the rationals and over GF(p) the ranks differ only
// when p divides every maximal minor, an integer here far below p in
// practice; the floating-point rank of these exact integer matrices is
// trusted only when no singular value falls in the grey band.
func TestDimensionAgainstFloatRank(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	f := NewField(Mersenne61)
	checked, deficient := 0, 0
	for c := 0; c < 3000; c++ {
		n := 1 + rng.IntN(6)
		p := randomPattern(rng, n, 0.1+0.4*rng.Float64(), 1+rng.IntN(3))
		x := smallIntegers(p, rng)
		for _, tr := range []bool{false, true} {
			want, ok := kalmanRank(p, x, tr)
			if !ok {
				continue
			}
			ex, inexact := ExactFromWeights(p, f, x.A, x.B)
			if inexact != 0 {
				t.Fatalf("small integers reported inexact")
			}
			got := Dimension(p, ex, tr, nil)
			if got != want {
				t.Fatalf("case %d (transpose %v): exact dimension %d, float Kalman rank %d; pattern %+v values %+v",
					c, tr, got, want, p, x)
			}
			checked++
			if got < n {
				deficient++
			}
		}
	}
	t.Logf("%d systems checked, %d rank-deficient", checked, deficient)
	if checked < 5000 || deficient < 500 {
		t.Errorf("too few informative cases: %d checked, %d deficient", checked, deficient)
	}
}

// hosoe is a brute-force generic dimension of the controllable subspace
// (Hosoe 1980): the largest number of states covered by vertex-disjoint
// stems, each starting at its own input, and cycles, all inside the part
// of the network the inputs reach. It tries every assignment of one
// predecessor (an in-neighbour or an input) or none to every state.
func hosoe(p *Pattern, transpose bool) int {
	n, m := p.N(), len(p.Signals)
	preds := make([][]int32, n) // states as 0..n-1, inputs as n..n+m-1
	succ := make([][]int32, n+m)
	g := p.Out
	for u := 0; u < n; u++ {
		for _, v := range g.Row(int32(u)) {
			a, b := int32(u), v
			if transpose {
				a, b = v, int32(u)
			}
			preds[b] = append(preds[b], a)
			succ[a] = append(succ[a], b)
		}
	}
	for j, s := range p.Signals {
		for _, st := range s {
			preds[st] = append(preds[st], int32(n+j))
			succ[n+j] = append(succ[n+j], st)
		}
	}
	reach := make([]bool, n+m)
	stack := []int32{}
	for j := 0; j < m; j++ {
		reach[n+j] = true
		stack = append(stack, int32(n+j))
	}
	for len(stack) > 0 {
		u := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		for _, v := range succ[u] {
			if !reach[v] {
				reach[v] = true
				stack = append(stack, v)
			}
		}
	}
	pred := make([]int32, n)
	used := make([]bool, n+m)
	best := 0
	var rec func(i int)
	rec = func(i int) {
		if i == n {
			if c := coverValid(pred, n); c > best {
				best = c
			}
			return
		}
		pred[i] = -1
		rec(i + 1)
		if !reach[i] {
			return
		}
		for _, q := range preds[i] {
			if !used[q] {
				used[q] = true
				pred[i] = q
				rec(i + 1)
				used[q] = false
			}
		}
		pred[i] = -1
	}
	rec(0)
	return best
}

// coverValid returns the number of covered states if every backward chain
// of predecessors ends at an input or closes a cycle, else -1.
func coverValid(pred []int32, n int) int {
	c := 0
	for s := 0; s < n; s++ {
		if pred[s] < 0 {
			continue
		}
		c++
		cur := int32(s)
		for steps := 0; ; steps++ {
			q := pred[cur]
			if q >= int32(n) {
				break // reached an input: a stem
			}
			if q < 0 {
				return -1 // a chain starting at a state with no input
			}
			if q == int32(s) || steps > n {
				break // back at s: a cycle
			}
			cur = q
		}
	}
	return c
}

// The brute-force check above reproduces the worked example of the design
// notes: u->x1, x1->x2, x1->x3, x2->x4, x3->x5 has term rank 4 but
// generic dimension 3 (common practice: two branches, one input).
func TestHosoeExample(t *testing.T) {
	p := &Pattern{
		Out:     matching.FromEdges(5, 5, []int32{0, 0, 1, 2}, []int32{1, 2, 3, 4}),
		Signals: [][]int32{{0}},
	}
	if got := hosoe(p, false); got != 3 {
		t.Fatalf("hosoe = %d, want 3", got)
	}
	f := NewField(Mersenne61)
	x := DrawExact(p, f, rand.New(rand.NewPCG(1, 1)))
	if got := Dimension(p, x, false, nil); got != 3 {
		t.Fatalf("sampled dimension = %d, want 3", got)
	}
}

// On thousands of random patterns the sampled dimension equals the
// brute-force generic dimension (Hosoe 1980, Theorem; Schwartz–Zippel
// bounds a miss by n²/(p-1) < 2e-17 per case here), for controllability
// and observability.
func TestDimensionAgainstBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	f := NewField(Mersenne61)
	counts := map[bool]int{}
	for c := 0; c < 4000; c++ {
		n := 1 + rng.IntN(6)
		p := randomPattern(rng, n, 0.05+0.35*rng.Float64(), 1+rng.IntN(2))
		x := DrawExact(p, f, rng)
		for _, tr := range []bool{false, true} {
			want := hosoe(p, tr)
			got := Dimension(p, x, tr, nil)
			if got != want {
				t.Fatalf("case %d transpose %v: sampled %d, brute-force generic %d; pattern %+v", c, tr, got, want, p)
			}
			counts[got == n]++
		}
	}
	t.Logf("full: %d, deficient: %d", counts[true], counts[false])
	if counts[true] < 1000 || counts[false] < 1000 {
		t.Errorf("unbalanced cases: %v", counts)
	}
}

// A long chain driven at its head is controllable and needs n products; a
// chain driven at its tail reaches one state. Exercises the grouped
// reduction across many rows (common practice).
func TestDimensionChain(t *testing.T) {
	const n = 300
	var er, ec []int32
	for i := 0; i+1 < n; i++ {
		er, ec = append(er, int32(i)), append(ec, int32(i+1))
	}
	f := NewField(Mersenne61)
	for _, tc := range []struct {
		drive int32
		want  int
	}{{0, n}, {n - 1, 1}, {n / 2, n - n/2}} {
		p := &Pattern{Out: matching.FromEdges(n, n, er, ec), Signals: [][]int32{{tc.drive}}}
		x := DrawExact(p, f, rand.New(rand.NewPCG(9, 9)))
		if got := Dimension(p, x, false, nil); got != tc.want {
			t.Errorf("drive %d: dimension %d, want %d", tc.drive, got, tc.want)
		}
		// Observability of the same chain sensed at that state.
		if got := Dimension(p, x, true, nil); got != int(tc.drive)+1 {
			t.Errorf("sense %d: dimension %d, want %d", tc.drive, got, tc.drive+1)
		}
	}
}
