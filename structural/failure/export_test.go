package failure

import "github.com/netsteer/netsteer/structural"

// DeviceBound returns the bounds the exact search adds, for the device
// threat, to the cost spent on the decided states (decided[v] the units
// fixed on v, -1 undecided): the leaf bound alone, and the source bound
// plus the leaf bound.
func DeviceBound(g *structural.Network, p structural.Property, dev structural.Devices, decided []int8, spares bool) (leaf, sum structural.Cost) {
	h := g
	if p == structural.Observability {
		h = g.Transpose()
	}
	maxMult := uint8(1)
	if spares {
		maxMult = 2
	}
	leaf = leafBound(h, dev, decided, maxMult)
	return leaf, sourceBound(h, dev, decided, maxMult) + leaf
}
