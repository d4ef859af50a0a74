package analysis_test

import (
	"fmt"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/analysis"
)

// The figures below are worked by hand from Lin's theorem (common
// practice): the set point and the pump have no incoming edge, and every
// other state has a matched in-neighbour, so N_D = 2; the two zone
// temperatures act only on the return temperature, so a sensor on the
// chiller load alone leaves them a contraction and the longest stem from
// it covers 5 states.

// coolingLoop is a fictional chilled-water loop: a chiller's set point
// drives the supply temperature, which acts on two zone temperatures; a
// pump speed drives the flow, which acts on both zones too; each zone
// feeds back on the return temperature, which acts on the chiller's load.
func coolingLoop() *structural.Network {
	b := structural.NewBuilder()
	for _, e := range [][2]string{
		{"chiller.setpoint", "supply.temp"},
		{"supply.temp", "zone1.temp"}, {"supply.temp", "zone2.temp"},
		{"pump.speed", "loop.flow"},
		{"loop.flow", "zone1.temp"}, {"loop.flow", "zone2.temp"},
		{"zone1.temp", "return.temp"}, {"zone2.temp", "return.temp"},
		{"return.temp", "chiller.load"},
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

// design returns the design whose signals drive (or sense) the named
// states, one state per signal.
func design(g *structural.Network, names ...string) *structural.Design {
	var ids []int32
	for _, n := range names {
		v, ok := g.Lookup(n)
		if !ok {
			panic(n)
		}
		ids = append(ids, v)
	}
	d, err := structural.Dedicated(g, ids)
	if err != nil {
		panic(err)
	}
	return &d
}

func ExampleDrivers() {
	g := coolingLoop()
	r, _ := analysis.Drivers(g, analysis.DriversRequest{})
	fmt.Println("signals needed:", r.DriverCount, "of", r.Nodes, "states")
	fmt.Println("driver nodes:", r.Drivers.Names())
	// Output:
	// signals needed: 2 of 8 states
	// driver nodes: [chiller.setpoint pump.speed]
}

func ExampleCheck() {
	g := coolingLoop()
	r, _ := analysis.Check(g, analysis.CheckRequest{
		Inputs:  design(g, "chiller.setpoint", "pump.speed"),
		Outputs: design(g, "chiller.load"),
	})
	for _, p := range r.Properties() {
		fmt.Printf("%s: holds %v, dimension %d of %d\n", p.Property, p.Holds, p.Dimension, r.Nodes)
		if d := p.Dilation; d != nil {
			fmt.Println("  dilation:", d.States.Names(), "share", d.Neighbours.Names())
		}
		if c := p.Completion; c != nil {
			fmt.Println("  cheapest completion:", c.Added.Names())
		}
	}
	// Output:
	// controllability: holds true, dimension 8 of 8
	// observability: holds false, dimension 5 of 8
	//   dilation: [zone1.temp zone2.temp] share [return.temp]
	//   cheapest completion: [zone1.temp]
}

func ExamplePlace() {
	g := coolingLoop()
	// Costs from a site survey (invented): the chiller's set point is
	// already wired, the flow meter's transmitter may not take a device,
	// and the pump's drive is cheap to fit.
	d := structural.Devices{Cost: make([]structural.Cost, g.N()), Forbidden: make([]bool, g.N()), Existing: make([]bool, g.N())}
	for v := range d.Cost {
		d.Cost[v] = 4 * structural.Unit
	}
	id := func(s string) int32 { v, _ := g.Lookup(s); return v }
	d.Existing[id("chiller.setpoint")] = true
	d.Forbidden[id("loop.flow")] = true
	d.Cost[id("pump.speed")] = structural.Unit + structural.Unit/2
	r, _ := analysis.Place(g, analysis.PlaceRequest{Property: structural.Controllability, Devices: d, Roles: true, Alternatives: 3})
	fmt.Println("feasible:", r.Feasible, "new:", r.Added.Names(), "existing:", r.Existing.Names(), "cost:", r.Cost)
	for _, x := range r.Roles {
		fmt.Println(g.Name(x.State), "forced:", x.Forced, "alternatives:", x.Alternatives.Names())
	}
	// Output:
	// feasible: true new: [pump.speed] existing: [chiller.setpoint] cost: 1.5
	// pump.speed forced: true alternatives: []
}

func ExampleAnalyse() {
	g := coolingLoop()
	r, _ := analysis.Analyse(g, analysis.ReviewRequest{
		Inputs:       design(g, "chiller.setpoint", "pump.speed"),
		PlaceSensors: true,
		Roles:        true,
	})
	fmt.Println("drivers:", r.Drivers.DriverCount)
	fmt.Println("design holds:", r.Check.Controllability.Holds)
	fmt.Println("cheapest sensors:", r.Sensors.Devices.Names())
	fmt.Println("critical for inputs:", r.Drivers.NodeRoles.With(structural.Critical).Names())
	// Output:
	// drivers: 2
	// design holds: true
	// cheapest sensors: [zone1.temp chiller.load]
	// critical for inputs: [chiller.setpoint pump.speed]
}
