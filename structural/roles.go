package structural

import (
	"runtime"
	"slices"
	"sort"
)

// Role classifies a state across all minimum driver sets, or an edge
// across all maximum matchings.
type Role uint8

// The roles. States are Critical, Intermittent or Redundant (Jia et al.,
// "Emergence of bimodality in controlling complex networks", Nature
// Communications 4:2002, 2013); edges are Critical, Ordinary or Redundant
// (Liu, Slotine & Barabási, Nature 473:167, 2011).
const (
	// Redundant: a state in no minimum driver set; an edge in no maximum
	// matching (removing it never changes N_D).
	Redundant Role = iota
	// Intermittent: a state in some minimum driver sets but not all.
	Intermittent
	// Ordinary: an edge in some maximum matchings but not all.
	Ordinary
	// Critical: a state in every minimum driver set (exactly the states
	// with no incoming edge); an edge in every maximum matching (removing
	// it raises N_D).
	Critical
)

func (r Role) String() string {
	switch r {
	case Redundant:
		return "redundant"
	case Intermittent:
		return "intermittent"
	case Ordinary:
		return "ordinary"
	case Critical:
		return "critical"
	}
	return "unknown"
}

// alternating holds the alternating-path structure of the network's
// maximum matching (the Dulmage–Mendelsohn decomposition of its bipartite
// graph), computed once and kept on the network.
type alternating struct {
	freeColReach []bool // column can be unmatched in some maximum matching
	freeRowReach []bool // row can be unmatched in some maximum matching
	h            *Components
	hSize        []int32 // members per component of h
}

// alternating returns the decomposition of g's maximum matching m: the
// columns reached by even alternating paths from unmatched columns (the
// states some maximum matching leaves unmatched), the rows reached likewise
// from unmatched rows, and the strongly connected components of the
// digraph on the other columns (neither reached from a free column nor
// matched to a row reached from a free row) with an arc v -> RowMate[u]
// for every edge u -> v outside m (its cycles are the alternating cycles
// of m; the columns left out are components of their own). Time O(N + E):
// two breadth-first searches, at the same time, and one components pass
// over that digraph, which is read through the matching and never built.
func (g *Network) alternating() *alternating {
	g.altOnce.Do(func() {
		m := g.Matching()
		n := g.N()
		a := &alternating{freeColReach: make([]bool, n), freeRowReach: make([]bool, n)}
		// The two searches are independent: one on another goroutine.
		colDone := make(chan struct{})
		go func() {
			defer close(colDone)
			queue := make([]int32, 0, 64)
			for v := 0; v < n; v++ {
				if m.ColMate[v] < 0 {
					a.freeColReach[v] = true
					queue = append(queue, int32(v))
				}
			}
			for h := 0; h < len(queue); h++ {
				for _, u := range g.in.Row(queue[h]) {
					if x := m.RowMate[u]; x >= 0 && !a.freeColReach[x] {
						a.freeColReach[x] = true
						queue = append(queue, x)
					}
				}
			}
		}()
		queue := make([]int32, 0, 64)
		for u := 0; u < n; u++ {
			if m.RowMate[u] < 0 {
				a.freeRowReach[u] = true
				queue = append(queue, int32(u))
			}
		}
		for h := 0; h < len(queue); h++ {
			for _, v := range g.out.Row(queue[h]) {
				if r := m.ColMate[v]; r >= 0 && !a.freeRowReach[r] {
					a.freeRowReach[r] = true
					queue = append(queue, r)
				}
			}
		}
		<-colDone
		// The components are needed only for edges u -> v with neither v
		// reached from a free column nor u from a free row. The columns
		// reached from free columns are closed under the digraph's arcs,
		// and the mates of rows reached from free rows under its reversed
		// arcs, so no cycle joins either set to the other columns: the
		// components are taken among the remaining columns only (the
		// square part of the Dulmage–Mendelsohn decomposition), each
		// skipped column left a component of its own.
		skip := a.freeColReach
		if len(queue) > 0 {
			skip = slices.Clone(a.freeColReach)
			for u, r := range a.freeRowReach {
				if x := m.RowMate[u]; r && x >= 0 {
					skip[x] = true
				}
			}
		}
		a.h = sccThrough(&g.in, m.RowMate, skip)
		a.hSize = make([]int32, a.h.Count)
		for _, c := range a.h.Of {
			a.hSize[c]++
		}
		g.alt = a
	})
	return g.alt
}

// nodeRoles returns the role of every state across all minimum driver
// sets, from the network's maximum matching. A state can be left unmatched
// by some maximum matching exactly when an even alternating path leads to
// it from a state left unmatched by the matching; it is unmatched by all
// of them exactly when no edge enters it. Time O(N + E).
//
// The roles follow the driver sets of maximum matchings (N - |M*| states);
// when the matching is perfect every state is Redundant, although one
// signal is still needed (N_D = 1).
func nodeRoles(g *Network) []Role {
	a := g.alternating()
	n := g.N()
	roles := make([]Role, n)
	for v := 0; v < n; v++ {
		switch {
		case g.in.Degree(int32(v)) == 0:
			roles[v] = Critical
		case a.freeColReach[v]:
			roles[v] = Intermittent
		}
	}
	return roles
}

// linkRoles returns the role of every edge across all maximum matchings,
// aligned with Out().Adj, from the network's maximum matching m. An edge u -> v
// belongs to some maximum matching exactly when it is in m, or v can be left
// unmatched by some maximum matching, or u can, or it lies on an
// alternating cycle; an edge of m belongs to all of them exactly when none
// of v free, u free or a cycle through it is possible (Dulmage–Mendelsohn).
// Time O(N + E): one alternating search from each side and one strongly
// connected components pass.
func linkRoles(g *Network) []Role {
	m := g.Matching()
	a := g.alternating()
	roles := make([]Role, len(g.out.Adj))
	n := g.N()
	// Rows are independent: two halves by edges, on two goroutines for
	// large networks.
	fill := func(from, to int) {
		for u := from; u < to; u++ {
			lo := g.out.Ptr[u]
			for i, v := range g.out.Row(int32(u)) {
				var r Role
				if m.RowMate[u] == v {
					if a.freeColReach[v] || a.freeRowReach[u] || a.hSize[a.h.Of[v]] > 1 {
						r = Ordinary
					} else {
						r = Critical
					}
				} else {
					w := m.RowMate[u]
					if a.freeColReach[v] || a.freeRowReach[u] || w >= 0 && a.h.Of[v] == a.h.Of[w] {
						r = Ordinary
					} else {
						r = Redundant
					}
				}
				roles[lo+int64(i)] = r
			}
		}
	}
	if g.Edges() < parallelEdges || runtime.GOMAXPROCS(0) < 2 {
		fill(0, n)
		return roles
	}
	half := int64(len(g.out.Adj)) / 2
	mid := sort.Search(n, func(u int) bool { return g.out.Ptr[u] >= half })
	done := make(chan struct{})
	go func() {
		defer close(done)
		fill(mid, n)
	}()
	fill(0, mid)
	<-done
	return roles
}

// NodeRoles is the role of every state across all minimum driver sets.
type NodeRoles struct {
	// Of[v] is the role of state v: Critical, Intermittent or Redundant.
	Of []Role
	g  *Network
}

// LinkRoles is the role of every edge across all maximum matchings.
type LinkRoles struct {
	// Of[k] is the role of the k-th edge of Out().Adj: Critical, Ordinary
	// or Redundant.
	Of []Role
	g  *Network
}

// StateRoles returns the role of every state across all minimum driver
// sets (see nodeRoles for the method). Time O(N + E) after the network's
// maximum matching; the alternating structure it needs is kept on the
// network for EdgeRoles.
func StateRoles(g *Network) *NodeRoles { return &NodeRoles{Of: nodeRoles(g), g: g} }

// EdgeRoles returns the role of every edge across all maximum matchings
// (see linkRoles for the method). Time O(N + E) after the network's
// maximum matching; the alternating structure is shared with StateRoles.
func EdgeRoles(g *Network) *LinkRoles { return &LinkRoles{Of: linkRoles(g), g: g} }

// NodeRoleOrder and LinkRoleOrder list the roles from the most to the
// least constrained, as reports show them.
var (
	NodeRoleOrder = []Role{Critical, Intermittent, Redundant}
	LinkRoleOrder = []Role{Critical, Ordinary, Redundant}
)

// With returns the states of the given role, in increasing order.
func (r *NodeRoles) With(role Role) States {
	var out []int32
	for v, x := range r.Of {
		if x == role {
			out = append(out, int32(v))
		}
	}
	return r.g.States(out)
}

// MarshalJSON writes an object mapping each role to its states' names.
func (r *NodeRoles) MarshalJSON() ([]byte, error) { return marshalVia(r) }

// Edge is an edge u -> v of a network.
type Edge struct{ From, To int32 }

// With returns the edges of the given role, in the order of Out().
func (r *LinkRoles) With(role Role) []Edge {
	var out []Edge
	g := r.g
	for u := 0; u < g.N(); u++ {
		lo := g.out.Ptr[u]
		for k, v := range g.out.Row(int32(u)) {
			if r.Of[lo+int64(k)] == role {
				out = append(out, Edge{int32(u), v})
			}
		}
	}
	return out
}

// Role returns the role of the edge u -> v, and false when there is no
// such edge.
func (r *LinkRoles) Role(u, v int32) (Role, bool) {
	k, ok := r.g.edgeIndex(u, v)
	if !ok {
		return 0, false
	}
	return r.Of[k], true
}

// MarshalJSON writes an object mapping each role to its edges, each as a
// [source, target] pair of names.
func (r *LinkRoles) MarshalJSON() ([]byte, error) { return marshalVia(r) }
