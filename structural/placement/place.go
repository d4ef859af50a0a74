package placement

import (
	"errors"
	"math"
	"slices"

	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural"
)

// Placement is a cheapest set of dedicated devices that makes a network
// structurally controllable (actuators) or observable (sensors).
//
// Cheapest means the least total cost of the added devices and, among
// placements of equal cost, the fewest devices (when the costs are small
// enough to break ties exactly; see FewestDevices). With unit costs it is
// the minimum number of devices.
type Placement struct {
	// Property is the property the devices provide: actuators for
	// Controllability, sensors for Observability.
	Property structural.Property `json:"-"`
	// Feasible reports whether the allowed states can make the network
	// structurally controllable (observable).
	Feasible bool `json:"feasible"`
	// Devices is the complete set, existing devices included, in
	// increasing order.
	Devices structural.States `json:"devices"`
	// Added lists the new devices, in increasing order.
	Added structural.States `json:"added"`
	// Existing lists the devices kept, in increasing order.
	Existing structural.States `json:"existing"`
	// Cost is the total cost of Added.
	Cost structural.Cost `json:"total_cost"`
	// FewestDevices reports whether ties in cost were broken exactly
	// toward fewer devices. It is false only when costs times the number
	// of states would overflow 64-bit integers.
	FewestDevices bool `json:"fewest_devices"`
	// Unmatchable lists the states of dilations (contractions, for
	// sensors) that only devices on forbidden states could remove; Deficit
	// is how many devices they lack. Both are empty when feasible.
	Unmatchable structural.States `json:"unmatchable"`
	Deficit     int               `json:"unmatchable_deficit"`
	// Unreached lists the source components (sink components, for
	// sensors) with no state allowed to take a device: nothing can reach
	// (observe) them.
	Unreached []structural.States `json:"unreached_components"`
	// Matched is the size of the matching of the states among themselves
	// in the returned design.
	Matched int `json:"-"`

	p       *placer
	net     *structural.Network
	devices structural.Devices
	added   []int32
}

// CostOf returns the cost of a new device on state v as given in
// Devices.Cost (Unit when it was nil).
func (pl *Placement) CostOf(v int32) structural.Cost { return pl.devices.CostOf(v) }

// IsAdded reports whether v holds a new device of the placement.
func (pl *Placement) IsAdded(v int32) bool {
	_, ok := slices.BinarySearch(pl.added, v)
	return ok
}

// Place returns a cheapest set of dedicated devices (each on one state)
// that, with the existing ones, makes g structurally controllable
// (actuators, for Controllability) or observable (sensors, for
// Observability) under the restrictions of d.
//
// A set S of dedicated actuators is enough exactly when (Lin 1974) every
// source strongly connected component holds a state of S, and the states
// outside S can be matched, each to a distinct in-neighbour. So a cheapest S
// is the set of states left unmatched by a matching M chosen to minimise
// the cost of the unmatched states, subject to every source component
// holding an unmatched allowed state, and to every forbidden state being
// matched. This is the minimum-weight maximum-matching formulation of
// Pequito, Kar & Aguiar, "Minimum cost input/output design for large-scale
// linear structural systems", Automatica (2016), solved here as a
// minimum-cost flow that exploits its shape:
//
//  1. Without the source components, the sets of states a matching leaves
//     uncovered are the bases of a matroid (the dual of the transversal
//     matroid), so the greedy algorithm is exact. Without forbidden states
//     it starts from the network's maximum matching and offers states by
//     increasing cost, each joining the uncovered set when an alternating
//     path moves an uncovered state's place to it (cheapest.go); with
//     forbidden states, states are offered by decreasing cost (forbidden
//     ones first) to a matching grown class by class by Hopcroft–Karp
//     augmentation, which never uncovers a state covered before. States
//     found unable to move are never searched again.
//  2. Node potentials for this optimal flow come from one pass over the
//     alternating paths (the cost of the most expensive uncovered state
//     that reaches each state), when step 3 or Roles needs them.
//  3. Each source component k then sends one mandatory unit through an
//     arc of cost c(v) into one of its allowed states v. Components already
//     holding an uncovered allowed state take it at no cost; the others are
//     routed by successive shortest paths (Dijkstra with potentials, then
//     vertex-disjoint augmentations along zero reduced-cost arcs).
//
// Sensors are actuators of the transposed network: sink components take
// the place of source components and out-neighbours that of in-neighbours.
//
// Time: without forbidden states, step 1 is the network's maximum matching
// (computed once and kept on the network), one alternating search, a sort
// and the successful searches of the greedy (short on the networks met in
// practice: on a directed Erdős–Rényi network of 10^6 states and 5*10^6
// edges with random costs, about the time of the matching); with
// forbidden states O(K E sqrt(N)) in the worst case with K distinct costs.
// Step 2 is O(E), step 3 O(R (E + N) log N), where R <= the number of
// source components that need routing (a handful of rounds with few
// distinct costs). Memory is O(N + E) beyond the network.
//
// The result is infeasible when some forbidden states form a dilation that
// no allowed device can remove, or a source component has no allowed
// state; the placement then covers everything else.
func Place(g *structural.Network, p structural.Property, d structural.Devices) (*Placement, error) {
	if err := d.Check(g); err != nil {
		return nil, err
	}
	pr, err := newPlacer(graphOf(g, p), d)
	if err != nil {
		return nil, err
	}
	h := g
	if p == structural.Observability {
		h = g.Transpose()
	}
	pr.match, pr.comps = h.MatchingAndComponents()
	return pr.solve().wrap(g, p, d, g.N()), nil
}

// graph is the part of a network a placement reads: its rows both ways.
type graph struct {
	Out, In matching.CSR
}

func (g *graph) N() int { return g.Out.Rows }

// graphOf returns the rows of g on which p is controllability.
func graphOf(g *structural.Network, p structural.Property) *graph {
	if p == structural.Observability {
		return &graph{Out: *g.In(), In: *g.Out()}
	}
	return &graph{Out: *g.Out(), In: *g.In()}
}

// raw is a placement in state indices, before it is tied to a network.
type raw struct {
	feasible, fewest bool
	devices, added   []int32
	cost             int64
	unmatchable      []int32
	deficit          int
	unreached        [][]int32
	matched          int
	p                *placer
}

// wrap ties r to g, keeping only the states below n (a completion's
// extended network has more).
func (r *raw) wrap(g *structural.Network, prop structural.Property, d structural.Devices, n int) *Placement {
	keep := func(ids []int32) []int32 {
		out := ids[:0:0]
		for _, v := range ids {
			if int(v) < n {
				out = append(out, v)
			}
		}
		return out
	}
	devices, added := keep(r.devices), keep(r.added)
	existing := make([]int32, 0, len(devices)-len(added))
	k := 0
	for _, v := range devices {
		if k < len(added) && added[k] == v {
			k++
			continue
		}
		existing = append(existing, v)
	}
	cost := structural.Cost(r.cost)
	if d.Cost == nil {
		cost *= structural.Unit
	}
	pl := &Placement{
		Property: prop, Feasible: r.feasible, FewestDevices: r.fewest,
		Devices: g.States(devices), Added: g.States(added), Existing: g.States(existing),
		Cost: cost, Unmatchable: g.States(keep(r.unmatchable)), Deficit: r.deficit,
		Matched: r.matched, p: r.p, net: g, devices: d, added: added,
	}
	pl.Unreached = make([]structural.States, len(r.unreached))
	for i, c := range r.unreached {
		pl.Unreached[i] = g.States(c)
	}
	return pl
}

// costLimit bounds the sum of the working costs so that potentials and
// path lengths stay far from overflow.
const costLimit = math.MaxInt64 / 8

// placer holds one placement computation. Vertices of the flow network
// are numbered: column (state in-copy) v is v, row (state out-copy) u is
// n+u, the terminal T is 2n (the supply of the rows and of the actuator
// pool P, merged: they are joined by zero-cost arcs both ways), and the
// mandatory source of source component j is 2n+1+j.
type placer struct {
	g         *graph
	n         int
	cost      []structural.Cost // caller's costs, nil = Unit
	w         []int64           // working cost of a new device on each state
	forbidden []bool
	existing  []bool
	lexico    bool

	comps  *structural.Components // given, or found by components
	match  *matching.Matching     // a maximum matching of g, or nil
	srcIdx []int32                // per component: index among source components, -1
	nsrc   int
	aPtr   []int64 // allowed states of each source component
	aAdj   []int32

	rowMate, colMate []int32
	dead             []bool // forbidden state left uncovered
	qAt              []int32
	pot              []int64

	unmatchable []int32
	deficit     int
	unreached   [][]int32
}

// newPlacer sets up a placement on g; d has been checked (Devices.Check)
// against the states of g (completions add states with existing devices).
func newPlacer(g *graph, d structural.Devices) (*placer, error) {
	n := g.N()
	p := &placer{g: g, n: n, cost: d.Cost, forbidden: d.Forbidden, existing: d.Existing}
	var sum int64
	for v := 0; v < n; v++ {
		c := p.costOf(int32(v))
		if p.isExisting(int32(v)) {
			continue
		}
		if p.isForbidden(int32(v)) {
			continue
		}
		if c > costLimit-sum {
			return nil, errors.New("placement: device costs too large (their sum overflows)")
		}
		sum += c
	}
	// Working costs: c*(n+1)+1 makes "least cost, then fewest devices"
	// one exact objective whenever it fits.
	wmul := int64(n) + 1
	p.lexico = sum <= (costLimit-int64(n))/wmul
	p.w = make([]int64, n)
	for v := 0; v < n; v++ {
		switch {
		case p.isExisting(int32(v)):
			p.w[v] = 0
		case p.lexico:
			p.w[v] = p.costOf(int32(v))*wmul + 1
		default:
			p.w[v] = p.costOf(int32(v))
		}
	}
	return p, nil
}

// costOf returns the cost of a device on v: 1 when the caller gave no
// costs (wrap scales the total to Unit each), so that tie-breaking by
// count stays exact on the largest networks.
func (p *placer) costOf(v int32) int64 {
	if p.cost == nil {
		return 1
	}
	return int64(p.cost[v])
}

func (p *placer) isForbidden(v int32) bool { return p.forbidden != nil && p.forbidden[v] }
func (p *placer) isExisting(v int32) bool  { return p.existing != nil && p.existing[v] }

// qOf returns the mandatory source serving column v, or -1.
func (p *placer) qOf(v int32) int32 {
	j := p.srcIdx[p.comps.Of[v]]
	if j >= 0 && p.qAt[j] == v {
		return j
	}
	return -1
}

// actuated reports whether column v gets a device in the current flow:
// served by the pool or by a mandatory source.
func (p *placer) actuated(v int32) bool {
	return p.colMate[v] < 0 && !p.dead[v]
}

func (p *placer) solve() *raw {
	p.components()
	p.greedy()
	p.route()
	return p.result()
}

// components finds the source components and their allowed states.
func (p *placer) components() {
	g, n := p.g, p.n
	if p.comps == nil {
		p.comps = structural.SCC(&g.Out)
	}
	src := p.comps.Source
	p.srcIdx = make([]int32, p.comps.Count)
	for k, s := range src {
		p.srcIdx[k] = -1
		if s {
			p.srcIdx[k] = int32(p.nsrc)
			p.nsrc++
		}
	}
	p.aPtr = make([]int64, p.nsrc+1)
	for v := 0; v < n; v++ {
		if j := p.srcIdx[p.comps.Of[v]]; j >= 0 && !p.isForbidden(int32(v)) {
			p.aPtr[j+1]++
		}
	}
	for j := 0; j < p.nsrc; j++ {
		p.aPtr[j+1] += p.aPtr[j]
	}
	p.aAdj = make([]int32, p.aPtr[p.nsrc])
	fill := make([]int64, p.nsrc)
	copy(fill, p.aPtr[:p.nsrc])
	for v := 0; v < n; v++ {
		if j := p.srcIdx[p.comps.Of[v]]; j >= 0 && !p.isForbidden(int32(v)) {
			p.aAdj[fill[j]] = int32(v)
			fill[j]++
		}
	}
	// Source components with no allowed state cannot be reached.
	at := make([]int32, p.comps.Count)
	nEmpty := int32(0)
	for k, j := range p.srcIdx {
		at[k] = -1
		if j >= 0 && p.aPtr[j] == p.aPtr[j+1] {
			at[k] = nEmpty
			nEmpty++
		}
	}
	if nEmpty > 0 {
		p.unreached = make([][]int32, nEmpty)
		for v := 0; v < n; v++ {
			if i := at[p.comps.Of[v]]; i >= 0 {
				p.unreached[i] = append(p.unreached[i], int32(v))
			}
		}
		for i := range p.unreached {
			p.unreached[i] = slices.Clip(p.unreached[i])
		}
	}
	p.qAt = make([]int32, p.nsrc)
	for j := range p.qAt {
		p.qAt[j] = -1
	}
}

// greedy covers states by a matching chosen greedily by decreasing working
// cost, forbidden states first: a maximum-weight independent set of the
// transversal matroid of the columns.
// classGreedy makes greedy build its matching class by class even without
// forbidden states, as it did before cheapestFree: tests compare the two.
var classGreedy = false

func (p *placer) greedy() {
	g, n := p.g, p.n
	p.dead = make([]bool, n)
	hasForbidden := false
	for v := 0; v < n; v++ {
		if p.isForbidden(int32(v)) {
			hasForbidden = true
			break
		}
	}
	if !hasForbidden && !classGreedy {
		m := p.match
		if m == nil {
			m = matching.Maximum(&g.Out, &g.In)
		}
		// Costs that are equal on every state with an in-edge (states
		// without one are never covered): any maximum matching is a
		// cheapest one.
		uniform, w := true, int64(-1)
		for v := 0; v < n && uniform; v++ {
			if g.In.Ptr[v+1] > g.In.Ptr[v] {
				uniform = w < 0 || p.w[v] == w
				w = p.w[v]
			}
		}
		if uniform {
			// The flow changes the matching: work on a copy.
			p.rowMate, p.colMate = slices.Clone(m.RowMate), slices.Clone(m.ColMate)
			return
		}
		p.cheapestFree(m)
		return
	}
	p.rowMate = make([]int32, n)
	p.colMate = make([]int32, n)
	for i := range p.rowMate {
		p.rowMate[i], p.colMate[i] = -1, -1
	}
	// Forbidden states: a greedy matching built class by class, forbidden
	// states first, whose failures witness the dilations no allowed device
	// removes. Left side: columns, adjacent to their in-neighbour rows.
	adj := &sideAdj{n0: int32(n), ptr: g.In.Ptr, adj: g.In.Adj}
	au := newAugmenter(adj, n, p.colMate, p.rowMate)
	order := make([]int32, 0, n)
	for v := 0; v < n; v++ {
		if p.isForbidden(int32(v)) {
			order = append(order, int32(v))
		}
	}
	au.grow(order, true)
	for _, v := range order {
		if p.colMate[v] < 0 {
			p.dead[v] = true
			p.deficit++
		}
	}
	if p.deficit > 0 {
		// The dead marks now hold the alternating closure of the
		// uncovered forbidden states: a set of forbidden states with
		// fewer distinct in-neighbours than members.
		for v := 0; v < n; v++ {
			if au.dead[v] {
				p.unmatchable = append(p.unmatchable, int32(v))
			}
		}
	}
	order = order[:0]
	for v := 0; v < n; v++ {
		if !p.isForbidden(int32(v)) {
			order = append(order, int32(v))
		}
	}
	slices.SortStableFunc(order, func(a, b int32) int {
		switch {
		case p.w[a] > p.w[b]:
			return -1
		case p.w[a] < p.w[b]:
			return 1
		}
		return 0
	})
	for i := 0; i < len(order); {
		j := i + 1
		for j < len(order) && p.w[order[j]] == p.w[order[i]] {
			j++
		}
		au.grow(order[i:j], true)
		i = j
	}
}

// potentials sets node potentials under which every residual arc of the
// greedy flow has a non-negative reduced cost: a column's potential is the
// working cost of the most expensive uncovered column that reaches it along
// alternating paths (0 if none), a row's the largest potential among the
// columns it could take instead of its mate.
func (p *placer) potentials() {
	if p.pot != nil {
		return
	}
	g, n := p.g, p.n
	p.pot = make([]int64, 2*n+1+p.nsrc)
	roots := make([]int32, 0)
	for v := 0; v < n; v++ {
		if p.actuated(int32(v)) && p.w[v] > 0 {
			roots = append(roots, int32(v))
		}
	}
	slices.SortStableFunc(roots, func(a, b int32) int {
		switch {
		case p.w[a] > p.w[b]:
			return -1
		case p.w[a] < p.w[b]:
			return 1
		}
		return 0
	})
	set := make([]bool, n)
	queue := make([]int32, 0, 64)
	for i := 0; i < len(roots); {
		j := i + 1
		for j < len(roots) && p.w[roots[j]] == p.w[roots[i]] {
			j++
		}
		val := p.w[roots[i]]
		queue = queue[:0]
		for _, r := range roots[i:j] {
			set[r] = true
			p.pot[r] = val
			queue = append(queue, r)
		}
		for h := 0; h < len(queue); h++ {
			v := queue[h]
			for _, u := range g.In.Row(v) {
				x := p.rowMate[u]
				if x >= 0 && !set[x] {
					set[x] = true
					p.pot[x] = val
					queue = append(queue, x)
				}
			}
		}
		i = j
	}
	for u := 0; u < n; u++ {
		var best int64
		for _, v := range g.Out.Row(int32(u)) {
			if v != p.rowMate[u] && p.pot[v] > best {
				best = p.pot[v]
			}
		}
		p.pot[n+u] = best
	}
}

// result collects the placement from the final flow.
func (p *placer) result() *raw {
	res := &raw{p: p, fewest: p.lexico, deficit: p.deficit, unmatchable: p.unmatchable, unreached: p.unreached}
	res.feasible = p.deficit == 0 && len(p.unreached) == 0
	for v := 0; v < p.n; v++ {
		vv := int32(v)
		if p.colMate[v] >= 0 {
			res.matched++
		}
		switch {
		case p.isExisting(vv):
			res.devices = append(res.devices, vv)
		case p.actuated(vv):
			res.devices = append(res.devices, vv)
			res.added = append(res.added, vv)
			res.cost += p.costOf(vv)
		}
	}
	return res
}
