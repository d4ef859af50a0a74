package numeric

import (
	"math/big"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/netsteer/netsteer/matching"
)

// detModP is det(M) over f by plain Gaussian elimination (common
// practice), the independent route for charPoly: det(cI - M) at any c.
func detModP(f *Field, m []uint64, k int) uint64 {
	a := append([]uint64(nil), m...)
	det := f.One()
	for c := 0; c < k; c++ {
		p := -1
		for i := c; i < k; i++ {
			if a[i*k+c] != 0 {
				p = i
				break
			}
		}
		if p < 0 {
			return 0
		}
		if p != c {
			for j := 0; j < k; j++ {
				a[p*k+j], a[c*k+j] = a[c*k+j], a[p*k+j]
			}
			det = f.Neg(det)
		}
		det = f.Mul(det, a[c*k+c])
		inv := f.Inv(a[c*k+c])
		for i := c + 1; i < k; i++ {
			u := f.Mul(a[i*k+c], inv)
			for j := c; j < k; j++ {
				a[i*k+j] = f.Sub(a[i*k+j], f.Mul(u, a[c*k+j]))
			}
		}
	}
	return det
}

func evalPoly(f *Field, p []uint64, x uint64) uint64 {
	var acc uint64
	for d := len(p) - 1; d >= 0; d-- {
		acc = f.Add(f.Mul(acc, x), p[d])
	}
	return acc
}

// The Hessenberg characteristic polynomial agrees with det(cI - M) by
// Gaussian elimination at random points, on random and sparse matrices
// (sparse ones exercise the zero subdiagonal and the swaps).
func TestCharPolyAgainstDeterminant(t *testing.T) {
	f := NewField(Mersenne61)
	rng := rand.New(rand.NewPCG(31, 32))
	for c := 0; c < 300; c++ {
		k := 1 + rng.IntN(9)
		m := make([]uint64, k*k)
		for i := range m {
			if c%2 == 0 || rng.IntN(3) == 0 {
				m[i] = f.FromInt(int64(rng.IntN(7) - 3))
			}
		}
		poly := charPoly(&f, append([]uint64(nil), m...), k)
		if len(poly) != k+1 || poly[k] != f.One() {
			t.Fatalf("case %d: polynomial of degree %d, leading %d", c, len(poly)-1, f.Uint(poly[k]))
		}
		for trial := 0; trial < 3; trial++ {
			x := f.FromUint(rng.Uint64N(f.P))
			if got, want := evalPoly(&f, poly, x), detModP(&f, shifted(&f, negated(&f, m), k, f.Neg(x)), k); got != want {
				t.Fatalf("case %d: charpoly(x) = %d, det(xI - M) = %d", c, f.Uint(got), f.Uint(want))
			}
		}
	}
}

// negated returns -M.
func negated(f *Field, m []uint64) []uint64 {
	out := make([]uint64, len(m))
	for i, v := range m {
		out[i] = f.Neg(v)
	}
	return out
}

// Root orders: (x-2)^3 (x+1) (x²+1)^2 has the orders 3, 1 and 2 (by
// construction); leftNull of a matrix with a known kernel.
func TestRootOrdersAndNullSpace(t *testing.T) {
	f := NewField(Mersenne61)
	mul := func(a, b []uint64) []uint64 {
		out := make([]uint64, len(a)+len(b)-1)
		for i, x := range a {
			for j, y := range b {
				out[i+j] = f.Add(out[i+j], f.Mul(x, y))
			}
		}
		return out
	}
	lin := func(c int64) []uint64 { return []uint64{f.Neg(f.FromInt(c)), f.One()} }
	quad := []uint64{f.One(), 0, f.One()}
	p := []uint64{f.One()}
	for _, q := range [][]uint64{lin(2), lin(2), lin(2), lin(-1), quad, quad} {
		p = mul(p, q)
	}
	if o := rootOrder(&f, p, f.FromInt(2)); o != 3 {
		t.Errorf("order at 2: %d", o)
	}
	if o := rootOrder(&f, p, f.FromInt(-1)); o != 1 {
		t.Errorf("order at -1: %d", o)
	}
	if o := rootOrder(&f, p, f.FromInt(3)); o != 0 {
		t.Errorf("order at 3: %d", o)
	}
	if o := quadOrder(&f, p, 0, f.One()); o != 2 {
		t.Errorf("order of x²+1: %d", o)
	}
	// wᵀM = 0 for M = [[1,2],[2,4]] (rank 1): w = (2, -1).
	m := []uint64{f.FromInt(1), f.FromInt(2), f.FromInt(2), f.FromInt(4)}
	ns := leftNull(&f, m, 2)
	if len(ns) != 1 {
		t.Fatalf("null space of dimension %d", len(ns))
	}
	w := ns[0]
	for j := 0; j < 2; j++ {
		if s := f.Add(f.Mul(w[0], m[j]), f.Mul(w[1], m[2+j])); s != 0 {
			t.Errorf("wᵀM[%d] = %d", j, f.Uint(s))
		}
	}
}

// faddeev is the characteristic polynomial of a small rational matrix by
// the Faddeev–LeVerrier recurrence in exact arithmetic (math/big), the
// independent route for the quotient: M_0 = 0, c_k = 1, M_j = A·M_{j-1} +
// c_{k-j+1}·I, c_{k-j} = -tr(A·M_j)/j (common practice).
func faddeev(a [][]*big.Rat) []*big.Rat {
	k := len(a)
	c := make([]*big.Rat, k+1)
	c[k] = big.NewRat(1, 1)
	m := make([][]*big.Rat, k)
	for i := range m {
		m[i] = make([]*big.Rat, k)
		for j := range m[i] {
			m[i][j] = new(big.Rat)
		}
	}
	for j := 1; j <= k; j++ {
		next := make([][]*big.Rat, k)
		for i := 0; i < k; i++ {
			next[i] = make([]*big.Rat, k)
			for l := 0; l < k; l++ {
				s := new(big.Rat)
				for q := 0; q < k; q++ {
					s.Add(s, new(big.Rat).Mul(a[i][q], m[q][l]))
				}
				if i == l {
					s.Add(s, c[k-j+1])
				}
				next[i][l] = s
			}
		}
		m = next
		tr := new(big.Rat)
		for i := 0; i < k; i++ {
			for q := 0; q < k; q++ {
				tr.Add(tr, new(big.Rat).Mul(a[i][q], m[q][i]))
			}
		}
		c[k-j] = tr.Neg(tr).Quo(tr, big.NewRat(int64(j), 1))
	}
	return c
}

// kalmanSystem builds, from a seed, an integer system in disguised
// Kalman form: A = T·[[A11, A12], [0, A22]]·T⁻¹ and B = T·[B1; 0] with
// T = P·L a permutation times a unit lower triangular integer matrix (so
// T⁻¹ is an integer matrix too), A11 and B1 random small integers (a
// controllable pair almost surely), A22 the k×k uncontrollable part.
// It returns A as a Pattern sample (every entry of A an edge), B, and
// A22: the eigenvalues of the uncontrollable part are those of A22
// (Kalman 1963; common practice).
func kalmanSystem(rng *rand.Rand, n, k, m int) (a [][]int64, b [][]int64, a22 [][]int64) {
	r := n - k
	blk := make([][]int64, n)
	for i := range blk {
		blk[i] = make([]int64, n)
	}
	small := func() int64 { return int64(rng.IntN(5) - 2) }
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			if i >= r && j < r {
				continue // the zero block
			}
			blk[i][j] = small()
		}
	}
	bb := make([][]int64, n)
	for i := range bb {
		bb[i] = make([]int64, m)
		if i < r {
			for j := range bb[i] {
				bb[i][j] = small()
			}
		}
	}
	// T = P·L, L unit lower triangular with entries in {-1, 0, 1}.
	l := make([][]int64, n)
	for i := range l {
		l[i] = make([]int64, n)
		l[i][i] = 1
		for j := 0; j < i; j++ {
			l[i][j] = int64(rng.IntN(3) - 1)
		}
	}
	linv := make([][]int64, n) // forward substitution, exact in integers
	for i := range linv {
		linv[i] = make([]int64, n)
		linv[i][i] = 1
		for j := 0; j < i; j++ {
			var s int64
			for q := j; q < i; q++ {
				s += l[i][q] * linv[q][j]
			}
			linv[i][j] = -s
		}
	}
	perm := rng.Perm(n)
	mulI := func(x, y [][]int64) [][]int64 {
		out := make([][]int64, len(x))
		for i := range x {
			out[i] = make([]int64, len(y[0]))
			for j := range y[0] {
				for q := range y {
					out[i][j] += x[i][q] * y[q][j]
				}
			}
		}
		return out
	}
	pm := make([][]int64, n)
	pinv := make([][]int64, n)
	for i := range pm {
		pm[i] = make([]int64, n)
		pinv[i] = make([]int64, n)
	}
	for i, j := range perm {
		pm[i][j] = 1
		pinv[j][i] = 1
	}
	t := mulI(pm, l)
	tinv := mulI(linv, pinv)
	a = mulI(mulI(t, blk), tinv)
	b = mulI(t, bb)
	a22 = make([][]int64, k)
	for i := range a22 {
		a22[i] = append([]int64(nil), blk[r+i][r:]...)
	}
	return a, b, a22
}

// denseSample turns an integer A (every position an edge, zeros
// included) and B into a Pattern and an exact sample over f.
func denseSample(f Field, a, b [][]int64) (*Pattern, *Exact) {
	n, m := len(a), len(b[0])
	var er, ec []int32
	for u := 0; u < n; u++ {
		for v := 0; v < n; v++ {
			er, ec = append(er, int32(u)), append(ec, int32(v))
		}
	}
	p := &Pattern{Out: matching.FromEdges(n, n, er, ec)}
	x := &Exact{F: f, A: make([]uint64, len(p.Out.Adj))}
	for u := 0; u < n; u++ {
		for t := p.Out.Ptr[u]; t < p.Out.Ptr[u+1]; t++ {
			x.A[t] = f.FromInt(a[p.Out.Adj[t]][u])
		}
	}
	for j := 0; j < m; j++ {
		var s []int32
		var vals []uint64
		for i := 0; i < n; i++ {
			s = append(s, int32(i))
			vals = append(vals, f.FromInt(b[i][j]))
		}
		p.Signals = append(p.Signals, s)
		x.B = append(x.B, vals)
	}
	return p, x
}

// The exact quotient of a disguised Kalman form has the characteristic
// polynomial of its A22 block, computed independently in rational
// arithmetic (Faddeev–LeVerrier); and every lifted left null vector of
// Ā - λI at an integer eigenvalue λ of A22 is a left eigenvector of A
// that vanishes on B (PBH: wᵀ[A - λI, B] = 0).
func TestQuotientAgainstKalmanForm(t *testing.T) {
	f := NewField(Mersenne61)
	rng := rand.New(rand.NewPCG(33, 34))
	tested := 0
	for c := 0; c < 200; c++ {
		n := 2 + rng.IntN(6)
		k := 1 + rng.IntN(n-1)
		m := 1 + rng.IntN(2)
		a, b, a22 := kalmanSystem(rng, n, k, m)
		p, x := denseSample(f, a, b)
		kb := krylov(p, x, false, nil)
		if len(kb.rows) != n-k {
			continue // A11, B1 happened to be uncontrollable
		}
		tested++
		q := newQuotient(p, x, false, kb)
		if q.k != k {
			t.Fatalf("case %d: quotient of dimension %d, want %d", c, q.k, k)
		}
		got := charPoly(&f, append([]uint64(nil), q.abar...), k)
		ra := make([][]*big.Rat, k)
		for i := range ra {
			ra[i] = make([]*big.Rat, k)
			for j := range ra[i] {
				ra[i][j] = big.NewRat(a22[i][j], 1)
			}
		}
		want := faddeev(ra)
		for d := range want {
			w, _ := fromRat(&f, want[d])
			if got[d] != w {
				t.Fatalf("case %d: coefficient %d is %d, want %v", c, d, f.Uint(got[d]), want[d])
			}
		}
		// Integer roots of the polynomial among -4..4.
		for lam := int64(-4); lam <= 4; lam++ {
			l := f.FromInt(lam)
			if rootOrder(&f, got, l) == 0 {
				continue
			}
			for _, wbar := range leftNull(&f, shifted(&f, q.abar, k, l), k) {
				w := q.lift(wbar)
				for j := 0; j < n; j++ { // wᵀ(A - λI) = 0
					var s uint64
					for i := 0; i < n; i++ {
						aij := f.FromInt(a[i][j])
						if i == j {
							aij = f.Sub(aij, l)
						}
						s = f.Add(s, f.Mul(w[i], aij))
					}
					if s != 0 {
						t.Fatalf("case %d: lifted vector is no left eigenvector at %d", c, lam)
					}
				}
				for j := 0; j < m; j++ { // wᵀB = 0
					var s uint64
					for i := 0; i < n; i++ {
						s = f.Add(s, f.Mul(w[i], f.FromInt(b[i][j])))
					}
					if s != 0 {
						t.Fatalf("case %d: lifted vector not orthogonal to B", c)
					}
				}
			}
		}
	}
	if tested < 100 {
		t.Errorf("only %d informative cases", tested)
	}
}

// Both routes to the quotient (reduced echelon form, or reducing each
// column) and both orientations (the pattern of Aᵀ read transposed is the
// pattern of A) give the same characteristic polynomial.
func TestQuotientRoutesAgree(t *testing.T) {
	f := NewField(Mersenne61)
	rng := rand.New(rand.NewPCG(35, 36))
	saved := useDirect
	defer func() { useDirect = saved }()
	for c := 0; c < 100; c++ {
		n := 2 + rng.IntN(7)
		k := 1 + rng.IntN(n-1)
		a, b, _ := kalmanSystem(rng, n, k, 1+rng.IntN(2))
		at := make([][]int64, n)
		for i := range at {
			at[i] = make([]int64, n)
			for j := range at[i] {
				at[i][j] = a[j][i]
			}
		}
		var polys [][]uint64
		for _, direct := range []bool{false, true} {
			useDirect = func(int, int) bool { return direct }
			for _, tr := range []bool{false, true} {
				m := a
				if tr {
					m = at
				}
				p, x := denseSample(f, m, b)
				kb := krylov(p, x, tr, nil)
				q := newQuotient(p, x, tr, kb)
				polys = append(polys, charPoly(&f, append([]uint64(nil), q.abar...), q.k))
			}
		}
		for i := 1; i < len(polys); i++ {
			if !slices.Equal(polys[i], polys[0]) {
				t.Fatalf("case %d: route %d gives another polynomial", c, i)
			}
		}
	}
}
