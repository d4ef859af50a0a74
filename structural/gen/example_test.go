package gen_test

import (
	"fmt"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/gen"
)

func ExampleParams_Network() {
	// A directed ER network with N = 10000 and <k> = 2L/N = 4.
	p := gen.Params{Model: "er", Nodes: 10000, MeanDegree: 4}
	g, err := p.Network(gen.NewRand(7))
	if err != nil {
		panic(err)
	}
	out, in, _ := p.Distributions()
	nD, _ := structural.CavityDriverFraction(out, in)
	fmt.Println(g.N(), g.Edges())
	fmt.Printf("cavity n_D = %.3f\n", nD)
	// Output:
	// 10000 20000
	// cavity n_D = 0.216
}
