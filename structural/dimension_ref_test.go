package structural_test

import (
	"math"

	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural"
)

// This file keeps the cover flow as it was before the liveness pruning
// (dimension_live.go): Dial phases followed by depth-first passes until a
// pass finds no path. TestDimensionReference compares the two.

// refControllableDimension is ControllableDimension by the reference flow.
func refControllableDimension(g *structural.Network, inputs [][]int32) int {
	reached, nR := structural.Reach(g, inputs)
	m := matching.Maximum(structural.InNeighbourCSR(g, inputs), nil)
	if nR == g.N() && m.Size == g.N() {
		return g.N()
	}
	return refDimension(g, inputs, reached, nR, m)
}

// Flow records. For a state v, succ is where v_out sends its unit and pred
// where v_in gets its unit from: a state (>= 0), nothing yet (refNone: a
// source for succ, a deficit for pred), the hub (succ only), v itself
// through the "uncovered" arc (refSelf), or input i (pred = refPredInput-i).
// For input i, succ is the state it feeds, or refNone.
const (
	refNone      = -1
	refHub       = -2
	refSelf      = -3
	refPredInput = -4
	refInf       = math.MaxInt32
)

// Kinds of residual arcs.
const (
	refArcNone = iota // no residual capacity
	refArcNode        // to a node
	refArcSink        // into a deficit v_in
)

// refNode holds what is read for every arc into a node, kept together so
// that following an arc touches one cache line.
type refNode struct {
	pred  int32 // states: who feeds v_in (see the flow records)
	q     int32 // potential: the reduced cost c + q[x] - q[y] is >= 0
	stamp int32 // pass of the last visit
	dist  int32 // tentative distance in the current phase, or refInf
}

// refFlow is the residual network of the cover flow, contracted: a v_in
// has exactly one residual arc out (back to whoever feeds it, or to the
// sink when it is a deficit), so an arc into v_in is followed through at
// once. Nodes are v_out = v (0..n-1), input i = n+i, and the hub T = n+m.
// Deficits keep potential 0 throughout, as in the uncontracted network.
type refFlow struct {
	g      *structural.Network
	inputs [][]int32
	n, hub int32
	node   []refNode
	succ   []int32 // where each v_out (and each input) sends its unit
	cur    []int32 // descent cursor of each node in the current pass
	look   []int32 // lookahead cursor of each node for the current potentials
	hubs   []int32 // states that may have succ == refHub (stale ones skipped)
	// The hub is the one node that several paths of a pass may share: its
	// cursor lives here and is reset every pass.
	hubCur    int64
	hubOnPath bool
	pass      int32
	touched   []int32
	buckets   [][]int32
	stack     []int32
	pos       []int64
}

// rangeLen returns the number of arc positions of node x.
func (f *refFlow) rangeLen(x int32) int64 {
	switch {
	case x < f.n:
		return f.g.Out().Ptr[x+1] - f.g.Out().Ptr[x] + 2
	case x < f.hub:
		return int64(len(f.inputs[x-f.n])) + 1
	}
	return int64(len(f.inputs)) + int64(len(f.hubs))
}

// through follows an arc of cost c into w_in on along w_in's only residual
// arc.
func (f *refFlow) through(w, c int32) (int32, int32, int) {
	switch p := f.node[w].pred; {
	case p >= 0:
		return p, c, refArcNode
	case p == refNone:
		return -1, c, refArcSink
	case p == refSelf:
		return w, c - 1, refArcNode
	default:
		return f.n + (refPredInput - p), c, refArcNode
	}
}

// arc returns the head, the original cost and the kind of the residual arc
// at position pos of node x.
func (f *refFlow) arc(x int32, pos int64) (int32, int32, int) {
	switch {
	case x < f.n: // v_out: its edges, then "uncovered", then the hub
		lo, hi := f.g.Out().Ptr[x], f.g.Out().Ptr[x+1]
		s := f.succ[x]
		switch {
		case pos < hi-lo:
			w := f.g.Out().Adj[lo+pos]
			if s == w {
				return 0, 0, refArcNone
			}
			return f.through(w, 0)
		case pos == hi-lo:
			if s == refSelf {
				return 0, 0, refArcNone
			}
			return f.through(x, 1)
		}
		if s == refHub {
			return 0, 0, refArcNone
		}
		return f.hub, 0, refArcNode
	case x < f.hub: // input: the states it drives, then back to the hub
		in := f.inputs[x-f.n]
		s := f.succ[x]
		if pos < int64(len(in)) {
			w := in[pos]
			if s == w {
				return 0, 0, refArcNone
			}
			return f.through(w, 0)
		}
		if s == refNone {
			return 0, 0, refArcNone
		}
		return f.hub, 0, refArcNode
	}
	// The hub: unused inputs, then back to the stem ends.
	m := int64(len(f.inputs))
	if pos < m {
		y := f.n + int32(pos)
		if f.succ[y] != refNone {
			return 0, 0, refArcNone
		}
		return y, 0, refArcNode
	}
	v := f.hubs[pos-m]
	if f.succ[v] != refHub {
		return 0, 0, refArcNone
	}
	return v, 0, refArcNode
}

// apply records that the augmenting path leaves node x by its arc at pos.
// Entering a node cancels its old flow implicitly: the leaving arc
// overwrites the record, and the v_in passed through gets its new feeder.
func (f *refFlow) apply(x int32, pos int64) {
	switch {
	case x < f.n:
		lo, hi := f.g.Out().Ptr[x], f.g.Out().Ptr[x+1]
		switch {
		case pos < hi-lo:
			w := f.g.Out().Adj[lo+pos]
			f.succ[x] = w
			f.node[w].pred = x
		case pos == hi-lo:
			f.succ[x] = refSelf
			f.node[x].pred = refSelf
		default:
			f.succ[x] = refHub
			f.hubs = append(f.hubs, x)
		}
	case x < f.hub:
		i := x - f.n
		in := f.inputs[i]
		if pos < int64(len(in)) {
			w := in[pos]
			f.succ[x] = w
			f.node[w].pred = refPredInput - i
		} else {
			f.succ[x] = refNone
		}
	}
}

// refDimension computes the largest stem-cycle cover on the reached states,
// starting from m, a maximum matching of structural.InNeighbourCSR(g, inputs).
func refDimension(g *structural.Network, inputs [][]int32, inR []bool, nR int, m *matching.Matching) int {
	n := g.N()
	if nR == 0 {
		return 0
	}
	if int64(n)+1+int64(len(inputs)) > math.MaxInt32/2 || nR > math.MaxInt32/4 {
		return -1
	}
	size := n + len(inputs) + 1
	f := &refFlow{g: g, inputs: inputs, n: int32(n), hub: int32(n + len(inputs))}
	f.node = make([]refNode, size)
	f.succ = make([]int32, size)
	f.cur = make([]int32, size)
	f.look = make([]int32, size)
	for i := range f.node {
		f.node[i] = refNode{pred: refNone, dist: refInf}
		f.succ[i] = refNone
	}
	// Zero-cost start: the matching restricted to R. Rows are states
	// needing a feeder; column c < n is a state, c >= n an input.
	used := 0
	for w := 0; w < n; w++ {
		c := m.RowMate[w]
		if !inR[w] || c < 0 {
			continue
		}
		if int(c) < n {
			if inR[c] {
				f.node[w].pred, f.succ[c] = c, int32(w)
			}
			continue
		}
		f.node[w].pred, f.succ[c] = refPredInput-(c-int32(n)), int32(w)
		used++
	}
	// Each used input takes its unit from the hub, which takes it from a
	// free v_out. There are enough: free outs = |R| - (rows matched to
	// states) >= rows matched to inputs, since at most |R| rows are matched.
	var sources []int32
	for v := 0; v < n; v++ {
		if !inR[v] || f.succ[v] != refNone {
			continue
		}
		if used > 0 {
			f.succ[v] = refHub
			f.hubs = append(f.hubs, int32(v))
			used--
			continue
		}
		sources = append(sources, int32(v))
	}
	// Phases: shortest distances, then augmenting passes along admissible
	// arcs until a pass finds no path.
	for len(sources) > 0 {
		if len(f.hubs) > 2*nR {
			k := 0
			for _, v := range f.hubs {
				if f.succ[v] == refHub {
					f.hubs[k] = v
					k++
				}
			}
			f.hubs = f.hubs[:k]
		}
		f.shortest(sources)
		for f.augment(sources) > 0 {
		}
		k := 0
		for _, v := range sources {
			if f.succ[v] == refNone {
				sources[k] = v
				k++
			}
		}
		sources = sources[:k]
	}
	uncovered := 0
	for v := 0; v < n; v++ {
		if inR[v] && f.succ[v] == refSelf {
			uncovered++
		}
	}
	return nR - uncovered
}

// shortest runs Dial's algorithm on reduced costs from all sources until
// the nearest deficit, at distance D, and raises the potentials: q[x] +=
// min(dist[x], D) - D, which keeps every reduced cost non-negative and makes
// the arcs of shortest paths admissible (reduced cost 0). When D > 0 it
// also resets the lookahead cursors, which hold for one set of potentials.
func (f *refFlow) shortest(sources []int32) {
	nd := f.node
	bound := int32(refInf) // the best distance to a deficit so far
	push := func(x, d int32) {
		if nd[x].dist == refInf {
			f.touched = append(f.touched, x)
		}
		nd[x].dist = d
		for int(d) >= len(f.buckets) {
			f.buckets = append(f.buckets, nil)
		}
		f.buckets[d] = append(f.buckets[d], x)
	}
	for _, v := range sources {
		push(v, 0)
	}
scan:
	for d := int32(0); int(d) < len(f.buckets); d++ {
		for i := 0; i < len(f.buckets[d]); i++ {
			if d >= bound {
				break scan // every node nearer than the deficit is final
			}
			x := f.buckets[d][i]
			if nd[x].dist != d {
				continue // a stale entry: x was pushed again nearer
			}
			base := d + nd[x].q
			end := f.rangeLen(x)
			for p := int64(0); p < end; p++ {
				y, c, kind := f.arc(x, p)
				switch kind {
				case refArcSink:
					if base+c < bound {
						bound = base + c
					}
				case refArcNode:
					if t := base + c - nd[y].q; t < nd[y].dist && t < bound {
						push(y, t)
					}
				}
			}
		}
	}
	if bound == refInf {
		panic("structural: internal error: no augmenting path in the cover flow")
	}
	for _, x := range f.touched {
		if d := nd[x].dist; d < bound {
			nd[x].q += d - bound
		}
		nd[x].dist = refInf
	}
	f.touched = f.touched[:0]
	for i := range f.buckets {
		f.buckets[i] = f.buckets[i][:0]
	}
	if bound > 0 {
		clear(f.look)
	}
}

// augment runs one depth-first pass from the sources along admissible
// arcs, augmenting vertex-disjoint paths, and returns how many it found. At every node the lookahead first
// tries the arcs straight into a deficit, and the descent alternates its
// scanning direction from pass to pass (Pothen and Fan's lookahead and
// fairness). The hub is exempt from the disjointness (it has unbounded
// capacity); it only may not appear twice on one path, and its cursor
// persists through the pass.
func (f *refFlow) augment(sources []int32) int {
	nd := f.node
	hub := f.hub
	f.pass++
	f.hubCur = 0
	backward := f.pass&1 == 0
	found := 0
	for _, src := range sources {
		if f.succ[src] != refNone || nd[src].stamp == f.pass {
			continue
		}
		nd[src].stamp = f.pass
		f.cur[src] = 0
		f.stack = append(f.stack[:0], src)
		f.pos = f.pos[:0]
		f.hubOnPath = false
		for len(f.stack) > 0 {
			x := f.stack[len(f.stack)-1]
			end := f.rangeLen(x)
			qx := nd[x].q
			if x != hub {
				hit := int64(-1)
				for int64(f.look[x]) < end {
					p := int64(f.look[x])
					f.look[x]++
					if _, c, kind := f.arc(x, p); kind == refArcSink && c+qx == 0 {
						hit = p
						break
					}
				}
				if hit >= 0 {
					f.pos = append(f.pos, hit)
					for k, z := range f.stack {
						f.apply(z, f.pos[k])
					}
					found++
					break
				}
			}
			advanced := false
			for {
				var p int64
				if x == hub {
					if f.hubCur >= end {
						break
					}
					p = f.hubCur
					f.hubCur++
				} else {
					if int64(f.cur[x]) >= end {
						break
					}
					p = int64(f.cur[x])
					f.cur[x]++
					if backward {
						p = end - 1 - p
					}
				}
				y, c, kind := f.arc(x, p)
				if kind != refArcNode || c+qx != nd[y].q {
					continue
				}
				if y == hub {
					if f.hubOnPath {
						continue
					}
					f.hubOnPath = true
				} else {
					if nd[y].stamp == f.pass {
						continue
					}
					nd[y].stamp = f.pass
					f.cur[y] = 0
				}
				f.pos = append(f.pos, p)
				f.stack = append(f.stack, y)
				advanced = true
				break
			}
			if !advanced {
				f.stack = f.stack[:len(f.stack)-1]
				if x == hub {
					f.hubOnPath = false
				}
				if len(f.pos) > 0 {
					f.pos = f.pos[:len(f.pos)-1]
				}
			}
		}
	}
	return found
}
