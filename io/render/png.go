package render

import (
	"encoding/json"
	"fmt"
	"image/color"
	"io"
	"math"
	"regexp"
	"strconv"
	"strings"
	"sync"

	"github.com/fogleman/gg"
	"golang.org/x/image/font"
	"golang.org/x/image/font/gofont/gobold"
	"golang.org/x/image/font/gofont/goregular"
	"golang.org/x/image/font/opentype"
)

// PNG pictures are drawn here from Graphviz's layout (its JSON output with
// xdot drawing operations), not by go-graphviz's own image renderer, which
// (v0.2.10) leaves filled shapes without outlines and drops some edges.
// Text is set in the Go fonts, so a picture looks the same on every
// machine.

// maxPNGSide bounds the width and height of a PNG in pixels; pngScale is
// the scale used when the picture fits (2 pixels per point).
const (
	maxPNGSide = 6000
	pngScale   = 2.0
)

// xdotOp is one xdot drawing operation in Graphviz's JSON output.
type xdotOp struct {
	Op       string      `json:"op"`
	Color    string      `json:"color"`
	Style    string      `json:"style"`
	Size     float64     `json:"size"`
	Face     string      `json:"face"`
	FontChar int         `json:"fontchar"`
	Rect     []float64   `json:"rect"`
	Points   [][]float64 `json:"points"`
	Pt       []float64   `json:"pt"`
	Align    string      `json:"align"`
	Width    float64     `json:"width"`
	Text     string      `json:"text"`
}

type xdotObject struct {
	Draw   []xdotOp `json:"_draw_"`
	LDraw  []xdotOp `json:"_ldraw_"`
	HDraw  []xdotOp `json:"_hdraw_"`
	TDraw  []xdotOp `json:"_tdraw_"`
	HLDraw []xdotOp `json:"_hldraw_"`
	TLDraw []xdotOp `json:"_tldraw_"`
}

type xdotGraph struct {
	xdotObject
	BB          string       `json:"bb"`
	Pad         string       `json:"pad"`
	OutputOrder string       `json:"outputorder"`
	Subgraphs   int          `json:"_subgraph_cnt"`
	Objects     []xdotObject `json:"objects"`
	Edges       []xdotObject `json:"edges"`
}

// pngTrace, when not nil, is given to drawLayout by drawPNG; set by
// tests only.
var pngTrace func(*xdotOp, *canvas)

// drawPNG draws a Graphviz JSON layout as PNG.
func drawPNG(layout []byte, w io.Writer) error {
	c, err := drawLayout(layout, pngTrace)
	if err != nil {
		return err
	}
	return c.dc.EncodePNG(w)
}

// drawLayout draws a Graphviz JSON layout on a new canvas. When trace is
// not nil it is called after each operation carried out (not after one
// skipped as malformed), with the canvas in the state the operation left.
func drawLayout(layout []byte, trace func(*xdotOp, *canvas)) (*canvas, error) {
	var g xdotGraph
	if err := json.Unmarshal(jsonControls(layout), &g); err != nil {
		return nil, fmt.Errorf("render: reading Graphviz layout: %v", err)
	}
	var x0, y0, x1, y1 float64
	if _, err := fmt.Sscanf(g.BB, "%g,%g,%g,%g", &x0, &y0, &x1, &y1); err != nil {
		return nil, fmt.Errorf("render: Graphviz layout has no bounding box (%q)", g.BB)
	}
	pad := 4.0
	if p, err := strconv.ParseFloat(g.Pad, 64); err == nil {
		pad = p * 72
	}
	x0, y0, x1, y1 = x0-pad, y0-pad, x1+pad, y1+pad
	s := pngScale
	if side := math.Max(x1-x0, y1-y0) * s; side > maxPNGSide {
		s *= maxPNGSide / side
	}
	wpx := int(math.Ceil((x1 - x0) * s))
	hpx := int(math.Ceil((y1 - y0) * s))
	if wpx < 1 {
		wpx = 1
	}
	if hpx < 1 {
		hpx = 1
	}
	c := &canvas{dc: gg.NewContext(wpx, hpx), s: s, x0: x0, y1: y1, trace: trace}
	c.dc.SetRGB(1, 1, 1)
	c.dc.Clear()
	c.dc.SetLineJoinRound()
	c.dc.SetLineCapButt()
	c.ops(g.Draw)
	c.ops(g.LDraw)
	n := g.Subgraphs
	if n > len(g.Objects) {
		n = len(g.Objects)
	}
	for _, o := range g.Objects[:n] {
		c.ops(o.Draw)
		c.ops(o.LDraw)
	}
	nodes := func() {
		for _, o := range g.Objects[n:] {
			c.ops(o.Draw)
			c.ops(o.LDraw)
		}
	}
	edges := func() {
		for _, e := range g.Edges {
			for _, l := range [][]xdotOp{e.Draw, e.HDraw, e.TDraw, e.LDraw, e.HLDraw, e.TLDraw} {
				c.ops(l)
			}
		}
	}
	if g.OutputOrder == "edgesfirst" {
		edges()
		nodes()
	} else {
		nodes()
		edges()
	}
	return c, nil
}

type canvas struct {
	dc     *gg.Context
	s      float64 // pixels per point
	x0, y1 float64 // top-left corner in Graphviz points

	pen, fill color.Color
	width     float64
	dash      []float64 // from the style
	penDash   []float64 // from a dash mark in the pen colour (see pngDOT)
	size      float64
	bold      bool

	trace func(*xdotOp, *canvas)
}

// Dash patterns in points (Graphviz's SVG output dashes 5,2 too).
var (
	dashPattern = []float64{5, 2}
	dotPattern  = []float64{1, 3}
)

// lineDash returns the dash pattern strokes are drawn with (nil: solid).
func (c *canvas) lineDash() []float64 {
	if c.penDash != nil {
		return c.penDash
	}
	return c.dash
}

func (c *canvas) x(v float64) float64 { return (v - c.x0) * c.s }
func (c *canvas) y(v float64) float64 { return (c.y1 - v) * c.s }

// ops runs one xdot operation list; drawing state starts afresh for each
// list, as in xdot.
func (c *canvas) ops(list []xdotOp) {
	if len(list) == 0 {
		return
	}
	c.pen, c.fill = color.Black, color.Black
	c.width, c.dash, c.penDash, c.size, c.bold = 1, nil, nil, 14, false
	for i := range list {
		op := &list[i]
		switch op.Op {
		case "c":
			c.pen, c.penDash = penColor(op.Color)
		case "C":
			c.fill = parseColor(op.Color)
		case "S":
			c.style(op.Style)
		case "F":
			c.size = op.Size
		case "t":
			c.bold = op.FontChar&1 != 0
		case "E", "e":
			if len(op.Rect) != 4 {
				continue
			}
			c.dc.DrawEllipse(c.x(op.Rect[0]), c.y(op.Rect[1]), op.Rect[2]*c.s, op.Rect[3]*c.s)
			c.paint(op.Op == "E", true)
		case "P", "p", "L":
			if len(op.Points) < 2 {
				continue
			}
			c.dc.MoveTo(c.x(op.Points[0][0]), c.y(op.Points[0][1]))
			for _, p := range op.Points[1:] {
				c.dc.LineTo(c.x(p[0]), c.y(p[1]))
			}
			if op.Op != "L" {
				c.dc.ClosePath()
			}
			c.paint(op.Op == "P", true)
		case "B", "b":
			if len(op.Points) < 4 {
				continue
			}
			c.dc.MoveTo(c.x(op.Points[0][0]), c.y(op.Points[0][1]))
			for k := 1; k+2 < len(op.Points); k += 3 {
				p1, p2, p3 := op.Points[k], op.Points[k+1], op.Points[k+2]
				c.dc.CubicTo(c.x(p1[0]), c.y(p1[1]), c.x(p2[0]), c.y(p2[1]), c.x(p3[0]), c.y(p3[1]))
			}
			// Graphviz's JSON writer (12.1) names a filled B-spline "B"
			// and an unfilled one "b", the reverse of the xdot text
			// format; edges come as "b".
			c.paint(op.Op == "B", true)
		case "T":
			op.Text = strings.ReplaceAll(op.Text, backslashMark, `\`)
			if len(op.Pt) != 2 || op.Text == "" || !c.text(op) {
				continue
			}
		}
		if c.trace != nil {
			c.trace(op, c)
		}
	}
}

// style applies an xdot style. Graphviz 12.1's JSON writer sometimes
// runs past the end of a style string (a missing terminator in the wasm
// build: "dashed" comes out followed by whatever lies behind it in
// memory), so styles are recognised by their prefix.
func (c *canvas) style(s string) {
	switch {
	case strings.HasPrefix(s, "setlinewidth("):
		v := strings.TrimPrefix(s, "setlinewidth(")
		if i := strings.IndexByte(v, ')'); i >= 0 {
			if w, err := strconv.ParseFloat(v[:i], 64); err == nil {
				c.width = w
			}
		}
	case strings.HasPrefix(s, "dashed"):
		c.dash = dashPattern
	case strings.HasPrefix(s, "dotted"):
		c.dash = dotPattern
	case strings.HasPrefix(s, "solid"):
		c.dash = nil
	case strings.HasPrefix(s, "bold"):
		c.width = 2
	case strings.HasPrefix(s, "invis"):
		c.pen = color.Transparent
		c.fill = color.Transparent
	}
}

// jsonControls replaces raw control bytes inside JSON strings with
// spaces, in place: the overrun described at style can carry them, and
// encoding/json rejects them.
func jsonControls(b []byte) []byte {
	in, esc := false, false
	for i, c := range b {
		switch {
		case !in:
			in = c == '"'
		case esc:
			esc = false
		case c == '\\':
			esc = true
		case c == '"':
			in = false
		case c < 0x20:
			b[i] = ' '
		}
	}
	return b
}

// paint fills the current path with the fill colour when filled, then
// strokes it with the pen.
func (c *canvas) paint(filled, stroke bool) {
	if filled {
		c.dc.SetColor(c.fill)
		c.dc.FillPreserve()
	}
	if stroke {
		c.dc.SetColor(c.pen)
		c.dc.SetLineWidth(c.width * c.s)
		if dash := c.lineDash(); dash != nil {
			d := make([]float64, len(dash))
			for i, v := range dash {
				d[i] = v * c.s * math.Max(1, c.width*0.6)
			}
			c.dc.SetDash(d...)
		} else {
			c.dc.SetDash()
		}
		c.dc.Stroke()
	}
	c.dc.ClearPath()
}

// text sets one text; false when there is no font for it.
func (c *canvas) text(op *xdotOp) bool {
	face := fontFace(c.bold, c.size*c.s)
	if face == nil {
		return false
	}
	c.dc.SetFontFace(face)
	c.dc.SetColor(c.pen)
	ax := 0.5
	switch op.Align {
	case "l":
		ax = 0
	case "r":
		ax = 1
	}
	c.dc.DrawStringAnchored(op.Text, c.x(op.Pt[0]), c.y(op.Pt[1]), ax, 0)
	return true
}

var (
	fontMu    sync.Mutex
	fontFaces = map[[2]float64]font.Face{}
	fontSets  [2]*opentype.Font
)

// fontFace returns a Go font face of the given pixel size.
func fontFace(bold bool, px float64) font.Face {
	fontMu.Lock()
	defer fontMu.Unlock()
	k := 0
	if bold {
		k = 1
	}
	key := [2]float64{float64(k), math.Round(px*4) / 4}
	if f, ok := fontFaces[key]; ok {
		return f
	}
	if fontSets[k] == nil {
		data := goregular.TTF
		if bold {
			data = gobold.TTF
		}
		f, err := opentype.Parse(data)
		if err != nil {
			return nil
		}
		fontSets[k] = f
	}
	face, err := opentype.NewFace(fontSets[k], &opentype.FaceOptions{Size: key[1], DPI: 72, Hinting: font.HintingNone})
	if err != nil {
		return nil
	}
	fontFaces[key] = face
	return face
}

// parseColor reads an xdot colour: #rrggbb or #rrggbbaa (Graphviz writes
// named colours in this form too); anything else is black.
func parseColor(s string) color.Color {
	if strings.HasPrefix(s, "#") && (len(s) == 7 || len(s) == 9) {
		v, err := strconv.ParseUint(s[1:], 16, 32)
		if err == nil {
			if len(s) == 7 {
				return color.NRGBA{uint8(v >> 16), uint8(v >> 8), uint8(v), 255}
			}
			return color.NRGBA{uint8(v >> 24), uint8(v >> 16), uint8(v >> 8), uint8(v)}
		}
	}
	switch s {
	case "white":
		return color.White
	case "transparent", "none", "invis":
		return color.Transparent
	}
	return color.Black
}

// pngDOT prepares DOT text for the JSON layout a PNG is drawn from,
// working around two faults of Graphviz 12.1 (the build inside go-graphviz
// v0.2.10) that drop or garble texts in its xdot drawing operations, where
// the SVG renderer is not affected:
//
//   - The border style of an HTML-like table or cell, style="dashed" or
//     "dotted", is written by reading on past the end of the style's name
//     (a cell's style list lacks the empty argument list that ends the
//     styles of nodes and edges), so the "S" operation carries tens of
//     kilobytes of the program's memory, and the JSON output keeps none of
//     the operations after it in that label: in netsteer's legend every
//     entry after the first dashed swatch was lost. pngDOT takes dashed and
//     dotted out of such styles and marks the border colour instead, in its
//     alpha channel (dashAlpha, dotAlpha), which the drawer (penColor) turns
//     back into an opaque colour and a dash pattern.
//   - A string in xdot is its length followed by its bytes; Graphviz
//     doubles the backslashes of graph, node and edge label texts after
//     counting them, and its parser counts an escaped backslash as one
//     character but keeps both (and miscounts runs of them), so a label
//     with a backslash came out doubled, and a cluster's label with one
//     took in the next character. pngDOT replaces every escaped backslash
//     in quoted and HTML strings by backslashMark, which the drawer turns
//     back into a backslash.
//
// The marks are alpha values no netsteer colour has and a character of the
// Unicode private use area.
const (
	dashAlpha     = 0xfe
	dotAlpha      = 0xfd
	backslashMark = "\uE05C"
)

var (
	htmlCellTag = regexp.MustCompile(`(?i)<(?:td|table)\b[^>]*>`)
	htmlAttr    = regexp.MustCompile(`(?i)(\s)([a-z-]+)(\s*=\s*)"([^"]*)"`)
	hexColor    = regexp.MustCompile(`^#[0-9a-fA-F]{6}$`)
)

// pngDOT returns the DOT text with the marks described above. It finds
// quoted strings and HTML strings (<...>) as DOT writes them (without
// comments). A table or cell border colour must be #rrggbb (or absent:
// black) to be marked; one in any other form keeps its style.
func pngDOT(dot []byte) []byte {
	out := make([]byte, 0, len(dot)+len(dot)/16)
	for i := 0; i < len(dot); {
		switch dot[i] {
		case '"':
			end := quotedEnd(dot, i)
			out = markBackslashes(out, dot[i:end])
			i = end
		case '<':
			end := htmlEnd(dot, i)
			out = markBackslashes(out, htmlCellTag.ReplaceAllFunc(dot[i:end], markBorderStyle))
			i = end
		default:
			out = append(out, dot[i])
			i++
		}
	}
	return out
}

// markBackslashes appends s to out with every escaped backslash (\\, read
// from the left) replaced by backslashMark; other escapes stay.
func markBackslashes(out, s []byte) []byte {
	for j := 0; j < len(s); j++ {
		if s[j] == '\\' && j+1 < len(s) {
			if s[j+1] == '\\' {
				out = append(out, backslashMark...)
			} else {
				out = append(out, s[j], s[j+1])
			}
			j++
			continue
		}
		out = append(out, s[j])
	}
	return out
}

// quotedEnd returns the index just past the DOT quoted string starting at
// dot[i] == '"' (backslash escapes), or len(dot).
func quotedEnd(dot []byte, i int) int {
	for j := i + 1; j < len(dot); j++ {
		switch dot[j] {
		case '\\':
			j++
		case '"':
			return j + 1
		}
	}
	return len(dot)
}

// htmlEnd returns the index just past the DOT HTML string starting at
// dot[i] == '<' (angle brackets nest), or len(dot).
func htmlEnd(dot []byte, i int) int {
	depth := 0
	for j := i; j < len(dot); j++ {
		switch dot[j] {
		case '<':
			depth++
		case '>':
			depth--
			if depth == 0 {
				return j + 1
			}
		}
	}
	return len(dot)
}

// markBorderStyle rewrites one <td ...> or <table ...> start tag: dashed or
// dotted leaves its style attribute and marks its color attribute.
func markBorderStyle(tag []byte) []byte {
	var mark byte
	hasColor := false
	for _, m := range htmlAttr.FindAllSubmatch(tag, -1) {
		switch strings.ToLower(string(m[2])) {
		case "style":
			for _, s := range strings.Split(string(m[4]), ",") {
				switch strings.ToLower(strings.TrimSpace(s)) {
				case "dashed":
					mark = dashAlpha
				case "dotted":
					mark = dotAlpha
				}
			}
		case "color":
			if !hexColor.Match(m[4]) {
				return tag
			}
			hasColor = true
		}
	}
	if mark == 0 {
		return tag
	}
	out := htmlAttr.ReplaceAllFunc(tag, func(a []byte) []byte {
		m := htmlAttr.FindSubmatch(a)
		switch strings.ToLower(string(m[2])) {
		case "style":
			var keep []string
			for _, s := range strings.Split(string(m[4]), ",") {
				switch strings.ToLower(strings.TrimSpace(s)) {
				case "dashed", "dotted":
				default:
					keep = append(keep, s)
				}
			}
			if len(keep) == 0 {
				return nil
			}
			return []byte(fmt.Sprintf(`%s%s%s"%s"`, m[1], m[2], m[3], strings.Join(keep, ",")))
		case "color":
			return []byte(fmt.Sprintf(`%s%s%s"%s%02x"`, m[1], m[2], m[3], m[4], mark))
		}
		return a
	})
	if !hasColor {
		end := len(out) - 1 // before '>'
		if end > 0 && out[end-1] == '/' {
			end--
		}
		out = append(out[:end:end], fmt.Sprintf(` color="#000000%02x"`, mark)+string(out[end:])...)
	}
	return out
}

// penColor reads an xdot pen colour and the dash pattern its mark asks for
// (see dashAlpha); nil when unmarked.
func penColor(s string) (color.Color, []float64) {
	c := parseColor(s)
	if n, ok := c.(color.NRGBA); ok {
		switch n.A {
		case dashAlpha:
			n.A = 0xff
			return n, dashPattern
		case dotAlpha:
			n.A = 0xff
			return n, dotPattern
		}
	}
	return c, nil
}
