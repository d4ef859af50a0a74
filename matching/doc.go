// Package matching computes maximum matchings of bipartite graphs stored in
// compressed sparse rows, and the decompositions built on them.
//
// Conventions. A bipartite graph is a CSR: row r is adjacent to the columns
// Adj[Ptr[r]:Ptr[r+1]]. Rows and columns are numbered from 0 and indices are
// int32, so a graph holds at most 2^31-1 rows, columns and edges. A directed
// network with an edge u -> v ("u acts on v") is the bipartite graph whose row
// u is adjacent to column v: the rows are the out-copies of the states and the
// columns their in-copies. A matching pairs rows with columns; a column left
// unmatched is a state with no matched incoming edge, that is a driver node in
// the sense of Liu, Slotine & Barabási (2011).
//
// A Matching records the mate of every row and column, -1 for unmatched.
// All traversals are iterative: deep alternating paths cost heap memory, not
// goroutine stack.
package matching
