package render

import (
	"bytes"
	"context"
	"html"
	"image/color"
	"image/png"
	"regexp"
	"sort"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/structural"
)

// greenhouseDesign is an invented greenhouse: a boiler loop heats the
// house air, a vent motor moves two flaps (a dilation: two states, one
// in-neighbour), and a rain gauge with its heater is reached by no input.
// One sensor watches the air, which leaves the dew alarm unobserved. Its
// legend has a dashed swatch (unreached) and a dotted one (unobserved).
// Backslashes in a group name, a label and a note test their escaping.
func greenhouseDesign(t testing.TB) *Input {
	t.Helper()
	b := structural.NewBuilder()
	id := func(name string) int32 {
		v, err := b.Intern([]byte(name))
		if err != nil {
			t.Fatal(err)
		}
		return v
	}
	for _, e := range [][2]string{
		{"boiler.burner", "boiler.water_temp"},
		{"boiler.water_temp", "house.air_temp"},
		{"house.air_temp", "house.humidity"},
		{"house.humidity", "house.air_temp"},
		{"vent.motor", "vent.left_flap"},
		{"vent.motor", "vent.right_flap"},
		{"vent.left_flap", "house.air_temp"},
		{"vent.right_flap", "house.humidity"},
		{"rain.heater", "rain.gauge"},
		{"rain.gauge", "vent.motor"},
		{"house.humidity", "house.dew_alarm"},
	} {
		b.AddEdge(id(e[0]), id(e[1]))
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	inputs := [][]int32{lookup(t, g, "boiler.burner"), lookup(t, g, "vent.motor")}
	outputs := [][]int32{lookup(t, g, "house.air_temp")}
	v := structural.Check(g, inputs)
	o := structural.CheckObservability(g, outputs)
	if len(v.Unreached) == 0 || v.Dilation == nil || len(o.Unobserved) == 0 {
		t.Fatalf("the greenhouse design should leave states unreached (%d), a dilation (%v) and states unobserved (%d)",
			len(v.Unreached), v.Dilation != nil, len(o.Unobserved))
	}
	return &Input{
		Net: g, Inputs: inputs, InputKind: "actuator", Outputs: outputs,
		Matching:  DesignMatching(g, inputs),
		Unreached: v.Unreached, Dilation: v.Dilation.States, Unobserved: o.Unobserved,
		Group: func(v int32) string {
			if gr := groupByPrefix(g)(v); gr != "rain" {
				return gr
			}
			return `rain\gauge`
		},
		Label: func(v int32) string {
			if g.Name(v) == "house.dew_alarm" {
				return `dew alarm C:\\ok\`
			}
			return ""
		},
		Title: `greenhouse.edges`,
		Notes: []string{`design under review \N`},
	}
}

// pngDrawn is what the PNG drawer carried out: the texts set (with their
// pixel anchors) and the strokes dashed by a colour mark.
type pngDrawn struct {
	texts        []string
	outside      []string // texts anchored outside the picture
	dashMarked   int
	dottedMarked int
	w, h         int
}

// drawTraced draws in's default view as PNG through the layout program,
// recording what drawPNG does.
func drawTraced(t *testing.T, in *Input, opt Options, layout string) (*pngDrawn, []byte) {
	t.Helper()
	d := &pngDrawn{}
	pngTrace = func(op *xdotOp, c *canvas) {
		d.w, d.h = c.dc.Width(), c.dc.Height()
		switch op.Op {
		case "T":
			d.texts = append(d.texts, op.Text)
			if x, y := c.x(op.Pt[0]), c.y(op.Pt[1]); x < 0 || y < 0 || x > float64(d.w) || y > float64(d.h) {
				d.outside = append(d.outside, op.Text)
			}
		case "p", "P", "e", "E", "L", "b", "B":
			switch {
			case c.penDash == nil:
			case sameDash(c.penDash, dashPattern):
				d.dashMarked++
			case sameDash(c.penDash, dotPattern):
				d.dottedMarked++
			}
		}
	}
	defer func() { pngTrace = nil }()
	var b bytes.Buffer
	if _, err := Draw(context.Background(), in, opt, layout, FormatPNG, &b); err != nil {
		t.Fatal(err)
	}
	if _, err := png.Decode(bytes.NewReader(b.Bytes())); err != nil {
		t.Fatal(err)
	}
	return d, b.Bytes()
}

func sameDash(a, b []float64) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}

var htmlTextRun = regexp.MustCompile(`>([^<>]+)<`)

// labelTexts returns the texts of the graph's HTML-like label (title lines
// and legend) in the DOT text, as Graphviz shows them, and the label's
// statement.
func labelTexts(t *testing.T, dot []byte) ([]string, string) {
	t.Helper()
	var label string
	for _, l := range strings.Split(string(dot), "\n") {
		if strings.HasPrefix(l, "  label=<") {
			label = l
		}
	}
	if label == "" {
		t.Fatal("no graph label in the DOT text")
	}
	var out []string
	for _, m := range htmlTextRun.FindAllStringSubmatch(label, -1) {
		// Graphviz halves backslashes in HTML-like labels too (see
		// htmlText), then decodes the entities.
		if s := strings.TrimSpace(html.UnescapeString(strings.ReplaceAll(m[1], `\\`, `\`))); s != "" {
			out = append(out, s)
		}
	}
	return out, label
}

// TestPNGLegendComplete draws designs whose legends hold a dashed and a
// dotted swatch, which Graphviz 12.1's JSON output used to cut short (see
// pngDOT), and checks that the PNG drawer sets every text of the title and
// legend found in the DOT text, and every text of the SVG that Graphviz
// draws from the same DOT (node labels, group names, signals), and no
// other.
func TestPNGLegendComplete(t *testing.T) {
	tests := []struct {
		name   string
		in     func(testing.TB) *Input
		opt    Options
		layout string
		// legend entries the view must hold (a check on the test's premise)
		want []string
	}{
		{"greenhouse", greenhouseDesign, Options{}, AutoLayout, []string{
			"unreached: no input reaches it", "unobserved: no sensor sees it",
			"dilation set: too few in-neighbours", "group (node table)"}},
		{"filter", filterDesign, Options{}, AutoLayout, nil},
		{"filter_condensation", filterDesign, Options{MaxNodes: 4}, AutoLayout, []string{"holds unreached states", "source component: no edge enters it"}},
		// Backslashes and markup in names, title and group frames.
		{"hostile", hostileInput, Options{}, "dot", []string{`<script>alert("title")</script> \G`}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			in := tc.in(t)
			legend, label := labelTexts(t, dotText(t, in, tc.opt, tc.layout))
			for _, w := range tc.want {
				if !contains(legend, w) {
					t.Fatalf("legend %q lacks %q", legend, w)
				}
			}
			drawn, _ := drawTraced(t, in, tc.opt, tc.layout)
			count := map[string]int{}
			for _, s := range drawn.texts {
				count[s]++
			}
			for _, s := range legend {
				if count[s] == 0 {
					t.Errorf("title/legend text %q not drawn in the PNG", s)
				}
			}
			if len(drawn.outside) > 0 {
				t.Errorf("texts anchored outside the %dx%d picture: %q", drawn.w, drawn.h, drawn.outside)
			}
			// Every dashed or dotted swatch of the legend is drawn so,
			// from its colour mark.
			if want := strings.Count(label, ` style="dashed"`); drawn.dashMarked != want {
				t.Errorf("%d dashed swatches drawn from a colour mark, want %d", drawn.dashMarked, want)
			}
			if want := strings.Count(label, ` style="dotted"`); drawn.dottedMarked != want {
				t.Errorf("%d dotted swatches drawn from a colour mark, want %d", drawn.dottedMarked, want)
			}

			// The SVG of the same DOT: the same texts, as many times.
			svgCount := svgTexts(t, layoutSVG(t, in, tc.opt, tc.layout))
			var missing, extra []string
			for s, n := range svgCount {
				if count[s] < n {
					missing = append(missing, s)
				}
			}
			for s, n := range count {
				if svgCount[s] < n {
					extra = append(extra, s)
				}
			}
			sort.Strings(missing)
			sort.Strings(extra)
			if len(missing) > 0 {
				t.Errorf("texts of the SVG not drawn in the PNG: %q", missing)
			}
			if len(extra) > 0 {
				t.Errorf("texts drawn in the PNG but not in the SVG: %q", extra)
			}
			if len(drawn.texts) < in.Net.N() {
				t.Errorf("%d texts drawn, fewer than the %d states", len(drawn.texts), in.Net.N())
			}
		})
	}
}

// svgTexts counts the <text> elements of an SVG by content.
func svgTexts(t *testing.T, svg []byte) map[string]int {
	t.Helper()
	s := scanSVG(t, svg)
	if len(s.texts) == 0 {
		t.Fatal("no text in the SVG")
	}
	// scanSVG keeps a set; count occurrences with a second pass.
	out := map[string]int{}
	for _, m := range svgTextRun.FindAllSubmatch(svg, -1) {
		out[html.UnescapeString(string(m[1]))]++
	}
	for k := range s.texts {
		if out[k] == 0 {
			t.Fatalf("SVG text %q missed by the count", k)
		}
	}
	return out
}

var svgTextRun = regexp.MustCompile(`<text\b[^>]*>([^<]*)</text>`)

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}

// TestPNGDOT checks the rewriting of cell border styles for the PNG
// layout, and that nothing else changes.
func TestPNGDOT(t *testing.T) {
	tests := []struct{ in, want string }{
		{`label=<<table><tr><td width="22" bgcolor="#F0E442" color="#333333" border="1" style="dashed"></td></tr></table>>;`,
			`label=<<table><tr><td width="22" bgcolor="#F0E442" color="#333333fe" border="1"></td></tr></table>>;`},
		{`label=<<td color="#D9D9D9" style="dotted">x</td>>`, `label=<<td color="#D9D9D9fd">x</td>>`},
		{`label=<<TD STYLE="rounded, dashed" COLOR="#123456">x</TD>>`, `label=<<TD STYLE="rounded" COLOR="#123456fe">x</TD>>`},
		{`label=<<table style="dashed" border="1"><tr><td>x</td></tr></table>>`,
			`label=<<table border="1" color="#000000fe"><tr><td>x</td></tr></table>>`},
		// A named colour cannot carry the mark: left as it is.
		{`label=<<td color="red" style="dashed">x</td>>`, `label=<<td color="red" style="dashed">x</td>>`},
		{`label=<<td style="rounded">x</td>>`, `label=<<td style="rounded">x</td>>`},
		// Quoted strings are names, not markup.
		{`s1 [label="<td color=\"#333333\" style=\"dashed\">"];`, `s1 [label="<td color=\"#333333\" style=\"dashed\">"];`},
		{`s1 [label="a<b \" <td style=\"dashed\">"]; label=<<td color="#000000" style="dashed"></td>>`,
			`s1 [label="a<b \" <td style=\"dashed\">"]; label=<<td color="#000000fe"></td>>`},
		// Escaped backslashes become the mark, other escapes stay.
		{`s1 [label="back\\slash\\\\ \"q\" \n \\N", tooltip="\\\\G"];`,
			`s1 [label="back` + backslashMark + `slash` + backslashMark + backslashMark + ` \"q\" \n ` + backslashMark + `N", tooltip="` + backslashMark + backslashMark + `G"];`},
		{`label=<<b>&lt;x&gt; \\G</b>>; a -> b;`, `label=<<b>&lt;x&gt; ` + backslashMark + `G</b>>; a -> b;`},
		// Edge and node styles are not table styles.
		{`s1 -> s2 [style=dashed]; s3 [style="filled,dashed"];`, `s1 -> s2 [style=dashed]; s3 [style="filled,dashed"];`},
	}
	for _, tc := range tests {
		if got := string(pngDOT([]byte(tc.in))); got != tc.want {
			t.Errorf("pngDOT(%s)\n got %s\nwant %s", tc.in, got, tc.want)
		}
	}

	// A network of hostile names: besides the backslashes, only the
	// legend's line changes.
	dot := dotText(t, hostileInput(t), Options{}, AutoLayout)
	if !bytes.Contains(dot, []byte(`\\`)) {
		t.Fatal("the hostile names have no backslash")
	}
	fixed := bytes.ReplaceAll(pngDOT(dot), []byte(backslashMark), []byte(`\\`))
	a, b := strings.Split(string(dot), "\n"), strings.Split(string(fixed), "\n")
	if len(a) != len(b) {
		t.Fatalf("pngDOT changed the number of lines: %d, want %d", len(b), len(a))
	}
	for i := range a {
		if a[i] != b[i] && !strings.HasPrefix(a[i], "  label=<") {
			t.Errorf("line %d changed:\n got %s\nwant %s", i+1, b[i], a[i])
		}
	}
}

// TestPenColor: the marks come back as opaque colours and dash patterns.
func TestPenColor(t *testing.T) {
	tests := []struct {
		in   string
		col  color.Color
		dash []float64
	}{
		{"#333333fe", color.NRGBA{0x33, 0x33, 0x33, 0xff}, dashPattern},
		{"#d9d9d9fd", color.NRGBA{0xd9, 0xd9, 0xd9, 0xff}, dotPattern},
		{"#333333", color.NRGBA{0x33, 0x33, 0x33, 0xff}, nil},
		{"#fffffe00", color.NRGBA{0xff, 0xff, 0xfe, 0}, nil},
	}
	for _, tc := range tests {
		col, dash := penColor(tc.in)
		if col != tc.col || !sameDash(dash, tc.dash) {
			t.Errorf("penColor(%s) = %v, %v; want %v, %v", tc.in, col, dash, tc.col, tc.dash)
		}
	}
}
