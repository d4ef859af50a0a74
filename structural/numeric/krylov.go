package numeric

import "math/bits"

// Dimension returns the dimension of the controllable subspace
// span{B, AB, A²B, ...} of the sample x, computed exactly in x.F. With
// transpose set it returns that of (Aᵀ, B), which for B = Cᵀ (the pattern's
// signals being outputs) is the dimension of the observable subspace.
//
// The Krylov chains are grown one signal at a time: b, Ab, A²b, ... with
// sparse products on the CSR, each new vector reduced against an echelon
// basis of everything kept so far, until one falls in the span. At that
// point the span S is A-invariant: it held the earlier signals' chains,
// invariant by induction, plus b, ..., A^(k-1)b with A·A^(k-1)b = A^k b in
// S. An invariant subspace that holds b_1, ..., b_j holds their whole
// Krylov space, and S is made of Krylov vectors, so S is exactly
// K(A, [b_1 ... b_j]) and the next signal can start. The product is taken
// of the reduced vector rather than of A^k b itself: the two differ by an
// element of S, whose image under A stays in S, so the spans agree and no
// power of A is ever formed.
//
// Work: at most r + m sparse products of O(E) each and r + m reductions of
// O(r·n) each, with r the result and m the number of signals: O(r·(E + r·n))
// in all, r·n words of memory. progress, when not nil, is called with the
// dimension reached after each new basis vector.
func Dimension(p *Pattern, x *Exact, transpose bool, progress func(dim int)) int {
	return len(krylov(p, x, transpose, progress).rows)
}

// krylovBasis is the echelon basis of a controllable subspace, with the
// number of basis vectors each signal's chain contributed (0 for a signal
// already in the span of the earlier ones, and for the signals left once
// the span is everything).
type krylovBasis struct {
	*echelon
	chains []int
}

// krylov computes the basis of Dimension.
func krylov(p *Pattern, x *Exact, transpose bool, progress func(dim int)) *krylovBasis {
	n := p.N()
	f := &x.F
	e := newEchelon(f, n)
	kb := &krylovBasis{echelon: e, chains: make([]int, len(p.Signals))}
	mul := mulA
	if transpose {
		mul = mulAT
	}
	// Signals waiting their turn, reduced lazily: pend[i] has been reduced
	// against e.rows[:cur[i]]. Bringing a window of them up to date in one
	// pass over the basis reads each basis row once for all of them.
	var pend [][]uint64
	var cur, sig []int
	next := 0
	load := func() {
		for len(pend) < window && next < len(p.Signals) {
			v := make([]uint64, n)
			for i, st := range p.Signals[next] {
				v[st] = f.Add(v[st], x.B[next][i])
			}
			pend = append(pend, v)
			cur = append(cur, 0)
			sig = append(sig, next)
			next++
		}
	}
	batch := make([][]uint64, 0, maxBatch)
	zeros := make([]int, maxBatch)
	for {
		load()
		if len(pend) == 0 {
			break
		}
		e.reduceFrom(pend, cur)
		for i := range cur {
			cur[i] = len(e.rows)
		}
		v, j := pend[0], sig[0]
		pend, cur, sig = pend[1:], cur[1:], sig[1:]
		piv := firstNonzero(v)
		if piv < 0 {
			continue
		}
		last := e.add(v, piv)
		kb.chains[j]++
		if progress != nil {
			progress(len(e.rows))
		}
		if len(e.rows) == n {
			return kb
		}
		// Grow the chain in batches of raw products last·A, A²·last, ...,
		// doubling the batch while the chain lasts. A batch is reduced
		// against the basis in one pass, then its members against each
		// other in order; the first that falls in the span ends the chain
		// and the rest of the batch (further powers, in the span too) is
		// dropped.
		k := 1
		for alive := true; alive; {
			k = min(k, n-len(e.rows))
			batch = batch[:0]
			src := last
			for t := 0; t < k; t++ {
				w := make([]uint64, n)
				mul(p, x, src, w)
				batch = append(batch, w)
				src = w
			}
			old := len(e.rows)
			e.reduceFrom(batch, zeros[:k])
			for _, w := range batch {
				e.reduceRange(w, old, len(e.rows))
				piv := firstNonzero(w)
				if piv < 0 {
					alive = false
					break
				}
				e.add(w, piv)
				kb.chains[j]++
				if progress != nil {
					progress(len(e.rows))
				}
				if len(e.rows) == n {
					return kb
				}
			}
			last = batch[len(batch)-1]
			k = min(2*k, maxBatch)
		}
	}
	return kb
}

// window is the number of waiting signals reduced together; maxBatch the
// longest batch of chain products.
const (
	window   = 16
	maxBatch = 32
)

func firstNonzero(v []uint64) int {
	for i, x := range v {
		if x != 0 {
			return i
		}
	}
	return -1
}

// mulA sets y = A·x: y[v] = sum over u -> v of A[v][u]·x[u]. y must be zero.
func mulA(p *Pattern, s *Exact, x, y []uint64) {
	g, f := p.Out, &s.F
	for u, xu := range x {
		if xu == 0 {
			continue
		}
		for k := g.Ptr[u]; k < g.Ptr[u+1]; k++ {
			v := g.Adj[k]
			y[v] = f.Add(y[v], f.Mul(s.A[k], xu))
		}
	}
}

// mulAT sets y = Aᵀ·x: y[u] = sum over u -> v of A[v][u]·x[v].
func mulAT(p *Pattern, s *Exact, x, y []uint64) {
	g, f := p.Out, &s.F
	for u := range y {
		var acc uint64
		for k := g.Ptr[u]; k < g.Ptr[u+1]; k++ {
			if xv := x[g.Adj[k]]; xv != 0 {
				acc = f.Add(acc, f.Mul(s.A[k], xv))
			}
		}
		y[u] = acc
	}
}

// group is the number of basis rows whose updates are summed before one
// reduction: 8 products of elements below 2^61 stay below p·2^64.
const group = 8

// echelon is a basis in echelon form: rows[i][piv[i]] is one and rows[i] is
// zero at the pivots of all earlier rows. Reducing a vector against the rows
// in order therefore clears each pivot for good.
type echelon struct {
	f    *Field
	n    int
	rows [][]uint64
	piv  []int32
}

func newEchelon(f *Field, n int) *echelon { return &echelon{f: f, n: n} }

// reduceFrom reduces each vs[i] against the rows e.rows[from[i]:], leaving
// it zero at every pivot. It walks the basis once for all the vectors.
//
// Rows are taken in groups of eight. Within a group the coefficients are
// found first, touching only the group's pivot positions (the coefficient
// of a row is v at its pivot after the earlier rows of the group are
// subtracted); then the whole vector is updated once, summing the eight
// products in 128 bits and reducing once per entry.
func (e *echelon) reduceFrom(vs [][]uint64, from []int) {
	lo := len(e.rows)
	for _, c := range from {
		lo = min(lo, c)
	}
	for start := lo; start < len(e.rows); start += group {
		end := min(start+group, len(e.rows))
		for i, v := range vs {
			if from[i] <= start {
				e.reduceGroup(v, start, end)
			} else if from[i] < end {
				e.reduceGroup(v, from[i], end)
			}
		}
	}
}

// reduceRange reduces v against e.rows[lo:hi].
func (e *echelon) reduceRange(v []uint64, lo, hi int) {
	for start := lo; start < hi; start += group {
		e.reduceGroup(v, start, min(start+group, hi))
	}
}

// reduceGroup reduces v against e.rows[start:end], end-start <= group.
func (e *echelon) reduceGroup(v []uint64, start, end int) {
	f := e.f
	var coef [group]uint64
	var rows [group][]uint64
	k := 0
	for i := start; i < end; i++ {
		pi := e.piv[i]
		c := v[pi]
		for t := 0; t < k; t++ {
			c = f.Sub(c, f.Mul(coef[t], rows[t][pi]))
		}
		if c != 0 {
			coef[k], rows[k] = c, e.rows[i]
			k++
		}
	}
	if k > 0 {
		subRows(f, v, coef[:k], rows[:k])
	}
}

// subRows sets v -= sum_t coef[t]·rows[t], len(coef) <= group.
func subRows(f *Field, v []uint64, coef []uint64, rows [][]uint64) {
	switch len(coef) {
	case group:
		sub8(f, v, (*[group]uint64)(coef), (*[group][]uint64)(rows))
		return
	case 1:
		c, r := coef[0], rows[0][:len(v)]
		for j, x := range r {
			if x != 0 {
				v[j] = f.Sub(v[j], f.Mul(c, x))
			}
		}
		return
	}
	for j := range v {
		var hi, lo uint64
		for t, c := range coef {
			h, l := bits.Mul64(c, rows[t][j])
			var carry uint64
			lo, carry = bits.Add64(lo, l, 0)
			hi += h + carry
		}
		if hi|lo != 0 {
			v[j] = f.Sub(v[j], f.redc(hi, lo))
		}
	}
}

// sub8 is subRows for a full group, unrolled: the hot loop of the exact
// check.
func sub8(f *Field, v []uint64, c *[group]uint64, r *[group][]uint64) {
	n := len(v)
	r0, r1, r2, r3 := r[0][:n], r[1][:n], r[2][:n], r[3][:n]
	r4, r5, r6, r7 := r[4][:n], r[5][:n], r[6][:n], r[7][:n]
	c0, c1, c2, c3, c4, c5, c6, c7 := c[0], c[1], c[2], c[3], c[4], c[5], c[6], c[7]
	p, pinv := f.P, f.pinv
	for j := range v {
		h0, l0 := bits.Mul64(c0, r0[j])
		h1, l1 := bits.Mul64(c1, r1[j])
		h2, l2 := bits.Mul64(c2, r2[j])
		h3, l3 := bits.Mul64(c3, r3[j])
		lo, k0 := bits.Add64(l0, l1, 0)
		lo2, k1 := bits.Add64(l2, l3, 0)
		hiA := h0 + h1 + h2 + h3 + k0 + k1
		lo, k0 = bits.Add64(lo, lo2, 0)
		hiA += k0
		h4, l4 := bits.Mul64(c4, r4[j])
		h5, l5 := bits.Mul64(c5, r5[j])
		h6, l6 := bits.Mul64(c6, r6[j])
		h7, l7 := bits.Mul64(c7, r7[j])
		lo3, k2 := bits.Add64(l4, l5, 0)
		lo4, k3 := bits.Add64(l6, l7, 0)
		hiB := h4 + h5 + h6 + h7 + k2 + k3
		lo3, k2 = bits.Add64(lo3, lo4, 0)
		hiB += k2
		lo, k0 = bits.Add64(lo, lo3, 0)
		hi := hiA + hiB + k0
		// Montgomery reduction of hi·2^64+lo < p·2^64, then v[j] -= it.
		m := lo * pinv
		mh, _ := bits.Mul64(m, p)
		t := hi - mh
		if hi < mh {
			t += p
		}
		x := v[j] - t
		if v[j] < t {
			x += p
		}
		v[j] = x
	}
}

// add normalises v (pivot at piv) to a unit pivot, stores it and returns
// the stored row.
func (e *echelon) add(v []uint64, piv int) []uint64 {
	f := e.f
	inv := f.Inv(v[piv])
	for j, x := range v {
		if x != 0 {
			v[j] = f.Mul(x, inv)
		}
	}
	e.rows = append(e.rows, v)
	e.piv = append(e.piv, int32(piv))
	return v
}
