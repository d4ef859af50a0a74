package render

import "math"

// autoLayout picks the layout for a view: the layered "dot" layout when the
// drawn graph is shallow, force-directed "sfdp" otherwise. Depth is the
// number of layers of a longest-path layering after the edges that close
// cycles (back edges of a depth-first search) are set aside, roughly what
// dot itself computes. Measured on the demo plant (46 states, 10 layers:
// dot reads well) and on random digraphs of three edges per node (100, 150
// and 200 states: 50, 73 and 109 layers; dot spread 150 of them over
// 6,700 x 4,200 points with most of the page empty, sfdp kept them on
// 1,900 x 1,800), a threshold of 2*sqrt(n)+4 layers separates the two.
func autoLayout(v *View) string {
	n, from, to := v.graph()
	if n == 0 {
		return "dot"
	}
	if depth(n, from, to) <= int(2*math.Sqrt(float64(n)))+4 {
		return "dot"
	}
	return "sfdp"
}

// graph returns the drawn graph as edges between nodes 0..n-1.
func (v *View) graph() (n int, from, to []int32) {
	if v.Kind == Components {
		for _, e := range v.CompEdges {
			from = append(from, e.From)
			to = append(to, e.To)
		}
		return len(v.Comps), from, to
	}
	pos := make(map[int32]int32, len(v.States))
	for i, s := range v.States {
		pos[s] = int32(i)
	}
	for _, e := range v.Edges {
		from = append(from, pos[e.From])
		to = append(to, pos[e.To])
	}
	return len(v.States), from, to
}

// depth returns the number of layers of a longest-path layering of the
// graph without its back edges. Iterative; O(n + m).
func depth(n int, from, to []int32) int {
	ptr := make([]int32, n+1)
	for _, u := range from {
		ptr[u+1]++
	}
	for i := 0; i < n; i++ {
		ptr[i+1] += ptr[i]
	}
	adj := make([]int32, len(from))
	fill := append([]int32(nil), ptr[:n]...)
	for i, u := range from {
		adj[fill[u]] = to[i]
		fill[u]++
	}
	// Depth-first search: state 0 new, 1 on the stack, 2 done. Finishing
	// order reversed is a topological order of the forward edges.
	state := make([]uint8, n)
	next := make([]int32, n)
	order := make([]int32, 0, n)
	stack := make([]int32, 0, 16)
	for r := 0; r < n; r++ {
		if state[r] != 0 {
			continue
		}
		state[r] = 1
		next[r] = ptr[r]
		stack = append(stack, int32(r))
		for len(stack) > 0 {
			u := stack[len(stack)-1]
			if next[u] < ptr[u+1] {
				w := adj[next[u]]
				next[u]++
				if state[w] == 0 {
					state[w] = 1
					next[w] = ptr[w]
					stack = append(stack, w)
				}
				continue
			}
			state[u] = 2
			order = append(order, u)
			stack = stack[:len(stack)-1]
		}
	}
	// Longest path over the forward edges in topological order (reverse
	// finishing order, position at[]); a back edge points to an earlier
	// position and is skipped, as is a self-loop.
	rank := make([]int32, n)
	at := make([]int32, n)
	for i, u := range order {
		at[u] = int32(n - 1 - i)
	}
	layers := int32(0)
	for i := n - 1; i >= 0; i-- {
		u := order[i]
		for _, w := range adj[ptr[u]:ptr[u+1]] {
			if at[w] > at[u] && rank[u]+1 > rank[w] {
				rank[w] = rank[u] + 1
			}
		}
		if rank[u]+1 > layers {
			layers = rank[u] + 1
		}
	}
	return int(layers)
}
