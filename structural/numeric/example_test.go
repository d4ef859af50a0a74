package numeric_test

import (
	"errors"
	"fmt"
	"math"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/numeric"
	"github.com/netsteer/netsteer/structural/placement"
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

// Example: the same bottling line with its own numbers. The two fillers'
// difference (filler1 - filler2) obeys x' = -0.25 x whatever the conveyor
// does: a mode the actuator cannot move, living on both fillers. It is
// stable, so the line is still stabilizable: feedback need not move it.
func ExampleVerify_modes() {
	b := structural.NewBuilder()
	id := func(s string) int32 { v, _ := b.Intern([]byte(s)); return v }
	conv, f1, f2 := id("conveyor.speed"), id("filler1.level"), id("filler2.level")
	b.AddWeightedEdge(conv, conv, -1)
	b.AddWeightedEdge(conv, f1, 0.8)
	b.AddWeightedEdge(conv, f2, 0.8)
	b.AddWeightedEdge(f1, f1, -0.25)
	b.AddWeightedEdge(f2, f2, -0.25)
	g, _ := b.Build(structural.BuildOptions{})
	in, _ := structural.NewDesign(g, [][]int32{{conv}}, nil)
	res, err := numeric.Verify(g, numeric.Request{Inputs: &in, Weights: true, Modes: true, Effort: true})
	if err != nil {
		fmt.Println(err)
		return
	}
	tr := res.Controllability.Trials[0]
	fmt.Printf("controllable dimension %d of %d\n", tr.Modes.Dimension, res.Nodes)
	for _, m := range tr.Modes.List {
		fmt.Printf("stuck mode %s (multiplicity %d, %s) on %v\n", m.Exact, m.Multiplicity, m.Stability, m.States.Names())
	}
	fmt.Println("stabilizable:", *res.Controllability.ModesStable)
	fmt.Println("every direction reachable:", !math.IsInf(tr.Effort.WorstCaseEnergy, 1))
	// Output:
	// controllable dimension 2 of 3
	// stuck mode -1/4 (multiplicity 1, stable) on [filler1.level filler2.level]
	// stabilizable: true
	// every direction reachable: false
}

// Example: a fictional cooling loop needs one actuator, and any of its
// three states can take it at the same cost. The Gramian of each choice
// (infinite horizon; the loop is stable) says how much input energy the
// hardest direction needs: the pump is by far the cheapest to steer from.
func ExampleRankCandidates() {
	b := structural.NewBuilder()
	id := func(s string) int32 { v, _ := b.Intern([]byte(s)); return v }
	pump, valve, tank := id("pump"), id("valve"), id("tank")
	b.AddWeightedEdge(pump, pump, -1)
	b.AddWeightedEdge(pump, valve, 2)
	b.AddWeightedEdge(valve, valve, -3)
	b.AddWeightedEdge(valve, tank, 0.5)
	b.AddWeightedEdge(tank, tank, -0.5)
	b.AddWeightedEdge(tank, pump, 0.1)
	g, _ := b.Build(structural.BuildOptions{})
	pl, _ := placement.Place(g, structural.Controllability, structural.Devices{})
	cands, _ := numeric.PlacementCandidates(g, pl, pl.Roles(5))
	rk, err := numeric.RankCandidates(g, cands, numeric.RankRequest{Weights: true})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, c := range rk.Candidates {
		fmt.Printf("%d. actuator on %s: worst-case energy %.3g, trace %.3g\n",
			c.Rank, g.Name(c.Design.Signal(0)[0]), c.WorstCaseEnergy, c.GramianTrace)
	}
	// Output:
	// 1. actuator on pump: worst-case energy 57.6, trace 0.756
	// 2. actuator on valve: worst-case energy 2.85e+04, trace 0.192
	// 3. actuator on tank: worst-case energy 4.77e+04, trace 1.05
}

// Example: the double integrator x1' = x2, x2' = u over one second has
// the Gramian [[1/3, 1/2], [1/2, 1]] (common practice): trace 4/3,
// determinant 1/12, so λ_min = (4/3 - sqrt(16/9 - 1/3))/2 ≈ 0.0657 and the
// hardest unit state costs 1/λ_min ≈ 15.2 units of input energy.
func ExampleGramianEffort() {
	a := []float64{0, 1, 0, 0}
	bm := []float64{0, 1}
	e, err := numeric.GramianEffort(a, bm, 2, 1, numeric.EffortRequest{Horizon: 1})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("trace %.4f, worst-case energy %.1f\n", e.GramianTrace, e.WorstCaseEnergy)
	// Output: trace 1.3333, worst-case energy 15.2
}

// Example: two million states are refused from the counts alone, before a
// network is built, with the stage and the limit (the estimate itself
// depends on the machine: years, and tebibytes of memory).
func ExampleCheckSize() {
	err := numeric.CheckSize(numeric.Counts{States: 2_000_000, Edges: 10_000_000, Inputs: 40}, numeric.Request{})
	var se *numeric.SizeError
	if errors.As(err, &se) {
		fmt.Println(se.Stage, se.States, "above", se.Limit, "- more than a year:", se.Estimate.Seconds > 365*86400)
	}
	// Output: exact 2000000 above 2000 - more than a year: true
}

// Example: verify only the neighbourhood of one state of a chain too
// long to verify whole: the part within two steps, with the design
// restricted to it.
func ExampleVerify_part() {
	b := structural.NewIntBuilder(100, 0)
	for i := int32(0); i < 99; i++ {
		b.AddEdge(i, i+1)
	}
	g, _ := b.Build(structural.BuildOptions{})
	mid, _ := g.Lookup("50")
	start, _ := g.Lookup("48")
	in, _ := structural.NewDesign(g, [][]int32{{0}, {start}}, nil)
	res, err := numeric.Verify(g, numeric.Request{Inputs: &in, Seed: 1, Part: &numeric.Part{Centres: []int32{mid}, Hops: 2}})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(res.Part.Describe())
	fmt.Printf("%d of %d states, %d signal left out; controllable: %v\n", res.Part.Nodes, res.Nodes, res.Part.SignalsLeftOut, res.Holds())
	// Output:
	// the states within 2 steps of 50
	// 5 of 100 states, 1 signal left out; controllable: true
}
