package structural

import (
	"errors"
	"fmt"

	"github.com/netsteer/netsteer/matching"
)

// CompleteActuators returns the cheapest set of dedicated actuators to add
// to a given input design (inputs[i] lists the states input i drives) so
// that g becomes structurally controllable, under the restrictions of d.
// Added lists the new actuators; Devices holds the states of d.Existing and
// Added (the design's own inputs are not states and are not listed).
//
// Each input of the design becomes an extra state with an existing
// actuator and an edge to every state it drives: the extended network with
// those actuators satisfies Lin's conditions exactly when the design does
// (the extra state's column can only be matched by its own actuator, and
// its row stands for the input), so PlaceActuators on it gives the cheapest
// completion. Time and memory as for PlaceActuators on a network of
// N + len(inputs) states.
func CompleteActuators(g *Network, inputs [][]int32, d Devices) (*Placement, error) {
	return complete(g, inputs, d)
}

// CompleteSensors is CompleteActuators for an output design (outputs[i]
// lists the states output i senses) and structural observability.
func CompleteSensors(g *Network, outputs [][]int32, d Devices) (*Placement, error) {
	return complete(reversed(g), outputs, d)
}

func complete(g *Network, signals [][]int32, d Devices) (*Placement, error) {
	n := g.N()
	k := len(signals)
	if n+k > MaxStates {
		return nil, errors.New("structural: too many states with the design's signals")
	}
	for i, s := range signals {
		for _, v := range s {
			if v < 0 || int(v) >= n {
				return nil, fmt.Errorf("structural: signal %d drives state %d, not in the network", i+1, v)
			}
		}
	}
	// The extended network: states 0..n-1 as in g, then one per signal.
	out := matching.CSR{Rows: n + k, Cols: n + k, Ptr: make([]int64, n+k+1)}
	copy(out.Ptr, g.Out.Ptr)
	extra := 0
	for i, s := range signals {
		extra += len(s)
		out.Ptr[n+i+1] = g.Out.Ptr[n] + int64(extra)
	}
	out.Adj = make([]int32, 0, len(g.Out.Adj)+extra)
	out.Adj = append(out.Adj, g.Out.Adj...)
	for _, s := range signals {
		out.Adj = append(out.Adj, s...)
	}
	ext := &Network{Out: out, names: g.names}
	ext.In = *matching.Transpose(&ext.Out)
	grow := func(c []int64, def int64) []int64 {
		if c == nil {
			return nil
		}
		x := make([]int64, n+k)
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
	de := Devices{Cost: grow(d.Cost, 0), Existing: growB(d.Existing, true)}
	if d.Forbidden != nil {
		de.Forbidden = growB(d.Forbidden, false)
	}
	p, err := newPlacer(ext, de)
	if err != nil {
		return nil, err
	}
	pl := p.solve()
	keep := func(ids []int32) []int32 {
		out := ids[:0]
		for _, v := range ids {
			if int(v) < n {
				out = append(out, v)
			}
		}
		return out
	}
	pl.Devices = keep(pl.Devices)
	pl.Added = keep(pl.Added)
	pl.Unmatchable = keep(pl.Unmatchable)
	return pl, nil
}
