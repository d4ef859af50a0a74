package render

import (
	"bufio"
	"bytes"
	"context"
	"encoding/xml"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
)

// Swatches of the legend: each draws, in a 26 x 16 box at (x, y), the mark
// the picture uses for one thing, so the legend shows shapes and colours
// rather than naming them.
type swatch func(s *scene, x, y float64)

func nodeSwatch(fill, stroke string, sw float64, dash string) swatch {
	return func(s *scene, x, y float64) {
		it := s.ellipse(x+1, y+2, 24, 12, fill, stroke, sw)
		it.dash = dash
	}
}

func doubleSwatch(stroke string) swatch {
	return func(s *scene, x, y float64) {
		s.ellipse(x, y+1, 26, 14, "#FFFFFF", stroke, 1.4)
		s.ellipse(x+3, y+3.5, 20, 9, "#FFFFFF", stroke, 1.4)
	}
}

func edgeSwatch(col string, sw float64, dash string) swatch {
	return func(s *scene, x, y float64) {
		it := s.line(col, sw, x, y+8, x+25, y+8)
		it.dash, it.arrow = dash, true
	}
}

func frameSwatch(stroke, dash string) swatch {
	return func(s *scene, x, y float64) {
		it := s.rect(x, y+1, 26, 14, "", stroke, 1.5)
		it.rx, it.dash = 4, dash
	}
}

func shapeSwatch(shape string) swatch {
	return func(s *scene, x, y float64) {
		switch shape {
		case "box":
			s.rect(x+2, y+2, 22, 12, "#FFFFFF", colInk, 1.2)
		case "octagon":
			cx, cy, r := x+13, y+8, 7.5
			var pts []float64
			for k := 0; k < 8; k++ {
				a := math.Pi/8 + float64(k)*math.Pi/4
				pts = append(pts, cx+r*1.45*math.Cos(a), cy+r*math.Sin(a))
			}
			s.poly("#FFFFFF", colInk, 1.2, pts...)
		default:
			s.ellipse(x+1, y+2, 24, 12, "#FFFFFF", colInk, 1.2)
		}
	}
}

// signalSwatch is an input (circle) or output (square) signal node, new
// devices hollow with a dashed outline.
func signalSwatch(output, isNew bool) swatch {
	return func(s *scene, x, y float64) {
		fill, stroke, dash := colOrange, colInk, ""
		if output {
			fill = colGreen
		}
		if isNew {
			stroke, dash = fill, "dash"
			fill = "#FFFFFF"
		}
		var it *item
		if output {
			it = s.rect(x+5, y, 16, 16, fill, stroke, 1.6)
		} else {
			it = s.ellipse(x+5, y, 16, 16, fill, stroke, 1.6)
		}
		it.dash = dash
	}
}

func componentSwatch(summary bool) swatch {
	return func(s *scene, x, y float64) {
		if summary {
			s.poly("#FFFFFF", colInk, 1.2, x, y+4, x+9, y+4, x+11, y+1, x+26, y+1, x+26, y+15, x, y+15)
			return
		}
		it := s.rect(x, y+1, 26, 14, "#FFFFFF", colInk, 1.2)
		it.rx = 4
	}
}

func textSwatch(t string) swatch {
	return func(s *scene, x, y float64) { s.text(x+13, y+12, t, smallSize, true, 'm', colMuted) }
}

type legendEntry struct {
	mark swatch
	text string
}

// legendEntries lists what a picture of in uses, per the features seen
// while drawing it.
func legendEntries(in *Input, has map[string]bool, condensed bool) []legendEntry {
	var es []legendEntry
	ik, ok := in.inputKind(), in.outputKind()
	add := func(key string, m swatch, text string) {
		if has[key] {
			es = append(es, legendEntry{m, text})
		}
	}
	add("input", signalSwatch(false, false), ik+" signal ("+in.inputPrefix()+"1, "+in.inputPrefix()+"2, …)")
	add("input-new", signalSwatch(false, true), "new "+ik+" (label: cost)")
	add("output", signalSwatch(true, false), ok+" signal ("+in.outputPrefix()+"1, …)")
	add("output-new", signalSwatch(true, true), "new "+ok+" (label: cost)")
	add("signal-edge", edgeSwatch(colOrange, 1.6, "dash"), "a signal acts on a state")
	add("sense-edge", edgeSwatch(colGreen, 1.6, "dot"), "a state is sensed")
	if condensed {
		box := func(fill, stroke string, sw float64, dash string) swatch {
			return func(s *scene, x, y float64) {
				it := s.rect(x, y+1, 26, 14, fill, stroke, sw)
				it.rx, it.dash = 4, dash
			}
		}
		add("driven", box(colSky, colInk, 1, ""), "holds driven states")
		add("sensed", doubleSwatch(colGreen), "holds sensed states")
		add("unreached", box(colYellow, colInk, 1, ""), "holds unreached states")
		add("unobserved", box(colGrey, colInk, 1, ""), "holds unobserved states")
	} else {
		add("driven", nodeSwatch(colSky, colInk, 1, ""), "state driven by "+article(ik))
		add("sensed", doubleSwatch(colGreen), "state sensed by "+article(ok))
		add("unreached", nodeSwatch(colYellow, colInk, 1.8, "dash"), "unreached: no input reaches it")
		add("unobserved", nodeSwatch(colGrey, colInk, 1.8, "dot"), "unobserved: no "+ok+" sees it")
	}
	add("other-states", func(s *scene, x, y float64) { s.rect(x, y+2, 26, 12, "#E4E4E4", "#9A9A9A", 1) }, "other states")
	add("all-states", func(s *scene, x, y float64) { s.rect(x, y+2, 26, 12, "#BDBDBD", "", 0) }, "all states")
	add("signal-states", func(s *scene, x, y float64) { s.rect(x, y+2, 26, 12, colOrange, colInk, 1) }, "states "+article(ik)+" acts on")
	add("stem-lengths", func(s *scene, x, y float64) { s.rect(x, y+2, 26, 12, colBlue, "", 0) }, "stems")
	add("dilation", nodeSwatch(colTint, colVermilion, 2.2, ""), "dilation set: too few in-neighbours")
	add("complete", nodeSwatch("#FFFFFF", colOrange, 2.2, "dash"), "takes a new device of the cheapest completion")
	add("stem", edgeSwatch(colBlue, 3, ""), "stem: control path from a signal")
	add("cycle", edgeSwatch(colVermilion, 3, ""), "cycle of the control structure")
	add("cycle-ring", func(s *scene, x, y float64) { s.ellipse(x+5, y+2, 16, 12, "", colVermilion, 2.4) }, "cycles hung here (count, states)")
	add("edge", edgeSwatch(colEdge, 1, ""), "other edge (u acts on v)")
	add("bundle", edgeSwatch(colEdge, 2.5, ""), "edges between components (width: count)")
	add("source", frameSwatch(colPurple, "dash"), "source component: no edge enters it")
	add("group", frameSwatch(colFrame, ""), "group of the node table")
	add("component", componentSwatch(false), "strongly connected component")
	add("summary", componentSwatch(true), "components summarised together")
	add("role-critical", shapeSwatch("box"), "critical: in every minimum driver set")
	add("role-intermittent", shapeSwatch("octagon"), "intermittent: in some")
	add("role-redundant", shapeSwatch("ellipse"), "redundant: in none")
	add("hidden", textSwatch("+k"), "links to states not drawn")
	return es
}

// drawLegend lays the entries out in rows across width w from (x, y) and
// returns the height used.
func drawLegend(s *scene, es []legendEntry, x, y, w float64) float64 {
	if len(es) == 0 {
		return 0
	}
	cx, cy := x, y
	const rowH = 22.0
	for _, e := range es {
		tw := textWidth(e.text, smallSize, false)
		ew := 26 + 6 + tw + 22
		if cx > x && cx+ew > x+w {
			cx, cy = x, cy+rowH
		}
		e.mark(s, cx, cy+1)
		s.text(cx+32, cy+13, e.text, smallSize, false, 's', colInk)
		cx += ew
	}
	return cy + rowH - y
}

// header draws the title lines across width w and returns their height.
func header(s *scene, in *Input, desc string, w float64) float64 {
	y := 8.0
	title := in.Title
	if title == "" {
		title = "network"
	}
	y += titleSize
	s.text(12, y, fit(name(title), titleSize, true, w-24), titleSize, true, 's', colInk)
	for _, l := range wrap(Summary(in), textSize, false, w-24) {
		y += textSize + 5
		s.text(12, y, l, textSize, false, 's', colInk)
	}
	for _, note := range in.Notes {
		for _, l := range wrap(note, textSize, false, w-24) {
			y += textSize + 5
			s.text(12, y, l, textSize, false, 's', colInk)
		}
	}
	for _, l := range wrap("view: "+desc, smallSize, false, w-24) {
		y += smallSize + 5
		s.text(12, y, l, smallSize, false, 's', colMuted)
	}
	return y + 10
}

// framed is a Graphviz layout with netsteer's header above it and legend
// below: the layout's own width and height in its units (points), where
// the header and legend go, and the scene holding them.
type framed struct {
	s          *scene
	gx, gy     float64 // where the layout's top-left corner goes
	gw, gh     float64
	scaleToFit float64
}

// frame builds the header and legend around a layout of gw x gh units.
// The layout is drawn at one unit per pixel; the frame is at least 760
// wide so the legend reads.
func frame(in *Input, desc string, has map[string]bool, condensed bool, gw, gh float64) *framed {
	w := math.Max(gw, 760)
	s := &scene{W: w}
	top := header(s, in, desc, w)
	es := legendEntries(in, has, condensed)
	lh := drawLegendAt(s, es, top+gh+8, w)
	s.H = top + gh + 8 + lh + 10
	return &framed{s: s, gx: (w - gw) / 2, gy: top, gw: gw, gh: gh}
}

func drawLegendAt(s *scene, es []legendEntry, y, w float64) float64 {
	if len(es) == 0 {
		return 0
	}
	s.line(colRule, 1, 12, y, w-12, y)
	return drawLegend(s, es, 12, y+8, w-24) + 8
}

// svgRoot reads the width and height (viewBox) of a Graphviz SVG and the
// bytes inside its root element.
func svgRoot(svg []byte) (w, h float64, inner []byte, err error) {
	dec := xml.NewDecoder(bytes.NewReader(svg))
	for {
		tok, terr := dec.RawToken()
		if terr != nil {
			return 0, 0, nil, errors.New("render: Graphviz wrote no SVG root")
		}
		e, ok := tok.(xml.StartElement)
		if !ok {
			continue
		}
		if e.Name.Local != "svg" {
			return 0, 0, nil, errors.New("render: Graphviz wrote no SVG root")
		}
		for _, a := range e.Attr {
			if a.Name.Local == "viewBox" {
				f := strings.Fields(a.Value)
				if len(f) == 4 {
					w, _ = strconv.ParseFloat(f[2], 64)
					h, _ = strconv.ParseFloat(f[3], 64)
				}
			}
		}
		break
	}
	start := int(dec.InputOffset())
	end := bytes.LastIndex(svg, []byte("</svg>"))
	if w <= 0 || h <= 0 || end < start {
		return 0, 0, nil, errors.New("render: Graphviz SVG has no size")
	}
	return w, h, svg[start:end], nil
}

// drawFramed lays out the DOT text and writes it in format f inside the
// frame: SVG by placing Graphviz's drawing in a group, PNG by painting
// the layout and the frame on one image.
func drawFramed(ctx context.Context, in *Input, v *View, dot []byte, layout string, has map[string]bool, f Format, w io.Writer) error {
	condensed := v.Kind == Components
	if f == FormatPNG {
		out, err := layoutRaw(ctx, pngDOT(dot), layout, "json")
		if err != nil {
			return err
		}
		c, err := drawLayout(out, pngTrace)
		if err != nil {
			return err
		}
		b := c.dc.Image().Bounds()
		gw, gh := float64(b.Dx())/c.s, float64(b.Dy())/c.s
		fr := frame(in, v.Desc, has, condensed, gw, gh)
		sc := c.s
		return fr.s.paint(sc, c.dc.Image(), fr.gx, fr.gy).EncodePNG(w)
	}
	out, err := layoutRaw(ctx, dot, layout, "svg")
	if err != nil {
		return err
	}
	gw, gh, inner, err := svgRoot(stripDoctype(out))
	if err != nil {
		return err
	}
	fr := frame(in, v.Desc, has, condensed, gw, gh)
	var buf bytes.Buffer
	fmt.Fprintf(&buf, `<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" viewBox="0 0 %s %s" width="100%%" style="min-width:%spx" font-family="%s" font-size="%s">`+"\n",
		ff(fr.s.W), ff(fr.s.H), ff(MinWidth(fr.s.W, math.Min(gvFontSize, smallSize))), fontStack, ff(textSize))
	fmt.Fprintf(&buf, `<rect x="0" y="0" width="%s" height="%s" fill="#FFFFFF"/>`+"\n", ff(fr.s.W), ff(fr.s.H))
	fmt.Fprintf(&buf, `<g transform="translate(%s %s)">`, ff(fr.gx), ff(fr.gy))
	buf.Write(inner)
	buf.WriteString("</g>\n")
	bw := bufio.NewWriter(&buf)
	fr.s.svgItems(bw)
	bw.Flush()
	buf.WriteString("</svg>\n")
	_, err = w.Write(buf.Bytes())
	return err
}

// MinWidth is the narrowest an SVG of width w (in its units) may be shown
// so that its smallest text, of size small units, stays at least 10
// pixels: the pictures set it as their CSS min-width and scroll rather
// than shrink past it.
func MinWidth(w, small float64) float64 { return math.Ceil(w * 10 / small) }
