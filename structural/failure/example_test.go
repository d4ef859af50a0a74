package failure_test

import (
	"fmt"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/failure"
)

// cooling builds an invented demo: a small chilled-water loop. The pump
// drives the supply header, which feeds two zones; both return to the
// chiller, which cools the supply.
func cooling() *structural.Network {
	b := structural.NewBuilder()
	id := func(s string) int32 { v, _ := b.Intern([]byte(s)); return v }
	for _, e := range [][2]string{
		{"pump", "supply"}, {"chiller", "supply"}, {"supply", "zone1"}, {"supply", "zone2"},
		{"zone1", "return"}, {"zone2", "return"}, {"return", "chiller"},
	} {
		b.AddEdge(id(e[0]), id(e[1]))
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		panic(err)
	}
	return g
}

func ids(g *structural.Network, names ...string) []int32 {
	out := make([]int32, len(names))
	for i, s := range names {
		out[i], _ = g.Lookup(s)
	}
	return out
}

// Three dedicated actuators on the loop. The pump's is essential and
// cannot be replaced (nothing else acts on the pump); the one on zone 1 is
// essential too, since without it the two zones compete for the supply
// header's single influence (a dilation), and an actuator on zone 2 would
// replace it; the chiller's adds nothing to any sub-design. One link is a
// single point of failure on both counts: the supply header is zone 2's
// only way in, and its only in-neighbour.
func ExampleAssess() {
	g := cooling()
	d, _ := structural.Dedicated(g, ids(g, "pump", "zone1", "chiller"))
	as, err := failure.Assess(g, failure.Request{Design: d})
	if err != nil {
		panic(err)
	}
	fmt.Println("design holds:", as.Intact.Holds)
	for _, dl := range as.Devices {
		fmt.Printf("actuator on %s: %s", dl.Touches.Name(0), dl.Class)
		if dl.Unreached.Len() > 0 {
			fmt.Printf(", leaves %v unreached", dl.Unreached.Names())
		}
		if dl.Dilation {
			fmt.Printf(", opens a dilation on %v", dl.Witness.States.Names())
		}
		if r := dl.Replacement; r != nil {
			if r.Feasible {
				fmt.Printf("; replace by %v", r.Added.Names())
			} else {
				fmt.Print("; no replacement elsewhere")
			}
		}
		fmt.Println()
	}
	fmt.Println("links whose loss breaks the design:", len(as.Links))
	for _, l := range as.Links {
		fmt.Printf("  %s -> %s: %d unreached, dilation %v, fix %v\n", g.Name(l.From), g.Name(l.To), l.UnreachedCount, l.Dilation, l.Fix.Added.Names())
	}
	// Output:
	// design holds: true
	// actuator on pump: essential, leaves [pump] unreached, opens a dilation on [pump]; no replacement elsewhere
	// actuator on zone1: essential, opens a dilation on [zone1 zone2]; replace by [zone2]
	// actuator on chiller: useless
	// links whose loss breaks the design: 1
	//   supply -> zone2: 1 unreached, dilation true, fix [zone2]
}

// The cheapest actuators that keep the loop controllable after the loss
// of any one of them, spares allowed: the pump, with nothing acting on it,
// can only be protected by a second actuator of its own, and the zones'
// competition for the supply header needs an actuator on a zone, so one
// on each (four in all, which the exact search proves least).
func ExampleRobust() {
	g := cooling()
	rp, err := failure.Robust(g, failure.RobustRequest{Survive: failure.AnyDevice, Spares: true})
	if err != nil {
		panic(err)
	}
	fmt.Println("feasible:", rp.Feasible, "optimal:", rp.Optimal, "by", rp.Method)
	fmt.Println("actuators on:", rp.Devices.Names())
	fmt.Println("spares on:", rp.Spares.Names())
	fmt.Println("cost:", rp.Cost)
	// Output:
	// feasible: true optimal: true by exact search
	// actuators on: [pump zone1 zone2]
	// spares on: [pump]
	// cost: 4
}
