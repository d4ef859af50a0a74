package matching

import (
	"fmt"
	"testing"

	"github.com/netsteer/netsteer/structural/gen/netgen"
)

// benchGraph returns the bipartite graph of a fixed-seed directed network
// (rows are sources, columns targets) and its transpose.
func benchGraph(model string, n int) (*CSR, *CSR) {
	var e *netgen.Edges
	switch model {
	case "er":
		e = netgen.ER(n, 10, 1)
	case "sf":
		e = netgen.ScaleFree(n, 10, 2.5, 1)
	case "sf2.1":
		e = netgen.ScaleFree(n, 10, 2.1, 1)
	case "grid":
		side := 1
		for (side+1)*(side+1) <= n {
			side++
		}
		e = netgen.Grid(side, 1)
		n = e.N
	}
	g := FromEdges(n, n, e.Src, e.Dst)
	return g, Transpose(g)
}

// BenchmarkMaximum times the matching stage alone on prebuilt CSRs:
// directed Erdős–Rényi and static-model scale-free networks with mean total
// degree 10, and randomly oriented square grids.
//
//	go test -run '^$' -bench Maximum -benchmem ./matching
func BenchmarkMaximum(b *testing.B) {
	for _, model := range []string{"er", "sf", "sf2.1", "grid"} {
		for _, n := range []int{10_000, 100_000, 1_000_000} {
			b.Run(fmt.Sprintf("%s/n=%d", model, n), func(b *testing.B) {
				g, gt := benchGraph(model, n)
				b.ReportMetric(float64(g.Edges()), "edges")
				b.ResetTimer()
				for i := 0; i < b.N; i++ {
					Maximum(g, gt)
				}
				b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(g.Edges()), "ns/edge")
			})
		}
	}
}
