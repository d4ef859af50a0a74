package target

import (
	"slices"

	"math/rand/v2"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/numeric"
)

// Defaults of Limits.
const (
	// DefaultMaxLinkingArcs bounds the dynamic graph built for the exact
	// linking bound: |H| layers times (edges + states + signal entries)
	// of the part H that matters.
	DefaultMaxLinkingArcs = 20_000_000
	// DefaultMaxSampleStates bounds the part H for the sampled rank (the
	// same default as numeric.Verify's whole-network limit).
	DefaultMaxSampleStates = numeric.DefaultMaxStates
	// DefaultTrials is the number of samples Check draws at most.
	DefaultTrials = 2
	// DefaultLayerCutDepth is the deepest layer cut tried.
	DefaultLayerCutDepth = 64
	// DefaultMaxDimensionStates bounds the network for the controllable
	// dimension bound (a min-cost flow on the whole network).
	DefaultMaxDimensionStates = 100_000
	// DefaultLinkingDepth is the number of layers of the greedy linking.
	DefaultLinkingDepth = 48
	// checkProveWork bounds the field operations of Check's quick proof
	// (rankProve) before the full sample.
	checkProveWork = 2_000_000_000
)

// Limits bound the work of the exact parts of Check and Select. Zero
// fields take the defaults; a negative field turns that part off.
type Limits struct {
	// MaxLinkingArcs bounds the dynamic graph of the linking bound.
	MaxLinkingArcs int64
	// MaxSampleStates bounds the states of the part H on which the rank of
	// C·K is computed on a sample.
	MaxSampleStates int
	// Trials is the most samples drawn; drawing stops once a sample meets
	// the best upper bound.
	Trials int
	// LayerCutDepth is the deepest layer cut tried.
	LayerCutDepth int
	// MaxDimensionStates bounds the network for the controllable
	// dimension bound.
	MaxDimensionStates int
	// LinkingDepth is the number of layers of the greedy linking.
	LinkingDepth int
	// sampleHook, for tests, replaces the sampled rank of Check.
	sampleHook func(rank int) int
}

func (l Limits) withDefaults() Limits {
	if l.MaxLinkingArcs == 0 {
		l.MaxLinkingArcs = DefaultMaxLinkingArcs
	}
	if l.MaxSampleStates == 0 {
		l.MaxSampleStates = DefaultMaxSampleStates
	}
	if l.Trials == 0 {
		l.Trials = DefaultTrials
	}
	if l.LayerCutDepth == 0 {
		l.LayerCutDepth = DefaultLayerCutDepth
	}
	if l.MaxDimensionStates == 0 {
		l.MaxDimensionStates = DefaultMaxDimensionStates
	}
	if l.LinkingDepth == 0 {
		l.LinkingDepth = DefaultLinkingDepth
	}
	return l
}

// CheckRequest asks whether a design steers a set of target states.
type CheckRequest struct {
	// Property is Controllability (inputs steer the targets) or
	// Observability (outputs tell the targets' initial values; asked as
	// target controllability of the transposed network).
	Property structural.Property
	// Targets are the states that must be steerable.
	Targets []int32
	// Inputs is the design judged (outputs, for Observability).
	Inputs structural.Design
	// Seed makes the samples reproducible.
	Seed uint64
	Limits
}

// Status is the outcome of a check.
type Status string

// The outcomes. Controllable is proved from below (a sample of C·K of
// rank |T|, Lin's theorem on a subnetwork, or |T| disjoint input-target
// paths); NotControllable is proved from above (an upper bound below |T|);
// Undecided means that the proved bounds straddle the number of targets:
// the exact parts were beyond the limits, or the samples fall short of the
// linking bound. A linking in the dynamic graph alone never proves
// Controllable (see Verdict.ByTheorem).
const (
	Controllable    Status = "controllable"
	NotControllable Status = "not_controllable"
	Undecided       Status = "undecided"
)

// Bound is one bound on the generic rank of C·K.
type Bound struct {
	// Name is one of "reached_targets", "in_capacity", "layer_cut",
	// "controllable_dimension", "dynamic_linking" (upper bounds, all
	// proved), "static_linking", "lin_subnetwork", "sampled_rank" (lower
	// bounds, proved), "greedy_linking" and "dynamic_linking" (linkings
	// in the dynamic graph, ByTheorem: lower bounds only if the rank
	// equals the largest dynamic linking, which is not proved here).
	Name string `json:"name"`
	// Upper reports an upper bound; otherwise a lower bound or, with
	// ByTheorem, a linking.
	Upper bool `json:"upper"`
	// ByTheorem reports a linking that would bound the rank from below if
	// the rank equalled the largest dynamic linking (the characterisation
	// attributed to Murota & Poljak 1990, not proved here). It never
	// raises Verdict.Lower and never decides the status.
	ByTheorem bool `json:"by_theorem"`
	// Value is the bound; meaningless when Skipped is set.
	Value int `json:"value"`
	// Skipped says why the bound was not computed.
	Skipped string `json:"skipped,omitempty"`
}

// Bottleneck is a set of targets with fewer independent ways in than
// targets: its in-neighbours (reached states) and the signals driving it
// number Capacity < len(Targets), so at most Capacity of these targets can
// be steered independently and at least Shortfall more signals must act
// directly on them.
type Bottleneck struct {
	Targets    structural.States `json:"targets"`
	Neighbours structural.States `json:"in_neighbours"`
	// Signals are the signals (0-based) driving some state of Targets;
	// SignalNumbers names them for a reader (design-file lines or 1-based
	// positions).
	Signals       []int `json:"-"`
	SignalNumbers []int `json:"input_lines"`
	Capacity      int   `json:"in_capacity"`
	Shortfall     int   `json:"shortfall"`
}

// Funnel is a layer every influence on the targets passes through: the
// States with a walk of exactly Depth steps to a target, plus the
// Above signals acting on the targets in fewer steps, number Capacity,
// fewer than the targets that can be told apart otherwise.
type Funnel struct {
	Depth    int               `json:"depth"`
	States   structural.States `json:"states"`
	Above    int               `json:"signals_above"`
	Capacity int               `json:"capacity"`
}

// Verdict judges a design for a set of targets: the generic rank of
// C[B, AB, ..., A^(N-1)B], C selecting the targets, bounded from both
// sides by proved bounds.
type Verdict struct {
	Property structural.Property `json:"-"`
	// Targets echoes the targets, in increasing order.
	Targets structural.States `json:"targets"`
	// Signals is the number of signals judged.
	Signals int `json:"signals"`
	// Status is Controllable when Lower equals the number of targets,
	// NotControllable when Upper is below it, Undecided otherwise.
	Status Status `json:"status"`
	// Holds reports Status == Controllable.
	Holds bool `json:"holds"`
	// Lower and Upper are the best proved bounds on the generic
	// target-controllable dimension (the generic rank of C·K); Exact
	// reports Lower == Upper, the dimension itself.
	Lower int  `json:"dimension"`
	Upper int  `json:"dimension_upper"`
	Exact bool `json:"exact"`
	// LowerFrom names the proved bound that gave Lower.
	LowerFrom string `json:"dimension_from"`
	// Linking is the largest linking found in the dynamic graph (greedy or
	// exact; 0 when none was computed). It bounds the rank from below
	// only by the characterisation attributed to Murota & Poljak, which is
	// not proved here, so it never raises Lower.
	Linking int `json:"linking"`
	// ByTheorem reports an Undecided verdict in which Linking reaches the
	// number of targets and no sample contradicts it: the targets are
	// steered if that characterisation holds, which no sample checked.
	ByTheorem bool `json:"by_theorem"`
	// SampleBelowLinking reports that the exact rank of a sample was
	// computed and is below Linking: either the characterisation fails
	// for this network (different path systems cancel through the shared
	// parameters of A) or every sample missed the generic rank (each with
	// probability at most FailureBound). The status is then decided by
	// the proved bounds alone.
	SampleBelowLinking bool `json:"sample_below_linking"`
	// Unreached lists the targets that no signal reaches, directly or
	// downstream.
	Unreached structural.States `json:"unreached"`
	// Bottleneck, when not nil, is a set of reached targets short of
	// independent in-neighbours (the in_capacity bound).
	Bottleneck *Bottleneck `json:"bottleneck"`
	// Funnel, when not nil, is the layer of the layer_cut bound, given
	// when it is tighter than the in-capacity bound.
	Funnel *Funnel `json:"funnel"`
	// Bounds lists every bound tried.
	Bounds []Bound `json:"bounds"`
	// RelevantStates is |H|, the states that some signal reaches and that
	// reach some target: the only ones the answer depends on.
	RelevantStates int `json:"relevant_states"`
	// FailureBound is the chance that one sample falls short of the
	// generic rank (numeric's Schwartz–Zippel bound N²/(p-1)); 0 when no
	// sample was drawn.
	FailureBound float64 `json:"failure_bound"`
}

// Check judges the design req.Inputs for the targets.
//
// Upper bounds, all proved: the reached targets; the in-capacity, the
// largest matching of the targets into distinct in-neighbours or signals;
// the layer cuts (see Funnel); the generic controllable dimension (Hosoe
// 1980, structural.Dimension, up to Limits.MaxDimensionStates), since
// rank C·K <= rank K; and, up to Limits.MaxLinkingArcs, the largest
// linking in the dynamic graph of |H| layers (via the
// Lindström–Gessel–Viennot lemma; see dynamicLinking). Lower bounds,
// proved: the largest set of vertex-disjoint paths from distinct signals
// to distinct targets (van der Woude 1991, through the rank of the
// transfer matrix); a subnetwork holding the targets on which Lin's
// theorem holds (see linCertificate); and, up to Limits.MaxSampleStates
// states in H, the exact rank of C·K over GF(2^61-1) for random samples,
// which never exceeds the generic rank and misses it with probability at
// most N²/(p-1) per sample. Linkings in the dynamic graph, a greedy one of
// Limits.LinkingDepth layers (see greedyLinking) and the largest one, are
// lower bounds only if the rank equals the largest dynamic linking (the
// characterisation attributed to Murota & Poljak, IEEE TAC 35(8), 1990,
// not proved here): they are reported as Linking and never raise Lower,
// so they never make a verdict Controllable (see Verdict.ByTheorem and
// Verdict.SampleBelowLinking).
//
// The bounds run cheapest first and stop once they meet. Work: breadth
// first searches and a few maximum matchings on H for the cheap bounds,
// one matching per layer for the greedy linking, the dimension's min-cost
// flow, O(|H|·(E_H + |H|)) arcs for the dynamic linking, and
// O(r·(E_H + r·|H|)) for a sample.
func Check(g *structural.Network, req CheckRequest) (*Verdict, error) {
	if !req.Inputs.Of(g) {
		return nil, structural.ErrForeignDesign
	}
	targets, err := cleanTargets(g, req.Targets)
	if err != nil {
		return nil, err
	}
	lim := req.Limits.withDefaults()
	h := on(g, req.Property)
	p, unreached := newPart(h, targets, req.Inputs.Signals())
	v := &Verdict{Property: req.Property, Targets: g.States(targets), Signals: req.Inputs.Len(),
		Unreached: g.States(unreached), RelevantStates: p.n}
	b := p.bound(lim, req.Seed, func() (int, error) {
		return structural.Dimension(g, req.Property, req.Inputs)
	})
	if b.err != nil {
		return nil, b.err
	}
	v.Bounds = b.list
	v.Lower, v.Upper = b.lower, b.upper
	v.LowerFrom, v.Linking = b.lowerFrom, b.linking
	v.Exact = v.Lower == v.Upper
	nt := len(targets)
	v.Status = status(v.Lower, v.Upper, nt)
	v.Holds = v.Status == Controllable
	v.SampleBelowLinking = b.sampleRank >= 0 && b.sampleRank < b.linking
	v.ByTheorem = v.Status == Undecided && b.linking >= nt && !v.SampleBelowLinking
	if b.sampled {
		v.FailureBound = failureBound(g.N())
	}
	if w := b.witness; w != nil {
		bn := &Bottleneck{Targets: g.States(globals(p, w.targets)), Neighbours: g.States(globals(p, w.neighbours)),
			Signals: append([]int{}, w.signals...), SignalNumbers: []int{}}
		for _, s := range w.signals {
			bn.SignalNumbers = append(bn.SignalNumbers, req.Inputs.Number(s))
		}
		bn.Capacity = len(w.neighbours) + len(w.signals)
		bn.Shortfall = len(w.targets) - bn.Capacity
		v.Bottleneck = bn
	}
	if b.cut < b.capacity && b.cut < len(p.targets) {
		v.Funnel = funnel(g, p, b.cutK, b.cut)
	}
	return v, nil
}

// status decides a verdict from the proved bounds alone: Controllable
// when the proved lower bound reaches the targets, NotControllable when a
// proved upper bound is below them, Undecided otherwise.
func status(lower, upper, targets int) Status {
	switch {
	case lower >= targets:
		return Controllable
	case upper < targets:
		return NotControllable
	}
	return Undecided
}

// failureBound is numeric's bound N²/(p-1) on the chance that one random
// sample misses the generic rank. For C·K it also holds: a nonzero r×r
// minor has degree at most r·N <= N² in the parameters (a column
// C·A^k·b has degree k+1 <= N), and the Schwartz–Zippel lemma applies as
// in numeric's package comment.
func failureBound(n int) float64 {
	return float64(n) * float64(n) / float64(numeric.Mersenne61-1)
}

func globals(p *part, locals []int32) []int32 {
	out := make([]int32, len(locals))
	for i, l := range locals {
		out[i] = p.global[l]
	}
	return out
}

// funnel lists W_k for the layer cut of depth k.
func funnel(g *structural.Network, p *part, k, capacity int) *Funnel {
	cur := append([]int32(nil), p.targets...)
	mark := make([]int32, p.n)
	for d := 0; d < k; d++ {
		var next []int32
		for _, v := range cur {
			for _, u := range p.in.Row(v) {
				if mark[u] != int32(d+1) {
					mark[u] = int32(d + 1)
					next = append(next, u)
				}
			}
		}
		cur = next
	}
	states := globals(p, cur)
	slices.Sort(states)
	return &Funnel{Depth: k, States: g.States(states), Above: capacity - len(cur), Capacity: capacity}
}

// bounds collects the bounds of one question.
type bounds struct {
	list         []Bound
	lower, upper int // proved
	lowerFrom    string
	// linking is the largest dynamic-graph linking found, a lower bound
	// only by the unproved characterisation; never mixed into lower.
	linking int
	// sampleRank is the exact rank of C·K of the best full sample, -1
	// when no full sample was computed.
	sampleRank    int
	capacity, cut int
	cutK          int
	witness       *capacityWitness
	sampled       bool
	err           error
}

func (b *bounds) add(name string, upper bool, value int) { b.addBasis(name, upper, false, value) }

// addBasis records a bound. A linking by the theorem is kept apart, in
// b.linking: it never raises the proved lower bound.
func (b *bounds) addBasis(name string, upper, theorem bool, value int) {
	b.list = append(b.list, Bound{Name: name, Upper: upper, ByTheorem: theorem, Value: value})
	switch {
	case upper:
		b.upper = min(b.upper, value)
	case theorem:
		b.linking = max(b.linking, value)
	case value > b.lower || b.lowerFrom == "":
		b.lower, b.lowerFrom = value, name
	}
}

func (b *bounds) skip(name string, upper bool, why string) {
	b.list = append(b.list, Bound{Name: name, Upper: upper, Skipped: why})
}

// bound computes the bounds on the part, cheapest first, and stops once
// they meet. dim, when not nil, gives the generic controllable dimension.
func (p *part) bound(lim Limits, seed uint64, dim func() (int, error)) *bounds {
	nt := len(p.targets)
	b := &bounds{upper: nt, sampleRank: -1}
	b.add("reached_targets", true, nt)
	if nt == 0 {
		b.lowerFrom = "reached_targets"
		return b
	}
	b.capacity, b.witness = inCapacity(p)
	b.add("in_capacity", true, b.capacity)
	b.cut, b.cutK = layerCut(p, min(max(lim.LayerCutDepth, 0), p.n))
	b.add("layer_cut", true, b.cut)
	b.add("static_linking", false, staticLinking(p))
	const met = "the bounds already meet"
	rest := []string{"lin_subnetwork", "sampled_rank", "greedy_linking", "controllable_dimension", "dynamic_linking"}
	done := func(i int) bool {
		if b.lower < b.upper {
			return false
		}
		for _, name := range rest[i:] {
			b.skip(name, name == "controllable_dimension" || name == "dynamic_linking", met)
		}
		return true
	}
	if done(0) {
		return b
	}
	if b.upper == nt {
		if linCertificate(p) {
			b.add("lin_subnetwork", false, nt)
		} else {
			b.skip("lin_subnetwork", false, "no subnetwork found that passes Lin's test")
		}
	} else {
		b.skip("lin_subnetwork", false, "an upper bound is below the number of targets")
	}
	if done(1) {
		return b
	}
	if lim.MaxSampleStates >= 0 && p.n <= lim.MaxSampleStates {
		f := numeric.NewField(numeric.Mersenne61)
		// The cheap depth-by-depth columns first: enough when they meet
		// the upper bound.
		best, _, _ := rankProve(p, f, rand.New(rand.NewPCG(seed, 1<<32)), p.n, b.upper, checkProveWork)
		full := best // the rank of a whole sample, once known
		if best < b.upper {
			full = -1
			for t := 0; t < max(lim.Trials, 1) && best < b.upper; t++ {
				rng := rand.New(rand.NewPCG(seed, uint64(2*t)))
				r := rankSample(p, f, rng, b.upper)
				best, full = max(best, r), max(full, r)
			}
		}
		if lim.sampleHook != nil {
			best = lim.sampleHook(best)
			full = best
		}
		b.sampled, b.sampleRank = true, full
		b.add("sampled_rank", false, best)
	} else {
		b.skip("sampled_rank", false, "the relevant part exceeds the sample limit")
	}
	if done(2) {
		return b
	}
	b.addBasis("greedy_linking", false, true, greedyLinking(p, min(max(lim.LinkingDepth, 1), p.n)))
	if done(3) {
		return b
	}
	switch {
	case dim == nil:
	case lim.MaxDimensionStates >= 0 && p.whole <= lim.MaxDimensionStates:
		d, err := dim()
		if err != nil {
			b.err = err
			return b
		}
		b.add("controllable_dimension", true, d)
	default:
		b.skip("controllable_dimension", true, "the network exceeds the dimension limit")
	}
	if done(4) {
		return b
	}
	if lim.MaxLinkingArcs < 0 || linkWork(p, p.n) > lim.MaxLinkingArcs {
		b.skip("dynamic_linking", true, "the dynamic graph exceeds the linking limit")
		return b
	}
	// Layers double until the linking meets the best upper bound (then
	// the full linking is that bound too) or all |H| layers are built. The
	// full linking bounds the rank from above (proved); it is also kept as
	// the linking, a lower bound only by the unproved characterisation.
	for L := 1; ; L = min(2*L, p.n) {
		lam := dynamicLinking(p, L)
		if lam >= b.upper || L == p.n {
			lam = min(lam, b.upper)
			b.add("dynamic_linking", true, lam)
			b.addBasis("dynamic_linking", false, true, lam)
			break
		}
	}
	return b
}
