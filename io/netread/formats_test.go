package netread

import (
	"strings"
	"testing"
)

// Expected networks below are written out by hand from the inputs, by the
// formats' own specifications (GraphML 1.0 primer, GML as networkx and
// igraph write it, Pajek's manual, networkx's node_link_data).

const graphmlHead = `<?xml version="1.0" encoding="UTF-8"?>
<graphml xmlns="http://graphml.graphdrawing.org/xmlns">
<key id="w" for="edge" attr.name="weight" attr.type="double"><default>2</default></key>
<key id="l" for="node" attr.name="label" attr.type="string"/>
<key id="c" for="edge" attr.name="capacity" attr.type="double"/>
`

func TestGraphML(t *testing.T) {
	cases := []readCase{
		{name: "directed with default weight", in: graphmlHead + `<graph edgedefault="directed">
<node id="a"><data key="l">Pump A</data></node><node id="b"/><node id="c"/>
<edge source="a" target="b"/><edge source="b" target="c"><data key="w">-1.5</data></edge>
</graph></graphml>`, opt: Options{Weights: true}, edges: []string{"a>b=2", "b>c=-1.5"}, nodes: []string{"a", "b", "c"}},
		{name: "undirected, per-edge directed, parallel", in: graphmlHead + `<graph edgedefault="undirected">
<node id="a"/><node id="b"/><node id="c"/>
<edge source="a" target="b"/><edge source="a" target="b"/><edge source="b" target="c" directed="true"/><edge source="c" target="c"/>
</graph></graphml>`, edges: []string{"a>b", "b>a", "b>c", "c>c"}, dups: 2, loops: 1},
		{name: "weight key renamed", in: graphmlHead + `<graph edgedefault="directed"><node id="a"/><node id="b"/>
<edge source="a" target="b"><data key="c">7</data></edge></graph></graphml>`, opt: Options{Weights: true, WeightKey: "capacity"}, edges: []string{"a>b=7"}},
		{name: "edges before nodes, entities", in: graphmlHead + `<graph edgedefault="directed"><edge source="x&amp;y" target="z"/><node id="x&amp;y"/><node id="z"/></graph></graphml>`,
			edges: []string{"x&y>z"}},
		{name: "isolated and foreign elements", in: graphmlHead + `<graph edgedefault="directed"><desc>plant</desc><node id="a"><port name="p"/></node><node id="b"/><edge source="a" target="b"/><node id="lonely"/></graph></graphml>`,
			edges: []string{"a>b"}, nodes: []string{"a", "b", "lonely"}},

		{name: "undeclared node", in: graphmlHead + "<graph edgedefault=\"directed\">\n<node id=\"a\"/>\n<edge source=\"a\" target=\"b\"/>\n</graph></graphml>", line: 8, err: `edge names node "b", which is never declared`},
		{name: "twice", in: graphmlHead + "<graph>\n<node id=\"a\"/>\n<node id=\"a\"/></graph></graphml>", line: 8, err: `node "a" declared twice`},
		{name: "bad weight", in: graphmlHead + "<graph edgedefault=\"directed\"><node id=\"a\"/>\n<edge source=\"a\" target=\"a\"><data key=\"w\">heavy</data></edge></graph></graphml>", opt: Options{Weights: true}, line: 7, err: `weight "heavy" is not a finite number`},
		{name: "zero weight", in: graphmlHead + "<graph edgedefault=\"directed\"><node id=\"a\"/>\n<edge source=\"a\" target=\"a\"><data key=\"w\">0</data></edge></graph></graphml>", line: 7, err: "weight 0 is no coupling"},
		{name: "not graphml", in: "<?xml version=\"1.0\"?>\n<svg/>", line: 2, err: "the root element is <svg>"},
		// Without edgedefault (required by the GraphML schema; networkx
		// reads such a file as undirected) the edges must say their own
		// direction.
		{name: "no edgedefault", in: graphmlHead + "<graph>\n<node id=\"a\"/><node id=\"b\"/>\n<edge source=\"a\" target=\"b\" directed=\"true\"/>\n<edge source=\"b\" target=\"a\"/></graph></graphml>",
			line: 6, err: `<graph> has no edgedefault, and the <edge> at line 9 no directed attribute`},
		{name: "no edgedefault, every edge directed or not", in: graphmlHead + `<graph><node id="a"/><node id="b"/><node id="c"/>
<edge source="a" target="b" directed="true"/><edge source="b" target="c" directed="false"/></graph></graphml>`, edges: []string{"a>b", "b>c", "c>b"}},
		{name: "no edgedefault, no edges", in: graphmlHead + `<graph><node id="a"/></graph></graphml>`, edges: []string{}, nodes: []string{"a"}},
		{name: "syntax", in: graphmlHead + "<graph>\n<node id=\"a\">\n</graph>", line: 8, err: "XML: "},
		{name: "two graphs", in: graphmlHead + "<graph/>\n<graph/></graphml>", line: 7, err: "a second <graph>"},
		{name: "nested", in: graphmlHead + "<graph><node id=\"a\"><graph/></node></graph></graphml>", line: 6, err: "nested graphs"},
		{name: "hyperedge", in: graphmlHead + "<graph><hyperedge/></graph></graphml>", line: 6, err: "hyperedges"},
		{name: "unknown key", in: graphmlHead + "<graph><node id=\"a\"><data key=\"zz\">1</data></node></graph></graphml>", line: 6, err: `key "zz"`},
		{name: "control character id", in: graphmlHead + "<graph><node id=\"a&#x1;\"/></graph></graphml>", line: 6, err: "XML: "},
		{name: "empty", in: graphmlHead + "</graphml>", err: "no <graph>"},
		{name: "deep", in: graphmlHead + "<graph>" + strings.Repeat("<desc>", 300), line: 6, err: "nested more than 256"},
		{name: "long token", in: graphmlHead + "<graph><node id=\"" + strings.Repeat("n", 2<<20) + "\"/></graph></graphml>", line: 6, err: "longer than"},
		{name: "trailing", in: graphmlHead + "<graph/></graphml>\n<graphml/>", line: 7, err: "a second root element"},
	}
	runReadCases(t, GraphML, cases)
}

func TestGML(t *testing.T) {
	cases := []readCase{
		// networkx: names from labels, ids are integers.
		{name: "networkx directed", in: "graph [\n  directed 1\n  node [\n    id 0\n    label \"pump&#38;valve\"\n  ]\n  node [\n    id 1\n    label \"tank\"\n    graphics [ x 1 y 2 ]\n  ]\n  edge [\n    source 0\n    target 1\n    weight 2.5\n  ]\n]\n",
			opt: Options{Weights: true}, edges: []string{"pump&valve>tank=2.5"}},
		// igraph: a Creator line, names from the name attribute.
		{name: "igraph", in: "Creator \"igraph version 0.10\"\nVersion 1\ngraph\n[\n  directed 1\n  node\n  [\n    id 0\n    name \"a\"\n  ]\n  node\n  [\n    id 1\n    name \"b\"\n  ]\n  edge\n  [\n    source 0\n    target 1\n  ]\n]\n",
			edges: []string{"a>b"}},
		{name: "undirected without directed key, ids as names", in: "# comment\ngraph [ node [ id 5 ] node [ id 7 label \"x\" ] edge [ source 5 target 7 ] edge [ source 7 target 7 ] ]",
			edges: []string{"5>7", "7>5", "7>7"}, loops: 1},
		{name: "duplicate labels fall back to ids", in: "graph [ directed 1 node [ id 1 label \"p\" ] node [ id 2 label \"p\" ] edge [ source 1 target 2 ] ]",
			edges: []string{"1>2"}},
		{name: "parallel edges", in: "graph [ directed 1 multigraph 1 node [ id 1 ] node [ id 2 ] edge [ source 1 target 2 ] edge [ source 1 target 2 key 1 ] ]",
			edges: []string{"1>2"}, dups: 1},

		{name: "undeclared", in: "graph [ directed 1\nnode [ id 1 ]\nedge [ source 1\ntarget 9 ] ]", line: 4, err: `edge names node id "9", which is never declared`},
		{name: "twice", in: "graph [ node [ id 1 ]\nnode [ id 1 ] ]", line: 2, err: `node id "1" declared twice`},
		{name: "no id", in: "graph [\nnode [ label \"a\" ] ]", line: 2, err: "node without an id"},
		{name: "unclosed", in: "graph [\n directed 1\n", line: 3, err: "a ] is missing"},
		{name: "unterminated string", in: "graph [\n node [ id 1 label \"ab\n", line: 2, err: "unterminated string"},
		{name: "second graph", in: "graph [ ]\ngraph [ ]", line: 2, err: "a second graph"},
		{name: "no graph", in: "Creator \"x\"\n", line: 2, err: "no \"graph [ ... ]\""},
		{name: "bad directed", in: "graph [ directed 2 ]", line: 1, err: `directed "2"`},
		{name: "deep", in: "graph [ x " + strings.Repeat("[ y ", 200), line: 1, err: "nested more than 100"},
		{name: "bad character", in: "graph [ { ]", line: 1, err: "unexpected character"},
		{name: "bad weight", in: "graph [ directed 1 node [ id 1 ] edge [ source 1 target 1 weight 0 ] ]", line: 1, err: "weight 0 is no coupling"},
	}
	runReadCases(t, GML, cases)
}

func TestPajek(t *testing.T) {
	cases := []readCase{
		{name: "labels, arcs and edges", in: "% fictional loop\n*Network plant\n*Vertices 4\n1 \"feed pump\" 0.1 0.2 0.5\n2 tank\n3 \"valve\"\n*Arcs\n1 2 1.5 c Blue\n2 3\n*Edges\n3 4 2\n",
			opt: Options{Weights: true}, edges: []string{"feed pump>tank=1.5", "tank>valve=1", "valve>4=2", "4>valve=2"}},
		{name: "lists", in: "*vertices 3\n*arcslist\n1 2 3\n*edgeslist\n2 3\n",
			edges: []string{"1>2", "1>3", "2>3", "3>2"}, nodes: []string{"1", "2", "3"}},
		{name: "duplicate labels: numbers name the states", in: "*Vertices 2\n1 p\n2 p\n*Arcs\n1 2\n",
			edges: []string{"1>2"}},
		{name: "label equal to another number", in: "*Vertices 2\n1 2\n*Arcs\n1 2\n", edges: []string{"1>2"}},
		{name: "isolated vertices", in: "*Vertices 5\n*Arcs\n1 2\n", edges: []string{"1>2"}, nodes: []string{"1", "2", "3", "4", "5"}},
		{name: "two-mode header", in: "*Vertices 3 1\n*Edges\n1 2\n1 3\n", edges: []string{"1>2", "2>1", "1>3", "3>1"}},

		{name: "out of range", in: "*Vertices 2\n*Arcs\n1 3\n", line: 3, err: `vertex "3" is not a number in 1..2`},
		{name: "arcs first", in: "*Arcs\n1 2\n", line: 1, err: "*Arcs before *Vertices"},
		{name: "claim", in: "*Vertices 100000000\n*Arcs\n1 2\n", line: 1, err: "which the file can justify"},
		{name: "too many", in: "*Vertices 9999999999\n", line: 1, err: "more than the"},
		{name: "matrix", in: "*Vertices 2\n*Matrix\n0 1\n1 0\n", line: 2, err: "*Matrix sections are not supported"},
		{name: "partition", in: "*Vertices 2\n*Partition x\n", line: 2, err: "not a network"},
		{name: "no vertices", in: "1 2\n", line: 1, err: "want *Vertices N first"},
		{name: "bad weight", in: "*Vertices 2\n*Arcs\n1 2 0\n", line: 3, err: "weight 0 is no coupling"},
		{name: "unterminated label", in: "*Vertices 2\n1 \"a b\n", line: 2, err: "unterminated quoted label"},
		{name: "listed twice", in: "*Vertices 2\n1 a\n1 b\n*Arcs\n1 2\n", line: 3, err: "vertex 1 listed twice"},
		{name: "control", in: "*Vertices 2\n1 a\x01\n", line: 2, err: "control character 0x01"},
		{name: "unknown section", in: "*Vertices 2\n*Lines\n", line: 2, err: "unknown section"},
	}
	runReadCases(t, Pajek, cases)
}

func TestNodeLinkJSON(t *testing.T) {
	cases := []readCase{
		{name: "networkx links", in: `{"directed": true, "multigraph": false, "graph": {"name": "p"}, "nodes": [{"id": "a", "label": "A"}, {"id": 7}, {"id": "c"}], "links": [{"source": "a", "target": 7, "weight": 2}, {"source": 7, "target": "c"}]}`,
			opt: Options{Weights: true}, edges: []string{"a>7=2", "7>c=1"}, nodes: []string{"7", "a", "c"}},
		{name: "edges key, undirected by default, directed last", in: "{\"nodes\": [{\"id\": 1}, {\"id\": 2}],\n \"edges\": [{\"source\": 1, \"target\": 2}]}",
			edges: []string{"1>2", "2>1"}},
		{name: "directed after the links", in: `{"links": [{"source": 1, "target": 2}], "nodes": [{"id": 1}, {"id": 2}], "directed": true}`,
			edges: []string{"1>2"}},
		{name: "multigraph", in: `{"directed": true, "multigraph": true, "nodes": [{"id": "a"}, {"id": "b"}], "links": [{"source": "a", "target": "b", "key": 0}, {"source": "a", "target": "b", "key": 1}]}`,
			edges: []string{"a>b"}, dups: 1},
		{name: "nested attributes skipped", in: `{"directed": true, "nodes": [{"id": "a", "pos": [1, [2, {"z": null}]]}, {"id": "b"}], "links": [{"source": "a", "target": "b", "extra": {"k": [true]}}]}`,
			edges: []string{"a>b"}},

		{name: "undeclared", in: "{\"directed\": true, \"nodes\": [{\"id\": 1}],\n\"links\": [\n{\"source\": 1, \"target\": 3}]}", line: 3, err: `edge names node "3", which is never declared`},
		{name: "no id", in: "{\"nodes\": [\n{\"label\": 1}]}", line: 2, err: "a node without an id"},
		{name: "twice", in: `{"nodes": [{"id": 1}, {"id": "1"}]}`, line: 1, err: `node "1" declared twice`},
		{name: "link keys that differ", in: `{"nodes": [{"id": 1}, {"id": 2}], "links": [{"source": 1, "target": 2}], "edges": [{"source": 2, "target": 1}]}`, line: 0, err: "differ"},
		{name: "a link key twice", in: `{"nodes": [], "links": [], "links": []}`, line: 1, err: "two"},
		{name: "syntax", in: "{\"nodes\": [\n{\"id\": 1,,}]}", line: 2, err: "JSON: "},
		{name: "ends early", in: `{"nodes": [{"id": 1}`, line: 1, err: "ends early"},
		{name: "trailing", in: `{"nodes": [{"id": 1}]} {}`, line: 1, err: "data after the JSON object"},
		{name: "no nodes", in: `{"links": []}`, line: 1, err: `no "nodes" array`},
		{name: "not an object", in: `[1, 2]`, line: 1, err: "want an object"},
		{name: "bad weight", in: `{"directed": true, "nodes": [{"id": 1}], "links": [{"source": 1, "target": 1, "weight": "x"}]}`, line: 1, err: `weight "x"`},
		{name: "deep", in: `{"graph": ` + strings.Repeat("[", 1100), line: 1, err: "nested more than 1000"},
		{name: "long string", in: `{"nodes": [{"id": "` + strings.Repeat("n", 2<<20) + `"}]}`, line: 1, err: "longer than"},
		{name: "bad id type", in: `{"nodes": [{"id": [1]}]}`, line: 1, err: "id: want a string or a number"},
	}
	runReadCases(t, NodeLinkJSON, cases)
}

// The edges under both "links" and "edges", as netsteer writes them for
// networkx of either default, read as one list.
func TestNodeLinkBothKeys(t *testing.T) {
	in, err := Read(strings.NewReader(`{"directed": true, "nodes": [{"id": "a"}, {"id": "b"}], "links": [{"source": "a", "target": "b"}], "edges": [{"source": "a", "target": "b"}]}`), "x.json", Options{})
	if err != nil {
		t.Fatal(err)
	}
	if g := in.Network; g.N() != 2 || g.Edges() != 1 || g.DuplicatesMerged() != 0 {
		t.Fatalf("got %d states, %d edges, %d merged", g.N(), g.Edges(), g.DuplicatesMerged())
	}
}
