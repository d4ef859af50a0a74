package render

import (
	"bytes"
	"context"
	"encoding/xml"
	"flag"
	"image/color"
	"image/png"
	"io"
	"math/rand/v2"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/io/netread"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/analysis"
)

var minWidthStyle = regexp.MustCompile(`^min-width:[0-9]+(\.[0-9]+)?px$`)

var update = flag.Bool("update", false, "rewrite the golden files in testdata")

func readNet(t testing.TB, path string) *structural.Network {
	t.Helper()
	in, err := netread.ReadFile(path, netread.Options{})
	if err != nil {
		t.Fatal(err)
	}
	return in.Network
}

func lookup(t testing.TB, g *structural.Network, names ...string) []int32 {
	t.Helper()
	out := make([]int32, len(names))
	for i, n := range names {
		v, ok := g.Lookup(n)
		if !ok {
			t.Fatalf("no state %q", n)
		}
		out[i] = v
	}
	return out
}

// groupByPrefix groups states by the part of their name before the first
// dot, like a node table's group column.
func groupByPrefix(g *structural.Network) func(int32) string {
	return func(v int32) string {
		name := g.Name(v)
		if i := strings.IndexByte(name, '.'); i > 0 {
			return name[:i]
		}
		return ""
	}
}

// filterDesign is the invented water-treatment train with a failing design
// drawn on it: every feature the DOT writer has.
func filterDesign(t testing.TB) *Input {
	g := readNet(t, "testdata/filter.edges")
	ins, _ := structural.NewDesign(g, [][]int32{
		lookup(t, g, "intake.pump_speed"),
		lookup(t, g, "dose.coagulant_rate", "dose.chlorine_rate"),
	}, nil)
	outs, _ := structural.NewDesign(g, [][]int32{lookup(t, g, "clearwell.residual")}, nil)
	in := review(t, g, analysis.ReviewRequest{Inputs: &ins, Outputs: &outs, Complete: true}, &ins, &outs)
	in.Group = groupByPrefix(g)
	in.Title = "Kestrel Ridge filter train"
	in.Notes = []string{"design under review"}
	label := map[string]string{"dist.pump_speed": "P-301 speed", "filter.headloss": "filter ΔP"}
	in.Label = func(s int32) string { return label[g.Name(s)] }
	role := map[string]string{"intake.pump_speed": "critical", "filter.level": "intermittent", "floc.level": "redundant"}
	in.Role = func(s int32) string { return role[g.Name(s)] }
	return in
}

// review analyses g as render and report do and builds the picture.
func review(t testing.TB, g *structural.Network, req analysis.ReviewRequest, ins, outs *structural.Design) *Input {
	t.Helper()
	rv, err := analysis.Analyse(g, req)
	if err != nil {
		t.Fatal(err)
	}
	in, err := FromReview(rv, ins, outs)
	if err != nil {
		t.Fatal(err)
	}
	return in
}

func heatingDrivers(t testing.TB) *Input {
	g := readNet(t, "../../testdata/plant/heating.edges")
	in := review(t, g, analysis.ReviewRequest{}, nil, nil)
	in.Title = "heating.edges"
	return in
}

func dotText(t testing.TB, in *Input, opt Options, layout string) []byte {
	t.Helper()
	v, err := Select(in, opt)
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := DOT(&b, in, v, layout); err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

// TestDOTGolden compares the DOT text with the files in testdata (rewrite
// them with go test -run TestDOTGolden -update after a deliberate change).
func TestDOTGolden(t *testing.T) {
	tests := []struct {
		name string
		in   func(testing.TB) *Input
		opt  Options
	}{
		{"filter_design", filterDesign, Options{}},
		{"filter_condensation", filterDesign, Options{View: Components, MaxNodes: 4}},
		{"filter_around", filterDesign, Options{View: Around, Hops: 1}},
		{"heating_drivers", heatingDrivers, Options{}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			in := tc.in(t)
			opt := tc.opt
			if opt.View == Around {
				opt.Centres = lookup(t, in.Net, "filter.level")
			}
			got := dotText(t, in, opt, AutoLayout)
			// The same input gives the same text, whatever the map order.
			for i := 0; i < 5; i++ {
				if again := dotText(t, tc.in(t), opt, AutoLayout); !bytes.Equal(again, got) {
					t.Fatalf("DOT text differs between runs")
				}
			}
			path := filepath.Join("testdata", tc.name+".dot")
			if *update {
				if err := os.WriteFile(path, got, 0o644); err != nil {
					t.Fatal(err)
				}
			}
			want, err := os.ReadFile(path)
			if err != nil {
				t.Fatalf("%v (run with -update to create it)", err)
			}
			if !bytes.Equal(got, want) {
				t.Errorf("DOT text differs from %s (run with -update after a deliberate change):\n%s", path, firstDiff(got, want))
			}
		})
	}
}

func firstDiff(got, want []byte) string {
	g := strings.Split(string(got), "\n")
	w := strings.Split(string(want), "\n")
	for i := 0; i < len(g) || i < len(w); i++ {
		var a, b string
		if i < len(g) {
			a = g[i]
		}
		if i < len(w) {
			b = w[i]
		}
		if a != b {
			return "line " + itoa(i+1) + ":\n got:  " + a + "\n want: " + b
		}
	}
	return ""
}

func itoa(i int) string { return num(i) }

// svgScan parses an SVG document with encoding/xml and collects its text
// elements, tooltips and anything that could run or load.
type svgScan struct {
	texts    map[string]bool
	tooltips []string
	bad      []string
}

func scanSVG(t *testing.T, svg []byte) *svgScan {
	t.Helper()
	s := &svgScan{texts: map[string]bool{}}
	dec := xml.NewDecoder(bytes.NewReader(svg))
	dec.Strict = true
	var inText bool
	var text strings.Builder
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("SVG is not well-formed XML: %v", err)
		}
		switch e := tok.(type) {
		case xml.StartElement:
			switch strings.ToLower(e.Name.Local) {
			case "script", "foreignobject", "iframe", "image", "use", "animate", "set", "handler", "style":
				s.bad = append(s.bad, "element "+e.Name.Local)
			}
			for _, a := range e.Attr {
				name := strings.ToLower(a.Name.Local)
				// The one style allowed: the root's min-width, which keeps
				// text readable (see MinWidth).
				if name == "style" && minWidthStyle.MatchString(a.Value) {
					continue
				}
				if strings.HasPrefix(name, "on") || name == "href" || name == "src" || name == "style" {
					s.bad = append(s.bad, "attribute "+a.Name.Local+"="+a.Value)
				}
				if name == "title" && a.Name.Space != "" {
					s.tooltips = append(s.tooltips, a.Value)
				}
			}
			if e.Name.Local == "text" {
				inText = true
				text.Reset()
			}
		case xml.EndElement:
			if e.Name.Local == "text" {
				inText = false
				s.texts[text.String()] = true
			}
		case xml.CharData:
			if inText {
				text.Write(e)
			}
		case xml.ProcInst:
			if e.Target != "xml" {
				s.bad = append(s.bad, "processing instruction "+e.Target)
			}
		case xml.Directive:
			s.bad = append(s.bad, "directive "+string(e))
		}
	}
	return s
}

func layoutSVG(t *testing.T, in *Input, opt Options, layout string) []byte {
	t.Helper()
	var b bytes.Buffer
	if _, err := Draw(context.Background(), in, opt, layout, FormatSVG, &b); err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

// TestSVGShowsEveryName draws the demo plant and checks that the SVG is
// well-formed XML holding every state's name and every signal.
func TestSVGShowsEveryName(t *testing.T) {
	in := heatingDrivers(t)
	s := scanSVG(t, layoutSVG(t, in, Options{}, AutoLayout))
	if len(s.bad) > 0 {
		t.Errorf("active content in the SVG: %v", s.bad)
	}
	for v := 0; v < in.Net.N(); v++ {
		if name := Shown(in.Net.Name(int32(v))); !s.texts[name] {
			t.Errorf("state %q not shown", name)
		}
	}
	for i := 0; i < in.In.Design.Len(); i++ {
		if u := "u" + itoa(i+1); !s.texts[u] {
			t.Errorf("signal %s not shown", u)
		}
	}
	if !s.texts["heating.edges"] {
		t.Errorf("title not shown")
	}
}

// hostileNames are state names meant to break out of DOT, SVG or HTML.
var hostileNames = []string{
	`<script>alert(1)</script>`,
	`"><svg onload=alert(1)>`,
	`' onmouseover='alert(2)`,
	`&lt;b&gt;bold&lt;/b&gt; &amp; &#60;`,
	`back\slash\`,
	`\N \G \E \T \H \L \n \l`,
	`]]><!-- comment --><![CDATA[x]]>`,
	`javascript:alert(3)`,
	`url(http://example.invalid/x.png)`,
	"tab\there bell\x07 del\x7f",
	"bad utf-8 \xff\xfe end",
	`名前 ünï ☃ 𝔘`,
	`} digraph x { a -> b`,
	`a very long name that goes on and on well past the label limit of the picture`,
}

func hostileInput(t testing.TB) *Input {
	b := structural.NewBuilder()
	ids := make([]int32, len(hostileNames))
	for i, n := range hostileNames {
		id, err := b.Intern([]byte(n))
		if err != nil {
			t.Fatal(err)
		}
		ids[i] = id
	}
	for i := 0; i+1 < len(ids); i++ {
		b.AddEdge(ids[i], ids[i+1])
		if i%3 == 0 {
			b.AddEdge(ids[i+1], ids[i])
		}
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	in := review(t, g, analysis.ReviewRequest{}, nil, nil)
	in.Title, in.Notes = `<script>alert("title")</script> \G`, []string{`<img src=x onerror=alert(4)>`}
	in.Group = func(v int32) string {
		if v%2 == 0 {
			return `<b>"group"</b> \G`
		}
		return ""
	}
	return in
}

// TestHostileNamesSVG draws a network of hostile names: the SVG must stay
// well-formed, hold no active content, and show every name as text.
func TestHostileNamesSVG(t *testing.T) {
	for _, layout := range []string{"dot", "sfdp"} {
		in := hostileInput(t)
		svg := layoutSVG(t, in, Options{}, layout)
		s := scanSVG(t, svg)
		if len(s.bad) > 0 {
			t.Errorf("%s: active content in the SVG: %v", layout, s.bad)
		}
		for _, n := range hostileNames {
			if !s.texts[Shown(n)] {
				t.Errorf("%s: name %q not shown verbatim (want text %q)", layout, n, Shown(n))
			}
		}
		want := []string{`<script>alert("title")</script> \G`, `<img src=x onerror=alert(4)>`}
		if layout == "dot" {
			want = append(want, `<b>"group"</b> \G`) // a cluster's label; sfdp draws no clusters
		}
		for _, w := range want {
			if !s.texts[w] {
				t.Errorf("%s: text %q not shown verbatim", layout, w)
			}
		}
		// Tooltips carry the whole name, escaped as the text reports
		// write it.
		tips := strings.Join(s.tooltips, "\n")
		for _, n := range hostileNames {
			if !strings.Contains(tips, clean(name(n), maxTooltipRunes)) {
				t.Errorf("%s: tooltip for %q missing", layout, n)
			}
		}
		if bytes.Contains(svg, []byte("<script")) || bytes.Contains(svg, []byte("<img")) {
			t.Errorf("%s: raw markup leaked into the SVG", layout)
		}
	}
}

// TestPNG draws the demo plant as PNG and looks for the palette: the
// input signals' orange fill and the stems' blue.
func TestPNG(t *testing.T) {
	in := heatingDrivers(t)
	var b bytes.Buffer
	if _, err := Draw(context.Background(), in, Options{}, AutoLayout, FormatPNG, &b); err != nil {
		t.Fatal(err)
	}
	img, err := png.Decode(&b)
	if err != nil {
		t.Fatal(err)
	}
	r := img.Bounds()
	if r.Dx() < 1000 || r.Dy() < 400 {
		t.Errorf("PNG is %dx%d, want at least 1000x400 for 46 states", r.Dx(), r.Dy())
	}
	count := func(want color.NRGBA) int {
		n := 0
		for y := r.Min.Y; y < r.Max.Y; y += 2 {
			for x := r.Min.X; x < r.Max.X; x += 2 {
				c := color.NRGBAModel.Convert(img.At(x, y)).(color.NRGBA)
				if c == want {
					n++
				}
			}
		}
		return n
	}
	for _, c := range []struct {
		name string
		col  color.NRGBA
	}{{"orange (inputs)", color.NRGBA{0xE6, 0x9F, 0x00, 0xFF}}, {"blue (stems)", color.NRGBA{0x00, 0x72, 0xB2, 0xFF}}, {"sky (driven)", color.NRGBA{0x56, 0xB4, 0xE9, 0xFF}}} {
		if n := count(c.col); n < 200 {
			t.Errorf("%s: %d pixels, want at least 200", c.name, n)
		}
	}
}

// TestSelectViews checks the views against independent computations on
// random networks.
func TestSelectViews(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 11))
	for trial := 0; trial < 30; trial++ {
		n := 20 + rng.IntN(40)
		g := randomNet(t, rng, n, 1+rng.Float64()*2)
		in := review(t, g, analysis.ReviewRequest{}, nil, nil)

		// Around: exactly the states within h undirected links of c
		// (Floyd–Warshall as the reference), nearest first under a cap.
		dist := undirectedDistances(g)
		c := int32(rng.IntN(n))
		h := 1 + rng.IntN(3)
		v, err := Select(in, Options{View: Around, Centres: []int32{c}, Hops: h, MaxNodes: n})
		if err != nil {
			t.Fatal(err)
		}
		want := 0
		for u := 0; u < n; u++ {
			if dist[c][u] <= h {
				want++
			}
		}
		if len(v.States) != want {
			t.Errorf("trial %d: around %d hops %d: %d states, want %d", trial, c, h, len(v.States), want)
		}
		for _, s := range v.States {
			if dist[c][s] > h {
				t.Errorf("trial %d: state %d at distance %d drawn within %d hops", trial, s, dist[c][s], h)
			}
		}
		capN := 1 + want/2
		v, _ = Select(in, Options{View: Around, Centres: []int32{c}, Hops: h, MaxNodes: capN})
		if len(v.States) != capN {
			t.Errorf("trial %d: capped around view has %d states, want %d", trial, len(v.States), capN)
		}
		far := 0
		for _, s := range v.States {
			if dist[c][s] > far {
				far = dist[c][s]
			}
		}
		shown := map[int32]bool{}
		for _, s := range v.States {
			shown[s] = true
		}
		for u := 0; u < n; u++ {
			if !shown[int32(u)] && dist[c][u] < far {
				t.Errorf("trial %d: state %d at distance %d left out while one at %d is drawn", trial, u, dist[c][u], far)
			}
		}

		// Edges of a view are exactly the edges among its states.
		v, _ = Select(in, Options{})
		if v.Kind != Whole || len(v.Edges) != g.Edges() {
			t.Errorf("trial %d: whole view kind %d with %d edges, want %d", trial, v.Kind, len(v.Edges), g.Edges())
		}

		// Stems and cycles against a walk along the matching.
		m := g.Matching()
		for _, e := range v.Edges {
			matched := m.RowMate[e.From] == e.To
			onCycle := false
			if matched {
				u := e.To
				for k := 0; k <= n && u >= 0; k++ {
					if u == e.From {
						onCycle = true
						break
					}
					u = m.RowMate[u]
				}
			}
			if e.Stem() != (matched && !onCycle) || e.Cycle() != onCycle {
				t.Errorf("trial %d: edge %d->%d: stem %v cycle %v, want stem %v cycle %v",
					trial, e.From, e.To, e.Stem(), e.Cycle(), matched && !onCycle, onCycle)
			}
		}

	}
}

func randomNet(t testing.TB, rng *rand.Rand, n int, k float64) *structural.Network {
	b := structural.NewIntBuilder(n, 1)
	m := int(k * float64(n))
	for i := 0; i < m; i++ {
		b.AddEdge(int32(rng.IntN(n)), int32(rng.IntN(n)))
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	return g
}

func undirectedDistances(g *structural.Network) [][]int {
	n := g.N()
	const inf = 1 << 30
	d := make([][]int, n)
	for i := range d {
		d[i] = make([]int, n)
		for j := range d[i] {
			d[i][j] = inf
		}
		d[i][i] = 0
	}
	for u := 0; u < n; u++ {
		for _, v := range g.Succ(int32(u)) {
			if int(v) != u {
				d[u][v], d[v][u] = 1, 1
			}
		}
	}
	for k := 0; k < n; k++ {
		for i := 0; i < n; i++ {
			for j := 0; j < n; j++ {
				if d[i][k]+d[k][j] < d[i][j] {
					d[i][j] = d[i][k] + d[k][j]
				}
			}
		}
	}
	return d
}

// TestPNGFromDamagedLayout feeds drawPNG the kind of JSON Graphviz 12.1's
// writer sometimes produces: a style string run on into raw memory, with
// control bytes. The picture must still be drawn.
func TestPNGFromDamagedLayout(t *testing.T) {
	layout := "{\"bb\": \"0,0,100,50\", \"pad\": \"0.1\", \"_subgraph_cnt\": 0, \"objects\": [],\n" +
		"\"edges\": [{\"_draw_\": [{\"op\": \"S\", \"style\": \"dashed(limit\x1a\n\\\"%s\\\",\x89PNG\"}," +
		"{\"op\": \"c\", \"grad\": \"none\", \"color\": \"#0072b2\"}, {\"op\": \"S\", \"style\": \"setlinewidth(3)garbage)\"}," +
		"{\"op\": \"b\", \"points\": [[0,0],[30,10],[60,40],[100,50]]}]}]}"
	var b bytes.Buffer
	if err := drawPNG([]byte(layout), &b); err != nil {
		t.Fatal(err)
	}
	img, err := png.Decode(&b)
	if err != nil {
		t.Fatal(err)
	}
	blue := 0
	r := img.Bounds()
	for y := r.Min.Y; y < r.Max.Y; y++ {
		for x := r.Min.X; x < r.Max.X; x++ {
			if c := color.NRGBAModel.Convert(img.At(x, y)).(color.NRGBA); c.B > 0x90 && c.R < 0x40 {
				blue++
			}
		}
	}
	if blue < 50 {
		t.Errorf("the edge was not drawn (%d blue pixels)", blue)
	}
}

// TestPNGForceDirected draws a deep random network (the sfdp layout) as
// PNG.
func TestPNGForceDirected(t *testing.T) {
	rng := rand.New(rand.NewPCG(4, 4))
	g := randomNet(t, rng, 60, 2.5)
	in := review(t, g, analysis.ReviewRequest{}, nil, nil)
	v, err := Select(in, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if l, _ := ChooseLayout(AutoLayout, v); l != "sfdp" {
		t.Fatalf("layout %s, want sfdp for a deep random network", l)
	}
	var b bytes.Buffer
	if err := DrawView(context.Background(), in, v, AutoLayout, FormatPNG, &b); err != nil {
		t.Fatal(err)
	}
	if _, err := png.Decode(&b); err != nil {
		t.Fatal(err)
	}
}
