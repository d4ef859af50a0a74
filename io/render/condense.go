package render

import (
	"fmt"
	"sort"
)

// condensationView draws one node per strongly connected component. When
// there are more components than MaxNodes, the components of two or more
// states are drawn one by one, largest first, and the rest are summarised
// in up to three nodes: source components, sink components and the others.
// O(N + E) time; memory O(N) plus the drawn edges.
func condensationView(in *Input, opt Options) *View {
	g := in.Net
	c := in.Components
	n := g.N()
	size := make([]int32, c.Count)
	first := make([]int32, c.Count)
	for i := range first {
		first[i] = -1
	}
	for v := n - 1; v >= 0; v-- {
		k := c.Of[v]
		size[k]++
		first[k] = int32(v)
	}
	isSource := c.Source
	isSink := make([]bool, c.Count)
	for k := range isSink {
		isSink[k] = true
	}
	for u := 0; u < n; u++ {
		cu := c.Of[u]
		for _, w := range g.Succ(int32(u)) {
			if c.Of[w] != cu {
				isSink[cu] = false
				break
			}
		}
	}

	// Which components get a node of their own.
	max := opt.maxNodes()
	node := make([]int32, c.Count) // component -> index in comps
	var comps []CompNode
	if c.Count <= max {
		for k := 0; k < c.Count; k++ {
			node[k] = int32(k)
		}
		comps = make([]CompNode, c.Count)
		for k := range comps {
			comps[k] = CompNode{Component: int32(k), Components: 1}
		}
	} else {
		var big []int32
		for k := 0; k < c.Count; k++ {
			if size[k] >= 2 {
				big = append(big, int32(k))
			}
		}
		sort.Slice(big, func(a, b int) bool {
			ka, kb := big[a], big[b]
			if size[ka] != size[kb] {
				return size[ka] > size[kb]
			}
			return first[ka] < first[kb]
		})
		if keep := max - 3; len(big) > keep {
			big = big[:maxInt(keep, 0)]
		}
		for k := range node {
			node[k] = -1
		}
		// Own nodes in order of their first state, so the DOT text
		// follows the input.
		sort.Slice(big, func(a, b int) bool { return first[big[a]] < first[big[b]] })
		for _, k := range big {
			node[k] = int32(len(comps))
			comps = append(comps, CompNode{Component: k, Components: 1})
		}
		bucket := [3]int32{-1, -1, -1}
		names := [3]string{"source", "sink", "other"}
		for k := 0; k < c.Count; k++ {
			if node[k] >= 0 {
				continue
			}
			b := 2
			switch {
			case isSource[k]:
				b = 0
			case isSink[k]:
				b = 1
			}
			if bucket[b] < 0 {
				bucket[b] = int32(len(comps))
				comps = append(comps, CompNode{Component: -1, Summary: names[b]})
			}
			node[k] = bucket[b]
			comps[bucket[b]].Components++
		}
	}

	// Per-node counts.
	driven := markAll(n, in.inputs)
	sensed := markAll(n, in.outputs)
	unreached := markAll(n, [][]int32{in.unreached})
	unobserved := markAll(n, [][]int32{in.unobserved})
	groupOf := func(int32) string { return "" }
	if in.Group != nil {
		groupOf = in.Group
	}
	mixed := make([]bool, len(comps))
	for i := range comps {
		comps[i].First = -1
	}
	for v := 0; v < n; v++ {
		k := c.Of[v]
		cn := &comps[node[k]]
		cn.States++
		if cn.First < 0 {
			cn.First = int32(v)
			cn.Group = groupOf(int32(v))
		} else if !mixed[node[k]] && cn.Group != groupOf(int32(v)) {
			mixed[node[k]] = true
			cn.Group = ""
		}
		if driven[v] {
			cn.Driven++
		}
		if sensed[v] {
			cn.Sensed++
		}
		if unreached[v] {
			cn.Unreached++
		}
		if unobserved[v] {
			cn.Unobserved++
		}
	}
	for i := range comps {
		if k := comps[i].Component; k >= 0 {
			comps[i].Source, comps[i].Sink = isSource[k], isSink[k]
		} else {
			comps[i].Source, comps[i].Sink = comps[i].Summary == "source", comps[i].Summary == "sink"
		}
	}
	// Ranks by size among the drawn components of two or more states.
	var ranked []int
	for i := range comps {
		if comps[i].Component >= 0 && comps[i].States >= 2 {
			ranked = append(ranked, i)
		}
	}
	sort.SliceStable(ranked, func(a, b int) bool { return comps[ranked[a]].States > comps[ranked[b]].States })
	for r, i := range ranked {
		comps[i].Rank = r + 1
	}

	// Edges between nodes, counted in a map keyed by node pair: the drawn nodes are few, but a caller may
	// ask for many.
	type pair struct{ a, b int32 }
	type tally struct{ count, stems int }
	cells := map[pair]*tally{}
	for u := 0; u < n; u++ {
		a := node[c.Of[u]]
		for _, w := range g.Succ(int32(u)) {
			b := node[c.Of[w]]
			if a == b {
				continue
			}
			t := cells[pair{a, b}]
			if t == nil {
				t = &tally{}
				cells[pair{a, b}] = t
			}
			t.count++
			if in.edgeKind(int32(u), w) == stemEdge {
				// A matched edge between components is never on a
				// cycle: it lies on a stem.
				t.stems++
			}
		}
	}
	edges := make([]CompEdge, 0, len(cells))
	for p, t := range cells {
		edges = append(edges, CompEdge{From: p.a, To: p.b, Count: t.count, Stems: t.stems})
	}
	sort.Slice(edges, func(a, b int) bool {
		if edges[a].From != edges[b].From {
			return edges[a].From < edges[b].From
		}
		return edges[a].To < edges[b].To
	})
	v := &View{Kind: Components, Comps: comps, EdgesTotal: len(edges)}
	if len(edges) > opt.maxEdges() {
		sort.SliceStable(edges, func(a, b int) bool {
			if (edges[a].Stems > 0) != (edges[b].Stems > 0) {
				return edges[a].Stems > 0
			}
			return edges[a].Count > edges[b].Count
		})
		edges = edges[:opt.maxEdges()]
		sort.Slice(edges, func(a, b int) bool {
			if edges[a].From != edges[b].From {
				return edges[a].From < edges[b].From
			}
			return edges[a].To < edges[b].To
		})
	}
	v.CompEdges = edges
	nc := len(comps)
	own := 0
	for _, cn := range comps {
		if cn.Component >= 0 {
			own++
		}
	}
	switch {
	case own == c.Count:
		v.Desc = fmt.Sprintf("condensation: %s strongly connected %s, one node each", num(c.Count), plural(c.Count, "component", "components"))
	case own == 0:
		v.Desc = fmt.Sprintf("condensation: %s strongly connected components, summarised in %d %s",
			num(c.Count), nc, plural(nc, "node", "nodes"))
	default:
		v.Desc = fmt.Sprintf("condensation: %s strongly connected components; the %s largest drawn one by one, the other %s summarised in %d %s",
			num(c.Count), num(own), num(c.Count-own), nc-own, plural(nc-own, "node", "nodes"))
	}
	return v
}

func maxInt(a, b int) int {
	if a > b {
		return a
	}
	return b
}

// markAll marks every state named in lists.
func markAll(n int, lists [][]int32) []bool {
	m := make([]bool, n)
	for _, l := range lists {
		for _, v := range l {
			m[v] = true
		}
	}
	return m
}
