package placement

// This file routes the mandatory unit of every source component through the
// residual network of the greedy flow (see PlaceActuators), by the
// primal–dual form of successive shortest paths: Dijkstra on reduced costs
// from all pending sources at once, a potential update, then as many
// vertex-disjoint augmenting paths as a depth-first search finds along arcs
// of zero reduced cost.
//
// Residual arcs, with P merged into the terminal T:
//
//	column v -> its server: row mate (cost 0), pool T (cost -w(v)) or its
//	            component's source Q_j (cost -w(v))
//	row u    -> column v' for each edge u -> v' other than its mate (cost 0);
//	            -> T when matched (the row's unit returns to the supply)
//	Q_j      -> every allowed column of component j it does not serve
//	            (cost w(v))
//	T        -> allowed columns not served by the pool (cost w(v)), free rows
//	            (cost 0); never needed on a path, since T is where paths end.

// degree returns the number of arc slots of node x (see arcAt).
func (p *placer) degree(x int32) int64 {
	n := int32(p.n)
	switch {
	case x < n:
		return 1
	case x < 2*n:
		u := x - n
		return p.g.Out.Ptr[u+1] - p.g.Out.Ptr[u] + 1
	case x == 2*n:
		return 0
	}
	j := x - 2*n - 1
	return p.aPtr[j+1] - p.aPtr[j]
}

// arcAt returns arc slot k of node x: its head and cost, and whether the
// arc is residual now.
func (p *placer) arcAt(x int32, k int64) (int32, int64, bool) {
	n := int32(p.n)
	switch {
	case x < n:
		if j := p.qOf(x); j >= 0 {
			return 2*n + 1 + j, -p.w[x], true
		}
		if u := p.colMate[x]; u >= 0 {
			return n + u, 0, true
		}
		if p.dead[x] {
			return 0, 0, false
		}
		return 2 * n, -p.w[x], true
	case x < 2*n:
		u := x - n
		lo, hi := p.g.Out.Ptr[u], p.g.Out.Ptr[u+1]
		if lo+k < hi {
			v := p.g.Out.Adj[lo+k]
			return v, 0, v != p.rowMate[u]
		}
		return 2 * n, 0, p.rowMate[u] >= 0
	}
	j := x - 2*n - 1
	v := p.aAdj[p.aPtr[j]+k]
	return v, p.w[v], p.qAt[j] != v
}

// route serves every source component with an allowed state.
func (p *placer) route() {
	var pending []int32
	for j := 0; j < p.nsrc; j++ {
		lo, hi := p.aPtr[j], p.aPtr[j+1]
		if lo == hi {
			continue // unreachable, reported
		}
		// An allowed state already uncovered: a zero-cost path.
		best := int32(-1)
		for _, v := range p.aAdj[lo:hi] {
			if p.colMate[v] < 0 && (best < 0 || p.w[v] < p.w[best]) {
				best = v
			}
		}
		if best >= 0 {
			p.qAt[j] = best
			continue
		}
		pending = append(pending, int32(j))
	}
	if len(pending) == 0 {
		return
	}
	p.potentials() // only routing and Roles need them

	s := newFlowState(2*p.n + 1 + p.nsrc)
	// Rounds from all pending sources at once suit few distinct path
	// lengths (unit costs: typically one or two rounds) but re-explore the
	// same regions when the lengths are spread out; searches from one
	// source at a time explore only their own neighbourhood but repeat
	// work shared by many sources. The loop measures the work per served
	// source (nodes settled) of both and keeps to the cheaper.
	one := make([]int32, 1)
	single := false
	multiCost := 0 // settled nodes per served source in the last round
	for len(pending) > 0 {
		if !single {
			s.round++
			p.dijkstra(pending, s)
			work := len(s.settled) + 1
			k := 0
			s.round++ // fresh marks for the depth-first searches
			for _, j := range pending {
				if !p.augmentFrom(int32(2*p.n+1)+j, s) {
					pending[k] = j
					k++
				}
			}
			served := len(pending) - k
			if served == 0 {
				panic("placement: placement routing made no progress")
			}
			pending = pending[:k]
			multiCost = (work + served - 1) / served
			single = 4*served < len(pending)+served
			continue
		}
		// One source at a time until it costs more than the rounds did.
		done, work := 0, 0
		for done < len(pending) {
			one[0] = pending[done]
			s.round++
			p.dijkstra(one, s)
			work += len(s.settled) + 1
			s.round++
			if !p.augmentFrom(int32(2*p.n+1)+pending[done], s) {
				panic("placement: placement routing made no progress")
			}
			done++
			if done >= 8 && work > 2*done*(multiCost+1) {
				break
			}
		}
		pending = pending[done:]
		single = false
	}
}

// flowState is scratch space for routing.
type flowState struct {
	round   int32
	dround  int32   // round of the last Dijkstra: paths stay on its settled nodes
	seen    []int32 // round in which dist was set
	done    []int32 // round in which the node was settled
	dist    []int64
	settled []int32
	heap    distHeap
	mark    []int32 // DFS visit marks
	pos     []int64
	stack   []int32
}

func newFlowState(nn int) *flowState {
	return &flowState{seen: make([]int32, nn), done: make([]int32, nn), dist: make([]int64, nn),
		mark: make([]int32, nn), pos: make([]int64, nn)}
}

// dijkstra computes reduced distances from the pending sources to T and
// updates the potentials so that every shortest path has zero reduced cost
// while every residual arc keeps a non-negative one.
func (p *placer) dijkstra(pending []int32, s *flowState) {
	t := int32(2 * p.n)
	r := s.round
	s.dround = r
	s.heap = s.heap[:0]
	s.settled = s.settled[:0]
	for _, j := range pending {
		q := t + 1 + j
		s.seen[q], s.dist[q] = r, 0
		s.heap.push(0, q)
	}
	var dT int64 = -1
	for len(s.heap) > 0 {
		d, x := s.heap.pop()
		if s.done[x] == r || d != s.dist[x] {
			continue
		}
		s.done[x] = r
		if x == t {
			dT = d
			break
		}
		s.settled = append(s.settled, x)
		deg := p.degree(x)
		for k := int64(0); k < deg; k++ {
			y, c, ok := p.arcAt(x, k)
			if !ok || s.done[y] == r {
				continue
			}
			nd := d + c + p.pot[x] - p.pot[y]
			if s.seen[y] != r || nd < s.dist[y] {
				s.seen[y], s.dist[y] = r, nd
				s.heap.push(nd, y)
			}
		}
	}
	if dT < 0 {
		panic("placement: placement routing found no path")
	}
	// pi += min(dist, dT) for all nodes, stored as pi -= dT - dist for the
	// nodes settled before T (a uniform shift leaves reduced costs alone).
	for _, x := range s.settled {
		p.pot[x] -= dT - s.dist[x]
	}
}

// augmentFrom searches a path of zero reduced cost from source node q to T
// through nodes settled by the last Dijkstra and not visited in this round,
// and applies it. Some shortest path lies entirely on settled nodes (T's
// predecessor in the search was settled), so the restriction loses none.
func (p *placer) augmentFrom(q int32, s *flowState) bool {
	t := int32(2 * p.n)
	r := s.round
	if s.mark[q] == r {
		return false
	}
	s.mark[q] = r
	st := append(s.stack[:0], q)
	s.pos[q] = 0
	defer func() { s.stack = st[:0] }()
	for len(st) > 0 {
		x := st[len(st)-1]
		deg := p.degree(x)
		pushed := false
		for s.pos[x] < deg {
			y, c, ok := p.arcAt(x, s.pos[x])
			s.pos[x]++
			if !ok || c+p.pot[x]-p.pot[y] != 0 {
				continue
			}
			if y == t {
				st = append(st, t)
				p.apply(st)
				return true
			}
			if s.mark[y] == r || s.done[y] != s.dround {
				continue
			}
			s.mark[y] = r
			s.pos[y] = 0
			st = append(st, y)
			pushed = true
			break
		}
		if !pushed {
			st = st[:len(st)-1]
		}
	}
	return false
}

// apply pushes one unit along path (a source, alternating columns and
// rows or sources, and T last).
func (p *placer) apply(path []int32) {
	n := int32(p.n)
	for i := 0; i+1 < len(path); i++ {
		a, b := path[i], path[i+1]
		switch {
		case a > 2*n: // source -> column
			p.qAt[a-2*n-1] = b
			p.colMate[b] = -1
		case a >= n && a < 2*n: // row -> column or T
			u := a - n
			if b == 2*n {
				p.rowMate[u] = -1
			} else {
				p.rowMate[u] = b
				p.colMate[b] = u
			}
		}
		// column -> its old server: nothing to do; the server is
		// reassigned by the next arc.
	}
}

// distHeap is a binary min-heap of (distance, node) pairs.
type distHeap []distItem

type distItem struct {
	d int64
	x int32
}

func (h *distHeap) push(d int64, x int32) {
	*h = append(*h, distItem{d, x})
	a := *h
	i := len(a) - 1
	for i > 0 {
		parent := (i - 1) / 2
		if a[parent].d <= a[i].d {
			break
		}
		a[parent], a[i] = a[i], a[parent]
		i = parent
	}
}

func (h *distHeap) pop() (int64, int32) {
	a := *h
	top := a[0]
	last := len(a) - 1
	a[0] = a[last]
	a = a[:last]
	i := 0
	for {
		l := 2*i + 1
		if l >= len(a) {
			break
		}
		m := l
		if r := l + 1; r < len(a) && a[r].d < a[l].d {
			m = r
		}
		if a[i].d <= a[m].d {
			break
		}
		a[i], a[m] = a[m], a[i]
		i = m
	}
	*h = a
	return top.d, top.x
}
