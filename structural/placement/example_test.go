package placement_test

import (
	"fmt"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/placement"
)

// A fictional cooling skid: a pump drives loop A, whose temperature feeds
// back on the pump through a controller state (a cycle that nothing
// enters), and also pushes loop B, whose valve has an actuator already.
// The pump's state may not take one and temperatures cost more.
func ExamplePlace() {
	b := structural.NewBuilder()
	add := func(u, v string) {
		x, _ := b.Intern([]byte(u))
		y, _ := b.Intern([]byte(v))
		b.AddEdge(x, y)
	}
	add("ctrl", "pump")
	add("pump", "flowA")
	add("flowA", "tempA")
	add("tempA", "ctrl")
	add("pump", "flowB")
	add("valveB", "flowB")
	add("flowB", "tempB")
	g, _ := b.Build(structural.BuildOptions{})
	d := structural.Devices{Cost: make([]structural.Cost, g.N()), Forbidden: make([]bool, g.N()), Existing: make([]bool, g.N())}
	for v := range d.Cost {
		d.Cost[v] = 10 * structural.Unit
	}
	id := func(s string) int32 { v, _ := g.Lookup(s); return v }
	d.Forbidden[id("pump")] = true
	d.Existing[id("valveB")] = true
	d.Cost[id("tempA")], d.Cost[id("tempB")] = 50*structural.Unit, 50*structural.Unit
	pl, _ := placement.Place(g, structural.Controllability, d)
	fmt.Println("feasible:", pl.Feasible, "cost:", pl.Cost)
	fmt.Println("devices:", pl.Devices.Names())
	for _, r := range pl.Roles(5) {
		fmt.Println(g.Name(r.State), "forced:", r.Forced, "alternatives:", r.Alternatives.Names())
	}
	// Output:
	// feasible: true cost: 10
	// devices: [ctrl valveB]
	// ctrl forced: false alternatives: [flowA]
}
