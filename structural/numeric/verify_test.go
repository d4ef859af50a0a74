package numeric

import (
	"errors"
	"math"
	"math/big"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/structural"
)

type wedge struct {
	u, v string
	w    float64
}

// weighted builds a network from named, weighted edges.
func weighted(t testing.TB, edges []wedge) *structural.Network {
	b := structural.NewBuilder()
	for _, e := range edges {
		u, _ := b.Intern([]byte(e.u))
		v, _ := b.Intern([]byte(e.v))
		b.AddWeightedEdge(u, v, e.w)
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	return g
}

func lookup(t testing.TB, g *structural.Network, names ...string) []int32 {
	var out []int32
	for _, s := range names {
		v, ok := g.Lookup(s)
		if !ok {
			t.Fatalf("no state %q", s)
		}
		out = append(out, v)
	}
	return out
}

// Two identical parallel branches on one input: a feeder x0 drives two
// heaters a and b, each with its own dynamics (a self-loop). The pattern
// is structurally controllable (stem u -> x0 -> a, bud b hanging on x0:
// Lin's theorem, no dilation and everything reached). With equal self-loop
// weights the combination z = w_b·a - w_a·b obeys z' = λz whatever the
// input does, so the weighted model is uncontrollable: dimension 2 of 3.
// Untie the dynamics and the weighted model is controllable again
// (constructed for this test; the argument is the one above).
func TestWeightsTiedBranches(t *testing.T) {
	for _, tc := range []struct {
		la, lb  float64
		wantDim int
	}{{-0.5, -0.5, 2}, {-0.5, -0.7, 3}} {
		g := weighted(t, []wedge{
			{"x0", "a", 2}, {"x0", "b", 3}, {"a", "a", tc.la}, {"b", "b", tc.lb},
		})
		in := [][]int32{lookup(t, g, "x0")}
		rep, err := Verify(g, Request{Inputs: dz(g, in), Weights: true, InputWeights: [][]float64{{1.5}}})
		if err != nil {
			t.Fatal(err)
		}
		r := rep.Controllability
		if r.Dimension != 3 {
			t.Fatalf("structural dimension %d, want 3", r.Dimension)
		}
		if r.SampledDimension != tc.wantDim {
			t.Errorf("self-loops %g, %g: weighted dimension %d, want %d", tc.la, tc.lb, r.SampledDimension, tc.wantDim)
		}
		if r.Agrees != (tc.wantDim == 3) || r.SampledHolds != (tc.wantDim == 3) {
			t.Errorf("self-loops %g, %g: agrees %v full %v", tc.la, tc.lb, r.Agrees, r.SampledHolds)
		}
		if tc.wantDim < 3 && (r.Trials[0].SecondPrime == nil || *r.Trials[0].SecondPrime != tc.wantDim) {
			t.Errorf("second prime gives %v, want %d", r.Trials[0].SecondPrime, tc.wantDim)
		}
		fr := r.Trials[0].Float
		if fr == nil {
			t.Fatal("no floating-point check")
		}
		tiny := fr.Margin <= RoundingLevel(3)
		if tiny != (tc.wantDim < 3) {
			t.Errorf("self-loops %g, %g: relative margin %g (rounding level %g)", tc.la, tc.lb, fr.Margin, RoundingLevel(3))
		}
		if tc.wantDim < 3 && math.Abs(real(fr.At)-tc.la) > 1e-9 {
			t.Errorf("margin attained at %v, want the tied eigenvalue %g", fr.At, tc.la)
		}
	}
}

// Decimal weights are taken as the decimals they are: with
// w(x0->a)·w(a->c) + w(x0->b)·w(b->c) = 0.1·0.3 + (-0.03)·1 = 0 the two
// paths into c cancel and the dimension drops to 2, as over the rationals.
// The float64 values themselves do not cancel (0.1·0.3 != 0.03 in binary),
// so mapping their binary values would wrongly give 3 (constructed for this
// test; arithmetic by hand).
func TestWeightsDecimalCancellation(t *testing.T) {
	g := weighted(t, []wedge{
		{"x0", "a", 0.1}, {"a", "c", 0.3}, {"x0", "b", -0.03}, {"b", "c", 1},
	})
	in := [][]int32{lookup(t, g, "x0")}
	rep, err := Verify(g, Request{Inputs: dz(g, in), Weights: true})
	if err != nil {
		t.Fatal(err)
	}
	r := rep.Controllability
	if r.Dimension != 3 || r.SampledDimension != 2 || rep.InexactWeights != 0 {
		t.Fatalf("structural %d sampled %d inexact %d, want 3, 2, 0", r.Dimension, r.SampledDimension, rep.InexactWeights)
	}
	// The exact binary values of the float64 weights would not cancel.
	w := []float64{0.1, 0.3, -0.03}
	bin := new(big.Rat).Mul(new(big.Rat).SetFloat64(w[0]), new(big.Rat).SetFloat64(w[1]))
	bin.Add(bin, new(big.Rat).SetFloat64(w[2]))
	if bin.Sign() == 0 {
		t.Fatal("the binary values cancel too; the test proves nothing")
	}
}

// The reverse cannot happen: a sample is never more controllable than its
// structure. Each k×k minor of [B AB ...] is a polynomial in the
// parameters; when the generic dimension is r every minor of size r+1 is
// the zero polynomial, so it vanishes at any values, over the rationals and
// in GF(p) alike (common practice; the argument is the definition of the
// generic rank). Checked on thousands of random patterns with tie-prone
// small-integer weights, both properties.
func TestWeightsNeverExceedStructure(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 22))
	vals := []float64{-1, 1, 2}
	below := 0
	for c := 0; c < 2000; c++ {
		n := 2 + rng.IntN(6)
		b := structural.NewIntBuilder(n, 0)
		for u := 0; u < n; u++ {
			for v := 0; v < n; v++ {
				if rng.Float64() < 0.3 {
					b.AddWeightedEdge(int32(u), int32(v), vals[rng.IntN(3)])
				}
			}
		}
		g, err := b.Build(structural.BuildOptions{})
		if err != nil {
			t.Fatal(err)
		}
		if g.Weights() == nil {
			continue // no edges
		}
		var in, out [][]int32
		var inW, outW [][]float64
		for j := 0; j <= rng.IntN(2); j++ {
			in = append(in, []int32{int32(rng.IntN(n))})
			inW = append(inW, []float64{vals[rng.IntN(3)]})
			out = append(out, []int32{int32(rng.IntN(n))})
			outW = append(outW, []float64{vals[rng.IntN(3)]})
		}
		rep, err := Verify(g, Request{Inputs: dz(g, in), Outputs: dz(g, out), Weights: true, InputWeights: inW, OutputWeights: outW, MaxFloatStates: -1})
		if err != nil {
			t.Fatal(err)
		}
		for _, r := range []*PropertyResult{rep.Controllability, rep.Observability} {
			if r.SampledDimension > r.Dimension {
				t.Fatalf("case %d: weighted dimension %d exceeds the structural %d", c, r.SampledDimension, r.Dimension)
			}
			if r.SampledHolds && r.Dimension != n {
				t.Fatalf("case %d: weighted model controllable, structure not", c)
			}
			if r.SampledDimension < r.Dimension {
				below++
			}
		}
	}
	t.Logf("%d weighted systems fell below their structural dimension", below)
	if below < 100 {
		t.Errorf("only %d cancellations: the weights are not tie-prone enough to test anything", below)
	}
}

// Random samples reach the structural dimension of structural.Check
// (Hosoe 1980, via structural.Check) on thousands of random patterns, for
// controllability and observability; a miss has probability below
// n²/(p-1) < 3e-17 per trial here (Schwartz–Zippel).
func TestVerifyAgreesWithStructure(t *testing.T) {
	rng := rand.New(rand.NewPCG(23, 24))
	full := 0
	for c := 0; c < 3000; c++ {
		n := 1 + rng.IntN(8)
		b := structural.NewIntBuilder(n, 0)
		for u := 0; u < n; u++ {
			for v := 0; v < n; v++ {
				if rng.Float64() < 0.25 {
					b.AddEdge(int32(u), int32(v))
				}
			}
		}
		g, err := b.Build(structural.BuildOptions{})
		if err != nil {
			t.Fatal(err)
		}
		var in, out [][]int32
		for j := 0; j <= rng.IntN(3); j++ {
			in = append(in, []int32{int32(rng.IntN(n))})
			out = append(out, []int32{int32(rng.IntN(n))})
		}
		rep, err := Verify(g, Request{Inputs: dz(g, in), Outputs: dz(g, out), Trials: 1, Seed: uint64(c), MaxFloatStates: -1})
		if err != nil {
			t.Fatal(err)
		}
		for _, r := range []*PropertyResult{rep.Controllability, rep.Observability} {
			if !r.Agrees {
				t.Fatalf("case %d: sampled %d, structural %d", c, r.SampledDimension, r.Dimension)
			}
			if r.SampledHolds {
				full++
			}
		}
	}
	t.Logf("%d of 6000 full", full)
}

// The same seed reproduces a run; another seed draws other numbers.
func TestVerifySeed(t *testing.T) {
	g, in := erNetwork(40, 3, 5)
	run := func(seed uint64) *Result {
		rep, err := Verify(g, Request{Inputs: dz(g, in), Seed: seed, Trials: 2})
		if err != nil {
			t.Fatal(err)
		}
		return rep
	}
	a, b, c := run(7), run(7), run(8)
	for t2 := range a.Controllability.Trials {
		if a.Controllability.Trials[t2].Float.Sigma != b.Controllability.Trials[t2].Float.Sigma {
			t.Errorf("trial %d: same seed, margins %g and %g", t2, a.Controllability.Trials[t2].Float.Sigma, b.Controllability.Trials[t2].Float.Sigma)
		}
	}
	if a.Controllability.Trials[0].Float.Sigma == c.Controllability.Trials[0].Float.Sigma {
		t.Errorf("seeds 7 and 8 give the same margin")
	}
	if a.Controllability.Trials[0].Float.Sigma == a.Controllability.Trials[1].Float.Sigma {
		t.Errorf("two trials give the same margin")
	}
	if !a.Controllability.SampledHolds || !a.Controllability.Agrees {
		t.Errorf("minimum driver design not confirmed: %+v", a.Controllability)
	}
}

// Above the limit Verify refuses with the estimated cost instead of
// starting a long computation.
func TestVerifySizeError(t *testing.T) {
	g, in := erNetwork(300, 4, 9)
	_, err := Verify(g, Request{Inputs: dz(g, in), MaxStates: 100})
	var se *SizeError
	if !errors.As(err, &se) {
		t.Fatalf("error %v, want a *SizeError", err)
	}
	if se.Stage != StageExact || se.States != 300 || se.Limit != 100 || se.Estimate.Seconds <= 0 || se.Estimate.Bytes < 300*300*8 {
		t.Errorf("size error %+v", se)
	}
}

// Observability is controllability of the transpose: a chain sensed at
// its tail is observable, sensed at its head it sees one state (common
// practice).
func TestVerifyObservabilityChain(t *testing.T) {
	g := weighted(t, []wedge{{"p", "q", 1}, {"q", "r", 1}, {"r", "s", 1}})
	for _, tc := range []struct {
		sense string
		want  int
	}{{"s", 4}, {"p", 1}, {"q", 2}} {
		rep, err := Verify(g, Request{Outputs: dz(g, [][]int32{lookup(t, g, tc.sense)}), Seed: 1})
		if err != nil {
			t.Fatal(err)
		}
		if r := rep.Observability; r.SampledDimension != tc.want || r.Dimension != tc.want {
			t.Errorf("sensing %s: sampled %d structural %d, want %d", tc.sense, r.SampledDimension, r.Dimension, tc.want)
		}
	}
}

// A trial count beyond MaxTrials is refused before anything is drawn: the
// samples of every trial once stayed in memory together, and 10^8 trials
// of a three-state network exhausted it.
func TestVerifyTrialsLimit(t *testing.T) {
	g, in := erNetwork(20, 3, 5)
	if _, err := Verify(g, Request{Inputs: dz(g, in), Seed: 1, Trials: MaxTrials + 1}); err == nil || !strings.Contains(err.Error(), "at most 1000") {
		t.Errorf("Trials %d: got error %v, want one saying at most %d", MaxTrials+1, err, MaxTrials)
	}
}

// mustDesign wraps signals as a design of g (nil: no signals).
func mustDesign(g *structural.Network, signals [][]int32) structural.Design {
	d, err := structural.NewDesign(g, signals, nil)
	if err != nil {
		panic(err)
	}
	return d
}

// dz wraps signals as a design of g for a Request (nil: none).
func dz(g *structural.Network, signals [][]int32) *structural.Design {
	if signals == nil {
		return nil
	}
	d := mustDesign(g, signals)
	return &d
}

// The findings of the CLI's old warnings arrive as typed data: ties lose a
// direction (below_structure with the count), merged edges that cancel
// (zero_entries), weights beyond 15 digits (inexact_weights), a near tie
// (margin below the warning level, attained at the tied eigenvalue), and
// a network without weights. Constructed for this test; the figures follow
// from TestWeightsTiedBranches' argument.
func TestVerifyWarnings(t *testing.T) {
	kinds := func(ws []Warning) map[WarningKind]Warning {
		m := map[WarningKind]Warning{}
		for _, w := range ws {
			if _, dup := m[w.Kind]; dup && w.Property == "" {
				t.Errorf("kind %s given twice", w.Kind)
			}
			m[w.Kind] = w
			if w.Message == "" {
				t.Errorf("kind %s without a message", w.Kind)
			}
		}
		return m
	}
	// Tied, with a cancelling duplicate edge and a long weight.
	b := structural.NewBuilder()
	id := func(s string) int32 { v, _ := b.Intern([]byte(s)); return v }
	x0, a, c, d := id("x0"), id("a"), id("b"), id("d")
	b.AddWeightedEdge(x0, a, 2)
	b.AddWeightedEdge(x0, c, 0.12345678901234567)
	b.AddWeightedEdge(a, a, -0.5)
	b.AddWeightedEdge(c, c, -0.5)
	b.AddWeightedEdge(c, d, 1)
	b.AddWeightedEdge(c, d, -1)
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	rep, err := Verify(g, Request{Inputs: dz(g, [][]int32{{x0}}), Weights: true})
	if err != nil {
		t.Fatal(err)
	}
	m := kinds(rep.Warnings)
	if w, ok := m[WarnBelowStructure]; !ok || w.Count != 2 || w.Property != "controllability" {
		// d is lost to the cancelled edge, and one of a, b to the tie.
		t.Errorf("below_structure %+v (dimension %d of structural %d)", w, rep.Controllability.SampledDimension, rep.Controllability.Dimension)
	}
	if w := m[WarnZeroEntries]; w.Count != 1 {
		t.Errorf("zero_entries %+v", w)
	}
	if w := m[WarnInexactWeights]; w.Count < 1 {
		t.Errorf("inexact_weights %+v", w)
	}
	if rep.Holds() {
		t.Errorf("tied model holds")
	}
	// A near tie: controllable, with a margin of about 1e-7.
	g = weighted(t, []wedge{{"x0", "a", 2}, {"x0", "b", 3}, {"a", "a", -0.5}, {"b", "b", -0.5000001}})
	rep, err = Verify(g, Request{Inputs: dz(g, [][]int32{lookup(t, g, "x0")}), Weights: true})
	if err != nil {
		t.Fatal(err)
	}
	m = kinds(rep.Warnings)
	w, ok := m[WarnLowMargin]
	if !ok || w.Value == nil || *w.Value > 1e-6 || w.AtRe == nil || math.Abs(*w.AtRe+0.5) > 1e-6 {
		t.Errorf("margin warning %+v", w)
	}
	if _, below := m[WarnBelowStructure]; !rep.Holds() || below {
		t.Errorf("near tie: holds %v, warnings %v", rep.Holds(), rep.Warnings)
	}
	// Turned off, no margin warning; the model's numbers without weights
	// draw one.
	rep, err = Verify(g, Request{Inputs: dz(g, [][]int32{lookup(t, g, "x0")}), Weights: true, WarnMargin: -1})
	if _, low := kinds(rep.Warnings)[WarnLowMargin]; err != nil || low {
		t.Errorf("WarnMargin -1: %v %v", err, rep.Warnings)
	}
	g2 := testNet(t, 2, [][2]int32{{0, 1}})
	rep, err = Verify(g2, Request{Inputs: dz(g2, [][]int32{{0}}), Weights: true})
	if err != nil {
		t.Fatal(err)
	}
	if _, ok := kinds(rep.Warnings)[WarnNoNetworkWeights]; !ok {
		t.Errorf("no warning for a network without weights: %v", rep.Warnings)
	}
}

// testNet builds an unweighted network of n states named 0..n-1.
func testNet(t testing.TB, n int, edges [][2]int32) *structural.Network {
	b := structural.NewIntBuilder(n, 0)
	for _, e := range edges {
		b.AddEdge(e[0], e[1])
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	return g
}

// A part verified through Request.Part gives the same verdicts as
// verifying the induced subnetwork directly with the restricted design
// (the independent route: Induced, RestrictDesign and a plain Verify),
// reports one count of its states (part.nodes), keeps the whole network's
// counts at the top, and names the signals it left out.
func TestVerifyPart(t *testing.T) {
	// A chain 0 -> 1 -> ... -> 9 with a branch 4 -> 10; inputs at 0, 3
	// and 8.
	var edges [][2]int32
	for i := int32(0); i < 9; i++ {
		edges = append(edges, [2]int32{i, i + 1})
	}
	edges = append(edges, [2]int32{4, 10})
	g := testNet(t, 11, edges)
	in := mustDesign(g, [][]int32{{0}, {3}, {8}})
	req := Request{Inputs: &in, Seed: 3, Part: &Part{Centres: []int32{4}, Hops: 2}}
	res, err := Verify(g, req)
	if err != nil {
		t.Fatal(err)
	}
	pr := res.Part
	if pr == nil || pr.Nodes != 6 || pr.SignalsLeftOut != 2 || res.Nodes != 11 || res.Edges != 10 {
		t.Fatalf("part %+v, whole %d states %d edges", pr, res.Nodes, res.Edges)
	}
	if got := pr.States.Names(); !slices.Equal(got, []string{"2", "3", "4", "5", "6", "10"}) {
		t.Errorf("part states %v", got)
	}
	if pr.Describe() != "the states within 2 steps of 4" {
		t.Errorf("description %q", pr.Describe())
	}
	// No signal acts on the part: refused.
	req.Part = &Part{Centres: []int32{10}, Hops: 1}
	if _, err := Verify(g, req); !errors.Is(err, ErrPartWithoutSignals) {
		t.Errorf("part without signals: %v", err)
	}
	// Default centres (the first input's states), no hop limit, at most 9
	// states: the first nine met from 0 breadth-first.
	req.Part = &Part{Hops: NoLimit, Limit: 9}
	res, err = Verify(g, req)
	if err != nil {
		t.Fatal(err)
	}
	pr = res.Part
	if pr.Nodes != 9 || pr.CentreSignal == nil || pr.CentreSignal.Number != 1 || pr.Hops != nil || pr.SignalsLeftOut != 1 { // 8 is the tenth state met
		t.Fatalf("sampled part %+v", pr)
	}
	keep := Around(g, []int32{0}, -1, 9)
	sub, newOf, err := Induced(g, keep)
	if err != nil {
		t.Fatal(err)
	}
	rd, _, _, err := RestrictDesign(in, nil, sub, newOf)
	if err != nil {
		t.Fatal(err)
	}
	direct, err := Verify(sub, Request{Inputs: &rd, Seed: 3})
	if err != nil {
		t.Fatal(err)
	}
	a, b := res.Controllability, direct.Controllability
	if a.Dimension != b.Dimension || a.SampledDimension != b.SampledDimension || a.Holds != b.Holds || a.Signals != b.Signals {
		t.Errorf("part %+v, direct %+v", a.Sample, b.Sample)
	}
	if res.Network.N() != 9 {
		t.Errorf("Network has %d states", res.Network.N())
	}
	found := false
	for _, w := range res.Warnings {
		found = found || w.Kind == WarnPartOnly
	}
	if !found {
		t.Errorf("no part_only warning: %v", res.Warnings)
	}
}

// Modes and effort need the dense floating-point work: above
// MaxFloatStates they are refused with the dense stage's estimate (the
// margin alone is skipped instead), and with the floating-point check
// turned off they are an error.
func TestVerifyDenseRefusal(t *testing.T) {
	g, in := erNetwork(60, 3, 11)
	req := Request{Inputs: dz(g, in), Seed: 1, MaxFloatStates: 50, Modes: true}
	_, err := Verify(g, req)
	var se *SizeError
	if !errors.As(err, &se) || se.Stage != StageDense || se.Limit != 50 || se.States != 60 || se.Estimate.Seconds <= 0 || se.Estimate.Bytes < 60*60*8 {
		t.Fatalf("modes above the dense limit: %v (%+v)", err, se)
	}
	if err2 := CheckSize(Counts{States: 60, Edges: g.Edges(), Inputs: len(in)}, req); !errors.As(err2, &se) || se.Stage != StageDense {
		t.Errorf("CheckSize: %v", err2)
	}
	req.Modes = false
	res, err := Verify(g, req)
	if err != nil || res.Controllability.FloatSkipped == "" || res.Controllability.Margin != nil {
		t.Errorf("margin above the limit: %v, %+v", err, res.Controllability.Sample)
	}
	req.Effort, req.MaxFloatStates = true, -1
	if _, err := Verify(g, req); err == nil || errors.As(err, &se) {
		t.Errorf("effort with the floating-point check off: %v", err)
	}
	req.MaxFloatStates, req.Horizon = 0, -2
	if _, err := Verify(g, req); !errors.Is(err, ErrHorizon) {
		t.Errorf("negative horizon: %v", err)
	}
}
