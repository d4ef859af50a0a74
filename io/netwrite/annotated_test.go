package netwrite_test

import (
	"bytes"
	"encoding/json"
	"encoding/xml"
	"os"
	"os/exec"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/io/netread"
	"github.com/netsteer/netsteer/io/netwrite"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/analysis"
)

// demo is a small invented network with names XML and JSON must escape.
func demo(t *testing.T) *structural.Network {
	t.Helper()
	in, err := netread.Read(strings.NewReader("pump \"a<b&c\"\n\"a<b&c\" tank\npump tank\ntank tank\nvalve tank\n"), "demo.edges", netread.Options{})
	if err != nil {
		t.Fatal(err)
	}
	return in.Network
}

type graphml struct {
	Keys []struct {
		ID   string `xml:"id,attr"`
		For  string `xml:"for,attr"`
		Name string `xml:"attr.name,attr"`
		Type string `xml:"attr.type,attr"`
	} `xml:"key"`
	Graph struct {
		Directed string `xml:"edgedefault,attr"`
		Nodes    []struct {
			ID   string `xml:"id,attr"`
			Data []struct {
				Key   string `xml:"key,attr"`
				Value string `xml:",chardata"`
			} `xml:"data"`
		} `xml:"node"`
		Edges []struct {
			Source string `xml:"source,attr"`
			Target string `xml:"target,attr"`
			Data   []struct {
				Key   string `xml:"key,attr"`
				Value string `xml:",chardata"`
			} `xml:"data"`
		} `xml:"edge"`
	} `xml:"graph"`
}

// The annotated files parse with a general XML (JSON) parser and carry
// exactly the answer: every driver node marked, every matched edge of the
// network's maximum matching marked and nothing else (the matching is the
// independent record here: structural.Network.Matching), names verbatim.
func TestAnnotatedDrivers(t *testing.T) {
	g := demo(t)
	r, err := analysis.Drivers(g, analysis.DriversRequest{Roles: true})
	if err != nil {
		t.Fatal(err)
	}
	a := netwrite.FromDrivers(r)
	var b bytes.Buffer
	if err := netwrite.WriteGraphML(&b, a); err != nil {
		t.Fatal(err)
	}
	var doc graphml
	if err := xml.Unmarshal(b.Bytes(), &doc); err != nil {
		t.Fatalf("GraphML does not parse: %v\n%s", err, b.String())
	}
	name := map[string]string{}
	for _, k := range doc.Keys {
		name[k.ID] = k.Name
	}
	if doc.Graph.Directed != "directed" || len(doc.Graph.Nodes) != g.N() || len(doc.Graph.Edges) != g.Edges() {
		t.Fatalf("graph: %s, %d nodes, %d edges", doc.Graph.Directed, len(doc.Graph.Nodes), len(doc.Graph.Edges))
	}
	drivers := map[string]bool{}
	for _, v := range r.Drivers.IDs() {
		drivers[g.Name(v)] = true
	}
	for _, n := range doc.Graph.Nodes {
		if _, ok := g.Lookup(n.ID); !ok {
			t.Errorf("node %q is not a state", n.ID)
		}
		got := false
		for _, d := range n.Data {
			if name[d.Key] == "driver" {
				got = d.Value == "true"
			}
		}
		if got != drivers[n.ID] {
			t.Errorf("node %q: driver %v, want %v", n.ID, got, drivers[n.ID])
		}
	}
	m := g.Matching()
	for _, e := range doc.Graph.Edges {
		u, _ := g.Lookup(e.Source)
		v, _ := g.Lookup(e.Target)
		matched := false
		for _, d := range e.Data {
			if name[d.Key] == "matched" {
				matched = d.Value == "true"
			}
		}
		if want := m.RowMate[u] == v; matched != want {
			t.Errorf("edge %s -> %s: matched %v, want %v", e.Source, e.Target, matched, want)
		}
	}

	b.Reset()
	if err := netwrite.WriteNodeLink(&b, a); err != nil {
		t.Fatal(err)
	}
	var nl struct {
		Directed bool             `json:"directed"`
		Nodes    []map[string]any `json:"nodes"`
		Links    []map[string]any `json:"links"`
		Edges    []map[string]any `json:"edges"`
	}
	if err := json.Unmarshal(b.Bytes(), &nl); err != nil {
		t.Fatalf("node-link JSON does not parse: %v", err)
	}
	if !nl.Directed || len(nl.Nodes) != g.N() || len(nl.Links) != g.Edges() || len(nl.Edges) != g.Edges() {
		t.Fatalf("node-link: directed %v, %d nodes, %d links, %d edges", nl.Directed, len(nl.Nodes), len(nl.Links), len(nl.Edges))
	}
	for _, n := range nl.Nodes {
		if n["driver"] != drivers[n["id"].(string)] {
			t.Errorf("node-link node %v: driver %v", n["id"], n["driver"])
		}
	}
}

// The written files read back with netsteer's own readers (GraphML and
// node-link JSON, themselves checked against networkx's writers in
// io/netread) give the same states and edges.
func TestAnnotatedRoundTrip(t *testing.T) {
	g := demo(t)
	d, _ := structural.Dedicated(g, []int32{0})
	r, err := analysis.Check(g, analysis.CheckRequest{Inputs: &d, Outputs: &d})
	if err != nil {
		t.Fatal(err)
	}
	a := netwrite.FromCheck(r)
	for _, w := range []struct {
		ext   string
		write func(*bytes.Buffer) error
	}{
		{".graphml", func(b *bytes.Buffer) error { return netwrite.WriteGraphML(b, a) }},
		{".json", func(b *bytes.Buffer) error { return netwrite.WriteNodeLink(b, a) }},
	} {
		var b bytes.Buffer
		if err := w.write(&b); err != nil {
			t.Fatal(err)
		}
		in, err := netread.Read(&b, "out"+w.ext, netread.Options{Format: netread.FormatOf("out" + w.ext)})
		if err != nil {
			t.Fatalf("%s: %v", w.ext, err)
		}
		h := in.Network
		if h.N() != g.N() || h.Edges() != g.Edges() {
			t.Fatalf("%s: read back %d states, %d edges; want %d, %d", w.ext, h.N(), h.Edges(), g.N(), g.Edges())
		}
		for u := int32(0); int(u) < g.N(); u++ {
			for _, v := range g.Succ(u) {
				x, _ := h.Lookup(g.Name(u))
				y, _ := h.Lookup(g.Name(v))
				if !h.HasEdge(x, y) {
					t.Errorf("%s: edge %s -> %s lost", w.ext, g.Name(u), g.Name(v))
				}
			}
		}
	}
}

// Where Python has networkx, its read_graphml and node_link_graph load
// the files with their defaults and find the same attributes (networkx is
// the reference library here; the test skips without it).
func TestAnnotatedNetworkx(t *testing.T) {
	py, err := exec.LookPath("python3")
	if err != nil || exec.Command(py, "-c", "import networkx").Run() != nil {
		t.Skip("python3 with networkx not available")
	}
	g := demo(t)
	r, err := analysis.Drivers(g, analysis.DriversRequest{})
	if err != nil {
		t.Fatal(err)
	}
	a := netwrite.FromDrivers(r)
	dir := t.TempDir()
	for _, f := range []struct {
		name  string
		write func(*bytes.Buffer) error
	}{
		{"d.graphml", func(b *bytes.Buffer) error { return netwrite.WriteGraphML(b, a) }},
		{"d.json", func(b *bytes.Buffer) error { return netwrite.WriteNodeLink(b, a) }},
	} {
		var b bytes.Buffer
		if err := f.write(&b); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(filepath.Join(dir, f.name), b.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	script := `
import json, sys, warnings
import networkx as nx
warnings.simplefilter("ignore")
g = nx.read_graphml(sys.argv[1] + "/d.graphml")
h = nx.node_link_graph(json.load(open(sys.argv[1] + "/d.json")))
for x in (g, h):
    drivers = sorted(n for n, d in x.nodes(data=True) if d.get("driver") is True)
    stems = sum(1 for _, _, d in x.edges(data=True) if d.get("control") == "stem")
    dc = x.graph.get("driver_count")
    print(x.number_of_nodes(), x.number_of_edges(), ",".join(drivers), stems, type(dc).__name__, dc)
`
	out, err := exec.Command(py, "-c", script, dir).CombinedOutput()
	if err != nil {
		t.Fatalf("networkx: %v\n%s", err, out)
	}
	var names []string
	for _, v := range r.Drivers.IDs() {
		names = append(names, g.Name(v))
	}
	stems := 0
	for _, k := range a.Edges[1].Strings {
		if k == "stem" {
			stems++
		}
	}
	want := strings.Repeat(strings.Join([]string{strconv.Itoa(g.N()), strconv.Itoa(g.Edges()), strings.Join(slices.Sorted(slices.Values(names)), ","), strconv.Itoa(stems),
		"int", strconv.Itoa(r.DriverCount)}, " ")+"\n", 2)
	if string(out) != want {
		t.Fatalf("networkx read\n%s\nwant\n%s", out, want)
	}
}

// Graph attributes keep their types: a general JSON parser finds booleans
// and numbers, and the GraphML keys declare boolean, long and double, so
// that readers (networkx's among them) give back typed values.
func TestAnnotatedGraphAttrTypes(t *testing.T) {
	g := demo(t)
	d, _ := structural.Dedicated(g, []int32{0})
	r, err := analysis.Check(g, analysis.CheckRequest{Inputs: &d})
	if err != nil {
		t.Fatal(err)
	}
	a := netwrite.FromCheck(r)
	a.Graph = append(a.Graph, netwrite.Attr{Name: "total_cost", Type: netwrite.Double, Value: structural.Cost(2500).String()},
		netwrite.Attr{Name: "bad", Type: netwrite.Double, Value: "NaN"}, netwrite.Attr{Name: "empty", Type: netwrite.Int, Value: ""})
	var b bytes.Buffer
	if err := netwrite.WriteNodeLink(&b, a); err != nil {
		t.Fatal(err)
	}
	var nl struct {
		Graph map[string]any `json:"graph"`
	}
	if err := json.Unmarshal(b.Bytes(), &nl); err != nil {
		t.Fatal(err)
	}
	p := r.Properties()[0]
	pre := p.Property.String() + "_"
	if v, ok := nl.Graph[pre+"holds"].(bool); !ok || v != p.Holds {
		t.Errorf("JSON %sholds = %#v, want the boolean %v", pre, nl.Graph[pre+"holds"], p.Holds)
	}
	if v, ok := nl.Graph[pre+"dimension"].(float64); !ok || v != float64(p.Dimension) {
		t.Errorf("JSON %sdimension = %#v, want the number %d", pre, nl.Graph[pre+"dimension"], p.Dimension)
	}
	if v, ok := nl.Graph["total_cost"].(float64); !ok || v != 2.5 {
		t.Errorf("JSON total_cost = %#v, want the number 2.5", nl.Graph["total_cost"])
	}
	// A value its type cannot write in JSON stays valid JSON, as a string.
	if nl.Graph["bad"] != "NaN" || nl.Graph["empty"] != "" {
		t.Errorf("JSON bad = %#v, empty = %#v, want the strings", nl.Graph["bad"], nl.Graph["empty"])
	}
	if _, ok := nl.Graph["question"].(string); !ok {
		t.Errorf("JSON question = %#v, want a string", nl.Graph["question"])
	}
	// Our node-link reader takes the typed graph object.
	if _, err := netread.Read(bytes.NewReader(b.Bytes()), "a.json", netread.Options{}); err != nil {
		t.Errorf("read back: %v", err)
	}

	b.Reset()
	if err := netwrite.WriteGraphML(&b, a); err != nil {
		t.Fatal(err)
	}
	var doc graphml
	if err := xml.Unmarshal(b.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	types := map[string]string{}
	for _, k := range doc.Keys {
		if k.For == "graph" {
			types[k.Name] = k.Type
		}
	}
	want := map[string]string{"question": "string", pre + "holds": "boolean", pre + "dimension": "long", "total_cost": "double"}
	for k, ty := range want {
		if types[k] != ty {
			t.Errorf("GraphML key %s: attr.type %q, want %q", k, types[k], ty)
		}
	}
	if _, err := netread.Read(bytes.NewReader(b.Bytes()), "a.graphml", netread.Options{}); err != nil {
		t.Errorf("read back: %v", err)
	}
}
