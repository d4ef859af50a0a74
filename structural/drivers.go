package structural

import "github.com/netsteer/netsteer/matching"

// DriverSet is a minimum set of independent control signals that makes a
// network structurally controllable.
type DriverSet struct {
	// Matching is the maximum matching the drivers come from.
	Matching *matching.Matching
	// Drivers are the driver nodes: the states left unmatched, or one state
	// of a source component when the matching is perfect.
	Drivers []int32
	// Inputs[i] lists the states signal i drives; Inputs[i][0] is
	// Drivers[i], the rest are states of source components that hold no
	// driver, wired to an existing signal.
	Inputs [][]int32
}

// MinimumDrivers returns a minimum driver set of g and a complete design
// with exactly N_D = max(N - |M*|, 1) signals (Liu, Slotine & Barabási,
// Nature 473:167, 2011).
func MinimumDrivers(g *Network) *DriverSet {
	m := matching.Maximum(&g.Out, &g.In)
	return DriversFrom(g, m, SCC(&g.Out))
}

// DriversFrom builds the driver set from a maximum matching m of g (rows
// are sources, columns targets) and g's strongly connected components.
//
// The unmatched states head the stems of the matching and the matched ones
// lie on stems or cycles, so driving the unmatched states leaves no
// dilation. Every state is then reached unless a source component holds no
// driver; one state of each such component is wired to an existing signal,
// adding a bud to its cactus, which keeps the number of signals at N_D and
// satisfies Lin's theorem.
func DriversFrom(g *Network, m *matching.Matching, c Components) *DriverSet {
	n := g.N()
	ds := &DriverSet{Matching: m}
	for v := 0; v < n; v++ {
		if m.ColMate[v] < 0 {
			ds.Drivers = append(ds.Drivers, int32(v))
		}
	}
	src := c.Sources(&g.Out)
	first := make([]int32, c.Count) // lowest state of each component
	for i := range first {
		first[i] = -1
	}
	for v := n - 1; v >= 0; v-- {
		first[c.Of[v]] = int32(v)
	}
	if len(ds.Drivers) == 0 {
		// Perfect matching: one signal, on a source component.
		for k := 0; k < c.Count; k++ {
			if src[k] && (len(ds.Drivers) == 0 || first[k] < ds.Drivers[0]) {
				ds.Drivers = []int32{first[k]}
			}
		}
	}
	covered := make([]bool, c.Count)
	ds.Inputs = make([][]int32, len(ds.Drivers))
	for i, d := range ds.Drivers {
		ds.Inputs[i] = []int32{d}
		covered[c.Of[d]] = true
	}
	next := 0
	for v := 0; v < n; v++ {
		k := c.Of[v]
		if src[k] && !covered[k] && first[k] == int32(v) {
			ds.Inputs[next] = append(ds.Inputs[next], int32(v))
			covered[k] = true
			next = (next + 1) % len(ds.Inputs)
		}
	}
	return ds
}
