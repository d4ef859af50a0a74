// Package bip holds the bipartite graph of a design, [A B], and the
// alternating-path machinery the failure analysis runs on it: which
// columns a maximum matching can leave free, the digraph of alternating
// paths between rows, and an augmenter that switches columns off and on and
// undoes its changes.
//
// Rows are the states, each needing a distinct in-neighbour; column u < N is
// state u as an in-neighbour (row v is adjacent to column u for every edge
// u -> v) and column N+i is signal i (adjacent to the rows it drives).
package bip

import (
	"github.com/netsteer/netsteer/matching"
)

// Graph is [A B] in both directions.
type Graph struct {
	N, K int
	// Rows: row v lists its columns; Cols: column c lists its rows.
	Rows, Cols matching.CSR
}

// New builds [A B] from in (row v lists the u with u -> v) and the
// signals' states. A signal listing a state twice is adjacent to it once.
func New(in *matching.CSR, signals [][]int32) *Graph {
	n, k := in.Rows, len(signals)
	extra := make([]int64, n+1)
	mark := make([]int32, n)
	for i, s := range signals {
		for _, v := range s {
			if mark[v] != int32(i+1) {
				mark[v] = int32(i + 1)
				extra[v+1]++
			}
		}
	}
	g := &Graph{N: n, K: k}
	r := &g.Rows
	r.Rows, r.Cols = n, n+k
	r.Ptr = make([]int64, n+1)
	for v := 0; v < n; v++ {
		r.Ptr[v+1] = r.Ptr[v] + (in.Ptr[v+1] - in.Ptr[v]) + extra[v+1]
	}
	r.Adj = make([]int32, r.Ptr[n])
	pos := extra[:n]
	for v := 0; v < n; v++ {
		c := copy(r.Adj[r.Ptr[v]:], in.Adj[in.Ptr[v]:in.Ptr[v+1]])
		pos[v] = r.Ptr[v] + int64(c)
		mark[v] = 0
	}
	for i, s := range signals {
		for _, v := range s {
			if mark[v] != int32(i+1) {
				mark[v] = int32(i + 1)
				r.Adj[pos[v]] = int32(n + i)
				pos[v]++
			}
		}
	}
	g.Cols = *matching.Transpose(r)
	return g
}

// Match returns a maximum matching of g.
func (g *Graph) Match() *matching.Matching { return matching.Maximum(&g.Rows, &g.Cols) }

// Freeable marks the columns some maximum matching leaves unmatched: the
// free columns of m and every column reached from one by an even
// alternating path (a row adjacent to a free column can move to it,
// freeing its own mate). Time O(E).
func (g *Graph) Freeable(m *matching.Matching) []bool {
	free := make([]bool, g.N+g.K)
	q := make([]int32, 0, 64)
	for c := range free {
		if m.ColMate[c] < 0 {
			free[c] = true
			q = append(q, int32(c))
		}
	}
	for h := 0; h < len(q); h++ {
		for _, r := range g.Cols.Row(q[h]) {
			if c := m.RowMate[r]; c >= 0 && !free[c] {
				free[c] = true
				q = append(q, c)
			}
		}
	}
	return free
}

// RowDigraph returns the digraph on rows with an arc r -> r' whenever r is
// adjacent to the column matched to r' (r could take that column, and r'
// would need another): the alternating paths of m between rows. Its cycles
// are the alternating cycles of m.
func (g *Graph) RowDigraph(m *matching.Matching) *matching.CSR {
	n := g.N
	d := &matching.CSR{Rows: n, Cols: n, Ptr: make([]int64, n+1)}
	for r := 0; r < n; r++ {
		for _, c := range g.Rows.Row(int32(r)) {
			if x := m.ColMate[c]; x >= 0 && x != int32(r) {
				d.Ptr[r+1]++
			}
		}
	}
	for r := 0; r < n; r++ {
		d.Ptr[r+1] += d.Ptr[r]
	}
	d.Adj = make([]int32, d.Ptr[n])
	k := 0
	for r := 0; r < n; r++ {
		for _, c := range g.Rows.Row(int32(r)) {
			if x := m.ColMate[c]; x >= 0 && x != int32(r) {
				d.Adj[k] = x
				k++
			}
		}
	}
	return d
}
