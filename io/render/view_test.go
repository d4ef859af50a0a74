package render

import (
	"bytes"
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/gonum/graph/simple"
	"gonum.org/v1/gonum/graph/topo"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/analysis"
)

func TestEscape(t *testing.T) {
	tests := []struct {
		name, in, label, tooltip, html string
	}{
		{"plain", "pump.p1_speed", `"pump.p1_speed"`, `"pump.p1_speed"`, `pump.p1_speed`},
		{"quote", `a"b`, `"a\"b"`, `"a\"b"`, `a&quot;b`},
		{"backslash", `a\N`, `"a\\N"`, `"a\\\\N"`, `a\\N`},
		{"trailing backslash", `a\`, `"a\\"`, `"a\\\\"`, `a\\`},
		{"entity text", `&lt;`, `"&amp;lt;"`, `"&amp;lt;"`, `&amp;lt;`},
		{"markup", `<b>`, `"<b>"`, `"<b>"`, `&lt;b&gt;`},
		{"control", "a\tb\x01", `"a␉b␁"`, `"a␉b␁"`, `a␉b␁`},
		{"invalid utf-8", "a\xffb", `"a` + "\uFFFD" + `b"`, `"a` + "\uFFFD" + `b"`, "a\uFFFDb"},
		{"unicode", "ΔP 名前", `"ΔP 名前"`, `"ΔP 名前"`, `ΔP 名前`},
	}
	for _, tc := range tests {
		if got := dotLabel(tc.in); got != tc.label {
			t.Errorf("%s: dotLabel(%q) = %s, want %s", tc.name, tc.in, got, tc.label)
		}
		if got := dotTooltip(tc.in); got != tc.tooltip {
			t.Errorf("%s: dotTooltip(%q) = %s, want %s", tc.name, tc.in, got, tc.tooltip)
		}
		if got := htmlText(tc.in); got != tc.html {
			t.Errorf("%s: htmlText(%q) = %s, want %s", tc.name, tc.in, got, tc.html)
		}
	}
	long := strings.Repeat("x", 50)
	if got, want := Shown(long), strings.Repeat("x", maxLabelRunes)+"…"; got != want {
		t.Errorf("Shown(50 x) = %q, want %q", got, want)
	}
}

// TestCondensationAgainstGonum compares the condensation view with gonum's
// topo.TarjanSCC (an independent implementation) on random networks larger
// than the view limit.
func TestCondensationAgainstGonum(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 5))
	for trial := 0; trial < 20; trial++ {
		n := 200 + rng.IntN(200)
		g := randomNet(t, rng, n, 0.6+rng.Float64()*0.8)
		in := review(t, g, analysis.ReviewRequest{}, nil, nil)
		max := 10 + rng.IntN(100)
		v, err := Select(in, Options{View: Components, MaxNodes: max})
		if err != nil {
			t.Fatal(err)
		}
		if v.Kind != Components {
			t.Fatalf("trial %d: %d states over a limit of %d drew view %d, want a condensation", trial, n, max, v.Kind)
		}

		// The reference partition.
		dg := simple.NewDirectedGraph()
		for u := 0; u < n; u++ {
			dg.AddNode(simple.Node(u))
		}
		for u := 0; u < n; u++ {
			for _, w := range g.Succ(int32(u)) {
				if int(w) != u {
					dg.SetEdge(simple.Edge{F: simple.Node(u), T: simple.Node(w)})
				}
			}
		}
		sccs := topo.TarjanSCC(dg)
		size := map[int]int{}    // state -> size of its component
		sccOf := map[int32]int{} // state -> index in sccs
		big := 0
		for k, c := range sccs {
			for _, x := range c {
				size[int(x.ID())] = len(c)
				sccOf[int32(x.ID())] = k
			}
			if len(c) >= 2 {
				big++
			}
		}
		wantOwn := big
		if len(sccs) <= max {
			wantOwn = len(sccs)
		} else if wantOwn > max-3 {
			wantOwn = max - 3
		}
		own, states, driven := 0, 0, 0
		for _, cn := range v.Comps {
			states += cn.States
			driven += cn.Driven
			if cn.Component >= 0 {
				own++
				if got := size[int(cn.First)]; got != cn.States {
					t.Errorf("trial %d: component of state %d has %d states, gonum says %d", trial, cn.First, cn.States, got)
				}
			}
		}
		if own != wantOwn {
			t.Errorf("trial %d: %d components drawn one by one, want %d (%d components, %d of two or more, limit %d)", trial, own, wantOwn, len(sccs), big, max)
		}
		if states != n {
			t.Errorf("trial %d: nodes hold %d states, want %d", trial, states, n)
		}
		if want := len(in.In.Design.Touched()); driven != want {
			t.Errorf("trial %d: nodes count %d driven states, want %d", trial, driven, want)
		}
		if len(v.Comps) > max {
			t.Errorf("trial %d: %d nodes drawn over a limit of %d", trial, len(v.Comps), max)
		}
		// Edge counts: every edge between different nodes, once.
		ownNode := map[int]int32{} // gonum component -> drawn node
		for i, cn := range v.Comps {
			if cn.Component >= 0 {
				ownNode[sccOf[cn.First]] = int32(i)
			}
		}
		nodeOf := map[int32]int32{}
		for u := 0; u < n; u++ {
			if i, ok := ownNode[sccOf[int32(u)]]; ok {
				nodeOf[int32(u)] = i
			}
		}
		if v.EdgesTotal == len(v.CompEdges) {
			cross := 0
			for u := 0; u < n; u++ {
				for _, w := range g.Succ(int32(u)) {
					a, aok := nodeOf[int32(u)]
					b, bok := nodeOf[w]
					if (aok || bok) && !(aok && bok && a == b) {
						cross++
					}
				}
			}
			// Edges between two summarised components of one summary node
			// are not drawn; count only those touching an own node.
			touching := 0
			for _, e := range v.CompEdges {
				if v.Comps[e.From].Component >= 0 || v.Comps[e.To].Component >= 0 {
					touching += e.Count
				}
			}
			if touching != cross {
				t.Errorf("trial %d: drawn edges touching own components stand for %d network edges, want %d", trial, touching, cross)
			}
		}
	}
}

// path of small random DAGs, and checks that back edges are ignored.
func TestDepth(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for trial := 0; trial < 300; trial++ {
		n := 1 + rng.IntN(9)
		var from, to []int32
		for u := 0; u < n; u++ {
			for w := u + 1; w < n; w++ {
				if rng.IntN(3) == 0 {
					from, to = append(from, int32(u)), append(to, int32(w))
				}
			}
		}
		// Shuffle node numbers so the order does not help.
		perm := rng.Perm(n)
		pf := make([]int32, len(from))
		pt := make([]int32, len(to))
		for i := range from {
			pf[i], pt[i] = int32(perm[from[i]]), int32(perm[to[i]])
		}
		want := 0
		var walk func(u int32, l int)
		walk = func(u int32, l int) {
			if l > want {
				want = l
			}
			for i := range pf {
				if pf[i] == u {
					walk(pt[i], l+1)
				}
			}
		}
		for u := 0; u < n; u++ {
			walk(int32(u), 1)
		}
		if got := depth(n, pf, pt); got != want {
			t.Errorf("trial %d: depth %d, want %d (edges %v -> %v)", trial, got, want, pf, pt)
		}
	}
	// A directed cycle of 5 has 5 layers once one edge is set aside; a
	// self-loop adds none.
	if got := depth(5, []int32{0, 1, 2, 3, 4, 2}, []int32{1, 2, 3, 4, 0, 2}); got != 5 {
		t.Errorf("cycle of 5: depth %d, want 5", got)
	}
}

// TestAutoLayout: a long chain is deep and goes to sfdp; a star is shallow
// and goes to dot.
func TestAutoLayout(t *testing.T) {
	chain := structural.NewIntBuilder(120, 1)
	star := structural.NewIntBuilder(120, 1)
	for i := int32(0); i+1 < 120; i++ {
		chain.AddEdge(i, i+1)
		star.AddEdge(0, i+1)
	}
	for _, tc := range []struct {
		b    *structural.Builder
		want string
	}{{chain, "sfdp"}, {star, "dot"}} {
		g, err := tc.b.Build(structural.BuildOptions{})
		if err != nil {
			t.Fatal(err)
		}
		v, err := Select(&Input{Net: g}, Options{})
		if err != nil {
			t.Fatal(err)
		}
		if got, _ := ChooseLayout(AutoLayout, v); got != tc.want {
			t.Errorf("auto layout %s, want %s", got, tc.want)
		}
	}
	if _, err := ChooseLayout("spring", &View{}); err == nil {
		t.Errorf("unknown layout accepted")
	}
}

// TestLargeStemCut: the driven view of a 10^5-state chain keeps the limit.
func TestLargeStemCut(t *testing.T) {
	const n = 100000
	b := structural.NewIntBuilder(n, 1)
	for i := int32(0); i+1 < n; i++ {
		b.AddEdge(i, i+1)
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	in := review(t, g, analysis.ReviewRequest{}, nil, nil)
	for _, kind := range []Kind{Auto, Control, Around} {
		v, err := Select(in, Options{View: kind, Centres: []int32{n / 2}, Hops: 1000})
		if err != nil {
			t.Fatal(err)
		}
		drawn := len(v.States) + len(v.Comps)
		if v.Graph() && (drawn == 0 || drawn > DefaultMaxNodes) {
			t.Errorf("view %d of a %d-chain draws %d nodes, want 1..%d", kind, n, drawn, DefaultMaxNodes)
		}
		if !v.Graph() {
			sc, _ := controlScene(in, v)
			if len(sc.items) > 200*DefaultMaxStems {
				t.Errorf("the control view of a %d-chain has %d shapes", n, len(sc.items))
			}
			continue
		}
		var dot bytes.Buffer
		if err := DOT(&dot, in, v, AutoLayout); err != nil {
			t.Fatal(err)
		}
	}
}

// TestViewForMatchesSelect checks that Options.ViewFor, which a command
// asks before any analysis whether a layout program will be needed, gives
// the kind Select then draws, for each view asked and on both sides of
// MaxNodes (the heating plant has 48 states).
func TestViewForMatchesSelect(t *testing.T) {
	in := heatingDrivers(t)
	n := in.Net.N()
	c := lookup(t, in.Net, "supply.header_temp")
	for _, max := range []int{10, n - 1, n, 200} {
		for _, kind := range []Kind{Auto, Whole, Around, Components, Control} {
			opt := Options{View: kind, MaxNodes: max, Centres: c, Hops: 1}
			v, err := Select(in, opt)
			if err != nil {
				continue // refused (too large to draw one by one)
			}
			if got := opt.ViewFor(n); got != v.Kind {
				t.Errorf("view %v, MaxNodes %d: ViewFor = %v, Select drew %v", kind, max, got, v.Kind)
			}
			if opt.ViewFor(n).Graph() != v.Graph() {
				t.Errorf("view %v, MaxNodes %d: ViewFor(n).Graph() = %v, the view drawn %v", kind, max, opt.ViewFor(n).Graph(), v.Graph())
			}
		}
	}
	if (&Options{MaxNodes: n}).ViewFor(n) != Whole || (&Options{MaxNodes: n - 1}).ViewFor(n) != Control {
		t.Error("Auto: want Whole up to MaxNodes states, Control above")
	}
}
