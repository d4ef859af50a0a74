package netread

import (
	"bytes"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/structural"
)

// canalEdges is the network of testdata/canal.*, written out by hand.
var canalEdges = []string{
	"reservoir_level>intake_gate", "intake_gate>main_canal_flow",
	"main_canal_flow>branch_a_level", "main_canal_flow>branch_b_level",
	"main_canal_flow>reservoir_level", "reservoir_level>reservoir_level",
	"branch_a_level>field_a_moisture", "branch_b_level>field_b_moisture",
	"pump_a_speed>branch_a_level", "weather_evaporation>field_a_moisture",
	"weather_evaporation>field_b_moisture",
}

// canalIndex numbers the canal's states as testdata/canal.mtx does.
var canalIndex = map[string]string{
	"reservoir_level": "1", "intake_gate": "2", "main_canal_flow": "3",
	"branch_a_level": "4", "branch_b_level": "5", "field_a_moisture": "6",
	"field_b_moisture": "7", "pump_a_speed": "8", "weather_evaporation": "9",
}

// Every file of testdata/canal.* reads to the same network, whatever its
// format and compression, with the format taken from the name and gzip
// from the magic bytes (canal-packed.txt is gzip under a plain name).
func TestReadFileFormats(t *testing.T) {
	byIndex := make([]string, len(canalEdges))
	for i, e := range canalEdges {
		u, v, _ := strings.Cut(e, ">")
		byIndex[i] = canalIndex[u] + ">" + canalIndex[v]
	}
	for _, c := range []struct {
		file  string
		edges []string
	}{
		{"canal.edges", canalEdges},
		{"canal.edges.gz", canalEdges},
		{"canal-packed.txt", canalEdges},
		{"canal.dot", canalEdges},
		{"canal.mtx", byIndex},
	} {
		g, err := readFileNet(filepath.Join("testdata", c.file), Options{})
		if err != nil {
			t.Errorf("%s: %v", c.file, err)
			continue
		}
		if err := checkNetwork(g); err != nil {
			t.Errorf("%s: %v", c.file, err)
		}
		if d := diffEdges(edgeMap(g), wantEdges(c.edges...)); d != "" {
			t.Errorf("%s: edges differ:%s", c.file, d)
		}
		if g.N() != 9 || g.SelfLoops() != 1 || g.DuplicatesMerged() != 0 {
			t.Errorf("%s: got N %d, self-loops %d, merged %d; want 9, 1, 0", c.file, g.N(), g.SelfLoops(), g.DuplicatesMerged())
		}
	}
}

func TestFormatOf(t *testing.T) {
	for _, c := range []struct {
		name string
		want Format
	}{
		{"a.mtx", MatrixMarket}, {"A.MTX.GZ", MatrixMarket}, {"x/y.dot", DOT}, {"y.gv.gz", DOT},
		{"n.edges", EdgeList}, {"n.tsv", EdgeList}, {"n.csv", EdgeList}, {"n.txt.gz", EdgeList},
		{"n", EdgeList}, {"-", EdgeList}, {"n.gz", EdgeList},
	} {
		if got := FormatOf(c.name); got != c.want {
			t.Errorf("FormatOf(%q) = %q, want %q", c.name, got, c.want)
		}
	}
	for _, s := range []string{"edges", "mtx", "dot", "csv", "gv", "mm", "MTX", "GraphML", "Edges"} {
		if _, err := ParseFormat(s); err != nil {
			t.Errorf("ParseFormat(%q): %v", s, err)
		}
	}
	if _, err := ParseFormat("yaml"); err == nil {
		t.Errorf("ParseFormat(\"yaml\") gave no error")
	}
}

// Gzip is recognised by its magic bytes for every format, whatever the
// name; a truncated or corrupt stream is a one-line error.
func TestGzip(t *testing.T) {
	inputs := map[Format]string{
		EdgeList:     "a b\nb c\n",
		MatrixMarket: "%%MatrixMarket matrix coordinate pattern general\n3 3 2\n2 1\n3 2\n",
		DOT:          "digraph { a -> b -> c }\n",
	}
	for f, in := range inputs {
		packed := gzipBytes([]byte(in))
		g, err := readNet(bytes.NewReader(packed), "plain-name", Options{Format: f})
		if err != nil {
			t.Errorf("%s: %v", f, err)
			continue
		}
		if g.N() != 3 || g.Edges() != 2 {
			t.Errorf("%s: got %d states, %d edges; want 3, 2", f, g.N(), g.Edges())
		}
		for _, cut := range []int{len(packed) - 4, len(packed) / 2, 10, 2} {
			_, err := Read(bytes.NewReader(packed[:cut]), "cut.gz", Options{Format: f})
			if err == nil {
				t.Errorf("%s cut at %d of %d bytes: no error", f, cut, len(packed))
				continue
			}
			e := asError(t, err)
			if !strings.Contains(e.Msg, "gzip") || e.File != "cut.gz" {
				t.Errorf("%s cut at %d: got %q, want a gzip error on cut.gz", f, cut, e.Error())
			}
		}
	}
	// A longer edge list cut short fails at a line, never silently.
	var b strings.Builder
	for i := 0; i < 20000; i++ {
		b.WriteString("n" + strconv.Itoa(i) + " n" + strconv.Itoa(i+1) + "\n")
	}
	packed := gzipBytes([]byte(b.String()))
	_, err := Read(bytes.NewReader(packed[:len(packed)*2/3]), "long.gz", Options{})
	if err == nil {
		t.Fatalf("truncated long stream: no error")
	}
	if e := asError(t, err); e.Line == 0 || !strings.Contains(e.Msg, "gzip: the compressed stream ends early") {
		t.Errorf("got %q, want FILE:LINE: gzip: the compressed stream ends early ...", e.Error())
	}
	// Trailing garbage after the stream is an error too.
	_, err = Read(bytes.NewReader(append(gzipBytes([]byte("a b\n")), "junk"...)), "junk.gz", Options{})
	if err == nil {
		t.Errorf("garbage after the gzip stream: no error")
	} else {
		asError(t, err)
	}
}

// Read takes any reader (standard input in the CLI), reads an edge list
// when no format is given, and names the source in errors.
func TestReadStdin(t *testing.T) {
	g, err := readNet(strings.NewReader("x y\n"), "stdin", Options{})
	if err != nil || g.N() != 2 || g.Edges() != 1 {
		t.Fatalf("got %v, %v; want 2 states, 1 edge", g, err)
	}
	_, err = Read(strings.NewReader("x y\nz z z z\n"), "stdin", Options{})
	if err == nil || err.Error() != "stdin:2: want \"source target [weight]\", found more than 3 fields (choose columns to read a wider table)" {
		t.Errorf("got %v", err)
	}
	_, err = Read(strings.NewReader("x y\n"), "stdin", Options{Format: "xml"})
	if err == nil {
		t.Errorf("unknown format: no error")
	} else {
		asError(t, err)
	}
}

func TestReadFileErrors(t *testing.T) {
	dir := t.TempDir()
	for _, c := range []struct {
		path, want string
	}{
		{filepath.Join(dir, "missing.edges"), "no such file"},
		{dir, "is a directory"},
	} {
		_, err := ReadFile(c.path, Options{})
		if err == nil {
			t.Errorf("%s: no error", c.path)
			continue
		}
		e := asError(t, err)
		if e.File != c.path || !strings.Contains(e.Msg, c.want) {
			t.Errorf("got %q, want %q on %s", e.Error(), c.want, c.path)
		}
	}
	// The extension picks the reader; the error names file and line.
	p := filepath.Join(dir, "bad.mtx")
	os.WriteFile(p, []byte("%%MatrixMarket matrix coordinate pattern general\n2 2 1\n3 1\n"), 0o644)
	_, err := ReadFile(p, Options{})
	if err == nil || err.Error() != p+":3: row index \"3\" is not an integer in 1..2" {
		t.Errorf("got %v", err)
	}
}

// The weights of a repeated edge that add up beyond the float64 range
// (1e308 + 1e308 > 1.8e308, IEEE 754 binary64) are refused at the line of
// the entry that overflowed, found by a second pass over the file; a
// stream read once has no line to name.
func TestWeightOverflowLine(t *testing.T) {
	dir := t.TempDir()
	edges := "# plant\na b 1e308\nb c 1\n\na b 1e308\na b 1\n"
	cases := []struct {
		name, data string
		opt        Options
		line       int
	}{
		{"x.edges", edges, Options{}, 5},
		{"x.edges.gz", string(gzipBytes([]byte(edges))), Options{}, 5},
		{"u.edges", "b a 1e308\nc d 1\na b 1e308\n", Options{Build: structural.BuildOptions{Undirected: true}}, 3},
		{"x.csv", "from;to;w\na;b;1e308\na;b;1e308\n", Options{Columns: &Columns{Names: []string{"from", "to", "w"}}}, 3},
		{"s.mtx", "%%MatrixMarket matrix coordinate real symmetric\n3 3 3\n2 1 1e308\n3 2 1\n1 2 1e308\n", Options{}, 5},
	}
	for _, c := range cases {
		path := filepath.Join(dir, c.name)
		if err := os.WriteFile(path, []byte(c.data), 0o644); err != nil {
			t.Fatal(err)
		}
		opt := c.opt
		opt.Weights = true
		_, err := ReadFile(path, opt)
		var e *Error
		var we *structural.WeightError
		if !errors.As(err, &e) || !errors.As(err, &we) {
			t.Fatalf("%s: got %v, want a weight error", c.name, err)
		}
		if e.Line != c.line || !strings.Contains(e.Msg, "add up to +Inf") {
			t.Errorf("%s: got %q, want line %d", c.name, err, c.line)
		}
		_, err = Read(strings.NewReader(c.data), c.name, opt)
		if !errors.As(err, &e) || e.Line != 0 {
			t.Errorf("%s from a stream: got %v, want no line", c.name, err)
		}
	}
}

// The checks the in-order reader makes hold for integer-named input of
// many blocks too (parsed and numbered in parallel): a weight overflow is
// found at its line, a table whose rows all have one field is refused,
// and one whose single-field rows follow its edges is read.
func TestIntegerBlocksKeepChecks(t *testing.T) {
	defer func(b, w int) { blockBytes, parseWorkers = b, w }(blockBytes, parseWorkers)
	blockBytes, parseWorkers = 300, 2
	var sb strings.Builder
	for i := 0; i < 2000; i++ {
		fmt.Fprintf(&sb, "%d %d\n", i, i+1)
	}
	sb.WriteString("5 6 1e308\n5 6 1e308\n")
	path := filepath.Join(t.TempDir(), "big.edges")
	if err := os.WriteFile(path, []byte(sb.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	var e *Error
	if _, err := ReadFile(path, Options{Weights: true}); !errors.As(err, &e) || e.Line != 2002 {
		t.Errorf("weight overflow: got %v, want line 2002", err)
	}

	var iso strings.Builder
	for i := 0; i < 3000; i++ {
		fmt.Fprintf(&iso, "%d\n", i)
	}
	cols := Options{Columns: &Columns{Positions: []int{1, 2}}}
	if _, err := readWith([]byte(iso.String()), 300, 2, cols); !errors.As(err, &e) || e.Line != 1 {
		t.Errorf("single-field table: got %v, want a refusal at line 1", err)
	}
	var mixed strings.Builder
	for i := 0; i < 500; i++ {
		fmt.Fprintf(&mixed, "%d,%d\n", i, i+1)
	}
	for i := 0; i < 50; i++ {
		fmt.Fprintf(&mixed, "lone%d\n", i)
	}
	g, err := readWith([]byte(mixed.String()), 300, 2, Options{Separator: Comma})
	if err != nil || g.Edges() != 500 || g.N() != 551 {
		t.Errorf("edges then single names: %v, want 500 edges and 551 states", err)
	}
}

// StatesFrom adds its states as States does, in every format (after the
// edges; before them in Matrix Market), and its error comes back as it is.
func TestStatesFromAsStates(t *testing.T) {
	gen := "%%MatrixMarket matrix coordinate pattern general\n"
	for _, c := range []struct{ file, in, extra string }{
		{"n.edges", "a b\nb c\n", "z"},
		{"n.edges", "10 20\n20 30\n", "7"},
		{"n.csv", "a,b\nb,c\n", "z"},
		{"n.mtx", gen + "4 4 1\n2 1\n", "4"},
		{"n.dot", "digraph { a -> b }", "z"},
		{"n.graphml", `<graphml><graph edgedefault="directed"><node id="a"/><node id="b"/><edge source="a" target="b"/></graph></graphml>`, "z"},
		{"n.gml", "graph [ directed 1 node [ id 1 ] node [ id 2 ] edge [ source 1 target 2 ] ]", "z"},
		{"n.net", "*Vertices 2\n1 \"a\"\n2 \"b\"\n*Arcs\n1 2\n", "z"},
		{"n.json", `{"directed": true, "nodes": [{"id": "a"}, {"id": "b"}], "links": [{"source": "a", "target": "b"}]}`, "z"},
	} {
		want, err := readNet(strings.NewReader(c.in), c.file, Options{States: []string{c.extra}})
		if err != nil {
			t.Fatalf("%s: %v", c.file, err)
		}
		calls := 0
		got, err := readNet(strings.NewReader(c.in), c.file, Options{StatesFrom: func() ([]string, error) {
			calls++
			return []string{c.extra}, nil
		}})
		if err != nil {
			t.Fatalf("%s with StatesFrom: %v", c.file, err)
		}
		names := func(g *structural.Network) (out []string) {
			for v := range g.N() {
				out = append(out, g.Name(int32(v)))
			}
			return out
		}
		if calls != 1 || strings.Join(names(got), "|") != strings.Join(names(want), "|") {
			t.Errorf("%s: %d calls, names %q, want one call and %q", c.file, calls, names(got), names(want))
		}
		boom := errors.New("the table failed")
		if _, err := readNet(strings.NewReader(c.in), c.file, Options{StatesFrom: func() ([]string, error) { return nil, boom }}); err != boom {
			t.Errorf("%s: error %v, want the table's own", c.file, err)
		}
	}
}
