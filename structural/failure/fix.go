package failure

import (
	"slices"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/failure/internal/bip"
)

// Fix is the cheapest set of new dedicated devices (one state each) that
// makes a design work again after a loss.
type Fix struct {
	// Feasible reports that the allowed states can restore the design.
	Feasible bool `json:"feasible"`
	// Added lists the new devices, in increasing order.
	Added structural.States `json:"added"`
	// Cost is their total cost; among fixes of least cost, Added is one
	// with the fewest devices.
	Cost structural.Cost `json:"total_cost"`
}

// sources lazily indexes the source components of h: the components each
// signal touches, the signals touching each, and each component's states.
type sources struct {
	comps     *structural.Components
	sigPtr    []int32
	sigAdj    []int32
	touch     []int32
	compAdj   []int32
	memberPtr []int32
	members   []int32
}

func (c *core) sources() *sources {
	if c.src != nil {
		return c.src
	}
	comps := c.h.Components()
	s := &sources{comps: comps, sigPtr: make([]int32, c.k+1)}
	stamp := make([]int32, comps.Count)
	for i := 0; i < c.k; i++ {
		for _, v := range c.sig[i] {
			x := comps.Of[v]
			if comps.Source[x] && stamp[x] != int32(i+1) {
				stamp[x] = int32(i + 1)
				s.sigAdj = append(s.sigAdj, x)
			}
		}
		s.sigPtr[i+1] = int32(len(s.sigAdj))
	}
	s.touch = make([]int32, comps.Count+1)
	for _, x := range s.sigAdj {
		s.touch[x+1]++
	}
	for x := 0; x < comps.Count; x++ {
		s.touch[x+1] += s.touch[x]
	}
	s.compAdj = make([]int32, len(s.sigAdj))
	fill := append([]int32(nil), s.touch[:comps.Count]...)
	for i := 0; i < c.k; i++ {
		for _, x := range s.sccsOf(i) {
			s.compAdj[fill[x]] = int32(i)
			fill[x]++
		}
	}
	c.src = s
	return s
}

func (s *sources) sccsOf(i int) []int32       { return s.sigAdj[s.sigPtr[i]:s.sigPtr[i+1]] }
func (s *sources) touchers(x int32) []int32   { return s.compAdj[s.touch[x]:s.touch[x+1]] }
func (s *sources) touchCount(x int32) int32   { return s.touch[x+1] - s.touch[x] }
func (s *sources) memberList(x int32) []int32 { return s.members[s.memberPtr[x]:s.memberPtr[x+1]] }

// states of component x (any component), built on first use.
func (s *sources) statesOf(x int32) []int32 {
	if s.memberPtr == nil {
		k := s.comps.Count
		s.memberPtr = make([]int32, k+1)
		for _, y := range s.comps.Of {
			s.memberPtr[y+1]++
		}
		for y := 0; y < k; y++ {
			s.memberPtr[y+1] += s.memberPtr[y]
		}
		s.members = make([]int32, len(s.comps.Of))
		fill := append([]int32(nil), s.memberPtr[:k]...)
		for v, y := range s.comps.Of {
			s.members[fill[y]] = int32(v)
			fill[y]++
		}
	}
	return s.memberList(x)
}

// cheapest returns the least-cost fix that puts one device in each of the
// state sets groups (each must be hit, and they are disjoint) and, when
// alt is not nil, one device on a state of alt (a device hitting a group
// and alt at once counts for both), among states allowed by ok.
//
// A single loss leaves at most these requirements: every source component
// of the unreached states needs a device of its own (nothing else reaches
// it), and a dilation of deficiency one is removed exactly by a device on a
// state that an alternating path from the unmatched row reaches (any new
// column adjacent to such a row completes an augmenting path, no other
// can). So the choice is exact: either the cheapest state of each group
// plus the cheapest of alt, or one group's choice moved into alt.
func cheapest(g *structural.Network, groups [][]int32, alt []int32, ok func(int32) bool, cost func(int32) structural.Cost) *Fix {
	f := &Fix{Feasible: true}
	var added []int32
	best := make([]int32, len(groups))
	var total structural.Cost
	for j, grp := range groups {
		best[j] = -1
		for _, v := range grp {
			if ok(v) && (best[j] < 0 || cost(v) < cost(best[j])) {
				best[j] = v
			}
		}
		if best[j] < 0 {
			f.Feasible = false
			f.Added = g.States(nil)
			return f
		}
		total += cost(best[j])
	}
	if alt != nil {
		// Option 1: one more device, the cheapest of alt.
		extra := int32(-1)
		for _, v := range alt {
			if ok(v) && (extra < 0 || cost(v) < cost(extra)) {
				extra = v
			}
		}
		// Option 2: group j's device moved into alt, found by marking
		// each group's states.
		swapJ, swapV := -1, int32(-1)
		var swapGain structural.Cost // cost(new) - cost(best[j]), least
		if len(groups) > 0 {
			in := make(map[int32]int, 0)
			for j, grp := range groups {
				for _, v := range grp {
					in[v] = j
				}
			}
			for _, v := range alt {
				j, hit := in[v]
				if !hit || !ok(v) {
					continue
				}
				gain := cost(v) - cost(best[j])
				if swapJ < 0 || gain < swapGain {
					swapJ, swapV, swapGain = j, v, gain
				}
			}
		}
		switch {
		case swapJ >= 0 && (extra < 0 || swapGain <= cost(extra)):
			best[swapJ] = swapV
			total += swapGain
		case extra >= 0:
			added = append(added, extra)
			total += cost(extra)
		default:
			f.Feasible = false
			f.Added = g.States(nil)
			return f
		}
	}
	added = append(added, best...)
	slices.Sort(added)
	f.Added, f.Cost = g.States(added), total
	return f
}

// deviceFix is the cheapest fix after losing signal i, its own states
// barred: a device in every source component only i touched, and one on a
// state reachable by alternating paths from the row i was matched to when
// i is in every maximum matching.
func (c *core) deviceFix(g *structural.Network, a *bip.Aug, i int, dev structural.Devices) *Fix {
	s := c.sources()
	var groups [][]int32
	for _, x := range s.sccsOf(i) {
		if s.touchCount(x) == 1 {
			groups = append(groups, s.statesOf(x))
		}
	}
	var alt []int32
	if c.coloop(i) {
		mark := a.Mark()
		r := a.Disable(int32(c.n + i))
		alt = slices.Clone(a.AltReach([]int32{r}))
		a.Undo(mark)
	}
	barred := c.sig[i]
	return cheapest(g, groups, alt, func(v int32) bool { return dev.Allowed(v) && !slices.Contains(barred, v) }, dev.CostOf)
}

// linkFix is the cheapest fix after losing the edge u -> v of h: a device
// in the component of v that still reaches v (the one source component of
// the states cut off, found by a backward search from v without the edge,
// which cannot leave them), and one on a state an alternating path reaches
// from v when the edge is in every maximum matching.
func (c *core) linkFix(g *structural.Network, a *bip.Aug, u, v int32, unreached, dilation bool, dev structural.Devices) *Fix {
	var groups [][]int32
	if unreached {
		q, _ := c.reachersWithout(u, v, 0)
		groups = append(groups, q)
	}
	var alt []int32
	if dilation {
		mark := a.Mark()
		a.Unmatch(v)
		alt = slices.Clone(a.AltReachSkip([]int32{v}, v, u))
		a.Undo(mark)
	}
	return cheapest(g, groups, alt, dev.Allowed, dev.CostOf)
}
