package transform

import (
	"math"
	"math/rand/v2"
	"slices"

	"github.com/netsteer/netsteer/structural"
)

// DropEdges returns g with each edge removed independently with
// probability p (random link failures). All states stay.
func DropEdges(g *structural.Network, p float64, rng *rand.Rand) (*structural.Network, error) {
	src, dst, w := edgeArrays(g)
	k := 0
	for i := range src {
		if rng.Float64() < p {
			continue
		}
		src[k], dst[k] = src[i], dst[i]
		if w != nil {
			w[k] = w[i]
		}
		k++
	}
	if w != nil {
		w = w[:k]
	}
	return g.WithEdges(src[:k], dst[:k], w)
}

// AddSelfLoops returns g with a self-loop added, with probability p, to
// each state that has none (p = 1: every state gets its own dynamics).
func AddSelfLoops(g *structural.Network, p float64, rng *rand.Rand) (*structural.Network, error) {
	src, dst, w := edgeArrays(g)
	for u := 0; u < g.N(); u++ {
		if hasLoop(g, int32(u)) || rng.Float64() >= p {
			continue
		}
		src = append(src, int32(u))
		dst = append(dst, int32(u))
		if w != nil {
			w = append(w, 1)
		}
	}
	return g.WithEdges(src, dst, w)
}

func hasLoop(g *structural.Network, u int32) bool {
	_, ok := slices.BinarySearch(g.Succ(u), u)
	return ok
}

// RemoveStates returns g without round(f N) states chosen uniformly at
// random, and without their edges (random failures of nodes).
func RemoveStates(g *structural.Network, f float64, rng *rand.Rand) (*structural.Network, error) {
	n := g.N()
	k := removeCount(n, f)
	order := make([]int32, n)
	for i := range order {
		order[i] = int32(i)
	}
	for i := 0; i < k; i++ { // partial Fisher–Yates
		j := i + rng.IntN(n-i)
		order[i], order[j] = order[j], order[i]
	}
	return withoutStates(g, order[:k])
}

// AttackStates returns g without the round(f N) states of highest total
// degree (in plus out), ties broken at random: a targeted attack (Albert,
// Jeong & Barabási, Nature 406:378, 2000).
func AttackStates(g *structural.Network, f float64, rng *rand.Rand) (*structural.Network, error) {
	n := g.N()
	k := removeCount(n, f)
	tie := make([]uint32, n)
	order := make([]int32, n)
	for i := range order {
		order[i] = int32(i)
		tie[i] = rng.Uint32()
	}
	deg := func(v int32) int { return len(g.Succ(v)) + len(g.Pred(v)) }
	slices.SortFunc(order, func(a, b int32) int {
		if da, db := deg(a), deg(b); da != db {
			return db - da
		}
		if tie[a] != tie[b] {
			if tie[a] < tie[b] {
				return -1
			}
			return 1
		}
		return int(a - b)
	})
	return withoutStates(g, order[:k])
}

func removeCount(n int, f float64) int {
	return min(n, int(math.Round(f*float64(n))))
}

// withoutStates returns g less the listed states and their edges; the
// survivors keep their names and their order.
func withoutStates(g *structural.Network, gone []int32) (*structural.Network, error) {
	n := g.N()
	if len(gone) >= n {
		return nil, errNoStates
	}
	newID := make([]int32, n)
	for _, v := range gone {
		newID[v] = -1
	}
	b := structural.NewBuilder()
	var buf []byte
	for v := 0; v < n; v++ {
		if newID[v] < 0 {
			continue
		}
		buf = g.AppendName(buf[:0], int32(v))
		id, err := b.Intern(buf)
		if err != nil {
			return nil, err
		}
		newID[v] = id
	}
	var src, dst []int32
	var w []float64
	for u := 0; u < n; u++ {
		if newID[u] < 0 {
			continue
		}
		for k := g.Out().Ptr[u]; k < g.Out().Ptr[u+1]; k++ {
			v := g.Out().Adj[k]
			if newID[v] < 0 {
				continue
			}
			src = append(src, newID[u])
			dst = append(dst, newID[v])
			if g.Weights() != nil {
				w = append(w, g.Weights()[k])
			}
		}
	}
	b.AddEdges(src, dst, w)
	return b.Build(structural.BuildOptions{})
}
