package render

import (
	"errors"
	"fmt"
	"sort"
)

// Kind is the kind of view a picture shows.
type Kind int

// The views. Auto draws the whole network when it has at most MaxNodes
// states and its condensation otherwise.
const (
	Auto Kind = iota
	Whole
	Condensation
	Around
	OnlyDriven
)

// DefaultMaxNodes is the largest number of states drawn one by one unless
// Options.MaxNodes says otherwise: about what a person can read on one page,
// and what Graphviz lays out in a few seconds.
const DefaultMaxNodes = 150

// Options choose the view.
type Options struct {
	View Kind
	// MaxNodes bounds the states (or components) drawn; 0 means
	// DefaultMaxNodes.
	MaxNodes int
	// MaxEdges bounds the edges drawn; 0 means four per node. Edges that
	// carry control are kept first.
	MaxEdges int
	// Centres and Hops define the Around view: the states within Hops
	// links of a centre, in either direction (Hops 0 means 1).
	Centres []int32
	Hops    int
}

func (o *Options) maxNodes() int {
	if o.MaxNodes <= 0 {
		return DefaultMaxNodes
	}
	return o.MaxNodes
}

func (o *Options) maxEdges() int {
	if o.MaxEdges <= 0 {
		return 4 * o.maxNodes()
	}
	return o.MaxEdges
}

// View is what Select chose to draw.
type View struct {
	Kind Kind
	// Desc says in words which view this is, for the title.
	Desc string

	// States are the states drawn (Whole, Around, OnlyDriven), ascending.
	States []int32
	// Edges are the edges drawn between them, in CSR order.
	Edges []ViewEdge
	// Hidden[i] counts the links of States[i] to states not drawn.
	Hidden []int32

	// Comps are the nodes of a Condensation view, CompEdges its edges.
	Comps     []CompNode
	CompEdges []CompEdge

	// EdgesTotal is the number of edges the view would have without the
	// edge cap; len(Edges) or len(CompEdges) the number drawn.
	EdgesTotal int
}

// ViewEdge is one edge between drawn states.
type ViewEdge struct {
	From, To int32
	kind     uint8
}

// Stem reports whether the edge lies on a stem; Cycle whether on a cycle.
func (e ViewEdge) Stem() bool  { return e.kind == stemEdge }
func (e ViewEdge) Cycle() bool { return e.kind == cycleEdge }

// CompNode is one node of a condensation: a strongly connected component,
// or a summary of several components not drawn one by one.
type CompNode struct {
	// Component is the index in Components, or -1 for a summary node.
	Component int32
	// Summary is "source", "sink" or "other" for a summary node.
	Summary    string
	Components int // components summarised (1 for a component)
	States     int
	Driven     int // states driven by an input
	Sensed     int
	Unreached  int
	Unobserved int
	Source     bool  // a source component (no edge enters it)
	First      int32 // its lowest-numbered state
	Group      string
}

// CompEdge joins two condensation nodes (indices into Comps).
type CompEdge struct {
	From, To int32
	Count    int  // network edges it stands for
	Control  bool // at least one of them lies on a stem
}

// Select chooses what to draw of in.
func Select(in *Input, opt Options) (*View, error) {
	g := in.Net
	if g == nil || g.N() == 0 {
		return nil, errors.New("render: no network")
	}
	if in.Components == nil {
		in.Components = g.Components()
	}
	kind := opt.View
	if kind == Auto {
		kind = Whole
		if g.N() > opt.maxNodes() {
			kind = Condensation
		}
	}
	switch kind {
	case Whole:
		if g.N() > opt.maxNodes() {
			return nil, fmt.Errorf("render: %d states is more than the limit of %d for a whole view", g.N(), opt.maxNodes())
		}
		all := make([]int32, g.N())
		for i := range all {
			all[i] = int32(i)
		}
		v := statesView(in, opt, all, false)
		v.Kind = Whole
		v.Desc = "whole network"
		return v, nil
	case Around:
		return aroundView(in, opt)
	case OnlyDriven:
		return drivenView(in, opt)
	case Condensation:
		return condensationView(in, opt), nil
	}
	return nil, fmt.Errorf("render: unknown view %d", kind)
}

// statesView builds the view of the given states (ascending): the edges
// among them, control edges first when capped, and the hidden links.
// With onlyControl, only the matched edges are drawn.
func statesView(in *Input, opt Options, states []int32, onlyControl bool) *View {
	g := in.Net
	v := &View{States: states}
	shown := make(map[int32]int32, len(states)) // state -> position
	for i, s := range states {
		shown[s] = int32(i)
	}
	var on []uint8
	if in.Matching != nil {
		on = in.controlMarks()
	}
	var control, plain []ViewEdge
	hidden := make([]int32, len(states))
	anyHidden := false
	for i, u := range states {
		for _, w := range g.Succ(u) {
			if _, ok := shown[w]; !ok {
				hidden[i]++
				anyHidden = true
				continue
			}
			e := ViewEdge{From: u, To: w, kind: edgeKind(in.Matching, on, u, w)}
			if e.kind != plainEdge {
				control = append(control, e)
			} else if !onlyControl {
				plain = append(plain, e)
			}
		}
		for _, w := range g.Pred(u) {
			if _, ok := shown[w]; !ok {
				hidden[i]++
				anyHidden = true
			}
		}
	}
	if anyHidden {
		v.Hidden = hidden
	}
	v.EdgesTotal = len(control) + len(plain)
	max := opt.maxEdges()
	if len(control) > max {
		control = control[:max]
	}
	if len(control)+len(plain) > max {
		plain = plain[:max-len(control)]
	}
	// Back to CSR order, so that the DOT text follows the input.
	edges := append(control, plain...)
	sort.Slice(edges, func(a, b int) bool {
		if edges[a].From != edges[b].From {
			return edges[a].From < edges[b].From
		}
		return edges[a].To < edges[b].To
	})
	v.Edges = edges
	return v
}

// aroundView shows the states within opt.Hops links of the centres,
// nearest first, up to MaxNodes.
func aroundView(in *Input, opt Options) (*View, error) {
	g := in.Net
	if len(opt.Centres) == 0 {
		return nil, errors.New("render: an around view needs at least one centre state")
	}
	hops := opt.Hops
	if hops <= 0 {
		hops = 1
	}
	max := opt.maxNodes()
	depth := map[int32]int{}
	queue := make([]int32, 0, max)
	for _, c := range opt.Centres {
		if c < 0 || int(c) >= g.N() {
			return nil, fmt.Errorf("render: centre state %d out of range", c)
		}
		if _, ok := depth[c]; !ok && len(queue) < max {
			depth[c] = 0
			queue = append(queue, c)
		}
	}
	truncated := false
	for head := 0; head < len(queue) && !truncated; head++ {
		u := queue[head]
		if depth[u] == hops {
			continue
		}
		for _, row := range [2][]int32{g.Succ(u), g.Pred(u)} {
			for _, w := range row {
				if _, ok := depth[w]; ok {
					continue
				}
				if len(queue) == max {
					truncated = true
					break
				}
				depth[w] = depth[u] + 1
				queue = append(queue, w)
			}
		}
	}
	states := append([]int32(nil), queue...)
	sort.Slice(states, func(a, b int) bool { return states[a] < states[b] })
	v := statesView(in, opt, states, false)
	v.Kind = Around
	names := ""
	for i, c := range opt.Centres {
		if i == 3 {
			names += fmt.Sprintf(" and %d more", len(opt.Centres)-3)
			break
		}
		if i > 0 {
			names += ", "
		}
		names += g.Name(c)
	}
	v.Desc = fmt.Sprintf("neighbourhood of %s within %d %s: %d %s", names, hops, plural(hops, "link", "links"), len(states), plural(len(states), "state", "states"))
	if truncated {
		v.Desc += fmt.Sprintf(" (cut at the limit of %d, nearest first)", max)
	}
	return v, nil
}

// drivenView shows the states the inputs drive and the stems that start
// at them, signal by signal, up to MaxNodes states.
func drivenView(in *Input, opt Options) (*View, error) {
	if len(in.Inputs) == 0 {
		return nil, errors.New("render: a view of the driven states needs inputs")
	}
	max := opt.maxNodes()
	seen := map[int32]bool{}
	var states []int32
	signals := 0
	cut := false
	for _, sig := range in.Inputs {
		var add []int32
		for _, d := range sig {
			for u := d; u >= 0 && !seen[u]; {
				seen[u] = true
				add = append(add, u)
				if in.Matching == nil {
					break
				}
				u = in.Matching.RowMate[u]
			}
		}
		if len(states)+len(add) > max {
			if signals > 0 {
				break
			}
			add = add[:max] // one stem longer than the limit: its head
			cut = true
		}
		states = append(states, add...)
		signals++
		if cut {
			break
		}
	}
	sort.Slice(states, func(a, b int) bool { return states[a] < states[b] })
	v := statesView(in, opt, states, true)
	v.Kind = OnlyDriven
	kind := in.inputKind()
	v.Desc = fmt.Sprintf("driven states and their stems: %d %s", len(states), plural(len(states), "state", "states"))
	if signals < len(in.Inputs) || cut {
		v.Desc += fmt.Sprintf(", first %d of %d %ss (limit %d states)", signals, len(in.Inputs), kind, max)
	}
	return v, nil
}

func plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}
