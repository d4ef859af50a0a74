package target

import (
	"math/rand/v2"

	"github.com/netsteer/netsteer/structural/numeric"
)

// rankSample returns the rank over GF(f.P) of C·K = C[B, AB, ..., A^(n-1)B]
// for one sample of the part p: every edge and every signal entry drawn
// uniformly from the nonzero elements of the field (numeric.DrawExact),
// C selecting the reached targets. It stops as soon as the rank reaches
// stop.
//
// The Krylov chains b, Ab, A²b, ... of one signal after another are reduced
// against an echelon basis of everything kept so far, as in
// numeric.Dimension: a chain ends when its next vector falls in the span,
// which is then A-invariant. Each kept vector is also projected on the
// targets and reduced against a second basis of |T| entries. A kept
// vector differs from the raw Krylov vector A^k·b by an element of the
// span S of the vectors kept before it, and the projections of S lie in the
// span of the projections kept before, so the second basis spans the
// column space of C·K exactly.
//
// Work: r sparse products of O(E) and r reductions of O(r·n) for a
// Krylov space of dimension r <= n on the n states of the part, plus
// r·|T|² for the projections; r·(n + |T|) words of memory.
func rankSample(p *part, f numeric.Field, rng *rand.Rand, stop int) int {
	n, nt := p.n, len(p.targets)
	if n == 0 || nt == 0 || stop <= 0 {
		return 0
	}
	pat := &numeric.Pattern{Out: &p.out, Signals: p.signals}
	x := numeric.DrawExact(pat, f, rng)
	full := &echelon{f: &x.F}
	proj := &echelon{f: &x.F}
	for i, s := range p.signals {
		v := make([]uint64, n)
		for j, st := range s {
			v[st] = x.F.Add(v[st], x.B[i][j])
		}
		for {
			piv := full.reduce(v)
			if piv < 0 {
				break
			}
			full.add(v, piv)
			pr := make([]uint64, nt)
			for j, t := range p.targets {
				pr[j] = v[t]
			}
			if q := proj.reduce(pr); q >= 0 {
				proj.add(pr, q)
				if len(proj.rows) >= stop || len(proj.rows) == nt {
					return len(proj.rows)
				}
			}
			if len(full.rows) == n {
				return len(proj.rows)
			}
			w := make([]uint64, n)
			mulA(p, x, v, w)
			v = w
		}
	}
	return len(proj.rows)
}

// mulA sets y = A·v on the part: y[w] = sum over u -> w of A[w][u]·v[u].
// y must be zero.
func mulA(p *part, x *numeric.Exact, v, y []uint64) {
	f := &x.F
	for u, vu := range v {
		if vu == 0 {
			continue
		}
		for k := p.out.Ptr[u]; k < p.out.Ptr[u+1]; k++ {
			w := p.out.Adj[k]
			y[w] = f.Add(y[w], f.Mul(x.A[k], vu))
		}
	}
}

// echelon is a basis in row echelon form over a prime field: rows[i] is
// zero before its pivot piv[i], one at it, and zero at the pivots of all
// earlier rows, so reducing a vector against the rows in order clears each
// pivot for good.
type echelon struct {
	f    *numeric.Field
	rows [][]uint64
	piv  []int32
}

// reduce subtracts from v its components along the rows and returns the
// position of its first nonzero entry, or -1 when v is in their span.
func (e *echelon) reduce(v []uint64) int {
	f := e.f
	for i, r := range e.rows {
		pi := e.piv[i]
		c := v[pi]
		if c == 0 {
			continue
		}
		for j := int(pi); j < len(r); j++ {
			if y := r[j]; y != 0 {
				v[j] = f.Sub(v[j], f.Mul(c, y))
			}
		}
	}
	for j, y := range v {
		if y != 0 {
			return j
		}
	}
	return -1
}

// add scales v to a unit pivot at piv and keeps it.
func (e *echelon) add(v []uint64, piv int) {
	f := e.f
	inv := f.Inv(v[piv])
	for j := piv; j < len(v); j++ {
		if v[j] != 0 {
			v[j] = f.Mul(v[j], inv)
		}
	}
	e.rows = append(e.rows, v)
	e.piv = append(e.piv, int32(piv))
}

// rankProve returns the rank over GF(f.P) of the columns C·A^k·B,
// k < L, of one sample, taken depth by depth (every signal at depth k
// before any at depth k+1) and stopping once the rank reaches stop (or the
// number of targets) or the work passes budget field operations; it also
// returns the work done. They are columns of C·K, so the rank is a lower
// bound on the sample's rank of C·K, and so on the generic rank: a result
// of |T| proves the targets steered. complete reports that the work limit
// did not stop it: then the stop was reached or, for L = |H|, the rank is
// the sample's rank of C·K itself (Cayley–Hamilton on the part). Without
// the echelon basis of the whole Krylov space that rankSample keeps, a
// vector costs one sparse product and one reduction of |T| entries, which
// makes this the cheap way to prove a design that works.
func rankProve(p *part, f numeric.Field, rng *rand.Rand, L, stop int, budget int64) (rank int, ops int64, complete bool) {
	n, nt, m := p.n, len(p.targets), len(p.signals)
	if n == 0 || nt == 0 || m == 0 {
		return 0, 0, true
	}
	pat := &numeric.Pattern{Out: &p.out, Signals: p.signals}
	x := numeric.DrawExact(pat, f, rng)
	proj := &echelon{f: &x.F}
	vs := make([][]uint64, m)
	for i, s := range p.signals {
		vs[i] = make([]uint64, n)
		for j, st := range s {
			vs[i][st] = x.F.Add(vs[i][st], x.B[i][j])
		}
	}
	pr := make([]uint64, nt)
	for k := 0; k < L; k++ {
		for i, v := range vs {
			if ops > budget {
				return len(proj.rows), ops, false
			}
			if k > 0 {
				w := make([]uint64, n)
				mulA(p, x, v, w)
				vs[i], v = w, w
				ops += int64(n + p.edges)
			}
			for j, t := range p.targets {
				pr[j] = v[t]
			}
			ops += int64(len(proj.rows)) * int64(nt)
			if q := proj.reduce(pr); q >= 0 {
				proj.add(pr, q)
				if len(proj.rows) >= min(stop, nt) {
					return len(proj.rows), ops, true
				}
				pr = make([]uint64, nt)
			}
		}
	}
	return len(proj.rows), ops, true
}
