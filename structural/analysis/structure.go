package analysis

import (
	"cmp"
	"slices"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/placement"
)

// Where the signals of a Structure come from.
const (
	FromDesign    = "design"    // a design given to judge
	FromPlacement = "placement" // the cheapest dedicated devices
	FromDrivers   = "drivers"   // a minimum driver set
)

// Structure is the part of a network that carries control from one
// design's signals, read from the maximum matching of [A B] behind the
// verdict (structural.Verdict.MatchedFrom): each signal's stem, the chain
// of matched edges it feeds, and the cycles of matched edges, each hung
// where an edge from a stem or from a cycle already hung enters it (Lin's
// cactus: stems and buds, IEEE TAC 19(3), 1974). For observability the
// structure is that of the transposed network: a stem runs from an output
// back through the states that act on it.
type Structure struct {
	Property structural.Property `json:"property"`
	// Kind names the signals: "driver node", "actuator", "input",
	// "sensor" or "output". Source is FromDesign, FromPlacement or
	// FromDrivers.
	Kind   string `json:"kind"`
	Source string `json:"source"`
	// Design is the design drawn; Verdict its verdict, nil for the driver
	// set (which holds by construction).
	Design  structural.Design   `json:"-"`
	Verdict *structural.Verdict `json:"-"`
	// Stems has one entry per signal, longest stem first (ties in signal
	// order).
	Stems []Stem `json:"stems"`
	// Cycles are the cycles of matched edges, largest first.
	Cycles []Cycle `json:"cycles"`
	// Loose counts the states on neither a stem nor a cycle: chains of
	// matched edges that start at a state nothing feeds (a dilation
	// member).
	Loose int `json:"loose_states"`
	// Costed reports whether signals carry costs from a placement.
	Costed bool `json:"-"`

	stemOf []int32 // state -> index in Stems, or -1
	cycOf  []int32 // state -> index in Cycles, or -1
}

// Stem is one signal's chain of matched edges.
type Stem struct {
	// Signal is the 0-based index in the design; Number names it to a
	// reader (structural.Design.Number).
	Signal int `json:"-"`
	Number int `json:"signal"`
	// States are the stem's states in order from the signal (empty when
	// the matching gives the signal no state of its own).
	States structural.States `json:"states"`
	// Cycles and CycleStates count the cycles hung from this stem
	// (directly or through other cycles) and their states.
	Cycles      int `json:"cycles"`
	CycleStates int `json:"cycle_states"`
	// New reports a device a placement adds (false for one in place);
	// Cost is its cost when the placement has costs.
	New  bool             `json:"new"`
	Cost *structural.Cost `json:"cost,omitempty"`
}

// Cycle is a cycle of matched edges (a matched self-loop has one state).
type Cycle struct {
	// States in matched order: each acts on the next, the last on the
	// first.
	States structural.States `json:"states"`
	// Stem is the index in Structure.Stems of the stem it hangs from, -1
	// when no stem or hung cycle has an edge into it.
	Stem int `json:"stem"`
	// Anchor is the state whose edge enters the cycle; empty when the
	// cycle hangs from the signal itself or from nothing.
	Anchor structural.States `json:"anchor"`
}

// Hung reports whether the cycle hangs from a stem.
func (c *Cycle) Hung() bool { return c.Stem >= 0 }

// StemOf returns the index in Stems of the stem v lies on, or -1.
func (s *Structure) StemOf(v int32) int { return int(s.stemOf[v]) }

// CycleOf returns the index in Cycles of the cycle v lies on, or -1.
func (s *Structure) CycleOf(v int32) int { return int(s.cycOf[v]) }

// Structure returns the structure that carries control (p =
// Controllability) or observation (Observability) for the design the
// review judges or places: the given design, else the cheapest dedicated
// devices, else (controllability only) the driver set. It returns nil when
// the review has none for p. given is the design the request gave for p
// (ReviewRequest.Inputs or Outputs; nil for none): a review keeps the
// verdict, not the design. Time O(N + E), plus one Check for a placement.
func (r *Review) Structure(p structural.Property, given *structural.Design) (*Structure, error) {
	g := r.Network()
	var prop *PropertyResult
	var place *PlaceResult
	if r.Check != nil {
		prop = r.Check.Controllability
		if p == structural.Observability {
			prop = r.Check.Observability
		}
	}
	place = r.Actuators
	if p == structural.Observability {
		place = r.Sensors
	}
	s := &Structure{Property: p}
	switch {
	case prop != nil && given != nil:
		s.Source, s.Design, s.Verdict = FromDesign, *given, prop.Verdict
		s.Kind = signalKind(p, s.Design)
	case place != nil:
		d, err := structural.Dedicated(g, place.Devices.IDs())
		if err != nil {
			return nil, err
		}
		v, err := structural.Check(g, p, d)
		if err != nil {
			return nil, err
		}
		s.Source, s.Design, s.Verdict, s.Kind = FromPlacement, d, v, p.Device()
	case p == structural.Controllability && r.Drivers != nil:
		s.Source, s.Design, s.Kind = FromDrivers, r.Drivers.Inputs, "driver node"
	default:
		return nil, nil
	}
	h := g
	if p == structural.Observability {
		h = g.Transpose()
	}
	if s.Verdict != nil {
		s.build(h, s.Verdict.MatchedFrom())
	} else {
		s.build(h, driverFeeds(g, r.Drivers))
	}
	if s.Source == FromPlacement {
		s.mark(place.Placement)
	}
	return s, nil
}

func signalKind(p structural.Property, d structural.Design) string {
	dedicated := true
	for _, s := range d.Signals() {
		if len(s) != 1 {
			dedicated = false
			break
		}
	}
	switch {
	case p == structural.Controllability && dedicated:
		return "actuator"
	case p == structural.Controllability:
		return "input"
	case dedicated:
		return "sensor"
	}
	return "output"
}

// driverFeeds returns the matched feeds of the driver set's design, read
// off the network's maximum matching without another one: with each
// driver fed by its own signal it is a maximum matching of [A B] in which
// every state has a feed (Liu, Slotine & Barabási 2011).
func driverFeeds(g *structural.Network, d *DriversResult) []int32 {
	m := g.Matching()
	n := g.N()
	from := make([]int32, n)
	copy(from, m.ColMate)
	for i := 0; i < d.Inputs.Len(); i++ {
		v := d.Inputs.Signal(i)[0]
		if from[v] < 0 {
			from[v] = int32(n + i)
		}
	}
	return from
}

// build reads stems and cycles from the matched feeds of h (the network
// in the property's orientation).
func (s *Structure) build(h *structural.Network, from []int32) {
	n := h.N()
	next := make([]int32, n) // matched successor
	for i := range next {
		next[i] = -1
	}
	for v, u := range from {
		if u >= 0 && int(u) < n {
			next[u] = int32(v)
		}
	}
	s.stemOf = make([]int32, n)
	s.cycOf = make([]int32, n)
	for i := range s.stemOf {
		s.stemOf[i], s.cycOf[i] = -1, -1
	}
	g := h // a transposed network shares the names
	nsig := s.Design.Len()
	head := make([]int32, nsig)
	for i := range head {
		head[i] = -1
	}
	for v, u := range from {
		if int(u) >= n {
			head[int(u)-n] = int32(v)
		}
	}
	stems := make([]Stem, nsig)
	for i := 0; i < nsig; i++ {
		var states []int32
		for v := head[i]; v >= 0; v = next[v] {
			states = append(states, v)
		}
		stems[i] = Stem{Signal: i, Number: s.Design.Number(i), States: g.States(states)}
	}
	// Rank: longest first, ties in signal order.
	slices.SortStableFunc(stems, func(a, b Stem) int { return cmp.Compare(b.States.Len(), a.States.Len()) })
	rank := make([]int, nsig) // signal -> index in stems
	for k := range stems {
		rank[stems[k].Signal] = k
		for _, v := range stems[k].States.IDs() {
			s.stemOf[v] = int32(k)
		}
	}
	// Chains from unfed states are loose; every state left is on a cycle
	// (each state has at most one feed and one matched successor).
	loose := make([]bool, n)
	for v := 0; v < n; v++ {
		if from[v] < 0 {
			for u := int32(v); u >= 0 && !loose[u]; u = next[u] {
				loose[u] = true
				s.Loose++
			}
		}
	}
	var cycles []Cycle
	for v := 0; v < n; v++ {
		if s.stemOf[v] >= 0 || s.cycOf[v] >= 0 || loose[v] {
			continue
		}
		k := int32(len(cycles))
		var states []int32
		for w := int32(v); s.cycOf[w] < 0; w = next[w] {
			s.cycOf[w] = k
			states = append(states, w)
		}
		cycles = append(cycles, Cycle{States: g.States(states), Stem: -1})
	}
	// Hang cycles: first from the states each signal touches, then
	// breadth first over edges from stem and hung-cycle states.
	hang := func(c int32, stem int, anchor int32, queue []int32) []int32 {
		cy := &cycles[c]
		cy.Stem = stem
		if anchor >= 0 {
			cy.Anchor = g.States([]int32{anchor})
		}
		stems[stem].Cycles++
		stems[stem].CycleStates += cy.States.Len()
		return append(queue, cy.States.IDs()...)
	}
	var queue []int32
	for k := range stems {
		queue = append(queue, stems[k].States.IDs()...)
	}
	for i := 0; i < nsig; i++ {
		for _, w := range s.Design.Signal(i) {
			if c := s.cycOf[w]; c >= 0 && cycles[c].Stem < 0 {
				queue = hang(c, rank[i], -1, queue)
			}
		}
	}
	owner := func(u int32) int {
		if k := s.stemOf[u]; k >= 0 {
			return int(k)
		}
		return cycles[s.cycOf[u]].Stem
	}
	for qi := 0; qi < len(queue); qi++ {
		u := queue[qi]
		for _, w := range h.Succ(u) {
			if c := s.cycOf[w]; c >= 0 && cycles[c].Stem < 0 {
				queue = hang(c, owner(u), u, queue)
			}
		}
	}
	// Largest cycles first; keep cycOf in step.
	order := make([]int32, len(cycles))
	for i := range order {
		order[i] = int32(i)
	}
	slices.SortStableFunc(order, func(a, b int32) int { return cmp.Compare(cycles[b].States.Len(), cycles[a].States.Len()) })
	pos := make([]int32, len(cycles))
	sorted := make([]Cycle, len(cycles))
	for i, c := range order {
		pos[c] = int32(i)
		sorted[i] = cycles[c]
	}
	for v := range s.cycOf {
		if c := s.cycOf[v]; c >= 0 {
			s.cycOf[v] = pos[c]
		}
	}
	s.Stems, s.Cycles = stems, sorted
}

// mark sets New and Cost of placed devices.
func (s *Structure) mark(pl *placement.Placement) {
	s.Costed = true
	for k := range s.Stems {
		v := s.Design.Signal(s.Stems[k].Signal)[0]
		if pl.IsAdded(v) {
			c := pl.CostOf(v)
			s.Stems[k].New, s.Stems[k].Cost = true, &c
		}
	}
}
