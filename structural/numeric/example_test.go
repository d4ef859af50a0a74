package numeric_test

import (
	"fmt"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/numeric"
)

// Example: a fictional bottling line's conveyor feeds two identical
// fillers. With their own numbers (equal filler dynamics) one actuator on
// the conveyor cannot steer both fillers apart; the structure alone would
// say it can, and random samples agree with the structure.
func ExampleVerify() {
	b := structural.NewBuilder()
	id := func(s string) int32 { v, _ := b.Intern([]byte(s)); return v }
	conv, f1, f2 := id("conveyor.speed"), id("filler1.level"), id("filler2.level")
	b.AddWeightedEdge(conv, f1, 0.8)
	b.AddWeightedEdge(conv, f2, 0.8)
	b.AddWeightedEdge(f1, f1, -0.25)
	b.AddWeightedEdge(f2, f2, -0.25)
	g, _ := b.Build(structural.BuildOptions{})
	in, _ := structural.NewDesign(g, [][]int32{{conv}}, nil)
	for _, weights := range []bool{false, true} {
		res, err := numeric.Verify(g, numeric.Request{Inputs: &in, Weights: weights, Seed: 1})
		if err != nil {
			fmt.Println(err)
			return
		}
		c := res.Controllability
		fmt.Printf("weights %v: structure holds %v (dimension %d); numbers: dimension %d of %d, agrees %v\n",
			weights, c.Holds, c.Dimension, c.SampledDimension, res.Nodes, c.Agrees)
		for _, w := range res.Warnings {
			fmt.Println("  warning:", w.Kind)
		}
	}
	// Output:
	// weights false: structure holds true (dimension 3); numbers: dimension 3 of 3, agrees true
	// weights true: structure holds true (dimension 3); numbers: dimension 2 of 3, agrees false
	//   warning: below_structure
}
