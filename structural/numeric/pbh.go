package numeric

import (
	"math"

	"math/cmplx"
	"runtime"
	"sync"

	"gonum.org/v1/gonum/lapack"
)

// pbhMargin returns the smallest singular value of [A - λI, B] over the
// eigenvalues λ of A in lams, and the eigenvalue where it is smallest,
// given the Schur form A = Z·T·Zᵀ and c = ZᵀB (n×m, row-major). The
// singular values of [A - λI, B] are those of [T - λI, c]: an orthogonal
// change of state coordinates.
//
// For each λ the n×(n+m) matrix [T - λI, c] is brought to [U, 0] with U
// upper triangular by plane rotations acting on columns (its singular values
// are kept): first the few subdiagonal entries of the 2×2 blocks, then
// each column of c folded into U from the bottom row up, O(m·n²) in all.
// The smallest singular value of U is found by inverse iteration on UUᴴ
// (two triangular solves per step), started from a fixed pseudo-random
// vector; each estimate 1/‖U⁻¹x‖ (‖x‖ = 1) is an upper bound that
// decreases to it. Eigenvalues are shared among GOMAXPROCS workers.
func pbhMargin(s *schurForm, c []float64, m int, lams []complex128) (sigma float64, at complex128) {
	n := s.n
	sig := make([]float64, len(lams))
	workers := min(runtime.GOMAXPROCS(0), len(lams))
	var wg sync.WaitGroup
	var mu sync.Mutex
	nextI := 0
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			u := make([]complex128, n*n)
			col := make([]complex128, n)
			x := make([]complex128, n)
			for {
				mu.Lock()
				i := nextI
				nextI++
				mu.Unlock()
				if i >= len(lams) {
					return
				}
				sig[i] = sigmaMinAt(s, c, m, lams[i], u, col, x)
			}
		}()
	}
	wg.Wait()
	sigma = math.Inf(1)
	for i, v := range sig {
		if v < sigma {
			sigma, at = v, lams[i]
		}
	}
	return sigma, at
}

// pbhFlops estimates the floating-point operations of one eigenvalue in
// pbhMargin: 14 per entry pair for each of m column folds over n²/2
// pairs, and about 6 inverse-iteration steps of two triangular solves.
func pbhFlops(n, m int) float64 { return (7*float64(m) + 48) * float64(n) * float64(n) }

// modalBounds returns, for each eigenvalue of T with a nonnegative
// imaginary part, ‖yᴴc‖/‖y‖ with y its left eigenvector (Dtrevc3): since
// yᴴ[T - λI, c] = [0, yᴴc], this is an upper bound on the smallest singular
// value of [T - λI, c], the classical eigenvector form of the PBH test.
func modalBounds(s *schurForm, c []float64, m int) (lams []complex128, bound []float64) {
	n := s.n
	vl := make([]float64, n*n)
	work := make([]float64, 1)
	impl.Dtrevc3(lapack.EVLeft, lapack.EVAll, nil, n, s.t, n, vl, n, nil, 1, n, work, -1)
	work = make([]float64, max(int(work[0]), 3*n))
	impl.Dtrevc3(lapack.EVLeft, lapack.EVAll, nil, n, s.t, n, vl, n, nil, 1, n, work, len(work))
	proj := func(col int) (yc, yy float64) {
		for j := 0; j < m; j++ {
			var acc float64
			for i := 0; i < n; i++ {
				acc += vl[i*n+col] * c[i*m+j]
			}
			yc += acc * acc
		}
		for i := 0; i < n; i++ {
			yy += vl[i*n+col] * vl[i*n+col]
		}
		return yc, yy
	}
	for i := 0; i < n; i++ {
		switch {
		case s.wi[i] == 0:
			yc, yy := proj(i)
			lams = append(lams, complex(s.wr[i], 0))
			bound = append(bound, math.Sqrt(yc/yy))
		case s.wi[i] > 0:
			// Columns i and i+1 hold the real and imaginary parts; for real
			// c, ‖yᴴc‖² = ‖Re yᵀc‖² + ‖Im yᵀc‖² whichever sign convention.
			yc1, yy1 := proj(i)
			yc2, yy2 := proj(i + 1)
			lams = append(lams, complex(s.wr[i], s.wi[i]))
			bound = append(bound, math.Sqrt((yc1+yc2)/(yy1+yy2)))
		}
	}
	return lams, bound
}

// sigmaMinAt returns the smallest singular value of [T - λI, c]. u (n·n),
// col and x (n) are scratch space.
func sigmaMinAt(s *schurForm, c []float64, m int, lam complex128, u, col, x []complex128) float64 {
	n := s.n
	t := s.t
	// u is column-major: u[j*n+i] = U[i][j].
	for j := 0; j < n; j++ {
		cj := u[j*n : (j+1)*n]
		for i := range cj {
			cj[i] = 0
		}
		for i := 0; i <= min(j+1, n-1); i++ {
			cj[i] = complex(t[i*n+j], 0)
		}
		cj[j] -= lam
	}
	// Clear the subdiagonal: rotate columns k-1 and k so that U[k][k-1]
	// becomes zero, from the bottom row up.
	for k := n - 1; k >= 1; k-- {
		a, b := u[(k-1)*n:(k-1)*n+k+1], u[k*n:k*n+k+1]
		xv, yv := a[k], b[k]
		if xv == 0 {
			continue
		}
		r := math.Hypot(cmplx.Abs(xv), cmplx.Abs(yv))
		xv, yv = xv/complex(r, 0), yv/complex(r, 0)
		xc, yc := cmplx.Conj(xv), cmplx.Conj(yv)
		for i := range a {
			ai, bi := a[i], b[i]
			a[i] = yv*ai - xv*bi
			b[i] = xc*ai + yc*bi
		}
		a[k] = 0
	}
	// Fold each column of c into U from the bottom row up: rotating U's
	// column k with the input column zeroes the input's entry k.
	for j := 0; j < m; j++ {
		for i := 0; i < n; i++ {
			col[i] = complex(c[i*m+j], 0)
		}
		for k := n - 1; k >= 0; k-- {
			yv := col[k]
			if yv == 0 {
				continue
			}
			a := u[k*n : k*n+k+1]
			xv := a[k]
			r := math.Hypot(cmplx.Abs(xv), cmplx.Abs(yv))
			xv, yv = xv/complex(r, 0), yv/complex(r, 0)
			xc, yc := cmplx.Conj(xv), cmplx.Conj(yv)
			b := col[:k+1]
			for i := range a {
				ai, bi := a[i], b[i]
				a[i] = xc*ai + yc*bi
				b[i] = yv*ai - xv*bi
			}
			a[k] = complex(r, 0)
		}
	}
	return sigmaMinTri(u, n, x)
}

// sigmaMinTri returns the smallest singular value of the upper triangular
// column-major n×n matrix u by inverse iteration; x is scratch.
func sigmaMinTri(u []complex128, n int, x []complex128) float64 {
	for j := 0; j < n; j++ {
		if u[j*n+j] == 0 {
			return 0
		}
	}
	// A fixed pseudo-random start (a splitmix sequence) is not orthogonal
	// to the wanted singular vector except by accident.
	seed := uint64(0x9e3779b97f4a7c15)
	for i := range x {
		seed += 0x9e3779b97f4a7c15
		z := seed
		z = (z ^ z>>30) * 0xbf58476d1ce4e5b9
		z = (z ^ z>>27) * 0x94d049bb133111eb
		z ^= z >> 31
		x[i] = complex(float64(z>>11)/(1<<53)-0.5, float64(z&0xffff)/(1<<16)-0.5)
	}
	scaleTo1(x)
	est := math.Inf(1)
	for it := 0; it < maxInverseIterations; it++ {
		// x <- U⁻¹x
		for j := n - 1; j >= 0; j-- {
			cj := u[j*n : j*n+j+1]
			x[j] /= cj[j]
			xj := x[j]
			for i := 0; i < j; i++ {
				x[i] -= xj * cj[i]
			}
		}
		nrm := norm2(x)
		if math.IsInf(nrm, 0) || math.IsNaN(nrm) {
			return 0 // below 1e-300 of the matrix: zero for any purpose
		}
		next := 1 / nrm
		scaleTo1(x)
		// x <- U⁻ᴴx
		for i := 0; i < n; i++ {
			ci := u[i*n : i*n+i+1]
			var acc complex128
			for k := 0; k < i; k++ {
				acc += cmplx.Conj(ci[k]) * x[k]
			}
			x[i] = (x[i] - acc) / cmplx.Conj(ci[i])
		}
		if nrm := norm2(x); math.IsInf(nrm, 0) || math.IsNaN(nrm) {
			return 0
		}
		scaleTo1(x)
		if est-next <= inverseIterationTol*next {
			return next
		}
		est = next
	}
	return est
}

// Inverse iteration stops when an estimate improves on the last by less than
// this relative amount, or after maxInverseIterations steps.
const (
	inverseIterationTol  = 1e-9
	maxInverseIterations = 60
)

func norm2(x []complex128) float64 {
	var scale, ssq float64 = 0, 1
	for _, v := range x {
		for _, a := range [2]float64{real(v), imag(v)} {
			if a != 0 {
				a = math.Abs(a)
				if scale < a {
					ssq = 1 + ssq*(scale/a)*(scale/a)
					scale = a
				} else {
					ssq += (a / scale) * (a / scale)
				}
			}
		}
	}
	return scale * math.Sqrt(ssq)
}

func scaleTo1(x []complex128) {
	nrm := norm2(x)
	if nrm == 0 {
		return
	}
	inv := complex(1/nrm, 0)
	for i := range x {
		x[i] *= inv
	}
}
