package matching

// Matching is a matching of a bipartite graph: RowMate[r] is the column
// matched to row r and ColMate[c] the row matched to column c, -1 when
// unmatched. Size is the number of matched pairs.
type Matching struct {
	RowMate []int32
	ColMate []int32
	Size    int
}

// Maximum returns a maximum-cardinality matching of g. gt must be the
// transpose of g (see Transpose) or nil, in which case it is computed.
//
// The matching is initialised by Karp–Sipser (degree-one reductions first,
// then arbitrary edges) and completed by Pothen–Fan augmentation with
// lookahead and fairness (PF+; Duff, Kaya & Uçar, ACM TOMS 38(2), 2011).
// Each phase runs a depth-first search from every free row with a shared
// visited mark, so a phase finds a maximal set of vertex-disjoint augmenting
// paths; the algorithm stops after a phase that finds none. Searches are
// iterative. Time is O(|E|) for the initialisation and O(|V||E|) in the worst
// case for the augmentation, near-linear on the sparse networks met in
// practice; memory is O(|V|) beyond the graph.
func Maximum(g, gt *CSR) *Matching {
	if gt == nil {
		gt = Transpose(g)
	}
	m := &Matching{RowMate: make([]int32, g.Rows), ColMate: make([]int32, g.Cols)}
	for i := range m.RowMate {
		m.RowMate[i] = -1
	}
	for i := range m.ColMate {
		m.ColMate[i] = -1
	}
	m.Size = karpSipser(g, gt, m)
	m.Size += augment(g, m)
	return m
}

// karpSipser extends m greedily: a vertex with exactly one free neighbour is
// matched to it (an optimal choice), and when none is left an arbitrary free
// edge is taken. Degrees are kept current on both sides, so the whole pass is
// linear in the graph size.
func karpSipser(g, gt *CSR, m *Matching) int {
	nr, nc := g.Rows, g.Cols
	// deg[0:nr] are row degrees, deg[nr:nr+nc] column degrees, counting
	// only free neighbours.
	deg := make([]int32, nr+nc)
	queue := make([]int32, 0, 1024)
	for r := 0; r < nr; r++ {
		d := int32(g.Ptr[r+1] - g.Ptr[r])
		deg[r] = d
		if d == 1 {
			queue = append(queue, int32(r))
		}
	}
	for c := 0; c < nc; c++ {
		d := int32(gt.Ptr[c+1] - gt.Ptr[c])
		deg[nr+c] = d
		if d == 1 {
			queue = append(queue, int32(nr+c))
		}
	}
	size := 0
	// match pairs row r with column c and lowers the degrees of their
	// neighbours, queueing those that reach one.
	match := func(r, c int32) {
		m.RowMate[r] = c
		m.ColMate[c] = r
		size++
		deg[r] = 0
		deg[int32(nr)+c] = 0
		for _, c2 := range g.Adj[g.Ptr[r]:g.Ptr[r+1]] {
			if m.ColMate[c2] < 0 {
				k := int32(nr) + c2
				deg[k]--
				if deg[k] == 1 {
					queue = append(queue, k)
				}
			}
		}
		for _, r2 := range gt.Adj[gt.Ptr[c]:gt.Ptr[c+1]] {
			if m.RowMate[r2] < 0 {
				deg[r2]--
				if deg[r2] == 1 {
					queue = append(queue, r2)
				}
			}
		}
	}
	drain := func() {
		for len(queue) > 0 {
			v := queue[len(queue)-1]
			queue = queue[:len(queue)-1]
			if deg[v] != 1 {
				continue
			}
			if int(v) < nr {
				if m.RowMate[v] >= 0 {
					continue
				}
				for _, c := range g.Adj[g.Ptr[v]:g.Ptr[v+1]] {
					if m.ColMate[c] < 0 {
						match(v, c)
						break
					}
				}
			} else {
				c := v - int32(nr)
				if m.ColMate[c] >= 0 {
					continue
				}
				for _, r := range gt.Adj[gt.Ptr[c]:gt.Ptr[c+1]] {
					if m.RowMate[r] < 0 {
						match(r, c)
						break
					}
				}
			}
		}
	}
	drain()
	// Second stage: take the free edge of the free row with the fewest free
	// neighbours, scanning rows in order; every choice is followed by the
	// degree-one reductions it enables.
	for r := int32(0); int(r) < nr; r++ {
		if m.RowMate[r] >= 0 || deg[r] == 0 {
			continue
		}
		best, bestDeg := int32(-1), int32(1<<30)
		for _, c := range g.Adj[g.Ptr[r]:g.Ptr[r+1]] {
			if m.ColMate[c] < 0 && deg[int32(nr)+c] < bestDeg {
				best, bestDeg = c, deg[int32(nr)+c]
			}
		}
		if best >= 0 {
			match(r, best)
			drain()
		}
	}
	return size
}

// augment completes m to a maximum matching by Pothen–Fan phases with
// lookahead and fairness. It returns the number of augmentations.
func augment(g *CSR, m *Matching) int {
	nr := g.Rows
	free := make([]int32, 0)
	for r := 0; r < nr; r++ {
		if m.RowMate[r] < 0 && g.Ptr[r+1] > g.Ptr[r] {
			free = append(free, int32(r))
		}
	}
	if len(free) == 0 {
		return 0
	}
	visited := make([]int32, g.Cols) // phase stamp of the last visit
	look := make([]int32, nr)        // lookahead offset into each row
	next := make([]int32, nr)        // DFS offset into each row this phase
	stackR := make([]int32, 0, 64)   // rows on the current alternating path
	added := 0
	for phase := int32(1); ; phase++ {
		forward := phase%2 == 1
		found := 0
		for _, root := range free {
			if m.RowMate[root] >= 0 {
				continue
			}
			stackR = append(stackR[:0], root)
			next[root] = 0
			for len(stackR) > 0 {
				r := stackR[len(stackR)-1]
				lo, hi := g.Ptr[r], g.Ptr[r+1]
				deg := int32(hi - lo)
				// Lookahead: a free column adjacent to r ends the path.
				endCol := int32(-1)
				for look[r] < deg {
					c := g.Adj[lo+int64(look[r])]
					look[r]++
					if m.ColMate[c] < 0 {
						endCol = c
						break
					}
				}
				if endCol >= 0 {
					// Augment: each row on the path takes the column
					// that entered the next one; the last takes endCol.
					c := endCol
					for i := len(stackR) - 1; i >= 0; i-- {
						rr := stackR[i]
						prev := m.RowMate[rr]
						m.RowMate[rr] = c
						m.ColMate[c] = rr
						c = prev
					}
					found++
					break
				}
				// Descend to an unvisited matched column.
				advanced := false
				for next[r] < deg {
					var c int32
					if forward {
						c = g.Adj[lo+int64(next[r])]
					} else {
						c = g.Adj[hi-1-int64(next[r])]
					}
					next[r]++
					if visited[c] == phase {
						continue
					}
					visited[c] = phase
					r2 := m.ColMate[c]
					if r2 < 0 {
						continue // columns only ever gain mates, so lookahead saw every free one
					}
					next[r2] = 0
					stackR = append(stackR, r2)
					advanced = true
					break
				}
				if !advanced {
					stackR = stackR[:len(stackR)-1]
				}
			}
		}
		if found == 0 {
			break
		}
		added += found
		// Drop matched rows from the free list.
		k := 0
		for _, r := range free {
			if m.RowMate[r] < 0 {
				free[k] = r
				k++
			}
		}
		free = free[:k]
		if len(free) == 0 {
			break
		}
	}
	return added
}
