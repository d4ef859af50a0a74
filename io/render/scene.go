package render

import (
	"bufio"
	"fmt"
	"image"
	"io"
	"math"
	"strconv"
	"strings"

	"github.com/fogleman/gg"
	"golang.org/x/image/font"

	"github.com/netsteer/netsteer/io/internal/words"
)

// A scene is a picture netsteer lays out itself: the views that draw the
// answer (control structure, groups, distributions) and the title and
// legend around a Graphviz layout. One list of shapes is written as SVG or
// painted as PNG, so both formats show the same thing. Units are CSS
// pixels at 100 % zoom; scenes are sceneWidth wide, so that on a
// 1,400-pixel screen they fit a review page's column (about 1,100 pixels)
// with their smallest text (smallSize) still 10 pixels or more.
type scene struct {
	W, H  float64
	items []item
}

const (
	sceneWidth = 1240.0
	textSize   = 13.0 // body text; small text is smallSize
	smallSize  = 11.5
	titleSize  = 19.0
	fontStack  = "Go, 'DejaVu Sans', Helvetica, Arial, sans-serif"
)

type itemKind uint8

const (
	kRect itemKind = iota
	kEllipse
	kPoly // closed polygon
	kLine // open polyline
	kText
	kGroup    // begins a group with a tooltip
	kGroupEnd // ends it
)

// item is one shape. Colours are "#rrggbb" or "" for none.
type item struct {
	kind       itemKind
	x, y, w, h float64   // rect and ellipse (x, y: top-left)
	pts        []float64 // x0 y0 x1 y1 ... for polygons and lines
	fill       string
	stroke     string
	sw         float64 // stroke width
	dash       string  // "", "dash" or "dot"
	rx         float64 // corner radius of a rect
	text       string
	size       float64
	bold       bool
	anchor     byte // 's'tart, 'm'iddle, 'e'nd
	arrow      bool // a line ends in an arrowhead
}

func (s *scene) add(it item) { s.items = append(s.items, it) }

func (s *scene) rect(x, y, w, h float64, fill, stroke string, sw float64) *item {
	s.add(item{kind: kRect, x: x, y: y, w: w, h: h, fill: fill, stroke: stroke, sw: sw})
	return &s.items[len(s.items)-1]
}

func (s *scene) ellipse(x, y, w, h float64, fill, stroke string, sw float64) *item {
	s.add(item{kind: kEllipse, x: x, y: y, w: w, h: h, fill: fill, stroke: stroke, sw: sw})
	return &s.items[len(s.items)-1]
}

func (s *scene) poly(fill, stroke string, sw float64, pts ...float64) *item {
	s.add(item{kind: kPoly, pts: pts, fill: fill, stroke: stroke, sw: sw})
	return &s.items[len(s.items)-1]
}

func (s *scene) line(stroke string, sw float64, pts ...float64) *item {
	s.add(item{kind: kLine, pts: pts, stroke: stroke, sw: sw})
	return &s.items[len(s.items)-1]
}

// text sets t with its baseline at y. It returns the text's width.
func (s *scene) text(x, y float64, t string, size float64, bold bool, anchor byte, col string) float64 {
	s.add(item{kind: kText, x: x, y: y, text: t, size: size, bold: bold, anchor: anchor, fill: col})
	return textWidth(t, size, bold)
}

// tip opens a group whose tooltip is t; end closes it.
func (s *scene) tip(t string) { s.add(item{kind: kGroup, text: t}) }
func (s *scene) end()         { s.add(item{kind: kGroupEnd}) }

// textWidth measures t in the Go font, which the PNG uses and which is
// close to the sans-serif faces a browser falls back to.
func textWidth(t string, size float64, bold bool) float64 {
	f := fontFace(bold, size)
	if f == nil {
		return float64(len(t)) * size * 0.55
	}
	return float64(font.MeasureString(f, t)) / 64
}

// fit returns t cut at a word boundary (or, for one long word, whole
// characters) with an ellipsis so that it is at most w wide; labels never
// break inside a word across lines.
func fit(t string, size float64, bold bool, w float64) string {
	if textWidth(t, size, bold) <= w {
		return t
	}
	r := []rune(t)
	lo, hi := 0, len(r)
	for lo < hi {
		mid := (lo + hi + 1) / 2
		if textWidth(string(r[:mid])+"…", size, bold) <= w {
			lo = mid
		} else {
			hi = mid - 1
		}
	}
	return string(r[:lo]) + "…"
}

// wrap splits t into lines at most w wide, breaking between words only;
// a word wider than w gets a line of its own, cut by fit.
func wrap(t string, size float64, bold bool, w float64) []string {
	var lines []string
	cur := ""
	for _, word := range strings.Fields(t) {
		try := word
		if cur != "" {
			try = cur + " " + word
		}
		if textWidth(try, size, bold) <= w || cur == "" {
			cur = try
			continue
		}
		lines = append(lines, fit(cur, size, bold, w))
		cur = word
	}
	if cur != "" {
		lines = append(lines, fit(cur, size, bold, w))
	}
	return lines
}

// name is how a picture shows a state name: characters a reader could not
// see or that reorder text (controls, bidirectional marks) escaped as the
// text reports write them, and invalid XML made printable.
func name(s string) string { return clean(words.Escape(s), 0) }

// writeSVG writes the scene as an SVG document that scales to its
// container: a viewBox and no fixed width or height.
func (s *scene) writeSVG(w io.Writer) error {
	bw := bufio.NewWriter(w)
	fmt.Fprintf(bw, `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 %s %s" width="100%%" style="min-width:%spx" font-family="%s" font-size="%s">`+"\n",
		ff(s.W), ff(s.H), ff(MinWidth(s.W, smallSize)), fontStack, ff(textSize))
	fmt.Fprintf(bw, `<rect x="0" y="0" width="%s" height="%s" fill="#FFFFFF"/>`+"\n", ff(s.W), ff(s.H))
	s.svgItems(bw)
	bw.WriteString("</svg>\n")
	return bw.Flush()
}

// svgItems writes the items as SVG elements.
func (s *scene) svgItems(bw *bufio.Writer) {
	for i := range s.items {
		it := &s.items[i]
		switch it.kind {
		case kGroup:
			bw.WriteString("<g><title>")
			bw.WriteString(xmlText(it.text))
			bw.WriteString("</title>\n")
		case kGroupEnd:
			bw.WriteString("</g>\n")
		case kRect:
			fmt.Fprintf(bw, `<rect x="%s" y="%s" width="%s" height="%s"`, ff(it.x), ff(it.y), ff(it.w), ff(it.h))
			if it.rx > 0 {
				fmt.Fprintf(bw, ` rx="%s"`, ff(it.rx))
			}
			paintAttrs(bw, it)
			bw.WriteString("/>\n")
		case kEllipse:
			fmt.Fprintf(bw, `<ellipse cx="%s" cy="%s" rx="%s" ry="%s"`, ff(it.x+it.w/2), ff(it.y+it.h/2), ff(it.w/2), ff(it.h/2))
			paintAttrs(bw, it)
			bw.WriteString("/>\n")
		case kPoly, kLine:
			tag := "polygon"
			if it.kind == kLine {
				tag = "polyline"
			}
			fmt.Fprintf(bw, `<%s points="%s"`, tag, points(it.pts))
			if it.kind == kLine {
				it2 := *it
				it2.fill = ""
				paintAttrs(bw, &it2)
			} else {
				paintAttrs(bw, it)
			}
			bw.WriteString("/>\n")
			if it.arrow && len(it.pts) >= 4 {
				p := arrowHead(it.pts, 3+2*it.sw)
				fmt.Fprintf(bw, `<polygon points="%s" fill="%s"/>`+"\n", points(p), it.stroke)
			}
		case kText:
			anchor := map[byte]string{'s': "start", 'm': "middle", 'e': "end"}[it.anchor]
			if anchor == "" {
				anchor = "start"
			}
			fmt.Fprintf(bw, `<text x="%s" y="%s" font-size="%s" text-anchor="%s" fill="%s"`, ff(it.x), ff(it.y), ff(it.size), anchor, colour(it.fill, colInk))
			if it.bold {
				bw.WriteString(` font-weight="bold"`)
			}
			bw.WriteString(">")
			bw.WriteString(xmlText(it.text))
			bw.WriteString("</text>\n")
		}
	}
}

func colour(c, def string) string {
	if c == "" {
		return def
	}
	return c
}

func paintAttrs(bw *bufio.Writer, it *item) {
	fmt.Fprintf(bw, ` fill="%s"`, colour(it.fill, "none"))
	if it.stroke != "" && it.sw > 0 {
		fmt.Fprintf(bw, ` stroke="%s" stroke-width="%s"`, it.stroke, ff(it.sw))
		switch it.dash {
		case "dash":
			fmt.Fprintf(bw, ` stroke-dasharray="%s,%s"`, ff(4*math.Max(1, it.sw*0.7)), ff(2.5*math.Max(1, it.sw*0.7)))
		case "dot":
			fmt.Fprintf(bw, ` stroke-dasharray="%s,%s"`, ff(1.2*math.Max(1, it.sw*0.7)), ff(2.5*math.Max(1, it.sw*0.7)))
		}
	}
}

// arrowHead returns the triangle at the end of a polyline.
func arrowHead(pts []float64, size float64) []float64 {
	n := len(pts)
	x1, y1, x0, y0 := pts[n-2], pts[n-1], pts[n-4], pts[n-3]
	dx, dy := x1-x0, y1-y0
	l := math.Hypot(dx, dy)
	if l == 0 {
		return []float64{x1, y1, x1, y1, x1, y1}
	}
	dx, dy = dx/l, dy/l
	bx, by := x1-dx*size*1.6, y1-dy*size*1.6
	return []float64{x1, y1, bx - dy*size*0.7, by + dx*size*0.7, bx + dy*size*0.7, by - dx*size*0.7}
}

func points(p []float64) string {
	var b strings.Builder
	for i := 0; i+1 < len(p); i += 2 {
		if i > 0 {
			b.WriteByte(' ')
		}
		b.WriteString(ff(p[i]))
		b.WriteByte(',')
		b.WriteString(ff(p[i+1]))
	}
	return b.String()
}

// ff formats a coordinate with at most two decimals.
func ff(v float64) string {
	s := strconv.FormatFloat(math.Round(v*100)/100, 'f', -1, 64)
	if s == "-0" {
		return "0"
	}
	return s
}

// xmlText escapes s for SVG text and attributes.
func xmlText(s string) string {
	s = clean(s, 0)
	r := strings.NewReplacer("&", "&amp;", "<", "&lt;", ">", "&gt;", `"`, "&quot;", "'", "&#39;")
	return r.Replace(s)
}

// pngScaleFor returns the pixels per unit for a PNG of a w x h scene: 2,
// less when a side would pass maxPNGSide.
func pngScaleFor(w, h float64) float64 {
	s := pngScale
	if side := math.Max(w, h) * s; side > maxPNGSide {
		s *= maxPNGSide / side
	}
	return s
}

// paint draws the scene on a new image at scale s, with an optional
// image placed at (ix, iy) in scene units before the items.
func (s *scene) paint(sc float64, under image.Image, ix, iy float64) *gg.Context {
	wpx := max(1, int(math.Ceil(s.W*sc)))
	hpx := max(1, int(math.Ceil(s.H*sc)))
	dc := gg.NewContext(wpx, hpx)
	dc.SetRGB(1, 1, 1)
	dc.Clear()
	if under != nil {
		dc.DrawImage(under, int(math.Round(ix*sc)), int(math.Round(iy*sc)))
	}
	dc.SetLineJoinRound()
	for i := range s.items {
		it := &s.items[i]
		switch it.kind {
		case kRect:
			if it.rx > 0 {
				dc.DrawRoundedRectangle(it.x*sc, it.y*sc, it.w*sc, it.h*sc, it.rx*sc)
			} else {
				dc.DrawRectangle(it.x*sc, it.y*sc, it.w*sc, it.h*sc)
			}
			fillStroke(dc, it, sc)
		case kEllipse:
			dc.DrawEllipse((it.x+it.w/2)*sc, (it.y+it.h/2)*sc, it.w/2*sc, it.h/2*sc)
			fillStroke(dc, it, sc)
		case kPoly, kLine:
			dc.MoveTo(it.pts[0]*sc, it.pts[1]*sc)
			for k := 2; k+1 < len(it.pts); k += 2 {
				dc.LineTo(it.pts[k]*sc, it.pts[k+1]*sc)
			}
			if it.kind == kPoly {
				dc.ClosePath()
				fillStroke(dc, it, sc)
			} else {
				it2 := *it
				it2.fill = ""
				fillStroke(dc, &it2, sc)
				if it.arrow && len(it.pts) >= 4 {
					p := arrowHead(it.pts, 3+2*it.sw)
					dc.MoveTo(p[0]*sc, p[1]*sc)
					dc.LineTo(p[2]*sc, p[3]*sc)
					dc.LineTo(p[4]*sc, p[5]*sc)
					dc.ClosePath()
					dc.SetColor(parseColor(it.stroke))
					dc.Fill()
				}
			}
		case kText:
			face := fontFace(it.bold, it.size*sc)
			if face == nil {
				continue
			}
			dc.SetFontFace(face)
			dc.SetColor(parseColor(colour(it.fill, colInk)))
			ax := map[byte]float64{'s': 0, 'm': 0.5, 'e': 1}[it.anchor]
			dc.DrawStringAnchored(clean(it.text, 0), it.x*sc, it.y*sc, ax, 0)
		}
	}
	return dc
}

func fillStroke(dc *gg.Context, it *item, sc float64) {
	if it.fill != "" {
		dc.SetColor(parseColor(it.fill))
		if it.stroke != "" && it.sw > 0 {
			dc.FillPreserve()
		} else {
			dc.Fill()
		}
	}
	if it.stroke != "" && it.sw > 0 {
		dc.SetColor(parseColor(it.stroke))
		dc.SetLineWidth(it.sw * sc)
		w := math.Max(1, it.sw*0.7) * sc
		switch it.dash {
		case "dash":
			dc.SetDash(4*w, 2.5*w)
		case "dot":
			dc.SetDash(1.2*w, 2.5*w)
		default:
			dc.SetDash()
		}
		dc.Stroke()
	}
	dc.ClearPath()
}

// writePNG paints the scene as PNG.
func (s *scene) writePNG(w io.Writer) error {
	return s.paint(pngScaleFor(s.W, s.H), nil, 0, 0).EncodePNG(w)
}
