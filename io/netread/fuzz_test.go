package netread

import (
	"bytes"
	"crypto/sha256"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/structural"
)

// Fuzz targets: go test -fuzz=FuzzEdgeList ./io/netread (likewise
// FuzzMatrixMarket, FuzzDOT). The seeds run as ordinary tests. Invariants:
// no panic; on success a valid network (see checkNetwork); on failure a
// *Error whose text is one line.

// fuzzOptions derives reader options from the fuzzer's flag byte.
func fuzzOptions(format Format, flags uint8) Options {
	return Options{
		Format:  format,
		Weights: flags&1 != 0,
		Build:   structural.BuildOptions{Undirected: flags&2 != 0, SelfDynamics: flags&4 != 0},
	}
}

func fuzzRead(t *testing.T, format Format, data []byte, flags uint8) {
	if flags&8 != 0 {
		data = gzipBytes(data)
	}
	in, err := Read(bytes.NewReader(data), "fuzz", fuzzOptions(format, flags))
	if err != nil {
		e, ok := err.(*Error)
		if !ok {
			t.Fatalf("error %v is a %T, want *netread.Error", err, err)
		}
		if strings.ContainsAny(e.Error(), "\r\n") {
			t.Fatalf("error text has a line break: %q", e.Error())
		}
		if e.File != "fuzz" || e.Line < 0 {
			t.Fatalf("error %q names file %q line %d", e.Error(), e.File, e.Line)
		}
		return
	}
	g := in.Network
	if err := checkNetwork(g); err != nil {
		t.Fatalf("invalid network: %v", err)
	}
	if in.Size != int64(len(data)) || in.SHA256 != sha256.Sum256(data) {
		t.Fatalf("digest covers %d of %d bytes", in.Size, len(data))
	}
	for _, s := range [][]string{in.Labels, in.Groups} {
		if s != nil && len(s) != g.N() {
			t.Fatalf("%d labels or groups for %d states", len(s), g.N())
		}
	}
	if flags&4 != 0 && g.SelfLoops != g.N() {
		t.Fatalf("self-dynamics: %d self-loops for %d states", g.SelfLoops, g.N())
	}
	if flags&2 != 0 {
		for u := int32(0); int(u) < g.N(); u++ {
			if !slices.Equal(g.Out.Row(u), g.In.Row(u)) {
				t.Fatalf("undirected: state %d has out-row %v, in-row %v", u, g.Out.Row(u), g.In.Row(u))
			}
		}
	}
}

// addFileSeeds adds the testdata files matching pattern as seeds.
func addFileSeeds(f *testing.F, pattern string) {
	paths, _ := filepath.Glob(filepath.Join("testdata", pattern))
	for _, p := range paths {
		b, err := os.ReadFile(p)
		if err != nil {
			f.Fatal(err)
		}
		f.Add(b, uint8(0))
	}
}

func FuzzEdgeList(f *testing.F) {
	for _, s := range []string{
		"a b\nb c\n",
		"a b 2.5\na b -1\nb b\n",
		"\"pump 1\",\"valve, \"\"main\"\"\"\r\nx\ty , 3\n",
		"# c\n% c\n\n",
		"a\n",
		"a b c d\n",
		"\"open\n",
		"a b NaN\n",
		"a b 0\n",
		"a,,b\n",
		"a b",
	} {
		f.Add([]byte(s), uint8(0))
		f.Add([]byte(s), uint8(7))
	}
	f.Add([]byte("a b 1\nb a 2\n"), uint8(15))
	addFileSeeds(f, "canal.edges*")
	f.Fuzz(func(t *testing.T, data []byte, flags uint8) {
		fuzzRead(t, EdgeList, data, flags)
	})
}

func FuzzMatrixMarket(f *testing.F) {
	for _, s := range []string{
		"%%MatrixMarket matrix coordinate pattern general\n3 3 3\n2 1\n3 2\n1 3\n",
		"%%MatrixMarket matrix coordinate real symmetric\n3 3 2\n2 1 4\n3 3 -1\n",
		"%%MatrixMarket matrix coordinate integer skew-symmetric\n3 3 1\n2 1 4\n",
		"%%MatrixMarket matrix coordinate real general\n% c\n\n2 2 2\n1 2 0\n1 2 1e300\n",
		"%%MatrixMarket matrix coordinate complex hermitian\n1 1 1\n1 1 1 0\n",
		"%%MatrixMarket matrix array real general\n1 1\n1\n",
		"%%MatrixMarket matrix coordinate pattern general\n1000000 1000000 1000000000000\n1 2\n",
		"%%MatrixMarket matrix coordinate pattern general\n3 4 1\n1 1\n",
		"%%MatrixMarket matrix coordinate pattern general\n3 3 1\n4 1\n",
		"%%MatrixMarket matrix coordinate pattern general\r\n2 2 1\r\n1 2",
		"3 3 1\n1 1\n",
		"",
	} {
		f.Add([]byte(s), uint8(0))
		f.Add([]byte(s), uint8(7))
	}
	addFileSeeds(f, "*.mtx")
	f.Fuzz(func(t *testing.T, data []byte, flags uint8) {
		fuzzRead(t, MatrixMarket, data, flags)
	})
}

func FuzzDOT(f *testing.F) {
	for _, s := range []string{
		"digraph { a -> b -> c }",
		"digraph G { {a b} -> subgraph s { c d } -> e [weight=2]; lonely }",
		"strict digraph { edge [weight=3] a -> b; { edge [weight=\"-1\"] b -> a } }",
		"graph { a -- b -- a; c }",
		"digraph { \"x \\\"y\\\"\" -> <<b>z</b>> -> -1.5 -> a:p:n }",
		"digraph { a -> b [weight=NaN] }",
		"digraph { a -> b -- c }",
		"graph { a -> b }",
		"digraph { {{{{a}}}} -> b }",
		"digraph {}\ndigraph {}\n",
		"// only a comment",
		"digraph { a -> \"\" }",
		"digraph {\r\n a -> b\r\n}",
		"digraph { a = b; node [x=y] }",
		"digraph { a -> }",
		"digraph { \"unterminated }",
	} {
		f.Add([]byte(s), uint8(0))
		f.Add([]byte(s), uint8(7))
	}
	addFileSeeds(f, "*.dot")
	f.Fuzz(func(t *testing.T, data []byte, flags uint8) {
		fuzzRead(t, DOT, data, flags)
	})
}
