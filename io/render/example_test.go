package render_test

import (
	"fmt"

	"github.com/netsteer/netsteer/io/render"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/analysis"
)

// ExampleSelect builds the picture of a review of an invented dosing
// line and lets the automatic choice pick the view: the whole network up
// to MaxNodes states, the control structure above.
func ExampleSelect() {
	b := structural.NewBuilder()
	for _, e := range [][2]string{{"dose.pump", "dose.flow"}, {"dose.flow", "mix.conc"}, {"mix.conc", "out.conc"}, {"bypass.valve", "out.conc"}} {
		u, _ := b.Intern([]byte(e[0]))
		v, _ := b.Intern([]byte(e[1]))
		b.AddEdge(u, v)
	}
	g, _ := b.Build(structural.BuildOptions{})
	rv, _ := analysis.Analyse(g, analysis.ReviewRequest{})
	in, _ := render.FromReview(rv, nil, nil)
	for _, max := range []int{10, 3} {
		v, _ := render.Select(in, render.Options{MaxNodes: max})
		fmt.Println(v.Kind, "-", v.Desc)
	}
	fmt.Println(in.Notes[0])
	// Output:
	// whole - whole network (chosen for 5 states: up to 10 are drawn one by one)
	// control - control structure: 2 stems, longest first (chosen for 5 states: more than 3 are not drawn one by one)
	// Minimum number of independent control signals N_D = 2 (driver nodes of a maximum matching).
}
