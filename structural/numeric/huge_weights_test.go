package numeric_test

import (
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/numeric"
)

// A model whose numbers are near the float64 limits (1e150: squares near
// 1e300; 1e308: squares overflow, IEEE 754 binary64) gets an answer or an
// error from the floating-point parts, never a panic inside LAPACK.
func TestHugeWeightsNoPanic(t *testing.T) {
	for _, x := range []float64{1e150, 1e308} {
		b := structural.NewBuilder()
		id := func(s string) int32 { v, _ := b.Intern([]byte(s)); return v }
		a, c, d := id("a"), id("b"), id("c")
		b.AddWeightedEdge(a, c, x)
		b.AddWeightedEdge(c, d, x)
		b.AddWeightedEdge(d, a, -x)
		b.AddWeightedEdge(a, a, -x)
		g, err := b.Build(structural.BuildOptions{})
		if err != nil {
			t.Fatal(err)
		}
		in, _ := structural.NewDesign(g, [][]int32{{a}}, nil)
		res, err := numeric.Verify(g, numeric.Request{Inputs: &in, Weights: true, Modes: true, Effort: true, Horizon: 1})
		if err == nil && res.Controllability == nil {
			t.Errorf("%g: no result and no error", x)
		}
		// The exact check does not use floating point: the pattern's
		// dimension 3 (a stem a -> b -> c) holds for these numbers.
		if res != nil && res.Controllability != nil && res.Controllability.Trials[0].Dimension != 3 {
			t.Errorf("%g: exact dimension %d, want 3", x, res.Controllability.Trials[0].Dimension)
		}
		for _, rr := range []numeric.RankRequest{{Weights: true, Effort: numeric.EffortRequest{Horizon: 1}}, {Weights: true}} {
			if ranked, err := numeric.RankDesigns(g, []structural.Design{in}, rr); err == nil && (ranked == nil || len(ranked.Candidates) != 1) {
				t.Errorf("%g: RankDesigns gave no ranking and no error", x)
			}
		}
	}
}

// Without Modes or Effort, numbers whose squares overflow float64 (IEEE 754
// binary64: 1e200^2 = 1e400) keep the exact answer, computed over GF(p)
// with no rounding, and skip the floating-point margin with the reason.
func TestHugeWeightsKeepExact(t *testing.T) {
	b := structural.NewBuilder()
	id := func(s string) int32 { v, _ := b.Intern([]byte(s)); return v }
	a, c, d := id("a"), id("b"), id("c")
	b.AddWeightedEdge(a, c, 1e200)
	b.AddWeightedEdge(c, d, 1e200)
	b.AddWeightedEdge(d, d, 2)
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	in, _ := structural.NewDesign(g, [][]int32{{a}}, nil)
	res, err := numeric.Verify(g, numeric.Request{Inputs: &in, Weights: true})
	if err != nil {
		t.Fatalf("Verify: %v", err)
	}
	r := res.Controllability
	// A stem a -> b -> c driven at a: dimension 3 for any nonzero numbers,
	// since its controllability matrix is triangular with the products of
	// the couplings on its diagonal (common practice).
	if r.Trials[0].Dimension != 3 || r.Margin != nil || r.FloatSkipped == "" {
		t.Errorf("dimension %d, margin %v, float skipped %q: want 3, none, a reason", r.Trials[0].Dimension, r.Margin, r.FloatSkipped)
	}
}
