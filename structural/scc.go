package structural

import "github.com/netsteer/netsteer/matching"

// Components is a partition of the states into strongly connected
// components. Of[v] is the component of state v. Components are numbered in
// the order Tarjan's algorithm completes them, which is a reverse
// topological order of the condensation: an edge between two components
// always goes from a higher number to a lower one.
type Components struct {
	Of    []int32
	Count int
}

// SCC returns the strongly connected components of the directed graph g
// (row u lists the targets of u). It runs Tarjan's algorithm with an
// explicit stack in O(V + E) time and about 16 bytes per state.
func SCC(g *matching.CSR) Components {
	n := g.Rows
	index := make([]int32, n) // 0 = unvisited, else discovery index + 1
	low := make([]int32, n)
	of := make([]int32, n)
	for i := range of {
		of[i] = -1
	}
	next := make([]int64, n) // position in the row for the call stack
	call := make([]int32, 0, 64)
	stack := make([]int32, 0, 64)
	var counter int32
	count := int32(0)
	for root := 0; root < n; root++ {
		if index[root] != 0 {
			continue
		}
		call = append(call, int32(root))
		counter++
		index[root], low[root] = counter, counter
		next[root] = g.Ptr[root]
		stack = append(stack, int32(root))
		for len(call) > 0 {
			v := call[len(call)-1]
			end := g.Ptr[v+1]
			descended := false
			for next[v] < end {
				w := g.Adj[next[v]]
				next[v]++
				if index[w] == 0 {
					counter++
					index[w], low[w] = counter, counter
					next[w] = g.Ptr[w]
					stack = append(stack, w)
					call = append(call, w)
					descended = true
					break
				}
				if of[w] < 0 && index[w] < low[v] {
					low[v] = index[w]
				}
			}
			if descended {
				continue
			}
			call = call[:len(call)-1]
			if len(call) > 0 {
				p := call[len(call)-1]
				if low[v] < low[p] {
					low[p] = low[v]
				}
			}
			if low[v] == index[v] {
				for {
					w := stack[len(stack)-1]
					stack = stack[:len(stack)-1]
					of[w] = count
					if w == v {
						break
					}
				}
				count++
			}
		}
	}
	return Components{Of: of, Count: int(count)}
}

// Sources reports, for each component, whether it is a source component:
// no edge of g enters it from another component.
func (c Components) Sources(g *matching.CSR) []bool {
	src := make([]bool, c.Count)
	for i := range src {
		src[i] = true
	}
	for u := 0; u < g.Rows; u++ {
		cu := c.Of[u]
		for _, v := range g.Adj[g.Ptr[u]:g.Ptr[u+1]] {
			if c.Of[v] != cu {
				src[c.Of[v]] = false
			}
		}
	}
	return src
}
