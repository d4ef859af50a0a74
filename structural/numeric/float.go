package numeric

import (
	"math"
	"sort"

	"gonum.org/v1/gonum/mat"
)

// FloatResult is the floating-point check of one sample (A, B).
type FloatResult struct {
	// Margin is Sigma relative to the size of the data, Sigma / Scale.
	Margin float64
	// Sigma is the smallest singular value of [A - λI, B] over the
	// eigenvalues λ of A, and At the eigenvalue where it is attained
	// (either of a conjugate pair). By the Eckart–Young theorem a
	// perturbation [ΔA ΔB] of 2-norm Sigma makes At an uncontrollable
	// eigenvalue; Sigma is thus an upper bound on the distance to
	// uncontrollability (Eising 1984), which minimises over every complex
	// λ, not only the eigenvalues.
	Sigma float64
	At    complex128
	// Scale is the Frobenius norm of [A B].
	Scale float64
	// Eigenvalues is the number of eigenvalues of A counting a conjugate
	// pair once, and Evaluated how many of them entered Sigma. When the
	// work for all would exceed the budget (FloatOptions.Flops), the
	// eigenvalues are taken in increasing order of their modal bound
	// ‖yᴴB‖/‖y‖ (y a left eigenvector), an upper bound on the singular
	// value at that eigenvalue; NextBound is the smallest modal bound
	// among those left out (+Inf when none is).
	Eigenvalues, Evaluated int
	NextBound              float64
	// Shift is the s of the Gramian: the largest real part of the
	// eigenvalues of A plus ‖A‖_F/√n (1 when A is zero), so that A - sI
	// is stable with its rightmost eigenvalue at distance ‖A‖_F/√n (an RMS
	// row size, which keeps the choice scale-free) left of the axis.
	Shift float64
	// GramianMin and GramianMax are the extreme eigenvalues of the
	// controllability Gramian W of (A - sI, B), the solution of
	// (A - sI)W + W(A - sI)ᵀ + BBᵀ = 0. W is positive definite exactly
	// when the sample is controllable; 1/GramianMin is the least input
	// energy that steers the shifted system to the hardest unit state.
	GramianMin, GramianMax float64
}

// RoundingLevel returns the relative margin below which a sample of n
// states cannot be told from an uncontrollable one in float64: 100·n·ε,
// a generous multiple of the backward error of the Schur decomposition and
// the rotations (about n·ε·‖A‖ for Householder and Givens sweeps; Golub &
// Van Loan, Matrix Computations, 4th ed., §5.1 and §7.5, from memory).
func RoundingLevel(n int) float64 { return 100 * float64(n) * 0x1p-52 }

// FloatOptions tune Float.
type FloatOptions struct {
	// Flops bounds the estimated work of the margin (0: DefaultFlops). The
	// margin is evaluated at every eigenvalue when that fits, else at the
	// ones with the smallest modal bounds, at least minEvaluated of them.
	Flops float64
}

// DefaultFlops is the default work budget of the margin, about ten
// seconds of one core.
const DefaultFlops = 1e10

// minEvaluated is the fewest eigenvalues the margin looks at.
const minEvaluated = 16

func (o *FloatOptions) flops() float64 {
	if o == nil || o.Flops <= 0 {
		return DefaultFlops
	}
	return o.Flops
}

// Float runs the floating-point check of the system (A, B), given as dense
// row-major matrices: a is n×n, b is n×m. Neither is modified; opt may be
// nil. Time is O(n³) for the Schur form, the left eigenvectors and the
// Gramian, plus O(m·n²) per eigenvalue for the margin within the budget;
// memory O(n²) per worker.
func Float(a, b []float64, n, m int, opt *FloatOptions) (*FloatResult, error) {
	r, _, _, err := floatCheck(a, b, n, m, opt)
	return r, err
}

// floatCheck is Float, returning also the Schur form of A and c = ZᵀB
// (n×m) for further work on the same system.
func floatCheck(a, b []float64, n, m int, opt *FloatOptions) (*FloatResult, *schurForm, []float64, error) {
	if n == 0 {
		return nil, nil, nil, errorf("empty system")
	}
	r := &FloatResult{}
	var fa, fb float64
	for _, v := range a {
		fa += v * v
	}
	for _, v := range b {
		fb += v * v
	}
	r.Scale = math.Sqrt(fa + fb)
	if r.Scale == 0 {
		return nil, nil, nil, errorf("A and B are both zero")
	}
	sf, err := newSchur(append([]float64(nil), a...), n)
	if err != nil {
		return nil, nil, nil, err
	}
	// c = ZᵀB, n×m.
	c := make([]float64, n*m)
	if m > 0 {
		zt := mat.NewDense(n, n, sf.z)
		cm := mat.NewDense(n, m, c)
		cm.Mul(zt.T(), mat.NewDense(n, m, append([]float64(nil), b...)))
	}
	cc, mc := compressColumns(c, n, m)
	r.NextBound = math.Inf(1)
	if mc == 0 {
		r.Sigma = 0
	} else {
		lams, bound := modalBounds(sf, cc, mc)
		r.Eigenvalues = len(lams)
		k := len(lams)
		if budget := opt.flops(); float64(k)*pbhFlops(n, mc) > budget {
			k = max(minEvaluated, int(budget/pbhFlops(n, mc)))
			k = min(k, len(lams))
		}
		if k < len(lams) {
			idx := make([]int, len(lams))
			for i := range idx {
				idx[i] = i
			}
			sort.SliceStable(idx, func(a, b int) bool { return bound[idx[a]] < bound[idx[b]] })
			sel := make([]complex128, k)
			for i := range sel {
				sel[i] = lams[idx[i]]
			}
			r.NextBound = bound[idx[k]]
			lams = sel
		}
		r.Evaluated = k
		r.Sigma, r.At = pbhMargin(sf, cc, mc, lams)
	}
	r.Margin = r.Sigma / r.Scale
	alpha := math.Inf(-1)
	for _, v := range sf.wr {
		alpha = math.Max(alpha, v)
	}
	delta := math.Sqrt(fa / float64(n))
	if delta == 0 {
		delta = 1
	}
	r.Shift = alpha + delta
	if m > 0 {
		r.GramianMin, r.GramianMax, err = gramianExtremes(sf, c, m, r.Shift)
		if err != nil {
			return nil, nil, nil, err
		}
	}
	return r, sf, c, nil
}

// compressColumns replaces the n×m matrix c by an n×k matrix d with
// d·dᵀ = c·cᵀ and k = min(m, n): the margin depends on c only through
// c·cᵀ, and the cost grows with the number of columns. For m > n it uses
// the QR factorisation cᵀ = QR, c·cᵀ = RᵀR, d = Rᵀ.
func compressColumns(c []float64, n, m int) ([]float64, int) {
	if m <= n {
		return c, m
	}
	ct := mat.DenseCopyOf(mat.NewDense(n, m, c).T()) // m×n
	var qr mat.QR
	qr.Factorize(ct)
	var rr mat.Dense
	qr.RTo(&rr) // m×n, upper triangular in its top n rows
	d := make([]float64, n*n)
	for i := 0; i < n; i++ {
		for k := 0; k < n; k++ {
			d[i*n+k] = rr.At(k, i)
		}
	}
	return d, n
}
