package gen

import (
	"math/rand/v2"
)

// Tree emits a leader-follower hierarchy of n states rooted at state 0:
// every other state i follows one leader, and the leader acts on it
// (leader -> i). With branching b >= 1 the hierarchy is the complete b-ary
// tree in breadth-first order (leader (i-1)/b; b = 1 is a chain); with b =
// 0 each state follows a uniformly random earlier state (a random recursive
// tree). With twoWay every follower also reports to its leader (i ->
// leader). Time O(n).
func Tree(n, branching int, twoWay bool, rng *rand.Rand, sink Sink) error {
	if n < 1 || n > maxStates {
		return errorf("nodes %d out of range [1, %d]", n, maxStates)
	}
	if branching < 0 {
		return errorf("branching %d is negative", branching)
	}
	for i := 1; i < n; i++ {
		var leader int
		if branching > 0 {
			leader = (i - 1) / branching
		} else {
			leader = rng.IntN(i)
		}
		sink.AddEdge(int32(leader), int32(i))
		if twoWay {
			sink.AddEdge(int32(i), int32(leader))
		}
	}
	return nil
}
