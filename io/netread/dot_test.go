package netread

import (
	"fmt"
	"io"
	"runtime"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/structural"
)

// DOT semantics from the language's definition (Graphviz, "The DOT
// Language", graphviz.org/doc/info/lang.html): chains a -> b -> c, a
// subgraph operand stands for all its nodes, "edge [...]" sets defaults for
// the rest of its (sub)graph, \" is the only escape in a quoted string.
func TestDOT(t *testing.T) {
	long := strings.Repeat("n", MaxNameBytes)
	cases := []readCase{
		{name: "chain", in: "digraph plant {\n a -> b -> c\n}\n", edges: []string{"a>b", "b>c"}},
		{name: "statements and semicolons", in: "digraph { a -> b; b -> c; c -> a; }", edges: []string{"a>b", "b>c", "c>a"}},
		{name: "subgraph operand", in: "digraph { {a b} -> c }", edges: []string{"a>c", "b>c"}},
		{name: "subgraph on the right", in: "digraph { a -> {b c} }", edges: []string{"a>b", "a>c"}},
		{name: "subgraph product", in: "digraph { {a b} -> {c d} }", edges: []string{"a>c", "a>d", "b>c", "b>d"}},
		{name: "named subgraph chain", in: "digraph { subgraph s { x; y } -> z -> {u} }", edges: []string{"x>z", "y>z", "z>u"}},
		{name: "subgraph with inner edges", in: "digraph { {a -> b} -> c }", edges: []string{"a>b", "a>c", "b>c"}},
		{name: "nested subgraphs", in: "digraph { {a {b {c}}} -> d }", edges: []string{"a>d", "b>d", "c>d"}},
		{name: "repeated operand node", in: "digraph { {a a} -> b }", edges: []string{"a>b"}},
		{name: "node statements", in: "digraph {\n lonely\n other [label=\"x\"]\n a -> b\n}\n",
			edges: []string{"a>b"}, nodes: []string{"a", "b", "lonely", "other"}},
		{name: "ports ignored", in: "digraph { a:p1 -> b:n; c:q:sw -> a }", edges: []string{"a>b", "c>a"}},
		{name: "quoted names", in: "digraph { \"pump 1\" -> \"valve, \\\"main\\\"\" -> \"a\\\\b\" }",
			edges: []string{"pump 1>valve, \"main\"", `valve, "main">a\\b`}},
		{name: "numerals and HTML", in: "digraph { -1.5 -> .5 -> <<b>x</b>> }", edges: []string{"-1.5>.5", ".5><<b>x</b>>"}},
		{name: "quoted and bare are one node", in: "digraph { a -> \"a\" }", edges: []string{"a>a"}, loops: 1},
		{name: "keywords any case", in: "DiGraph G { Node [shape=box]; EDGE [color=red]; a -> b }", edges: []string{"a>b"}},
		{name: "strict", in: "strict digraph { a -> b; a -> b }", edges: []string{"a>b"}, dups: 1},
		{name: "comments", in: "// top\n# cpp line\ndigraph { /* block\n */ a -> b // tail\n}", edges: []string{"a>b"}},
		{name: "crlf", in: "digraph {\r\n a -> b\r\n}\r\n", edges: []string{"a>b"}, nodes: []string{"a", "b"}},
		{name: "no final newline after comment", in: "digraph { a -> b } // end", edges: []string{"a>b"}},
		{name: "name at the limit", in: "digraph { " + long + " -> b }", edges: []string{long + ">b"}},
		{name: "weights ignored by default", in: "digraph { a -> b [weight=3] }", edges: []string{"a>b"}},
		{name: "weights", in: "digraph { a -> b [weight=3]; b -> c [weight=\"-0.5\", color=red]; c -> a }", opt: Options{Weights: true},
			edges: []string{"a>b=3", "b>c=-0.5", "c>a=1"}},
		{name: "weights summed", in: "digraph { a -> b [weight=3]; a -> b [weight=2] }", opt: Options{Weights: true},
			edges: []string{"a>b=5"}, dups: 1},
		{name: "edge defaults and scope", in: "digraph {\n edge [weight=2]\n a -> b\n { edge [weight=5]; b -> c }\n c -> d [weight=7]\n d -> a\n}",
			opt: Options{Weights: true}, edges: []string{"a>b=2", "b>c=5", "c>d=7", "d>a=2"}},
		{name: "chain weight", in: "digraph { a -> b -> c [weight=4] }", opt: Options{Weights: true}, edges: []string{"a>b=4", "b>c=4"}},
		{name: "undirected", in: "graph { a -- b -- c; c -- c }", edges: []string{"a>b", "b>a", "b>c", "c>b", "c>c"}, loops: 1},
		{name: "undirected weighted", in: "graph { a -- b [weight=2] }", opt: Options{Weights: true}, edges: []string{"a>b=2", "b>a=2"}},
		{name: "undirected with --undirected", in: "graph { a -- b }", opt: Options{Build: structural.BuildOptions{Undirected: true}},
			edges: []string{"a>b", "b>a"}},
		{name: "self-dynamics", in: "digraph { a -> b; b -> b }", opt: Options{Build: structural.BuildOptions{SelfDynamics: true}},
			edges: []string{"a>b", "a>a", "b>b"}, loops: 2},
		{name: "isolated only", in: "digraph { x }", nodes: []string{"x"}},
		{name: "byte-order mark", in: "\ufeffdigraph { a -> b }", edges: []string{"a>b"}},
		{name: "extra states", in: "digraph { a -> b }", opt: Options{States: []string{"c"}}, edges: []string{"a>b"}, nodes: []string{"a", "b", "c"}},

		{name: "empty file", in: "", err: "empty network: no graph"},
		{name: "only comments", in: "// nothing\n\n/* here */\n", err: "empty network: no graph"},
		{name: "empty graph", in: "digraph plant {\n}\n", err: "empty network"},
		{name: "an edge list read as DOT", in: "# plant\n\nvalve flow\nflow level\n", line: 3, err: "not a DOT graph"},
		{name: "only an edge operator", in: "\n->\n", line: 2, err: "not a DOT graph"},
		{name: "syntax error", in: "digraph {\n a -> b\n c -> \n}\n", line: 4, err: "DOT syntax"},
		{name: "unterminated quote", in: "digraph {\n a -> \"b\n}\n", line: 2, err: "unterminated quoted string"},
		{name: "unclosed brace", in: "digraph {\n a -> b\n", line: 3, err: "end-of-file"},
		{name: "bad weight", in: "digraph {\n a -> b\n b -> c [weight=heavy]\n}", opt: Options{Weights: true}, line: 3, err: "weight \"heavy\" is not a finite number"},
		{name: "bad weight without --weights", in: "digraph {\n a -> b [weight=heavy]\n}", line: 2, err: "not a finite number"},
		{name: "NaN weight", in: "digraph {\n a -> b [\n  weight=NaN ]\n}", line: 3, err: "not a finite number"},
		{name: "Inf weight", in: "digraph { a -> b [weight=\"-Inf\"] }", line: 1, err: "not a finite number"},
		{name: "weight 0", in: "digraph {\n a -> b [weight=0]\n}", line: 2, err: "weight 0"},
		{name: "bad default weight", in: "digraph {\n edge [weight=x]\n}", line: 2, err: "not a finite number"},
		{name: "empty name", in: "digraph {\n a -> \"\"\n}", line: 2, err: "empty node name"},
		{name: "name over the limit", in: "digraph {\n a\n -> " + long + "x }", line: 3, err: "node name of 4097 bytes"},
		{name: "line break in name", in: "digraph {\n a -> \"b\nc\"\n}", line: 2, err: "line break"},
		{name: "control character in name", in: "digraph {\n a -> \"b\x01c\"\n}", line: 2, err: "control character 0x01 in a node name"},
		{name: "DEL in name", in: "digraph {\n \"\x7f\" -> a\n}", line: 2, err: "control character 0x7f in a node name"},
		{name: "tab in quoted name", in: "digraph { \"a\tb\" -> c }", edges: []string{"a\tb>c"}},
		{name: "directed edge in graph", in: "graph {\n a -- b\n b -> c\n}", line: 3, err: "\"->\" in an undirected graph"},
		{name: "undirected edge in digraph", in: "digraph {\n a -> b -- c\n}", line: 2, err: "\"--\" in a digraph"},
		{name: "two graphs", in: "digraph { a -> b }\n\ndigraph { c -> d }\n", line: 3, err: "a second graph"},
		{name: "deep nesting", in: "digraph {\n" + strings.Repeat("{", maxDOTDepth+5) + strings.Repeat("}", maxDOTDepth+5) + "}", line: 2, err: "nested more than"},
		{name: "long chain", in: "digraph {\na" + strings.Repeat(" -> a", maxDOTChain+1) + "\n}", line: 2, err: "edge chain of more than"},
		{name: "operand explosion", in: dotProduct(3000), line: 1, err: "expand to more than"},
	}
	runReadCases(t, DOT, cases)
}

// dotProduct is "{n0 ... n(k-1)} -> {m0 ... m(k-1)}": k^2 edges from a few
// bytes per node.
func dotProduct(k int) string {
	var b strings.Builder
	b.WriteString("digraph { {")
	for i := 0; i < k; i++ {
		fmt.Fprintf(&b, " n%d", i)
	}
	b.WriteString("} -> {")
	for i := 0; i < k; i++ {
		fmt.Fprintf(&b, " m%d", i)
	}
	b.WriteString("} }")
	return b.String()
}

// Statements without semicolons do not add up to one long chain, and a
// chain at the limit reads (gonum's checker recurses along it).
func TestDOTChainsWithoutSemicolons(t *testing.T) {
	var b strings.Builder
	b.WriteString("digraph {\n")
	n := maxDOTChain + 10
	for i := 0; i < n; i++ {
		fmt.Fprintf(&b, "s%d -> s%d\n", i, i+1)
		if i%1000 == 0 {
			b.WriteString("s0 -> subgraph x { s1 } -> { s2 }\n")
		}
	}
	b.WriteString("}\n")
	sc, e := scanDOT([]byte(b.String()), "lines.dot")
	if e != nil {
		t.Fatal(e)
	}
	if want := n + 2*(n/1000+1); len(sc.ops) != want {
		t.Errorf("scan found %d edge operators, want %d", len(sc.ops), want)
	}
	in := "digraph { a" + strings.Repeat(" -> a", maxDOTChain) + " }"
	g, err := readNet(strings.NewReader(in), "chain.dot", Options{Format: DOT})
	if err != nil {
		t.Fatalf("chain of %d steps: %v", maxDOTChain, err)
	}
	if g.N() != 1 || g.Edges() != 1 || g.DuplicatesMerged() != maxDOTChain-1 {
		t.Errorf("got N %d, edges %d, merged %d; want 1, 1, %d", g.N(), g.Edges(), g.DuplicatesMerged(), maxDOTChain-1)
	}
}

// The DOT reader agrees with the edge-list reader on a network written both
// ways: an independent route through the other reader.
func TestDOTMatchesEdgeList(t *testing.T) {
	var dot, el strings.Builder
	dot.WriteString("digraph grid {\n")
	seed := uint64(99)
	next := func() int {
		seed = seed*6364136223846793005 + 1442695040888963407
		return int(seed>>33) % 150
	}
	for k := 0; k < 1000; k++ {
		u, v, w := next(), next(), k%7+1
		fmt.Fprintf(&dot, "  \"st %d\" -> \"st %d\" [weight=%d]\n", u, v, w)
		fmt.Fprintf(&el, "\"st %d\" \"st %d\" %d\n", u, v, w)
	}
	dot.WriteString("}\n")
	gd, err := readNet(strings.NewReader(dot.String()), "g.dot", Options{Format: DOT, Weights: true})
	if err != nil {
		t.Fatal(err)
	}
	ge, err := readNet(strings.NewReader(el.String()), "g.edges", Options{Weights: true})
	if err != nil {
		t.Fatal(err)
	}
	if err := checkNetwork(gd); err != nil {
		t.Fatal(err)
	}
	if gd.N() != ge.N() || gd.DuplicatesMerged() != ge.DuplicatesMerged() || gd.SelfLoops() != ge.SelfLoops() {
		t.Errorf("got N %d, dups %d, loops %d; want %d, %d, %d", gd.N(), gd.DuplicatesMerged(), gd.SelfLoops(), ge.N(), ge.DuplicatesMerged(), ge.SelfLoops())
	}
	if d := diffEdges(edgeMap(gd), edgeMap(ge)); d != "" {
		t.Errorf("edges differ:%s", d)
	}
}

// An input larger than MaxDOTBytes is refused before it is parsed.
func TestDOTTooLarge(t *testing.T) {
	if testing.Short() {
		t.Skip("builds a 64 MiB input")
	}
	in := io.MultiReader(strings.NewReader("digraph { a -> b }\n"), &blanks{n: MaxDOTBytes})
	var before, after runtime.MemStats
	runtime.ReadMemStats(&before)
	_, err := Read(in, "big.dot", Options{Format: DOT})
	runtime.ReadMemStats(&after)
	if err == nil || !strings.Contains(err.Error(), "larger than 64 MiB") {
		t.Fatalf("got %v, want a size error", err)
	}
	asError(t, err)
	t.Logf("allocated %d MB", (after.TotalAlloc-before.TotalAlloc)>>20)
}

// blanks reads as n spaces.
type blanks struct{ n int }

func (b *blanks) Read(p []byte) (int, error) {
	if b.n == 0 {
		return 0, io.EOF
	}
	k := min(len(p), b.n)
	for i := range p[:k] {
		p[i] = ' '
	}
	b.n -= k
	return k, nil
}

// The light scan that supplies line numbers must see the same IDs and edge
// operators as gonum's parser; where it does, errors carry lines.
func TestDOTScanAgreesWithParser(t *testing.T) {
	inputs := []string{
		"digraph G { a -> b }",
		"strict digraph \"the plant\" {\n graph [rankdir=LR]\n node [shape=box, color=\"red\"]\n edge [weight=2]\n a:p -> b:n -> c:q:sw\n}",
		"digraph { subgraph cluster_0 { label=\"zone\"; a; b } -> subgraph { c } -> {d e} [weight=1][color=blue] }",
		"digraph { <<i>html</i>> -> -2.5 -> .75 -> \"multi\\\nline\" }",
		"graph { a -- b; rank=same; subgraph s { c -- d } }",
		"DIGRAPH { NODE [a=b] Edge [c=d] x -> Subgraph y { z } }",
		"digraph { a -> b\n c -> d\n {e} -> f\n g h i }",
	}
	for _, in := range inputs {
		src := []byte(in + "\n")
		sc, e := scanDOT(src, "x")
		if e != nil {
			t.Errorf("%q: scan error %v", in, e)
			continue
		}
		f, err := parseDOT(src)
		if err != nil {
			t.Errorf("%q: parse error %v", in, err)
			continue
		}
		ids, ops := 0, 0
		countDOT(f.Graphs[0].Stmts, &ids, &ops)
		if f.Graphs[0].ID != "" {
			ids++
		}
		if ids != len(sc.ids) || ops != len(sc.ops) {
			t.Errorf("%q: scan found %d IDs, %d operators; the parse tree holds %d, %d", in, len(sc.ids), len(sc.ops), ids, ops)
		}
	}
}

// Errors found in the parse tree point at the right line in a file that
// uses most of the language before the faulty statement.
func TestDOTErrorLines(t *testing.T) {
	head := "strict digraph \"plant\" {\n" + // 1
		"  graph [rankdir=LR]\n" + // 2
		"  node [shape=box,\n" + // 3
		"        color=\"dark\ngreen\"]\n" + // 4-5
		"  /* a\n   comment */ a:out -> b:in:n\n" + // 6-7
		"  subgraph cluster { x; y } -> <<b>z</b>>\n" // 8
	for _, c := range []struct {
		tail string
		line int
		msg  string
	}{
		{"  b -> c [color=red,\n    weight=oops]\n}\n", 10, "weight \"oops\""},
		{"  b -> \"" + strings.Repeat("q", MaxNameBytes+1) + "\"\n}\n", 9, "node name of"},
		{"  { b -> \"\" }\n}\n", 9, "empty node name"},
	} {
		_, err := Read(strings.NewReader(head+c.tail), "p.dot", Options{Format: DOT, Weights: true})
		if err == nil {
			t.Errorf("no error for tail %q", c.tail)
			continue
		}
		e := asError(t, err)
		if e.Line != c.line || !strings.Contains(e.Msg, c.msg) {
			t.Errorf("got %q, want line %d with %q", e.Error(), c.line, c.msg)
		}
	}
}

func BenchmarkDOT(b *testing.B) {
	for _, n := range []int{1e3, 1e4, 1e5} {
		var sb strings.Builder
		sb.WriteString("digraph bench {\n")
		seed := uint64(7)
		next := func() int {
			seed = seed*6364136223846793005 + 1442695040888963407
			return int(seed>>33) % n
		}
		for k := 0; k < 5*n; k++ {
			fmt.Fprintf(&sb, "  s%d -> s%d [weight=%d]\n", next(), next(), k%9+1)
		}
		sb.WriteString("}\n")
		in := sb.String()
		b.Run(fmt.Sprintf("n=%d", n), func(b *testing.B) {
			b.SetBytes(int64(len(in)))
			for b.Loop() {
				if _, err := Read(strings.NewReader(in), "b.dot", Options{Format: DOT, Weights: true}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
