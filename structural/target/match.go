package target

import "github.com/netsteer/netsteer/matching"

// priorityMatch returns a maximum matching of g that covers the rows class
// by class: order lists the rows, classEnd[i] is the end in order of class
// i (the last equals len(order)). Each class is matched as fully as it can
// be without unmatching a row of an earlier class, so when classes are
// offered by decreasing weight the matched weight is the largest possible
// (the greedy algorithm on the transversal matroid of the rows, Edmonds
// 1971, run a class at a time since rows of one class weigh the same).
// Rows missing from order are never matched.
//
// One class of all rows without preferences is matching.Maximum. Otherwise,
// within a class, each row first takes a free column, the one of highest
// score in prefer (nil: the first); then Hopcroft–Karp phases (SIAM J.
// Comput. 2(4), 1973) from the class's free rows: a breadth-first search
// layers the alternating graph, and depth-first searches, iterative, take
// vertex-disjoint shortest augmenting paths. An augmentation never
// unmatches a row. A row that no phase can augment stays unmatched for
// good: later classes only take free columns or augment, which never opens
// a path to it (such a path would have been found). Time O(E·sqrt(V)) per
// class at worst.
func priorityMatch(g *matching.CSR, order []int32, classEnd []int, prefer []uint8) (rowMate, colMate []int32) {
	if len(classEnd) == 1 && prefer == nil && len(order) == g.Rows {
		// One class of every row: any maximum matching will do.
		m := matching.Maximum(g, nil)
		return m.RowMate, m.ColMate
	}
	rowMate = make([]int32, g.Rows)
	colMate = make([]int32, g.Cols)
	for i := range rowMate {
		rowMate[i] = -1
	}
	for i := range colMate {
		colMate[i] = -1
	}
	dist := make([]int32, g.Rows)
	cur := make([]int64, g.Rows)
	var free, queue []int32
	var stack []int32
	begin := 0
	for _, end := range classEnd {
		class := order[begin:end]
		begin = end
		free = free[:0]
		for _, r := range class {
			pick := int32(-1)
			for _, c := range g.Row(r) {
				if colMate[c] < 0 {
					if prefer == nil {
						pick = c
						break
					}
					if pick < 0 || prefer[c] > prefer[pick] {
						pick = c
					}
				}
			}
			if pick >= 0 {
				rowMate[r], colMate[pick] = pick, r
			} else {
				free = append(free, r)
			}
		}
		for len(free) > 0 {
			// Layers from the free rows of this class.
			for i := range dist {
				dist[i] = -1
			}
			queue = queue[:0]
			for _, r := range free {
				dist[r] = 0
				queue = append(queue, r)
			}
			found := false
			limit := int32(-1)
			for i := 0; i < len(queue); i++ {
				r := queue[i]
				if limit >= 0 && dist[r] >= limit {
					break
				}
				for _, c := range g.Row(r) {
					nr := colMate[c]
					if nr < 0 {
						found = true
						if limit < 0 {
							limit = dist[r] + 1
						}
						continue
					}
					if dist[nr] < 0 {
						dist[nr] = dist[r] + 1
						queue = append(queue, nr)
					}
				}
			}
			if !found {
				break
			}
			// Vertex-disjoint shortest augmenting paths, depth first.
			for _, r := range queue {
				cur[r] = g.Ptr[r]
			}
			next := free[:0]
			for _, root := range free {
				stack = append(stack[:0], root)
				for len(stack) > 0 {
					r := stack[len(stack)-1]
					advanced := false
					for cur[r] < g.Ptr[r+1] {
						c := g.Adj[cur[r]]
						cur[r]++
						nr := colMate[c]
						if nr < 0 {
							if dist[r]+1 != limit {
								continue
							}
							// Augment along the stack: each row takes the
							// column it stepped through.
							colMate[c], rowMate[r] = r, c
							dist[r] = -1
							for k := len(stack) - 2; k >= 0; k-- {
								pr := stack[k]
								pc := g.Adj[cur[pr]-1]
								colMate[pc], rowMate[pr] = pr, pc
								dist[pr] = -1
							}
							stack = stack[:0]
							advanced = true
							break
						}
						if dist[nr] == dist[r]+1 {
							stack = append(stack, nr)
							advanced = true
							break
						}
					}
					if !advanced {
						dist[r] = -1 // a dead end for the rest of the phase
						stack = stack[:len(stack)-1]
					}
				}
				if rowMate[root] < 0 {
					next = append(next, root)
				}
			}
			if len(next) == len(free) {
				break
			}
			free = next
		}
	}
	return rowMate, colMate
}
