package testnet

import (
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/gen"
)

// StageSizes are the numbers of states of the stage benchmarks: the four
// doublings from 2.5*10^5 to 4*10^6 over which the exponent of time
// against edges is fitted.
var StageSizes = []int{250_000, 500_000, 1_000_000, 2_000_000, 4_000_000}

// Workload returns the benchmark network gen.Workload(name, n) generated
// with seed 1, state i named i (as the comparison script writes it).
func Workload(tb testing.TB, name string, n int) *structural.Network {
	tb.Helper()
	p, err := gen.Workload(name, n)
	if err != nil {
		tb.Fatal(err)
	}
	e, err := p.Edges(gen.NewRand(1))
	if err != nil {
		tb.Fatal(err)
	}
	g, err := e.Network(0)
	if err != nil {
		tb.Fatal(err)
	}
	return g
}

// Fresh returns a copy of g with the same states and edges and nothing
// computed yet (no matching, components or transpose kept on it), as a
// command that has just read the network sees it.
func Fresh(tb testing.TB, g *structural.Network) *structural.Network {
	tb.Helper()
	src := make([]int32, 0, g.Edges())
	dst := make([]int32, 0, g.Edges())
	out := g.Out()
	for u := 0; u < g.N(); u++ {
		for _, v := range out.Adj[out.Ptr[u]:out.Ptr[u+1]] {
			src, dst = append(src, int32(u)), append(dst, v)
		}
	}
	h, err := g.WithEdges(src, dst, g.Weights())
	if err != nil {
		tb.Fatal(err)
	}
	return h
}

// Designs returns a minimum design of g (structural.Drivers, computed on a
// fresh copy so that g keeps nothing) and every other signal of it, the
// failing design of the check benchmarks: half of the inputs missing.
func Designs(tb testing.TB, g *structural.Network) (full, half structural.Design) {
	tb.Helper()
	sig := structural.Drivers(Fresh(tb, g)).Inputs.Signals()
	var h [][]int32
	for i, s := range sig {
		if i%2 == 0 {
			h = append(h, s)
		}
	}
	return Design(tb, g, sig), Design(tb, g, h)
}
