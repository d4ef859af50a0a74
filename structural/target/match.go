package target

import "github.com/netsteer/netsteer/matching"

// priorityMatch returns a maximum matching of g that covers the rows in the
// order given: each row in turn is matched if it can be without unmatching
// an earlier one, so the rows matched form the lexicographically first
// basis of the transversal matroid in that order, and when rows are
// offered by decreasing weight the matched weight is the largest possible
// (Edmonds' greedy algorithm on a matroid). Rows missing from order are
// never matched.
//
// Each row takes a free column if it has one, the one of highest score in
// prefer (nil: the first), else searches breadth-first for an
// augmenting path. An augmentation never unmatches a row. A search that
// fails proves that every vertex it met leads to no free column, now and
// later (later rows only take free columns, which the dead set has none
// of, and an augmenting path through the dead set would have been found),
// so they are marked dead for good and failing searches together scan
// each edge once. Time O(E) beyond the successful searches, each O(E) at
// worst.
func priorityMatch(g *matching.CSR, order []int32, prefer []uint8) (rowMate, colMate []int32) {
	rowMate = make([]int32, g.Rows)
	colMate = make([]int32, g.Cols)
	for i := range rowMate {
		rowMate[i] = -1
	}
	for i := range colMate {
		colMate[i] = -1
	}
	deadRow := make([]bool, g.Rows)
	seenRow := make([]int32, g.Rows) // search stamp
	from := make([]int32, g.Rows)    // the row whose scan reached a row's mate column
	var queue []int32
	stamp := int32(0)
	for _, root := range order {
		if rowMate[root] >= 0 {
			continue
		}
		pick := int32(-1)
		for _, c := range g.Row(root) {
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
			rowMate[root], colMate[pick] = pick, root
			continue
		}
		stamp++
		queue = append(queue[:0], root)
		seenRow[root] = stamp
		found := int32(-1) // free column reached
		var last int32
		for i := 0; i < len(queue) && found < 0; i++ {
			r := queue[i]
			for _, c := range g.Row(r) {
				nr := colMate[c]
				if nr < 0 {
					found, last = c, r
					break
				}
				if deadRow[nr] || seenRow[nr] == stamp {
					continue
				}
				seenRow[nr] = stamp
				from[nr] = r
				queue = append(queue, nr)
			}
		}
		if found < 0 {
			for _, r := range queue {
				deadRow[r] = true
			}
			continue
		}
		// Flip the path: last takes found, and every row up the tree takes
		// the old mate of the row it reached.
		c, r := found, last
		for {
			old := rowMate[r]
			rowMate[r], colMate[c] = c, r
			if r == root {
				break
			}
			c, r = old, from[r]
		}
	}
	return rowMate, colMate
}
