package netwrite

import (
	"math"
	"strconv"
	"strings"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/analysis"
)

// The attributes written, one name per concept, as the JSON keys name them.
const (
	attrDriver     = "driver"       // bool: a driver node
	attrSignal     = "signal"       // int: the signal driving the state (0: none)
	attrNodeRole   = "node_role"    // critical, intermittent, redundant
	attrMatched    = "matched"      // bool: the edge is in the maximum matching shown
	attrControl    = "control"      // stem or cycle: the matched edge carries control
	attrLinkRole   = "link_role"    // critical, ordinary, redundant
	attrDevice     = "device"       // new or existing
	attrCost       = "cost"         // the cost of a new device
	attrForced     = "forced"       // bool: every cheapest placement has it
	attrAlternates = "alternatives" // states that could take its place
	attrLabel      = "label"
	attrGroup      = "group"
)

// control marks the matched edges of a cover of g: from[v] is where v's
// matched edge comes from (a state u for u -> v, or a value >= N or < 0
// otherwise), head reports which states begin a stem. It returns, per edge
// of g.Out().Adj, "stem", "cycle" or "" and whether the edge is matched.
func control(g *structural.Network, from []int32, head func(v int32) bool) ([]string, []bool) {
	n := int32(g.N())
	next := make([]int32, n) // the state v a matched edge u -> v goes to
	for i := range next {
		next[i] = -1
	}
	for v, u := range from {
		if u >= 0 && u < n {
			next[u] = int32(v)
		}
	}
	onStem := make([]bool, n)
	for v := int32(0); v < n; v++ {
		if !head(v) {
			continue
		}
		for u := v; u >= 0 && !onStem[u]; u = next[u] {
			onStem[u] = true
		}
	}
	kind := make([]string, g.Edges())
	matched := make([]bool, g.Edges())
	out := g.Out()
	for u := int32(0); u < n; u++ {
		for k := out.Ptr[u]; k < out.Ptr[u+1]; k++ {
			v := out.Adj[k]
			if next[u] != v {
				continue
			}
			matched[k] = true
			if onStem[u] && onStem[v] {
				kind[k] = "stem"
			} else {
				kind[k] = "cycle"
			}
		}
	}
	return kind, matched
}

// FromDrivers annotates the network of a drivers answer: driver nodes,
// the signal driving each state, the matched edges as stems and cycles,
// and the roles when computed.
func FromDrivers(r *analysis.DriversResult) *Annotated {
	g := r.Network()
	n := g.N()
	a := &Annotated{Net: g, Graph: []Attr{StringAttr("question", "fewest independent control signals"),
		IntAttr("driver_count", r.DriverCount), IntAttr("matching_size", r.MatchingSize)}}
	driver := make([]bool, n)
	for _, v := range r.Drivers.IDs() {
		driver[v] = true
	}
	signal := make([]int64, n)
	for i, s := range r.Inputs.Signals() {
		for _, v := range s {
			signal[v] = int64(i + 1)
		}
	}
	a.Nodes = append(a.Nodes, Column{Name: attrDriver, Type: Bool, Bools: driver}, Column{Name: attrSignal, Type: Int, Ints: signal})
	if r.NodeRoles != nil {
		a.Nodes = append(a.Nodes, Column{Name: attrNodeRole, Type: String, Strings: roleNames(r.NodeRoles.Of)})
	}
	m := g.Matching()
	kind, matched := control(g, m.ColMate, func(v int32) bool { return m.ColMate[v] < 0 })
	a.Edges = append(a.Edges, Column{Name: attrMatched, Type: Bool, Bools: matched}, Column{Name: attrControl, Type: String, Strings: kind})
	if r.LinkRoles != nil {
		a.Edges = append(a.Edges, Column{Name: attrLinkRole, Type: String, Strings: roleNames(r.LinkRoles.Of)})
	}
	return a
}

func roleNames(roles []structural.Role) []string {
	out := make([]string, len(roles))
	for i, r := range roles {
		out[i] = r.String()
	}
	return out
}

// FromCheck annotates the network of a check answer, per property (the
// attribute names start with "controllability_" or "observability_"): the
// signals touching each state (their design-file lines, ";"-separated),
// unreached states, the dilation witness, the states of the cheapest
// completion, and the matched edges of [A B] ([A; C]) as stems and cycles.
func FromCheck(r *analysis.CheckResult) *Annotated {
	g := r.Network()
	n := g.N()
	a := &Annotated{Net: g, Graph: []Attr{StringAttr("question", "is the design structurally controllable (observable)?")}}
	for _, p := range r.Properties() {
		pre := p.Property.String() + "_"
		a.Graph = append(a.Graph, BoolAttr(pre+"holds", p.Holds), IntAttr(pre+"dimension", p.Dimension))
		sig := make([]string, n)
		for i, st := range p.Design.Signals() {
			for _, v := range st {
				if sig[v] != "" {
					sig[v] += ";"
				}
				sig[v] += strconv.Itoa(p.Design.Number(i))
			}
		}
		unreached := make([]bool, n)
		for _, v := range p.Unreached.IDs() {
			unreached[v] = true
		}
		dil := make([]bool, n)
		if p.Dilation != nil {
			for _, v := range p.Dilation.States.IDs() {
				dil[v] = true
			}
		}
		added := make([]bool, n)
		if c := p.Completion; c != nil {
			for _, v := range c.Added.IDs() {
				added[v] = true
			}
		}
		a.Nodes = append(a.Nodes, Column{Name: pre + "signals", Type: String, Strings: sig}, Column{Name: pre + "unreached", Type: Bool, Bools: unreached},
			Column{Name: pre + "dilation", Type: Bool, Bools: dil}, Column{Name: pre + "completion", Type: Bool, Bools: added})
		from := p.MatchedFrom()
		var kind []string
		var matched []bool
		if p.Property == structural.Observability {
			// The cover is on the transposed network: from[v] = u is the
			// edge v -> u of g. Mark it on g's edges.
			kind, matched = controlTransposed(g, from)
		} else {
			kind, matched = control(g, from, func(v int32) bool { return from[v] >= int32(n) })
		}
		a.Edges = append(a.Edges, Column{Name: pre + "matched", Type: Bool, Bools: matched}, Column{Name: pre + "control", Type: String, Strings: kind})
	}
	return a
}

// controlTransposed is control for a cover of the transposed network.
func controlTransposed(g *structural.Network, from []int32) ([]string, []bool) {
	t := g.Transpose()
	n := int32(g.N())
	kt, mt := control(t, from, func(v int32) bool { return from[v] >= n })
	// Edge k of t's Out is u -> v in t, v -> u in g.
	kind := make([]string, g.Edges())
	matched := make([]bool, g.Edges())
	tout := t.Out()
	for u := int32(0); u < n; u++ {
		for k := tout.Ptr[u]; k < tout.Ptr[u+1]; k++ {
			if !mt[k] {
				continue
			}
			v := tout.Adj[k]
			if e, ok := edgeIndex(g, v, u); ok {
				matched[e], kind[e] = true, kt[k]
			}
		}
	}
	return kind, matched
}

func edgeIndex(g *structural.Network, u, v int32) (int64, bool) {
	out := g.Out()
	row := out.Adj[out.Ptr[u]:out.Ptr[u+1]]
	lo, hi := 0, len(row)
	for lo < hi {
		m := (lo + hi) / 2
		if row[m] < v {
			lo = m + 1
		} else {
			hi = m
		}
	}
	if lo < len(row) && row[lo] == v {
		return out.Ptr[u] + int64(lo), true
	}
	return 0, false
}

// FromPlace annotates the network of a placement: each device new or
// existing, the cost of a new one, and with roles whether it is forced and
// where else it could go.
func FromPlace(r *analysis.PlaceResult) *Annotated {
	g := r.Network()
	n := g.N()
	pl := r.Placement
	a := &Annotated{Net: g, Graph: []Attr{StringAttr("question", "cheapest dedicated "+r.Device+"s"),
		BoolAttr("feasible", pl.Feasible), IntAttr("device_count", r.DeviceCount), {Name: "total_cost", Type: Double, Value: pl.Cost.String()}}}
	dev := make([]string, n)
	cost := make([]float64, n)
	for i := range cost {
		cost[i] = math.NaN() // left out: no new device
	}
	for _, v := range pl.Existing.IDs() {
		dev[v] = "existing"
	}
	for _, v := range pl.Added.IDs() {
		dev[v] = "new"
		cost[v] = float64(pl.CostOf(v)) / float64(structural.Unit)
	}
	a.Nodes = append(a.Nodes, Column{Name: r.Device, Type: String, Strings: dev}, Column{Name: attrCost, Type: Double, Doubles: cost})
	if r.Roles != nil {
		forced := make([]string, n)
		alts := make([]string, n)
		for _, x := range r.Roles {
			forced[x.State] = strconv.FormatBool(x.Forced)
			alts[x.State] = strings.Join(x.Alternatives.Names(), ";")
		}
		a.Nodes = append(a.Nodes, Column{Name: attrForced, Type: String, Strings: forced}, Column{Name: attrAlternates, Type: String, Strings: alts})
	}
	return a
}

// AddLabels adds the states' labels and groups (from a node table or the
// network file), "" where a state has none; nil slices add nothing.
func (a *Annotated) AddLabels(labels, groups []string) {
	if labels != nil {
		a.Nodes = append(a.Nodes, Column{Name: attrLabel, Type: String, Strings: labels})
	}
	if groups != nil {
		a.Nodes = append(a.Nodes, Column{Name: attrGroup, Type: String, Strings: groups})
	}
}
