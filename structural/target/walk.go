package target

import (
	"container/heap"
	"math/bits"
	"slices"

	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural"
)

// linkingOnly is the proof of a design that rests on a linking in the
// dynamic graph alone (see Selection.Proof).
const linkingOnly = "dynamic_linking"

// walkGreedy builds, from the targets backwards, one walk per target such
// that no two walks are at the same state at the same depth, and ends each
// walk on a driver: a linking of size |T| in the dynamic graph (see
// dynamicLinking), which suggests that the targets are steered (the rank
// equals the largest linking, after Murota & Poljak 1990, is not proved
// here): the design is proved only when a sample confirms it. A driver ends every walk that passes it, each at its
// own depth (input copy (driver, depth)), which is where target control
// saves on full control: one driver can serve many targets.
//
// This is the greedy of Gao, Liu, D'Souza & Barabási ("Target control of
// complex networks", Nat. Commun. 5:5415, 2014): iterated maximum
// matchings of the current walk heads into distinct in-neighbours, the
// matched in-neighbours becoming the next heads. Here a head on a driver
// stops at once; a head left unmatched ends its walk on the cheapest
// allowed state the walk has passed (ties: the latest); the matching
// serves first the walks with no allowed state yet (they must go on) and
// prefers in-neighbours that are drivers already, then allowed ones; after maxDepth layers
// the walks still open are ended by a greedy weighted set cover over the
// states they passed (cost per newly ended walk), which picks states that
// many walks share, on cycles typically. Every walk finally ends at the
// shallowest depth where it meets a driver, and drivers that end no walk
// are dropped. In Signals mode, drivers whose depths of use are disjoint
// share one signal: each copy (signal, depth) still ends one walk.
//
// Time: per layer, a priority matching of the heads into their
// in-neighbours, O(sum of the heads' in-degrees) beyond its augmenting
// searches; memory O(|T|·maxDepth) for the walks.
func walkGreedy(r *region, mode Mode, maxDepth int) (*design, bool) {
	if mode == Signals {
		plain := *r
		plain.dev = structural.Devices{} // signals know no device table
		r = &plain
	}
	nt := len(r.targets)
	isDriver := make([]bool, r.n)
	for v := int32(0); int(v) < r.n; v++ {
		isDriver[v] = r.dev.Has(v)
	}
	bestS := make([]int32, nt) // cheapest allowed state passed by each walk
	for i := range bestS {
		bestS[i] = -1
	}
	heads := slices.Clone(r.targets)
	walks := make([]int32, nt)
	for i := range walks {
		walks[i] = int32(i)
	}
	var hist [][2][]int32 // per depth: heads and their walks
	cid := make([]int32, r.n)
	for i := range cid {
		cid[i] = -1
	}
	var cols []int32
	for depth := 0; ; depth++ {
		hist = append(hist, [2][]int32{slices.Clone(heads), slices.Clone(walks)})
		for i, s := range heads {
			w := walks[i]
			if r.dev.Allowed(s) && (bestS[w] < 0 || r.dev.CostOf(s) <= r.dev.CostOf(bestS[w])) {
				bestS[w] = s
			}
		}
		// Heads on a driver stop here.
		k := 0
		for i, s := range heads {
			if !isDriver[s] {
				heads[k], walks[k] = s, walks[i]
				k++
			}
		}
		heads, walks = heads[:k], walks[:k]
		if len(heads) == 0 || depth == maxDepth {
			break
		}
		// Match the heads into distinct in-neighbours.
		for _, c := range cols {
			cid[c] = -1
		}
		cols = cols[:0]
		b := &matching.CSR{Rows: len(heads), Ptr: make([]int64, len(heads)+1)}
		for i, s := range heads {
			for _, u := range r.in.Row(s) {
				if cid[u] < 0 {
					cid[u] = int32(len(cols))
					cols = append(cols, u)
				}
				b.Adj = append(b.Adj, cid[u])
			}
			b.Ptr[i+1] = int64(len(b.Adj))
		}
		b.Cols = len(cols)
		prefer := make([]uint8, len(cols))
		for j, u := range cols {
			switch {
			case isDriver[u]:
				prefer[j] = 2
			case r.dev.Allowed(u):
				prefer[j] = 1
			}
		}
		order := make([]int32, 0, len(heads))
		var classEnd []int
		for pass := 0; pass < 2; pass++ {
			for i := range heads {
				if (bestS[walks[i]] < 0) == (pass == 0) {
					order = append(order, int32(i))
				}
			}
			classEnd = append(classEnd, len(order))
		}
		mate, _ := priorityMatch(b, order, classEnd, prefer)
		for i := range heads {
			if mate[i] >= 0 {
				continue
			}
			w := walks[i]
			if bestS[w] < 0 {
				return nil, false // no allowed state can end this walk
			}
			isDriver[bestS[w]] = true
		}
		k = 0
		for i, s := range heads {
			if mate[i] >= 0 && !isDriver[s] {
				heads[k], walks[k] = cols[mate[i]], walks[i]
				k++
			}
		}
		heads, walks = heads[:k], walks[:k]
	}
	if len(heads) > 0 && !coverWalks(r, hist, walks, isDriver) {
		return nil, false
	}
	// End every walk at its shallowest driver; keep the drivers used.
	end := make([]bool, nt)
	used := make(map[int32]uint64) // driver -> depths of use (bit d)
	for d, hw := range hist {
		for i, s := range hw[0] {
			if w := hw[1][i]; !end[w] && isDriver[s] {
				end[w] = true
				used[s] |= 1 << uint(d)
			}
		}
	}
	for _, e := range end {
		if !e {
			return nil, false
		}
	}
	drivers := make([]int32, 0, len(used))
	for s := range used {
		drivers = append(drivers, s)
	}
	slices.Sort(drivers)
	d := &design{method: "walk_greedy", proof: linkingOnly}
	if mode == Actuators {
		for _, s := range drivers {
			if !r.dev.Has(s) {
				d.added = append(d.added, s)
				d.cost += r.dev.CostOf(s)
			}
		}
		d.signals = dedicated(slices.Concat(r.existing(), d.added))
		return d, true
	}
	// Signals: first fit by decreasing number of depths used.
	slices.SortStableFunc(drivers, func(a, b int32) int {
		return bits.OnesCount64(used[b]) - bits.OnesCount64(used[a])
	})
	var occ []uint64
	for _, s := range drivers {
		placed := false
		for i := range occ {
			if occ[i]&used[s] == 0 {
				occ[i] |= used[s]
				d.signals[i] = append(d.signals[i], s)
				placed = true
				break
			}
		}
		if !placed {
			occ = append(occ, used[s])
			d.signals = append(d.signals, []int32{s})
		}
	}
	return d, true
}

// coverWalks ends the walks still open by a greedy weighted set cover over
// the allowed states each passed: repeatedly the state ending the most open
// walks per unit of cost becomes a driver. It reports false when some open
// walk passed no allowed state.
func coverWalks(r *region, hist [][2][]int32, open []int32, isDriver []bool) bool {
	isOpen := make(map[int32]int32, len(open)) // walk -> index
	for i, w := range open {
		isOpen[w] = int32(i)
	}
	// states[i]: the allowed states open walk i passed, each once.
	type pair struct{ walk, state int32 }
	var pairs []pair
	for _, hw := range hist {
		for i, s := range hw[0] {
			if j, ok := isOpen[hw[1][i]]; ok && r.dev.Allowed(s) {
				pairs = append(pairs, pair{j, s})
			}
		}
	}
	slices.SortFunc(pairs, func(a, b pair) int {
		if a.state != b.state {
			return int(a.state - b.state)
		}
		return int(a.walk - b.walk)
	})
	pairs = slices.Compact(pairs)
	// Walks of each state, and states of each walk.
	byState := make(map[int32][]int32)
	byWalk := make([][]int32, len(open))
	for _, p := range pairs {
		byState[p.state] = append(byState[p.state], p.walk)
		byWalk[p.walk] = append(byWalk[p.walk], p.state)
	}
	for _, ss := range byWalk {
		if len(ss) == 0 {
			return false
		}
	}
	done := make([]bool, len(open))
	left := len(open)
	h := &coverHeap{}
	for s, ws := range byState {
		heap.Push(h, coverItem{state: s, count: len(ws), cost: r.dev.CostOf(s)})
	}
	for left > 0 && h.Len() > 0 {
		it := heap.Pop(h).(coverItem)
		c := 0
		for _, w := range byState[it.state] {
			if !done[w] {
				c++
			}
		}
		if c == 0 {
			continue
		}
		if c < it.count {
			it.count = c
			heap.Push(h, it)
			continue
		}
		isDriver[it.state] = true
		for _, w := range byState[it.state] {
			if !done[w] {
				done[w] = true
				left--
			}
		}
	}
	return left == 0
}

type coverItem struct {
	state int32
	count int
	cost  structural.Cost
}

// coverHeap orders by walks per cost (count/cost, zero cost first), then
// by state.
type coverHeap []coverItem

func (h coverHeap) Len() int { return len(h) }
func (h coverHeap) Less(i, j int) bool {
	a, b := h[i], h[j]
	// a.count/a.cost > b.count/b.cost, without division.
	l, r := int64(a.count)*int64(b.cost), int64(b.count)*int64(a.cost)
	if l != r {
		return l > r
	}
	if a.count != b.count {
		return a.count > b.count
	}
	return a.state < b.state
}
func (h coverHeap) Swap(i, j int) { h[i], h[j] = h[j], h[i] }
func (h *coverHeap) Push(x any)   { *h = append(*h, x.(coverItem)) }
func (h *coverHeap) Pop() any {
	old := *h
	x := old[len(old)-1]
	*h = old[:len(old)-1]
	return x
}
