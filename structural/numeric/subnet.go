package numeric

import (
	"slices"

	"github.com/netsteer/netsteer/structural"
)

// Around returns, in increasing order, the states met by a breadth-first
// search from the centres that follows edges in either direction, going at
// most hops steps (hops < 0: no limit) and stopping once limit states are
// kept (limit <= 0: no limit). It is a connected piece of the network
// around the centres, for verifying a part of a network too large to
// verify whole.
func Around(g *structural.Network, centres []int32, hops, limit int) []int32 {
	n := g.N()
	if limit <= 0 {
		limit = n
	}
	dist := make([]int32, n)
	for i := range dist {
		dist[i] = -1
	}
	queue := make([]int32, 0, min(limit, 1024))
	for _, c := range centres {
		if dist[c] < 0 && len(queue) < limit {
			dist[c] = 0
			queue = append(queue, c)
		}
	}
	for i := 0; i < len(queue) && len(queue) < limit; i++ {
		u := queue[i]
		if hops >= 0 && int(dist[u]) >= hops {
			continue
		}
		for _, row := range [2][]int32{g.Succ(u), g.Pred(u)} {
			for _, v := range row {
				if dist[v] < 0 && len(queue) < limit {
					dist[v] = dist[u] + 1
					queue = append(queue, v)
				}
			}
		}
	}
	slices.Sort(queue)
	return queue
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
		for k := g.Out().Ptr[u]; k < g.Out().Ptr[u+1]; k++ {
			v := g.Out().Adj[k]
			if newOf[v] < 0 {
				continue
			}
			if g.Weights() != nil {
				b.AddWeightedEdge(newOf[u], newOf[v], g.Weights()[k])
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
