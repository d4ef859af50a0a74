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
		_, _ = numeric.RankDesigns(g, []structural.Design{in}, numeric.RankRequest{Weights: true, Effort: numeric.EffortRequest{Horizon: 1}})
		_, _ = numeric.RankDesigns(g, []structural.Design{in}, numeric.RankRequest{Weights: true})
	}
}
