package strong

import (
	"cmp"
	"math"
	"math/bits"
	"slices"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/optimize/convex/lp"

	"github.com/netsteer/netsteer/structural"
)

// exact is the branch and bound of Place, step 3, on bitsets of n bits
// (w words each).
type exact struct {
	n, w int
	// tests[t] holds the columns of one forcing test: rows of kind
	// Nonzero or Arbitrary (any) and of kind Nonzero (star), w words per
	// column, columns one after the other.
	tests []bitCols
	base  []uint64 // existing devices
	allow []uint64 // states that may take a new device
	key   []int64  // cost·(n+1) + 1: least cost first, then fewest devices
	cost  []structural.Cost
	// forts holds minimal forts, w words each, smallest first.
	forts [][]uint64
	nodes int64
}

type bitCols struct {
	any, star []uint64
	cols      int
}

func newExact(s *system, dev structural.Devices, existing []int32) *exact {
	n := s.n
	w := (n + 63) / 64
	x := &exact{n: n, w: w, base: make([]uint64, w), allow: make([]uint64, w), key: make([]int64, n), cost: make([]structural.Cost, n)}
	for _, v := range existing {
		set(x.base, v)
	}
	for v := int32(0); int(v) < n; v++ {
		if dev.Allowed(v) && !dev.Has(v) {
			set(x.allow, v)
		}
		x.cost[v] = dev.CostOf(v)
		x.key[v] = int64(x.cost[v])*int64(n+1) + 1
	}
	for _, diag := range [][]Kind{s.diag, s.shifted} {
		if diag == nil {
			continue
		}
		cols := n + s.m
		t := bitCols{any: make([]uint64, cols*w), star: make([]uint64, cols*w), cols: cols}
		for u := int32(0); int(u) < n; u++ {
			a, st := t.any[int(u)*w:int(u+1)*w], t.star[int(u)*w:int(u+1)*w]
			for k := s.out.Ptr[u]; k < s.out.Ptr[u+1]; k++ {
				v := s.out.Adj[k]
				if v == u {
					continue
				}
				set(a, v)
				if s.kindOut(k) == Nonzero {
					set(st, v)
				}
			}
			if diag[u] != Zero {
				set(a, u)
				if diag[u] == Nonzero {
					set(st, u)
				}
			}
		}
		for i := 0; i < s.m; i++ {
			j := n + i
			for _, v := range s.signal(i) {
				set(t.any[j*w:(j+1)*w], v)
				set(t.star[j*w:(j+1)*w], v)
			}
		}
		x.tests = append(x.tests, t)
	}
	return x
}

func set(b []uint64, v int32)      { b[v>>6] |= 1 << (uint(v) & 63) }
func has(b []uint64, v int32) bool { return b[v>>6]>>(uint(v)&63)&1 != 0 }

func meets(a, b []uint64) bool {
	for i := range a {
		if a[i]&b[i] != 0 {
			return true
		}
	}
	return false
}

func count(b []uint64) int {
	c := 0
	for _, x := range b {
		c += bits.OnesCount64(x)
	}
	return c
}

// closure returns the states test t colours from the devices S (and the
// existing ones): repeated passes of the colour change rule over all
// columns until none forces. O(N (N + m) w) per call at worst.
func (x *exact) closure(t *bitCols, s []uint64) []uint64 {
	w := x.w
	c := make([]uint64, w)
	for i := range c {
		c[i] = s[i] | x.base[i]
	}
	for changed := true; changed; {
		changed = false
		for j := 0; j < t.cols; j++ {
			a, st := t.any[j*w:(j+1)*w], t.star[j*w:(j+1)*w]
			white, at := 0, -1
			for i := 0; i < w && white < 2; i++ {
				if y := a[i] &^ c[i]; y != 0 {
					white += bits.OnesCount64(y)
					at = i
				}
			}
			if white != 1 {
				continue
			}
			y := a[at] &^ c[at]
			if st[at]&y == 0 {
				continue // the last white row is arbitrary
			}
			c[at] |= y
			changed = true
		}
	}
	return c
}

// fort returns the states test t leaves white from the devices s, shrunk
// to a minimal fort (see shrink), or nil when t colours everything.
func (x *exact) fort(t *bitCols, s []uint64) []uint64 {
	c := x.closure(t, s)
	f := make([]uint64, x.w)
	empty := true
	for i := range f {
		f[i] = ^c[i]
		if i == x.w-1 && x.n%64 != 0 {
			f[i] &= 1<<(uint(x.n)%64) - 1
		}
		empty = empty && f[i] == 0
	}
	if empty {
		return nil
	}
	trial := make([]uint64, x.w)
	for v := int32(0); int(v) < x.n; v++ {
		if !has(f, v) {
			continue
		}
		for i := range trial {
			trial[i] = ^f[i]
		}
		set(trial, v)
		c := x.closure(t, trial)
		smaller := false
		for i := range c {
			y := ^c[i] & f[i]
			smaller = smaller || y != 0
		}
		if smaller {
			for i := range f {
				f[i] &^= c[i]
			}
		}
	}
	return f
}

// addFort records f, keeping the list sorted by size.
func (x *exact) addFort(f []uint64) {
	k := count(f)
	i, _ := slices.BinarySearchFunc(x.forts, k, func(g []uint64, k int) int { return cmp.Compare(count(g), k) })
	x.forts = slices.Insert(x.forts, i, f)
}

// bound returns the disjoint-fort bound on the key still to pay for the
// forts the devices s miss, with the excluded states excl unavailable:
// forts with pairwise disjoint candidates, each priced at its cheapest
// candidate (a feasible solution of the dual of the fort cover's linear
// relaxation). It also returns the missed fort with fewest candidates
// (nil when s meets every fort) and whether some missed fort has no
// candidate at all.
func (x *exact) bound(s, excl []uint64) (lb int64, pick []uint64, dead bool) {
	w := x.w
	used := make([]uint64, w)
	cand := make([]uint64, w)
	best := -1
	for _, f := range x.forts {
		if meets(f, s) {
			continue
		}
		k := 0
		for i := range cand {
			cand[i] = f[i] & x.allow[i] &^ excl[i]
			k += bits.OnesCount64(cand[i])
		}
		if k == 0 {
			return 0, nil, true
		}
		if best < 0 || k < best {
			best, pick = k, f
		}
		if meets(cand, used) {
			continue
		}
		m := int64(-1)
		for i, y := range cand {
			used[i] |= y
			for y != 0 {
				v := int32(i*64 + bits.TrailingZeros64(y))
				y &= y - 1
				if m < 0 || x.key[v] < m {
					m = x.key[v]
				}
			}
		}
		lb += m
	}
	return lb, pick, false
}

// search returns the cheapest device set (as keyed) it finds, whether it
// proved it optimal, and a lower bound on the cost of every placement.
// start must be a working placement (the incumbent).
func (x *exact) search(start []int32, budget int64) ([]int32, bool, structural.Cost) {
	w := x.w
	bestKey := int64(0)
	for _, v := range start {
		bestKey += x.key[v]
	}
	best := slices.Clone(start)
	type frame struct {
		s, excl []uint64
		key     int64
		cands   []int32
		next    int
		ready   bool
	}
	stack := []*frame{{s: make([]uint64, w), excl: make([]uint64, w)}}
	proved := true
	for len(stack) > 0 {
		f := stack[len(stack)-1]
		if !f.ready {
			x.nodes++
			if x.nodes > budget {
				proved = false
				break
			}
			lb, pick, dead := x.bound(f.s, f.excl)
			if dead || f.key+lb >= bestKey {
				stack = stack[:len(stack)-1]
				continue
			}
			if pick == nil {
				// Every known fort is met: colour.
				var found bool
				for i := range x.tests {
					if ft := x.fort(&x.tests[i], f.s); ft != nil {
						x.addFort(ft)
						found = true
					}
				}
				if found {
					x.nodes-- // the same node, bounded again
					continue
				}
				bestKey = f.key
				best = best[:0]
				for v := int32(0); int(v) < x.n; v++ {
					if has(f.s, v) {
						best = append(best, v)
					}
				}
				stack = stack[:len(stack)-1]
				continue
			}
			// Branch on pick's candidates: cheapest first, then those in
			// most missed forts.
			for i := 0; i < w; i++ {
				y := pick[i] & x.allow[i] &^ f.excl[i]
				for y != 0 {
					f.cands = append(f.cands, int32(i*64+bits.TrailingZeros64(y)))
					y &= y - 1
				}
			}
			hits := make(map[int32]int, len(f.cands))
			for _, ft := range x.forts {
				if meets(ft, f.s) {
					continue
				}
				for _, v := range f.cands {
					if has(ft, v) {
						hits[v]++
					}
				}
			}
			slices.SortStableFunc(f.cands, func(a, b int32) int {
				if c := cmp.Compare(x.key[a], x.key[b]); c != 0 {
					return c
				}
				return cmp.Compare(hits[b], hits[a])
			})
			f.ready = true
		}
		if f.next == len(f.cands) {
			stack = stack[:len(stack)-1]
			continue
		}
		// Child: take cands[next]; the candidates before it are excluded.
		v := f.cands[f.next]
		child := &frame{s: slices.Clone(f.s), excl: slices.Clone(f.excl), key: f.key + x.key[v]}
		set(child.s, v)
		for _, u := range f.cands[:f.next] {
			set(child.excl, u)
		}
		f.next++
		stack = append(stack, child)
	}
	var lb structural.Cost
	if proved {
		lb = costSum(x.cost, best)
	} else {
		root, _, _ := x.bound(make([]uint64, w), make([]uint64, w))
		// key = cost·(n+1) + count with count <= n, so the cost bound is
		// the quotient.
		lb = max(structural.Cost(root/int64(x.n+1)), x.lpBound())
	}
	return best, proved, lb
}

// lpBound returns a lower bound on the cost of every placement from the
// linear relaxation of the fort cover over the forts found (the
// fractional fort cover): a feasible solution y of its dual, maximise
// sum y_F subject to sum over forts holding v of y_F <= cost(v), y >= 0,
// solved by gonum's simplex, scaled down until it is feasible in floating
// point, and rounded up to a multiple of the costs' greatest common
// divisor (every placement's cost is one). Weak duality makes any such y a bound. 0 when the solver
// fails.
func (x *exact) lpBound() structural.Cost {
	var vars []int32
	for v := int32(0); int(v) < x.n; v++ {
		if has(x.allow, v) {
			vars = append(vars, v)
		}
	}
	k := len(x.forts)
	if k == 0 || len(vars) == 0 {
		return 0
	}
	rows, cols := len(vars), k+len(vars)
	a := mat.NewDense(rows, cols, nil)
	b := make([]float64, rows)
	c := make([]float64, cols)
	for i, v := range vars {
		b[i] = float64(x.cost[v])
		a.Set(i, k+i, 1) // slack
		for j, f := range x.forts {
			if has(f, v) {
				a.Set(i, j, 1)
			}
		}
	}
	for j := 0; j < k; j++ {
		c[j] = -1
	}
	basic := make([]int, rows)
	for i := range basic {
		basic[i] = k + i
	}
	_, y, err := lp.Simplex(c, a, b, 1e-10, basic)
	if err != nil || len(y) != cols {
		return 0
	}
	// Scale y into the constraints exactly as far as float arithmetic
	// can tell, with a margin.
	scale := 1.0
	for i, v := range vars {
		var load float64
		for j, f := range x.forts {
			if y[j] > 0 && has(f, v) {
				load += y[j]
			}
		}
		if load > 0 && b[i] < load {
			scale = math.Min(scale, b[i]/load)
		}
		if b[i] == 0 && load > 0 {
			return 0
		}
	}
	var sum float64
	for j := 0; j < k; j++ {
		if y[j] > 0 {
			sum += y[j]
		}
	}
	sum *= scale * (1 - 1e-9)
	// Every placement costs a multiple of the costs' greatest common
	// divisor.
	var g int64
	for _, v := range vars {
		g = gcd(g, int64(x.cost[v]))
	}
	if g == 0 {
		return 0
	}
	return structural.Cost(int64(math.Ceil(sum/float64(g)-1e-6)) * g)
}

func gcd(a, b int64) int64 {
	for b != 0 {
		a, b = b, a%b
	}
	return a
}

func costSum(c []structural.Cost, states []int32) structural.Cost {
	var s structural.Cost
	for _, v := range states {
		s += c[v]
	}
	return s
}
