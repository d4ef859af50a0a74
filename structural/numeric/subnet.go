package numeric

import (
	"slices"

	"github.com/netsteer/netsteer/structural"
)

// Around returns, in increasing order, the states within hops steps of the
// centres, following edges in either direction.
func Around(g *structural.Network, centres []int32, hops int) []int32 {
	n := g.N()
	dist := make([]int32, n)
	for i := range dist {
		dist[i] = -1
	}
	queue := make([]int32, 0, 64)
	for _, c := range centres {
		if dist[c] < 0 {
			dist[c] = 0
			queue = append(queue, c)
		}
	}
	for i := 0; i < len(queue); i++ {
		u := queue[i]
		if int(dist[u]) >= hops {
			continue
		}
		for _, row := range [2][]int32{g.Out.Row(u), g.In.Row(u)} {
			for _, v := range row {
				if dist[v] < 0 {
					dist[v] = dist[u] + 1
					queue = append(queue, v)
				}
			}
		}
	}
	slices.Sort(queue)
	return queue
}

// Nearest returns, in increasing order, the first k states met by one
// breadth-first search that starts at the driven states (down) and walks
// along the edges, and at the sensed states (up) and walks against them:
// the part of the network the signals act on, or observe, most directly.
func Nearest(g *structural.Network, down, up []int32, k int) []int32 {
	const (
		fwd = 1
		bwd = 2
	)
	type item struct {
		v int32
		d uint8
	}
	dir := make([]uint8, g.N())
	kept := make([]int32, 0, min(k, g.N()))
	var work []item
	visit := func(v int32, d uint8) {
		if dir[v]&d != 0 {
			return
		}
		if dir[v] == 0 {
			if len(kept) == k {
				return
			}
			kept = append(kept, v)
		}
		dir[v] |= d
		work = append(work, item{v, d})
	}
	for _, v := range down {
		visit(v, fwd)
	}
	for _, v := range up {
		visit(v, bwd)
	}
	for i := 0; i < len(work) && len(kept) < k; i++ {
		it := work[i]
		row := g.Out.Row(it.v)
		if it.d == bwd {
			row = g.In.Row(it.v)
		}
		for _, v := range row {
			visit(v, it.d)
		}
	}
	slices.Sort(kept)
	return kept
}

// Induced returns the subnetwork of g on the states keep (increasing, no
// repeats), with their names and, when g has them, its edge weights, and
// the new index of every state of g (-1 for the states left out).
func Induced(g *structural.Network, keep []int32) (*structural.Network, []int32, error) {
	n := g.N()
	newOf := make([]int32, n)
	for i := range newOf {
		newOf[i] = -1
	}
	b := structural.NewBuilder()
	for _, v := range keep {
		id, err := b.Intern([]byte(g.Name(v)))
		if err != nil {
			return nil, nil, err
		}
		newOf[v] = id
	}
	for _, u := range keep {
		for k := g.Out.Ptr[u]; k < g.Out.Ptr[u+1]; k++ {
			v := g.Out.Adj[k]
			if newOf[v] < 0 {
				continue
			}
			if g.OutW != nil {
				b.AddWeightedEdge(newOf[u], newOf[v], g.OutW[k])
			} else {
				b.AddEdge(newOf[u], newOf[v])
			}
		}
	}
	sub, err := b.Build(structural.BuildOptions{})
	if err != nil {
		return nil, nil, err
	}
	return sub, newOf, nil
}

// Restrict maps signals (and their weights, when not nil) to a subnetwork:
// states left out are dropped from each signal, and signals left with no
// state are dropped. It returns the number of signals dropped.
func Restrict(signals [][]int32, weights [][]float64, newOf []int32) ([][]int32, [][]float64, int) {
	var out [][]int32
	var outW [][]float64
	dropped := 0
	for j, s := range signals {
		var ns []int32
		var nw []float64
		for i, v := range s {
			if newOf[v] >= 0 {
				ns = append(ns, newOf[v])
				if weights != nil && weights[j] != nil {
					nw = append(nw, weights[j][i])
				}
			}
		}
		if len(ns) == 0 {
			dropped++
			continue
		}
		out = append(out, ns)
		if weights != nil {
			outW = append(outW, nw)
		}
	}
	return out, outW, dropped
}
