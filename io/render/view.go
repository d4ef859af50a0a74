package render

import (
	"errors"
	"fmt"
	"sort"
	"strconv"
	"strings"
	"time"
)

// Kind is the kind of view a picture shows.
type Kind int

// The views. Whole, Around and Components are graphs laid out by Graphviz
// and grow with what they draw; Control, Groups and Degrees draw the
// answer itself, laid out by netsteer, and take time linear in the
// network whatever its size.
const (
	// Auto picks by size: Whole up to MaxNodes states, Control above.
	Auto Kind = iota
	// Whole draws every state and edge.
	Whole
	// Around draws the states within Hops links of Centres.
	Around
	// Components draws the condensation: one node per strongly connected
	// component, labelled by what it is.
	Components
	// Control draws the control structure: each signal's stem in order,
	// cycles hung where they attach, long stems shortened, ranked by size.
	Control
	// Groups draws a table and a chart by node-table group.
	Groups
	// Degrees draws the degree distributions of the signals' states
	// against all states, and the stem lengths.
	Degrees
)

var kindNames = []string{"auto", "whole", "around", "components", "control", "groups", "degrees"}

// String returns the view's name, as ParseKind reads it.
func (k Kind) String() string {
	if k >= 0 && int(k) < len(kindNames) {
		return kindNames[k]
	}
	return "Kind(" + strconv.Itoa(int(k)) + ")"
}

// ParseKind reads a view name.
func ParseKind(s string) (Kind, error) {
	for i, n := range kindNames {
		if s == n {
			return Kind(i), nil
		}
	}
	return 0, fmt.Errorf("render: unknown view %q (want %s)", s, strings.Join(kindNames, ", "))
}

// Views returns the view names with a line of help each.
func Views() [][2]string {
	return [][2]string{
		{"auto", "whole network up to --max-nodes states, else the control structure"},
		{"whole", "every state and edge (Graphviz layout)"},
		{"around", "the states within --hops links of --around (Graphviz layout)"},
		{"components", "one node per strongly connected component, labelled by what it is"},
		{"control", "each signal's stem in order with its cycles, ranked; any size"},
		{"groups", "table and chart by node-table group; any size"},
		{"degrees", "degree distributions of the signals' states against all, stem lengths; any size"},
	}
}

// DefaultMaxNodes is the largest number of states drawn one by one unless
// Options.MaxNodes says otherwise: about what a person can read on one
// page, and what Graphviz lays out in a few seconds.
const DefaultMaxNodes = 150

// DefaultMaxStems is the number of stems the control view draws one by
// one.
const DefaultMaxStems = 40

// Options choose the view.
type Options struct {
	View Kind
	// MaxNodes bounds the states (or components) of a Graphviz view; 0
	// means DefaultMaxNodes.
	MaxNodes int
	// MaxEdges bounds the edges drawn; 0 means four per node. Edges that
	// carry control are kept first.
	MaxEdges int
	// Centres and Hops define the Around view: the states within Hops
	// links of a centre, in either direction (Hops 0 means 1).
	Centres []int32
	Hops    int
	// MaxStems bounds the stems the Control view draws one by one (0:
	// DefaultMaxStems); the rest are counted.
	MaxStems int
	// Budget bounds the estimated layout time of a Graphviz view (0:
	// DefaultBudget); a view estimated above it is refused with a
	// *BudgetError before any layout starts.
	Budget time.Duration
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

func (o *Options) maxStems() int {
	if o.MaxStems <= 0 {
		return DefaultMaxStems
	}
	return o.MaxStems
}

// View is what Select chose to draw.
type View struct {
	Kind Kind
	// Desc says in words which view this is, for the title.
	Desc string
	// Chosen says why Auto chose this view; empty when the view was asked
	// for.
	Chosen string

	// States are the states drawn (Whole, Around), ascending.
	States []int32
	// Edges are the edges drawn between them, in CSR order.
	Edges []ViewEdge
	// Hidden[i] counts the links of States[i] to states not drawn.
	Hidden []int32

	// Comps are the nodes of a Components view, CompEdges its edges.
	Comps     []CompNode
	CompEdges []CompEdge

	// EdgesTotal is the number of edges the view would have without the
	// edge cap; len(Edges) or len(CompEdges) the number drawn.
	EdgesTotal int

	// Estimate is the expected layout time of a Graphviz view (zero for
	// the others).
	Estimate time.Duration

	opt Options
}

// Graph reports whether the view is a graph laid out by Graphviz.
func (v *View) Graph() bool { return v.Kind.Graph() }

// Graph reports whether views of kind k are graphs laid out by Graphviz.
func (k Kind) Graph() bool { return k == Whole || k == Around || k == Components }

// ViewFor returns the kind of view Select draws for a network of n
// states: o.View, or for Auto the choice by size (Whole up to MaxNodes
// states, Control above).
func (o *Options) ViewFor(n int) Kind {
	switch {
	case o.View != Auto:
		return o.View
	case n > o.maxNodes():
		return Control
	}
	return Whole
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
	Sink       bool  // a sink component (no edge leaves it)
	First      int32 // its lowest-numbered state
	Group      string
	// Rank is the component's place by size among those of two or more
	// states (1: the largest), 0 for others.
	Rank int
}

// CompEdge joins two condensation nodes (indices into Comps).
type CompEdge struct {
	From, To int32
	Count    int // network edges it stands for
	Stems    int // of them, edges on a stem
}

// Select chooses what to draw of in. A Graphviz view whose layout is
// estimated to take longer than opt.Budget is refused with a
// *BudgetError naming the estimate and the views that will work.
func Select(in *Input, opt Options) (*View, error) {
	g := in.Net
	if g == nil || g.N() == 0 {
		return nil, errors.New("render: no network")
	}
	in.prep()
	kind := opt.ViewFor(g.N())
	chosen := ""
	switch {
	case opt.View != Auto:
	case kind == Control:
		chosen = fmt.Sprintf("chosen for %s states: more than %s are not drawn one by one", num(g.N()), num(opt.maxNodes()))
	default:
		chosen = fmt.Sprintf("chosen for %s states: up to %s are drawn one by one", num(g.N()), num(opt.maxNodes()))
	}
	var v *View
	var err error
	switch kind {
	case Whole:
		if g.N() > opt.maxNodes() {
			return nil, &BudgetError{View: Whole, Nodes: g.N(), Edges: g.Edges(), Limit: opt.maxNodes(), Estimate: estimate(g.N(), g.Edges())}
		}
		all := make([]int32, g.N())
		for i := range all {
			all[i] = int32(i)
		}
		v = statesView(in, opt, all)
		v.Kind = Whole
		v.Desc = "whole network"
	case Around:
		v, err = aroundView(in, opt)
	case Components:
		v = condensationView(in, opt)
	case Control:
		if in.In == nil {
			return nil, errors.New("render: the control view needs inputs or a driver set")
		}
		v = &View{Kind: Control, Desc: controlDesc(in, opt)}
	case Groups:
		if in.Group == nil {
			return nil, errors.New("render: the groups view needs the states' groups (a node table with a group column)")
		}
		v = &View{Kind: Groups, Desc: "summary by group of the node table"}
	case Degrees:
		v = &View{Kind: Degrees, Desc: "degree distributions and stem lengths"}
	default:
		return nil, fmt.Errorf("render: unknown view %d", kind)
	}
	if err != nil {
		return nil, err
	}
	v.Chosen, v.opt = chosen, opt
	if chosen != "" {
		v.Desc += " (" + chosen + ")"
	}
	if v.Graph() {
		n, e := v.size()
		v.Estimate = estimate(n, e)
		if b := opt.budget(); v.Estimate > b {
			return nil, &BudgetError{View: kind, Nodes: n, Edges: e, Estimate: v.Estimate, Budget: b}
		}
	}
	return v, nil
}

// statesView builds the view of the given states (ascending): the edges
// among them, control edges first when capped, and the hidden links.
// With onlyControl, only the matched edges are drawn.
func statesView(in *Input, opt Options, states []int32) *View {
	g := in.Net
	v := &View{States: states}
	shown := make(map[int32]int32, len(states)) // state -> position
	for i, s := range states {
		shown[s] = int32(i)
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
			e := ViewEdge{From: u, To: w, kind: in.edgeKind(u, w)}
			if e.kind != plainEdge {
				control = append(control, e)
			} else {
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
	v := statesView(in, opt, states)
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

func plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}
