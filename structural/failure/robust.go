package failure

import (
	"cmp"
	"errors"
	"fmt"
	"slices"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/failure/internal/bip"
	"github.com/netsteer/netsteer/structural/failure/internal/cover"
	"github.com/netsteer/netsteer/structural/placement"
)

// Threat is the single failure a robust placement must survive.
type Threat uint8

const (
	// AnyDevice: the loss of any one device.
	AnyDevice Threat = iota
	// AnyLink: the loss of any one edge of the network.
	AnyLink
)

func (t Threat) String() string {
	if t == AnyLink {
		return "any link"
	}
	return "any device"
}

// MarshalText writes "any device" or "any link".
func (t Threat) MarshalText() ([]byte, error) { return []byte(t.String()), nil }

// RobustRequest asks for the cheapest dedicated devices (actuators for
// Controllability, sensors for Observability) that keep the network
// structurally controllable (observable) after any one failure of a kind.
type RobustRequest struct {
	Property structural.Property
	Survive  Threat
	// Devices gives costs, forbidden states and the devices already in
	// place (kept, free).
	Devices structural.Devices
	// Spares allows a second device on a state that has one, at the
	// state's cost: a spare (the usual dual-redundant instrument). Without
	// spares a state with no incoming edge (no outgoing edge, for sensors)
	// can never survive the loss of its device.
	Spares bool
	// ExactStates is the largest network solved by exact search; 0 means
	// 40, a negative value never searches.
	ExactStates int
	// Nodes bounds the exact search (and the exact cover of the second
	// step); 0 means 20000. A search cut short keeps its best answer and
	// reports the bound it proved.
	Nodes int
}

// RobustPlacement is a set of dedicated devices that survives any one
// failure of the requested kind, with what is known of its cost.
type RobustPlacement struct {
	Property structural.Property `json:"-"`
	Survive  Threat              `json:"survive"`
	// Feasible reports that the allowed states can survive the threat at
	// all (the design with every allowed device, and spares when allowed,
	// does). When not, Blocking says why.
	Feasible bool `json:"feasible"`
	// Devices lists the states holding a device, existing ones included;
	// Added the states given a new device; Spares the states given a
	// second device; Existing the devices kept.
	Devices  structural.States `json:"devices"`
	Added    structural.States `json:"added"`
	Spares   structural.States `json:"spares"`
	Existing structural.States `json:"existing"`
	// Cost is the cost of Added and Spares.
	Cost structural.Cost `json:"total_cost"`
	// Optimal reports that no cheaper placement survives the threat.
	// LowerBound is a proven lower bound on the least cost, Gap is Cost
	// minus LowerBound.
	Optimal    bool            `json:"optimal"`
	LowerBound structural.Cost `json:"lower_bound"`
	Gap        structural.Cost `json:"gap"`
	// Method is "exact search", "two-step" or "all allowed devices" (the
	// fallback when the second step cannot complete the first).
	Method      string `json:"method"`
	SearchNodes int    `json:"search_nodes"`
	// Step is the two-step method's account (Liu, Mo, Pequito, Sinopoli,
	// Kar & Aguiar, IEEE TCNS 2017): a cheapest plain placement, then the
	// cheapest additions found as a weighted set cover.
	Step *TwoStep `json:"two_step,omitempty"`
	// Blocking, when infeasible, lists what no allowed device can
	// protect: the losses that break even the design with every allowed
	// device.
	// When even every allowed device fails with no failure at all,
	// Unplaceable is that design's verdict.
	BlockingDevices structural.States   `json:"blocking_devices"`
	BlockingLinks   []LinkLoss          `json:"blocking_links,omitempty"`
	Unplaceable     *structural.Verdict `json:"unplaceable,omitempty"`
}

// TwoStep is the account of the two-step method.
type TwoStep struct {
	// Base is the cheapest plain placement (step 1), BaseCost its cost.
	Base     structural.States `json:"base"`
	BaseCost structural.Cost   `json:"base_cost"`
	// Requirements is the number of covering requirements of step 2 (a
	// failure the base does not survive needs a device in a given set of
	// states, up to two sets per failure).
	Requirements int `json:"requirements"`
	// CoverCost is the cost step 2 adds; CoverLowerBound bounds the least
	// cost of any additions to this base; CoverFactor is the greedy
	// guarantee H(d) (d the most requirements one device meets);
	// CoverOptimal reports the additions proved least for this base.
	CoverCost       structural.Cost `json:"cover_cost"`
	CoverLowerBound structural.Cost `json:"cover_lower_bound"`
	CoverFactor     float64         `json:"cover_factor"`
	CoverOptimal    bool            `json:"cover_optimal"`
	// Restricted reports that some requirement's candidate states were cut
	// to bound the work; the cover bounds then hold for the cut instance.
	Restricted bool `json:"restricted"`
}

// units is a multiset of dedicated devices: mult[v] in 0..2.
type units []uint8

func (u units) design(g *structural.Network) structural.Design {
	var sig [][]int32
	for v, m := range u {
		for j := uint8(0); j < m; j++ {
			sig = append(sig, []int32{int32(v)})
		}
	}
	d, _ := structural.NewDesign(g, sig, nil)
	return d
}

func (u units) signals() [][]int32 {
	var sig [][]int32
	for v, m := range u {
		for j := uint8(0); j < m; j++ {
			sig = append(sig, []int32{int32(v)})
		}
	}
	return sig
}

// survives reports whether the devices u keep h controllable after any
// one failure of kind t (one core analysis).
func survives(h *structural.Network, u units, t Threat) bool {
	c := newCore(h, u.signals())
	if !c.holds() {
		return false
	}
	if t == AnyDevice {
		for i := 0; i < c.k; i++ {
			if c.coloop(i) || c.tree.Size[c.sigNode(i)] > 1 {
				return false
			}
		}
		return true
	}
	for v := int32(0); int(v) < c.n; v++ {
		if c.bridge(v) >= 0 || c.criticalIn(v) >= 0 {
			return false
		}
	}
	return true
}

// Robust returns a cheapest set of dedicated devices that keeps g
// structurally controllable (observable) after any one failure of kind
// req.Survive, honouring existing devices, forbidden states and costs.
//
// The problem is NP-hard (Liu, Mo, Pequito, Sinopoli, Kar & Aguiar,
// "Minimum sensor placement for robust observability of structured complex
// networks", IEEE TCNS, 2017; arXiv:1507.07205). Networks of up to
// req.ExactStates states are solved by branch and bound over each state's
// number of devices: a branch is cut when even every remaining device cannot
// survive (survival only improves with more devices), or when its cost
// plus a lower bound reaches the best known; the bound is the cheapest
// plain placement of the remaining states (placement.Place), plus the
// cheapest remaining device for the device threat (removing any new device
// of a surviving design leaves a controllable one), or the cost of two
// device units in every source component (one of them alone is a single
// point of failure) plus the leaf bound (the states whose only
// in-neighbour is one same state compete for it, so after any single loss
// at most one of them may lack a device), whichever is larger. For the
// link threat every state with at most one incoming edge from another
// state must have a device (its one edge lost, nothing else reaches it),
// so those are fixed first.
// A search that completes proves optimality; one cut short by req.Nodes
// reports the least bound among the branches left open.
//
// Beyond that size, or as the search's first incumbent, the two-step
// method of Liu et al.: a cheapest plain placement (placement.Place, step
// 1; for the link threat, the cheapest one containing the states that
// must have a device); then every failure it does not survive, found as
// Assess finds them, is a requirement that the additions hit a set of
// states (the source component cut off; for a lost edge u -> v, the states
// that still reach v; and, for a dilation, the states reached by
// alternating paths from the row left unmatched), so the fewest-cost
// additions are a weighted set cover (step 2), solved greedily within H(d)
// of its optimum and exactly by branch and bound when small. Each
// requirement keeps at most 256 candidate states, the nearest first
// (TwoStep.Restricted says when some were cut; the cover bounds then hold
// for the cut instance). When no addition can cover some requirement, the
// design with every allowed device is pruned instead, most expensive
// first. The lower bound reported is, for the device threat, the larger of
// the cheapest plain placement plus the cheapest new device, and two units
// in every source component plus the leaf bound; for the link threat, the
// forced states plus the cheapest placement around them.
//
// Time: two placements and two core analyses, plus the cover (O(I log C)
// for I candidate entries); the exact search costs a placement and up to
// two core analyses per node.
func Robust(g *structural.Network, req RobustRequest) (*RobustPlacement, error) {
	dev := req.Devices
	if err := dev.Check(g); err != nil {
		return nil, fmt.Errorf("failure: %w", err)
	}
	n := g.N()
	p := req.Property
	h := g
	if p == structural.Observability {
		h = g.Transpose()
	}
	maxMult := uint8(1)
	if req.Spares {
		maxMult = 2
	}
	exactStates := req.ExactStates
	if exactStates == 0 {
		exactStates = 40
	}
	nodes := req.Nodes
	if nodes <= 0 {
		nodes = 20000
	}
	rp := &RobustPlacement{Property: p, Survive: req.Survive}
	// Feasibility: every allowed device, at most multiplicity.
	full := make(units, n)
	for v := range full {
		if dev.Allowed(int32(v)) {
			full[v] = maxMult
		}
	}
	if !survives(h, full, req.Survive) {
		as, err := Assess(g, Request{Property: p, Design: full.design(g), Detail: -1, Budget: 1})
		if err != nil {
			return nil, err
		}
		if !as.Intact.Holds {
			rp.Unplaceable = as.Intact
		}
		var block []int32
		for _, dl := range as.Devices {
			if dl.Class == Essential {
				block = append(block, dl.Touches.IDs()...)
			}
		}
		slices.Sort(block)
		rp.BlockingDevices = g.States(slices.Compact(block))
		if req.Survive == AnyLink {
			rp.BlockingDevices = g.States(nil)
			rp.BlockingLinks = as.Links
		}
		rp.Devices, rp.Added, rp.Spares, rp.Existing = g.States(nil), g.States(nil), g.States(nil), g.States(nil)
		rp.Method = "none"
		return rp, nil
	}
	rp.Feasible = true
	base := make(units, n)
	for v := range base {
		if dev.Has(int32(v)) {
			base[v] = 1
		}
	}
	cost := func(u units) structural.Cost {
		var c structural.Cost
		for v, m := range u {
			k := int(m)
			if dev.Has(int32(v)) {
				k--
			}
			c += structural.Cost(k) * dev.CostOf(int32(v))
		}
		return c
	}
	var best units
	lb := structural.Cost(0)
	if survives(h, base, req.Survive) {
		best, rp.Method, rp.Optimal = base, "existing devices", true
	} else {
		var err error
		var two *TwoStep
		best, two, err = twoStep(g, h, p, req.Survive, dev, maxMult, nodes)
		if err != nil {
			return nil, err
		}
		rp.Step = two
		rp.Method = "two-step"
		if best == nil {
			best, rp.Method = prune(h, full, base, req.Survive, dev, nodes), "all allowed devices, pruned"
		}
		lb, err = lowerBound(g, h, p, req.Survive, dev, maxMult)
		if err != nil {
			return nil, err
		}
		if n <= exactStates {
			ex, exLB, done, count, err := exact(g, h, p, req.Survive, dev, maxMult, best, cost(best), nodes)
			if err != nil {
				return nil, err
			}
			rp.SearchNodes = count
			if ex != nil {
				best, rp.Method = ex, "exact search"
			}
			if done {
				lb, rp.Optimal = cost(best), true
				rp.Method = "exact search"
			} else {
				lb = max(lb, exLB)
			}
		}
	}
	if !survives(h, best, req.Survive) {
		return nil, errors.New("failure: internal error: the robust placement does not survive its threat")
	}
	rp.Cost = cost(best)
	if rp.Optimal {
		lb = rp.Cost
	}
	rp.LowerBound = min(lb, rp.Cost)
	rp.Gap = rp.Cost - rp.LowerBound
	rp.Optimal = rp.Optimal || rp.Gap == 0
	var all, added, spares, existing []int32
	for v, m := range best {
		x := int32(v)
		if m >= 1 {
			all = append(all, x)
			if dev.Has(x) {
				existing = append(existing, x)
			} else {
				added = append(added, x)
			}
		}
		if m == 2 {
			spares = append(spares, x)
		}
	}
	rp.Devices, rp.Added, rp.Spares, rp.Existing = g.States(all), g.States(added), g.States(spares), g.States(existing)
	return rp, nil
}

// forcedByLinks marks the states every placement surviving the loss of
// any link must equip: those with at most one incoming edge from another
// state (losing it, or having none, leaves the state unreached unless it
// has a device of its own).
func forcedByLinks(h *structural.Network) []bool {
	in := h.In()
	f := make([]bool, h.N())
	for v := range f {
		k := 0
		for _, u := range in.Row(int32(v)) {
			if u != int32(v) {
				k++
			}
		}
		f[v] = k <= 1
	}
	return f
}

// withForced returns dev with the forced states marked existing, and the
// cost of those not already existing.
func withForced(dev structural.Devices, forced []bool) (structural.Devices, structural.Cost) {
	if forced == nil {
		return dev, 0
	}
	ex := make([]bool, len(forced))
	var c structural.Cost
	for v, f := range forced {
		ex[v] = dev.Has(int32(v)) || f
		if f && !dev.Has(int32(v)) {
			c += dev.CostOf(int32(v))
		}
	}
	return structural.Devices{Cost: dev.Cost, Forbidden: dev.Forbidden, Existing: ex}, c
}

// lowerBound is a bound on the cost of any surviving placement: the
// cheapest plain placement (plus, for the device threat, the cheapest new
// device unit, since removing a new device of a surviving design leaves a
// controllable one), or two device units in every source component for
// the device threat.
func lowerBound(g, h *structural.Network, p structural.Property, t Threat, dev structural.Devices, maxMult uint8) (structural.Cost, error) {
	if t == AnyLink {
		// The forced states, then the cheapest plain placement around them.
		fd, fc := withForced(dev, forcedByLinks(h))
		pl, err := placement.Place(g, p, fd)
		if err != nil {
			return 0, fmt.Errorf("failure: %w", err)
		}
		return fc + pl.Cost, nil
	}
	pl, err := placement.Place(g, p, dev)
	if err != nil {
		return 0, fmt.Errorf("failure: %w", err)
	}
	lb := pl.Cost
	cmin := structural.Cost(-1)
	for v := int32(0); int(v) < g.N(); v++ {
		if dev.Allowed(v) && (!dev.Has(v) || maxMult == 2) {
			if c := dev.CostOf(v); cmin < 0 || c < cmin {
				cmin = c
			}
		}
	}
	if cmin > 0 {
		lb += cmin
	}
	return max(lb, sourceBound(h, dev, nil, maxMult)+leafBound(h, dev, nil, maxMult)), nil
}

// sourceBound is the least cost of two device units in every source
// component, given fixed multiplicities for the states decided (nil: none;
// -1 marks undecided) — 0 when some component cannot get two.
func sourceBound(h *structural.Network, dev structural.Devices, decided []int8, maxMult uint8) structural.Cost {
	comps := h.Components()
	type pick struct{ c1, c2 structural.Cost } // two cheapest units offered
	have := make([]int, comps.Count)
	offer := make([]pick, comps.Count)
	const none = structural.Cost(-1)
	for x := range offer {
		offer[x] = pick{none, none}
	}
	addOffer := func(x int32, c structural.Cost) {
		o := &offer[x]
		switch {
		case o.c1 < 0 || c < o.c1:
			o.c1, o.c2 = c, o.c1
		case o.c2 < 0 || c < o.c2:
			o.c2 = c
		}
	}
	for v := int32(0); int(v) < h.N(); v++ {
		x := comps.Of[v]
		if !comps.Source[x] {
			continue
		}
		if decided != nil && decided[v] >= 0 {
			have[x] += int(decided[v])
			continue
		}
		if dev.Has(v) {
			have[x]++
			if maxMult == 2 {
				addOffer(x, dev.CostOf(v))
			}
			continue
		}
		if !dev.Allowed(v) {
			continue
		}
		addOffer(x, dev.CostOf(v))
		if maxMult == 2 {
			addOffer(x, dev.CostOf(v))
		}
	}
	var total structural.Cost
	for x := 0; x < comps.Count; x++ {
		if !comps.Source[x] || have[x] >= 2 {
			continue
		}
		o := offer[x]
		need := 2 - have[x]
		if o.c1 < 0 || need == 2 && o.c2 < 0 {
			return 0 // infeasible branch: reported by the survival test
		}
		total += o.c1
		if need == 2 {
			total += o.c2
		}
	}
	return total
}

// leafBound is a lower bound, for the device threat, on the cost of the
// units on the leaves of each state u: the states whose only in-neighbour
// is u (no self-loop). They compete for u, so at most one of them can be
// without a device; after the loss of any one unit that must still hold,
// so either every leaf has a device, or one has none and all the others
// have two. Leaf sets are disjoint; those meeting a source component are
// left out, so that the bound adds to sourceBound. decided as there. A
// leaf set no assignment can satisfy adds nothing (the survival test cuts
// that branch); the sets are summed in the order of u.
func leafBound(h *structural.Network, dev structural.Devices, decided []int8, maxMult uint8) structural.Cost {
	in := h.In()
	comps := h.Components()
	n := h.N()
	parent := make([]int32, n) // the one in-neighbour, or -1
	count := make([]int32, n)
	skip := make([]bool, n)
	for v := 0; v < n; v++ {
		parent[v] = -1
		row := in.Row(int32(v))
		if len(row) == 1 && row[0] != int32(v) {
			parent[v] = row[0]
			count[row[0]]++
			if comps.Source[comps.Of[v]] {
				skip[row[0]] = true
			}
		}
	}
	// Per leaf set: the cost of at least one unit on every leaf (option
	// 1), and of two units on every leaf but one left bare (option 2),
	// minimised over the bare one.
	const inf = structural.Cost(1) << 60
	type acc struct {
		all1, all2 structural.Cost // sums over the leaves (finite parts)
		bad1, bad2 int             // leaves that cannot take 1, 2 units
		bare2      structural.Cost // best c0(w) - c2(w) among finite c2(w)
		bareBad    structural.Cost // c0 of the leaf that cannot take 2
		hasBare    bool
	}
	// The leaf sets in the order of u: set[u] indexes sets.
	set := make([]int32, n)
	var sets []acc
	for u := range set {
		set[u] = -1
		if count[u] >= 2 && !skip[u] {
			set[u] = int32(len(sets))
			sets = append(sets, acc{bareBad: inf})
		}
	}
	for v := int32(0); int(v) < n; v++ {
		u := parent[v]
		if u < 0 || set[u] < 0 {
			continue
		}
		a := &sets[set[u]]
		c, ex := dev.CostOf(v), dev.Has(v)
		// cost of k units on v beyond what is paid or fixed already.
		costK := func(k uint8) structural.Cost {
			if decided != nil && decided[v] >= 0 {
				if uint8(decided[v]) == k {
					return 0
				}
				return inf
			}
			switch {
			case k > maxMult || k > 0 && !dev.Allowed(v) || k == 0 && ex:
				return inf
			case ex:
				return structural.Cost(k-1) * c
			}
			return structural.Cost(k) * c
		}
		c0, c1, c2 := costK(0), costK(1), costK(2)
		// Option 1 asks for at least one unit: one or two.
		if c12 := min(c1, c2); c12 == inf {
			a.bad1++
		} else {
			a.all1 += c12
		}
		if c2 == inf {
			a.bad2++
			a.bareBad = c0
		} else {
			a.all2 += c2
			if c0 < inf && (!a.hasBare || c0-c2 < a.bare2) {
				a.bare2, a.hasBare = c0-c2, true
			}
		}
	}
	var total structural.Cost
	for i := range sets {
		a := &sets[i]
		best := inf
		if a.bad1 == 0 {
			best = a.all1
		}
		switch {
		case a.bad2 == 0 && a.hasBare:
			best = min(best, a.all2+a.bare2)
		case a.bad2 == 1 && a.bareBad < inf:
			best = min(best, a.all2+a.bareBad)
		}
		if best >= inf {
			continue // infeasible here: the survival test cuts the branch
		}
		total += best
	}
	return total
}

// twoStep runs the two-step method: nil units when step 2 cannot
// complete step 1's placement.
func twoStep(g, h *structural.Network, p structural.Property, t Threat, dev structural.Devices, maxMult uint8, nodes int) (units, *TwoStep, error) {
	start := dev
	var forcedCost structural.Cost
	if t == AnyLink {
		start, forcedCost = withForced(dev, forcedByLinks(h))
	}
	pl, err := placement.Place(g, p, start)
	if err != nil {
		return nil, nil, fmt.Errorf("failure: %w", err)
	}
	n := g.N()
	u := make(units, n)
	for _, v := range pl.Devices.IDs() {
		u[v] = 1
	}
	two := &TwoStep{Base: pl.Devices, BaseCost: pl.Cost + forcedCost}
	c := newCore(h, u.signals())
	if !c.holds() {
		return nil, nil, errors.New("failure: internal error: the cheapest placement does not hold")
	}
	// A device may go on a state without one, or as a spare.
	canTake := func(v int32) bool {
		return dev.Allowed(v) && (u[v] == 0 || u[v] < maxMult)
	}
	cand := map[int32]int32{} // state -> candidate index
	var candState []int32
	var inst cover.Instance
	// Each requirement keeps at most setCap candidate states, the nearest
	// first, from a search of at most searchCap states.
	const setCap, searchCap = 256, 512
	addSet := func(states []int32, cut bool) int {
		var s []int32
		for _, v := range states {
			if !canTake(v) {
				continue
			}
			if len(s) == setCap {
				cut = true
				break
			}
			x, ok := cand[v]
			if !ok {
				x = int32(len(candState))
				cand[v] = x
				candState = append(candState, v)
				inst.Cost = append(inst.Cost, int64(dev.CostOf(v)))
			}
			s = append(s, x)
		}
		two.Restricted = two.Restricted || cut && len(s) > 0
		inst.Sets = append(inst.Sets, s)
		return len(s)
	}
	// addSearch adds the requirement found by search, searched again in
	// full when the capped search found no candidate.
	addSearch := func(search func(limit int) ([]int32, bool)) {
		if states, cut := search(searchCap); addSet(states, cut) == 0 && cut {
			inst.Sets = inst.Sets[:len(inst.Sets)-1]
			states, _ = search(0)
			addSet(states, false)
		}
	}
	a := bip.NewAug(c.bg, c.m)
	if t == AnyDevice {
		src := c.sources()
		for i := 0; i < c.k; i++ {
			if c.tree.Size[c.sigNode(i)] > 1 {
				for _, x := range src.sccsOf(i) {
					if src.touchCount(x) == 1 {
						addSet(src.statesOf(x), false)
					}
				}
			}
			if c.coloop(i) {
				mark := a.Mark()
				r := a.Disable(int32(c.n + i))
				addSearch(func(limit int) ([]int32, bool) { return a.AltReachLimit([]int32{r}, -1, -1, limit) })
				a.Undo(mark)
			}
		}
	} else {
		for v := int32(0); int(v) < c.n; v++ {
			if b := c.bridge(v); b >= 0 {
				addSearch(func(limit int) ([]int32, bool) { return c.reachersWithout(b, v, limit) })
			}
			if m := c.criticalIn(v); m >= 0 {
				mark := a.Mark()
				a.Unmatch(v)
				addSearch(func(limit int) ([]int32, bool) { return a.AltReachLimit([]int32{v}, v, m, limit) })
				a.Undo(mark)
			}
		}
	}
	two.Requirements = len(inst.Sets)
	res := cover.Greedy(inst)
	if !res.Feasible {
		return nil, two, nil
	}
	var entries int
	for _, st := range inst.Sets {
		entries += len(st)
	}
	if entries <= 1<<14 {
		res = cover.Exact(inst, res, nodes) // each node costs a pass over the entries
	}
	for _, x := range res.Chosen {
		u[candState[x]]++
	}
	two.CoverCost = structural.Cost(res.Cost)
	two.CoverLowerBound = structural.Cost(res.LowerBound)
	two.CoverFactor = res.Factor
	two.CoverOptimal = res.Optimal
	return u, two, nil
}

// reachersWithout returns the states that reach v in h without the edge
// u -> v (those the loss of a bridge u -> v cuts off and that can reach
// all of them again), nearest first, stopping after limit states (0: no
// limit); it reports whether it stopped early.
func (c *core) reachersWithout(u, v int32, limit int) ([]int32, bool) {
	in := c.h.In()
	if c.mark == nil {
		c.mark = make([]int32, c.n)
	}
	c.stamp++
	st := c.stamp
	c.mark[v] = st
	q := []int32{v}
	for k := 0; k < len(q); k++ {
		y := q[k]
		for _, w := range in.Row(y) {
			if y == v && w == u || c.mark[w] == st {
				continue
			}
			if limit > 0 && len(q) >= limit {
				return q, true
			}
			c.mark[w] = st
			q = append(q, w)
		}
	}
	return q, false
}

// exact runs the branch and bound. It returns a better placement than the
// incumbent if found (nil otherwise), the least bound of the branches left
// open when cut short, whether it completed, and the nodes visited.
func exact(g, h *structural.Network, p structural.Property, t Threat, dev structural.Devices, maxMult uint8, inc units, incCost structural.Cost, limit int) (units, structural.Cost, bool, int, error) {
	n := g.N()
	var order []int32
	for v := int32(0); int(v) < n; v++ {
		if dev.Allowed(v) {
			order = append(order, v)
		}
	}
	// Expensive states first, each tried without a device first.
	slices.SortStableFunc(order, func(a, b int32) int { return cmp.Compare(dev.CostOf(b), dev.CostOf(a)) })
	var forced []bool
	if t == AnyLink {
		forced = forcedByLinks(h)
	}
	options := func(v int32) []uint8 {
		switch {
		case forced != nil && forced[v] && !dev.Has(v) && maxMult == 2:
			return []uint8{1, 2}
		case forced != nil && forced[v] && !dev.Has(v):
			return []uint8{1}
		case dev.Has(v) && maxMult == 2:
			return []uint8{1, 2}
		case dev.Has(v):
			return []uint8{1}
		case maxMult == 2:
			return []uint8{0, 1, 2}
		}
		return []uint8{0, 1}
	}
	decided := make([]int8, n)
	for v := range decided {
		decided[v] = -1
		if !dev.Allowed(int32(v)) {
			decided[v] = 0
		}
	}
	cur := make(units, n)
	maxU := make(units, n)
	var best units
	bestCost := incCost
	unitCost := func(v int32, m uint8) structural.Cost {
		k := int(m)
		if dev.Has(v) {
			k--
		}
		return structural.Cost(k) * dev.CostOf(v)
	}
	count := 0
	// evaluate judges the node whose first d states of order are decided:
	// whether to expand it, and its bound.
	evaluate := func(d int, spent structural.Cost) (bool, structural.Cost, error) {
		for v := range cur {
			switch {
			case decided[v] >= 0:
				cur[v] = uint8(decided[v])
			case dev.Has(int32(v)):
				cur[v] = 1
			default:
				cur[v] = 0
			}
		}
		if spent < bestCost && survives(h, cur, t) {
			best, bestCost = slices.Clone(cur), spent
			return false, spent, nil
		}
		if d == len(order) {
			return false, spent, nil
		}
		// The cheapest plain placement of what is left.
		ex := make([]bool, n)
		fb := make([]bool, n)
		for v := range decided {
			ex[v] = decided[v] > 0 || dev.Has(int32(v))
			fb[v] = decided[v] == 0
		}
		pl, err := placement.Place(g, p, structural.Devices{Cost: dev.Cost, Forbidden: fb, Existing: ex})
		if err != nil {
			return false, 0, err
		}
		if !pl.Feasible {
			return false, 0, nil
		}
		// pl.Cost counts new devices at their cost; existing ones of the
		// original table are decided and free.
		bound := pl.Cost
		if t == AnyDevice {
			// The cheapest new unit left: a first device, or a spare.
			cmin := structural.Cost(-1)
			for _, v := range order[d:] {
				if !dev.Has(v) || maxMult == 2 {
					if c := dev.CostOf(v); cmin < 0 || c < cmin {
						cmin = c
					}
				}
			}
			if cmin > 0 {
				bound += cmin
			}
			bound = max(bound, sourceBound(h, dev, decided, maxMult)+leafBound(h, dev, decided, maxMult))
		}
		lbNode := spent + bound
		if lbNode >= bestCost {
			return false, lbNode, nil
		}
		for v := range maxU {
			switch {
			case decided[v] >= 0:
				maxU[v] = uint8(decided[v])
			case dev.Allowed(int32(v)):
				maxU[v] = maxMult
			default:
				maxU[v] = 0
			}
		}
		if !survives(h, maxU, t) {
			return false, lbNode, nil
		}
		return true, lbNode, nil
	}
	type frame struct {
		d     int
		next  int
		spent structural.Cost
		lb    structural.Cost
	}
	var stack []frame
	ok, rootLB, err := evaluate(0, 0)
	if err != nil {
		return nil, 0, false, 0, err
	}
	if ok {
		stack = append(stack, frame{d: 0, lb: rootLB})
	}
	aborted := false
	for len(stack) > 0 {
		f := &stack[len(stack)-1]
		v := order[f.d]
		opts := options(v)
		if f.next == len(opts) {
			decided[v] = -1
			stack = stack[:len(stack)-1]
			continue
		}
		if count >= limit {
			aborted = true
			break
		}
		count++
		m := opts[f.next]
		f.next++
		decided[v] = int8(m)
		spent := f.spent + unitCost(v, m)
		d := f.d + 1
		ok, lbNode, err := evaluate(d, spent)
		if err != nil {
			return nil, 0, false, 0, err
		}
		if ok {
			stack = append(stack, frame{d: d, spent: spent, lb: lbNode})
		}
	}
	openLB := bestCost
	if aborted {
		for _, f := range stack {
			if f.next < len(options(order[f.d])) {
				openLB = min(openLB, f.lb)
			}
		}
	}
	return best, openLB, !aborted, count, nil
}

// prune removes device units from u, most expensive first, while the
// design still survives, keeping the units of keep; at most tests
// survival tests. It is the fallback when the second step cannot complete
// the first (a failure of the cheapest placement that no added device can
// cover).
func prune(h *structural.Network, u, keep units, t Threat, dev structural.Devices, tests int) units {
	u = slices.Clone(u)
	var order []int32
	for v := range u {
		if u[v] > keep[v] {
			order = append(order, int32(v))
		}
	}
	slices.SortStableFunc(order, func(a, b int32) int { return cmp.Compare(dev.CostOf(b), dev.CostOf(a)) })
	for _, v := range order {
		for u[v] > keep[v] && tests > 0 {
			tests--
			u[v]--
			if !survives(h, u, t) {
				u[v]++
				break
			}
		}
	}
	return u
}
