package structural

import (
	"math"

	"github.com/netsteer/netsteer/matching"
)

// Dimension returns the generic dimension of the controllable subspace of
// design d (the observable subspace, for Observability): the rank of
// [B AB ... A^(N-1)B] for almost all values of the free parameters. It is
// N exactly when the design is structurally controllable. Networks of more
// than 2^29 states give a *TooLargeError.
//
// Hosoe ("Determination of generic dimensions of controllable subspaces and
// its application", IEEE TAC 25(6):1208-1213, 1980) shows that on the part
// R of the network the inputs reach, the dimension is the largest number of
// states covered by vertex-disjoint cycles and stems (paths starting at
// distinct inputs). States outside R never move from zero, so they add
// nothing. This is not the term rank of [A B], which also counts paths
// that start at an uncovered state: u -> x1, x1 -> x2, x1 -> x3,
// x2 -> x4, x3 -> x5 has term rank 4 but dimension 3.
//
// The largest cover is a minimum-cost flow. Every state v in R is split
// into v_out (supply 1) and v_in (demand 1), joined by an arc of cost 1
// ("v uncovered"); an edge v -> w inside R is an arc v_out -> w_in; a hub
// T takes arcs v_out -> T (a stem ends at v) and gives T -> i (capacity 1)
// for each input i, with i -> w_in for each state w that input i drives.
// All other arcs cost 0. In an integral flow every covered state has one
// predecessor (a covered state or an input) and one successor (a covered
// state or the hub), and the hub balances stem ends against used inputs,
// so the flow is a family of cycles and stems, and its cost is the number
// of uncovered states: dimension = |R| - minimum cost.
//
// The flow starts from a maximum matching (all zero-cost arcs) and is
// completed by successive shortest paths in phases: Dial's buckets on
// reduced costs give the next distance, then depth-first passes with
// lookahead augment vertex-disjoint paths along zero-reduced-cost arcs.
// Before every pass a backward search from the deficits (dimension_live.go)
// marks the nodes that can still reach one; the pass never enters the
// others, skips those that reach one only through the hub once the hub is
// on the path or used up, and the phase ends when no source is live. Costs
// are 0 or 1 and the optimum is at most |R|, so the path cost rises at
// every phase and there are O(sqrt |R|) phases; each pass, each backward
// search and each Dial sweep is O(N + E + the input entries). A v_in has a
// single residual arc out, so it is contracted away; the residual network
// is implicit in a few int32 arrays over states and inputs, and every
// traversal is iterative. On a random network of 10^6 states and 2*10^6
// edges judged with half of a minimum design, the flow takes 7 phases; the
// passes, which used to sweep the whole zero-cost region about 26 times,
// now visit about 2.5*10^6 nodes in all.
func Dimension(g *Network, p Property, d Design) (int, error) {
	if !d.Of(g) {
		return 0, ErrForeignDesign
	}
	h := g.on(p)
	n := h.N()
	reached, nR := reach(h, d.signals)
	b := inNeighbourCSR(h, d.signals)
	m := matching.Maximum(b, nil)
	if nR == n && m.Size == n {
		return n, nil
	}
	return dimension(h, d.signals, reached, nR, m)
}

// Flow records. For a state v, succ is where v_out sends its unit and pred
// where v_in gets its unit from: a state (>= 0), nothing yet (flowNone: a
// source for succ, a deficit for pred), the hub (succ only), v itself
// through the "uncovered" arc (flowSelf), or input i (pred = predInput-i).
// For input i, succ is the state it feeds, or flowNone.
const (
	flowNone   = -1
	flowHub    = -2
	flowSelf   = -3
	predInput  = -4
	infinity32 = math.MaxInt32
)

// Kinds of residual arcs.
const (
	arcNone = iota // no residual capacity
	arcNode        // to a node
	arcSink        // into a deficit v_in
)

// flowNode holds what is read for every arc into a node, kept together so
// that following an arc touches one cache line.
type flowNode struct {
	pred  int32 // states: who feeds v_in (see the flow records)
	q     int32 // potential: the reduced cost c + q[x] - q[y] is >= 0
	stamp int32 // search of the last visit, or -phase when dead
	dist  int32 // tentative distance in the current phase, or infinity32
}

// coverFlow is the residual network of the cover flow, contracted: a v_in
// has exactly one residual arc out (back to whoever feeds it, or to the
// sink when it is a deficit), so an arc into v_in is followed through at
// once. Nodes are v_out = v (0..n-1), input i = n+i, and the hub T = n+m.
// Deficits keep potential 0 throughout, as in the uncontracted network.
type coverFlow struct {
	g      *Network
	inputs [][]int32
	n, hub int32
	node   []flowNode
	succ   []int32 // where each v_out (and each input) sends its unit
	cur    []int32 // descent cursor of each node in the current pass
	look   []int32 // lookahead cursor of each node for the current potentials
	hubs   []int32 // states that may have succ == flowHub (stale ones skipped)
	inR    []bool  // the reached states
	// hubOnly marks the live nodes that reach a deficit only through the
	// hub; a pass skips them once the hub is on the path or used up.
	hubOnly []bool
	plain   bool // a pass without that shortcut
	// inputsOf lists the inputs driving each state w at
	// inputsOf[inPtr[w]:inPtr[w+1]].
	inPtr    []int64
	inputsOf []int32
	// The hub is the one node that several paths of a pass may share: its
	// cursor lives here and is reset every pass.
	hubCur    int64
	hubOnPath bool
	pass      int32
	search    int32 // number of the current search (stamps)
	passStart int32 // number of the first search of the current pass
	phase     int32 // potentials' generation; stamp -phase marks dead nodes
	hubFirst  int32 // search that first entered the hub in this pass, or 0
	hubDead   int32 // phase in which the hub was found dead
	unknown   bool  // the current search met a node of an earlier search
	visited   []int32
	touched   []int32
	buckets   [][]int32
	stack     []int32
	pos       []int64
}

// rangeLen returns the number of arc positions of node x.
func (f *coverFlow) rangeLen(x int32) int64 {
	switch {
	case x < f.n:
		return f.g.out.Ptr[x+1] - f.g.out.Ptr[x] + 2
	case x < f.hub:
		return int64(len(f.inputs[x-f.n])) + 1
	}
	return int64(len(f.inputs)) + int64(len(f.hubs))
}

// through follows an arc of cost c into w_in on along w_in's only residual
// arc.
func (f *coverFlow) through(w, c int32) (int32, int32, int) {
	switch p := f.node[w].pred; {
	case p >= 0:
		return p, c, arcNode
	case p == flowNone:
		return -1, c, arcSink
	case p == flowSelf:
		return w, c - 1, arcNode
	default:
		return f.n + (predInput - p), c, arcNode
	}
}

// arc returns the head, the original cost and the kind of the residual arc
// at position pos of node x.
func (f *coverFlow) arc(x int32, pos int64) (int32, int32, int) {
	switch {
	case x < f.n: // v_out: its edges, then "uncovered", then the hub
		lo, hi := f.g.out.Ptr[x], f.g.out.Ptr[x+1]
		s := f.succ[x]
		switch {
		case pos < hi-lo:
			w := f.g.out.Adj[lo+pos]
			if s == w {
				return 0, 0, arcNone
			}
			return f.through(w, 0)
		case pos == hi-lo:
			if s == flowSelf {
				return 0, 0, arcNone
			}
			return f.through(x, 1)
		}
		if s == flowHub {
			return 0, 0, arcNone
		}
		return f.hub, 0, arcNode
	case x < f.hub: // input: the states it drives, then back to the hub
		in := f.inputs[x-f.n]
		s := f.succ[x]
		if pos < int64(len(in)) {
			w := in[pos]
			if s == w {
				return 0, 0, arcNone
			}
			return f.through(w, 0)
		}
		if s == flowNone {
			return 0, 0, arcNone
		}
		return f.hub, 0, arcNode
	}
	// The hub: unused inputs, then back to the stem ends.
	m := int64(len(f.inputs))
	if pos < m {
		y := f.n + int32(pos)
		if f.succ[y] != flowNone {
			return 0, 0, arcNone
		}
		return y, 0, arcNode
	}
	v := f.hubs[pos-m]
	if f.succ[v] != flowHub {
		return 0, 0, arcNone
	}
	return v, 0, arcNode
}

// apply records that the augmenting path leaves node x by its arc at pos.
// Entering a node cancels its old flow implicitly: the leaving arc
// overwrites the record, and the v_in passed through gets its new feeder.
func (f *coverFlow) apply(x int32, pos int64) {
	switch {
	case x < f.n:
		lo, hi := f.g.out.Ptr[x], f.g.out.Ptr[x+1]
		switch {
		case pos < hi-lo:
			w := f.g.out.Adj[lo+pos]
			f.succ[x] = w
			f.node[w].pred = x
		case pos == hi-lo:
			f.succ[x] = flowSelf
			f.node[x].pred = flowSelf
		default:
			f.succ[x] = flowHub
			f.hubs = append(f.hubs, x)
		}
	case x < f.hub:
		i := x - f.n
		in := f.inputs[i]
		if pos < int64(len(in)) {
			w := in[pos]
			f.succ[x] = w
			f.node[w].pred = predInput - i
		} else {
			f.succ[x] = flowNone
		}
	}
}

// dimension computes the largest stem-cycle cover on the reached states,
// starting from m, a maximum matching of inNeighbourCSR(g, inputs).
func dimension(g *Network, inputs [][]int32, inR []bool, nR int, m *matching.Matching) (int, error) {
	n := g.N()
	if nR == 0 {
		return 0, nil
	}
	if int64(n)+1+int64(len(inputs)) > math.MaxInt32/2 || nR > math.MaxInt32/4 {
		return 0, &TooLargeError{What: "the controllable dimension", States: n, Limit: math.MaxInt32 / 4}
	}
	size := n + len(inputs) + 1
	f := &coverFlow{g: g, inputs: inputs, n: int32(n), hub: int32(n + len(inputs)), phase: 1}
	f.node = make([]flowNode, size)
	f.succ = make([]int32, size)
	f.cur = make([]int32, size)
	f.look = make([]int32, size)
	f.inR = inR
	f.hubOnly = make([]bool, size)
	f.inPtr = make([]int64, n+1)
	for _, in := range inputs {
		for _, w := range in {
			f.inPtr[w+1]++
		}
	}
	for w := 0; w < n; w++ {
		f.inPtr[w+1] += f.inPtr[w]
	}
	f.inputsOf = make([]int32, f.inPtr[n])
	next := make([]int64, n)
	copy(next, f.inPtr[:n])
	for i, in := range inputs {
		for _, w := range in {
			f.inputsOf[next[w]] = int32(i)
			next[w]++
		}
	}
	next = nil
	for i := range f.node {
		f.node[i] = flowNode{pred: flowNone, dist: infinity32}
		f.succ[i] = flowNone
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
		f.node[w].pred, f.succ[c] = predInput-(c-int32(n)), int32(w)
		used++
	}
	// Each used input takes its unit from the hub, which takes it from a
	// free v_out. There are enough: free outs = |R| - (rows matched to
	// states) >= rows matched to inputs, since at most |R| rows are matched.
	var sources []int32
	for v := 0; v < n; v++ {
		if !inR[v] || f.succ[v] != flowNone {
			continue
		}
		if used > 0 {
			f.succ[v] = flowHub
			f.hubs = append(f.hubs, int32(v))
			used--
			continue
		}
		sources = append(sources, int32(v))
	}
	// Phases: shortest distances, then augmenting passes along admissible
	// arcs until a pass finds no path.
	stalled := false
	for len(sources) > 0 {
		if len(f.hubs) > 2*nR {
			k := 0
			for _, v := range f.hubs {
				if f.succ[v] == flowHub {
					f.hubs[k] = v
					k++
				}
			}
			f.hubs = f.hubs[:k]
		}
		if f.shortest(sources) == 0 && stalled {
			panic("structural: internal error: the cover flow makes no progress")
		}
		before := len(sources)
		for f.live(sources) {
			if f.augment(sources) > 0 {
				continue
			}
			// The pass that skips hub-only nodes found nothing although
			// the hub is live: one plain pass decides.
			f.plain = true
			k := f.augment(sources)
			f.plain = false
			if k == 0 {
				break
			}
		}
		k := 0
		for _, v := range sources {
			if f.succ[v] == flowNone {
				sources[k] = v
				k++
			}
		}
		sources = sources[:k]
		stalled = len(sources) == before
	}
	uncovered := 0
	for v := 0; v < n; v++ {
		if inR[v] && f.succ[v] == flowSelf {
			uncovered++
		}
	}
	return nR - uncovered, nil
}

// shortest runs Dial's algorithm on reduced costs from all sources until
// the nearest deficit, at distance D, and raises the potentials: q[x] +=
// min(dist[x], D) - D, which keeps every reduced cost non-negative and makes
// the arcs of shortest paths admissible (reduced cost 0). When D > 0 it
// also resets the lookahead cursors, which hold for one set of potentials.
func (f *coverFlow) shortest(sources []int32) int32 {
	nd := f.node
	bound := int32(infinity32) // the best distance to a deficit so far
	push := func(x, d int32) {
		if nd[x].dist == infinity32 {
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
				case arcSink:
					if base+c < bound {
						bound = base + c
					}
				case arcNode:
					if t := base + c - nd[y].q; t < nd[y].dist && t < bound {
						push(y, t)
					}
				}
			}
		}
	}
	if bound == infinity32 {
		panic("structural: internal error: no augmenting path in the cover flow")
	}
	for _, x := range f.touched {
		if d := nd[x].dist; d < bound {
			nd[x].q += d - bound
		}
		nd[x].dist = infinity32
	}
	f.touched = f.touched[:0]
	for i := range f.buckets {
		f.buckets[i] = f.buckets[i][:0]
	}
	if bound > 0 {
		clear(f.look)
		f.phase++
	}
	return bound
}

// augment runs one depth-first pass from the sources along admissible
// arcs, augmenting vertex-disjoint paths, and returns how many it found.
// At every node the lookahead first tries the arcs straight into a
// deficit, and the descent alternates its scanning direction from pass to
// pass (Pothen and Fan's lookahead and fairness). The hub is exempt from
// the disjointness (it has unbounded capacity); it only may not appear
// twice on one path, and its cursor persists through the pass. Dead nodes
// are never entered; unless f.plain, neither are hub-only nodes once the
// hub is on the path or its arcs are used up. A search that fails without
// meeting a node of an earlier search of the pass (nor skipping a hub-only
// node) saw a closed set with no admissible arc into a deficit: it stamps
// that set dead.
func (f *coverFlow) augment(sources []int32) int {
	nd := f.node
	hub := f.hub
	f.pass++
	if f.search > math.MaxInt32-int32(len(sources))-2 {
		// Search numbers run out: forget the visits (dead marks stay).
		for i := range nd {
			if nd[i].stamp > 0 {
				nd[i].stamp = 0
			}
		}
		f.search = 0
	}
	f.passStart = f.search + 1
	f.hubCur = 0
	f.hubFirst = 0
	backward := f.pass&1 == 0
	dead := -f.phase
	found := 0
	for _, src := range sources {
		if f.succ[src] != flowNone || nd[src].stamp >= f.passStart || nd[src].stamp == dead {
			continue
		}
		if f.hubOnly[src] && !f.plain && f.hubCur >= f.rangeLen(hub) {
			continue
		}
		f.search++
		search := f.search
		nd[src].stamp = search
		f.visited = append(f.visited[:0], src)
		f.unknown = false
		f.cur[src] = 0
		f.stack = append(f.stack[:0], src)
		f.pos = f.pos[:0]
		f.hubOnPath = false
		success := false
		for len(f.stack) > 0 {
			x := f.stack[len(f.stack)-1]
			end := f.rangeLen(x)
			qx := nd[x].q
			if x != hub {
				hit := int64(-1)
				for int64(f.look[x]) < end {
					p := int64(f.look[x])
					f.look[x]++
					if _, c, kind := f.arc(x, p); kind == arcSink && c+qx == 0 {
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
					success = true
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
				if kind != arcNode || c+qx != nd[y].q {
					continue
				}
				if y == hub {
					if f.hubDead == f.phase {
						continue
					}
					if f.hubFirst != search && f.hubFirst != 0 {
						// The hub's arcs were partly scanned by an
						// earlier search of this pass.
						f.unknown = true
					}
					if f.hubOnPath {
						continue
					}
					if f.hubFirst == 0 {
						f.hubFirst = search
					}
					f.hubOnPath = true
				} else {
					st := nd[y].stamp
					if st == dead {
						continue
					}
					if f.hubOnly[y] && !f.plain && (f.hubOnPath || f.hubCur >= f.rangeLen(hub)) {
						f.unknown = true
						continue
					}
					if st >= f.passStart {
						if st != search {
							f.unknown = true
						}
						continue
					}
					nd[y].stamp = search
					f.visited = append(f.visited, y)
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
		if !success && !f.unknown {
			// Everything this search saw leads to no deficit along
			// admissible arcs, and augmenting elsewhere cannot change
			// that until the potentials move.
			for _, y := range f.visited {
				nd[y].stamp = dead
			}
			if f.hubFirst == search {
				f.hubDead = f.phase
			}
		}
	}
	return found
}
