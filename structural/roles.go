package structural

import "github.com/netsteer/netsteer/matching"

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

// alternating holds the alternating-path structure of a maximum matching
// (the Dulmage–Mendelsohn decomposition of the bipartite graph).
type alternating struct {
	freeColReach []bool // column can be unmatched in some maximum matching
	freeRowReach []bool // row can be unmatched in some maximum matching
	h            Components
	hSize        []int32 // members per component of h
}

// decompose computes, from a maximum matching m of g: the columns reached
// by even alternating paths from unmatched columns, the rows reached
// likewise from unmatched rows, and the strongly connected components of
// the digraph on columns with an arc v -> RowMate[u] for every edge u -> v
// outside m (its cycles are the alternating cycles of m).
func decompose(g *Network, m *matching.Matching) *alternating {
	n := g.N()
	a := &alternating{freeColReach: make([]bool, n), freeRowReach: make([]bool, n)}
	queue := make([]int32, 0, 64)
	for v := 0; v < n; v++ {
		if m.ColMate[v] < 0 {
			a.freeColReach[v] = true
			queue = append(queue, int32(v))
		}
	}
	for h := 0; h < len(queue); h++ {
		for _, u := range g.In.Row(queue[h]) {
			if x := m.RowMate[u]; x >= 0 && !a.freeColReach[x] {
				a.freeColReach[x] = true
				queue = append(queue, x)
			}
		}
	}
	queue = queue[:0]
	for u := 0; u < n; u++ {
		if m.RowMate[u] < 0 {
			a.freeRowReach[u] = true
			queue = append(queue, int32(u))
		}
	}
	for h := 0; h < len(queue); h++ {
		for _, v := range g.Out.Row(queue[h]) {
			if r := m.ColMate[v]; r >= 0 && !a.freeRowReach[r] {
				a.freeRowReach[r] = true
				queue = append(queue, r)
			}
		}
	}
	// The column digraph of alternating cycles.
	hg := matching.CSR{Rows: n, Cols: n, Ptr: make([]int64, n+1)}
	for v := 0; v < n; v++ {
		for _, u := range g.In.Row(int32(v)) {
			if x := m.RowMate[u]; x >= 0 && x != int32(v) {
				hg.Ptr[v+1]++
			}
		}
	}
	for v := 0; v < n; v++ {
		hg.Ptr[v+1] += hg.Ptr[v]
	}
	hg.Adj = make([]int32, hg.Ptr[n])
	k := 0
	for v := 0; v < n; v++ {
		for _, u := range g.In.Row(int32(v)) {
			if x := m.RowMate[u]; x >= 0 && x != int32(v) {
				hg.Adj[k] = x
				k++
			}
		}
	}
	a.h = SCC(&hg)
	a.hSize = make([]int32, a.h.Count)
	for _, c := range a.h.Of {
		a.hSize[c]++
	}
	return a
}

// NodeRoles returns the role of every state across all minimum driver
// sets, given a maximum matching m of g (matching.Maximum(&g.Out, &g.In)).
// A state can be left unmatched by some maximum matching exactly when an
// even alternating path leads to it from a state left unmatched by m; it is
// unmatched by all of them exactly when no edge enters it. Time O(N + E).
//
// The roles follow the driver sets of maximum matchings (N - |M*| states);
// when m is perfect every state is Redundant, although one signal is still
// needed (N_D = 1).
func NodeRoles(g *Network, m *matching.Matching) []Role {
	n := g.N()
	roles := make([]Role, n)
	reach := make([]bool, n)
	queue := make([]int32, 0, 64)
	for v := 0; v < n; v++ {
		if m.ColMate[v] < 0 {
			reach[v] = true
			queue = append(queue, int32(v))
		}
	}
	for h := 0; h < len(queue); h++ {
		for _, u := range g.In.Row(queue[h]) {
			if x := m.RowMate[u]; x >= 0 && !reach[x] {
				reach[x] = true
				queue = append(queue, x)
			}
		}
	}
	for v := 0; v < n; v++ {
		switch {
		case g.In.Degree(int32(v)) == 0:
			roles[v] = Critical
		case reach[v]:
			roles[v] = Intermittent
		}
	}
	return roles
}

// LinkRoles returns the role of every edge across all maximum matchings,
// aligned with g.Out.Adj, given a maximum matching m of g. An edge u -> v
// belongs to some maximum matching exactly when it is in m, or v can be left
// unmatched by some maximum matching, or u can, or it lies on an
// alternating cycle; an edge of m belongs to all of them exactly when none
// of v free, u free or a cycle through it is possible (Dulmage–Mendelsohn).
// Time O(N + E): one alternating search from each side and one strongly
// connected components pass.
func LinkRoles(g *Network, m *matching.Matching) []Role {
	a := decompose(g, m)
	roles := make([]Role, len(g.Out.Adj))
	n := g.N()
	for u := 0; u < n; u++ {
		lo := g.Out.Ptr[u]
		for i, v := range g.Out.Row(int32(u)) {
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
	return roles
}
