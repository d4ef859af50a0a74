package numeric

import (
	"math"

	"gonum.org/v1/gonum/mat"
)

// lyapunov solves T·X + X·Tᵀ + Q = 0 for X, with T upper quasi-triangular
// (row-major n×n, 2×2 blocks as in a real Schur form) and Q symmetric: the
// Bartels–Stewart method (Bartels & Stewart, CACM 15(9):820, 1972) with the
// Schur form already at hand. X is found one block column at a time from
// the last: with the later columns known, block column J solves the
// quasi-triangular Sylvester equation T·Y + Y·T_JJᵀ = -Q_J - Σ_{l>J} X_l·T_Jlᵀ,
// itself by block back substitution, each 1×1 to 2×2 piece by LAPACK's
// Dlasy2. O(n³) time. It fails when T_II and -T_JJ share an eigenvalue,
// which a stable T rules out.
func lyapunov(t, q []float64, n int, start, size []int) ([]float64, error) {
	x := make([]float64, n*n)
	var rhs, y []float64
	var piece [4]float64
	var sol [4]float64
	for jb := len(start) - 1; jb >= 0; jb-- {
		j0, bj := start[jb], size[jb]
		jEnd := j0 + bj
		rhs = append(rhs[:0], make([]float64, n*bj)...)
		for i := 0; i < n; i++ {
			xi := x[i*n+jEnd : i*n+n]
			for jj := 0; jj < bj; jj++ {
				tj := t[(j0+jj)*n+jEnd : (j0+jj)*n+n]
				var acc float64
				for l, v := range xi {
					acc += v * tj[l]
				}
				rhs[i*bj+jj] = -q[i*n+j0+jj] - acc
			}
		}
		y = append(y[:0], make([]float64, n*bj)...)
		for ib := len(start) - 1; ib >= 0; ib-- {
			i0, bi := start[ib], size[ib]
			iEnd := i0 + bi
			for ii := 0; ii < bi; ii++ {
				ti := t[(i0+ii)*n+iEnd : (i0+ii)*n+n]
				for jj := 0; jj < bj; jj++ {
					acc := rhs[(i0+ii)*bj+jj]
					for k, v := range ti {
						acc -= v * y[(iEnd+k)*bj+jj]
					}
					piece[ii*bj+jj] = acc
				}
			}
			scale, _, ok := impl.Dlasy2(false, true, 1, bi, bj, t[i0*n+i0:], n, t[j0*n+j0:], n, piece[:], bj, sol[:], bj)
			if !ok || scale != 1 {
				return nil, errorf("Lyapunov equation nearly singular (the shifted matrix is not stable enough)")
			}
			for ii := 0; ii < bi; ii++ {
				for jj := 0; jj < bj; jj++ {
					y[(i0+ii)*bj+jj] = sol[ii*bj+jj]
				}
			}
		}
		for i := 0; i < n; i++ {
			for jj := 0; jj < bj; jj++ {
				x[i*n+j0+jj] = y[i*bj+jj]
			}
		}
	}
	return x, nil
}

// gramianExtremes returns the smallest and largest eigenvalues of the
// controllability Gramian W of (A - sI, B), the solution of
// (A - sI)W + W(A - sI)ᵀ + BBᵀ = 0, from the Schur form A = Z·T·Zᵀ and
// c = ZᵀB: in Schur coordinates X = ZᵀWZ solves the same equation with T,
// and has the same eigenvalues. s must exceed the largest real part of the
// eigenvalues of A.
func gramianExtremes(sf *schurForm, c []float64, m int, s float64) (lo, hi float64, err error) {
	n := sf.n
	ts := append([]float64(nil), sf.t...)
	for i := 0; i < n; i++ {
		ts[i*n+i] -= s
	}
	q := make([]float64, n*n)
	for i := 0; i < n; i++ {
		ci := c[i*m : (i+1)*m]
		for k := 0; k <= i; k++ {
			ck := c[k*m : (k+1)*m]
			var acc float64
			for j, v := range ci {
				acc += v * ck[j]
			}
			q[i*n+k], q[k*n+i] = acc, acc
		}
	}
	start, size := sf.blocks()
	x, err := lyapunov(ts, q, n, start, size)
	if err != nil {
		return 0, 0, err
	}
	for i := 0; i < n; i++ {
		for k := 0; k < i; k++ {
			v := (x[i*n+k] + x[k*n+i]) / 2
			x[i*n+k], x[k*n+i] = v, v
		}
	}
	var big float64
	for _, v := range x {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return 0, 0, errorf("the Gramian is beyond floating point (an entry overflowed); scale the model's numbers")
		}
		big = math.Max(big, math.Abs(v))
	}
	if big == 0 {
		return 0, 0, nil
	}
	// The eigen solver is given the Gramian scaled by a power of two
	// (exact) to entries of at most 1: its own scaling fails on extreme
	// magnitudes, as the Gramians of models with huge numbers have.
	_, e2 := math.Frexp(big)
	for i := range x {
		x[i] = math.Ldexp(x[i], -e2)
	}
	var es mat.EigenSym
	if !es.Factorize(mat.NewSymDense(n, x), false) {
		return 0, 0, errorf("symmetric eigenvalue solver failed on the Gramian")
	}
	vals := es.Values(nil)
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, v := range vals {
		lo, hi = math.Min(lo, v), math.Max(hi, v)
	}
	return math.Ldexp(lo, e2), math.Ldexp(hi, e2), nil
}
