package target

import (
	"cmp"
	"slices"

	"github.com/netsteer/netsteer/structural"
)

// exactActuators searches the sets of new devices for one cheaper (then
// smaller) than best, by branch and bound: candidates (allowed states
// without a device) in increasing cost, sets enumerated as increasing
// sequences, a branch cut when its cost reaches the best found, when its
// set is proved enough (its supersets cost more), or when the set with
// every remaining candidate added is refuted by a proved upper bound
// (adding signals never lowers the rank, so no subset can do better). Each
// set is proved by a sample or refuted by an upper bound; a set whose
// whole sample falls short is counted as an unsure rejection, and a set
// that the work limits left unjudged as a stopped one. It returns the
// better design found (nil if none) and whether the search ran to the end
// with no stopped rejection, which proves the result optimal. Designs: at
// most 2^c for c candidates.
func exactActuators(r *region, o *oracle, best *design, maxCand, maxNodes int) (*design, bool) {
	var cand []int32
	for v := int32(0); int(v) < r.n; v++ {
		if r.dev.Allowed(v) && !r.dev.Has(v) {
			cand = append(cand, v)
		}
	}
	if maxCand < 0 || len(cand) > maxCand {
		return nil, false
	}
	slices.SortStableFunc(cand, func(a, b int32) int { return cmp.Compare(r.dev.CostOf(a), r.dev.CostOf(b)) })
	ex := r.existing()
	stopped := o.stopped
	bestCost, bestCount := best.cost, len(best.added)
	var found *design
	nodes := 0
	aborted := false
	try := func(set []int32, cost structural.Cost) bool {
		if o.accept(dedicated(slices.Concat(ex, set))) {
			found = &design{added: slices.Clone(set), cost: cost, method: "exact_search", proof: "sampled_rank"}
			found.signals = dedicated(slices.Concat(ex, found.added))
			bestCost, bestCount = cost, len(set)
			return true
		}
		return false
	}
	if bestCost > 0 || bestCount > 0 {
		if try(nil, 0) {
			return found, true
		}
	}
	var dfs func(i int, set []int32, cost structural.Cost)
	dfs = func(i int, set []int32, cost structural.Cost) {
		for j := i; j < len(cand) && !aborted; j++ {
			c := cost + r.dev.CostOf(cand[j])
			if c > bestCost || c == bestCost && len(set)+1 >= bestCount {
				break // candidates only get dearer
			}
			nodes++
			if nodes > maxNodes {
				aborted = true
				return
			}
			next := append(set, cand[j])
			if try(next, c) {
				continue
			}
			if j+1 < len(cand) && o.possible(dedicated(slices.Concat(ex, next, cand[j+1:]))) {
				dfs(j+1, next, c)
			}
		}
	}
	dfs(0, nil, 0)
	return found, !aborted && o.stopped == stopped
}

// exactSignals finds the fewest signals: k signals that each drive every
// state of the region steer the targets exactly when some design of k
// signals does (more nonzeros never lower a generic rank), so k runs up
// from the lower bound until a sample proves it or the best known count is
// reached (a k whose whole sample falls short counts as an unsure
// rejection; a k the work limits left unjudged, as a stopped one, and the
// search then reports that it did not finish). The design found is then
// thinned: states are dropped from the signals one by one while a sample
// still proves the rest enough.
func exactSignals(r *region, o *oracle, best *design, lower int) (*design, bool) {
	all := make([]int32, r.n)
	for i := range all {
		all[i] = int32(i)
	}
	done := true
	for k := max(lower, 1); k < len(best.signals); k++ {
		sig := make([][]int32, k)
		for i := range sig {
			sig[i] = slices.Clone(all)
		}
		switch o.judge(sig) {
		case proved:
		case refuted:
			continue
		case short:
			o.unsure++
			continue
		default:
			o.stopped++
			done = false
			continue
		}
		// Thin the dense design.
		for i := range sig {
			for j := 0; j < len(sig[i]); {
				if len(sig[i]) == 1 {
					break
				}
				trial := slices.Clone(sig)
				trial[i] = slices.Delete(slices.Clone(sig[i]), j, j+1)
				if o.judge(trial) == proved {
					sig = trial
					continue
				}
				j++
			}
		}
		return &design{signals: sig, method: "exact_search", proof: "sampled_rank"}, done
	}
	return nil, done
}
