package strong

import (
	"math"
	"math/big"
	"math/bits"
	"math/rand/v2"
	"testing"

	"github.com/netsteer/netsteer/structural"
)

// This file is the independent route the strong answers are checked
// against: patterns written as dense matrices of kinds, realisations with
// small integer values, and the Kalman rank of [B AB ... A^(n-1)B] in
// exact integer arithmetic (fraction-free elimination; int64 with overflow
// detection, math/big when a product would overflow). It shares no code
// with the package: no colouring, no forts, no witness construction.

// pat is a pattern of at most 4 states: a[v][u] is the kind of A[v][u]
// (edge u -> v), the diagonal included; sig are the signals (the columns
// of B, each the states it touches, its entries nonzero).
type pat struct {
	n   int
	a   [4][4]Kind
	sig [][]int32
}

// network returns the network and class that stand for p with the given
// diagonal class, or false when p cannot be written with it (a zero
// diagonal needs ZeroDiagonal; an unlisted diagonal takes the class's
// kind, a listed one is Nonzero or marked Arbitrary).
func (p pat) network(t testing.TB, d Diagonal) (*structural.Network, Class, bool) {
	b := structural.NewIntBuilder(p.n, 0)
	var marked []structural.Edge
	for v := 0; v < p.n; v++ {
		for u := 0; u < p.n; u++ {
			k := p.a[v][u]
			if u == v {
				if k == Zero && d != ZeroDiagonal {
					return nil, Class{}, false
				}
				if k == d.kind() {
					continue // unlisted
				}
			}
			if k == Zero {
				continue
			}
			b.AddEdge(int32(u), int32(v))
			if k == Arbitrary {
				marked = append(marked, structural.Edge{From: int32(u), To: int32(v)})
			}
		}
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	c := Class{Diagonal: d}
	if len(marked) > 0 {
		m, err := Marks(g, marked)
		if err != nil {
			t.Fatal(err)
		}
		c.MayBeZero = m
	}
	return g, c, true
}

// values are the integers a realisation tries: zero first for arbitrary
// entries (cheap counterexamples come early).
var (
	nonzeroValues   = []int64{1, -1, 2}
	arbitraryValues = []int64{0, 1, -1}
)

// slot is one entry of a realisation: A[row][col] (or B[row][col] when
// b is set) taking the values vals.
type slot struct {
	row, col int
	b        bool
	vals     []int64
}

// slots lists the free entries of p. Dedicated signals need none: scaling
// a column of B does not change the rank, so their entry is 1. Signals on
// several states take grid values on every entry.
func (p pat) slots() []slot {
	var s []slot
	for v := 0; v < p.n; v++ {
		for u := 0; u < p.n; u++ {
			switch p.a[v][u] {
			case Nonzero:
				s = append(s, slot{v, u, false, nonzeroValues})
			case Arbitrary:
				s = append(s, slot{v, u, false, arbitraryValues})
			}
		}
	}
	for i, sg := range p.sig {
		if len(sg) == 1 {
			continue
		}
		for _, v := range sg {
			s = append(s, slot{int(v), i, true, nonzeroValues})
		}
	}
	return s
}

// realisation is a concrete (A, B).
type realisation struct {
	n int
	a [4][4]int64
	b [][4]int64 // b[i] is column i
}

func (p pat) base() realisation {
	r := realisation{n: p.n, b: make([][4]int64, len(p.sig))}
	for i, sg := range p.sig {
		for _, v := range sg {
			r.b[i][v] = 1
		}
	}
	return r
}

func (r *realisation) set(s slot, x int64) {
	if s.b {
		r.b[s.col][s.row] = x
	} else {
		r.a[s.row][s.col] = x
	}
}

// controllable reports whether rank [B AB ... A^(n-1)B] = n, exactly. With
// obs it judges (A^T, B) instead: observability of (A, B^T).
func (r *realisation) controllable(obs bool) bool {
	var m kalman
	return r.controllableIn(obs, &m)
}

// controllableIn is controllable with a scratch matrix (every entry it
// reads is written first).
func (r *realisation) controllableIn(obs bool, m *kalman) bool {
	n := r.n
	a := &r.a
	if obs {
		var t [4][4]int64
		for i := 0; i < n; i++ {
			for j := 0; j < n; j++ {
				t[i][j] = r.a[j][i]
			}
		}
		a = &t
	}
	if n == 3 && len(r.b) == 1 {
		// One signal on three states: the Kalman matrix is square;
		// controllable exactly when its determinant is not zero (entries
		// below 100 here, so the products cannot overflow).
		b := r.b[0]
		var ab, aab [3]int64
		for i := 0; i < 3; i++ {
			for j := 0; j < 3; j++ {
				ab[i] += a[i][j] * b[j]
			}
		}
		for i := 0; i < 3; i++ {
			for j := 0; j < 3; j++ {
				aab[i] += a[i][j] * ab[j]
			}
		}
		det := b[0]*(ab[1]*aab[2]-ab[2]*aab[1]) - ab[0]*(b[1]*aab[2]-b[2]*aab[1]) + aab[0]*(b[1]*ab[2]-b[2]*ab[1])
		return det != 0
	}
	// The first n columns of [B AB A^2B ...] decide most realisations: if
	// they are independent the rank is n. Otherwise all n·m columns.
	full := n * len(r.b)
	if full > len(m.e[0]) || len(r.b) > 4 {
		panic("oracle: more than 4 signals")
	}
	widths := []int{n, full}
	if full <= n {
		widths = widths[1:]
	}
	for _, width := range widths {
		r.kalmanInto(a, m, width)
		rk, ok := m.rankInt64()
		if !ok {
			// Overflow (never on the grid of these tests): again in
			// math/big.
			r.kalmanInto(a, m, width)
			rk = m.rankBig()
		}
		if rk == n {
			return true
		}
	}
	return false
}

// kalmanInto writes the first width columns of [B AB A^2B ...] (power by
// power) of (a, r.b) into m.
func (r *realisation) kalmanInto(a *[4][4]int64, m *kalman, width int) {
	n := r.n
	m.rows, m.cols = n, 0
	var x [4][4]int64 // the current power's columns, one per signal
	copy(x[:], r.b)
	for m.cols < width {
		for bi := range r.b {
			if m.cols == width {
				return
			}
			for i := 0; i < n; i++ {
				m.e[i][m.cols] = x[bi][i]
			}
			m.cols++
		}
		for bi := range r.b {
			var y [4]int64
			for i := 0; i < n; i++ {
				for j := 0; j < n; j++ {
					y[i] += a[i][j] * x[bi][j]
				}
			}
			x[bi] = y
		}
	}
}

// kalman is a Kalman matrix of at most 4 rows and 16 columns (more
// columns than 16 are never needed: 4 independent ones suffice, and the
// callers have at most 4 signals).
type kalman struct {
	e          [4][16]int64
	rows, cols int
}

// mulOK returns a*b and whether it fits in int64.
func mulOK(a, b int64) (int64, bool) {
	if a == 0 || b == 0 {
		return 0, true
	}
	ua, ub := uint64(a), uint64(b)
	neg := (a < 0) != (b < 0)
	if a < 0 {
		ua = uint64(-a)
	}
	if b < 0 {
		ub = uint64(-b)
	}
	hi, lo := bits.Mul64(ua, ub)
	if hi != 0 || lo > math.MaxInt64 {
		return 0, false
	}
	if neg {
		return -int64(lo), true
	}
	return int64(lo), true
}

// rankInt64 is fraction-free Gaussian elimination (Bareiss): every entry
// stays a minor of the input and each division is exact. It reports false
// when a product would overflow. The matrix is overwritten.
func (k *kalman) rankInt64() (int, bool) {
	m := &k.e
	rows, cols := k.rows, k.cols
	// With at most 4 rows the products formed are of two minors of at
	// most 3 rows; entries of at most 2^8 in magnitude keep those minors
	// below 3!·2^24 and the products below 2^54, so the checks can be
	// skipped.
	small := rows <= 4
	for i := 0; i < rows && small; i++ {
		for j := 0; j < cols; j++ {
			if x := m[i][j]; x > 1<<8 || x < -(1<<8) {
				small = false
				break
			}
		}
	}
	prev := int64(1)
	r := 0
	for c := 0; c < cols && r < rows; c++ {
		p := -1
		for i := r; i < rows; i++ {
			if m[i][c] != 0 {
				p = i
				break
			}
		}
		if p < 0 {
			continue
		}
		if p != r {
			m[r], m[p] = m[p], m[r]
		}
		for i := r + 1; i < rows; i++ {
			if small {
				for j := c + 1; j < cols; j++ {
					m[i][j] = (m[r][c]*m[i][j] - m[i][c]*m[r][j]) / prev
				}
				m[i][c] = 0
				continue
			}
			for j := c + 1; j < cols; j++ {
				x, ok1 := mulOK(m[r][c], m[i][j])
				y, ok2 := mulOK(m[i][c], m[r][j])
				if !ok1 || !ok2 || (y < 0 && x > math.MaxInt64+y) || (y > 0 && x < math.MinInt64+y) {
					return 0, false
				}
				m[i][j] = (x - y) / prev
			}
			m[i][c] = 0
		}
		prev = m[r][c]
		r++
	}
	return r, true
}

// rankBig is rankInt64 in math/big.
func (k *kalman) rankBig() int {
	rows, cols := k.rows, k.cols
	m := make([][]*big.Int, rows)
	for i := range m {
		m[i] = make([]*big.Int, cols)
		for j := range m[i] {
			m[i][j] = big.NewInt(k.e[i][j])
		}
	}
	prev := big.NewInt(1)
	r := 0
	var x, y big.Int
	for c := 0; c < cols && r < rows; c++ {
		p := -1
		for i := r; i < rows; i++ {
			if m[i][c].Sign() != 0 {
				p = i
				break
			}
		}
		if p < 0 {
			continue
		}
		m[r], m[p] = m[p], m[r]
		for i := r + 1; i < rows; i++ {
			for j := c + 1; j < cols; j++ {
				x.Mul(m[r][c], m[i][j])
				y.Mul(m[i][c], m[r][j])
				x.Sub(&x, &y)
				m[i][j] = new(big.Int).Quo(&x, prev)
			}
			m[i][c] = new(big.Int)
		}
		prev = new(big.Int).Set(m[r][c])
		r++
	}
	return r
}

// search enumerates the realisations of p on the value grid (odometer
// order) and returns the first that is not controllable (observable, with
// obs), or false after all of them; limit > 0 stops after that many
// (returning false, complete false).
func (p pat) search(obs bool, limit int) (found bool, complete bool, tried int) {
	sl := p.slots()
	r := p.base()
	var m kalman
	idx := make([]int, len(sl))
	for _, s := range sl {
		r.set(s, s.vals[0])
	}
	for {
		tried++
		if !r.controllableIn(obs, &m) {
			return true, true, tried
		}
		if limit > 0 && tried >= limit {
			return false, false, tried
		}
		i := 0
		for ; i < len(sl); i++ {
			idx[i]++
			if idx[i] < len(sl[i].vals) {
				r.set(sl[i], sl[i].vals[idx[i]])
				break
			}
			idx[i] = 0
			r.set(sl[i], sl[i].vals[0])
		}
		if i == len(sl) {
			return false, true, tried
		}
	}
}

// grid returns the number of realisations on the value grid.
func (p pat) grid() float64 {
	g := 1.0
	for _, s := range p.slots() {
		g *= float64(len(s.vals))
	}
	return g
}

// sample draws k realisations of p uniformly from the value grid and
// returns whether one is not controllable (observable, with obs).
func (p pat) sample(obs bool, k int, rng *rand.Rand) bool {
	sl := p.slots()
	r := p.base()
	var m kalman
	for ; k > 0; k-- {
		for _, s := range sl {
			r.set(s, s.vals[rng.IntN(len(s.vals))])
		}
		if !r.controllableIn(obs, &m) {
			return true
		}
	}
	return false
}
