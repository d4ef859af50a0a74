package placement

import (
	"cmp"
	"fmt"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/internal/testnet"
)

// cheapestFree (from any maximum matching, by the dual greedy) and the
// greedy matching built class by class by Hopcroft–Karp augmentation (the
// method before it, still used with forbidden states) are two routes to
// the same optimum: on random networks of 50-2000 states, beyond the reach
// of brute force, placements and completions with random costs, existing
// devices or unit costs agree in feasibility, total cost and number of
// devices (the chosen states may differ among equally cheap sets). Both
// routes are checked against brute force on small networks in
// TestPlacementBruteForce and TestCompleteBruteForce.
func TestCheapestFreeMatchesClassGreedy(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 5))
	for trial := 0; trial < 60; trial++ {
		n := 50 + rng.IntN(2000)
		g := testnet.Random(t, rng, n, (0.5+3*rng.Float64())/float64(n))
		var d structural.Devices
		switch trial % 3 {
		case 0:
			d = testnet.RandomDevices(rng, n, 1000, 0, 0)
		case 1:
			d = testnet.RandomDevices(rng, n, 5, 0, 0.1)
		case 2:
			d = testnet.RandomDevices(rng, n, 0, 0, 0.05)
		}
		prop := structural.Controllability
		if trial%2 == 1 {
			prop = structural.Observability
		}
		var inputs [][]int32
		for i := rng.IntN(n / 20); i >= 0; i-- {
			inputs = append(inputs, []int32{int32(rng.IntN(n))})
		}
		design := testnet.Design(t, g, inputs)
		run := func(old bool) (*Placement, *Placement) {
			defer func(v bool) { classGreedy = v }(classGreedy)
			classGreedy = old
			pl, err := Place(g, prop, d)
			if err != nil {
				t.Fatal(err)
			}
			dc := d
			dc.Existing = nil
			cp, err := Complete(g, prop, design, dc)
			if err != nil {
				t.Fatal(err)
			}
			return pl, cp
		}
		newP, newC := run(false)
		oldP, oldC := run(true)
		label := fmt.Sprintf("trial %d (n=%d, %v)", trial, n, prop)
		for _, c := range []struct {
			what     string
			got, ref *Placement
		}{{"place", newP, oldP}, {"complete", newC, oldC}} {
			if c.got.Feasible != c.ref.Feasible || c.got.Cost != c.ref.Cost || c.got.Added.Len() != c.ref.Added.Len() {
				t.Errorf("%s %s: feasible %v cost %v with %d added; class by class: %v, %v with %d",
					label, c.what, c.got.Feasible, c.got.Cost, c.got.Added.Len(), c.ref.Feasible, c.ref.Cost, c.ref.Added.Len())
			}
		}
	}
}

// sortByCost orders by cost, then index, as a comparison sort does
// (slices.SortFunc, the standard library, is the reference), with small
// costs (packed radix keys) and costs too large to pack.
func TestSortByCost(t *testing.T) {
	rng := rand.New(rand.NewPCG(2, 2))
	for trial := 0; trial < 100; trial++ {
		n := 1 + rng.IntN(3000)
		w := make([]int64, n)
		big := trial%4 == 0
		for v := range w {
			if big {
				w[v] = rng.Int64N(1 << 60)
			} else {
				w[v] = rng.Int64N(50)
			}
		}
		mark := make([]bool, n)
		var list []int32
		for v := range mark {
			if rng.IntN(3) > 0 {
				mark[v] = true
				list = append(list, int32(v))
			}
		}
		rng.Shuffle(len(list), func(i, j int) { list[i], list[j] = list[j], list[i] })
		want := slices.Clone(list)
		slices.SortFunc(want, func(a, b int32) int {
			if c := cmp.Compare(w[a], w[b]); c != 0 {
				return c
			}
			return cmp.Compare(a, b)
		})
		sortByCost(list, mark, w)
		if !slices.Equal(list, want) {
			t.Fatalf("trial %d: %v, want %v", trial, list, want)
		}
	}
}
