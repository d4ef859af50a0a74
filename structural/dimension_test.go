package structural_test

import (
	"fmt"
	"math/rand/v2"
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/internal/testnet"
	"github.com/netsteer/netsteer/structural/numeric"
)

// hungarian returns the minimum cost of a perfect assignment of the square
// cost matrix c (the O(n^3) shortest-augmenting-path form of the Hungarian
// method, Kuhn 1955 / Munkres 1957, with row and column potentials).
func hungarian(c [][]int) int {
	n := len(c)
	const inf = 1 << 60
	u := make([]int, n+1)
	v := make([]int, n+1)
	p := make([]int, n+1) // p[j]: row assigned to column j (1-based), 0 = none
	way := make([]int, n+1)
	for i := 1; i <= n; i++ {
		p[0] = i
		j0 := 0
		minv := make([]int, n+1)
		used := make([]bool, n+1)
		for j := range minv {
			minv[j] = inf
		}
		for {
			used[j0] = true
			i0, delta, j1 := p[j0], inf, 0
			for j := 1; j <= n; j++ {
				if used[j] {
					continue
				}
				cur := c[i0-1][j-1] - u[i0] - v[j]
				if cur < minv[j] {
					minv[j], way[j] = cur, j0
				}
				if minv[j] < delta {
					delta, j1 = minv[j], j
				}
			}
			for j := 0; j <= n; j++ {
				if used[j] {
					u[p[j]] += delta
					v[j] -= delta
				} else {
					minv[j] -= delta
				}
			}
			j0 = j1
			if p[j0] == 0 {
				break
			}
		}
		for j0 != 0 {
			j1 := way[j0]
			p[j0] = p[j1]
			j0 = j1
		}
	}
	total := 0
	for j := 1; j <= n; j++ {
		total += c[p[j]-1][j-1]
	}
	return total
}

// dimensionByAssignment computes the largest stem-cycle cover of the
// reached part as a dense minimum-cost assignment, an independent route to
// ControllableDimension. Rows are the out-copies of the reached states and
// the inputs; columns the in-copies and one slot per input. An out-copy
// takes an in-copy along an edge (cost 0) or its own in-copy (cost 1: the
// state is uncovered), or any slot (a stem ends there); an input takes an
// in-copy it drives or its own slot (unused). Slots left to out-copies are
// exactly the used inputs, so perfect assignments are the families of
// cycles and stems from distinct inputs, and the cost counts uncovered
// states.
func dimensionByAssignment(g *structural.Network, inputs [][]int32, unreached []int32) int {
	const inf = 1 << 40
	n := g.N()
	idx := make([]int, n)
	for i := range idx {
		idx[i] = -2
	}
	for _, v := range unreached {
		idx[v] = -1
	}
	var states []int32
	for v := 0; v < n; v++ {
		if idx[v] == -2 {
			idx[v] = len(states)
			states = append(states, int32(v))
		}
	}
	r, m := len(states), len(inputs)
	size := r + m
	if r == 0 {
		return 0
	}
	c := make([][]int, size)
	for i := range c {
		c[i] = make([]int, size)
		for j := range c[i] {
			c[i][j] = inf
		}
	}
	for a, v := range states {
		c[a][a] = 1
		for _, w := range g.Succ(v) {
			c[a][idx[w]] = 0
		}
		for k := 0; k < m; k++ {
			c[a][r+k] = 0
		}
	}
	for k, in := range inputs {
		c[r+k][r+k] = 0
		for _, w := range in {
			c[r+k][idx[w]] = 0
		}
	}
	return r - hungarian(c)
}

// randomForest gives every state but a few roots one random parent among
// the states before it, then adds extra random edges: shapes where stems
// compete for branches, so the cover is often smaller than the term rank.
func randomForest(t testing.TB, rng *rand.Rand, n, extra int) *structural.Network {
	var es []testnet.Edge
	for v := 1; v < n; v++ {
		if rng.IntN(8) > 0 {
			es = append(es, testnet.Edge{int32(rng.IntN(v)), int32(v)})
		}
	}
	for k := 0; k < extra; k++ {
		es = append(es, testnet.Edge{int32(rng.IntN(n)), int32(rng.IntN(n))})
	}
	return testnet.Network(t, n, es)
}

// TestDimensionAssignment compares the phased cover flow with the dense
// Hungarian assignment on random networks of 10-90 states: forests with a
// few extra edges and sparse random digraphs, with random designs and with
// parts of minimum driver sets.
func TestDimensionAssignment(t *testing.T) {
	rng := rand.New(rand.NewPCG(1955, 1957))
	trials := 300
	if testing.Short() {
		trials = 60
	}
	below := 0
	for trial := 0; trial < trials; trial++ {
		n := 10 + rng.IntN(80)
		var g *structural.Network
		if trial%2 == 0 {
			g = randomForest(t, rng, n, rng.IntN(n/3+1))
		} else {
			g = testnet.Random(t, rng, n, (0.5+2*rng.Float64())/float64(n))
		}
		var inputs [][]int32
		if trial%3 == 0 {
			// Every other signal of a minimum design.
			for i, in := range structural.Drivers(g).Inputs.Signals() {
				if i%2 == 0 {
					inputs = append(inputs, in)
				}
			}
		} else {
			inputs = randomDesign(rng, n, 1+n/10)
		}
		v := testnet.Check(t, g, structural.Controllability, inputs)
		want := dimensionByAssignment(g, inputs, v.Unreached.IDs())
		if v.Dimension != want {
			t.Fatalf("trial %d (%d states, %d inputs): dimension %d, assignment %d", trial, n, len(inputs), v.Dimension, want)
		}
		if want < termRankReached(g, inputs, v.Unreached.IDs()) {
			below++
		}
	}
	t.Logf("%d trials, %d with the dimension below the reached term rank", trials, below)
	if below < trials/10 {
		t.Errorf("only %d of %d trials separate the dimension from the term rank", below, trials)
	}
}

// sparseNetwork returns n states and l random edges (self-loops and
// repeats allowed; the builder merges repeats).
func sparseNetwork(t testing.TB, rng *rand.Rand, n, l int) *structural.Network {
	es := make([]testnet.Edge, l)
	for k := range es {
		es[k] = testnet.Edge{int32(rng.IntN(n)), int32(rng.IntN(n))}
	}
	return testnet.Network(t, n, es)
}

// TestDimensionSampled compares Dimension with an independent route on
// networks of 90-700 states, too large for the dense assignment at scale:
// the exact rank of [B AB ... A^(n-1)B] over GF(2^61-1) for random
// parameters (structural/numeric), which never exceeds the generic
// dimension and falls short of it with probability at most n^2/(p-1) per
// draw (Schwartz-Zippel), so the larger of two draws equals it; up to 300
// states the Hungarian assignment of TestDimensionAssignment is checked
// too. Forests, sparse digraphs of mean degree 0.5-4, and designs that are
// random, half of a minimum design, or a minimum design with one signal
// dropped.
func TestDimensionSampled(t *testing.T) {
	rng := rand.New(rand.NewPCG(1980, 1208))
	trials := 160
	if testing.Short() {
		trials = 30
	}
	f := numeric.NewField(numeric.Mersenne61)
	below := 0
	for trial := 0; trial < trials; trial++ {
		n := 90 + rng.IntN(611)
		var g *structural.Network
		switch trial % 3 {
		case 0:
			g = randomForest(t, rng, n, rng.IntN(n/2+1))
		default:
			g = sparseNetwork(t, rng, n, int(float64(n)*(0.25+1.75*rng.Float64())))
		}
		var inputs [][]int32
		switch trial % 4 {
		case 0, 1:
			full := structural.Drivers(g).Inputs.Signals()
			for i, in := range full {
				if trial%4 == 1 && i == len(full)/2 {
					continue
				}
				if trial%4 == 0 && i%2 == 1 {
					continue
				}
				inputs = append(inputs, in)
			}
		default:
			inputs = randomDesign(rng, n, 1+n/(5+rng.IntN(20)))
		}
		got := testnet.Dimension(t, g, structural.Controllability, inputs)
		p := &numeric.Pattern{Out: g.Out(), Signals: inputs}
		sampled := 0
		for draw := 0; draw < 2; draw++ {
			x := numeric.DrawExact(p, f, rand.New(rand.NewPCG(uint64(trial), uint64(draw))))
			sampled = max(sampled, numeric.Dimension(p, x, false, nil))
		}
		if got != sampled {
			t.Fatalf("trial %d (%d states, %d edges, %d inputs): dimension %d, exact sampled rank %d", trial, n, g.Edges(), len(inputs), got, sampled)
		}
		if n <= 300 {
			if want := dimensionByAssignment(g, inputs, closureUnreached(g, inputs)); got != want {
				t.Fatalf("trial %d (%d states): dimension %d, Hungarian assignment %d", trial, n, got, want)
			}
		}
		if got < n {
			below++
		}
	}
	if below < trials/2 {
		t.Errorf("only %d of %d designs fail to control everything: the comparison is too easy", below, trials)
	}
}

// copiesOfExample returns k disjoint copies of the term-rank
// example, each with its own input: dimension 3k of 5k states.
func copiesOfExample(k int) (*structural.Network, [][]int32) {
	b := structural.NewIntBuilder(5*k, 0)
	inputs := make([][]int32, k)
	for c := 0; c < k; c++ {
		o := int32(5 * c)
		b.AddEdge(o, o+1)
		b.AddEdge(o, o+2)
		b.AddEdge(o+1, o+3)
		b.AddEdge(o+2, o+4)
		inputs[c] = []int32{o}
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		panic(err)
	}
	return g, inputs
}

// TestDimensionLarge runs shapes with known dimensions at 10^5 states
// (common practice: worked by hand from Hosoe's cover).
func TestDimensionLarge(t *testing.T) {
	const k = 20000
	g, inputs := copiesOfExample(k)
	if got := testnet.Dimension(t, g, structural.Controllability, inputs); got != 3*k {
		t.Errorf("%d copies of the example: got %d, want %d", k, got, 3*k)
	}
	// An out-star: one stem of two states whatever the number of leaves.
	const leaves = 100000
	b := structural.NewIntBuilder(leaves+1, 0)
	for l := 1; l <= leaves; l++ {
		b.AddEdge(0, int32(l))
	}
	star, _ := b.Build(structural.BuildOptions{})
	if got := testnet.Dimension(t, star, structural.Controllability, [][]int32{{0}}); got != 2 {
		t.Errorf("out-star: got %d, want 2", got)
	}
	// A chain driven at its middle reaches its second half only, and its
	// head, with no in-neighbour at all, is a dilation of one state.
	const n = 100000
	b = structural.NewIntBuilder(n, 0)
	for v := 0; v+1 < n; v++ {
		b.AddEdge(int32(v), int32(v+1))
	}
	chain, _ := b.Build(structural.BuildOptions{})
	v := testnet.Check(t, chain, structural.Controllability, [][]int32{{n / 2}})
	if v.Dimension != n/2 || len(v.Unreached.IDs()) != n/2 || v.Dilation == nil || len(v.Dilation.States.IDs()) != 1 || v.Dilation.States.IDs()[0] != 0 {
		t.Errorf("chain: dimension %d, %d unreached, dilation %+v; want %d, %d, [0]", v.Dimension, len(v.Unreached.IDs()), v.Dilation, n/2, n/2)
	}
}

// erNetwork returns a directed Erdos-Renyi G(N, L) network without
// self-loops or repeated edges, from a fixed seed.
func erNetwork(tb testing.TB, n, l int, seed uint64) *structural.Network {
	rng := rand.New(rand.NewPCG(seed, uint64(n)))
	seen := make(map[uint64]struct{}, l)
	b := structural.NewIntBuilder(n, 0)
	b.Grow(l)
	for len(seen) < l {
		u, v := rng.IntN(n), rng.IntN(n)
		if u == v {
			continue
		}
		key := uint64(u)<<32 | uint64(v)
		if _, dup := seen[key]; dup {
			continue
		}
		seen[key] = struct{}{}
		b.AddEdge(int32(u), int32(v))
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		tb.Fatal(err)
	}
	return g
}

// BenchmarkCheck judges failing designs (every other signal of a minimum
// design, so the cover flow runs) and complete ones (the fast path) on
// directed ER networks with <k> = 4.
func BenchmarkCheck(b *testing.B) {
	for _, n := range []int{10000, 100000, 1000000} {
		g := erNetwork(b, n, 2*n, 42)
		full := structural.Drivers(g).Inputs.Signals()
		var half [][]int32
		for i, in := range full {
			if i%2 == 0 {
				half = append(half, in)
			}
		}
		b.Run(fmt.Sprintf("failing/N=%d", n), func(b *testing.B) {
			for b.Loop() {
				testnet.Check(b, g, structural.Controllability, half)
			}
		})
		b.Run(fmt.Sprintf("complete/N=%d", n), func(b *testing.B) {
			for b.Loop() {
				testnet.Check(b, g, structural.Controllability, full)
			}
		})
	}
}

// BenchmarkControllableDimension: copies of the term-rank example, where
// every copy needs the cost-1 phase.
func BenchmarkControllableDimension(b *testing.B) {
	for _, k := range []int{10000, 100000, 200000} {
		g, inputs := copiesOfExample(k)
		b.Run(fmt.Sprintf("N=%d", 5*k), func(b *testing.B) {
			for b.Loop() {
				testnet.Dimension(b, g, structural.Controllability, inputs)
			}
		})
	}
}
