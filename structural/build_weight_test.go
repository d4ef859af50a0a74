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
		edge    int64 // index of the offending entry: b -> c is edge 0
	}{
		{"overflow", structural.BuildOptions{}, []float64{1e308, 1e308, 1}, math.Inf(1), 2, 2},
		{"negative overflow", structural.BuildOptions{}, []float64{-1e308, -1e308}, math.Inf(-1), 2, 2},
		{"undirected", structural.BuildOptions{Undirected: true}, []float64{1e308, 1e308}, math.Inf(1), 2, 2},
		{"self-dynamics", structural.BuildOptions{SelfDynamics: true}, []float64{1, 1e308, 1e308}, math.Inf(1), 3, 3},
		{"given inf", structural.BuildOptions{}, []float64{math.Inf(1)}, math.Inf(1), 1, 1},
		{"given nan", structural.BuildOptions{}, []float64{math.NaN()}, math.NaN(), 1, 1},
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
			if we.Edge != tt.edge {
				t.Errorf("Edge %d, want %d", we.Edge, tt.edge)
			}
		})
	}
	// Undirected, the mirror of an earlier input edge can overflow: a -> b
	// (edge 1) then the mirror of b -> a (edge 0) in row a.
	b0 := structural.NewBuilder()
	a0, _ := b0.Intern([]byte("a"))
	c0, _ := b0.Intern([]byte("b"))
	b0.AddWeightedEdge(c0, a0, 1e308)
	b0.AddWeightedEdge(a0, c0, 1e308)
	_, err := b0.Build(structural.BuildOptions{Undirected: true})
	var we *structural.WeightError
	if !errors.As(err, &we) || we.From != "a" || we.To != "b" || we.Edge != 0 {
		t.Errorf("undirected mirror: got %+v, want a -> b from edge 0", err)
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
