package structural_test

import (
	"errors"
	"math"
	"testing"

	"github.com/netsteer/netsteer/structural"
)

// Repeated edges add their weights; a sum that overflows float64 (two
// entries of 1e308: 2e308 > MaxFloat64 ≈ 1.8e308, IEEE 754 binary64) or a
// non-finite weight given through the library is refused with the edge.
func TestBuildRefusesNonFiniteWeight(t *testing.T) {
	tests := []struct {
		name    string
		opt     structural.BuildOptions
		ws      []float64 // weights of the entries of a -> b, in order
		sum     float64
		entries int
	}{
		{"overflow", structural.BuildOptions{}, []float64{1e308, 1e308, 1}, math.Inf(1), 2},
		{"negative overflow", structural.BuildOptions{}, []float64{-1e308, -1e308}, math.Inf(-1), 2},
		{"undirected", structural.BuildOptions{Undirected: true}, []float64{1e308, 1e308}, math.Inf(1), 2},
		{"given inf", structural.BuildOptions{}, []float64{math.Inf(1)}, math.Inf(1), 1},
		{"given nan", structural.BuildOptions{}, []float64{math.NaN()}, math.NaN(), 1},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			b := structural.NewBuilder()
			a, _ := b.Intern([]byte("a"))
			c, _ := b.Intern([]byte("b"))
			d, _ := b.Intern([]byte("c"))
			b.AddWeightedEdge(c, d, 1)
			for _, w := range tt.ws {
				b.AddWeightedEdge(a, c, w)
			}
			_, err := b.Build(tt.opt)
			var we *structural.WeightError
			if !errors.As(err, &we) {
				t.Fatalf("Build: err = %v, want a *WeightError", err)
			}
			if we.Entries != tt.entries || !(we.Sum == tt.sum || math.IsNaN(tt.sum) && math.IsNaN(we.Sum)) {
				t.Errorf("got %+v, want sum %g after %d entries", we, tt.sum, tt.entries)
			}
			if !(we.From == "a" && we.To == "b" || tt.opt.Undirected && we.From == "b" && we.To == "a") {
				t.Errorf("edge %s -> %s, want a -> b", we.From, we.To)
			}
		})
	}
	// Large weights whose sum stays finite are kept.
	b := structural.NewBuilder()
	a, _ := b.Intern([]byte("a"))
	c, _ := b.Intern([]byte("b"))
	b.AddWeightedEdge(a, c, 1e308)
	b.AddWeightedEdge(a, c, -1e308)
	b.AddWeightedEdge(a, c, 1e308)
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if w, _ := g.Weight(a, c); w != 1e308 {
		t.Errorf("weight %g, want 1e308", w)
	}
}
