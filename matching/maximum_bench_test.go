package matching_test

import (
	"fmt"
	"testing"

	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural/gen"
)

// benchGraph returns the bipartite graph of a fixed-seed benchmark workload
// (gen.Workload, seed 1; rows are sources, columns targets) and its
// transpose.
func benchGraph(b *testing.B, model string, n int) (*matching.CSR, *matching.CSR) {
	p, err := gen.Workload(model, n)
	if err != nil {
		b.Fatal(err)
	}
	e, err := p.Edges(gen.NewRand(1))
	if err != nil {
		b.Fatal(err)
	}
	g := matching.FromEdges(e.N, e.N, e.Src, e.Dst)
	return g, matching.Transpose(g)
}

// BenchmarkMaximum times the matching stage alone on prebuilt CSRs:
// directed Erdős–Rényi and static-model scale-free networks with mean total
// degree 10, and right-and-down square grids (gen.Workload).
//
//	go test -run '^$' -bench Maximum -benchmem ./matching
func BenchmarkMaximum(b *testing.B) {
	for _, model := range []string{"er", "sf", "sf2.1", "grid"} {
		for _, n := range []int{10_000, 100_000, 1_000_000} {
			b.Run(fmt.Sprintf("%s/n=%d", model, n), func(b *testing.B) {
				g, gt := benchGraph(b, model, n)
				b.ReportMetric(float64(g.Edges()), "edges")
				b.ResetTimer()
				for i := 0; i < b.N; i++ {
					matching.Maximum(g, gt)
				}
				b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(g.Edges()), "ns/edge")
			})
		}
	}
}
