package render

import (
	"bytes"
	"context"
	"encoding/xml"
	"errors"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/analysis"
	"github.com/netsteer/netsteer/structural/gen"
)

// svgFacts reads what a reader's browser does with an SVG: its viewBox
// width, the width and height attributes of the root, its min-width, and
// the smallest font size of any text.
type svgFacts struct {
	viewW, minWidth float64
	width, height   string
	smallest        float64
	texts           []string
}

func readSVG(t *testing.T, svg []byte) svgFacts {
	t.Helper()
	f := svgFacts{smallest: math.Inf(1)}
	dec := xml.NewDecoder(bytes.NewReader(svg))
	root := true
	inText := false
	size := []float64{textSize}
	for {
		tok, err := dec.Token()
		if err != nil {
			break
		}
		switch e := tok.(type) {
		case xml.StartElement:
			fs := size[len(size)-1]
			for _, a := range e.Attr {
				switch a.Name.Local {
				case "viewBox":
					if root {
						p := strings.Fields(a.Value)
						f.viewW, _ = strconv.ParseFloat(p[2], 64)
					}
				case "width":
					if root {
						f.width = a.Value
					}
				case "height":
					if root {
						f.height = a.Value
					}
				case "style":
					if v, ok := strings.CutPrefix(a.Value, "min-width:"); ok && root {
						f.minWidth, _ = strconv.ParseFloat(strings.TrimSuffix(v, "px"), 64)
					}
				case "font-size":
					fs, _ = strconv.ParseFloat(strings.TrimSuffix(a.Value, "px"), 64)
				}
			}
			size = append(size, fs)
			root = false
			inText = e.Name.Local == "text"
		case xml.EndElement:
			size = size[:len(size)-1]
			inText = false
		case xml.CharData:
			if inText && strings.TrimSpace(string(e)) != "" {
				f.smallest = math.Min(f.smallest, size[len(size)-1])
				f.texts = append(f.texts, string(e))
			}
		}
	}
	return f
}

func drawSVG(t *testing.T, in *Input, opt Options) (*View, []byte) {
	t.Helper()
	var b bytes.Buffer
	v, err := Draw(context.Background(), in, opt, AutoLayout, FormatSVG, &b)
	if err != nil {
		t.Fatalf("view %v: %v", opt.View, err)
	}
	return v, b.Bytes()
}

// TestViewsReadable draws every view of the demo plant and checks what
// issue 13 asks of a picture: it scales to its container (a viewBox, a
// width of 100 % and no fixed height), and on a 1,400-pixel-wide screen at
// 100 % its smallest text is at least 10 pixels, even in the review
// page's column of about 1,100 pixels (the picture scrolls rather than
// shrink past its min-width).
func TestViewsReadable(t *testing.T) {
	in := heatingDrivers(t)
	in.Group = groupByPrefix(in.Net)
	centre, _ := in.Net.Lookup("supply.header_temp")
	for _, k := range []Kind{Whole, Around, Components, Control, Groups, Degrees} {
		_, svg := drawSVG(t, in, Options{View: k, Centres: []int32{centre}})
		f := readSVG(t, svg)
		if f.viewW <= 0 || f.width != "100%" || f.height != "" {
			t.Errorf("%v: viewBox width %g, width %q, height %q: want a viewBox, width 100%% and no height", k, f.viewW, f.width, f.height)
		}
		shown := math.Max(1100, f.minWidth)
		if px := f.smallest * shown / f.viewW; px < 10 {
			t.Errorf("%v: smallest text %.1f units on %.0f shown as %.0f px: %.1f px", k, f.smallest, f.viewW, shown, px)
		}
		for _, s := range f.texts {
			switch strings.TrimSpace(s) {
			case "box", "ellipse", "octagon", "folder", "circle":
				t.Errorf("%v: the legend names a shape (%q) instead of drawing it", k, s)
			}
		}
	}
}

// TestColoursAsLegend checks that the heavy control colours mark control
// edges only: in the whole view, the edges drawn heavy blue are exactly
// the stems of the structure and heavy vermilion exactly its cycles; in the
// condensation, bundles of edges never take either colour.
func TestColoursAsLegend(t *testing.T) {
	in := filterDesign(t)
	for _, k := range []Kind{Whole, Components} {
		v, err := Select(in, Options{View: k})
		if err != nil {
			t.Fatal(err)
		}
		var b bytes.Buffer
		if err := DOT(&b, in, v, AutoLayout); err != nil {
			t.Fatal(err)
		}
		blue, red := 0, 0
		for _, l := range strings.Split(b.String(), "\n") {
			if !strings.Contains(l, "->") {
				continue
			}
			if strings.Contains(l, colBlue) {
				blue++
			}
			if strings.Contains(l, colVermilion) {
				red++
			}
		}
		stems, cycles := 0, 0
		for _, e := range v.Edges {
			if e.Stem() {
				stems++
			}
			if e.Cycle() {
				cycles++
			}
		}
		if blue != stems || red != cycles {
			t.Errorf("%v: %d blue and %d vermilion edges, want %d stems and %d cycle edges", k, blue, red, stems, cycles)
		}
		if k == Components && blue+red != 0 {
			t.Errorf("condensation bundles drawn in control colours")
		}
	}
}

// TestTinyLimits: a condensation of at most 1 or 2 nodes must not fail
// (issue 11: it panicked), and still accounts for every state.
func TestTinyLimits(t *testing.T) {
	in := filterDesign(t)
	for _, max := range []int{1, 2, 3} {
		v, err := Select(in, Options{View: Components, MaxNodes: max})
		if err != nil {
			t.Fatal(err)
		}
		states := 0
		for _, c := range v.Comps {
			states += c.States
		}
		if states != in.Net.N() || len(v.Comps) > max+3 {
			t.Errorf("limit %d: %d nodes hold %d states, want at most %d nodes holding %d", max, len(v.Comps), states, max+3, in.Net.N())
		}
		var b bytes.Buffer
		if err := DOT(&b, in, v, AutoLayout); err != nil {
			t.Fatal(err)
		}
	}
}

// TestBudgetRefusedUpFront: a whole view past the limit, or one whose
// layout is estimated past the budget, is refused at once with the
// estimate, before any layout starts.
func TestBudgetRefusedUpFront(t *testing.T) {
	g, err := gen.Params{Model: "er", Nodes: 2000, MeanDegree: 6}.Network(gen.NewRand(1))
	if err != nil {
		t.Fatal(err)
	}
	in := review(t, g, analysis.ReviewRequest{}, nil, nil)
	start := time.Now()
	_, err = Select(in, Options{View: Whole})
	var be *BudgetError
	if !errors.As(err, &be) || be.Limit != DefaultMaxNodes || be.Estimate < time.Minute {
		t.Fatalf("whole view of 2,000 states: %v", err)
	}
	_, err = Select(in, Options{View: Whole, MaxNodes: 5000})
	if !errors.As(err, &be) || be.Limit != 0 || be.Budget != DefaultBudget || !strings.Contains(err.Error(), "to lay out") {
		t.Fatalf("whole view past the budget: %v", err)
	}
	if d := time.Since(start); d > 2*time.Second {
		t.Errorf("refusing took %v", d)
	}
	// The views that draw the answer take it at once.
	for _, k := range []Kind{Control, Degrees} {
		if _, err := Select(in, Options{View: k}); err != nil {
			t.Errorf("%v: %v", k, err)
		}
	}
	if v, err := Select(in, Options{}); err != nil || v.Kind != Control || !strings.Contains(v.Desc, "chosen for 2,000 states") {
		t.Errorf("auto view of 2,000 states: %v %v", v, err)
	}
}

// TestNewDevicesAndCosts: placed actuators with costs and one in place;
// the new ones are drawn hollow and dashed with their cost, the one in
// place filled, in the control view and in the Graphviz view alike.
func TestNewDevicesAndCosts(t *testing.T) {
	g := readNet(t, "testdata/filter.edges")
	n := g.N()
	dev := structural.Devices{Cost: make([]structural.Cost, n), Existing: make([]bool, n)}
	for v := range dev.Cost {
		dev.Cost[v] = 2500
	}
	src := lookup(t, g, "intake.pump_speed")[0]
	dev.Existing[src] = true
	in := review(t, g, analysis.ReviewRequest{PlaceActuators: true, Actuators: dev}, nil, nil)
	_, svg := drawSVG(t, in, Options{View: Control})
	if !bytes.Contains(svg, []byte(">2.5</text>")) || !bytes.Contains(svg, []byte(`stroke-dasharray`)) {
		t.Errorf("control view: no cost or no dashed new device")
	}
	v, _ := Select(in, Options{View: Whole})
	var b bytes.Buffer
	if err := DOT(&b, in, v, AutoLayout); err != nil {
		t.Fatal(err)
	}
	dot := b.String()
	newN, oldN := strings.Count(dot, `style="dashed,filled"`), 0
	for _, l := range strings.Split(dot, "\n") {
		if strings.HasPrefix(strings.TrimSpace(l), "u") && strings.Contains(l, `style="filled"`) {
			oldN++
		}
	}
	added := in.In.Design.Len() - 1
	if newN != added || oldN != 1 || !strings.Contains(dot, `\n2.5"`) {
		t.Errorf("%d new and %d existing actuators drawn, want %d and 1, with costs", newN, oldN, added)
	}
}

// TestControlShortensLongStems: the stem of a 10^5-state chain is drawn
// as its first states, a box counting the others, and its last state.
func TestControlShortensLongStems(t *testing.T) {
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
	v, svg := drawSVG(t, in, Options{})
	if v.Kind != Control {
		t.Fatalf("auto view of a %d-chain is %v", n, v.Kind)
	}
	f := readSVG(t, svg)
	states, more := 0, ""
	for _, s := range f.texts {
		if strings.HasPrefix(s, "… ") {
			more = s
		}
		if _, err := strconv.Atoi(s); err == nil {
			states++
		}
	}
	if want := "… " + num(n-states) + " more …"; more != want {
		t.Errorf("shortened stem reads %q, want %q (%d states drawn)", more, want, states)
	}
}

// BenchmarkViews draws each view of scale-free networks (static model,
// gamma 2.8 both ways, mean degree 4) of 10^4 and 10^6 states, from the
// analysis to the SVG: the budgets of issue 13 are 10 s and 60 s.
func BenchmarkViews(b *testing.B) {
	for _, n := range []int{10_000, 1_000_000} {
		g, err := gen.Params{Model: "scale-free", Nodes: n, MeanDegree: 4, GammaOut: 2.8, GammaIn: 2.8}.Network(gen.NewRand(1))
		if err != nil {
			b.Fatal(err)
		}
		group := func(v int32) string { return "area " + strconv.Itoa(int(v%40)) }
		for _, k := range []Kind{Auto, Control, Groups, Degrees, Components} {
			b.Run(k.String()+"/"+strconv.Itoa(n), func(b *testing.B) {
				for i := 0; i < b.N; i++ {
					rv, err := analysis.Analyse(g, analysis.ReviewRequest{})
					if err != nil {
						b.Fatal(err)
					}
					in, err := FromReview(rv, nil, nil)
					if err != nil {
						b.Fatal(err)
					}
					in.Group = group
					var out bytes.Buffer
					if _, err := Draw(context.Background(), in, Options{View: k}, AutoLayout, FormatSVG, &out); err != nil {
						b.Fatal(err)
					}
					b.ReportMetric(float64(out.Len()), "svg_bytes")
				}
			})
		}
	}
}

func TestDuration(t *testing.T) {
	for d, want := range map[time.Duration]string{
		300 * time.Millisecond: "under a second", 12 * time.Second: "12 s", 10 * time.Minute: "10 min",
		5 * time.Hour: "5 h", 3 * 24 * time.Hour: "3 days", 1e7 * time.Second: "over 100 days",
	} {
		if got := Duration(d); got != want {
			t.Errorf("Duration(%v) = %q, want %q", d, got, want)
		}
	}
}

// TestProgress: a layout that takes a while reports its progress about
// once a second (a stand-in layout program that sleeps, then answers).
func TestProgress(t *testing.T) {
	if testing.Short() {
		t.Skip("waits two seconds")
	}
	dir := t.TempDir()
	prog := dir + "/slow-layout"
	script := "#!/bin/sh\ncat >/dev/null\nsleep 2.2\nprintf 'netsteer-layout protocol 1\\n<svg xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 0 10 10\"></svg>\\n'\n"
	if err := os.WriteFile(prog, []byte(script), 0o755); err != nil {
		t.Fatal(err)
	}
	t.Setenv(LayoutEnv, prog)
	in := heatingDrivers(t)
	calls := 0
	ctx := WithProgress(context.Background(), func(elapsed, est time.Duration) {
		calls++
		if elapsed <= 0 || est <= 0 {
			t.Errorf("progress %v of %v", elapsed, est)
		}
	})
	var b bytes.Buffer
	if _, err := Draw(ctx, in, Options{View: Whole}, AutoLayout, FormatSVG, &b); err != nil {
		t.Fatal(err)
	}
	if calls < 1 {
		t.Errorf("no progress reported during a 2-second layout")
	}
}
