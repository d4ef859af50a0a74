package main

import (
	"compress/gzip"
	"encoding/binary"
	"flag"
	"fmt"
	"io"
	"os"
	"strings"

	"github.com/netsteer/netsteer/structural/gen/netgen"
)

// genMain writes the deterministic synthetic networks used by compare.sh: a
// text edge list of integer names and, optionally, the same edges as raw
// little-endian int32 pairs for the Python peers.
func genMain(args []string) {
	flag := flag.NewFlagSet("gen", flag.ExitOnError)
	model := flag.String("model", "er", "er, sf (static-model scale-free) or grid")
	n := flag.Int("n", 1000000, "number of states (grid: rounded down to a square)")
	k := flag.Float64("k", 10, "mean total degree (in + out)")
	gamma := flag.Float64("gamma", 2.5, "degree exponent for -model sf")
	seed := flag.Uint64("seed", 1, "random seed")
	out := flag.String("o", "", "edge-list output file (.gz compresses)")
	bin := flag.String("bin", "", "also write int32 pairs (src, dst) to this file")
	flag.Parse(args)
	if *out == "" {
		fmt.Fprintln(os.Stderr, "gen: -o is required")
		os.Exit(2)
	}
	var e *netgen.Edges
	switch *model {
	case "er":
		e = netgen.ER(*n, *k, *seed)
	case "sf":
		e = netgen.ScaleFree(*n, *k, *gamma, *seed)
	case "grid":
		side := 1
		for (side+1)*(side+1) <= *n {
			side++
		}
		e = netgen.Grid(side, *seed)
	default:
		fmt.Fprintf(os.Stderr, "gen: unknown model %q\n", *model)
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
	fmt.Fprintf(os.Stderr, "gen: %s: %d states, %d edges\n", *out, e.N, len(e.Src))
}

func writeText(path string, e *netgen.Edges) error {
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

func writeBin(path string, e *netgen.Edges) error {
	buf := make([]byte, 8*len(e.Src))
	for i := range e.Src {
		binary.LittleEndian.PutUint32(buf[8*i:], uint32(e.Src[i]))
		binary.LittleEndian.PutUint32(buf[8*i+4:], uint32(e.Dst[i]))
	}
	return os.WriteFile(path, buf, 0o644)
}
