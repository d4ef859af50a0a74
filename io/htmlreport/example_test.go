package htmlreport_test

import (
	"fmt"

	"github.com/netsteer/netsteer/io/htmlreport"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/analysis"
)

// ExampleFromReview builds the first screen of the review of an invented
// dosing line judged with one actuator on the dosing pump: nothing acts
// on the bypass valve, so no input reaches it and, with no in-neighbour,
// it is a dilation of one state by itself; the answer is No, and the card
// says what is missing in the question's terms.
func ExampleFromReview() {
	b := structural.NewBuilder()
	for _, e := range [][2]string{{"dose.pump", "dose.flow"}, {"dose.flow", "out.conc"}, {"bypass.valve", "out.conc"}} {
		u, _ := b.Intern([]byte(e[0]))
		v, _ := b.Intern([]byte(e[1]))
		b.AddEdge(u, v)
	}
	g, _ := b.Build(structural.BuildOptions{})
	pump, _ := g.Lookup("dose.pump")
	d, _ := structural.Dedicated(g, []int32{pump})
	rv, _ := analysis.Analyse(g, analysis.ReviewRequest{Inputs: &d, Complete: true})
	page := htmlreport.FromReview(rv, htmlreport.Context{Title: "dosing", Network: "dosing.edges", InputsFile: "pump.txt", Inputs: &d})
	for _, a := range page.Answers {
		fmt.Println(a.Topic)
		fmt.Println(" ", a.Word, "-", a.Headline)
	}
	// Output:
	// Is dosing.edges structurally controllable from the inputs in pump.txt?
	//   No - Not structurally controllable: 1 state unreached; a dilation: at least 1 more input needed.
	// For reference: the network
	//    - 4 states, 3 edges; at least 2 independent control signals (N_D).
}
