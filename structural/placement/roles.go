package placement

import (
	"cmp"
	"encoding/json"
	"slices"

	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural"
)

// DeviceRole says whether a new device of a cheapest placement must be
// where it is, and where else it could go.
type DeviceRole struct {
	// State is the state holding the device (an entry of Added).
	State int32 `json:"-"`
	// Forced reports that every cheapest placement has a device on State.
	Forced bool `json:"forced"`
	// Alternatives are states that could take this device's place on
	// their own, at the same cost: replacing State by one of them leaves a
	// cheapest placement. They are listed in increasing order, at most the
	// number asked for.
	Alternatives structural.States `json:"alternatives"`
	// More reports that there are further alternatives beyond those
	// listed.
	More bool `json:"more_alternatives"`
}

// MarshalJSON writes the role with the state's name under "state".
func (r DeviceRole) MarshalJSON() ([]byte, error) {
	type plain DeviceRole
	return json.Marshal(struct {
		State string `json:"state"`
		plain
	}{r.Alternatives.NameOf(r.State), plain(r)})
}

// Roles returns, for every entry of Added in order, whether it is forced
// and up to max single-swap alternatives. A device that is not forced but
// has no alternative can only move together with others.
//
// Forced devices come from the complementary-slackness view of the final
// minimum-cost flow: every cheapest placement differs from this one by
// cycles of zero reduced cost in the residual network, so a device is
// avoidable exactly when a zero-reduced-cost cycle re-covers its state by a
// matching edge, i.e. when the state and one of its in-neighbour rows share
// a strongly connected component of the zero-reduced-cost residual
// network. Alternatives come from the exchange property of matchings:
// replacing x by y keeps the states outside the set matchable exactly when
// an alternating path leads from x to y (or to a free row); the K cheapest
// states reachable from each strongly connected component of the
// alternating digraph are merged along its condensation. A device alone in
// a source component can only move within it; those are searched one by
// one. Time O((N + E) K log K) for K = max, plus one alternating search per
// such lone device. Roles returns nil for an infeasible placement.
func (pl *Placement) Roles(max int) []DeviceRole {
	if !pl.Feasible || len(pl.added) == 0 {
		return nil
	}
	if max < 0 {
		max = 0
	}
	p := pl.p
	p.potentials()
	forced := p.forced(pl.added)
	alts := p.alternatives(pl, max)
	out := make([]DeviceRole, len(pl.added))
	for i, x := range pl.added {
		out[i] = DeviceRole{State: x, Forced: forced[i]}
		a := alts[i]
		if len(a) > max {
			out[i].More = true
			a = a[:max]
		}
		out[i].Alternatives = pl.net.States(a)
	}
	return out
}

// forced reports, for each added device, whether every optimal flow
// leaves its state without a matching edge.
func (p *placer) forced(added []int32) []bool {
	n := int32(p.n)
	nn := 2*n + 1 + int32(p.nsrc)
	t := 2 * n
	g0 := matching.CSR{Rows: int(nn), Cols: int(nn), Ptr: make([]int64, nn+1)}
	// Two passes over the zero-reduced-cost residual arcs: count, fill.
	for pass := 0; pass < 2; pass++ {
		var k int64
		emit := func(x, y int32, c int64) {
			if c+p.pot[x]-p.pot[y] != 0 {
				return
			}
			if pass == 0 {
				g0.Ptr[x+1]++
			} else {
				g0.Adj[k] = y
				k++
			}
		}
		for x := int32(0); x < nn; x++ {
			if x == t {
				for v := int32(0); v < n; v++ {
					if !p.isForbidden(v) && !(p.actuated(v) && p.qOf(v) < 0) {
						emit(t, v, p.w[v]) // pool -> column
					}
				}
				for u := int32(0); u < n; u++ {
					if p.rowMate[u] < 0 {
						emit(t, n+u, 0) // supply -> free row
					}
				}
				continue
			}
			deg := p.degree(x)
			for i := int64(0); i < deg; i++ {
				if y, c, ok := p.arcAt(x, i); ok {
					emit(x, y, c)
				}
			}
		}
		if pass == 0 {
			for x := int32(0); x < nn; x++ {
				g0.Ptr[x+1] += g0.Ptr[x]
			}
			g0.Adj = make([]int32, g0.Ptr[nn])
		}
	}
	comp := structural.SCC(&g0)
	out := make([]bool, len(added))
	for i, x := range added {
		out[i] = true
		for _, u := range p.g.In.Row(x) {
			if p.pot[n+u]-p.pot[x] == 0 && comp.Of[n+u] == comp.Of[x] {
				out[i] = false
				break
			}
		}
	}
	return out
}

// alternatives returns, for each added device, up to max+1 states that can
// replace it alone at the same cost.
func (p *placer) alternatives(pl *Placement, max int) [][]int32 {
	g, n := p.g, p.n
	// The complete set: existing devices and the states the flow
	// actuates (pl.Devices may hide extra states of a completion).
	inS := make([]bool, n)
	for v := int32(0); int(v) < n; v++ {
		inS[v] = p.isExisting(v) || p.actuated(v)
	}
	// The matching restricted to the states outside the set.
	ms := func(u int32) int32 {
		if v := p.rowMate[u]; v >= 0 && !inS[v] {
			return v
		}
		return -1
	}
	// Alternating digraph on columns: v -> ms(u) for u in In(v).
	h := matching.CSR{Rows: n, Cols: n, Ptr: make([]int64, n+1)}
	freeIn := make([]bool, n) // an in-neighbour row is free
	for v := 0; v < n; v++ {
		for _, u := range g.In.Row(int32(v)) {
			if x := ms(u); x >= 0 && x != int32(v) {
				h.Ptr[v+1]++
			} else if x < 0 {
				freeIn[v] = true
			}
		}
	}
	for v := 0; v < n; v++ {
		h.Ptr[v+1] += h.Ptr[v]
	}
	h.Adj = make([]int32, h.Ptr[n])
	k := 0
	for v := 0; v < n; v++ {
		for _, u := range g.In.Row(int32(v)) {
			if x := ms(u); x >= 0 && x != int32(v) {
				h.Adj[k] = x
				k++
			}
		}
	}
	comps := structural.SCC(&h)
	eligible := func(y int32) bool { return !inS[y] && !p.isForbidden(y) }
	less := func(a, b int32) int {
		if c := cmp.Compare(p.w[a], p.w[b]); c != 0 {
			return c
		}
		return cmp.Compare(a, b)
	}
	// Members of each component, components in Tarjan order (sinks
	// first), then the capped lists of the cheapest reachable eligible
	// states and whether a free row is reachable.
	start := make([]int32, comps.Count+1)
	for _, c := range comps.Of {
		start[c+1]++
	}
	for c := 0; c < comps.Count; c++ {
		start[c+1] += start[c]
	}
	members := make([]int32, n)
	fill := make([]int32, comps.Count)
	copy(fill, start[:comps.Count])
	for v := 0; v < n; v++ {
		c := comps.Of[v]
		members[fill[c]] = int32(v)
		fill[c]++
	}
	cap1 := max + 1
	listOff := make([]int32, comps.Count+1)
	var lists []int32
	drop := make([]bool, comps.Count)
	var scratch []int32
	for c := 0; c < comps.Count; c++ {
		scratch = scratch[:0]
		for _, v := range members[start[c]:start[c+1]] {
			if eligible(v) {
				scratch = append(scratch, v)
			}
			if freeIn[v] {
				drop[c] = true
			}
			for _, w := range h.Row(v) {
				if d := comps.Of[w]; d != int32(c) {
					drop[c] = drop[c] || drop[d]
					scratch = append(scratch, lists[listOff[d]:listOff[d+1]]...)
				}
			}
		}
		slices.SortFunc(scratch, less)
		scratch = slices.Compact(scratch)
		if len(scratch) > cap1 {
			scratch = scratch[:cap1]
		}
		lists = append(lists, scratch...)
		listOff[c+1] = int32(len(lists))
	}
	// Devices alone in their source component.
	sInComp := make([]int32, p.nsrc)
	for v := 0; v < n; v++ {
		if j := p.srcIdx[p.comps.Of[v]]; j >= 0 && inS[v] {
			sInComp[j]++
		}
	}
	out := make([][]int32, len(pl.added))
	seen := make([]int32, n)
	stamp := int32(0)
	var queue []int32
	for i, x := range pl.added {
		j := p.srcIdx[p.comps.Of[x]]
		c := comps.Of[x]
		if j < 0 || sInComp[j] > 1 {
			if drop[c] {
				continue // removable at no cost: nothing to replace
			}
			var a []int32
			for _, y := range lists[listOff[c]:listOff[c+1]] {
				if p.w[y] != p.w[x] {
					break
				}
				a = append(a, y)
			}
			out[i] = a
			continue
		}
		// Alone in source component j: the replacement must be in j.
		var a []int32
		if drop[c] {
			for _, y := range p.aAdj[p.aPtr[j]:p.aPtr[j+1]] {
				if y != x && eligible(y) && p.w[y] == p.w[x] {
					a = append(a, y)
					if len(a) == cap1 {
						break
					}
				}
			}
			out[i] = a
			continue
		}
		has := false
		for _, y := range p.aAdj[p.aPtr[j]:p.aPtr[j+1]] {
			if y != x && eligible(y) && p.w[y] == p.w[x] {
				has = true
				break
			}
		}
		if !has {
			continue
		}
		stamp++
		seen[x] = stamp
		queue = append(queue[:0], x)
		for hd := 0; hd < len(queue) && len(a) < cap1; hd++ {
			for _, w := range h.Row(queue[hd]) {
				if seen[w] == stamp {
					continue
				}
				seen[w] = stamp
				queue = append(queue, w)
				if p.srcIdx[p.comps.Of[w]] == j && eligible(w) && p.w[w] == p.w[x] {
					a = append(a, w)
				}
			}
		}
		slices.Sort(a)
		if len(a) > cap1 {
			a = a[:cap1]
		}
		out[i] = a
	}
	return out
}
