package target

import (
	"errors"
	"math/rand/v2"
	"slices"
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/internal/testnet"
)

// randomSignals draws m signals on n states, a third of them driving two
// states.
func randomSignals(rng *rand.Rand, n, m int) [][]int32 {
	var sig [][]int32
	for i := 0; i < m; i++ {
		s := []int32{int32(rng.IntN(n))}
		if rng.IntN(3) == 0 {
			if w := int32(rng.IntN(n)); w != s[0] {
				s = append(s, w)
			}
		}
		sig = append(sig, s)
	}
	return sig
}

func randomTargets(rng *rand.Rand, n int) []int32 {
	var tg []int32
	for v := 0; v < n; v++ {
		if rng.IntN(2) == 0 {
			tg = append(tg, int32(v))
		}
	}
	if len(tg) == 0 {
		tg = []int32{int32(rng.IntN(n))}
	}
	return tg
}

// kalmanTargetRank is the independent route: the numerical rank of
// C·[B AB ... A^(n-1)B] for random real parameters (gonum/mat SVD,
// testnet.KalmanRankRows), which equals the generic rank with probability
// one; borderline samples are redrawn.
func kalmanTargetRank(t *testing.T, rng *rand.Rand, g *structural.Network, signals [][]int32, targets []int32) int {
	t.Helper()
	for try := 0; try < 6; try++ {
		var b *mat.Dense
		if len(signals) > 0 {
			b = testnet.RealiseB(rng, g.N(), signals)
		}
		r, grey := testnet.KalmanRankRows(testnet.RealiseA(rng, g), b, targets)
		if !grey && r >= 0 {
			return r
		}
	}
	t.Fatalf("six borderline Kalman samples in a row")
	return -1
}

// Check on random small systems against the Kalman rank of C·K on random
// real parameters (gonum/mat): the proved bounds bracket it, they meet
// (the sample meets the linking bound), and the verdict follows. The
// static linking (van der Woude 1991) never exceeds it and the dynamic
// linking (Murota & Poljak 1990) never falls below it.
func TestCheckAgainstKalman(t *testing.T) {
	rng := rand.New(rand.NewPCG(16, 1))
	used := map[string]int{}
	for it := 0; it < 3000; it++ {
		n := 1 + rng.IntN(9)
		g := testnet.Random(t, rng, n, 0.08+0.3*rng.Float64())
		sig := randomSignals(rng, n, rng.IntN(3))
		tg := randomTargets(rng, n)
		d := testnet.Design(t, g, sig)
		v, err := Check(g, CheckRequest{Targets: tg, Inputs: d, Seed: uint64(it)})
		if err != nil {
			t.Fatal(err)
		}
		want := kalmanTargetRank(t, rng, g, sig, tg)
		if !v.Exact || v.Lower != want {
			t.Fatalf("case %d (n=%d, signals %v, targets %v): bounds [%d, %d], Kalman rank %d; %+v", it, n, sig, tg, v.Lower, v.Upper, want, v.Bounds)
		}
		if got := v.Status == Controllable; got != (want == len(tg)) || v.Holds != got {
			t.Fatalf("case %d: status %s with rank %d of %d targets", it, v.Status, want, len(tg))
		}
		for _, b := range v.Bounds {
			if b.Skipped != "" {
				continue
			}
			used[b.Name]++
			if b.Upper && b.Value < want || !b.Upper && b.Value > want {
				t.Fatalf("case %d: bound %s = %d against rank %d", it, b.Name, b.Value, want)
			}
		}
		// The dynamic linking itself, always computed here.
		p, _ := newPart(g, v.Targets.IDs(), sig)
		if lam := dynamicLinking(p, max(p.n, 1)); lam != want {
			t.Fatalf("case %d: dynamic linking %d, rank %d", it, lam, want)
		}
		if st := staticLinking(p); st > want {
			t.Fatalf("case %d: static linking %d above rank %d", it, st, want)
		}
	}
	// Every bound took part somewhere.
	for _, name := range []string{"sampled_rank", "dynamic_linking", "static_linking", "in_capacity", "layer_cut", "controllable_dimension"} {
		if used[name] == 0 {
			t.Errorf("bound %s never computed", name)
		}
	}
	t.Logf("bounds computed: %v", used)
}

// With every state a target, the target dimension is the controllable
// dimension (Hosoe 1980, structural.Dimension) and the verdict is Lin's
// (structural.Check).
func TestCheckAllStates(t *testing.T) {
	rng := rand.New(rand.NewPCG(16, 2))
	for it := 0; it < 300; it++ {
		n := 2 + rng.IntN(30)
		g := testnet.Random(t, rng, n, 2.5/float64(n))
		sig := randomSignals(rng, n, 1+rng.IntN(4))
		all := make([]int32, n)
		for i := range all {
			all[i] = int32(i)
		}
		d := testnet.Design(t, g, sig)
		v, err := Check(g, CheckRequest{Targets: all, Inputs: d, Seed: 3})
		if err != nil {
			t.Fatal(err)
		}
		lin := testnet.Check(t, g, structural.Controllability, sig)
		if !v.Exact || v.Lower != lin.Dimension || v.Holds != lin.Holds {
			t.Fatalf("case %d: target check [%d, %d] holds %v; Lin dimension %d holds %v", it, v.Lower, v.Upper, v.Holds, lin.Dimension, lin.Holds)
		}
	}
}

// Gao, Liu, D'Souza & Barabási (Nat. Commun. 5:5415, 2014), k-walk
// theory: in a directed tree one input at the root controls a set of
// targets when their distances from the root are distinct. More is true
// and checked here: on a tree the rows of targets at the same depth are
// multiples of each other (only the block A^depth·b reaches them), so the
// dimension is the number of distinct depths (derived from the same
// argument).
func TestKWalkTrees(t *testing.T) {
	rng := rand.New(rand.NewPCG(16, 3))
	for it := 0; it < 200; it++ {
		n := 2 + rng.IntN(40)
		// A random recursive tree: parent of v is a random earlier state.
		var es []testnet.Edge
		depth := make([]int, n)
		for v := 1; v < n; v++ {
			p := rng.IntN(v)
			es = append(es, testnet.Edge{int32(p), int32(v)})
			depth[v] = depth[p] + 1
		}
		g := testnet.Network(t, n, es)
		tg := randomTargets(rng, n)
		distinct := map[int]bool{}
		for _, x := range tg {
			distinct[depth[x]] = true
		}
		v, err := Check(g, CheckRequest{Targets: tg, Inputs: testnet.Design(t, g, [][]int32{{0}})})
		if err != nil {
			t.Fatal(err)
		}
		if !v.Exact || v.Lower != len(distinct) {
			t.Fatalf("tree %d: dimension [%d, %d], distinct depths %d", it, v.Lower, v.Upper, len(distinct))
		}
	}
}

// A hub that feeds two targets: one input behind the hub steers at most
// one of them; the verdict names the pair and the hub as its only
// in-neighbour (common practice: two outputs behind one state). A target
// upstream of the input is unreached.
func TestCheckWitness(t *testing.T) {
	// 0 -> 1 -> {2, 3}; 4 -> 0.
	g := testnet.Network(t, 5, []testnet.Edge{{0, 1}, {1, 2}, {1, 3}, {4, 0}})
	v, err := Check(g, CheckRequest{Targets: []int32{2, 3, 4}, Inputs: testnet.Design(t, g, [][]int32{{0}})})
	if err != nil {
		t.Fatal(err)
	}
	if v.Status != NotControllable || !v.Exact || v.Lower != 1 {
		t.Fatalf("status %s, bounds [%d, %d]", v.Status, v.Lower, v.Upper)
	}
	if got := v.Unreached.Names(); !slices.Equal(got, []string{"4"}) {
		t.Errorf("unreached %v", got)
	}
	bn := v.Bottleneck
	if bn == nil || !slices.Equal(bn.Targets.Names(), []string{"2", "3"}) || !slices.Equal(bn.Neighbours.Names(), []string{"1"}) ||
		bn.Capacity != 1 || bn.Shortfall != 1 {
		t.Fatalf("bottleneck %+v", bn)
	}
	// Targets two steps behind one state: 0 -> 1 -> {2, 3}, 2 -> 4, 3 -> 5:
	// every state acting on {4, 5} is distinct, but both lie two steps
	// behind state 1, which the funnel of depth 2 shows.
	g = testnet.Network(t, 6, []testnet.Edge{{0, 1}, {1, 2}, {1, 3}, {2, 4}, {3, 5}})
	v, err = Check(g, CheckRequest{Targets: []int32{4, 5}, Inputs: testnet.Design(t, g, [][]int32{{0}})})
	if err != nil {
		t.Fatal(err)
	}
	if v.Bottleneck != nil || v.Funnel == nil || v.Funnel.Depth != 2 || !slices.Equal(v.Funnel.States.Names(), []string{"1"}) || v.Lower != 1 {
		t.Fatalf("funnel %+v, bottleneck %+v, dimension %d", v.Funnel, v.Bottleneck, v.Lower)
	}
}

func TestCheckErrors(t *testing.T) {
	g := testnet.Network(t, 3, []testnet.Edge{{0, 1}})
	d := testnet.Design(t, g, [][]int32{{0}})
	if _, err := Check(g, CheckRequest{Inputs: d}); err != ErrNoTargets {
		t.Errorf("no targets: %v", err)
	}
	if _, err := Check(g, CheckRequest{Targets: []int32{3}, Inputs: d}); err == nil {
		t.Error("target out of range accepted")
	}
	other := testnet.Network(t, 3, []testnet.Edge{{0, 1}})
	if _, err := Check(other, CheckRequest{Targets: []int32{1}, Inputs: d}); err != structural.ErrForeignDesign {
		t.Errorf("foreign design: %v", err)
	}
}

// The two lower bounds that need no sample, on random small systems
// against the Kalman rank (gonum/mat): a Lin certificate is only ever
// found for a design of full rank, and the greedy linking never exceeds
// the rank (it is a linking: by Murota & Poljak 1990 at most the rank).
func TestCertificatesAgainstKalman(t *testing.T) {
	rng := rand.New(rand.NewPCG(16, 9))
	certified := 0
	for it := 0; it < 3000; it++ {
		n := 1 + rng.IntN(9)
		g := testnet.Random(t, rng, n, 0.08+0.3*rng.Float64())
		sig := randomSignals(rng, n, 1+rng.IntN(4))
		tg := randomTargets(rng, n)
		p, _ := newPart(g, tg, sig)
		want := kalmanTargetRank(t, rng, g, sig, tg)
		if len(p.targets) == len(tg) && linCertificate(p) {
			certified++
			if want != len(tg) {
				t.Fatalf("case %d: Lin certificate for rank %d of %d (edges %v, signals %v, targets %v)", it, want, len(tg), edgesOf(g), sig, tg)
			}
		}
		if gl := greedyLinking(p, max(p.n, 1)); gl > want {
			t.Fatalf("case %d: greedy linking %d above rank %d", it, gl, want)
		}
	}
	if certified == 0 {
		t.Error("no design certified")
	}
}

// Sample against the Kalman rank: every trial equals it on these sizes
// (each could miss it with probability at most N²/(p-1)), the structural
// bounds bracket it, and the trials are reproducible from the seed.
func TestSampleAgainstKalman(t *testing.T) {
	rng := rand.New(rand.NewPCG(16, 10))
	for it := 0; it < 500; it++ {
		n := 1 + rng.IntN(9)
		g := testnet.Random(t, rng, n, 0.08+0.3*rng.Float64())
		sig := randomSignals(rng, n, 1+rng.IntN(3))
		tg := randomTargets(rng, n)
		d := testnet.Design(t, g, sig)
		res, err := Sample(g, SampleRequest{Targets: tg, Inputs: d, Trials: 2, Seed: uint64(it)})
		if err != nil {
			t.Fatal(err)
		}
		want := kalmanTargetRank(t, rng, g, sig, tg)
		if res.Rank != want || len(res.Trials) != 2 || res.Trials[0] != want || res.Trials[1] != want {
			t.Fatalf("case %d: trials %v, Kalman rank %d", it, res.Trials, want)
		}
		if res.Lower > want || res.Upper < want || res.Holds != (want == len(tg)) || !res.Agrees {
			t.Fatalf("case %d: bounds [%d, %d], holds %v, agrees %v, rank %d", it, res.Lower, res.Upper, res.Holds, res.Agrees, want)
		}
		again, _ := Sample(g, SampleRequest{Targets: tg, Inputs: d, Trials: 2, Seed: uint64(it)})
		if !slices.Equal(again.Trials, res.Trials) {
			t.Fatalf("case %d: not reproducible", it)
		}
	}
	g := testnet.Random(t, rng, 40, 0.1)
	d := testnet.Design(t, g, [][]int32{{0}, {1}})
	var tl *structural.TooLargeError
	if _, err := Sample(g, SampleRequest{Targets: []int32{2, 3}, Inputs: d, MaxStates: 5}); !errors.As(err, &tl) {
		t.Errorf("limit: %v", err)
	}
}

// A linking in the dynamic graph never proves the targets steered on its
// own. The tree 0 -> 1, 0 -> 2 -> 3 with one input on 0 steers the targets
// {1, 3} (distinct distances from the root: Gao, Liu, D'Souza & Barabási,
// Nat. Commun. 5:5415, 2014); Lin's test fails on every subnetwork holding
// them (1 and 2 share their only in-neighbour 0) and one signal gives one
// disjoint input-target path, so only the sample proves it. A greedy
// linking of 2 exists. When the sample is forced below it (the shape of a
// network where the rank is below the largest dynamic linking), or when no
// sample fits the limits, the verdict is Undecided, never Controllable.
func TestLinkingNeverOverridesSample(t *testing.T) {
	g := testnet.Network(t, 4, []testnet.Edge{{0, 1}, {0, 2}, {2, 3}})
	d := testnet.Design(t, g, [][]int32{{0}})
	req := CheckRequest{Targets: []int32{1, 3}, Inputs: d}

	v, err := Check(g, req)
	if err != nil {
		t.Fatal(err)
	}
	if v.Status != Controllable || v.LowerFrom != "sampled_rank" || v.ByTheorem || v.SampleBelowLinking {
		t.Fatalf("plain check: status %s from %s, by theorem %v, below linking %v", v.Status, v.LowerFrom, v.ByTheorem, v.SampleBelowLinking)
	}

	req.sampleHook = func(int) int { return 1 }
	v, err = Check(g, req)
	if err != nil {
		t.Fatal(err)
	}
	if v.Status != Undecided || v.Holds || v.Lower != 1 || v.Upper != 2 || v.Linking != 2 || !v.SampleBelowLinking || v.ByTheorem {
		t.Fatalf("sample below the linking: status %s, bounds [%d, %d], linking %d, below %v, by theorem %v; %+v",
			v.Status, v.Lower, v.Upper, v.Linking, v.SampleBelowLinking, v.ByTheorem, v.Bounds)
	}

	req.sampleHook = nil
	req.MaxSampleStates = -1
	v, err = Check(g, req)
	if err != nil {
		t.Fatal(err)
	}
	if v.Status != Undecided || v.Holds || v.Lower != 1 || v.Linking != 2 || !v.ByTheorem || v.SampleBelowLinking || v.FailureBound != 0 {
		t.Fatalf("no sample: status %s, bounds [%d, %d] from %s, linking %d, by theorem %v", v.Status, v.Lower, v.Upper, v.LowerFrom, v.Linking, v.ByTheorem)
	}
	for _, b := range v.Bounds {
		if b.ByTheorem && b.Upper {
			t.Errorf("bound %s: an upper bound marked by theorem", b.Name)
		}
	}
}
