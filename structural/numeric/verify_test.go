package numeric

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
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
		rep, err := Verify(g, mustDesign(g, in), mustDesign(g, nil), Options{Weights: true, InputWeights: [][]float64{{1.5}}})
		if err != nil {
			t.Fatal(err)
		}
		r := rep.Controllability
		if r.Structural != 3 {
			t.Fatalf("structural dimension %d, want 3", r.Structural)
		}
		if r.Sampled != tc.wantDim {
			t.Errorf("self-loops %g, %g: weighted dimension %d, want %d", tc.la, tc.lb, r.Sampled, tc.wantDim)
		}
		if r.Agrees != (tc.wantDim == 3) || r.Full != (tc.wantDim == 3) {
			t.Errorf("self-loops %g, %g: agrees %v full %v", tc.la, tc.lb, r.Agrees, r.Full)
		}
		if tc.wantDim < 3 && r.Trials[0].AltDimension != tc.wantDim {
			t.Errorf("second prime gives %d, want %d", r.Trials[0].AltDimension, tc.wantDim)
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
	rep, err := Verify(g, mustDesign(g, in), mustDesign(g, nil), Options{Weights: true})
	if err != nil {
		t.Fatal(err)
	}
	r := rep.Controllability
	if r.Structural != 3 || r.Sampled != 2 || rep.Inexact != 0 {
		t.Fatalf("structural %d sampled %d inexact %d, want 3, 2, 0", r.Structural, r.Sampled, rep.Inexact)
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
		rep, err := Verify(g, mustDesign(g, in), mustDesign(g, out), Options{Weights: true, InputWeights: inW, OutputWeights: outW, MaxFloatStates: -1})
		if err != nil {
			t.Fatal(err)
		}
		for _, r := range []*Result{rep.Controllability, rep.Observability} {
			if r.Sampled > r.Structural {
				t.Fatalf("case %d: weighted dimension %d exceeds the structural %d", c, r.Sampled, r.Structural)
			}
			if r.Full && r.Structural != n {
				t.Fatalf("case %d: weighted model controllable, structure not", c)
			}
			if r.Sampled < r.Structural {
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
		rep, err := Verify(g, mustDesign(g, in), mustDesign(g, out), Options{Trials: 1, Seed: uint64(c), MaxFloatStates: -1})
		if err != nil {
			t.Fatal(err)
		}
		for _, r := range []*Result{rep.Controllability, rep.Observability} {
			if !r.Agrees {
				t.Fatalf("case %d: sampled %d, structural %d", c, r.Sampled, r.Structural)
			}
			if r.Full {
				full++
			}
		}
	}
	t.Logf("%d of 6000 full", full)
}

// The same seed reproduces a run; another seed draws other numbers.
func TestVerifySeed(t *testing.T) {
	g, in := erNetwork(40, 3, 5)
	run := func(seed uint64) *Report {
		rep, err := Verify(g, mustDesign(g, in), mustDesign(g, nil), Options{Seed: seed, Trials: 2})
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
	if !a.Controllability.Full || !a.Controllability.Agrees {
		t.Errorf("minimum driver design not confirmed: %+v", a.Controllability)
	}
}

// Above the limit Verify refuses with the estimated cost instead of
// starting a long computation.
func TestVerifySizeError(t *testing.T) {
	g, in := erNetwork(300, 4, 9)
	_, err := Verify(g, mustDesign(g, in), mustDesign(g, nil), Options{MaxStates: 100})
	var se *SizeError
	if !errors.As(err, &se) {
		t.Fatalf("error %v, want a *SizeError", err)
	}
	if se.N != 300 || se.Max != 100 || se.Time <= 0 || se.Bytes < 300*300*8 {
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
		rep, err := Verify(g, mustDesign(g, nil), mustDesign(g, [][]int32{lookup(t, g, tc.sense)}), Options{Seed: 1})
		if err != nil {
			t.Fatal(err)
		}
		if r := rep.Observability; r.Sampled != tc.want || r.Structural != tc.want {
			t.Errorf("sensing %s: sampled %d structural %d, want %d", tc.sense, r.Sampled, r.Structural, tc.want)
		}
	}
}

// Example: a fictional bottling line's conveyor feeds two identical
// fillers. With their own numbers (equal filler dynamics) one actuator on
// the conveyor cannot steer both fillers apart; the structure alone would
// say it can.
func ExampleVerify() {
	b := structural.NewBuilder()
	id := func(s string) int32 { v, _ := b.Intern([]byte(s)); return v }
	conv, f1, f2 := id("conveyor.speed"), id("filler1.level"), id("filler2.level")
	b.AddWeightedEdge(conv, f1, 0.8)
	b.AddWeightedEdge(conv, f2, 0.8)
	b.AddWeightedEdge(f1, f1, -0.25)
	b.AddWeightedEdge(f2, f2, -0.25)
	g, _ := b.Build(structural.BuildOptions{})
	in := [][]int32{{conv}}
	for _, weights := range []bool{false, true} {
		rep, _ := Verify(g, mustDesign(g, in), mustDesign(g, nil), Options{Weights: weights, Seed: 1})
		r := rep.Controllability
		fmt.Printf("weights %v: dimension %d of %d, structure %d, agrees %v\n", weights, r.Sampled, rep.N, r.Structural, r.Agrees)
	}
	// Output:
	// weights false: dimension 3 of 3, structure 3, agrees true
	// weights true: dimension 2 of 3, structure 3, agrees false
}

// A trial count beyond MaxTrials is refused before anything is drawn: the
// samples of every trial once stayed in memory together, and 10^8 trials
// of a three-state network exhausted it.
func TestVerifyTrialsLimit(t *testing.T) {
	g, in := erNetwork(20, 3, 5)
	if _, err := Verify(g, mustDesign(g, in), mustDesign(g, nil), Options{Seed: 1, Trials: MaxTrials + 1}); err == nil || !strings.Contains(err.Error(), "at most 1000") {
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
