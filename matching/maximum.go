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
// then the free edge to the column of fewest free neighbours) and completed
// by augmenting paths. A search that fails proves that the columns it
// visited lead to no free column, now or after later augmentations (they
// and their mates form a closed alternating set); they are marked dead and
// never entered again. A first pass searches from each free row in turn,
// breadth-first with lookahead (Kuhn's method with dead marks), so failing
// searches together cost one pass over the graph; if successful searches
// grow expensive, the remaining free rows go on in phases of Pothen–Fan
// with lookahead and fairness (PF+; Duff, Kaya & Uçar, ACM TOMS 38(2):13,
// 2011), depth-first with a visit mark shared by the phase, so a phase costs
// at most one pass.
//
// Every search is iterative. Time is O(|E|) for the initialisation and
// O(|V||E|) in the worst case for the augmentation, near-linear on the
// sparse networks met in practice; memory is about 24 bytes per row and
// column beyond the graph.
func Maximum(g, gt *CSR) *Matching {
	if gt == nil {
		gt = Transpose(g)
	}
	m := &Matching{RowMate: make([]int32, g.Rows), ColMate: make([]int32, g.Cols)}
	m.Size = karpSipser(g, gt, m)
	m.Size += augment(g, gt, m)
	return m
}

// karpSipser fills m with a greedy matching: a vertex with exactly one free
// neighbour is matched to it (an optimal choice), and when none is left the
// next free row takes the free column with the fewest free neighbours.
//
// Each vertex keeps its state in one word, so a neighbour update touches one
// cache line: st >= 0 is the mate, st < 0 a free vertex with -1-st free
// incidences, and x the exclusive or of those incidences' indices, which is
// the last free neighbour itself once one is left (repeated edges cancel in
// pairs as they leave together).
func karpSipser(g, gt *CSR, m *Matching) int {
	nr, nc := g.Rows, g.Cols
	rs := make([]ksState, nr)
	cs := make([]ksState, nc)
	queue := make([]int32, 0, 1024) // degree-one vertices: rows r, columns as ^c
	gp, ga, tp, ta := g.Ptr, g.Adj, gt.Ptr, gt.Adj
	for r := 0; r < nr; r++ {
		x := int32(0)
		for _, c := range ga[gp[r]:gp[r+1]] {
			x ^= c
		}
		d := int32(gp[r+1] - gp[r])
		rs[r] = ksState{-1 - d, x}
		if d == 1 {
			queue = append(queue, int32(r))
		}
	}
	for c := 0; c < nc; c++ {
		x := int32(0)
		for _, r := range ta[tp[c]:tp[c+1]] {
			x ^= r
		}
		d := int32(tp[c+1] - tp[c])
		cs[c] = ksState{-1 - d, x}
		if d == 1 {
			queue = append(queue, ^int32(c))
		}
	}
	size := 0
	// match pairs row r with column c and removes them from the free
	// neighbourhoods of their neighbours, queueing those left with one.
	match := func(r, c int32) {
		rs[r].st = c
		cs[c].st = r
		size++
		for _, c2 := range ga[gp[r]:gp[r+1]] {
			if s := &cs[c2]; s.st < 0 {
				s.st++
				s.x ^= r
				if s.st == -2 {
					queue = append(queue, ^c2)
				}
			}
		}
		for _, r2 := range ta[tp[c]:tp[c+1]] {
			if s := &rs[r2]; s.st < 0 {
				s.st++
				s.x ^= c
				if s.st == -2 {
					queue = append(queue, r2)
				}
			}
		}
	}
	drain := func() {
		for len(queue) > 0 {
			v := queue[len(queue)-1]
			queue = queue[:len(queue)-1]
			if v >= 0 {
				if s := rs[v]; s.st == -2 {
					match(v, s.x)
				}
			} else if s := cs[^v]; s.st == -2 {
				match(s.x, ^v)
			}
		}
	}
	drain()
	for r := int32(0); int(r) < nr; r++ {
		if rs[r].st >= -1 {
			continue // matched, or no free neighbour left
		}
		best, bestSt := int32(-1), int32(0)
		for _, c := range ga[gp[r]:gp[r+1]] {
			// The largest negative state has the fewest free neighbours.
			if st := cs[c].st; st < 0 && (best < 0 || st > bestSt) {
				best, bestSt = c, st
				if st == -2 {
					break
				}
			}
		}
		if best >= 0 {
			match(r, best)
			drain()
		}
	}
	for r := range rs {
		m.RowMate[r] = max(rs[r].st, -1)
	}
	for c := range cs {
		m.ColMate[c] = max(cs[c].st, -1)
	}
	return size
}

// ksState is a vertex during Karp–Sipser; see karpSipser.
type ksState struct{ st, x int32 }

// colInfo keeps a column's mate and visit mark in one cache line.
type colInfo struct {
	mate int32 // row, or -1
	mark int32 // 0 never visited, dead, or the search that last visited
}

// dead marks a column from which no alternating path reaches a free column.
const dead = -1

// rowInfo keeps a row's search offsets and mate together.
type rowInfo struct {
	look int32 // lookahead offset: columns before it are matched
	next int32 // depth-first offset within the current visit; or the row it was reached from, breadth-first
	mate int32
}

// augment completes m to a maximum matching and returns the number of
// augmentations. gt is not used yet; it is kept for searches from columns.
func augment(g, gt *CSR, m *Matching) int {
	_ = gt
	nr, nc := g.Rows, g.Cols
	free := make([]int32, 0, 1024)
	for r := 0; r < nr; r++ {
		if m.RowMate[r] < 0 && g.Ptr[r+1] > g.Ptr[r] {
			free = append(free, int32(r))
		}
	}
	if len(free) == 0 {
		return 0
	}
	unmatchedCols := 0
	for _, r := range m.ColMate {
		if r < 0 {
			unmatchedCols++
		}
	}
	if unmatchedCols == 0 {
		return 0
	}
	cols := make([]colInfo, nc)
	for c, r := range m.ColMate {
		cols[c].mate = r
	}
	rows := make([]rowInfo, nr)
	for r, c := range m.RowMate {
		rows[r].mate = c
	}
	ptr, adj := g.Ptr, g.Adj
	// The first pass searches from each free row in turn, breadth-first
	// (Kuhn's method with the dead marks); see kuhnPass. Roots left when
	// its budget runs out go on in Pothen–Fan phases.
	var added int
	free, added, unmatchedCols = kuhnPass(g, rows, cols, free, unmatchedCols)
	search := int32(1)              // mark 1 was used by kuhnPass
	stack := make([]int32, 0, 64)   // rows on the current alternating path
	visited := make([]int32, 0, 64) // columns visited by the current search
	for phase := 0; len(free) > 0 && unmatchedCols > 0; phase++ {
		forward := phase%2 == 0
		phaseStart := search + 1
		found := 0
		k := 0 // free[:k] are the roots kept for the next phase
		for _, root := range free {
			if rows[root].mate >= 0 {
				continue
			}
			if unmatchedCols == 0 {
				break
			}
			search++
			cur := search
			touchedLive := false
			visited = visited[:0]
			stack = append(stack[:0], root)
			rows[root].next = 0
			success := false
			for len(stack) > 0 {
				r := stack[len(stack)-1]
				ri := &rows[r]
				lo, hi := ptr[r], ptr[r+1]
				deg := int32(hi - lo)
				// Lookahead: a free column adjacent to r ends the path.
				endCol := int32(-1)
				for ri.look < deg {
					c := adj[lo+int64(ri.look)]
					ri.look++
					if cols[c].mate < 0 {
						endCol = c
						break
					}
				}
				if endCol >= 0 {
					c := endCol
					for i := len(stack) - 1; i >= 0; i-- {
						rr := stack[i]
						prev := rows[rr].mate
						rows[rr].mate = c
						cols[c].mate = rr
						c = prev
					}
					success = true
					break
				}
				// Descend to an unvisited live column; all of r's columns
				// are matched now (columns never lose their mates).
				advanced := false
				for ri.next < deg {
					var c int32
					if forward {
						c = adj[lo+int64(ri.next)]
					} else {
						c = adj[hi-1-int64(ri.next)]
					}
					ri.next++
					ci := &cols[c]
					mk := ci.mark
					if mk == dead {
						continue
					}
					if mk >= phaseStart {
						if mk != cur {
							touchedLive = true
						}
						continue
					}
					ci.mark = cur
					visited = append(visited, c)
					r2 := ci.mate
					rows[r2].next = 0
					stack = append(stack, r2)
					advanced = true
					break
				}
				if !advanced {
					stack = stack[:len(stack)-1]
				}
			}
			if success {
				found++
				unmatchedCols--
				continue
			}
			if touchedLive {
				free[k] = root
				k++
				continue
			}
			// A clean failure: the visited columns and their rows form a
			// closed alternating set with no free column; no later
			// augmentation can enter it, so it is dead for good.
			for _, c := range visited {
				cols[c].mark = dead
			}
		}
		free = free[:k]
		added += found
		if found == 0 {
			break
		}
	}
	for c := range cols {
		m.ColMate[c] = cols[c].mate
	}
	for r := range rows {
		m.RowMate[r] = rows[r].mate
	}
	return added
}

// kuhnPass searches for an augmenting path from each root in turn,
// breadth-first, with a visit mark of its own (the mark 1, cleared by the
// search's end), lookahead for free columns, and dead marks: a search that
// fails leaves every column it visited dead, since they and their mates form
// a closed alternating set that no later augmentation enters, so each
// column is scanned by failing searches once in all. Successful searches
// may re-scan live columns; once they have scanned more than twice the
// edges, the pass stops and returns the roots not yet tried, with the number
// of augmentations and the free columns left. Breadth-first order lets the
// memory accesses of one row's columns overlap, which matters because the
// failing searches together touch most of the graph.
func kuhnPass(g *CSR, rows []rowInfo, cols []colInfo, free []int32, unmatchedCols int) ([]int32, int, int) {
	ptr, adj := g.Ptr, g.Adj
	budget := kuhnEdgeFactor*int64(len(adj)) + int64(g.Rows)
	if kuhnEdgeFactor < 0 {
		budget = -1 // tests: Pothen–Fan phases only
	}
	var spent int64
	queue := make([]int32, 0, 64)
	visited := make([]int32, 0, 64)
	const mark = 1
	added := 0
	for i, root := range free {
		if unmatchedCols == 0 || spent > budget {
			return free[i:], added, unmatchedCols
		}
		queue = append(queue[:0], root)
		visited = visited[:0]
		var scans int64
		success := false
	search:
		for qi := 0; qi < len(queue); qi++ {
			r := queue[qi]
			ri := &rows[r]
			lo, hi := ptr[r], ptr[r+1]
			deg := int32(hi - lo)
			for ri.look < deg {
				c := adj[lo+int64(ri.look)]
				ri.look++
				if cols[c].mate < 0 {
					// Augment back along the rows' predecessors.
					for {
						prev := rows[r].mate
						rows[r].mate = c
						cols[c].mate = r
						if r == root {
							break
						}
						c = prev
						r = rows[r].next
					}
					success = true
					break search
				}
			}
			scans += hi - lo
			for _, c := range adj[lo:hi] {
				ci := &cols[c]
				if ci.mark != 0 {
					continue // dead, or visited by this search
				}
				ci.mark = mark
				visited = append(visited, c)
				r2 := ci.mate
				rows[r2].next = r
				queue = append(queue, r2)
			}
		}
		if success {
			added++
			unmatchedCols--
			spent += scans
			for _, c := range visited {
				cols[c].mark = 0
			}
			continue
		}
		for _, c := range visited {
			cols[c].mark = dead
		}
	}
	return free[:0], added, unmatchedCols
}

// kuhnEdgeFactor sets kuhnPass's budget in edges scanned by successful
// searches per edge of the graph; tests set it below zero to exercise the
// Pothen–Fan phases alone.
var kuhnEdgeFactor int64 = 2
