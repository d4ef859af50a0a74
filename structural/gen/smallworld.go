package gen

import (
	"math/rand/v2"
)

// SmallWorld emits a directed small-world network in the manner of Watts &
// Strogatz (Nature 393:440, 1998): n states on a ring, each acting on its k
// successors (u -> u+1, ..., u+k mod n), or with twoWay on its k/2
// successors and k/2 predecessors (k even); then each edge's target is
// replaced, with probability p, by a uniformly random state that u does not
// yet act on and that is not u. Out-degrees stay k; p = 0 is the ring
// lattice and p = 1 close to a random network. Time O(n k).
func SmallWorld(n, k int, p float64, twoWay bool, rng *rand.Rand, sink Sink) error {
	if n < 1 || n > maxStates {
		return errorf("nodes %d out of range [1, %d]", n, maxStates)
	}
	if k < 0 || k > n-1 {
		return errorf("ring degree %d out of range [0, %d] for %d states", k, n-1, n)
	}
	if twoWay && k%2 != 0 {
		return errorf("a two-way ring needs an even out-degree, not %d", k)
	}
	if !(p >= 0 && p <= 1) {
		return errorf("rewiring probability %v out of [0, 1]", p)
	}
	if int64(n)*int64(k) > maxEdges {
		return errorf("%d edges exceed the limit of %d", int64(n)*int64(k), int64(maxEdges))
	}
	if k == 0 {
		return nil
	}
	mark := make([]int32, n) // mark[v] == u+1: u acts on v
	row := make([]int32, 0, k)
	for u := 0; u < n; u++ {
		stamp := int32(u + 1)
		row = row[:0]
		if twoWay {
			for j := 1; j <= k/2; j++ {
				row = append(row, int32((u+j)%n), int32((u-j+n)%n))
			}
		} else {
			for j := 1; j <= k; j++ {
				row = append(row, int32((u+j)%n))
			}
		}
		for _, v := range row {
			mark[v] = stamp
		}
		mark[u] = stamp
		for i, v := range row {
			if p == 0 || rng.Float64() >= p {
				continue
			}
			if len(row) >= n-1 {
				break // u already acts on every other state
			}
			for {
				w := int32(rng.IntN(n))
				if mark[w] != stamp {
					mark[w] = stamp
					mark[v] = 0
					row[i] = w
					break
				}
			}
		}
		for _, v := range row {
			sink.AddEdge(int32(u), v)
		}
	}
	return nil
}
