package transform

import (
	"math"
	"math/rand/v2"

	"github.com/netsteer/netsteer/structural"
)

// SwapEdges returns a degree-preserving randomisation of g: about perEdge
// × L attempts, each picking two edges a -> b and c -> d at random and
// replacing them with a -> d and c -> b unless that would make a self-loop
// or repeat an edge (Maslov & Sneppen, Science 296:910, 2002). Every
// state keeps its in- and out-degree; self-loops stay where they are.
// Ten or more swaps per edge are customary for mixing.
func SwapEdges(g *structural.Network, perEdge float64, rng *rand.Rand) (*structural.Network, error) {
	src, dst, w := edgeArrays(g)
	loopsSrc, loopsDst, loopsW := splitLoops(&src, &dst, &w)
	m := len(src)
	attempts := int64(math.Round(perEdge * float64(m)))
	if m >= 2 && attempts > 0 {
		set := newEdgeSet(m)
		for i := range src {
			set.add(src[i], dst[i])
		}
		for t := int64(0); t < attempts; t++ {
			i, j := rng.IntN(m), rng.IntN(m)
			a, b, c, d := src[i], dst[i], src[j], dst[j]
			if a == c || b == d || a == d || c == b {
				continue
			}
			if set.has(a, d) || set.has(c, b) {
				continue
			}
			set.remove(a, b)
			set.remove(c, d)
			set.add(a, d)
			set.add(c, b)
			dst[i], dst[j] = d, b
		}
	}
	return g.WithEdges(append(src, loopsSrc...), append(dst, loopsDst...), joinW(w, loopsW))
}

// RewireEdges returns g with each edge that is not a self-loop moved, with
// probability p, to a uniformly random place u -> v (u != v, not already an
// edge): N and L are kept, the degrees are not. p = 1 gives a G(N, L)
// network plus g's self-loops.
func RewireEdges(g *structural.Network, p float64, rng *rand.Rand) (*structural.Network, error) {
	src, dst, w := edgeArrays(g)
	loopsSrc, loopsDst, loopsW := splitLoops(&src, &dst, &w)
	n := g.N()
	m := len(src)
	if uint64(m) > uint64(n)*uint64(n-1) {
		return nil, errorf("cannot rewire %d edges among %d states", m, n)
	}
	set := newEdgeSet(m)
	for i := range src {
		set.add(src[i], dst[i])
	}
	// Pick the edges to move first, so that a moved edge may land where
	// another moved edge was.
	var moved []int
	for i := 0; i < m; i++ {
		if rng.Float64() < p {
			moved = append(moved, i)
			set.remove(src[i], dst[i])
		}
	}
	for _, i := range moved {
		for {
			u, v := int32(rng.IntN(n)), int32(rng.IntN(n))
			if u == v || set.has(u, v) {
				continue
			}
			set.add(u, v)
			src[i], dst[i] = u, v
			break
		}
	}
	return g.WithEdges(append(src, loopsSrc...), append(dst, loopsDst...), joinW(w, loopsW))
}

// splitLoops moves the self-loops out of the edge slices and returns them.
func splitLoops(src, dst *[]int32, w *[]float64) (ls, ld []int32, lw []float64) {
	s, d := *src, *dst
	k := 0
	for i := range s {
		if s[i] == d[i] {
			ls = append(ls, s[i])
			ld = append(ld, d[i])
			if *w != nil {
				lw = append(lw, (*w)[i])
			}
			continue
		}
		s[k], d[k] = s[i], d[i]
		if *w != nil {
			(*w)[k] = (*w)[i]
		}
		k++
	}
	*src, *dst = s[:k], d[:k]
	if *w != nil {
		*w = (*w)[:k]
	}
	return ls, ld, lw
}

func joinW(w, lw []float64) []float64 {
	if w == nil {
		return nil
	}
	return append(w, lw...)
}
