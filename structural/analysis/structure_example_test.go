package analysis_test

import (
	"fmt"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/analysis"
)

// ExampleReview_Structure reads the control structure of an invented
// mixing tank: the feed pump's stem runs through the flow to the level,
// from which the loop of agitator and viscosity hangs; the heater's stem
// is the heater alone, and the temperature's own dynamics (a self-loop)
// hang from it as a cycle of one state.
func ExampleReview_Structure() {
	b := structural.NewBuilder()
	for _, e := range [][2]string{{"feed.pump", "feed.flow"}, {"feed.flow", "tank.level"}, {"heater", "tank.temp"},
		{"tank.temp", "tank.temp"}, {"tank.level", "agitator"}, {"agitator", "viscosity"}, {"viscosity", "agitator"}} {
		u, _ := b.Intern([]byte(e[0]))
		v, _ := b.Intern([]byte(e[1]))
		b.AddEdge(u, v)
	}
	g, _ := b.Build(structural.BuildOptions{})
	rv, _ := analysis.Analyse(g, analysis.ReviewRequest{})
	s, _ := rv.Structure(structural.Controllability, nil)
	for _, st := range s.Stems {
		fmt.Printf("u%d: %v, %d cycle(s) hung\n", st.Number, st.States.Names(), st.Cycles)
	}
	for _, c := range s.Cycles {
		fmt.Printf("cycle %v hung from stem %d at %v\n", c.States.Names(), c.Stem, c.Anchor.Names())
	}
	// Output:
	// u1: [feed.pump feed.flow tank.level], 1 cycle(s) hung
	// u2: [heater], 1 cycle(s) hung
	// cycle [agitator viscosity] hung from stem 0 at [tank.level]
	// cycle [tank.temp] hung from stem 1 at [heater]
}
