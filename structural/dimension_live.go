package structural

// live marks the nodes that can reach a deficit along admissible arcs
// (reduced cost 0) without passing through the hub. It is one backward
// search from the deficits over the contracted residual network, through
// the arcs that enter each node: into v_out come the in-neighbours of the
// state v feeds (and of v itself when v is uncovered), into input i those
// of the state i feeds. When one of them is an admissible target of the
// hub, the hub is live and every unmarked node is hub-only (it may still
// reach a deficit through the hub, and no other way); otherwise every
// unmarked node, the hub included, is stamped dead for the current
// potentials, so that no pass enters it. It reports whether some source
// may still reach a deficit: false means that none can.
//
// Dead stays dead while the potentials stay: augmenting along a path P
// changes only the arcs leaving nodes of P and the contracted arcs through
// the v_in of P, whose reduced costs can only rise (the arc that entered
// v_in on P was admissible), and a node that reached P was live.
func (f *coverFlow) live(sources []int32) bool {
	nd := f.node
	n := f.n
	hubLive := false
	queue := f.stack[:0]
	// mark makes x live; dist 0 is the mark (dist is infinity32 outside
	// the shortest-path search).
	mark := func(x int32) {
		if nd[x].dist != 0 {
			nd[x].dist = 0
			queue = append(queue, x)
		}
	}
	// into marks the tails x of the admissible arcs x -> w_in -> y, where
	// w_in passes on to a live y of potential qy (a deficit passes to the
	// sink, potential 0) at cost delta: -1 when y is w itself through the
	// "uncovered" arc, else 0.
	into := func(w int32, delta, qy int32) {
		for _, x := range f.g.in.Adj[f.g.in.Ptr[w]:f.g.in.Ptr[w+1]] {
			if delta+nd[x].q == qy && nd[x].dist != 0 && f.succ[x] != w && f.inR[x] {
				mark(x)
			}
		}
		for _, i := range f.inputsOf[f.inPtr[w]:f.inPtr[w+1]] {
			x := n + i
			if delta+nd[x].q == qy && f.succ[x] != w {
				mark(x)
			}
		}
		if f.succ[w] != flowSelf && 1+delta+nd[w].q == qy {
			mark(w)
		}
	}
	for w := int32(0); w < n; w++ {
		if f.inR[w] && nd[w].pred == flowNone {
			into(w, 0, 0)
		}
	}
	qh := nd[f.hub].q
	hubTarget := func(y int32) bool {
		s := f.succ[y]
		return (s == flowHub || (y >= n && s == flowNone)) && qh == nd[y].q
	}
	for k := 0; k < len(queue); k++ {
		y := queue[k]
		qy := nd[y].q
		if s := f.succ[y]; s >= 0 {
			into(s, 0, qy)
		}
		if y < n && nd[y].pred == flowSelf {
			into(y, -1, qy)
		}
		if !hubLive && hubTarget(y) {
			hubLive = true
		}
	}
	f.stack = queue[:0]
	dead := -f.phase
	for x := range nd {
		switch nd[x].dist {
		case 0:
			f.hubOnly[x] = false
			nd[x].dist = infinity32
		default:
			if hubLive {
				f.hubOnly[x] = true
			} else {
				nd[x].stamp = dead
			}
		}
	}
	if !hubLive {
		f.hubDead = f.phase
	}
	if hubLive {
		return true
	}
	for _, v := range sources {
		if f.succ[v] == flowNone && nd[v].stamp != dead {
			return true
		}
	}
	return false
}
