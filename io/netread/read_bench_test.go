package netread

import (
	"bytes"
	"fmt"
	"testing"

	"github.com/netsteer/netsteer/io/internal/source"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/gen/netgen"
)

// benchInputs are fixed-seed edge lists of integer names: directed
// Erdős–Rényi and static-model scale-free (gamma 2.5), mean total degree 10.
var benchInputs = map[string][]byte{}

func benchInput(model string, n int) []byte {
	key := fmt.Sprintf("%s/%d", model, n)
	if b, ok := benchInputs[key]; ok {
		return b
	}
	var e *netgen.Edges
	switch model {
	case "er":
		e = netgen.ER(n, 10, 1)
	case "sf":
		e = netgen.ScaleFree(n, 10, 2.5, 1)
	case "grid":
		side := 1
		for (side+1)*(side+1) <= n {
			side++
		}
		e = netgen.Grid(side, 1)
	}
	b := e.AppendEdgeList(nil, 0)
	benchInputs[key] = b
	return b
}

// BenchmarkRead times reading an integer-named edge list into a Network:
// parsing, interning and building both CSR directions. Inputs are generated
// once per size (not timed).
//
//	go test -run '^$' -bench Read -benchmem ./io/netread
func BenchmarkRead(b *testing.B) {
	for _, model := range []string{"er", "sf", "grid"} {
		for _, n := range []int{10_000, 100_000, 1_000_000} {
			b.Run(fmt.Sprintf("%s/n=%d", model, n), func(b *testing.B) {
				data := benchInput(model, n)
				b.SetBytes(int64(len(data)))
				b.ResetTimer()
				for i := 0; i < b.N; i++ {
					if _, err := Read(bytes.NewReader(data), "bench", Options{}); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}

// BenchmarkParse times the parse stage alone: blocks, tokens and names
// interned into a Builder, without Build.
//
//	go test -run '^$' -bench Parse -benchmem ./io/netread
func BenchmarkParse(b *testing.B) {
	for _, model := range []string{"er", "sf", "grid"} {
		for _, n := range []int{10_000, 100_000, 1_000_000} {
			b.Run(fmt.Sprintf("%s/n=%d", model, n), func(b *testing.B) {
				data := benchInput(model, n)
				b.SetBytes(int64(len(data)))
				b.ResetTimer()
				for i := 0; i < b.N; i++ {
					br, err := maybeGunzip(source.NewDigest(bytes.NewReader(data)), "bench", Options{})
					if err != nil {
						b.Fatal(err)
					}
					if err := readEdgeList(br, "bench", structural.NewBuilder(), Options{}); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}
