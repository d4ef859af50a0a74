package placement

import (
	"errors"
	"slices"

	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural"
)

// Complete returns the cheapest set of dedicated devices to add to design
// d (inputs for Controllability, outputs for Observability) so that g
// becomes structurally controllable (observable), under the restrictions
// of dev. Added lists the new devices; Devices holds the states of
// dev.Existing and Added (the design's own signals are not states and are
// not listed).
//
// Each signal of the design becomes an extra state with an existing
// device and an edge to every state it drives: the extended network with
// those devices satisfies Lin's conditions exactly when the design does
// (the extra state's column can only be matched by its own device, and its
// row stands for the signal), so Place on it gives the cheapest
// completion. Time and memory as for Place on a network of N + d.Len()
// states.
func Complete(g *structural.Network, p structural.Property, d structural.Design, dev structural.Devices) (*Placement, error) {
	if !d.Of(g) {
		return nil, structural.ErrForeignDesign
	}
	if err := dev.Check(g); err != nil {
		return nil, err
	}
	base := graphOf(g, p)
	signals := d.Signals()
	n := g.N()
	k := len(signals)
	if n+k > structural.MaxStates {
		return nil, errors.New("placement: too many states with the design's signals")
	}
	// The extended network: states 0..n-1 as in g, then one per signal.
	out := matching.CSR{Rows: n + k, Cols: n + k, Ptr: make([]int64, n+k+1)}
	copy(out.Ptr, base.Out.Ptr)
	extra := 0
	for i, s := range signals {
		extra += len(s)
		out.Ptr[n+i+1] = base.Out.Ptr[n] + int64(extra)
	}
	out.Adj = make([]int32, 0, len(base.Out.Adj)+extra)
	out.Adj = append(out.Adj, base.Out.Adj...)
	for _, s := range signals {
		out.Adj = append(out.Adj, s...)
	}
	ext := &graph{Out: out, In: extendIn(base, signals)}
	grow := func(c []structural.Cost, def structural.Cost) []structural.Cost {
		if c == nil {
			return nil
		}
		x := make([]structural.Cost, n+k)
		copy(x, c)
		for i := n; i < n+k; i++ {
			x[i] = def
		}
		return x
	}
	growB := func(b []bool, def bool) []bool {
		x := make([]bool, n+k)
		copy(x, b)
		for i := n; i < n+k; i++ {
			x[i] = def
		}
		return x
	}
	de := structural.Devices{Cost: grow(dev.Cost, 0), Existing: growB(dev.Existing, true)}
	if dev.Forbidden != nil {
		de.Forbidden = growB(dev.Forbidden, false)
	}
	pr, err := newPlacer(ext, de)
	if err != nil {
		return nil, err
	}
	h := g
	if p == structural.Observability {
		h = g.Transpose()
	}
	// The network's components (kept on it) and the matching of the
	// extended network are independent: both at once.
	comps := make(chan *structural.Components, 1)
	go func() { comps <- h.Components() }()
	if dev.Forbidden == nil || !slices.Contains(dev.Forbidden, true) {
		// The matching of [A B] is one of the extended network, whose
		// in-rows are the rows of [A B]; Check of the same design left it
		// on the network.
		m, err := structural.DesignMatching(g, p, d)
		if err != nil {
			return nil, err
		}
		colMate := make([]int32, n+k)
		copy(colMate, m.RowMate)
		for i := n; i < n+k; i++ {
			colMate[i] = -1
		}
		pr.match = &matching.Matching{RowMate: m.ColMate, ColMate: colMate, Size: m.Size}
	}
	pr.comps = extendComponents(<-comps, ext, n)
	return pr.solve().wrap(g, p, dev, n), nil
}

// extendIn returns the in-rows of the extended network: row v lists the
// states acting on v, then the signals driving v (as states n+i, each
// once, in increasing order), and the signals' rows are empty; the
// transpose of the extended out-rows, built by sequential copies.
func extendIn(base *graph, signals [][]int32) matching.CSR {
	n := base.N()
	k := len(signals)
	extra := make([]int64, n+1)
	mark := make([]int32, n) // signal index + 1 of the last signal counted at v
	for i, s := range signals {
		for _, v := range s {
			if mark[v] != int32(i+1) {
				mark[v] = int32(i + 1)
				extra[v+1]++
			}
		}
	}
	in := matching.CSR{Rows: n + k, Cols: n + k, Ptr: make([]int64, n+k+1)}
	for v := 0; v < n; v++ {
		in.Ptr[v+1] = in.Ptr[v] + (base.In.Ptr[v+1] - base.In.Ptr[v]) + extra[v+1]
	}
	for v := n; v < n+k; v++ {
		in.Ptr[v+1] = in.Ptr[n]
	}
	in.Adj = make([]int32, in.Ptr[n])
	pos := extra[:n]
	for v := 0; v < n; v++ {
		c := copy(in.Adj[in.Ptr[v]:], base.In.Adj[base.In.Ptr[v]:base.In.Ptr[v+1]])
		pos[v] = in.Ptr[v] + int64(c)
		mark[v] = 0
	}
	for i, s := range signals {
		for _, v := range s {
			if mark[v] != int32(i+1) {
				mark[v] = int32(i + 1)
				in.Adj[pos[v]] = int32(n + i)
				pos[v]++
			}
		}
	}
	return in
}

// extendComponents returns the strongly connected components of the
// extended network from those of the base network c: a signal's state has
// no in-edge, so it is a component of its own, a source one, and a base
// component stops being a source when a signal drives one of its states.
// Signal components take the numbers after the base ones, which keeps
// every edge going from a higher number to a lower one.
func extendComponents(c *structural.Components, ext *graph, n int) *structural.Components {
	k := ext.N() - n
	e := &structural.Components{Of: make([]int32, n+k), Count: c.Count + k, Source: make([]bool, c.Count+k)}
	copy(e.Of, c.Of)
	copy(e.Source, c.Source)
	for i := 0; i < k; i++ {
		e.Of[n+i] = int32(c.Count + i)
		e.Source[c.Count+i] = true
		for _, v := range ext.Out.Row(int32(n + i)) {
			e.Source[c.Of[v]] = false
		}
	}
	return e
}
