package numeric

import (
	"fmt"
	"slices"
	"strings"

	"github.com/netsteer/netsteer/structural"
)

// NoLimit, as Part.Hops, lets the part grow without a bound on the
// distance from its centres.
const NoLimit = -1

// Part chooses a connected part of a network to verify instead of the
// whole, for networks too large for the exact check: the states met by a
// breadth-first search from the centres that follows edges in either
// direction.
type Part struct {
	// Centres are the states the search starts from; nil: the states the
	// first signal acts on (the first input, or the first output when
	// there are no inputs).
	Centres []int32
	// Hops bounds the distance from the centres in steps; 0 keeps the
	// centres only, NoLimit (any negative value) sets no bound.
	Hops int
	// Limit bounds the number of states kept, the first ones met; 0: no
	// bound.
	Limit int
}

// DefaultHops is the radius of a part around named centres when neither
// a radius nor a number of states bounds it.
const DefaultHops = 2

// NewPart returns the part grown from centres (nil: the states of the
// first signal) that keeps at most limit states (0: no bound) within hops
// steps. hops nil means no radius was asked for: a part bounded by its
// number of states, or grown from the first signal, then has no bound on
// the distance, and one around named centres reaches DefaultHops steps.
func NewPart(centres []int32, hops *int, limit int) *Part {
	p := &Part{Centres: centres, Hops: NoLimit, Limit: limit}
	switch {
	case hops != nil:
		p.Hops = *hops
	case limit <= 0 && len(centres) > 0:
		p.Hops = DefaultHops
	}
	return p
}

// PartResult describes the part verified. Its states are the states of
// the part's own network (Result.Network): state i of the part is
// States.At(i) of the whole network.
type PartResult struct {
	// Nodes and Edges count the part (self-loops included).
	Nodes int `json:"nodes"`
	Edges int `json:"edges"`
	// Centres are the states the part grew from, in the whole network.
	Centres structural.States `json:"centres"`
	// CentreSignal names the signal whose states were taken as centres
	// when none were given: "controllability" (an input) or
	// "observability" (an output), and its number (design-file line or
	// 1-based position). Nil when the centres were given.
	CentreSignal *SignalRef `json:"centre_signal,omitempty"`
	// Hops is the bound on the distance (nil: none); Limit the bound on
	// the number of states (0: none).
	Hops  *int `json:"hops,omitempty"`
	Limit int  `json:"limit,omitempty"`
	// SignalsLeftOut counts the signals that act only outside the part,
	// dropped with it (inputs and outputs together).
	SignalsLeftOut int `json:"signals_left_out"`
	// States are the states kept, in increasing order of the whole
	// network's indices; position i is state i of the part.
	States structural.States `json:"states"`
}

// SignalRef names one signal of a design.
type SignalRef struct {
	Property string `json:"property"`
	Number   int    `json:"number"`
}

// Describe says in words which part was cut out, for reports: "the
// states within 2 steps of pump.speed", "the first 1500 states met from
// the states of input 4".
func (p *PartResult) Describe() string {
	var from string
	if p.CentreSignal != nil {
		kind := "input"
		if p.CentreSignal.Property == structural.Observability.String() {
			kind = "output"
		}
		from = fmt.Sprintf("the states of %s %d", kind, p.CentreSignal.Number)
	} else {
		names := p.Centres.Names()
		if len(names) > 5 {
			names = append(names[:5], fmt.Sprintf("%d more", p.Centres.Len()-5))
		}
		from = strings.Join(names, ", ")
	}
	states := func(n int) string {
		if n == 1 {
			return "state"
		}
		return fmt.Sprintf("%d states", n)
	}
	steps := func(h int) string {
		if h == 1 {
			return "1 step"
		}
		return fmt.Sprintf("%d steps", h)
	}
	switch {
	case p.Limit > 0 && p.Hops == nil:
		return fmt.Sprintf("the first %s met from %s", states(p.Nodes), from)
	case p.Limit > 0:
		return fmt.Sprintf("the first %s met within %s of %s", states(p.Nodes), steps(*p.Hops), from)
	case p.Hops == nil:
		return fmt.Sprintf("the states connected to %s", from)
	}
	return fmt.Sprintf("the states within %s of %s", steps(*p.Hops), from)
}

// ErrPartWithoutSignals is returned when no signal acts on the part of the
// network chosen for verification.
var ErrPartWithoutSignals = errorf("no input or output acts on the chosen part of the network")

// Around returns, in increasing order, the states met by a breadth-first
// search from the centres that follows edges in either direction, going at
// most hops steps (hops < 0: no limit) and stopping once limit states are
// kept (limit <= 0: no limit). It is a connected piece of the network
// around the centres. Time O(N + E) at most; iterative.
func Around(g *structural.Network, centres []int32, hops, limit int) []int32 {
	n := g.N()
	if limit <= 0 {
		limit = n
	}
	dist := make([]int32, n)
	for i := range dist {
		dist[i] = -1
	}
	queue := make([]int32, 0, min(limit, 1024))
	for _, c := range centres {
		if dist[c] < 0 && len(queue) < limit {
			dist[c] = 0
			queue = append(queue, c)
		}
	}
	for i := 0; i < len(queue) && len(queue) < limit; i++ {
		u := queue[i]
		if hops >= 0 && int(dist[u]) >= hops {
			continue
		}
		for _, row := range [2][]int32{g.Succ(u), g.Pred(u)} {
			for _, v := range row {
				if dist[v] < 0 && len(queue) < limit {
					dist[v] = dist[u] + 1
					queue = append(queue, v)
				}
			}
		}
	}
	slices.Sort(queue)
	return queue
}

// Induced returns the subnetwork of g on the states keep (increasing, no
// repeats), with their names and, when g has them, its edge weights, and
// the new index of every state of g (-1 for the states left out): state
// keep[i] of g is state i of the subnetwork.
func Induced(g *structural.Network, keep []int32) (*structural.Network, []int32, error) {
	n := g.N()
	newOf := make([]int32, n)
	for i := range newOf {
		newOf[i] = -1
	}
	b := structural.NewBuilder()
	for _, v := range keep {
		id, err := b.Intern([]byte(g.Name(v)))
		if err != nil {
			return nil, nil, err
		}
		newOf[v] = id
	}
	out, w := g.Out(), g.Weights()
	for _, u := range keep {
		for k := out.Ptr[u]; k < out.Ptr[u+1]; k++ {
			v := out.Adj[k]
			if newOf[v] < 0 {
				continue
			}
			if w != nil {
				b.AddWeightedEdge(newOf[u], newOf[v], w[k])
			} else {
				b.AddEdge(newOf[u], newOf[v])
			}
		}
	}
	sub, err := b.Build(structural.BuildOptions{})
	if err != nil {
		return nil, nil, err
	}
	return sub, newOf, nil
}

// RestrictDesign maps design d of a network to its subnetwork sub (newOf
// from Induced), with the signals' values when weights is not nil: states
// left out are dropped from each signal, and signals left with no state
// are dropped. The signals kept keep their numbers (design-file lines, or
// positions in d), so witnesses on the part name them as in d. It returns
// the number of signals dropped.
func RestrictDesign(d structural.Design, weights [][]float64, sub *structural.Network, newOf []int32) (structural.Design, [][]float64, int, error) {
	var sig [][]int32
	var lines []int
	var outW [][]float64
	dropped := 0
	for j := 0; j < d.Len(); j++ {
		var ns []int32
		var nw []float64
		for i, v := range d.Signal(j) {
			if newOf[v] >= 0 {
				ns = append(ns, newOf[v])
				if weights != nil && weights[j] != nil {
					nw = append(nw, weights[j][i])
				}
			}
		}
		if len(ns) == 0 {
			dropped++
			continue
		}
		sig = append(sig, ns)
		lines = append(lines, d.Number(j))
		if weights != nil {
			outW = append(outW, nw)
		}
	}
	rd, err := structural.NewDesign(sub, sig, lines)
	return rd, outW, dropped, err
}

// cutPart cuts the part of g that req.Part chooses and maps the designs
// and their values to it.
func cutPart(g *structural.Network, req *Request, in, out structural.Design) (sub *structural.Network, pr *PartResult, rin, rout structural.Design, inW, outW [][]float64, err error) {
	p := req.Part
	pr = &PartResult{Limit: max(p.Limit, 0)}
	centres := p.Centres
	if centres == nil {
		var d structural.Design
		prop := structural.Controllability
		switch {
		case in.Len() > 0:
			d = in
		case out.Len() > 0:
			d, prop = out, structural.Observability
		}
		if d.Len() == 0 {
			return nil, nil, rin, rout, nil, nil, errorf("no centres and no signal to take them from")
		}
		centres = d.Signal(0)
		pr.CentreSignal = &SignalRef{Property: prop.String(), Number: d.Number(0)}
	}
	n := g.N()
	for _, c := range centres {
		if c < 0 || int(c) >= n {
			return nil, nil, rin, rout, nil, nil, errorf("centre %d is not a state (the network has %d)", c, n)
		}
	}
	pr.Centres = g.States(centres)
	hops := p.Hops
	if hops >= 0 {
		pr.Hops = &hops
	} else {
		hops = -1
	}
	keep := Around(g, centres, hops, p.Limit)
	sub, newOf, err := Induced(g, keep)
	if err != nil {
		return nil, nil, rin, rout, nil, nil, err
	}
	pr.Nodes, pr.Edges, pr.States = sub.N(), sub.Edges(), g.States(keep)
	var d1, d2 int
	if rin, inW, d1, err = RestrictDesign(in, req.InputWeights, sub, newOf); err != nil {
		return nil, nil, rin, rout, nil, nil, err
	}
	if rout, outW, d2, err = RestrictDesign(out, req.OutputWeights, sub, newOf); err != nil {
		return nil, nil, rin, rout, nil, nil, err
	}
	pr.SignalsLeftOut = d1 + d2
	if rin.Len()+rout.Len() == 0 {
		return nil, nil, rin, rout, nil, nil, ErrPartWithoutSignals
	}
	return sub, pr, rin, rout, inW, outW, nil
}
