package strong_test

import (
	"fmt"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/strong"
)

// net builds a network from named edges (u acts on v).
func net(edges [][2]string, opt structural.BuildOptions) *structural.Network {
	b := structural.NewBuilder()
	for _, e := range edges {
		u, _ := b.Intern([]byte(e[0]))
		v, _ := b.Intern([]byte(e[1]))
		b.AddEdge(u, v)
	}
	g, err := b.Build(opt)
	if err != nil {
		panic(err)
	}
	return g
}

// A fictional buffer tank: the feed valve fills the tank and, through a
// bypass, also acts on the outlet flow, which the level drives too. One
// actuator on the valve controls it for almost all parameter values; for
// every value only if the level and the outlet have no self-dynamics of
// their own.
func ExampleCheck() {
	g := net([][2]string{{"valve", "level"}, {"level", "outflow"}, {"valve", "outflow"}}, structural.BuildOptions{})
	v, _ := g.Lookup("valve")
	d, _ := structural.Dedicated(g, []int32{v})
	gen, _ := structural.Check(g, structural.Controllability, d)
	fmt.Println("generic:", gen.Holds)
	for _, diag := range []strong.Diagonal{strong.FreeDiagonal, strong.ZeroDiagonal} {
		r, _ := strong.Check(g, strong.Request{Design: d, Class: strong.Class{Diagonal: diag}})
		fmt.Printf("strong with %s self-dynamics: %v, unforced %v\n", diag, r.Holds, r.Unforced.Names())
		if w := r.AtZero.Witness; w != nil {
			fmt.Printf("  eigenvalue %d, vector 1 on %v, confirmed %v:\n", w.Eigenvalue, w.Support.Names(), w.Confirmed)
			for _, e := range w.Entries {
				fmt.Printf("  A[%s][%s] = %d\n", g.Name(e.To), g.Name(e.From), e.Value)
			}
		}
	}
	// Output:
	// generic: true
	// strong with free self-dynamics: false, unforced [level outflow]
	//   eigenvalue 0, vector 1 on [level outflow], confirmed true:
	//   A[level][valve] = 1
	//   A[outflow][valve] = -1
	//   A[level][level] = -1
	//   A[outflow][level] = 1
	//   A[outflow][outflow] = 0
	// strong with zero self-dynamics: true, unforced []
}

// A fictional ring of six generators coupled both ways: one actuator
// controls it for almost all couplings, two adjacent ones for all of them
// (the zero forcing number of a cycle).
func ExamplePlace() {
	var ring [][2]string
	for i := 0; i < 6; i++ {
		ring = append(ring, [2]string{fmt.Sprintf("g%d", i+1), fmt.Sprintf("g%d", (i+1)%6+1)})
	}
	g := net(ring, structural.BuildOptions{Undirected: true})
	pl, _ := strong.Place(g, strong.PlaceRequest{})
	fmt.Println("actuators:", pl.Devices.Names(), "optimal:", pl.Optimal, "by", pl.BoundFrom)
	fmt.Println("generic minimum:", pl.GenericDevices)
	// Output:
	// actuators: [g5 g6] optimal: true by search
	// generic minimum: 1
}
