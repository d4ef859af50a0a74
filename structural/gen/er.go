package gen

import (
	"math/rand/v2"
)

// ER emits a uniformly random directed network with n states and exactly l
// edges, no self-loops and no repeated edges: the directed Erdős–Rényi
// model G(N, L). Edges are emitted sorted by source, then target.
//
// The l edges are a uniform l-subset of the n(n-1) possible ones, drawn as
// distinct integer codes and radix-sorted; when l exceeds half of them the
// complement is drawn instead. Time O(n + l), memory about 24 bytes per
// edge.
func ER(n int, l int64, rng *rand.Rand, sink Sink) error {
	if n < 1 || n > maxStates {
		return errorf("nodes %d out of range [1, %d]", n, maxStates)
	}
	m := uint64(n) * uint64(n-1) // possible edges, no self-loops
	if l < 0 || uint64(l) > m {
		return errorf("%d edges do not fit in %d states without self-loops or repeats (at most %d)", l, n, m)
	}
	if l > maxEdges {
		return errorf("%d edges exceed the limit of %d", l, int64(maxEdges))
	}
	if l == 0 {
		return nil
	}
	nn := uint64(n)
	// Code x in [0, n(n-1)) is source x/(n-1) and the target x%(n-1),
	// shifted past the source.
	emit := func(x uint64) {
		u := x / (nn - 1)
		v := x % (nn - 1)
		if v >= u {
			v++
		}
		sink.AddEdge(int32(u), int32(v))
	}
	complement := uint64(l) > m/2
	k := int(l)
	if complement {
		k = int(m - uint64(l))
	}
	codes, err := distinct(k, m-1, func() uint64 { return rng.Uint64N(m) })
	if err != nil {
		return err
	}
	if !complement {
		for _, x := range codes {
			emit(x)
		}
		return nil
	}
	j := 0
	for x := uint64(0); x < m; x++ {
		if j < len(codes) && codes[j] == x {
			j++
			continue
		}
		emit(x)
	}
	return nil
}

// maxStates and maxEdges are the int32 limits of structural.Network.
const (
	maxStates = 1<<31 - 2
	maxEdges  = 1<<31 - 1
)
