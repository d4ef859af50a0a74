package render

import (
	"context"
	"fmt"
	"io"
	"math/rand/v2"
	"testing"

	"github.com/netsteer/netsteer/structural"
)

// BenchmarkLayout lays out whole views of random digraphs with three edges
// per state (fixed seed), the workload behind the layout choices: run
//
//	go test ./io/render -run XXX -bench Layout -benchtime 3x
//
// Each operation starts the layout program (this test binary, see
// TestMain), about 0.1 s of the time at any size.
func BenchmarkLayout(b *testing.B) {
	for _, n := range []int{50, 100, 150, 200} {
		rng := rand.New(rand.NewPCG(uint64(n), 3))
		g := randomNet(b, rng, n, 3)
		ds := structural.MinimumDrivers(g)
		in := &Input{Net: g, Inputs: ds.Inputs, Matching: ds.Matching, InputKind: "driver node"}
		for _, layout := range []string{"dot", "sfdp", "dot-splines"} {
			if layout == "dot-splines" && n > 100 {
				continue // tens of seconds
			}
			b.Run(fmt.Sprintf("%s/n=%d", layout, n), func(b *testing.B) {
				for i := 0; i < b.N; i++ {
					if _, err := Draw(context.Background(), in, Options{MaxNodes: n}, layout, FormatSVG, io.Discard); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}

// BenchmarkCondensation selects the condensation view of large random
// networks (mean degree 2), the work done before any layout.
func BenchmarkCondensation(b *testing.B) {
	for _, n := range []int{100_000, 1_000_000} {
		rng := rand.New(rand.NewPCG(uint64(n), 5))
		g := randomNet(b, rng, n, 2)
		ds := structural.MinimumDrivers(g)
		in := &Input{Net: g, Inputs: ds.Inputs, Matching: ds.Matching, Components: structural.SCC(g.Out())}
		b.Run(fmt.Sprintf("n=%d", n), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				v, err := Select(in, Options{})
				if err != nil {
					b.Fatal(err)
				}
				if err := DOT(io.Discard, in, v, "dot"); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
