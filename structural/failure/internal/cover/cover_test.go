package cover

import (
	"math/rand/v2"
	"testing"
)

// brute returns the least cover cost by trying every candidate subset.
func brute(in Instance) (int64, bool) {
	nc := len(in.Cost)
	best, ok := int64(0), false
	for m := 0; m < 1<<nc; m++ {
		all := true
		for _, s := range in.Sets {
			hit := false
			for _, x := range s {
				if m&(1<<x) != 0 {
					hit = true
					break
				}
			}
			if !hit {
				all = false
				break
			}
		}
		if !all {
			continue
		}
		var c int64
		for x := 0; x < nc; x++ {
			if m&(1<<x) != 0 {
				c += in.Cost[x]
			}
		}
		if !ok || c < best {
			best, ok = c, true
		}
	}
	return best, ok
}

// Greedy within its H(d) guarantee (Chvátal 1979) and its lower bound
// below the optimum; Exact equal to the optimum; both against exhaustive
// search on thousands of random instances.
func TestAgainstBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(1979, 4))
	for trial := 0; trial < 3000; trial++ {
		nc := 1 + rng.IntN(10)
		in := Instance{Cost: make([]int64, nc)}
		for x := range in.Cost {
			in.Cost[x] = int64(rng.IntN(6)) * 1000
		}
		for j := rng.IntN(9); j >= 0; j-- {
			var s []int32
			for x := 0; x < nc; x++ {
				if rng.Float64() < 0.3 {
					s = append(s, int32(x))
				}
			}
			in.Sets = append(in.Sets, s)
		}
		opt, ok := brute(in)
		g := Greedy(in)
		if g.Feasible != ok {
			t.Fatalf("trial %d: feasible %v, brute force %v", trial, g.Feasible, ok)
		}
		if !ok {
			continue
		}
		covers := func(r Result) bool {
			for _, s := range in.Sets {
				hit := false
				for _, x := range s {
					for _, y := range r.Chosen {
						hit = hit || x == y
					}
				}
				if !hit {
					return false
				}
			}
			var c int64
			for _, y := range r.Chosen {
				c += in.Cost[y]
			}
			return c == r.Cost
		}
		if !covers(g) || g.Cost < opt || float64(g.Cost) > g.Factor*float64(opt)+1e-9 || g.LowerBound > opt || g.Optimal && g.Cost != opt {
			t.Fatalf("trial %d: greedy %+v, optimum %d", trial, g, opt)
		}
		e := Exact(in, g, 1<<20)
		if !covers(e) || !e.Optimal || e.Cost != opt || e.LowerBound != opt {
			t.Fatalf("trial %d: exact %+v, optimum %d", trial, e, opt)
		}
	}
}
