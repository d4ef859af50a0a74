package numeric

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
)

func randDense(rng *rand.Rand, r, c int) []float64 {
	d := make([]float64, r*c)
	for i := range d {
		d[i] = rng.NormFloat64()
	}
	return d
}

// sigmaMinSVD is the smallest singular value of [A - λI, B] by gonum's
// SVD of the real embedding [[Re M, -Im M], [Im M, Re M]] of the complex
// matrix M, whose singular values are those of M, each twice (a standard
// identity; common practice).
func sigmaMinSVD(a, b []float64, n, m int, lam complex128) float64 {
	w := n + m
	e := mat.NewDense(2*n, 2*w, nil)
	for i := 0; i < n; i++ {
		for j := 0; j < w; j++ {
			var re, im float64
			if j < n {
				re = a[i*n+j]
				if i == j {
					re -= real(lam)
					im = -imag(lam)
				}
			} else {
				re = b[i*m+j-n]
			}
			e.Set(i, j, re)
			e.Set(i+n, j+w, re)
			e.Set(i, j+w, -im)
			e.Set(i+n, j, im)
		}
	}
	var svd mat.SVD
	if !svd.Factorize(e, mat.SVDNone) {
		panic("svd failed")
	}
	s := svd.Values(nil)
	return s[len(s)-1]
}

// The PBH margin equals the minimum over gonum's eigenvalues (mat.Eigen) of
// the smallest singular value from gonum's SVD (reference library: gonum
// mat.Eigen and mat.SVD).
func TestMarginAgainstSVD(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	for c := 0; c < 200; c++ {
		n, m := 1+rng.IntN(12), 1+rng.IntN(3)
		if c%10 == 0 {
			m = n + 1 + rng.IntN(3) // more inputs than states: compression
		}
		a, b := randDense(rng, n, n), randDense(rng, n, m)
		if c%3 == 0 {
			// A sparse, structured case: a chain with a few extra links.
			for i := range a {
				if rng.IntN(3) != 0 {
					a[i] = 0
				}
			}
		}
		got, err := Float(a, b, n, m, nil)
		if err != nil {
			t.Fatal(err)
		}
		var eig mat.Eigen
		if !eig.Factorize(mat.NewDense(n, n, append([]float64(nil), a...)), mat.EigenNone) {
			t.Fatal("eigen failed")
		}
		want := math.Inf(1)
		for _, lam := range eig.Values(nil) {
			want = math.Min(want, sigmaMinSVD(a, b, n, m, lam))
		}
		if math.Abs(got.Sigma-want) > 1e-7*(1+want) {
			t.Fatalf("case %d (n=%d m=%d): margin %.12g, SVD %.12g", c, n, m, got.Sigma, want)
		}
	}
}

// kronGramian solves (A-sI)W + W(A-sI)ᵀ + BBᵀ = 0 by the Kronecker form
// (I⊗A' + A'⊗I) vec W = -vec(BBᵀ) with gonum's dense solver: an
// independent route for small n (common practice).
func kronGramian(a, b []float64, n, m int, s float64) *mat.Dense {
	k := mat.NewDense(n*n, n*n, nil)
	rhs := mat.NewVecDense(n*n, nil)
	idx := func(i, j int) int { return i*n + j } // vec by rows
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			row := idx(i, j)
			// (A'W)_ij = Σ_k A'_ik W_kj ; (WA'ᵀ)_ij = Σ_k W_ik A'_jk
			for q := 0; q < n; q++ {
				aiq := a[i*n+q]
				if i == q {
					aiq -= s
				}
				k.Set(row, idx(q, j), k.At(row, idx(q, j))+aiq)
				ajq := a[j*n+q]
				if j == q {
					ajq -= s
				}
				k.Set(row, idx(i, q), k.At(row, idx(i, q))+ajq)
			}
			var bb float64
			for l := 0; l < m; l++ {
				bb += b[i*m+l] * b[j*m+l]
			}
			rhs.SetVec(row, -bb)
		}
	}
	var w mat.VecDense
	if err := w.SolveVec(k, rhs); err != nil {
		panic(err)
	}
	return mat.NewDense(n, n, w.RawVector().Data)
}

// Bartels–Stewart on the Schur form agrees with the Kronecker solve, and
// the extreme eigenvalues with gonum's symmetric eigensolver on it.
func TestGramianAgainstKronecker(t *testing.T) {
	rng := rand.New(rand.NewPCG(13, 14))
	for c := 0; c < 100; c++ {
		n, m := 1+rng.IntN(8), 1+rng.IntN(3)
		a, b := randDense(rng, n, n), randDense(rng, n, m)
		got, err := Float(a, b, n, m, nil)
		if err != nil {
			t.Fatal(err)
		}
		w := kronGramian(a, b, n, m, got.Shift)
		var es mat.EigenSym
		sym := mat.NewSymDense(n, nil)
		for i := 0; i < n; i++ {
			for j := i; j < n; j++ {
				sym.SetSym(i, j, (w.At(i, j)+w.At(j, i))/2)
			}
		}
		es.Factorize(sym, false)
		v := es.Values(nil)
		lo, hi := v[0], v[n-1]
		if math.Abs(got.GramianMin-lo) > 1e-8*hi || math.Abs(got.GramianMax-hi) > 1e-8*hi {
			t.Fatalf("case %d: Gramian extremes %g..%g, Kronecker %g..%g", c, got.GramianMin, got.GramianMax, lo, hi)
		}
		// And the shift is stable with the promised gap.
		var eig mat.Eigen
		eig.Factorize(mat.NewDense(n, n, append([]float64(nil), a...)), mat.EigenNone)
		for _, lam := range eig.Values(nil) {
			if real(lam) >= got.Shift {
				t.Fatalf("case %d: eigenvalue %v not left of the shift %g", c, lam, got.Shift)
			}
		}
	}
}

// A scalar system x' = a x + b u: with the shift s = a + |a| the Gramian is
// b²/(2|a|) (closed form of the scalar Lyapunov equation; common practice),
// and the margin at λ = a is |b| (the matrix [0, b]).
func TestFloatScalar(t *testing.T) {
	for _, tc := range []struct{ a, b float64 }{{-2, 3}, {0.5, -1}, {4, 0.25}} {
		r, err := Float([]float64{tc.a}, []float64{tc.b}, 1, 1, nil)
		if err != nil {
			t.Fatal(err)
		}
		if want := tc.b * tc.b / (2 * math.Abs(tc.a)); math.Abs(r.GramianMin-want) > 1e-12*want {
			t.Errorf("a=%g b=%g: Gramian %g, want %g", tc.a, tc.b, r.GramianMin, want)
		}
		if math.Abs(r.Sigma-math.Abs(tc.b)) > 1e-12 {
			t.Errorf("a=%g b=%g: margin %g, want %g", tc.a, tc.b, r.Sigma, math.Abs(tc.b))
		}
	}
}

// kalmanRankDense is the rank of [B AB ... A^(n-1)B] by gonum's SVD with
// the usual tolerance max(dims)·σ_max·ε.
func kalmanRankDense(a, b []float64, n, m int) int {
	am := mat.NewDense(n, n, a)
	blk := mat.NewDense(n, m, append([]float64(nil), b...))
	k := mat.NewDense(n, n*m, nil)
	for i := 0; i < n; i++ {
		k.Slice(0, n, i*m, (i+1)*m).(*mat.Dense).Copy(blk)
		var next mat.Dense
		next.Mul(am, blk)
		blk = &next
	}
	var svd mat.SVD
	svd.Factorize(k, mat.SVDNone)
	s := svd.Values(nil)
	tol := float64(n*m) * s[0] * 1e-10
	r := 0
	for _, v := range s {
		if v > tol {
			r++
		}
	}
	return r
}

// The PBH (Hautus) test and the Kalman rank test agree: (A, B) is
// controllable iff rank [A - λI, B] = n at every eigenvalue λ iff
// rank [B AB ... A^(n-1)B] = n (Hautus 1969; Kailath, Linear Systems,
// Prentice Hall 1980, section on the PBH tests, section number from
// memory). Uncontrollable cases are built from a Kalman decomposition
// A = Q [[A11 A12], [0 A22]] Qᵀ, B = Q [B1; 0] with a random orthogonal Q.
func TestPBHAgreesWithKalman(t *testing.T) {
	rng := rand.New(rand.NewPCG(15, 16))
	agreeC, agreeU := 0, 0
	for c := 0; c < 300; c++ {
		n, m := 2+rng.IntN(6), 1+rng.IntN(2)
		a, b := randDense(rng, n, n), randDense(rng, n, m)
		uncontrollable := c%2 == 1
		if uncontrollable {
			k := 1 + rng.IntN(n-1) // size of the uncontrollable part
			for i := n - k; i < n; i++ {
				for j := 0; j < n-k; j++ {
					a[i*n+j] = 0
				}
				for j := 0; j < m; j++ {
					b[i*m+j] = 0
				}
			}
			var qr mat.QR
			qr.Factorize(mat.NewDense(n, n, randDense(rng, n, n)))
			var q mat.Dense
			qr.QTo(&q)
			var t1, t2, bq mat.Dense
			t1.Mul(&q, mat.NewDense(n, n, a))
			t2.Mul(&t1, q.T())
			bq.Mul(&q, mat.NewDense(n, m, b))
			a = t2.RawMatrix().Data
			b = bq.RawMatrix().Data
		}
		r, err := Float(a, b, n, m, nil)
		if err != nil {
			t.Fatal(err)
		}
		pbh := r.Margin > 1e-9
		kal := kalmanRankDense(a, b, n, m) == n
		if pbh != kal || pbh == uncontrollable {
			t.Fatalf("case %d (n=%d, built uncontrollable %v): PBH margin %g says %v, Kalman says %v",
				c, n, uncontrollable, r.Margin, pbh, kal)
		}
		if uncontrollable {
			agreeU++
			if r.GramianMin > 1e-9*r.GramianMax {
				t.Errorf("case %d: uncontrollable but Gramian min %g of max %g", c, r.GramianMin, r.GramianMax)
			}
		} else {
			agreeC++
		}
	}
	t.Logf("agree on %d controllable and %d uncontrollable systems", agreeC, agreeU)
}

// The modal bound ‖yᴴB‖/‖y‖ (left eigenvector y, gonum's Dtrevc3) is never
// below the smallest singular value at that eigenvalue (yᴴ[A - λI, B] =
// [0, yᴴB]; common practice), and a budget too small for every eigenvalue
// evaluates the weakest ones only and says so; the margin then can only be
// larger.
func TestModalBoundsAndBudget(t *testing.T) {
	rng := rand.New(rand.NewPCG(17, 18))
	for c := 0; c < 50; c++ {
		n, m := 20+rng.IntN(20), 1+rng.IntN(3)
		a, b := randDense(rng, n, n), randDense(rng, n, m)
		sf, err := newSchur(append([]float64(nil), a...), n)
		if err != nil {
			t.Fatal(err)
		}
		cm := mat.NewDense(n, m, nil)
		cm.Mul(mat.NewDense(n, n, sf.z).T(), mat.NewDense(n, m, b))
		lams, bound := modalBounds(sf, cm.RawMatrix().Data, m)
		for i, lam := range lams {
			if s := sigmaMinSVD(a, b, n, m, lam); s > bound[i]*(1+1e-9)+1e-12 {
				t.Fatalf("case %d: at %v singular value %g above the modal bound %g", c, lam, s, bound[i])
			}
		}
		all, err := Float(a, b, n, m, nil)
		if err != nil {
			t.Fatal(err)
		}
		part, err := Float(a, b, n, m, &FloatOptions{Flops: 1})
		if err != nil {
			t.Fatal(err)
		}
		if all.Evaluated != all.Eigenvalues || !math.IsInf(all.NextBound, 1) {
			t.Errorf("case %d: default budget evaluated %d of %d", c, all.Evaluated, all.Eigenvalues)
		}
		if part.Evaluated != min(minEvaluated, part.Eigenvalues) {
			t.Errorf("case %d: tiny budget evaluated %d", c, part.Evaluated)
		}
		if part.Evaluated < part.Eigenvalues && part.NextBound < 0 {
			t.Errorf("case %d: next bound %g", c, part.NextBound)
		}
		if part.Sigma < all.Sigma*(1-1e-9) {
			t.Errorf("case %d: partial margin %g below the full %g", c, part.Sigma, all.Sigma)
		}
	}
}
