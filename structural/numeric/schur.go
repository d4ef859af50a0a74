package numeric

import (
	"math"

	"gonum.org/v1/gonum/lapack"
	"gonum.org/v1/gonum/lapack/gonum"
)

// schurForm is a real Schur decomposition A = Z·T·Zᵀ: T upper
// quasi-triangular with 1×1 and standardised 2×2 diagonal blocks (one per
// complex-conjugate pair of eigenvalues), Z orthogonal. Matrices are n×n,
// row-major.
type schurForm struct {
	n      int
	t, z   []float64
	wr, wi []float64 // eigenvalues; a pair has wi > 0 then wi < 0
}

var impl gonum.Implementation

// newSchur computes the real Schur form of the n×n row-major matrix a, which
// it overwrites: Householder reduction to Hessenberg form (Dgehrd, Dorghr),
// then the multishift QR algorithm (Dhseqr). No balancing: a diagonal
// similarity would change the singular values the margin measures.
func newSchur(a []float64, n int) (*schurForm, error) {
	// LAPACK gives no meaningful answer for non-finite entries (and the
	// block structure read from its eigenvalues would index out of range).
	// Entries so large that their squares overflow would too: the
	// Householder steps square them (an index out of range inside LAPACK).
	var ss float64
	for _, x := range a[:n*n] {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return nil, errorf("an entry of A is not a finite number")
		}
		ss += x * x
	}
	if math.IsInf(ss, 0) {
		return nil, errorf("the entries of A are too large for floating point (the sum of their squares overflows); scale the model's numbers")
	}
	s := &schurForm{n: n, wr: make([]float64, n), wi: make([]float64, n)}
	tau := make([]float64, n-1)
	work := make([]float64, 1)
	impl.Dgehrd(n, 0, n-1, a, n, tau, work, -1)
	lwork := max(int(work[0]), n)
	work = make([]float64, lwork)
	impl.Dgehrd(n, 0, n-1, a, n, tau, work, lwork)
	h := make([]float64, n*n)
	for i := 0; i < n; i++ {
		for j := max(i-1, 0); j < n; j++ {
			h[i*n+j] = a[i*n+j]
		}
	}
	impl.Dorghr(n, 0, n-1, a, n, tau, work, -1)
	if need := int(work[0]); need > len(work) {
		work = make([]float64, need)
	}
	impl.Dorghr(n, 0, n-1, a, n, tau, work, len(work))
	for _, x := range h {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return nil, errorf("the Hessenberg form of A overflowed; scale the model's numbers")
		}
	}
	impl.Dhseqr(lapack.EigenvaluesAndSchur, lapack.SchurOrig, n, 0, n-1, h, n, s.wr, s.wi, a, n, work, -1)
	if need := int(work[0]); need > len(work) {
		work = make([]float64, need)
	}
	if unconv := impl.Dhseqr(lapack.EigenvaluesAndSchur, lapack.SchurOrig, n, 0, n-1, h, n, s.wr, s.wi, a, n, work, len(work)); unconv != 0 {
		return nil, errorf("the QR algorithm did not converge for the eigenvalues of A")
	}
	s.t, s.z = h, a
	return s, nil
}

// blocks returns the start of each diagonal block of T and its size.
func (s *schurForm) blocks() (start, size []int) {
	n := s.n
	for i := 0; i < n; {
		b := 1
		if i+1 < n && s.t[(i+1)*n+i] != 0 {
			b = 2
		}
		start, size = append(start, i), append(size, b)
		i += b
	}
	return start, size
}
