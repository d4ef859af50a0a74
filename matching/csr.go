package matching

import (
	"errors"
	"fmt"
)

// CSR is a bipartite graph in compressed sparse rows. Row r is adjacent to
// columns Adj[Ptr[r]:Ptr[r+1]]. Ptr has Rows+1 entries, non-decreasing, with
// Ptr[0] == 0 and Ptr[Rows] == len(Adj).
type CSR struct {
	Rows, Cols int
	Ptr        []int64
	Adj        []int32
}

// Row returns the columns adjacent to row r. The slice aliases g.Adj.
func (g *CSR) Row(r int32) []int32 { return g.Adj[g.Ptr[r]:g.Ptr[r+1]] }

// Degree returns the number of columns adjacent to row r.
func (g *CSR) Degree(r int32) int { return int(g.Ptr[r+1] - g.Ptr[r]) }

// Edges returns the number of stored edges.
func (g *CSR) Edges() int { return len(g.Adj) }

// Validate checks the structural invariants of g: pointer monotonicity and
// column indices in range. It is meant for graphs built outside this module.
func (g *CSR) Validate() error {
	if g.Rows < 0 || g.Cols < 0 {
		return errors.New("matching: negative dimension")
	}
	if len(g.Ptr) != g.Rows+1 {
		return fmt.Errorf("matching: Ptr has %d entries, want %d", len(g.Ptr), g.Rows+1)
	}
	if g.Ptr[0] != 0 || g.Ptr[g.Rows] != int64(len(g.Adj)) {
		return errors.New("matching: Ptr does not span Adj")
	}
	for r := 0; r < g.Rows; r++ {
		if g.Ptr[r+1] < g.Ptr[r] {
			return fmt.Errorf("matching: Ptr decreases at row %d", r)
		}
	}
	for i, c := range g.Adj {
		if c < 0 || int(c) >= g.Cols {
			return fmt.Errorf("matching: Adj[%d] = %d out of range [0,%d)", i, c, g.Cols)
		}
	}
	return nil
}

// Transpose returns the column-major copy of g: row c of the result lists the
// rows of g adjacent to column c, in increasing order when g's rows are
// scanned in order (always the case here).
func Transpose(g *CSR) *CSR {
	t := &CSR{Rows: g.Cols, Cols: g.Rows, Ptr: make([]int64, g.Cols+1), Adj: make([]int32, len(g.Adj))}
	for _, c := range g.Adj {
		t.Ptr[c+1]++
	}
	for c := 0; c < g.Cols; c++ {
		t.Ptr[c+1] += t.Ptr[c]
	}
	pos := make([]int64, g.Cols)
	copy(pos, t.Ptr[:g.Cols])
	for r := 0; r < g.Rows; r++ {
		for _, c := range g.Adj[g.Ptr[r]:g.Ptr[r+1]] {
			t.Adj[pos[c]] = int32(r)
			pos[c]++
		}
	}
	return t
}

// FromEdges builds a CSR with the given dimensions from parallel edge
// slices (rows[i], cols[i]). Duplicates are kept. It is a convenience for
// tests and small graphs.
func FromEdges(rows, cols int, er, ec []int32) *CSR {
	g := &CSR{Rows: rows, Cols: cols, Ptr: make([]int64, rows+1), Adj: make([]int32, len(er))}
	for _, r := range er {
		g.Ptr[r+1]++
	}
	for r := 0; r < rows; r++ {
		g.Ptr[r+1] += g.Ptr[r]
	}
	pos := make([]int64, rows)
	copy(pos, g.Ptr[:rows])
	for i, r := range er {
		g.Adj[pos[r]] = ec[i]
		pos[r]++
	}
	return g
}
