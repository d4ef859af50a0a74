package structural

import (
	"math/rand/v2"
	"testing"

	"github.com/netsteer/netsteer/matching"
)

// The matching of [A B] started from the network's maximum matching is a
// valid matching of [A B] as large as the one found from nothing
// (matching.Maximum, itself checked against Kuhn's method in package
// matching), for random networks and designs.
func TestWarmDesignMatching(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	for it := 0; it < 300; it++ {
		n := 2 + rng.IntN(40)
		b := NewIntBuilder(n, 0)
		for e := rng.IntN(3 * n); e > 0; e-- {
			b.AddEdge(int32(rng.IntN(n)), int32(rng.IntN(n)))
		}
		g, err := b.Build(BuildOptions{})
		if err != nil {
			t.Fatal(err)
		}
		var signals [][]int32
		for k := rng.IntN(4); k > 0; k-- {
			var s []int32
			for j := 1 + rng.IntN(3); j > 0; j-- {
				s = append(s, int32(rng.IntN(n)))
			}
			signals = append(signals, s)
		}
		csr := inNeighbourCSR(g, signals)
		cold := matching.Maximum(csr, inNeighbourCSRT(g, signals))
		warm := warmStart(g, csr.Cols)
		matchSignals(warm, n, signals)
		matching.Augment(csr, inNeighbourCSRT(g, signals), warm)
		if warm.Size != cold.Size {
			t.Fatalf("network %d: warm start %d, from nothing %d", it, warm.Size, cold.Size)
		}
		size := 0
		for r, c := range warm.RowMate {
			if c < 0 {
				continue
			}
			size++
			ok := warm.ColMate[c] == int32(r)
			found := false
			for _, x := range csr.Adj[csr.Ptr[r]:csr.Ptr[r+1]] {
				found = found || x == c
			}
			if !ok || !found {
				t.Fatalf("network %d: row %d matched to %d, not a matched edge", it, r, c)
			}
		}
		if size != warm.Size {
			t.Fatalf("network %d: %d pairs, Size %d", it, size, warm.Size)
		}
	}
}
