package structural_test

import (
	"fmt"
	"math/rand/v2"
	"slices"
	"sort"
	"strconv"
	"testing"

	"github.com/netsteer/netsteer/structural"
)

// namedEdge is one input edge of a test: names and, when w != 0, a weight.
type namedEdge struct {
	u, v string
	w    float64
}

// buildNamed interns the names in order of appearance and builds.
func buildNamed(t *testing.T, edges []namedEdge, opt structural.BuildOptions) *structural.Network {
	t.Helper()
	b := structural.NewBuilder()
	for _, e := range edges {
		u, err := b.Intern([]byte(e.u))
		if err != nil {
			t.Fatal(err)
		}
		v, err := b.Intern([]byte(e.v))
		if err != nil {
			t.Fatal(err)
		}
		if e.w != 0 {
			b.AddWeightedEdge(u, v, e.w)
		} else {
			b.AddEdge(u, v)
		}
	}
	g, err := b.Build(opt)
	if err != nil {
		t.Fatal(err)
	}
	return g
}

// namedEdges lists g's edges as sorted "u>v" strings (with "=w" when g has
// weights).
func namedEdges(g *structural.Network) []string {
	var out []string
	for u := int32(0); int(u) < g.N(); u++ {
		for k := g.Out().Ptr[u]; k < g.Out().Ptr[u+1]; k++ {
			s := g.Name(u) + ">" + g.Name(g.Out().Adj[k])
			if g.Weights() != nil {
				s += "=" + strconv.FormatFloat(g.Weights()[k], 'g', -1, 64)
			}
			out = append(out, s)
		}
	}
	sort.Strings(out)
	return out
}

// checkBuilt checks what every built network must satisfy, independently
// of how Build computes it: sorted duplicate-free rows, and In holding
// exactly the reversed edges of Out (checked through a set, not through
// matching.Transpose).
func checkBuilt(t *testing.T, g *structural.Network) {
	t.Helper()
	n := g.N()
	if g.Out().Rows != n || g.Out().Cols != n || g.In().Rows != n || g.In().Cols != n {
		t.Fatalf("CSR shapes %dx%d and %dx%d for %d states", g.Out().Rows, g.Out().Cols, g.In().Rows, g.In().Cols, n)
	}
	if err := g.Out().Validate(); err != nil {
		t.Fatal(err)
	}
	if err := g.In().Validate(); err != nil {
		t.Fatal(err)
	}
	out := map[[2]int32]bool{}
	for u := int32(0); int(u) < n; u++ {
		row := g.Succ(u)
		for k, v := range row {
			if k > 0 && v <= row[k-1] {
				t.Fatalf("out-row %d not strictly increasing: %v", u, row)
			}
			out[[2]int32{u, v}] = true
		}
	}
	in := 0
	for v := int32(0); int(v) < n; v++ {
		row := g.Pred(v)
		for k, u := range row {
			if k > 0 && u <= row[k-1] {
				t.Fatalf("in-row %d not strictly increasing: %v", v, row)
			}
			if !out[[2]int32{u, v}] {
				t.Fatalf("in-row %d lists %d, but %d -> %d is no edge", v, u, u, v)
			}
			in++
		}
	}
	if in != len(out) || g.Edges() != len(out) {
		t.Fatalf("%d in-entries, %d out-entries, Edges() = %d", in, len(out), g.Edges())
	}
}

// Expected networks worked out by hand from the edge lists.
func TestBuild(t *testing.T) {
	und := structural.BuildOptions{Undirected: true}
	dyn := structural.BuildOptions{SelfDynamics: true}
	both := structural.BuildOptions{Undirected: true, SelfDynamics: true}
	cases := []struct {
		name   string
		edges  []namedEdge
		opt    structural.BuildOptions
		want   []string
		loops  int
		merged int
	}{
		{name: "chain", edges: []namedEdge{{"a", "b", 0}, {"b", "c", 0}}, want: []string{"a>b", "b>c"}},
		{name: "repeats", edges: []namedEdge{{"a", "b", 0}, {"a", "b", 0}, {"b", "a", 0}, {"a", "b", 0}},
			want: []string{"a>b", "b>a"}, merged: 2},
		{name: "self-loops", edges: []namedEdge{{"a", "a", 0}, {"a", "a", 0}, {"b", "b", 0}, {"a", "b", 0}},
			want: []string{"a>a", "a>b", "b>b"}, loops: 2, merged: 1},
		{name: "weights summed", edges: []namedEdge{{"a", "b", 2}, {"a", "b", 0.5}, {"b", "c", 0}, {"a", "b", -1}},
			want: []string{"a>b=1.5", "b>c=1"}, merged: 2},
		{name: "undirected", edges: []namedEdge{{"a", "b", 0}, {"c", "c", 0}}, opt: und,
			want: []string{"a>b", "b>a", "c>c"}, loops: 1},
		// Under Undirected each edge stands for both directed couplings;
		// "b a" after "a b" repeats both of them.
		{name: "undirected repeats", edges: []namedEdge{{"a", "b", 0}, {"b", "a", 0}}, opt: und,
			want: []string{"a>b", "b>a"}, merged: 2},
		{name: "undirected weights", edges: []namedEdge{{"a", "b", 2}, {"b", "a", 3}}, opt: und,
			want: []string{"a>b=5", "b>a=5"}, merged: 2},
		{name: "self-dynamics", edges: []namedEdge{{"a", "b", 0}}, opt: dyn,
			want: []string{"a>a", "a>b", "b>b"}, loops: 2},
		// A loop already in the input is not a repeat of the nodal
		// dynamics; a repeated input loop still is one.
		{name: "self-dynamics over loops", edges: []namedEdge{{"a", "a", 0}, {"a", "b", 0}, {"b", "b", 0}, {"b", "b", 0}}, opt: dyn,
			want: []string{"a>a", "a>b", "b>b"}, loops: 2, merged: 1},
		{name: "both", edges: []namedEdge{{"a", "b", 0}, {"b", "c", 0}, {"c", "b", 0}}, opt: both,
			want: []string{"a>a", "a>b", "b>a", "b>b", "b>c", "c>b", "c>c"}, loops: 3, merged: 2},
		{name: "weighted self-dynamics", edges: []namedEdge{{"a", "b", 4}}, opt: dyn,
			want: []string{"a>a=1", "a>b=4", "b>b=1"}, loops: 2},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			g := buildNamed(t, c.edges, c.opt)
			checkBuilt(t, g)
			if got := namedEdges(g); !slices.Equal(got, c.want) {
				t.Errorf("got edges %q, want %q", got, c.want)
			}
			if g.SelfLoops() != c.loops {
				t.Errorf("got SelfLoops %d, want %d", g.SelfLoops(), c.loops)
			}
			if g.DuplicatesMerged() != c.merged {
				t.Errorf("got DuplicatesMerged %d, want %d", g.DuplicatesMerged(), c.merged)
			}
		})
	}
}

// Random multigraphs against a map model of the rules: Undirected adds
// v -> u for every u -> v (u != v), SelfDynamics adds u -> u for every
// state, repeats merge with weights summed, and DuplicatesMerged counts
// the dropped repeats except the nodal-dynamics loops that fell on an
// input loop.
func TestBuildMatchesMapModel(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 11))
	for trial := 0; trial < 300; trial++ {
		n := 1 + r.IntN(40)
		m := r.IntN(4 * n)
		opt := structural.BuildOptions{Undirected: r.IntN(2) == 0, SelfDynamics: r.IntN(2) == 0}
		weighted := r.IntN(2) == 0
		// Names mix words and decimals so both naming routes are used.
		name := func(i int) string {
			if i%3 == 0 {
				return strconv.Itoa(i)
			}
			return fmt.Sprintf("s%d", i)
		}
		var in []namedEdge
		for k := 0; k < m; k++ {
			e := namedEdge{u: name(r.IntN(n)), v: name(r.IntN(n))}
			if weighted && r.IntN(3) > 0 {
				e.w = float64(1 + r.IntN(9))
			}
			in = append(in, e)
		}
		// Intern every state first, so that isolated ones count in N.
		b := structural.NewBuilder()
		for i := 0; i < n; i++ {
			if _, err := b.Intern([]byte(name(i))); err != nil {
				t.Fatal(err)
			}
		}
		for _, e := range in {
			u, _ := b.Intern([]byte(e.u))
			v, _ := b.Intern([]byte(e.v))
			if e.w != 0 {
				b.AddWeightedEdge(u, v, e.w)
			} else {
				b.AddEdge(u, v)
			}
		}
		g, err := b.Build(opt)
		if err != nil {
			t.Fatal(err)
		}
		checkBuilt(t, g)

		// The model.
		type key struct{ u, v string }
		w := map[key]float64{}
		total := 0
		anyWeight := false
		add := func(u, v string, x float64) {
			if x == 0 {
				x = 1
			} else {
				anyWeight = true
			}
			w[key{u, v}] += x
			total++
		}
		for _, e := range in {
			add(e.u, e.v, e.w)
			if opt.Undirected && e.u != e.v {
				add(e.v, e.u, e.w)
			}
		}
		inputLoops := map[string]bool{}
		for k := range w {
			if k.u == k.v {
				inputLoops[k.u] = true
			}
		}
		if opt.SelfDynamics {
			for i := 0; i < n; i++ {
				w[key{name(i), name(i)}] += 0 // present; weight checked below
				total++
			}
		}
		loops := 0
		for k := range w {
			if k.u == k.v {
				loops++
			}
		}
		merged := total - len(w)
		if opt.SelfDynamics {
			merged -= len(inputLoops)
		}
		if g.N() != n || g.Edges() != len(w) || g.SelfLoops() != loops || g.DuplicatesMerged() != merged {
			t.Fatalf("trial %d (%+v): got N %d, edges %d, loops %d, merged %d; want %d, %d, %d, %d",
				trial, opt, g.N(), g.Edges(), g.SelfLoops(), g.DuplicatesMerged(), n, len(w), loops, merged)
		}
		if (g.Weights() != nil) != anyWeight {
			t.Fatalf("trial %d: weights kept %v, want %v", trial, g.Weights() != nil, anyWeight)
		}
		for u := int32(0); int(u) < g.N(); u++ {
			for k := g.Out().Ptr[u]; k < g.Out().Ptr[u+1]; k++ {
				kk := key{g.Name(u), g.Name(g.Out().Adj[k])}
				x, ok := w[kk]
				if !ok {
					t.Fatalf("trial %d: unexpected namedEdge %v", trial, kk)
				}
				if g.Weights() == nil || kk.u == kk.v && opt.SelfDynamics {
					// Nodal-dynamics loops: only presence is specified.
					continue
				}
				if g.Weights()[k] != x {
					t.Fatalf("trial %d: namedEdge %v weight %g, want %g", trial, kk, g.Weights()[k], x)
				}
			}
		}
	}
}

func TestBuildEmpty(t *testing.T) {
	if _, err := structural.NewBuilder().Build(structural.BuildOptions{}); err == nil {
		t.Errorf("empty builder: no error")
	}
	if _, err := structural.NewIntBuilder(3, 1).Intern([]byte("x")); err == nil {
		t.Errorf("Intern on an integer builder: no error")
	}
	// Isolated states only.
	g, err := structural.NewIntBuilder(3, 1).Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	checkBuilt(t, g)
	if g.N() != 3 || g.Edges() != 0 || g.Name(0) != "1" || g.Name(2) != "3" {
		t.Errorf("got N %d, edges %d, names %q..%q; want 3, 0, 1..3", g.N(), g.Edges(), g.Name(0), g.Name(2))
	}
}

// A long chain builds without recursion and keeps its order.
func TestBuildLongChain(t *testing.T) {
	const n = 200000
	b := structural.NewIntBuilder(n, 0)
	b.Grow(n - 1)
	for i := int32(0); i+1 < n; i++ {
		b.AddEdge(i, i+1)
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if g.Edges() != n-1 {
		t.Fatalf("got %d edges, want %d", g.Edges(), n-1)
	}
	for i := int32(0); i+1 < n; i++ {
		if r := g.Succ(i); len(r) != 1 || r[0] != i+1 {
			t.Fatalf("out-row %d = %v, want [%d]", i, r, i+1)
		}
		if r := g.Pred(i + 1); len(r) != 1 || r[0] != i {
			t.Fatalf("in-row %d = %v, want [%d]", i+1, r, i)
		}
	}
}

// TestSelfDynamicsKeepsInputLoopWeight: --self-dynamics adds a loop only
// where the input has none, so an input loop keeps its own weight.
func TestSelfDynamicsKeepsInputLoopWeight(t *testing.T) {
	b := structural.NewBuilder()
	a, _ := b.Intern([]byte("a"))
	c, _ := b.Intern([]byte("c"))
	b.AddWeightedEdge(a, a, 2.5)
	b.AddWeightedEdge(a, c, 4)
	g, err := b.Build(structural.BuildOptions{SelfDynamics: true})
	if err != nil {
		t.Fatal(err)
	}
	want := map[[2]int32]float64{{a, a}: 2.5, {a, c}: 4, {c, c}: 1}
	got := map[[2]int32]float64{}
	for u := int32(0); int(u) < g.N(); u++ {
		for k := g.Out().Ptr[u]; k < g.Out().Ptr[u+1]; k++ {
			got[[2]int32{u, g.Out().Adj[k]}] = g.Weights()[k]
		}
	}
	if len(got) != len(want) {
		t.Fatalf("edges = %v, want %v", got, want)
	}
	for e, w := range want {
		if got[e] != w {
			t.Errorf("weight of %v = %g, want %g", e, got[e], w)
		}
	}
	if g.DuplicatesMerged() != 0 || g.SelfLoops() != 2 {
		t.Errorf("DuplicatesMerged = %d, SelfLoops = %d, want 0 and 2", g.DuplicatesMerged(), g.SelfLoops())
	}
}
