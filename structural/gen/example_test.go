package gen_test

import (
	"fmt"
	"strings"

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

func ExampleParams_Edges() {
	// The comparison workload at N = 1000: directed ER, <k> = 10, seed 1.
	p, _ := gen.Workload("er", 1000)
	e, err := p.Edges(gen.NewRand(1))
	if err != nil {
		panic(err)
	}
	fmt.Println(e.N, e.Len())
	// Edges come sorted by source; the text names state i by i+1.
	first, _, _ := strings.Cut(string(e.AppendEdgeList(nil, 1)), "\n")
	fmt.Println(first)
	// Output:
	// 1000 5000
	// 1 88
}
