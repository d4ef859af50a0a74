package target_test

import (
	"fmt"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/target"
)

// plant builds a fictional chilled-water skid: the chiller cools the
// header, the header feeds two building loops whose temperatures matter,
// each loop's valve position acts on its own flow, and the return water
// acts back on the chiller.
func plant() *structural.Network {
	b := structural.NewBuilder()
	add := func(u, v string) {
		x, _ := b.Intern([]byte(u))
		y, _ := b.Intern([]byte(v))
		b.AddEdge(x, y)
	}
	add("chiller", "header")
	add("header", "flowA")
	add("header", "flowB")
	add("valveA", "flowA")
	add("valveB", "flowB")
	add("flowA", "tempA")
	add("flowB", "tempB")
	add("tempA", "return")
	add("tempB", "return")
	add("return", "chiller")
	g, _ := b.Build(structural.BuildOptions{})
	return g
}

func ids(g *structural.Network, names ...string) []int32 {
	var out []int32
	for _, s := range names {
		v, _ := g.Lookup(s)
		out = append(out, v)
	}
	return out
}

// One actuator on the chiller cannot set both building temperatures: both
// depend on the header alone, two steps up. Adding the valve of loop B
// makes them steerable.
func ExampleCheck() {
	g := plant()
	targets := ids(g, "tempA", "tempB")
	for _, act := range [][]string{{"chiller"}, {"chiller", "valveB"}} {
		d, _ := structural.Dedicated(g, ids(g, act...))
		v, _ := target.Check(g, target.CheckRequest{Targets: targets, Inputs: d})
		fmt.Printf("%v: %s, dimension %d of %d (exact %v)\n", act, v.Status, v.Lower, v.Targets.Len(), v.Exact)
		if f := v.Funnel; f != nil {
			fmt.Printf("  every influence passes %v, %d steps before the targets\n", f.States.Names(), f.Depth)
		}
	}
	// Output:
	// [chiller]: not_controllable, dimension 1 of 2 (exact true)
	//   every influence passes [header], 2 steps before the targets
	// [chiller valveB]: controllable, dimension 2 of 2 (exact true)
}

// Steering the two building temperatures with dedicated actuators, a
// valve costing 10 and a trim heater on a temperature 50: full control
// takes both valves (each has no in-neighbour), but one valve alone
// reaches the two temperatures along walks of different lengths (2 and
// 7 steps), and that is enough.
func ExampleSelect() {
	g := plant()
	d := structural.Devices{Cost: make([]structural.Cost, g.N())}
	for v := range d.Cost {
		d.Cost[v] = 10 * structural.Unit
	}
	for _, v := range ids(g, "tempA", "tempB") {
		d.Cost[v] = 50 * structural.Unit
	}
	sel, _ := target.Select(g, target.SelectRequest{Targets: ids(g, "tempA", "tempB"), Mode: target.Actuators, Devices: d})
	fmt.Println("actuators:", sel.Driven.Names(), "cost:", sel.Cost, "optimal:", sel.Optimal)
	fmt.Println("full control:", sel.FullControl.Cost, "saved:", sel.CostSaved)
	// Output:
	// actuators: [valveB] cost: 10 optimal: true
	// full control: 20 saved: 10
}

// The numeric check: exact ranks over GF(2^61-1) on random samples.
func ExampleSample() {
	g := plant()
	d, _ := structural.Dedicated(g, ids(g, "valveA", "valveB"))
	res, _ := target.Sample(g, target.SampleRequest{Targets: ids(g, "tempA", "tempB"), Inputs: d, Seed: 1})
	fmt.Println("trials:", res.Trials, "holds:", res.Holds, "agrees:", res.Agrees)
	// Output:
	// trials: [2 2 2] holds: true agrees: true
}
