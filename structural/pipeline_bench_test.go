package structural_test

import (
	"fmt"
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/gen"
)

// Stage benchmarks of the read-match-decompose pipeline on the fixed-seed
// workloads of gen.Workload (seed 1): directed Erdős–Rényi and static-model
// scale-free (gamma 2.5 and 2.1) with mean total degree 10, and right-and-down
// square grids, at 10^4, 10^5 and 10^6 states. Run them with
//
//	go test -run '^$' -bench 'Build|SCC|Drivers' -benchmem ./structural
//
// and the parse stage with go test -bench Read ./io/netread, the matching
// stage with go test -bench Maximum ./matching.

var benchModels = []string{"er", "sf", "sf2.1", "grid"}
var benchSizes = []int{10_000, 100_000, 1_000_000}

func benchEdges(b *testing.B, model string, n int) *gen.Edges {
	p, err := gen.Workload(model, n)
	if err != nil {
		b.Fatal(err)
	}
	e, err := p.Edges(gen.NewRand(1))
	if err != nil {
		b.Fatal(err)
	}
	return e
}

func benchNetwork(b *testing.B, e *gen.Edges) *structural.Network {
	g, err := e.Network(0)
	if err != nil {
		b.Fatal(err)
	}
	return g
}

func perEdge(b *testing.B, edges int) {
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(edges), "ns/edge")
}

// BenchmarkBuild times Builder.Build: both CSR directions by counting sort,
// rows sorted and repeats merged.
func BenchmarkBuild(b *testing.B) {
	for _, model := range benchModels {
		for _, n := range benchSizes {
			b.Run(fmt.Sprintf("%s/n=%d", model, n), func(b *testing.B) {
				e := benchEdges(b, model, n)
				b.ResetTimer()
				for i := 0; i < b.N; i++ {
					b.StopTimer()
					bl := structural.NewIntBuilder(e.N, 0)
					bl.Grow(len(e.Src))
					for k := range e.Src {
						bl.AddEdge(e.Src[k], e.Dst[k])
					}
					b.StartTimer()
					if _, err := bl.Build(structural.BuildOptions{}); err != nil {
						b.Fatal(err)
					}
				}
				perEdge(b, len(e.Src))
			})
		}
	}
}

// BenchmarkSCC times the strongly connected components.
func BenchmarkSCC(b *testing.B) {
	for _, model := range benchModels {
		for _, n := range benchSizes {
			b.Run(fmt.Sprintf("%s/n=%d", model, n), func(b *testing.B) {
				g := benchNetwork(b, benchEdges(b, model, n))
				b.ResetTimer()
				for i := 0; i < b.N; i++ {
					structural.SCC(g.Out())
				}
				perEdge(b, g.Edges())
			})
		}
	}
}

// BenchmarkDrivers times matching, components and the driver set together
// on a built network (what `netsteer drivers` does after reading).
func BenchmarkDrivers(b *testing.B) {
	for _, model := range benchModels {
		for _, n := range benchSizes {
			b.Run(fmt.Sprintf("%s/n=%d", model, n), func(b *testing.B) {
				g := benchNetwork(b, benchEdges(b, model, n))
				b.ResetTimer()
				for i := 0; i < b.N; i++ {
					// A fresh network each time: Drivers keeps its matching
					// and components on the network.
					b.StopTimer()
					h := clone(b, g)
					b.StartTimer()
					structural.Drivers(h)
				}
				perEdge(b, g.Edges())
			})
		}
	}
}

// clone returns a copy of g without its computed matching and components.
func clone(b *testing.B, g *structural.Network) *structural.Network {
	src := make([]int32, 0, g.Edges())
	dst := make([]int32, 0, g.Edges())
	for u := int32(0); int(u) < g.N(); u++ {
		for _, v := range g.Succ(u) {
			src, dst = append(src, u), append(dst, v)
		}
	}
	h, err := g.WithEdges(src, dst, nil)
	if err != nil {
		b.Fatal(err)
	}
	return h
}
