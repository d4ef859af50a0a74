package netread

import (
	"bytes"
	"fmt"
	"testing"

	"github.com/netsteer/netsteer/io/internal/source"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/gen"
)

// benchInputs are fixed-seed edge lists of integer names: directed
// Erdős–Rényi and static-model scale-free (gamma 2.5), mean total degree 10.
var benchInputs = map[string][]byte{}

func benchInput(model string, n int) []byte {
	key := fmt.Sprintf("%s/%d", model, n)
	if b, ok := benchInputs[key]; ok {
		return b
	}
	p, _ := gen.Workload(model, n)
	e, err := p.Edges(gen.NewRand(1))
	if err != nil {
		panic(err)
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
				cpu := processCPU()
				defer func() { b.ReportMetric(float64(processCPU()-cpu)/float64(b.N)/1e6, "cpu-ms/op") }()
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

// formatInput writes a fixed-seed directed Erdős–Rényi network (mean total
// degree 10) in one of the formats, the way the common writers lay it out.
func formatInput(f Format, n int) []byte {
	e, err := gen.Params{Model: "er", Nodes: n, MeanDegree: 10}.Edges(gen.NewRand(1))
	if err != nil {
		panic(err)
	}
	var b bytes.Buffer
	switch f {
	case GraphML:
		b.WriteString("<?xml version='1.0' encoding='utf-8'?>\n<graphml xmlns=\"http://graphml.graphdrawing.org/xmlns\">\n<graph edgedefault=\"directed\">\n")
		for i := 0; i < e.N; i++ {
			fmt.Fprintf(&b, "<node id=\"%d\"/>\n", i)
		}
		for k := range e.Src {
			fmt.Fprintf(&b, "<edge source=\"%d\" target=\"%d\"/>\n", e.Src[k], e.Dst[k])
		}
		b.WriteString("</graph></graphml>\n")
	case GML:
		b.WriteString("graph [\n  directed 1\n")
		for i := 0; i < e.N; i++ {
			fmt.Fprintf(&b, "  node [\n    id %d\n    label \"%d\"\n  ]\n", i, i)
		}
		for k := range e.Src {
			fmt.Fprintf(&b, "  edge [\n    source %d\n    target %d\n  ]\n", e.Src[k], e.Dst[k])
		}
		b.WriteString("]\n")
	case Pajek:
		fmt.Fprintf(&b, "*vertices %d\n", e.N)
		for i := 0; i < e.N; i++ {
			fmt.Fprintf(&b, "%d %d\n", i+1, i)
		}
		b.WriteString("*arcs\n")
		for k := range e.Src {
			fmt.Fprintf(&b, "%d %d 1.0\n", e.Src[k]+1, e.Dst[k]+1)
		}
	case NodeLinkJSON:
		b.WriteString(`{"directed": true, "multigraph": false, "graph": {}, "nodes": [`)
		for i := 0; i < e.N; i++ {
			if i > 0 {
				b.WriteString(", ")
			}
			fmt.Fprintf(&b, `{"id": %d}`, i)
		}
		b.WriteString(`], "links": [`)
		for k := range e.Src {
			if k > 0 {
				b.WriteString(", ")
			}
			fmt.Fprintf(&b, `{"source": %d, "target": %d}`, e.Src[k], e.Dst[k])
		}
		b.WriteString("]}\n")
	default:
		return e.AppendEdgeList(nil, 0)
	}
	return b.Bytes()
}

// BenchmarkReadFormats times Read on the same network in every format
// (N = 10^5, 5*10^5 edges), hashing included.
//
//	go test -run '^$' -bench ReadFormats -benchtime 3x ./io/netread
func BenchmarkReadFormats(b *testing.B) {
	for _, f := range []Format{EdgeList, GraphML, GML, Pajek, NodeLinkJSON} {
		b.Run(string(f), func(b *testing.B) {
			data := formatInput(f, 100_000)
			b.SetBytes(int64(len(data)))
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				in, err := Read(bytes.NewReader(data), "bench", Options{})
				if err != nil || in.Format != f || in.Network.Edges() < 490_000 {
					b.Fatal(err)
				}
			}
		})
	}
}
