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
	in := fuzzReadOpt(t, data, flags, fuzzOptions(format, flags))
	if in == nil {
		return
	}
	g := in.Network
	if flags&4 != 0 && g.SelfLoops() != g.N() {
		t.Fatalf("self-dynamics: %d self-loops for %d states", g.SelfLoops(), g.N())
	}
	if flags&2 != 0 {
		for u := int32(0); int(u) < g.N(); u++ {
			if !slices.Equal(g.Succ(u), g.Pred(u)) {
				t.Fatalf("undirected: state %d has out-row %v, in-row %v", u, g.Succ(u), g.Pred(u))
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

// fuzzReadOpt reads data with opt (gzip-compressed when flags say so)
// and checks what every read must deliver; it returns the input read, or
// nil after an error.
func fuzzReadOpt(t *testing.T, data []byte, flags uint8, opt Options) *Input {
	if flags&8 != 0 {
		data = gzipBytes(data)
	}
	in, err := Read(bytes.NewReader(data), "fuzz", opt)
	if err != nil {
		e, ok := err.(*Error)
		if !ok {
			t.Fatalf("error %v is a %T, want *netread.Error", err, err)
		}
		if strings.ContainsAny(e.Error(), "\r\n") || len(e.Error()) > 2000 {
			t.Fatalf("error text has a line break or is long: %.300q", e.Error())
		}
		if e.File != "fuzz" || e.Line < 0 {
			t.Fatalf("error %q names file %q line %d", e.Error(), e.File, e.Line)
		}
		return nil
	}
	if err := checkNetwork(in.Network); err != nil {
		t.Fatalf("invalid network: %v", err)
	}
	if in.Size != int64(len(data)) || in.SHA256 != sha256.Sum256(data) {
		t.Fatalf("digest covers %d of %d bytes", in.Size, len(data))
	}
	for _, s := range [][]string{in.Labels, in.Groups} {
		if s != nil && len(s) != in.Network.N() {
			t.Fatalf("%d labels or groups for %d states", len(s), in.Network.N())
		}
	}
	return in
}

// addDirSeeds adds the files of a testdata subdirectory matching pattern.
func addDirSeeds(f *testing.F, pattern string) {
	paths, _ := filepath.Glob(filepath.Join("testdata", "networkx", pattern))
	for _, p := range paths {
		b, err := os.ReadFile(p)
		if err != nil {
			f.Fatal(err)
		}
		f.Add(b, uint8(0))
		f.Add(b, uint8(1))
	}
}

// FuzzTable reads delimited tables with columns chosen by the flags.
func FuzzTable(f *testing.F) {
	for _, s := range []string{
		"s,t,w\na,b,1\nc\n", "x;t;s\n1;a;b\n", "\"s\"\t\"t\"\n\"a b\"\tc\n", "a b;c d\n",
		"s,t\n\"a,b\n", "s,t,t\n", "a,b;c\n", "S T\nx y\n", "# c\n\ns,t,w\na,b,\n",
	} {
		for _, fl := range []uint8{0, 16, 32, 48, 64, 128, 192} {
			f.Add([]byte(s), fl)
		}
	}
	f.Fuzz(func(t *testing.T, data []byte, flags uint8) {
		opt := fuzzOptions(EdgeList, flags)
		switch flags >> 4 & 3 {
		case 1:
			opt.Columns = &Columns{Names: []string{"s", "t", "w"}}
		case 2:
			opt.Columns = &Columns{Positions: []int{2, 1}}
		case 3:
			opt.Columns = &Columns{Names: []string{"t", "s"}}
		}
		opt.Separator = []Separator{DetectSeparator, Comma, Semicolon, Whitespace}[flags>>6]
		fuzzReadOpt(t, data, flags, opt)
	})
}

func FuzzGraphML(f *testing.F) {
	f.Add([]byte(graphmlHead+`<graph edgedefault="undirected"><node id="a"><data key="l">A</data></node><node id="b"/><edge source="a" target="b" directed="true"><data key="w">3</data></edge></graph></graphml>`), uint8(1))
	f.Add([]byte(`<graphml><graph><edge source="a" target="b"/></graph></graphml>`), uint8(0))
	addDirSeeds(f, "*.graphml")
	f.Fuzz(func(t *testing.T, data []byte, flags uint8) {
		fuzzRead(t, GraphML, data, flags)
	})
}

func FuzzGML(f *testing.F) {
	f.Add([]byte("graph [ directed 1 node [ id 0 label \"a&#38;b\" ] node [ id 1 ] edge [ source 0 target 1 weight 2 ] ]"), uint8(1))
	f.Add([]byte("Creator \"x\"\ngraph\n[\n node [ id 1 name \"p\" group 3 ]\n]\n"), uint8(0))
	addDirSeeds(f, "*.gml")
	f.Fuzz(func(t *testing.T, data []byte, flags uint8) {
		fuzzRead(t, GML, data, flags)
	})
}

func FuzzPajek(f *testing.F) {
	f.Add([]byte("*Vertices 3\n1 \"a b\" 0 0\n2 c\n*Arcs\n1 2 2\n*Edges\n2 3\n*Arcslist\n1 2 3\n"), uint8(1))
	f.Add([]byte("% c\n*network x\n*vertices 2 1\n*edgeslist\n1 2\n"), uint8(0))
	addDirSeeds(f, "*.net")
	f.Fuzz(func(t *testing.T, data []byte, flags uint8) {
		fuzzRead(t, Pajek, data, flags)
	})
}

func FuzzNodeLinkJSON(f *testing.F) {
	f.Add([]byte(`{"directed": true, "nodes": [{"id": "a", "label": "A", "group": 2}, {"id": 1}], "links": [{"source": "a", "target": 1, "weight": 1.5}]}`), uint8(1))
	f.Add([]byte(`{"nodes": [{"id": 1}], "edges": [{"source": 1, "target": 1}], "graph": {"x": [1, {"y": null}]}}`), uint8(0))
	addDirSeeds(f, "*.json")
	f.Fuzz(func(t *testing.T, data []byte, flags uint8) {
		fuzzRead(t, NodeLinkJSON, data, flags)
	})
}

// FuzzSniff reads with no format given: whatever the content announces.
func FuzzSniff(f *testing.F) {
	for _, s := range []string{"%%MatrixMarket matrix coordinate pattern general\n2 2 1\n1 2\n", "digraph { a -> b }", "graph [ ]", "*Vertices 1\n", "{\"nodes\": []}", "<?xml version=\"1.0\"?><graphml/>", "a b\n"} {
		f.Add([]byte(s), uint8(0))
	}
	f.Fuzz(func(t *testing.T, data []byte, flags uint8) {
		fuzzRead(t, "", data, flags)
	})
}
