package placement

import (
	"errors"

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
	ext := &graph{Out: out}
	ext.In = *matching.Transpose(&ext.Out)
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
	return pr.solve().wrap(g, p, dev, n), nil
}
