package placement

import (
	"cmp"
	"math/bits"
	"slices"

	"github.com/netsteer/netsteer/matching"
)

// This file finds the cheapest set of uncovered states (step 1 of Place)
// when no state is forbidden, from any maximum matching instead of a
// greedy matching built class by class.
//
// The sets of columns a maximum matching leaves free are the bases of a
// matroid (the dual of the transversal matroid of the columns), so a
// cheapest one is found greedily: columns are offered by increasing
// working cost, and a column is added when it can be left free together
// with those added before. Starting from a maximum matching M, whose free
// columns are "tokens", column s can join exactly when an alternating path
// leads from s to a token that avoids the columns added so far: the row
// covering s moves to another column, whose row moves on, until a row
// takes the token, and s is free. A search that finds no token proves that
// the columns it visited can never be freed again (tokens only get fewer,
// added columns only close paths, and the paths later searches flip avoid
// the columns that cannot reach a token), so they are marked dead and
// failing searches together scan each edge once. Only the columns reachable
// backwards from the tokens (those that some maximum matching leaves free:
// the Dulmage–Mendelsohn part of free columns) are offered at all. Time is
// one maximum matching (the network's own, cached, for Place), one
// alternating search and a sort over that part, plus the successful
// searches, which on the networks met in practice stop after a few hundred
// columns.

// cheapestFree sets p.rowMate and p.colMate to a maximum matching whose
// free columns have the least total working cost, starting from m.
func (p *placer) cheapestFree(m *matching.Matching) {
	g, n := p.g, p.n
	p.rowMate, p.colMate = slices.Clone(m.RowMate), slices.Clone(m.ColMate)
	colMate, rowMate := p.colMate, p.rowMate
	const (
		token   = 1 // free and not added yet
		added   = 2 // committed to stay free
		dead    = 3 // can never be freed
		visited = 4 // seen by the current search (reset after it)
	)
	mark := make([]uint8, n)
	// The columns some maximum matching leaves free: backwards from the
	// tokens, a row adjacent to a reachable column could move to it, so
	// its own column can be freed.
	reach := make([]int32, 0, 1024)
	inReach := make([]bool, n)
	tokens := 0
	for v := 0; v < n; v++ {
		if colMate[v] < 0 {
			mark[v] = token
			tokens++
			inReach[v] = true
			reach = append(reach, int32(v))
		}
	}
	for k := 0; k < len(reach); k++ {
		for _, u := range g.In.Row(reach[k]) {
			if x := rowMate[u]; x >= 0 && !inReach[x] {
				inReach[x] = true
				reach = append(reach, x)
			}
		}
	}
	sortByCost(reach, inReach, p.w)
	inReach = nil
	parent := make([]int32, n)
	queue := make([]int32, 0, 1024)
	for _, s := range reach {
		if tokens == 0 {
			break
		}
		switch mark[s] {
		case token:
			mark[s] = added
			tokens--
			continue
		case dead:
			continue
		}
		// Breadth-first from s towards a token.
		queue = append(queue[:0], s)
		mark[s] = visited
		found := int32(-1)
	search:
		for k := 0; k < len(queue); k++ {
			x := queue[k]
			for _, v := range g.Out.Row(colMate[x]) {
				switch mark[v] {
				case token:
					parent[v] = x
					found = v
					break search
				case 0:
					mark[v] = visited
					parent[v] = x
					queue = append(queue, v)
				}
			}
		}
		if found < 0 {
			for _, x := range queue {
				mark[x] = dead
			}
			continue
		}
		for _, x := range queue {
			mark[x] = 0
		}
		mark[found] = 0 // matched now
		// Flip: each row on the path moves to the next column.
		for v := found; v != s; {
			x := parent[v]
			u := colMate[x]
			rowMate[u], colMate[v] = v, u
			v = x
		}
		colMate[s] = -1
		mark[s] = added
		tokens--
	}
}

// sortByCost puts the states marked in mark, listed in list, in order of
// increasing w, ties by increasing index. When a cost and an index fit in
// 64 bits together, the pairs are packed into keys and radix-sorted
// (16-bit digits), which on 10^7 states takes a fraction of a comparison
// sort's time.
func sortByCost(list []int32, mark []bool, w []int64) {
	n := len(mark)
	var maxW int64
	for _, v := range list {
		maxW = max(maxW, w[v])
	}
	shift := bits.Len(uint(n))
	if bits.Len64(uint64(maxW))+shift > 64 {
		slices.SortFunc(list, func(a, b int32) int {
			if c := cmp.Compare(w[a], w[b]); c != 0 {
				return c
			}
			return cmp.Compare(a, b)
		})
		return
	}
	keys := make([]uint64, 0, len(list))
	for v := 0; v < n; v++ {
		if mark[v] {
			keys = append(keys, uint64(w[v])<<shift|uint64(v))
		}
	}
	buf := make([]uint64, len(keys))
	var count [1 << 16]int
	for d := 0; d < bits.Len64(uint64(maxW)<<shift|uint64(n)); d += 16 {
		clear(count[:])
		for _, k := range keys {
			count[k>>d&0xffff]++
		}
		sum := 0
		for i, c := range count {
			count[i] = sum
			sum += c
		}
		for _, k := range keys {
			x := k >> d & 0xffff
			buf[count[x]] = k
			count[x]++
		}
		keys, buf = buf, keys
	}
	mask := uint64(1)<<shift - 1
	for i, k := range keys {
		list[i] = int32(k & mask)
	}
}
