package gen

import (
	"strings"
	"testing"
)

// Params.Check accepts exactly the parameters the generators accept, so
// that generate and sweep refuse a bad combination before any work (a
// sweep would otherwise fail halfway through), and its message names the
// option to change.
func TestCheckAgreesWithGenerators(t *testing.T) {
	for _, tc := range []struct {
		model string
		set   map[string]string
		want  string // "" when valid; else a part of Check's message
	}{
		{"er", map[string]string{"nodes": "10", "mean_degree": "18"}, ""},
		{"er", map[string]string{"nodes": "10", "mean_degree": "18.2"}, "mean-degree 18.2 asks for 91 edges; 10 states hold at most 90"},
		{"er", map[string]string{"nodes": "1", "mean_degree": "0"}, ""},
		{"er", map[string]string{"nodes": "1", "mean_degree": "2"}, "mean-degree 2 asks for 1 edges"},
		{"scale-free", map[string]string{"nodes": "10", "mean_degree": "9"}, ""},
		{"scale-free", map[string]string{"nodes": "10", "mean_degree": "9.2"}, "static model"},
		{"scale-free", map[string]string{"nodes": "1", "mean_degree": "0"}, "nodes of at least 2"},
		{"scale-free", map[string]string{"nodes": "100", "gamma_out": "1.5"}, "gamma-out 1.5 must be greater than 2"},
		{"scale-free", map[string]string{"nodes": "100", "gamma_in": "2"}, "gamma-in 2 must be greater than 2"},
		{"small-world", map[string]string{"nodes": "10", "degree": "9"}, ""},
		{"small-world", map[string]string{"nodes": "10", "degree": "10"}, "degree 10 out of range [0, 9]"},
		{"small-world", map[string]string{"nodes": "10", "degree": "3", "two_way": "true"}, "even degree"},
		{"small-world", map[string]string{"nodes": "10", "rewire": "1.5"}, "rewire 1.5 is not a probability"},
		{"regular", map[string]string{"nodes": "5", "degree": "4"}, ""},
		{"regular", map[string]string{"nodes": "5", "degree": "5"}, "degree 5 out of range [0, 4]"},
		{"grid", map[string]string{"nodes": "10", "width": "10"}, ""},
		{"grid", map[string]string{"nodes": "10", "width": "11"}, "width 11 out of range [1, 10]"},
		{"grid", map[string]string{"nodes": "10", "width": "0"}, "width 0"},
		{"tree", map[string]string{"nodes": "10", "branching": "0"}, ""},
	} {
		p, err := FromSettings(tc.model, tc.set)
		name := tc.model
		for k, v := range tc.set {
			name += " " + k + "=" + v
		}
		if tc.want != "" {
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("%s: got error %v, want one holding %q", name, err, tc.want)
			}
			// Where Check is the only guard, the generator must fail too
			// (built by hand, skipping FromSettings).
			continue
		}
		if err != nil {
			t.Errorf("%s: got error %v, want none", name, err)
			continue
		}
		var s countSink
		if err := p.Generate(NewRand(1), &s); err != nil {
			t.Errorf("%s: Check passed but Generate failed: %v", name, err)
		}
	}
}

// The generators' own guards, reached through Params built by hand, fail
// where Check does: Check is never laxer than a generator.
func TestCheckNotLaxerThanGenerators(t *testing.T) {
	for _, p := range []Params{
		{Model: "er", Nodes: 10, MeanDegree: 18.2},
		{Model: "scale-free", Nodes: 10, MeanDegree: 9.2, GammaOut: 3, GammaIn: 3},
		{Model: "scale-free", Nodes: 100, MeanDegree: 2, GammaOut: 1.5, GammaIn: 3},
		{Model: "small-world", Nodes: 10, Degree: 3, TwoWay: true},
		{Model: "small-world", Nodes: 10, Degree: 2, Rewire: -0.1},
		{Model: "regular", Nodes: 5, Degree: 5},
		{Model: "grid", Nodes: 10, Width: 11, Directions: Right},
		{Model: "tree", Nodes: 10, Branching: -1},
	} {
		var s countSink
		genErr := p.Generate(NewRand(1), &s)
		// Skip Check inside Generate by calling the model's generator.
		var direct error
		switch p.Model {
		case "er":
			direct = ER(p.Nodes, p.targetEdges(), NewRand(1), &s)
		case "scale-free":
			direct = ScaleFree(p.Nodes, p.targetEdges(), p.GammaOut, p.GammaIn, NewRand(1), &s)
		case "small-world":
			direct = SmallWorld(p.Nodes, p.Degree, p.Rewire, p.TwoWay, NewRand(1), &s)
		case "regular":
			direct = Regular(p.Nodes, p.Degree, p.Side, NewRand(1), &s)
		case "grid":
			direct = Grid(p.Nodes, p.width(), p.dirs(), &s)
		case "tree":
			direct = Tree(p.Nodes, p.Branching, p.TwoWay, NewRand(1), &s)
		}
		if direct == nil {
			t.Fatalf("%+v: the generator accepts it; the test case is wrong", p)
		}
		if p.Check() == nil || genErr == nil {
			t.Errorf("%+v: Check passed, but the generator says %v", p, direct)
		}
	}
}
