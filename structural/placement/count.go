package placement

import (
	"errors"
	"slices"

	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural"
)

// DeviceCount is the minimum number of dedicated devices, with unit costs,
// in the form of Pequito, Kar & Aguiar, "A framework for structural
// input/output and control configuration selection in large-scale
// systems", IEEE TAC (2016): Count = Unmatched + SourceComponents - Alpha.
// For sensors every term is read on the transposed network (sink
// components instead of source components).
type DeviceCount struct {
	// Feasible is false when forbidden states form a dilation that no
	// allowed device removes, or a source component has no allowed state;
	// the other fields are then not meaningful.
	Feasible bool `json:"feasible"`
	// Unmatched is m = N - |M*|, the states a maximum matching leaves
	// unmatched (a maximum matching that matches every forbidden state).
	// It is 0 for a network with a perfect matching: no max(., 1) here.
	Unmatched int `json:"unmatched"`
	// SourceComponents is beta, the number of source strongly connected
	// components (no edge enters them from another component).
	SourceComponents int `json:"source_components"`
	// Alpha is the largest number of source components that can each
	// hold a state left unmatched (and allowed) by one such maximum
	// matching.
	Alpha int `json:"alpha"`
	// Count is Unmatched + SourceComponents - Alpha.
	Count int `json:"count"`
	// Devices is one minimum set, in increasing order.
	Devices structural.States `json:"-"`
}

// Count returns the minimum number of dedicated actuators (sensors, for
// Observability) that make g structurally controllable (observable) when
// the states marked in forbidden (nil: none) cannot take one, and one set
// of that size.
//
// Alpha is found as Olshevsky ("Minimum input selection for structural
// controllability", ACC 2015, which also treats forbidden states) finds it,
// as a maximum flow along alternating paths: every source component k gets
// one extra row adjacent to its allowed states, and Hopcroft–Karp phases
// augment the maximum matching from these rows only. An augmenting path
// from the row of k shifts an unmatched state into k along an alternating
// path; vertex-disjointness makes the shifts compatible, so the number of
// extra rows matched is alpha. The states left without a matched state row
// are the unmatched ones of the shifted matching; each source component
// whose row stayed unmatched adds one of its allowed states. Time: the
// network's maximum matching (a greedy over the forbidden states first
// when there are any) and O(E sqrt(N)) for alpha.
func Count(g *structural.Network, p structural.Property, forbidden []bool) (*DeviceCount, error) {
	if forbidden != nil && len(forbidden) != g.N() {
		return nil, errors.New("placement: forbidden has the wrong length")
	}
	h := g
	if p == structural.Observability {
		h = g.Transpose()
	}
	m, c := h.MatchingAndComponents()
	res, devices := countDevices(graphOf(g, p), c, m, forbidden)
	res.Devices = g.States(devices)
	return res, nil
}

func countDevices(g *graph, comps *structural.Components, m *matching.Matching, forbidden []bool) (*DeviceCount, []int32) {
	n := g.N()
	isForbidden := func(v int32) bool { return forbidden != nil && forbidden[v] }
	hasForbidden := false
	for v := 0; v < n && forbidden != nil; v++ {
		hasForbidden = hasForbidden || forbidden[v]
	}
	res := &DeviceCount{Feasible: true}
	var rowMate, colMate []int32
	if !hasForbidden {
		rowMate, colMate = slices.Clone(m.RowMate), slices.Clone(m.ColMate)
	} else {
		rowMate, colMate = make([]int32, n), make([]int32, n)
		for i := range rowMate {
			rowMate[i], colMate[i] = -1, -1
		}
		au := newAugmenter(&sideAdj{n0: int32(n), ptr: g.In.Ptr, adj: g.In.Adj}, n, colMate, rowMate)
		var first, rest []int32
		for v := int32(0); int(v) < n; v++ {
			if isForbidden(v) {
				first = append(first, v)
			} else {
				rest = append(rest, v)
			}
		}
		au.grow(first, true)
		for _, v := range first {
			if colMate[v] < 0 {
				res.Feasible = false
			}
		}
		au.grow(rest, true)
	}
	for v := 0; v < n; v++ {
		if colMate[v] < 0 {
			res.Unmatched++
		}
	}
	src := comps.Source
	idx := make([]int32, comps.Count)
	beta := 0
	for k, s := range src {
		idx[k] = -1
		if s {
			idx[k] = int32(beta)
			beta++
		}
	}
	res.SourceComponents = beta
	xptr := make([]int64, beta+1)
	for v := 0; v < n; v++ {
		if j := idx[comps.Of[v]]; j >= 0 && !isForbidden(int32(v)) {
			xptr[j+1]++
		}
	}
	for j := 0; j < beta; j++ {
		if xptr[j+1] == 0 {
			res.Feasible = false
		}
		xptr[j+1] += xptr[j]
	}
	xadj := make([]int32, xptr[beta])
	fill := make([]int64, beta)
	copy(fill, xptr[:beta])
	for v := 0; v < n; v++ {
		if j := idx[comps.Of[v]]; j >= 0 && !isForbidden(int32(v)) {
			xadj[fill[j]] = int32(v)
			fill[j]++
		}
	}
	if !res.Feasible {
		return res, nil
	}
	// The augmented bipartite graph: state rows, then one row per source
	// component. colMate values >= n name component rows.
	left := make([]int32, n+beta)
	copy(left, rowMate)
	roots := make([]int32, beta)
	for j := 0; j < beta; j++ {
		left[n+j] = -1
		roots[j] = int32(n + j)
	}
	au := newAugmenter(&sideAdj{n0: int32(n), ptr: g.Out.Ptr, adj: g.Out.Adj, xptr: xptr, xadj: xadj}, n+beta, left, colMate)
	res.Alpha = au.grow(roots, false)
	res.Count = res.Unmatched + beta - res.Alpha
	extra := make([]bool, n)
	for j := 0; j < beta; j++ {
		if left[n+j] < 0 {
			extra[xadj[xptr[j]]] = true
		}
	}
	var devices []int32
	for v := 0; v < n; v++ {
		if colMate[v] < 0 || int(colMate[v]) >= n || extra[v] {
			devices = append(devices, int32(v))
		}
	}
	return res, devices
}
