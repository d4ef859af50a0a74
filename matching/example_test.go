package matching_test

import (
	"fmt"

	"github.com/netsteer/netsteer/matching"
)

// A directed star: a hub acting on three leaves. As a bipartite graph, row
// "hub" is adjacent to the three leaf columns, so only one leaf can be
// matched (which one is up to the algorithm); the other two leaf columns and
// the hub's own column stay unmatched: they are the driver nodes
// (N_D = N - |M*| = 4 - 1 = 3; common practice).
func ExampleMaximum() {
	names := []string{"hub", "x", "y", "z"}
	g := matching.FromEdges(4, 4, []int32{0, 0, 0}, []int32{1, 2, 3})
	m := matching.Maximum(g, nil)
	fmt.Println("matched pairs:", m.Size)
	unmatched := 0
	for _, r := range m.ColMate {
		if r < 0 {
			unmatched++
		}
	}
	fmt.Println("unmatched columns (driver nodes):", unmatched)
	fmt.Println("the hub is one of them:", m.ColMate[0] < 0)
	fmt.Println("the hub's row is matched to a leaf:", names[m.RowMate[0]] != "hub")
	// Output:
	// matched pairs: 1
	// unmatched columns (driver nodes): 3
	// the hub is one of them: true
	// the hub's row is matched to a leaf: true
}
