package structural_test

import (
	"fmt"

	"github.com/netsteer/netsteer/structural"
)

// filtrationWorks builds a small invented water-treatment train: an edge
// u -> v means that process variable u acts on v.
func filtrationWorks() *structural.Network {
	b := structural.NewBuilder()
	for _, e := range [][2]string{
		{"intake_flow", "coag_dose"},
		{"intake_flow", "clearwell_level"},
		{"raw_turbidity", "floc_size"},
		{"coag_dose", "floc_size"},
		{"floc_size", "settled_turbidity"},
		{"settled_turbidity", "filter_headloss"},
		{"settled_turbidity", "filtered_turbidity"},
		{"filter_headloss", "filtered_turbidity"},
		{"filtered_turbidity", "chlorine_residual"},
		{"chlorine_residual", "chlorine_residual"},
		{"clearwell_level", "chlorine_residual"},
	} {
		u, _ := b.Intern([]byte(e[0]))
		v, _ := b.Intern([]byte(e[1]))
		b.AddEdge(u, v)
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		panic(err)
	}
	return g
}

func names(g *structural.Network, ids []int32) []string {
	out := make([]string, len(ids))
	for i, v := range ids {
		out[i] = g.Name(v)
	}
	return out
}

func ExampleDrivers() {
	g := filtrationWorks()
	ds := structural.Drivers(g)
	fmt.Printf("%d states need %d independent signals\n", g.N(), ds.Drivers.Len())
	for i, in := range ds.Inputs.Signals() {
		fmt.Printf("signal %d drives %v\n", i+1, names(g, in))
	}
	// Output:
	// 9 states need 3 independent signals
	// signal 1 drives [intake_flow]
	// signal 2 drives [coag_dose]
	// signal 3 drives [raw_turbidity]
}

func ExampleCheck() {
	g := filtrationWorks()
	id := func(name string) int32 {
		v, _ := g.Lookup(name)
		return v
	}
	// Two actuators: the intake pump and the raw-water blend valve.
	design, err := structural.NewDesign(g, [][]int32{{id("intake_flow")}, {id("raw_turbidity")}}, nil)
	if err != nil {
		panic(err)
	}
	v, err := structural.Check(g, structural.Controllability, design)
	if err != nil {
		panic(err)
	}
	fmt.Println("controllable:", v.Holds)
	fmt.Println("unreached:", names(g, v.Unreached.IDs()))
	if d := v.Dilation; d != nil {
		fmt.Printf("%v share only %v: one more actuator needed among them\n", names(g, d.States.IDs()), names(g, d.Neighbours.IDs()))
	}
	fmt.Printf("controllable dimension: %d of %d\n", v.Dimension, g.N())
	// Output:
	// controllable: false
	// unreached: []
	// [coag_dose clearwell_level] share only [intake_flow]: one more actuator needed among them
	// controllable dimension: 8 of 9
}
