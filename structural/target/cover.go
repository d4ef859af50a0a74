package target

import (
	"cmp"
	"slices"

	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural"
)

// design is a candidate answer in local indices of a region: the signals,
// and for dedicated designs the states newly driven.
type design struct {
	signals [][]int32
	added   []int32 // dedicated actuators added (Actuators mode)
	cost    structural.Cost
	method  string
	proof   string
	// support is the set S of a stem–cycle cover, increasing.
	support []int32
}

// stemCycleCover finds a set S of states holding the targets and dedicated
// drivers such that the subnetwork S, with every edge from outside S
// removed, is structurally controllable by Lin's theorem: each state of S
// has a distinct in-neighbour in S or its own driver (no dilation), and
// every source component of S holds a driver (all reached). Removing edges
// sets parameters to zero, which can only lower the generic rank; the
// subnetwork then evolves on its own and steers all of S, so the design
// steers the targets (a proof, whatever else the network holds).
//
// The drivers are the states of S left without a matched in-neighbour. A
// matching of the bipartite graph (in-neighbour rows, state columns) in
// which every non-target state may also be matched to itself ("not in S")
// and every column is covered, matched or driven, describes such an S: S is
// the closure of the targets under "matched in-neighbour of". The cheapest
// uncovered columns are found by the matroid greedy over columns offered by
// decreasing cost (forbidden states first, existing devices last, at no
// cost); columns outside S are then re-matched to themselves, so the cost
// is that of the drivers in S, and it is the least cost of any
// dilation-free cover of the targets. Each source component of S without a
// driver then gets one (a greedy step): in Signals mode one of its states
// joins an existing signal; in Actuators mode its cheapest allowed state,
// or the cheapest allowed state outside S (an existing device costs
// nothing) with a path into it through states outside S, the path joining
// S as a new stem.
//
// Time: a priority matching on the region (O(E) plus its augmenting
// searches; again, up to seven times, when forbidden states block it) and
// one strongly connected components pass on S.
func stemCycleCover(r *region, mode Mode) (*design, bool) {
	if mode == Signals {
		plain := *r
		plain.dev = structural.Devices{} // signals know no device table
		r = &plain
	}
	n := r.n
	order := make([]int32, n)
	for i := range order {
		order[i] = int32(i)
	}
	// Classes: forbidden states, then allowed ones by decreasing cost,
	// then existing devices (free).
	key := func(v int32) (int, structural.Cost) {
		switch {
		case !r.dev.Allowed(v):
			return 0, 0
		case r.dev.Has(v):
			return 2, 0
		case mode == Actuators:
			return 1, -r.dev.CostOf(v)
		}
		return 1, 0
	}
	slices.SortStableFunc(order, func(a, c int32) int {
		ka, ca := key(a)
		kc, cc := key(c)
		if d := cmp.Compare(ka, kc); d != 0 {
			return d
		}
		return cmp.Compare(ca, cc)
	})
	var classEnd []int
	for i := 1; i <= n; i++ {
		if i == n {
			classEnd = append(classEnd, i)
			break
		}
		ka, ca := key(order[i-1])
		kb, cb := key(order[i])
		if ka != kb || ca != cb {
			classEnd = append(classEnd, i)
		}
	}
	// Forbidden states that S needs but that can be neither covered nor
	// reached are banned as in-neighbours, and the cover redone (a few
	// rounds at most).
	banned := make([]bool, n)
	for round := 0; round < 8; round++ {
		d, stuck, ok := coverOnce(r, mode, order, classEnd, banned)
		if ok {
			return d, true
		}
		if len(stuck) == 0 {
			return nil, false
		}
		for _, v := range stuck {
			banned[v] = true
		}
	}
	return nil, false
}

// coverOnce is one attempt of stemCycleCover with some states banned as
// in-neighbours. It returns the design, or the non-target forbidden
// states that blocked it (none: a target blocked it).
func coverOnce(r *region, mode Mode, order []int32, classEnd []int, banned []bool) (*design, []int32, bool) {
	n := r.n
	// Row v of b (a column to cover) lists v's in-neighbours that are not
	// banned, then v itself when v is not a target and has no self-loop.
	b := &matching.CSR{Rows: n, Cols: n, Ptr: make([]int64, n+1)}
	b.Adj = make([]int32, 0, len(r.in.Adj)+n)
	for v := int32(0); int(v) < n; v++ {
		loop := false
		for _, u := range r.in.Row(v) {
			loop = loop || u == v
			if !banned[u] || u == v {
				b.Adj = append(b.Adj, u)
			}
		}
		if !r.isTarget[v] && !loop {
			b.Adj = append(b.Adj, v)
		}
		b.Ptr[v+1] = int64(len(b.Adj))
	}
	mate, _ := priorityMatch(b, order, classEnd, nil)
	// S: the closure of the targets under "matched in-neighbour".
	inS := make([]bool, n)
	var S []int32
	for _, t := range r.targets {
		inS[t] = true
		S = append(S, t)
	}
	for i := 0; i < len(S); i++ {
		if u := mate[S[i]]; u >= 0 && !inS[u] {
			inS[u] = true
			S = append(S, u)
		}
	}
	slices.Sort(S)
	isDriver := make([]bool, n)
	var drivers, stuck []int32
	for _, v := range S {
		switch {
		case mate[v] < 0 && !r.dev.Allowed(v):
			if r.isTarget[v] {
				return nil, nil, false
			}
			stuck = append(stuck, v)
		case mate[v] < 0:
			isDriver[v] = true
			drivers = append(drivers, v)
		case r.dev.Has(v):
			isDriver[v] = true
		}
	}
	if len(stuck) > 0 {
		return nil, stuck, false
	}
	// Source components of S, edges between states of S only.
	pos := make([]int32, n)
	for i, v := range S {
		pos[v] = int32(i)
	}
	sg := &matching.CSR{Rows: len(S), Cols: len(S), Ptr: make([]int64, len(S)+1)}
	for i, v := range S {
		for _, w := range r.out.Row(v) {
			if inS[w] {
				sg.Adj = append(sg.Adj, pos[w])
			}
		}
		sg.Ptr[i+1] = int64(len(sg.Adj))
	}
	comps := structural.SCC(sg)
	covered := make([]bool, comps.Count)
	for i, v := range S {
		if isDriver[v] {
			covered[comps.Of[i]] = true
		}
	}
	// Each source component of S without a driver gets one: in Signals
	// mode its first state joins an existing signal; in Actuators mode its
	// cheapest allowed state, or, when cheaper or the only way, the
	// cheapest allowed state outside S with a path into it through states
	// outside S: the path joins S as a stem (each of its states matched to
	// the one before it, the first driven).
	members := make([][]int32, comps.Count)
	for i, v := range S {
		if k := comps.Of[i]; comps.Source[k] && !covered[k] {
			members[k] = append(members[k], v)
		}
	}
	// An existing device outside S costs nothing to use as a stem.
	costNow := func(v int32) structural.Cost {
		if r.dev.Has(v) {
			return 0
		}
		return r.dev.CostOf(v)
	}
	next := make([]int32, n) // on a path: the state it acts on
	seen := make([]int32, n) // search stamp
	var queue, extra []int32
	onStem := make([]bool, n) // added to S by a path below
	for k, mem := range members {
		if len(mem) == 0 {
			continue
		}
		reached := false
		for _, v := range mem {
			for _, u := range r.in.Row(v) {
				reached = reached || onStem[u]
			}
		}
		if reached {
			continue // an earlier stem enters this component
		}
		if mode == Signals {
			extra = append(extra, mem[0])
			continue
		}
		pick := int32(-1)
		for _, v := range mem {
			if r.dev.Allowed(v) && (pick < 0 || r.dev.CostOf(v) < r.dev.CostOf(pick)) {
				pick = v
			}
		}
		queue = append(queue[:0], mem...)
		for _, v := range mem {
			seen[v] = int32(k + 1)
		}
		out := int32(-1)
		for i := 0; i < len(queue); i++ {
			for _, u := range r.in.Row(queue[i]) {
				if inS[u] || seen[u] == int32(k+1) {
					continue
				}
				seen[u] = int32(k + 1)
				next[u] = queue[i]
				queue = append(queue, u)
				if r.dev.Allowed(u) && (out < 0 || costNow(u) < costNow(out)) {
					out = u
				}
			}
		}
		switch {
		case out >= 0 && (pick < 0 || costNow(out) < r.dev.CostOf(pick)):
			for u := out; !inS[u]; u = next[u] {
				inS[u], onStem[u] = true, true
				S = append(S, u)
			}
			extra = append(extra, out)
		case pick >= 0:
			extra = append(extra, pick)
		default:
			// Nothing can reach this component: keep it out of S.
			for _, v := range mem {
				if r.isTarget[v] {
					return nil, nil, false
				}
				stuck = append(stuck, v)
			}
		}
	}
	if len(stuck) > 0 {
		return nil, stuck, false
	}
	slices.Sort(S)
	slices.Sort(extra)
	d := &design{method: "stem_cycle_cover", proof: "lin_subnetwork", support: S}
	if mode == Actuators {
		added := append(drivers, extra...)
		slices.Sort(added)
		var kept []int32
		for _, v := range added {
			if !r.dev.Has(v) {
				kept = append(kept, v)
				d.cost += r.dev.CostOf(v)
			}
		}
		d.added = kept
		d.signals = dedicated(slices.Concat(r.existing(), kept))
		return d, nil, true
	}
	if len(drivers) == 0 {
		d.signals = [][]int32{extra}
		return d, nil, true
	}
	d.signals = make([][]int32, len(drivers))
	for i, v := range drivers {
		d.signals[i] = []int32{v}
	}
	for i, v := range extra {
		d.signals[i%len(drivers)] = append(d.signals[i%len(drivers)], v)
	}
	return d, nil, true
}
