package numeric

import (
	"math/big"
)

// quotient is the action of A on V/C over a prime field, where C is the
// controllable subspace (A-invariant) of a sample: the uncontrollable part
// of the Kalman decomposition, exactly.
//
// With the basis of C in reduced row echelon form (each row one at its
// pivot and zero at every other pivot), a vector x is congruent modulo C
// to x - Σ_i x[piv_i]·row_i, which is zero at the pivots; its values at the
// other positions ("free" positions) are the coordinates of x + C. So the
// unit vectors at the free positions are a basis of V/C, and column j of
// the quotient matrix is the reduction of A·e_free[j]: Ā = A_ff - Rᵀ·A_pf
// in blocks, where R holds the basis rows at the free positions.
type quotient struct {
	f    *Field
	n, k int
	free []int32 // the free positions, increasing: coordinates of V/C
	slot []int32 // per state: its index in free, or -(1 + basis row) at a pivot
	e    *echelon
	abar []uint64 // k×k, row-major
}

// newQuotient returns the quotient of the sample x of pattern p (Aᵀ with
// transpose) by the subspace kb spans. When the quotient is large (k at
// least r/2) the basis is brought to reduced row echelon form in place,
// O(r²·n), and the matrix follows in O(E·k); otherwise each column
// A·e_free[j] is reduced against the basis, O(k·r·n) in all. Memory
// O(n + k²) beyond the basis.
func newQuotient(p *Pattern, x *Exact, transpose bool, kb *krylovBasis) *quotient {
	n, f := p.N(), &x.F
	e := kb.echelon
	rr := len(e.rows)
	q := &quotient{f: f, n: n, slot: make([]int32, n), e: e}
	for i, pv := range e.piv {
		q.slot[pv] = -int32(i) - 1
	}
	for v := 0; v < n; v++ {
		if q.slot[v] >= 0 {
			q.slot[v] = int32(len(q.free))
			q.free = append(q.free, int32(v))
		}
	}
	k := len(q.free)
	q.k = k
	q.abar = make([]uint64, k*k)
	g := p.Out
	if useDirect(k, rr) {
		// Column j of Ā: the reduction of column free[j] of A (of Aᵀ: row
		// free[j] of A) at the free positions.
		var colPtr []int64
		var colRow []int32
		var colVal []uint64
		if transpose {
			colPtr, colRow, colVal = transposedColumns(p, x)
		}
		v := make([]uint64, n)
		for j, c := range q.free {
			for i := range v {
				v[i] = 0
			}
			if transpose {
				for t := colPtr[c]; t < colPtr[c+1]; t++ {
					v[colRow[t]] = f.Add(v[colRow[t]], colVal[t])
				}
			} else {
				for t := g.Ptr[c]; t < g.Ptr[c+1]; t++ {
					w := g.Adj[t]
					v[w] = f.Add(v[w], x.A[t])
				}
			}
			e.reduceRange(v, 0, rr)
			for i, fr := range q.free {
				q.abar[i*k+j] = v[fr]
			}
		}
		return q
	}
	// Back substitution: rows after j are already reduced, so reducing
	// row j against them clears its entries at their pivots.
	for j := rr - 2; j >= 0; j-- {
		e.reduceRange(e.rows[j], j+1, rr)
	}
	r := make([][]uint64, rr)
	for i, row := range e.rows {
		r[i] = make([]uint64, k)
		for j, v := range q.free {
			r[i][j] = row[v]
		}
	}
	for u := 0; u < n; u++ {
		for t := g.Ptr[u]; t < g.Ptr[u+1]; t++ {
			v := int(g.Adj[t])
			// Entry A[v][u] = x.A[t]: column u, row v of A; of Aᵀ, column
			// v, row u.
			col, row := u, v
			if transpose {
				col, row = v, u
			}
			jc := q.slot[col]
			if jc < 0 {
				continue
			}
			val := x.A[t]
			if val == 0 {
				continue
			}
			if ir := q.slot[row]; ir >= 0 {
				idx := int(ir)*k + int(jc)
				q.abar[idx] = f.Add(q.abar[idx], val)
			} else {
				ri := r[-ir-1]
				for i, rv := range ri {
					if rv != 0 {
						idx := i*k + int(jc)
						q.abar[idx] = f.Sub(q.abar[idx], f.Mul(val, rv))
					}
				}
			}
		}
	}
	return q
}

// useDirect chooses the column-reduction route for a quotient of
// dimension k by a basis of rr rows (a variable, so tests can force either
// route).
var useDirect = func(k, rr int) bool { return 2*k < rr }

// transposedColumns returns the columns of Aᵀ (the rows of A) in CSR
// form: column v lists the states u of the edges u -> v with A[v][u].
func transposedColumns(p *Pattern, x *Exact) ([]int64, []int32, []uint64) {
	g := p.Out
	n := g.Rows
	ptr := make([]int64, n+1)
	for _, v := range g.Adj {
		ptr[v+1]++
	}
	for v := 0; v < n; v++ {
		ptr[v+1] += ptr[v]
	}
	pos := append([]int64(nil), ptr[:n]...)
	rows := make([]int32, len(g.Adj))
	vals := make([]uint64, len(g.Adj))
	for u := 0; u < n; u++ {
		for t := g.Ptr[u]; t < g.Ptr[u+1]; t++ {
			v := g.Adj[t]
			rows[pos[v]], vals[pos[v]] = int32(u), x.A[t]
			pos[v]++
		}
	}
	return ptr, rows, vals
}

// lift maps a functional w̄ on V/C (k coordinates) to the functional w on
// V that vanishes on C: w is w̄ at the free positions, and wᵀrow_i = 0
// fixes w at the pivot of each basis row, solved from the last row up
// (row i is one at its pivot and zero at the earlier pivots). O(r·n).
func (q *quotient) lift(wbar []uint64) []uint64 {
	f, e := q.f, q.e
	w := make([]uint64, q.n)
	for j, v := range q.free {
		w[v] = wbar[j]
	}
	for i := len(e.rows) - 1; i >= 0; i-- {
		row, pv := e.rows[i], e.piv[i]
		var acc uint64
		for l, rv := range row {
			if rv != 0 && w[l] != 0 && int32(l) != pv {
				acc = f.Add(acc, f.Mul(rv, w[l]))
			}
		}
		w[pv] = f.Neg(acc)
	}
	return w
}

// charPoly returns the characteristic polynomial det(xI - M) of the k×k
// row-major matrix m over f, coefficients from the constant term up (the
// last is one). m is overwritten. The matrix is first brought to upper
// Hessenberg form by elementary similarity transformations (Gaussian
// elimination below the subdiagonal, with row and column swaps), then the
// polynomial follows from the Hessenberg recurrence (Cohen, A Course in
// Computational Algebraic Number Theory, Springer 1993, Algorithm 2.2.9,
// from memory). Time O(k³), no division other than by the pivots.
func charPoly(f *Field, m []uint64, k int) []uint64 {
	at := func(i, j int) *uint64 { return &m[i*k+j] }
	for c := 0; c+2 < k; c++ {
		// Find a nonzero entry below the subdiagonal in column c.
		piv := -1
		for i := c + 1; i < k; i++ {
			if *at(i, c) != 0 {
				piv = i
				break
			}
		}
		if piv < 0 {
			continue
		}
		if piv != c+1 {
			// Swap rows and columns piv and c+1 (a permutation similarity).
			for j := 0; j < k; j++ {
				*at(piv, j), *at(c+1, j) = *at(c+1, j), *at(piv, j)
			}
			for i := 0; i < k; i++ {
				*at(i, piv), *at(i, c+1) = *at(i, c+1), *at(i, piv)
			}
		}
		inv := f.Inv(*at(c+1, c))
		for i := c + 2; i < k; i++ {
			u := f.Mul(*at(i, c), inv)
			if u == 0 {
				continue
			}
			// row_i -= u·row_{c+1}; then column_{c+1} += u·column_i.
			ri, rp := m[i*k:(i+1)*k], m[(c+1)*k:(c+2)*k]
			for j := c; j < k; j++ {
				if rp[j] != 0 {
					ri[j] = f.Sub(ri[j], f.Mul(u, rp[j]))
				}
			}
			for r := 0; r < k; r++ {
				if v := *at(r, i); v != 0 {
					*at(r, c+1) = f.Add(*at(r, c+1), f.Mul(u, v))
				}
			}
		}
	}
	// Hessenberg recurrence: p_0 = 1; p_j = (x - h_jj) p_{j-1} -
	// Σ_{i<j} h_ij (Π_{l=i+1..j} h_{l,l-1}) p_{i-1} (1-based).
	polys := make([][]uint64, k+1)
	polys[0] = []uint64{f.One()}
	for j := 1; j <= k; j++ {
		pj := make([]uint64, j+1)
		prev := polys[j-1]
		hjj := *at(j-1, j-1)
		for d, c := range prev {
			pj[d+1] = f.Add(pj[d+1], c)
			pj[d] = f.Sub(pj[d], f.Mul(hjj, c))
		}
		prod := f.One()
		for i := j - 1; i >= 1; i-- {
			prod = f.Mul(prod, *at(i, i-1)) // h_{i+1,i} in 1-based terms
			if prod == 0 {
				break
			}
			coef := f.Mul(*at(i-1, j-1), prod)
			if coef == 0 {
				continue
			}
			for d, c := range polys[i-1] {
				pj[d] = f.Sub(pj[d], f.Mul(coef, c))
			}
		}
		polys[j] = pj
		polys[j-1] = prev
	}
	return polys[k]
}

// rootOrder returns how many times (x - c) divides poly over f.
func rootOrder(f *Field, poly []uint64, c uint64) int {
	p := append([]uint64(nil), poly...)
	order := 0
	for len(p) > 1 {
		// Synthetic division by (x - c): p = (x - c)·q + rem.
		q := make([]uint64, len(p)-1)
		acc := uint64(0)
		for d := len(p) - 1; d >= 1; d-- {
			acc = f.Add(p[d], f.Mul(acc, c))
			q[d-1] = acc
		}
		rem := f.Add(p[0], f.Mul(acc, c))
		if rem != 0 {
			break
		}
		order++
		p = q
	}
	return order
}

// quadOrder returns how many times x² - s·x + t divides poly over f.
func quadOrder(f *Field, poly []uint64, s, t uint64) int {
	p := append([]uint64(nil), poly...)
	order := 0
	for len(p) > 2 {
		// Long division by the monic x² - s x + t.
		q := make([]uint64, len(p)-2)
		r := append([]uint64(nil), p...)
		for d := len(r) - 1; d >= 2; d-- {
			c := r[d]
			q[d-2] = c
			if c == 0 {
				continue
			}
			r[d] = 0
			r[d-1] = f.Add(r[d-1], f.Mul(c, s))
			r[d-2] = f.Sub(r[d-2], f.Mul(c, t))
		}
		if r[0] != 0 || r[1] != 0 {
			break
		}
		order++
		p = q
	}
	return order
}

// leftNull returns a basis of {w : wᵀM = 0} for the k×k row-major m over
// f, by Gaussian elimination on Mᵀ. m is not modified. Time O(k³).
func leftNull(f *Field, m []uint64, k int) [][]uint64 {
	// a = Mᵀ, reduced to reduced row echelon form.
	a := make([]uint64, k*k)
	for i := 0; i < k; i++ {
		for j := 0; j < k; j++ {
			a[j*k+i] = m[i*k+j]
		}
	}
	pivCol := make([]int, 0, k)
	row := 0
	for c := 0; c < k && row < k; c++ {
		p := -1
		for i := row; i < k; i++ {
			if a[i*k+c] != 0 {
				p = i
				break
			}
		}
		if p < 0 {
			continue
		}
		if p != row {
			for j := 0; j < k; j++ {
				a[p*k+j], a[row*k+j] = a[row*k+j], a[p*k+j]
			}
		}
		inv := f.Inv(a[row*k+c])
		for j := c; j < k; j++ {
			a[row*k+j] = f.Mul(a[row*k+j], inv)
		}
		for i := 0; i < k; i++ {
			if i == row || a[i*k+c] == 0 {
				continue
			}
			u := a[i*k+c]
			for j := c; j < k; j++ {
				if a[row*k+j] != 0 {
					a[i*k+j] = f.Sub(a[i*k+j], f.Mul(u, a[row*k+j]))
				}
			}
		}
		pivCol = append(pivCol, c)
		row++
	}
	isPiv := make([]bool, k)
	for _, c := range pivCol {
		isPiv[c] = true
	}
	var basis [][]uint64
	for c := 0; c < k; c++ {
		if isPiv[c] {
			continue
		}
		w := make([]uint64, k)
		w[c] = f.One()
		for r, pc := range pivCol {
			w[pc] = f.Neg(a[r*k+c])
		}
		basis = append(basis, w)
	}
	return basis
}

// quadMatrix returns M² - s·M + t·I for the k×k row-major m over f.
func quadMatrix(f *Field, m []uint64, k int, s, t uint64) []uint64 {
	out := make([]uint64, k*k)
	for i := 0; i < k; i++ {
		for l := 0; l < k; l++ {
			mil := m[i*k+l]
			if mil == 0 {
				continue
			}
			for j := 0; j < k; j++ {
				if v := m[l*k+j]; v != 0 {
					out[i*k+j] = f.Add(out[i*k+j], f.Mul(mil, v))
				}
			}
		}
		for j := 0; j < k; j++ {
			out[i*k+j] = f.Sub(out[i*k+j], f.Mul(s, m[i*k+j]))
		}
		out[i*k+i] = f.Add(out[i*k+i], t)
	}
	return out
}

// shifted returns M - c·I.
func shifted(f *Field, m []uint64, k int, c uint64) []uint64 {
	out := append([]uint64(nil), m...)
	for i := 0; i < k; i++ {
		out[i*k+i] = f.Sub(out[i*k+i], c)
	}
	return out
}

// fromRat maps the rational x into f; ok is false when f's prime divides
// its denominator.
func fromRat(f *Field, x *big.Rat) (uint64, bool) {
	p := new(big.Int).SetUint64(f.P)
	num := new(big.Int).Mod(x.Num(), p)
	den := new(big.Int).Mod(x.Denom(), p)
	if den.Sign() == 0 {
		return 0, false
	}
	v := f.Mul(f.FromUint(num.Uint64()), f.Inv(f.FromUint(den.Uint64())))
	return v, true
}
