package strong

import (
	"cmp"
	"errors"
	"fmt"
	"math/rand/v2"
	"slices"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/placement"
)

// Sizes of the exact search.
const (
	// DefaultExactStates is the largest network Place searches exactly
	// unless the request says otherwise.
	DefaultExactStates = 64
	// MaxExactStates is the largest network Place will ever search.
	MaxExactStates = 512
	// DefaultSearchNodes is the search's default budget of nodes.
	DefaultSearchNodes = 200_000
	// AlwaysExact is the number of allowed states up to which the search
	// always finishes: its tree has at most 2^k nodes for k allowed
	// states (every node adds a distinct state to a distinct set), and
	// the budget is raised to that.
	AlwaysExact = 18
)

// PlaceRequest asks for the cheapest dedicated devices (one state each)
// that make a network strongly structurally controllable (actuators, for
// Controllability) or observable (sensors, for Observability) for every
// system of Class.
type PlaceRequest struct {
	Property structural.Property
	Class    Class
	// Devices gives costs, forbidden states and existing devices (kept
	// and free).
	Devices structural.Devices
	// Design holds signals already in place besides Devices.Existing
	// (inputs or outputs touching several states); they are kept. It may
	// be empty.
	Design structural.Design
	// ExactStates is the largest number of states searched exactly; 0
	// means DefaultExactStates, a negative value never searches. It is at
	// most MaxExactStates.
	ExactStates int
	// SearchNodes is the search's budget of nodes; 0 means
	// DefaultSearchNodes. When it runs out the best placement found is
	// returned with a lower bound and Optimal false.
	SearchNodes int64
}

// Placement is the answer to a PlaceRequest: a set of dedicated devices
// that makes the design strongly structurally controllable (observable),
// with how far from the cheapest it can be.
//
// Cheapest means the least total cost of the added devices and, among
// those, the fewest devices.
type Placement struct {
	// Property is the property the devices provide.
	Property structural.Property `json:"-"`
	// Diagonal and MayBeZero restate the class (see Result).
	Diagonal  Diagonal `json:"diagonal"`
	MayBeZero int      `json:"may_be_zero_edges"`
	// Feasible reports that the allowed states can make the design
	// strongly structurally controllable (observable) at all.
	Feasible bool `json:"feasible"`
	// Devices is the complete set of dedicated devices, existing ones
	// included (a base design's signals are not listed); Added the new
	// devices; Existing those kept. All in increasing order.
	Devices  structural.States `json:"devices"`
	Added    structural.States `json:"added"`
	Existing structural.States `json:"existing"`
	// Cost is the total cost of Added.
	Cost structural.Cost `json:"total_cost"`
	// Optimal reports that no placement is cheaper and none as cheap has
	// fewer devices: proved by the exact search, or because the placement
	// meets the generic one in cost and count.
	Optimal bool `json:"optimal"`
	// LowerBound is a proved lower bound on the cost of every placement;
	// Gap is Cost - LowerBound, 0 when Optimal (and when the cost is
	// proved least but a set as cheap with fewer devices is not ruled
	// out).
	LowerBound structural.Cost `json:"lower_bound"`
	Gap        structural.Cost `json:"gap"`
	// BoundFrom names the lower bound: "search" (the exact search
	// finished), "forts" (from the forts a search cut short found:
	// disjoint ones, or their fractional cover by linear programming),
	// "generic" (the cheapest placement for structural controllability,
	// which every strong placement is).
	BoundFrom string `json:"lower_bound_from"`
	// Method is "search" when the exact search ran, "heuristic" otherwise.
	Method string `json:"method"`
	// SearchNodes and Forts measure the search (0 without one).
	SearchNodes int64 `json:"search_nodes"`
	Forts       int   `json:"forts"`
	// GenericCost and GenericDevices describe the cheapest placement for
	// (generic) structural controllability (observability) under the same
	// devices: the lower bound every strong placement respects.
	GenericCost    structural.Cost `json:"generic_cost"`
	GenericDevices int             `json:"generic_devices"`
	// Blocked lists, when infeasible, the states that stay uncoloured with
	// a device on every allowed state: no placement reaches them.
	Blocked structural.States `json:"blocked"`
	// Caution is the standing caution of a strong answer (Caution).
	Caution string `json:"caution"`
}

// Place returns a cheapest (or, beyond the exact search, a good) set of
// dedicated devices that, with the existing ones and the design's
// signals, makes g strongly structurally controllable (observable) for
// every system of the class.
//
// The problem contains the zero forcing number of a graph, NP-hard
// (Aazami 2008 for simple graphs; Trefois & Delvenne 2015 for directed
// graphs with loops), so Place works in three steps:
//
//  1. Feasibility: a device on every allowed state; when the colouring
//     (see Check) still leaves states white, nothing can, and they are
//     returned as Blocked. O(N + E).
//  2. Heuristic (any size, near-linear): the cheapest placement for
//     structural controllability (structural/placement, Pequito, Kar &
//     Aguiar 2016) seeds the colouring; while states stay white, the
//     column closest to forcing (fewest white rows, at most 31) gets
//     devices on all its white rows but the dearest nonzero one, which it
//     then forces; failing that, the first white allowed state in
//     upstream-first order. Passes in several orders then drop every
//     device that the devices before it already colour (cheapest kept
//     first). Each pass is one incremental colouring, O(N + E), plus the
//     generic placement. On small networks up to 64 rounds of destroy and
//     repair follow (a random fifth of the devices removed, the set
//     completed and pruned again, kept when no worse), within about 10^7
//     edge visits.
//  3. Exact search for networks of at most ExactStates states: a set of
//     devices works exactly when it meets every fort (a nonempty set of
//     states no column can force into while the rest is coloured; the
//     fort cover model of Brimkov, Fast & Hicks, "Computational
//     approaches for zero forcing and related problems", EJOR 273(3),
//     2019). Branch and bound over a growing list of minimal forts: each
//     node branches on the fort with fewest candidates; its bound is the
//     cost so far plus, over forts with pairwise disjoint candidates, the
//     cheapest candidate of each; a node whose devices meet every known
//     fort is coloured, and either is a placement or yields a new minimal
//     fort. The heuristic gives the first incumbent. Exponential in the
//     worst case; the node budget bounds it, except that with at most
//     AlwaysExact allowed states the search always runs to the end (at
//     most 2^18 nodes), so such networks are always solved exactly.
//
// The lower bound is the largest of: the generic minimum (a strongly
// structurally controllable design is structurally controllable, so its
// devices are a generic placement); when the search stopped early, the
// disjoint-fort bound and the fractional fort cover (a dual solution of
// the linear relaxation over the forts found, gonum's simplex) at the
// root; and the optimum when it finished.
func Place(g *structural.Network, r PlaceRequest) (*Placement, error) {
	if !r.Design.Of(g) {
		return nil, structural.ErrForeignDesign
	}
	if err := r.Class.Check(g); err != nil {
		return nil, err
	}
	dev := r.Devices
	if err := dev.Check(g); err != nil {
		return nil, err
	}
	exactStates := r.ExactStates
	if exactStates == 0 {
		exactStates = DefaultExactStates
	}
	if exactStates > MaxExactStates {
		return nil, fmt.Errorf("strong: exact search limited to %d states, asked for %d", MaxExactStates, exactStates)
	}
	budget := r.SearchNodes
	if budget <= 0 {
		budget = DefaultSearchNodes
	}
	s := newSystem(g, r.Property, r.Class, r.Design)
	n := s.n
	pl := &Placement{Property: r.Property, Diagonal: r.Class.Diagonal, MayBeZero: r.Class.Marked(), Method: "heuristic", Caution: Caution}
	var existing []int32
	for v := int32(0); int(v) < n; v++ {
		if dev.Has(v) {
			existing = append(existing, v)
		}
	}
	empty := g.States([]int32{})
	pl.Existing, pl.Added, pl.Devices, pl.Blocked = g.States(existing), empty, g.States(existing), empty

	// 1. Feasibility.
	white := make([]bool, n)
	var blocked []int32
	for _, f := range s.forcers() {
		for v := int32(0); int(v) < n; v++ {
			if dev.Has(v) || dev.Allowed(v) {
				f.colour(v)
			}
		}
		f.run()
		for v, c := range f.colored {
			white[v] = white[v] || !c
		}
	}
	for v, w := range white {
		if w {
			blocked = append(blocked, int32(v))
		}
	}
	if len(blocked) > 0 {
		pl.Blocked = g.States(blocked)
		return pl, nil
	}
	pl.Feasible = true

	// The generic lower bound and seeds.
	var gp *placement.Placement
	var err error
	if r.Design.Len() > 0 {
		gp, err = placement.Complete(g, r.Property, r.Design, dev)
	} else {
		gp, err = placement.Place(g, r.Property, dev)
	}
	if err != nil {
		return nil, err
	}
	if !gp.Feasible {
		return nil, fmt.Errorf("strong: internal error: a strong placement exists but no generic one")
	}
	pl.GenericCost, pl.GenericDevices = gp.Cost, gp.Added.Len()
	pl.LowerBound, pl.BoundFrom = gp.Cost, "generic"

	// 2. Heuristic.
	added := heuristic(s, dev, existing, gp.Added.IDs())
	cost := costOf(dev, added)

	// The generic placement is the cheapest, then fewest, generic one;
	// meeting both numbers proves the heuristic's set optimal.
	proved := gp.FewestDevices && cost == gp.Cost && len(added) == gp.Added.Len()

	// 3. Exact search.
	if !proved && n <= exactStates {
		pl.Method = "search"
		x := newExact(s, dev, existing)
		if k := count(x.allow); k <= AlwaysExact {
			budget = max(budget, int64(1)<<k+1)
		}
		best, ok, lb := x.search(added, budget)
		added = best
		cost = costOf(dev, added)
		pl.SearchNodes, pl.Forts = x.nodes, len(x.forts)
		switch {
		case ok:
			proved = true
			pl.LowerBound, pl.BoundFrom = cost, "search"
		case lb > pl.LowerBound:
			pl.LowerBound, pl.BoundFrom = lb, "forts"
		}
	}
	slices.Sort(added)
	all := append(slices.Clone(existing), added...)
	slices.Sort(all)
	// The answer is checked once more by fresh colourings.
	for _, f := range s.forcers() {
		for _, v := range all {
			f.colour(v)
		}
		f.run()
		if !f.complete() {
			return nil, errors.New("strong: internal error: the placement does not colour every state")
		}
	}
	pl.Added, pl.Devices, pl.Cost = g.States(added), g.States(all), cost
	if pl.LowerBound > cost {
		return nil, fmt.Errorf("strong: internal error: lower bound %v above the placement's cost %v", pl.LowerBound, cost)
	}
	pl.Optimal = proved
	pl.Gap = cost - pl.LowerBound
	return pl, nil
}

// forcers returns fresh colourings for the system's tests: one when both
// coincide.
func (s *system) forcers() []*forcer {
	fs := []*forcer{newForcer(s, s.diag)}
	if s.shifted != nil {
		fs = append(fs, newForcer(s, s.shifted))
	}
	return fs
}

func costOf(dev structural.Devices, states []int32) structural.Cost {
	var c structural.Cost
	for _, v := range states {
		c += dev.CostOf(v)
	}
	return c
}

// stallMax bounds the white rows of a column the heuristic unlocks.
const stallMax = 32

// heuristicWork bounds the work of the heuristic's improvement rounds, in
// edge visits; a round costs about eight colourings. The rounds pay on
// small networks (on random ones of 20 to 60 states they bring the
// heuristic from 25% to 4% above the optimum); on large ones a random
// fifth of the devices is too coarse a move to help.
const heuristicWork = 10_000_000

// heuristic returns devices (besides existing) that make both tests of s
// colour every state; see Place, step 2. The caller has checked that a
// device on every allowed state does.
func heuristic(s *system, dev structural.Devices, existing, seeds []int32) []int32 {
	best := eliminate(s, dev, existing, fill(s, dev, existing, seeds), nil)
	// Improvement rounds (destroy and repair): keep a random four fifths
	// of the best set, complete it again, drop what is redundant; keep the
	// result when it is no worse. Each round is O(N + E).
	rounds := min(64, heuristicWork/(8*(s.n+len(s.out.Adj))+8))
	rng := rand.New(rand.NewPCG(uint64(s.n), uint64(len(s.out.Adj))))
	for r := 0; r < rounds; r++ {
		part := make([]int32, 0, len(best))
		for _, v := range best {
			if rng.IntN(5) != 0 {
				part = append(part, v)
			}
		}
		cand := eliminate(s, dev, existing, fill(s, dev, existing, part), rng)
		if c, cb := costOf(dev, cand), costOf(dev, best); c < cb || c == cb && len(cand) <= len(best) {
			best = cand
		}
	}
	return best
}

// fill returns start followed by the devices that the stall rule
// adds until both tests colour everything (existing devices coloured
// first).
func fill(s *system, dev structural.Devices, existing, start []int32) []int32 {
	n := s.n
	fs := s.forcers()
	for _, f := range fs {
		f.stall = make([][]int32, stallMax)
		for j, cl := range f.col {
			if c := cl.cnt; c >= 2 && c < stallMax && cl.arb < c {
				f.stall[c] = append(f.stall[c], int32(j))
			}
		}
		for _, v := range existing {
			f.colour(v)
		}
		f.run()
	}
	var added []int32
	colouredAll := func(v int32) bool {
		for _, f := range fs {
			if !f.colored[v] {
				return false
			}
		}
		return true
	}
	add := func(v int32) {
		added = append(added, v)
		for _, f := range fs {
			f.colour(v)
			f.run()
		}
	}
	for _, v := range start {
		if !colouredAll(v) {
			add(v)
		}
	}
	order := upstreamOrder(s, dev)
	type row struct {
		v    int32
		kind Kind
	}
	var rows []row
	for _, f := range fs {
		next := 0 // into order; states before it are coloured in f
		for !f.complete() {
			j, ok := f.popStall()
			if ok {
				// The white rows of column j.
				rows = rows[:0]
				if int(j) < n {
					for k := s.out.Ptr[j]; k < s.out.Ptr[j+1]; k++ {
						if v := s.out.Adj[k]; v != j && !f.colored[v] {
							rows = append(rows, row{v, s.kindOut(k)})
						}
					}
					if d := f.diag[j]; d != Zero && !f.colored[j] {
						rows = append(rows, row{j, d})
					}
				} else {
					for _, v := range s.signal(int(j) - n) {
						if !f.colored[v] {
							rows = append(rows, row{v, Nonzero})
						}
					}
				}
				// The row left to be forced: the forbidden one, else the
				// dearest nonzero one.
				keep := int32(-1)
				bad := false
				for _, x := range rows {
					if !dev.Allowed(x.v) {
						if x.kind != Nonzero || keep >= 0 && !dev.Allowed(keep) {
							bad = true
							break
						}
						keep = x.v
					}
				}
				if bad {
					continue
				}
				if keep < 0 {
					for _, x := range rows {
						if x.kind == Nonzero && (keep < 0 || dev.CostOf(x.v) > dev.CostOf(keep)) {
							keep = x.v
						}
					}
				}
				if keep < 0 {
					continue
				}
				slices.SortStableFunc(rows, func(a, b row) int { return cmp.Compare(dev.CostOf(a.v), dev.CostOf(b.v)) })
				for _, x := range rows {
					if f.colored[keep] {
						break
					}
					if x.v != keep && !f.colored[x.v] {
						add(x.v)
					}
				}
				continue
			}
			for next < len(order) && f.colored[order[next]] {
				next++
			}
			if next == len(order) {
				panic("strong: internal error: no allowed state left to colour") // Place checked feasibility
			}
			add(order[next])
		}
	}
	return added
}

// eliminate keeps the devices of cand that the ones before them do not
// already colour, over several orders (cheapest first; ties in cand's
// order, in reverse, and, with rng, shuffled), and returns the best set.
func eliminate(s *system, dev structural.Devices, existing, cand []int32, rng *rand.Rand) []int32 {
	best := cand
	for pass := 0; pass < 3; pass++ {
		order := slices.Clone(best)
		switch {
		case pass == 1:
			slices.Reverse(order)
		case pass == 2 && rng != nil:
			rng.Shuffle(len(order), func(i, j int) { order[i], order[j] = order[j], order[i] })
		case pass == 2:
			continue
		}
		slices.SortStableFunc(order, func(a, b int32) int { return cmp.Compare(dev.CostOf(a), dev.CostOf(b)) })
		kept := prune(s, existing, order)
		if c, cb := costOf(dev, kept), costOf(dev, best); c < cb || c == cb && len(kept) < len(best) {
			best = kept
		}
	}
	return best
}

// prune colours existing, then each candidate in order that is still
// white in some test, and returns those; every skipped candidate is
// coloured by the ones before it, so the kept set colours everything the
// whole list does.
func prune(s *system, existing, cand []int32) []int32 {
	fs := s.forcers()
	for _, f := range fs {
		for _, v := range existing {
			f.colour(v)
		}
		f.run()
	}
	var kept []int32
	for _, v := range cand {
		white := false
		for _, f := range fs {
			white = white || !f.colored[v]
		}
		if !white {
			continue
		}
		kept = append(kept, v)
		for _, f := range fs {
			f.colour(v)
			f.run()
		}
	}
	return kept
}

// popStall returns a column with the fewest white rows (2 to stallMax-1)
// that are not all arbitrary, most recently stalled first.
func (f *forcer) popStall() (int32, bool) {
	for c := 2; c < len(f.stall); c++ {
		b := f.stall[c]
		for len(b) > 0 {
			j := b[len(b)-1]
			b = b[:len(b)-1]
			if cl := f.col[j]; cl.cnt == int32(c) && cl.arb < int32(c) {
				f.stall[c] = b
				return j, true
			}
		}
		f.stall[c] = b
	}
	return 0, false
}

// upstreamOrder lists the allowed states upstream first (strongly
// connected components in topological order of the condensation), then
// cheapest first.
func upstreamOrder(s *system, dev structural.Devices) []int32 {
	comp := s.h.Components().Of
	order := make([]int32, 0, s.n)
	for v := int32(0); int(v) < s.n; v++ {
		if dev.Allowed(v) && !dev.Has(v) {
			order = append(order, v)
		}
	}
	// Edges go from higher component numbers to lower ones.
	slices.SortStableFunc(order, func(a, b int32) int {
		if c := cmp.Compare(comp[b], comp[a]); c != 0 {
			return c
		}
		return cmp.Compare(dev.CostOf(a), dev.CostOf(b))
	})
	return order
}
