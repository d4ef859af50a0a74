package gen

import (
	"math/rand/v2"
)

// Side says which degrees a regular network fixes.
type Side int

const (
	// Both fixes in- and out-degree: every state has d sources and d
	// targets.
	Both Side = iota
	// Out fixes the out-degree: every state acts on d distinct states
	// chosen uniformly, so in-degrees are binomial (about Poisson(d)).
	Out
	// In fixes the in-degree: every state is acted on by d distinct
	// states chosen uniformly.
	In
)

// ParseSide reads "both", "out" or "in".
func ParseSide(s string) (Side, error) {
	switch s {
	case "both", "":
		return Both, nil
	case "out":
		return Out, nil
	case "in":
		return In, nil
	}
	return 0, errorf("regular side %q: want both, out or in", s)
}

func (s Side) String() string {
	switch s {
	case Out:
		return "out"
	case In:
		return "in"
	}
	return "both"
}

// Regular emits a random directed network of n states in which every state
// has degree d on the chosen side(s), with no self-loops or repeats.
//
// For Both, the edges start as the union of d random permutations (u ->
// σ_k(u)), which fixes every in- and out-degree at d; self-loops and
// repeats are then removed by degree-preserving swaps with random edges.
// For Out (In), each state picks d distinct targets (sources) uniformly.
// Time O(n d), memory 4 n d bytes.
func Regular(n, d int, side Side, rng *rand.Rand, sink Sink) error {
	if n < 1 || n > maxStates {
		return errorf("nodes %d out of range [1, %d]", n, maxStates)
	}
	if d < 0 || d > n-1 {
		return errorf("degree %d out of range [0, %d] for %d states", d, n-1, n)
	}
	if int64(n)*int64(d) > maxEdges {
		return errorf("%d edges exceed the limit of %d", int64(n)*int64(d), int64(maxEdges))
	}
	if d == 0 {
		return nil
	}
	switch side {
	case Out, In:
		mark := make([]int32, n) // mark[v] == u+1: v already picked for u
		row := make([]int32, 0, d)
		for u := 0; u < n; u++ {
			row = row[:0]
			stamp := int32(u + 1)
			mark[u] = stamp // no self-loop
			for len(row) < d {
				v := int32(rng.IntN(n))
				if mark[v] == stamp {
					continue
				}
				mark[v] = stamp
				row = append(row, v)
			}
			for _, v := range row {
				if side == Out {
					sink.AddEdge(int32(u), v)
				} else {
					sink.AddEdge(v, int32(u))
				}
			}
		}
		return nil
	}
	if d == n-1 { // the complete digraph, the only such network
		for u := 0; u < n; u++ {
			for v := 0; v < n; v++ {
				if u != v {
					sink.AddEdge(int32(u), int32(v))
				}
			}
		}
		return nil
	}
	// Both: out[u*d+k] is the k-th target of u.
	out := make([]int32, n*d)
	perm := make([]int32, n)
	for k := 0; k < d; k++ {
		permute(rng, perm)
		for u := 0; u < n; u++ {
			out[u*d+k] = perm[u]
		}
	}
	row := func(u int32) []int32 { return out[int(u)*d : int(u)*d+d] }
	has := func(u, v int32) bool {
		for _, x := range row(u) {
			if x == v {
				return true
			}
		}
		return false
	}
	// bad lists slots holding a self-loop or a repeat within their row.
	var bad []int
	mark := make([]int32, n)
	for u := 0; u < n; u++ {
		stamp := int32(u + 1)
		for k, v := range row(int32(u)) {
			if int(v) == u || mark[v] == stamp {
				bad = append(bad, u*d+k)
				continue
			}
			mark[v] = stamp
		}
	}
	mark = nil
	total := n * d
	for _, slot := range bad {
		u := int32(slot / d)
		for tries := 0; ; tries++ {
			if tries > 1000000 {
				return errorf("cannot remove self-loops and repeats from a %d-regular network of %d states", d, n)
			}
			v := out[slot]
			other := rng.IntN(total)
			x := int32(other / d)
			y := out[other]
			// Swap targets: u -> y and x -> v replace u -> v and x -> y.
			if x == u || y == v || y == u || v == x || has(u, y) || has(x, v) {
				continue
			}
			out[slot], out[other] = y, v
			// The slot is good now unless v still repeats in u's row or
			// was a self-loop; those other copies are in bad already or
			// stay valid, since the row kept them.
			break
		}
	}
	for u := 0; u < n; u++ {
		for _, v := range row(int32(u)) {
			sink.AddEdge(int32(u), v)
		}
	}
	return nil
}
