package target

import (
	"cmp"
	"slices"

	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/placement"
)

// Mode says what Select minimises.
type Mode uint8

const (
	// Signals: the fewest independent signals; a signal may drive several
	// states (the drivers question).
	Signals Mode = iota
	// Actuators: the cheapest dedicated actuators, one state each, under
	// the costs, forbidden states and existing devices of a
	// structural.Devices (the actuators question).
	Actuators
)

// String returns "signals" or "actuators".
func (m Mode) String() string {
	if m == Actuators {
		return "actuators"
	}
	return "signals"
}

// walkWords bounds the walk history of the walk greedy (targets × layers).
const walkWords = 50_000_000

// Defaults of SelectRequest.
const (
	DefaultExactCandidates = 20
	DefaultExactStates     = 64
	DefaultMaxSearchNodes  = 200_000
	DefaultWalkDepth       = 48
	// MaxWalkDepth is the deepest walk greedy.
	MaxWalkDepth = 63
)

// SelectRequest asks for the fewest signals, or the cheapest dedicated
// actuators, that steer a set of targets.
type SelectRequest struct {
	// Property is Controllability (actuators) or Observability (sensors
	// that tell the targets; asked on the transposed network).
	Property structural.Property
	Targets  []int32
	Mode     Mode
	// Devices gives costs, forbidden states and existing devices
	// (Actuators mode; ignored in Signals mode).
	Devices structural.Devices
	// The exact search runs when the region (the states with a walk to a
	// target) has at most ExactStates states and, in Actuators mode, at
	// most ExactCandidates states that may take a new device; it visits
	// at most MaxSearchNodes nodes. Zero: the defaults; negative: never.
	ExactStates, ExactCandidates, MaxSearchNodes int
	// WalkDepth is the number of layers of the walk greedy (default
	// DefaultWalkDepth, at most MaxWalkDepth; negative: no walk greedy).
	WalkDepth int
	// Seed makes the samples reproducible.
	Seed uint64
	Limits
	// judgeWork, for tests, replaces the work limit of one design's quick
	// proof in the searches (judgeWork).
	judgeWork int64
}

// Candidate is the outcome of one method.
type Candidate struct {
	// Method is "full_control" (structural.Drivers or placement.Place on
	// the region), "stem_cycle_cover", "walk_greedy", "all_allowed" (every
	// allowed state, tried when no method found a design) or
	// "exact_search".
	Method string `json:"method"`
	// Found reports that the method produced a design; Note says why not,
	// or what happened to it.
	Found bool            `json:"found"`
	Count int             `json:"signal_count"`
	Cost  structural.Cost `json:"total_cost"`
	Proof string          `json:"proof,omitempty"`
	Note  string          `json:"note,omitempty"`
}

// FullControl is today's answer for the whole network: structural.Drivers
// (Signals) or placement.Place (Actuators), for the saving.
type FullControl struct {
	Feasible bool            `json:"feasible"`
	Count    int             `json:"signal_count"`
	Cost     structural.Cost `json:"total_cost"`
}

// Selection is a design that steers the targets, with the bounds that
// judge it.
type Selection struct {
	Property structural.Property `json:"-"`
	Mode     Mode                `json:"-"`
	// Targets echoes the targets, in increasing order.
	Targets structural.States `json:"targets"`
	// Feasible reports that a design was found. When false, Unreachable
	// and Bottleneck say why, if a proof of infeasibility was found.
	Feasible bool `json:"feasible"`
	// Proved reports that the design is proved to steer the targets: false
	// only for Proof "dynamic_linking", a design kept on its linking alone
	// because nothing proved was found.
	Proved bool `json:"proved"`
	// Inputs is the design: one signal per actuator in Actuators mode.
	Inputs structural.Design `json:"inputs"`
	// Driven lists the states the design drives; in Actuators mode, the
	// complete set of actuators, existing ones included.
	Driven structural.States `json:"driven"`
	// Added and Existing split Driven in Actuators mode.
	Added    structural.States `json:"added"`
	Existing structural.States `json:"existing"`
	// Count is the number of signals (Signals) or of actuators, existing
	// included (Actuators); Cost is the cost of Added (Actuators).
	Count int             `json:"signal_count"`
	Cost  structural.Cost `json:"total_cost"`
	// Lower and LowerCost are proved lower bounds on Count and Cost.
	Lower     int             `json:"lower_bound"`
	LowerCost structural.Cost `json:"lower_bound_cost"`
	// Optimal reports that the design is Proved and that Count (Signals) or
	// Cost (Actuators) is proved the least possible: it meets the lower
	// bound, or the exact search finished with every design it passed over
	// judged (see Stopped), or the targets hold every state that acts on
	// them (then target control is full control of that part, solved exactly
	// by Drivers or Place). When false the design is not proved minimal.
	Optimal bool `json:"optimal"`
	// Method produced the design; Proof says why it steers the targets:
	// "ancestor_closed" (full control of the closed part that acts on the
	// targets), "lin_subnetwork" (Lin's theorem on a subnetwork holding
	// the targets), "sampled_rank" (a sample of C·K of full rank over
	// GF(2^61-1), which no generic rank can fall below), or
	// "dynamic_linking" (a linking of size |T| in the dynamic graph, not
	// checked on a sample because the region exceeds the sample's size or
	// work limits: sufficient only if the rank equals the largest dynamic
	// linking, the characterisation attributed to Murota & Poljak 1990,
	// which is not proved here; a design whose whole sample falls short
	// of the targets is never kept on a linking).
	Method string `json:"method"`
	Proof  string `json:"proof"`
	// Pruned counts the signals removed from the method's design because a
	// sample proved the rest enough.
	Pruned int `json:"pruned"`
	// FullControl is the whole-network answer; SignalsSaved and CostSaved
	// are its Count and Cost minus this one's.
	FullControl  FullControl     `json:"full_control"`
	SignalsSaved int             `json:"signals_saved"`
	CostSaved    structural.Cost `json:"cost_saved"`
	// Candidates lists every method tried.
	Candidates []Candidate `json:"candidates"`
	// Unsure counts designs the exact search rejected on samples alone
	// (each wrong with probability at most FailureBound).
	Unsure int `json:"unsure_rejections"`
	// Stopped counts designs the searches passed over unjudged, every
	// sample stopped by a work or size limit; when the exact search met
	// one it did not finish, and Optimal rests on the lower bound alone.
	Stopped      int     `json:"stopped_rejections"`
	FailureBound float64 `json:"failure_bound"`
	// Infeasible reports a proof that no design the devices allow steers
	// the targets. Unreachable lists targets that no allowed state acts
	// on; Bottleneck is a set of targets with too few in-neighbours whose
	// own states may not take enough devices; either proves it, and so
	// does a proved upper bound on the design driving every allowed state.
	Infeasible  bool              `json:"infeasible"`
	Unreachable structural.States `json:"unreachable_targets"`
	Bottleneck  *Bottleneck       `json:"bottleneck"`
	// RegionStates is the number of states with a walk to a target: the
	// only ones a design can use.
	RegionStates int `json:"region_states"`
}

// Select returns a design that steers the targets with the fewest signals
// (Signals) or the cheapest dedicated actuators (Actuators), with proved
// lower bounds. Minimum input selection for target control is NP-hard
// (Czeizler, Wu, Gratie, Kanhaiya & Petre, "Structural target
// controllability of linear networks", IEEE/ACM TCBB 15(4), 2018), so
// Select runs several methods on the region R of states with a walk to a
// target (closed under predecessors, so it evolves on its own) and keeps
// the best proved design:
//
//   - full control of R: structural.Drivers or placement.Place on R,
//     exact for full control and so never worse than full control
//     restricted to the targets; when the targets are all of R this is
//     the exact answer (and with every state a target, today's answer);
//   - the stem–cycle cover (see stemCycleCover), proved by Lin's theorem
//     on a subnetwork;
//   - the walk greedy after Gao et al. 2014 (see walkGreedy), suggested
//     by a dynamic-graph linking and proved only when a sample of the
//     part it reaches confirms it;
//   - up to the exact limits, a branch-and-bound search over the designs
//     (Actuators: sets of new devices by cost; Signals: the fewest k such
//     that k signals driving every state of R steer the targets, since
//     more nonzeros never lower a generic rank), each design proved by a
//     sample or refuted by a proved upper bound.
//
// Where a sample fits, a design's signals are then removed one by one,
// dearest first, while a sample still proves the rest enough. The lower
// bounds: every target must be reached from a device, and a set T* of
// targets whose in-neighbours (existing devices on T* included) number
// |T*| - δ needs δ new devices on T* itself (the in-capacity bound), the
// δ cheapest of them at least.
func Select(g *structural.Network, req SelectRequest) (*Selection, error) {
	targets, err := cleanTargets(g, req.Targets)
	if err != nil {
		return nil, err
	}
	dev := structural.Devices{}
	if req.Mode == Actuators {
		if err := req.Devices.Check(g); err != nil {
			return nil, err
		}
		dev = req.Devices
	}
	lim := req.Limits.withDefaults()
	if req.ExactStates == 0 {
		req.ExactStates = DefaultExactStates
	}
	if req.ExactCandidates == 0 {
		req.ExactCandidates = DefaultExactCandidates
	}
	if req.MaxSearchNodes == 0 {
		req.MaxSearchNodes = DefaultMaxSearchNodes
	}
	if req.WalkDepth == 0 {
		req.WalkDepth = DefaultWalkDepth
	}
	req.WalkDepth = min(req.WalkDepth, MaxWalkDepth)
	h := on(g, req.Property)
	r, err := newRegion(h, targets, dev)
	if err != nil {
		return nil, err
	}
	mode := req.Mode
	sel := &Selection{Property: req.Property, Mode: mode, Targets: g.States(targets), RegionStates: r.n,
		Unreachable: g.States(nil)}
	full, err := wholeFullControl(h, mode, dev, r)
	if err != nil {
		return nil, err
	}
	sel.FullControl = full.summary
	var existingAll []int32
	for v := int32(0); int(v) < g.N(); v++ {
		if dev.Has(v) {
			existingAll = append(existingAll, v)
		}
	}
	lb := lowerBounds(r, mode)
	sel.Lower, sel.LowerCost = lb.count, lb.cost
	if mode == Actuators {
		sel.Lower += len(existingAll)
	}
	if lb.infeasible {
		sel.Infeasible = true
		sel.Unreachable = g.States(r.toGlobal(lb.unreachable))
		sel.Bottleneck = lb.bottleneck(g, r)
		sel.Inputs, _ = structural.NewDesign(g, nil, nil)
		sel.Driven, sel.Added = g.States(nil), g.States(nil)
		sel.Existing = g.States(existingAll)
		return sel, nil
	}

	o := newOracle(r, lim, req.Seed)
	if req.judgeWork > 0 {
		o.work = req.judgeWork
	}
	fits := lim.MaxSampleStates >= 0 && r.n <= lim.MaxSampleStates
	var best *design
	// A design proved to steer the targets is preferred to any that rests
	// on a linking alone, however cheaper: the latter is kept only when
	// nothing is proved, and is listed among the candidates otherwise.
	better := func(d *design) bool {
		if best == nil {
			return true
		}
		if dp, bp := d.proof != linkingOnly, best.proof != linkingOnly; dp != bp {
			return dp
		}
		if mode == Actuators && d.cost != best.cost {
			return d.cost < best.cost
		}
		return len(d.signals) < len(best.signals)
	}
	consider := func(method string, d *design, ok bool, note string) {
		c := Candidate{Method: method, Found: ok, Note: note}
		if ok {
			c.Count, c.Cost, c.Proof = len(d.signals)+len(existingAll)-len(r.existing()), d.cost, d.proof
			if mode == Signals {
				c.Count = len(d.signals)
			}
			if better(d) {
				best = d
			}
		}
		sel.Candidates = append(sel.Candidates, c)
	}

	if full.region != nil {
		consider("full_control", full.region, true, "")
	} else {
		consider("full_control", nil, false, full.note)
	}
	// When the targets are the whole region, target control is full
	// control of the region, which Drivers and Place solve exactly.
	closed := len(r.targets) == r.n && best != nil
	if !closed {
		d, ok := stemCycleCover(r, mode)
		consider("stem_cycle_cover", d, ok, map[bool]string{false: "a forbidden state or a source component without an allowed state blocks the cover"}[ok])
	}
	if req.WalkDepth > 0 && !closed {
		// The walks are kept for every layer: at most walkWords entries.
		depth := min(req.WalkDepth, max(r.n-1, 0), max(walkWords/len(r.targets), 1))
		d, ok := walkGreedy(r, mode, depth)
		note := ""
		if !ok {
			note = "a walk met no allowed state"
		} else if lim.MaxSampleStates >= 0 {
			// Judged on the part the design reaches, which can fit a
			// sample where the whole region does not.
			switch o.judgeWithin(d.signals, confirmWork) {
			case proved:
				d.proof = "sampled_rank"
			case refuted:
				ok, note = false, "a proved upper bound refutes the design"
			case short:
				// The linking is not attained: a theorem never outweighs
				// the exact rank of a sample of the same design.
				ok, note = false, "a sample of the design falls short of the targets despite the linking"
			default:
				note = "no sample within the work limit: kept on the linking alone"
			}
		}
		consider("walk_greedy", d, ok, note)
	}
	if (best == nil || best.proof == linkingOnly) && fits && mode == Actuators {
		// Every allowed state driven: the most any design can do. A sample
		// proves it (then the pruning below thins it), a bound refutes it;
		// also tried when the best so far rests on a linking alone.
		var all []int32
		for v := int32(0); int(v) < r.n; v++ {
			if r.dev.Allowed(v) && !r.dev.Has(v) {
				all = append(all, v)
			}
		}
		d := &design{added: all, signals: dedicated(slices.Concat(r.existing(), all)), method: "all_allowed", proof: "sampled_rank"}
		for _, v := range all {
			d.cost += r.dev.CostOf(v)
		}
		switch o.judge(d.signals) {
		case proved:
			consider("all_allowed", d, true, "")
		case refuted:
			consider("all_allowed", nil, false, "a proved upper bound refutes even every allowed state driven")
			sel.Infeasible = true
			best = nil // an unproved design cannot do better than all of them
		default:
			consider("all_allowed", nil, false, "neither proved nor refuted")
		}
	}
	if best == nil {
		// No method found a design; say so without claiming infeasibility
		// unless the bounds refute every design.
		sel.Inputs, _ = structural.NewDesign(g, nil, nil)
		sel.Driven, sel.Added, sel.Existing = g.States(nil), g.States(nil), g.States(existingAll)
		return sel, nil
	}

	exact := false
	if req.ExactStates >= 0 && r.n <= req.ExactStates && fits && !closed {
		var d *design
		var done bool
		stopped := o.stopped
		if mode == Actuators {
			d, done = exactActuators(r, o, best, req.ExactCandidates, req.MaxSearchNodes)
		} else {
			d, done = exactSignals(r, o, best, lb.count)
		}
		note := ""
		switch {
		case o.stopped > stopped:
			note = "work limit reached: designs left unjudged, so the search proves nothing minimal"
		case !done:
			note = "search limit reached"
		}
		if d != nil {
			consider("exact_search", d, true, note)
		} else {
			consider("exact_search", nil, false, map[bool]string{true: "nothing better than the candidates", false: note}[done])
		}
		exact = done
	}
	if !exact && !closed && fits && mode == Actuators && len(best.added) <= 256 {
		best = prune(r, o, best, sel)
	}

	sel.Feasible = true
	sel.Method, sel.Proof = best.method, best.proof
	sel.Proved = best.proof != linkingOnly
	sel.Unsure, sel.Stopped = o.unsure, o.stopped
	if o.draws > 0 {
		sel.FailureBound = failureBound(r.n)
	}
	count := len(best.signals)
	if mode == Actuators {
		count = len(best.added) + len(existingAll)
	}
	sel.Count, sel.Cost = count, best.cost
	switch {
	case exact:
		sel.Optimal = true
	case mode == Actuators:
		sel.Optimal = best.cost <= sel.LowerCost
	default:
		sel.Optimal = count <= sel.Lower
	}
	if closed && best.method == "full_control" {
		sel.Optimal = true // target control of a closed set is full control of it
	}
	sel.Optimal = sel.Optimal && sel.Proved // nothing unproved is called optimal
	if mode == Actuators {
		added := r.toGlobal(best.added)
		slices.Sort(added)
		all := slices.Concat(existingAll, added)
		slices.Sort(all)
		sel.Added, sel.Existing, sel.Driven = g.States(added), g.States(existingAll), g.States(all)
		sel.Inputs, err = structural.Dedicated(g, all)
	} else {
		sig := make([][]int32, len(best.signals))
		for i, s := range best.signals {
			sig[i] = r.toGlobal(s)
		}
		sel.Inputs, err = structural.NewDesign(g, sig, nil)
		sel.Driven = g.States(sel.Inputs.Touched())
		sel.Added, sel.Existing = g.States(nil), g.States(nil)
	}
	if err != nil {
		return nil, err
	}
	if full.summary.Feasible {
		sel.SignalsSaved = full.summary.Count - sel.Count
		sel.CostSaved = full.summary.Cost - sel.Cost
	}
	return sel, nil
}

// fullControl holds the whole-network answer and the region's.
type fullControl struct {
	summary FullControl
	region  *design // nil when infeasible
	note    string
}

// wholeFullControl runs today's answer on the whole network (for the
// saving) and on the region (a candidate).
func wholeFullControl(h *structural.Network, mode Mode, dev structural.Devices, r *region) (*fullControl, error) {
	fc := &fullControl{}
	if mode == Signals {
		ds := structural.Drivers(h)
		fc.summary = FullControl{Feasible: true, Count: ds.Count()}
		rd := ds
		if !r.whole {
			rd = structural.Drivers(r.net)
		}
		fc.region = &design{signals: rd.Inputs.Signals(), method: "full_control", proof: "ancestor_closed"}
		return fc, nil
	}
	pl, err := placement.Place(h, structural.Controllability, dev)
	if err != nil {
		return nil, err
	}
	fc.summary = FullControl{Feasible: pl.Feasible, Count: pl.Devices.Len(), Cost: pl.Cost}
	if !r.whole {
		if pl, err = placement.Place(r.net, structural.Controllability, r.dev); err != nil {
			return nil, err
		}
	}
	if !pl.Feasible {
		fc.note = "forbidden states block full control of the region"
		return fc, nil
	}
	d := &design{signals: dedicated(slices.Clone(pl.Devices.IDs())), added: slices.Clone(pl.Added.IDs()), cost: pl.Cost,
		method: "full_control", proof: "ancestor_closed"}
	fc.region = d
	return fc, nil
}

// lowerBound is the proved lower bound of Select, in local indices.
type lowerBound struct {
	count       int // new signals (Signals: all signals)
	cost        structural.Cost
	infeasible  bool
	unreachable []int32
	witness     *capacityWitness
	delta       int // new devices the witness needs on itself
	allowed     int // states of the witness that may take a new device
}

// lowerBounds computes the in-capacity and reach bounds. In Actuators mode
// the existing devices count as inputs already there.
func lowerBounds(r *region, mode Mode) *lowerBound {
	lb := &lowerBound{}
	nt := len(r.targets)
	// In-capacity with the existing devices on targets as extra columns.
	b := &matching.CSR{Rows: nt, Cols: r.n + nt, Ptr: make([]int64, nt+1)}
	for i, t := range r.targets {
		b.Adj = append(b.Adj, r.in.Row(t)...)
		if r.dev.Has(t) {
			b.Adj = append(b.Adj, int32(r.n+i))
		}
		b.Ptr[i+1] = int64(len(b.Adj))
	}
	mt := matching.Maximum(b, nil)
	delta := nt - mt.Size
	if mode == Signals {
		lb.count = max(1, delta)
		return lb
	}
	if delta > 0 {
		// The union of the alternating trees of the unmatched targets.
		seen := make([]bool, nt)
		colSeen := make([]bool, b.Cols)
		var rows []int32
		for i := 0; i < nt; i++ {
			if mt.RowMate[i] < 0 {
				seen[i] = true
				rows = append(rows, int32(i))
			}
		}
		for i := 0; i < len(rows); i++ {
			for _, c := range b.Row(rows[i]) {
				if !colSeen[c] {
					colSeen[c] = true
					if x := mt.ColMate[c]; x >= 0 && !seen[x] {
						seen[x] = true
						rows = append(rows, x)
					}
				}
			}
		}
		w := &capacityWitness{}
		var costs []structural.Cost
		for _, i := range rows {
			t := r.targets[i]
			w.targets = append(w.targets, t)
			if r.dev.Allowed(t) && !r.dev.Has(t) {
				costs = append(costs, r.dev.CostOf(t))
			}
		}
		for c := range colSeen {
			if colSeen[c] && c < r.n {
				w.neighbours = append(w.neighbours, int32(c))
			}
		}
		slices.Sort(w.targets)
		slices.Sort(costs)
		lb.witness, lb.allowed, lb.delta = w, len(costs), delta
		if len(costs) < delta {
			lb.infeasible = true
		} else {
			for _, c := range costs[:delta] {
				lb.cost += c
			}
		}
	}
	// Reach: targets that no existing device reaches need a new one among
	// their ancestors; the cheapest allowed ancestor of each is found by
	// searches from the allowed states in increasing cost.
	reached, _ := forward(r.out, r.existing())
	var cands []int32
	for v := int32(0); int(v) < r.n; v++ {
		if r.dev.Allowed(v) && !r.dev.Has(v) {
			cands = append(cands, v)
		}
	}
	slices.SortStableFunc(cands, func(a, b int32) int { return cmp.Compare(r.dev.CostOf(a), r.dev.CostOf(b)) })
	minCost := make([]structural.Cost, r.n)
	for i := range minCost {
		minCost[i] = -1
	}
	var queue []int32
	for _, s := range cands {
		if minCost[s] >= 0 || reached[s] {
			continue
		}
		c := r.dev.CostOf(s)
		minCost[s] = c
		queue = append(queue[:0], s)
		for i := 0; i < len(queue); i++ {
			for _, v := range r.out.Row(queue[i]) {
				if minCost[v] < 0 && !reached[v] {
					minCost[v] = c
					queue = append(queue, v)
				}
			}
		}
	}
	need := 0
	var reachCost structural.Cost
	for _, t := range r.targets {
		if reached[t] {
			continue
		}
		if minCost[t] < 0 {
			lb.infeasible = true
			lb.unreachable = append(lb.unreachable, t)
			continue
		}
		need = 1
		reachCost = max(reachCost, minCost[t])
	}
	lb.count = max(delta, need)
	lb.cost = max(lb.cost, reachCost)
	return lb
}

// bottleneck reports the in-capacity witness when it proves
// infeasibility: its targets need delta new devices among themselves and
// fewer may take one.
func (lb *lowerBound) bottleneck(g *structural.Network, r *region) *Bottleneck {
	w := lb.witness
	if w == nil || lb.allowed >= lb.delta {
		return nil
	}
	bn := &Bottleneck{Targets: g.States(r.toGlobal(w.targets)), Neighbours: g.States(r.toGlobal(w.neighbours)),
		Signals: []int{}, SignalNumbers: []int{}}
	bn.Capacity = len(w.targets) - lb.delta
	bn.Shortfall = lb.delta
	return bn
}

// pruneWork bounds the field operations of the samples of one pruning.
const pruneWork = 3_000_000_000

// prune removes the design's new devices one by one, dearest first, while
// a sample proves the rest enough, within pruneWork.
func prune(r *region, o *oracle, d *design, sel *Selection) *design {
	order := slices.Clone(d.added)
	slices.SortStableFunc(order, func(a, b int32) int { return cmp.Compare(r.dev.CostOf(b), r.dev.CostOf(a)) })
	keep := make(map[int32]bool, len(order))
	for _, v := range order {
		keep[v] = true
	}
	removed := 0
	ex := r.existing()
	start := o.ops
	for _, v := range order {
		if o.ops-start > pruneWork {
			break
		}
		keep[v] = false
		var rest []int32
		for _, u := range d.added {
			if keep[u] {
				rest = append(rest, u)
			}
		}
		if o.judge(dedicated(slices.Concat(ex, rest))) == proved {
			removed++
			continue
		}
		keep[v] = true
	}
	if removed == 0 {
		return d
	}
	nd := &design{method: d.method, proof: "sampled_rank"}
	for _, u := range d.added {
		if keep[u] {
			nd.added = append(nd.added, u)
			nd.cost += r.dev.CostOf(u)
		}
	}
	nd.signals = dedicated(slices.Concat(ex, nd.added))
	sel.Pruned = removed
	return nd
}
