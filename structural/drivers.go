package structural

// DriverSet is a minimum set of independent control signals that makes a
// network structurally controllable.
type DriverSet struct {
	// MatchingSize is |M*|, the size of a maximum matching.
	MatchingSize int `json:"matching_size"`
	// Drivers are the driver nodes: the states left unmatched, or one state
	// of a source component when the matching is perfect.
	Drivers States `json:"drivers"`
	// Inputs is the complete design: signal i drives Drivers[i] first,
	// then the states of source components that hold no driver, wired to
	// an existing signal.
	Inputs Design `json:"inputs"`
}

// Count returns N_D, the number of driver nodes (and of signals).
func (ds *DriverSet) Count() int { return ds.Drivers.Len() }

// Drivers returns a minimum driver set of g and a complete design with
// exactly N_D = max(N - |M*|, 1) signals (Liu, Slotine & Barabási, Nature
// 473:167, 2011), from the network's maximum matching and strongly
// connected components.
// The unmatched states head the stems of the matching and the matched ones
// lie on stems or cycles, so driving the unmatched states leaves no
// dilation. Every state is then reached unless a source component holds no
// driver; one state of each such component is wired to an existing signal,
// adding a bud to its cactus, which keeps the number of signals at N_D and
// satisfies Lin's theorem.
func Drivers(g *Network) *DriverSet {
	m, c := g.MatchingAndComponents()
	n := g.N()
	var drivers []int32
	for v := 0; v < n; v++ {
		if m.ColMate[v] < 0 {
			drivers = append(drivers, int32(v))
		}
	}
	src := c.Source
	first := make([]int32, c.Count) // lowest state of each component
	for i := range first {
		first[i] = -1
	}
	for v := n - 1; v >= 0; v-- {
		first[c.Of[v]] = int32(v)
	}
	if len(drivers) == 0 {
		// Perfect matching: one signal, on a source component.
		for k := 0; k < c.Count; k++ {
			if src[k] && (len(drivers) == 0 || first[k] < drivers[0]) {
				drivers = []int32{first[k]}
			}
		}
	}
	covered := make([]bool, c.Count)
	inputs := make([][]int32, len(drivers))
	for i, d := range drivers {
		inputs[i] = []int32{d}
		covered[c.Of[d]] = true
	}
	next := 0
	for v := 0; v < n; v++ {
		k := c.Of[v]
		if src[k] && !covered[k] && first[k] == int32(v) {
			inputs[next] = append(inputs[next], int32(v))
			covered[k] = true
			next = (next + 1) % len(inputs)
		}
	}
	return &DriverSet{MatchingSize: m.Size, Drivers: g.States(drivers), Inputs: Design{signals: inputs, names: g.names, n: n}}
}
