// Package cover solves weighted set cover in its hitting-set form: each
// element lists the candidates that cover it, each candidate has a
// non-negative cost, and the cheapest set of candidates covering every
// element is wanted.
package cover

import (
	"cmp"
	"container/heap"
	"math"
	"slices"
)

// Instance is a hitting-set instance: Sets[j] lists the candidates
// (0..len(Cost)-1) covering element j.
type Instance struct {
	Cost []int64
	Sets [][]int32
}

// Result is a cover with what is known of its quality.
type Result struct {
	// Feasible reports that every element has a candidate.
	Feasible bool
	// Chosen lists the candidates taken, in the order taken.
	Chosen []int32
	Cost   int64
	// LowerBound is a lower bound on the least cost of a cover.
	LowerBound int64
	// Factor is H(d), d the most elements one candidate covers: the
	// greedy cover costs at most Factor times the least (Chvátal 1979).
	Factor float64
	// Optimal reports that Cost was proved least.
	Optimal bool
}

// Greedy returns the greedy cover (Chvátal, "A greedy heuristic for the
// set-covering problem", Math. Oper. Res. 4(3):233-235, 1979): repeatedly
// the candidate of least cost per newly covered element, found through a
// heap with lazy updates, then redundant choices dropped. Its cost is
// within H(d) = 1 + 1/2 + ... + 1/d of the least. The lower bound is the better of Cost/H(d) and a dual packing
// (each element in turn takes the least remaining slack of its
// candidates, a feasible solution of the dual linear program). Time
// O(I log C) for I incidences and C candidates.
func Greedy(in Instance) Result {
	nc := len(in.Cost)
	by := make([][]int32, nc) // elements each candidate covers
	for j, s := range in.Sets {
		if len(s) == 0 {
			return Result{}
		}
		for _, x := range s {
			by[x] = append(by[x], int32(j))
		}
	}
	d := 0
	for _, e := range by {
		d = max(d, len(e))
	}
	res := Result{Feasible: true, Factor: harmonic(d)}
	covered := make([]bool, len(in.Sets))
	left := len(in.Sets)
	gain := make([]int, nc)
	h := &ratioHeap{}
	for x := 0; x < nc; x++ {
		gain[x] = len(by[x])
		if gain[x] > 0 {
			heap.Push(h, item{x: int32(x), gain: gain[x], cost: in.Cost[x]})
		}
	}
	for left > 0 {
		it := heap.Pop(h).(item)
		if it.gain != gain[it.x] {
			if gain[it.x] > 0 {
				heap.Push(h, item{x: it.x, gain: gain[it.x], cost: it.cost})
			}
			continue
		}
		res.Chosen = append(res.Chosen, it.x)
		res.Cost += it.cost
		for _, j := range by[it.x] {
			if covered[j] {
				continue
			}
			covered[j] = true
			left--
			for _, y := range in.Sets[j] {
				gain[y]--
			}
		}
	}
	// The H(d) bound holds for the greedy cost; the lower bound derived
	// from it is taken before dropping redundant candidates.
	fromGreedy := int64(math.Ceil(float64(res.Cost)/res.Factor - 1e-9))
	dropRedundant(in, by, &res)
	res.LowerBound = max(packing(in), fromGreedy)
	if res.LowerBound > res.Cost {
		res.LowerBound = res.Cost
	}
	res.Optimal = res.LowerBound == res.Cost
	return res
}

// dropRedundant removes chosen candidates whose every element another
// chosen candidate also covers, the most expensive first; the cover only
// gets cheaper.
func dropRedundant(in Instance, by [][]int32, res *Result) {
	times := make([]int32, len(in.Sets))
	for _, x := range res.Chosen {
		for _, j := range by[x] {
			times[j]++
		}
	}
	order := append([]int32(nil), res.Chosen...)
	slices.SortStableFunc(order, func(a, b int32) int { return cmp.Compare(in.Cost[b], in.Cost[a]) })
	drop := map[int32]bool{}
	for _, x := range order {
		ok := true
		for _, j := range by[x] {
			if times[j] < 2 {
				ok = false
				break
			}
		}
		if ok {
			drop[x] = true
			for _, j := range by[x] {
				times[j]--
			}
			res.Cost -= in.Cost[x]
		}
	}
	if len(drop) > 0 {
		res.Chosen = slices.DeleteFunc(res.Chosen, func(x int32) bool { return drop[x] })
	}
}

// packing returns the value of a feasible dual solution: a lower bound
// on every cover's cost.
func packing(in Instance) int64 {
	slack := append([]int64(nil), in.Cost...)
	var total int64
	for _, s := range in.Sets {
		y := int64(math.MaxInt64)
		for _, x := range s {
			y = min(y, slack[x])
		}
		for _, x := range s {
			slack[x] -= y
		}
		total += y
	}
	return total
}

func harmonic(d int) float64 {
	h := 0.0
	for i := 1; i <= d; i++ {
		h += 1 / float64(i)
	}
	return h
}

type item struct {
	x    int32
	gain int
	cost int64
}

type ratioHeap []item

func (h ratioHeap) Len() int { return len(h) }
func (h ratioHeap) Less(i, j int) bool {
	// cost_i/gain_i < cost_j/gain_j, exactly; ties toward more elements.
	a, b := h[i].cost*int64(h[j].gain), h[j].cost*int64(h[i].gain)
	if a != b {
		return a < b
	}
	return h[i].gain > h[j].gain
}
func (h ratioHeap) Swap(i, j int) { h[i], h[j] = h[j], h[i] }
func (h *ratioHeap) Push(x any)   { *h = append(*h, x.(item)) }
func (h *ratioHeap) Pop() any {
	old := *h
	x := old[len(old)-1]
	*h = old[:len(old)-1]
	return x
}

// Exact improves a greedy result by branch and bound when the instance is
// small: it branches on the uncovered element with the fewest candidates,
// bounded by the dual packing of what is left, and gives up after nodes
// nodes (keeping the greedy answer and its bounds). It reports whether the
// search completed, in which case the result is optimal.
func Exact(in Instance, greedy Result, nodes int) Result {
	if !greedy.Feasible || greedy.Optimal {
		return greedy
	}
	best := greedy
	nc := len(in.Cost)
	by := make([][]int32, nc)
	for j, s := range in.Sets {
		for _, x := range s {
			by[x] = append(by[x], int32(j))
		}
	}
	cover := make([]int32, len(in.Sets)) // how many chosen candidates cover j
	chosen := []int32{}
	var cost int64
	count := 0
	aborted := false
	// lb returns a dual packing over the uncovered elements.
	slack := make([]int64, nc)
	lb := func() int64 {
		copy(slack, in.Cost)
		var t int64
		for j, s := range in.Sets {
			if cover[j] > 0 {
				continue
			}
			y := int64(math.MaxInt64)
			for _, x := range s {
				y = min(y, slack[x])
			}
			for _, x := range s {
				slack[x] -= y
			}
			t += y
		}
		return t
	}
	type frame struct {
		j    int // element branched on
		next int
	}
	var stack []frame
	pick := func() int {
		bj, bn := -1, 0
		for j, s := range in.Sets {
			if cover[j] == 0 && (bj < 0 || len(s) < bn) {
				bj, bn = j, len(s)
			}
		}
		return bj
	}
	take := func(x int32, sign int32) {
		for _, j := range by[x] {
			cover[j] += sign
		}
	}
	expand := func() bool {
		count++
		if count > nodes {
			aborted = true
			return false
		}
		j := pick()
		if j < 0 {
			if cost < best.Cost {
				best.Cost = cost
				best.Chosen = append([]int32(nil), chosen...)
			}
			return false
		}
		if cost+lb() >= best.Cost {
			return false
		}
		stack = append(stack, frame{j: j})
		return true
	}
	expand()
	for len(stack) > 0 && !aborted {
		f := &stack[len(stack)-1]
		if f.next > 0 { // undo the previous choice
			x := in.Sets[f.j][f.next-1]
			take(x, -1)
			cost -= in.Cost[x]
			chosen = chosen[:len(chosen)-1]
		}
		if f.next == len(in.Sets[f.j]) {
			stack = stack[:len(stack)-1]
			continue
		}
		x := in.Sets[f.j][f.next]
		f.next++
		take(x, 1)
		cost += in.Cost[x]
		chosen = append(chosen, x)
		expand()
	}
	if !aborted {
		best.LowerBound = best.Cost
		best.Optimal = true
	}
	return best
}
