package netwrite

import (
	"bytes"
	"encoding/csv"
	"fmt"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/io/netread"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/gen"
)

func build(t *testing.T, edges [][2]string, isolated ...string) *structural.Network {
	t.Helper()
	b := structural.NewBuilder()
	for _, e := range edges {
		u, _ := b.Intern([]byte(e[0]))
		v, _ := b.Intern([]byte(e[1]))
		b.AddEdge(u, v)
	}
	for _, s := range isolated {
		b.Intern([]byte(s))
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	return g
}

func edgeSet(g *structural.Network) []string {
	var out []string
	for u := int32(0); int(u) < g.N(); u++ {
		for _, v := range g.Succ(u) {
			out = append(out, g.Name(u)+" -> "+g.Name(v))
		}
	}
	sort.Strings(out)
	return out
}

func readNodeTable(t *testing.T, path string) []string {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	recs, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(recs) == 0 || len(recs[0]) != 2 || recs[0][0] != "node" || recs[0][1] != "isolated" {
		t.Fatalf("node table header %v, want [node isolated]", recs[:1])
	}
	var names []string
	for _, r := range recs[1:] {
		if r[1] != "yes" {
			t.Fatalf("row %q: want isolated=yes", r)
		}
		names = append(names, r[0])
	}
	return names
}

// Names that need quoting survive a round trip through the edge-list
// reader, and the node table restores isolated states (same N and L).
func TestEdgeListRoundTrip(t *testing.T) {
	g := build(t, [][2]string{
		{"pump 1", "valve,a"}, {`say "hi"`, "#tag"}, {"%x", "plain"}, {"plain", "pump 1"}, {"ünï", "ünï"},
	}, "lonely", "also alone")
	dir := t.TempDir()
	for _, name := range []string{"net.edges", "net.edges.gz"} {
		path := filepath.Join(dir, name)
		wr, err := WriteFile(path, g, Options{})
		if err != nil {
			t.Fatal(err)
		}
		if wr.NodeTable != filepath.Join(dir, "net.nodes.csv") {
			t.Errorf("node table at %q", wr.NodeTable)
		}
		states := readNodeTable(t, wr.NodeTable)
		in, err := netread.ReadFile(path, netread.Options{States: states})
		if err != nil {
			t.Fatal(err)
		}
		h := in.Network
		if h.N() != g.N() || h.Edges() != g.Edges() {
			t.Errorf("%s: read back N=%d L=%d, want N=%d L=%d", name, h.N(), h.Edges(), g.N(), g.Edges())
		}
		if got, want := fmt.Sprint(edgeSet(h)), fmt.Sprint(edgeSet(g)); got != want {
			t.Errorf("%s: edges %s, want %s", name, got, want)
		}
	}
}

func TestWeightsRoundTrip(t *testing.T) {
	b := structural.NewIntBuilder(3, 1)
	b.AddWeightedEdge(0, 1, 2.5)
	b.AddWeightedEdge(1, 2, -1e-3)
	g, _ := b.Build(structural.BuildOptions{})
	var buf bytes.Buffer
	if err := WriteEdges(&buf, g); err != nil {
		t.Fatal(err)
	}
	if got, want := buf.String(), "1 2 2.5\n2 3 -0.001\n"; got != want {
		t.Errorf("got %q, want %q", got, want)
	}
}

// Matrix Market: entry (i, j) is A[i][j] != 0, the edge j -> i (the
// Matrix Market coordinate format, NIST; netsteer's reading convention),
// and the size line carries N, isolated states included.
func TestMatrixMarket(t *testing.T) {
	b := structural.NewIntBuilder(5, 1)
	b.AddEdge(0, 1)
	b.AddEdge(3, 1)
	g, _ := b.Build(structural.BuildOptions{})
	var buf bytes.Buffer
	if err := WriteMatrixMarket(&buf, g); err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(strings.TrimSpace(buf.String()), "\n")
	var data []string
	for _, l := range lines {
		if !strings.HasPrefix(l, "%") {
			data = append(data, l)
		}
	}
	if !strings.HasPrefix(lines[0], "%%MatrixMarket matrix coordinate pattern general") {
		t.Errorf("banner %q", lines[0])
	}
	if got, want := strings.Join(data, "|"), "5 5 2|2 1|2 4"; got != want {
		t.Errorf("got %q, want %q", got, want)
	}
}

func TestEdgeWriter(t *testing.T) {
	var buf bytes.Buffer
	e := NewEdgeWriter(&buf, 1)
	e.AddEdge(0, 4)
	e.AddEdge(2, 1)
	if err := e.Flush(); err != nil {
		t.Fatal(err)
	}
	if buf.String() != "1 5\n3 2\n" || e.Edges() != 2 {
		t.Errorf("got %q (%d edges)", buf.String(), e.Edges())
	}
	buf.Reset()
	if err := WriteIntNodeTable(&buf, 3, 1); err != nil || buf.String() != "node,isolated\n1,yes\n2,yes\n3,yes\n" {
		t.Errorf("int node table %q, %v", buf.String(), err)
	}
}

func TestNodeTablePath(t *testing.T) {
	for in, want := range map[string]string{
		"net.edges": "net.nodes.csv", "d/net.edges.gz": "d/net.nodes.csv", "net": "net.nodes.csv",
		"a.b/net": "a.b/net.nodes.csv", "x.txt": "x.nodes.csv", "g.edges.GZ": "g.nodes.csv",
	} {
		if got := NodeTablePath(in); got != want {
			t.Errorf("NodeTablePath(%q) = %q, want %q", in, got, want)
		}
	}
}

func TestLineBreakInName(t *testing.T) {
	g := build(t, [][2]string{{"a\nb", "c"}})
	if err := WriteEdges(&bytes.Buffer{}, g); err == nil {
		t.Error("a name with a line break: got no error")
	}
}

// Matrix Market has indices only: names that differ from them are kept in
// comment lines, quoted as in an edge list, and the matrix reads back the
// same (the comments are ignored by readers, as the format says).
func TestMatrixMarketKeepsNames(t *testing.T) {
	g := build(t, [][2]string{{"feed pump", "drum_level"}, {"drum_level", "steam_flow"}})
	var buf bytes.Buffer
	if err := WriteMatrixMarket(&buf, g); err != nil {
		t.Fatal(err)
	}
	out := buf.String()
	for i := int32(0); int(i) < g.N(); i++ {
		name := g.Name(i)
		if strings.Contains(name, " ") {
			name = `"` + name + `"`
		}
		want := "% state " + strconv.Itoa(int(i)+1) + " " + name + "\n"
		if !strings.Contains(out, want) {
			t.Errorf("no line %q in\n%s", want, out)
		}
	}
	var data []string
	for _, l := range strings.Split(strings.TrimSpace(out), "\n") {
		if !strings.HasPrefix(l, "%") {
			data = append(data, l)
		}
	}
	if len(data) != 3 || data[0] != "3 3 2" {
		t.Errorf("size line and entries %q, want 3 3 2 and two entries", data)
	}
	back, err := netread.Read(strings.NewReader(out), "named.mtx", netread.Options{Format: netread.MatrixMarket})
	if err != nil || back.Network.N() != 3 || back.Network.Edges() != 2 {
		t.Fatalf("read back: %v, want 3 states and 2 edges", err)
	}
	// The names come back, in order, with the edges between them.
	for i := int32(0); int(i) < g.N(); i++ {
		if back.Network.Name(i) != g.Name(i) {
			t.Errorf("state %d read back as %q, want %q", i+1, back.Network.Name(i), g.Name(i))
		}
		for _, v := range g.Succ(i) {
			if !back.Network.HasEdge(i, v) {
				t.Errorf("edge %s -> %s lost", g.Name(i), g.Name(v))
			}
		}
	}
	// Integer names equal to the indices need no comments.
	b := structural.NewIntBuilder(3, 1)
	b.AddEdge(0, 2)
	h, _ := b.Build(structural.BuildOptions{})
	buf.Reset()
	if err := WriteMatrixMarket(&buf, h); err != nil {
		t.Fatal(err)
	}
	if strings.Contains(buf.String(), "% state ") {
		t.Errorf("index names written as comments:\n%s", buf.String())
	}
}

// A generated network streamed to a file (edge list with its node table,
// gzip, Matrix Market) reads back as the network the generator builds in
// memory from the same seed (gen.Params.Network, a separate route), with
// the comment line that remakes it.
func TestWriteGeneratedRoundTrip(t *testing.T) {
	p, err := gen.FromSettings("er", map[string]string{"nodes": "300", "mean_degree": "1.5"})
	if err != nil {
		t.Fatal(err)
	}
	want, err := p.Network(gen.NewRand(9))
	if err != nil {
		t.Fatal(err)
	}
	if want.Edges() >= 300 { // some states are isolated at this density
		t.Fatalf("%d edges", want.Edges())
	}
	dir := t.TempDir()
	for _, name := range []string{"g.edges", "g.edges.gz", "g.mtx"} {
		path := filepath.Join(dir, name)
		wr, edges, err := WriteGenerated(path, p, 9, Options{})
		if err != nil {
			t.Fatal(err)
		}
		var states []string
		if wr.Format == MatrixMarket {
			if wr.NodeTable != "" {
				t.Errorf("%s: node table %q beside Matrix Market", name, wr.NodeTable)
			}
		} else {
			states = readNodeTable(t, wr.NodeTable)
		}
		in, err := netread.ReadFile(path, netread.Options{States: states})
		if err != nil {
			t.Fatal(err)
		}
		h := in.Network
		if h.N() != want.N() || int64(h.Edges()) != edges || h.Edges() != want.Edges() {
			t.Errorf("%s: N=%d L=%d (reported %d), want N=%d L=%d", name, h.N(), h.Edges(), edges, want.N(), want.Edges())
		}
		if got, w := fmt.Sprint(edgeSet(h)), fmt.Sprint(edgeSet(want)); got != w {
			t.Errorf("%s: edges differ", name)
		}
	}
	b, err := os.ReadFile(filepath.Join(dir, "g.edges"))
	if err != nil {
		t.Fatal(err)
	}
	if first, _, _ := strings.Cut(string(b), "\n"); first != "# netsteer generate er --nodes=300 --mean-degree=1.5 --seed=9" {
		t.Errorf("first line %q", first)
	}
}
