package main

import (
	"compress/gzip"
	"encoding/binary"
	"flag"
	"fmt"
	"io"
	"os"
	"strings"

	"github.com/netsteer/netsteer/structural/gen"
)

// workload returns the generator parameters of a comparison workload: the
// structural/gen model users get, er and sf with mean total degree k.
func workload(model string, n int, k, gamma float64) (gen.Params, error) {
	if model != "er" && model != "sf" && model != "grid" {
		return gen.Params{}, fmt.Errorf("unknown model %q (want er, sf or grid)", model)
	}
	p, err := gen.Workload(model, n)
	if err != nil {
		return p, err
	}
	if model != "grid" {
		p.MeanDegree = k
	}
	if model == "sf" {
		p.GammaOut, p.GammaIn = gamma, gamma
	}
	return p, p.Check()
}

// genMain writes the deterministic synthetic networks used by compare.sh: a
// text edge list of integer names and, optionally, the same edges as raw
// little-endian int32 pairs for the Python peers. The networks are those
// of structural/gen (gen.Workload), state i named i.
func genMain(args []string) {
	flag := flag.NewFlagSet("gen", flag.ExitOnError)
	model := flag.String("model", "er", "er (directed Erdos-Renyi G(N, N*k/2)), sf (static-model scale-free) or grid (right and down)")
	n := flag.Int("n", 1000000, "number of states")
	k := flag.Float64("k", 10, "mean total degree (in + out) for er and sf")
	gamma := flag.Float64("gamma", 2.5, "in- and out-degree exponent for -model sf")
	seed := flag.Uint64("seed", 1, "random seed (gen.NewRand)")
	out := flag.String("o", "", "edge-list output file (.gz compresses)")
	bin := flag.String("bin", "", "also write int32 pairs (src, dst) to this file")
	flag.Parse(args)
	if *out == "" {
		fmt.Fprintln(os.Stderr, "gen: -o is required")
		os.Exit(2)
	}
	p, err := workload(*model, *n, *k, *gamma)
	if err != nil {
		fmt.Fprintln(os.Stderr, "gen:", err)
		os.Exit(2)
	}
	e, err := p.Edges(gen.NewRand(*seed))
	if err != nil {
		fmt.Fprintln(os.Stderr, "gen:", err)
		os.Exit(2)
	}
	if err := writeText(*out, e); err != nil {
		fmt.Fprintln(os.Stderr, "gen:", err)
		os.Exit(1)
	}
	if *bin != "" {
		if err := writeBin(*bin, e); err != nil {
			fmt.Fprintln(os.Stderr, "gen:", err)
			os.Exit(1)
		}
	}
	fmt.Fprintf(os.Stderr, "gen: %s: %d states, %d edges\n", *out, e.N, e.Len())
}

func writeText(path string, e *gen.Edges) error {
	f, err := os.Create(path)
	if err != nil {
		return err
	}
	var w io.Writer = f
	var zw *gzip.Writer
	if strings.HasSuffix(path, ".gz") {
		zw = gzip.NewWriter(f)
		w = zw
	}
	if err := e.WriteEdgeList(w, 0); err != nil {
		f.Close()
		return err
	}
	if zw != nil {
		if err := zw.Close(); err != nil {
			f.Close()
			return err
		}
	}
	return f.Close()
}

func writeBin(path string, e *gen.Edges) error {
	f, err := os.Create(path)
	if err != nil {
		return err
	}
	buf := make([]byte, 0, 8<<16)
	for i := range e.Src {
		buf = binary.LittleEndian.AppendUint32(buf, uint32(e.Src[i]))
		buf = binary.LittleEndian.AppendUint32(buf, uint32(e.Dst[i]))
		if len(buf) == cap(buf) || i == len(e.Src)-1 {
			if _, err := f.Write(buf); err != nil {
				f.Close()
				return err
			}
			buf = buf[:0]
		}
	}
	return f.Close()
}
