package gen

import (
	"fmt"
	"testing"
)

type countSink struct{ n int64 }

func (c *countSink) AddEdge(u, v int32) { c.n++ }

// Fixed-seed generator benchmarks at several sizes (<k> = 4: L = 2N).
func BenchmarkGenerate(b *testing.B) {
	for _, model := range []string{"er", "scale-free", "regular", "small-world"} {
		for _, n := range []int{10000, 100000, 1000000} {
			p := Defaults(model, n)
			p.MeanDegree = 4
			b.Run(fmt.Sprintf("%s/N=%d", model, n), func(b *testing.B) {
				for i := 0; i < b.N; i++ {
					var s countSink
					if err := p.Generate(NewRand(1), &s); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}
