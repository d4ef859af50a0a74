// Package plot draws sweep results with gonum/plot: the measured mean
// driver fraction at each grid point, with error bars of one standard error
// over the replicates, against the curve the cavity method predicts. Plots
// are sized for a slide, set in a sans-serif face, coloured from the
// palette of the network pictures (Okabe & Ito) with a marker and a dash
// per series, and titled with the model, its fixed parameters, N and the
// replicates per point read from the rows.
//
// The x axis is the first coordinate of the rows' params that takes more
// than one value; rows that differ in other coordinates form separate
// series. Files are SVG or PNG by extension, written through fileout.
package plot

import (
	"bytes"
	"fmt"
	"image/color"
	"io"
	"math"
	"path/filepath"
	"sort"
	"strconv"
	"strings"

	"gonum.org/v1/gonum/stat"
	gplot "gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"github.com/netsteer/netsteer/io/fileout"
	"github.com/netsteer/netsteer/io/sweepcsv"
)

// axisLabels names each coordinate with its unit.
var axisLabels = map[string]string{
	"nodes":       "nodes N (states)",
	"mean_degree": "mean degree <k> = 2L/N (edges per state)",
	"degree":      "out-degree d (edges per state)",
	"gamma_out":   "out-degree exponent γ_out (dimensionless)",
	"gamma_in":    "in-degree exponent γ_in (dimensionless)",
	"rewire":      "rewiring probability (fraction of ring edges)",
	"width":       "grid width (states per row)",
	"branching":   "branching (followers per leader)",
	"+swap":       "edge swaps (attempts per edge)",
	"+rewire":     "rewired edges (fraction of edges)",
	"+dropout":    "edge dropout (fraction of edges removed)",
	"+remove":     "random state removal (fraction of states)",
	"+attack":     "targeted attack, highest degree first (fraction of states)",
	"+loops":      "self-loops added (probability per state)",
	"+replicate":  "copies of the unit (count)",
}

// YLabel is the y axis label.
const YLabel = "driver fraction n_D = N_D/N (driver nodes per state)"

type coord struct{ name, value string }

func parseParams(s string) []coord {
	var out []coord
	for _, part := range strings.Split(s, ";") {
		n, v, _ := strings.Cut(part, "=")
		out = append(out, coord{n, v})
	}
	return out
}

// Point is one aggregated grid point of a series.
type Point struct {
	X            float64
	Mean, StdErr float64 // measured driver fraction over replicates
	Predicted    float64 // mean prediction (NaN when none)
	Replicates   int
}

// Series is the points of one curve, sorted by X.
type Series struct {
	Label  string // the other varying coordinates, "" when there are none
	Points []Point
}

// Aggregate groups rows into series along the x coordinate, which it
// returns by name.
func Aggregate(rows []sweepcsv.Row) (xName string, series []Series, err error) {
	if len(rows) == 0 {
		return "", nil, fmt.Errorf("plot: no rows to draw")
	}
	// Coordinates in order of first appearance, with their distinct values.
	var names []string
	values := map[string]map[string]bool{}
	for _, r := range rows {
		for _, c := range parseParams(r.Params) {
			if values[c.name] == nil {
				values[c.name] = map[string]bool{}
				names = append(names, c.name)
			}
			values[c.name][c.value] = true
		}
	}
	models := map[string]bool{}
	for _, r := range rows {
		models[r.Model] = true
	}
	numeric := func(name string) bool {
		for v := range values[name] {
			if _, err := strconv.ParseFloat(v, 64); err != nil && v != "inf" {
				return false
			}
		}
		return true
	}
	for _, n := range names {
		if len(values[n]) > 1 && numeric(n) {
			xName = n
			break
		}
	}
	if xName == "" {
		for _, n := range names {
			if numeric(n) {
				xName = n
				break
			}
		}
	}
	if xName == "" {
		return "", nil, fmt.Errorf("plot: the rows have no numeric coordinate to draw along")
	}
	type acc struct {
		meas, pred []float64
	}
	groups := map[string]map[float64]*acc{}
	var order []string
	for _, r := range rows {
		var label []string
		if len(models) > 1 {
			label = append(label, r.Model)
		}
		x := math.NaN()
		for _, c := range parseParams(r.Params) {
			if c.name == xName {
				x, _ = strconv.ParseFloat(c.value, 64)
				if c.value == "inf" {
					x = math.Inf(1)
				}
				continue
			}
			if len(values[c.name]) > 1 {
				label = append(label, c.name+"="+c.value)
			}
		}
		if math.IsNaN(x) || math.IsInf(x, 0) {
			continue
		}
		key := strings.Join(label, " ")
		if groups[key] == nil {
			groups[key] = map[float64]*acc{}
			order = append(order, key)
		}
		a := groups[key][x]
		if a == nil {
			a = &acc{}
			groups[key][x] = a
		}
		a.meas = append(a.meas, r.DriverFraction)
		if !math.IsNaN(r.PredictedFraction) {
			a.pred = append(a.pred, r.PredictedFraction)
		}
	}
	for _, key := range order {
		s := Series{Label: key}
		for x, a := range groups[key] {
			p := Point{X: x, Replicates: len(a.meas), Predicted: math.NaN()}
			var sd float64
			p.Mean, sd = stat.MeanStdDev(a.meas, nil)
			if len(a.meas) > 1 {
				p.StdErr = sd / math.Sqrt(float64(len(a.meas)))
			}
			if len(a.pred) > 0 {
				p.Predicted = stat.Mean(a.pred, nil)
			}
			s.Points = append(s.Points, p)
		}
		sort.Slice(s.Points, func(i, j int) bool { return s.Points[i].X < s.Points[j].X })
		series = append(series, s)
	}
	return xName, series, nil
}

// errPoints adapts a series to plotter.XYer and YErrorer.
type errPoints []Point

func (e errPoints) Len() int                    { return len(e) }
func (e errPoints) XY(i int) (float64, float64) { return e[i].X, e[i].Mean }
func (e errPoints) YError(i int) (float64, float64) {
	return e[i].StdErr, e[i].StdErr
}

// Options style a plot.
type Options struct {
	// Title is the plot's first line; Describe(rows) is added beneath it.
	Title string
	// LogX and LogY draw the axis on a logarithmic scale (points at zero
	// or below are left out of a log axis).
	LogX, LogY bool
}

// The palette of the network pictures (Okabe & Ito 2008), with a marker
// and a dash pattern per series so that series stay apart in grey.
var (
	palette = []color.NRGBA{
		{0x00, 0x72, 0xB2, 0xFF}, {0xD5, 0x5E, 0x00, 0xFF}, {0x00, 0x9E, 0x73, 0xFF},
		{0xCC, 0x79, 0xA7, 0xFF}, {0xE6, 0x9F, 0x00, 0xFF}, {0x56, 0xB4, 0xE9, 0xFF}, {0x00, 0x00, 0x00, 0xFF},
	}
	glyphs = []draw.GlyphDrawer{draw.CircleGlyph{}, draw.SquareGlyph{}, draw.TriangleGlyph{}, draw.RingGlyph{}, draw.BoxGlyph{}, draw.PyramidGlyph{}, draw.CrossGlyph{}}
	dashes = [][]vg.Length{{vg.Points(6), vg.Points(3)}, {vg.Points(2), vg.Points(2)}, {vg.Points(8), vg.Points(2), vg.Points(2), vg.Points(2)}, {vg.Points(4), vg.Points(4)}}
)

// Slide is the size plots are drawn at: 16:9, for a slide.
const (
	SlideWidth  = 10 * vg.Inch
	SlideHeight = 5.625 * vg.Inch
)

func sans(size vg.Length) font.Font {
	return font.Font{Typeface: "Liberation", Variant: "Sans", Size: size}
}

// Describe words what the rows hold for a subtitle: the models, the
// coordinates that take one value (N among them), and the replicates per
// point.
func Describe(rows []sweepcsv.Row) string {
	models := map[string]bool{}
	var order []string
	values := map[string]map[string]bool{}
	reps := map[string]int{}
	nodes := map[int]bool{}
	for _, r := range rows {
		if !models[r.Model] {
			models[r.Model] = true
			order = append(order, r.Model)
		}
		nodes[r.Nodes] = true
		for _, c := range parseParams(r.Params) {
			if values[c.name] == nil {
				values[c.name] = map[string]bool{}
			}
			values[c.name][c.value] = true
		}
		k := r.Model + "|" + r.Params
		reps[k]++
	}
	var parts []string
	parts = append(parts, "model "+strings.Join(order, ", "))
	if len(nodes) == 1 {
		for n := range nodes {
			if n > 0 {
				parts = append(parts, "N = "+thousands(n))
			}
		}
	}
	var fixed []string
	for name, vs := range values {
		if len(vs) == 1 && name != "nodes" {
			for v := range vs {
				fixed = append(fixed, strings.TrimPrefix(name, "+")+" = "+v)
			}
		}
	}
	sort.Strings(fixed)
	parts = append(parts, fixed...)
	lo, hi := math.MaxInt, 0
	for _, k := range reps {
		lo, hi = min(lo, k), max(hi, k)
	}
	if hi > 0 {
		r := strconv.Itoa(hi)
		if lo != hi {
			r = strconv.Itoa(lo) + "-" + strconv.Itoa(hi)
		}
		parts = append(parts, r+" "+map[bool]string{true: "replicate", false: "replicates"}[hi == 1]+" per point")
	}
	return strings.Join(parts, "; ")
}

func thousands(n int) string {
	s := strconv.Itoa(n)
	for i := len(s) - 3; i > 0; i -= 3 {
		s = s[:i] + "," + s[i:]
	}
	return s
}

// New draws rows into a plot titled title.
func New(rows []sweepcsv.Row, title string) (*gplot.Plot, error) {
	return NewWith(rows, Options{Title: title})
}

// NewWith draws rows into a plot styled by opt: measured means as markers
// joined by a thin solid line, with error bars of one standard error;
// the cavity prediction as a dashed line without markers; one colour,
// marker and dash per series; a sans-serif face throughout.
func NewWith(rows []sweepcsv.Row, opt Options) (*gplot.Plot, error) {
	xName, series, err := Aggregate(rows)
	if err != nil {
		return nil, err
	}
	p := gplot.New()
	p.Title.Text = opt.Title
	if d := Describe(rows); d != "" {
		if p.Title.Text != "" {
			p.Title.Text += "\n"
		}
		p.Title.Text += d
	}
	p.Title.TextStyle.Font = sans(15)
	p.X.Label.Text = axisLabels[xName]
	if p.X.Label.Text == "" {
		p.X.Label.Text = strings.TrimPrefix(xName, "+")
	}
	p.Y.Label.Text = YLabel
	for _, ax := range []*gplot.Axis{&p.X, &p.Y} {
		ax.Label.TextStyle.Font = sans(14)
		ax.Tick.Label.Font = sans(12)
	}
	p.Legend.TextStyle.Font = sans(12)
	p.Legend.Top = true
	p.Add(plotter.NewGrid())
	keep := func(x, y float64) bool { return (!opt.LogX || x > 0) && (!opt.LogY || y > 0) }
	for i, s := range series {
		col := palette[i%len(palette)]
		suffix := ""
		if s.Label != "" {
			suffix = " (" + s.Label + ")"
		}
		var pred plotter.XYs
		var meas errPoints
		for _, pt := range s.Points {
			if !math.IsNaN(pt.Predicted) && keep(pt.X, pt.Predicted) {
				pred = append(pred, plotter.XY{X: pt.X, Y: pt.Predicted})
			}
			if keep(pt.X, pt.Mean) {
				meas = append(meas, pt)
			}
		}
		if len(pred) > 0 {
			l, err := plotter.NewLine(pred)
			if err != nil {
				return nil, err
			}
			l.Color = col
			l.Width = vg.Points(1.6)
			l.Dashes = dashes[i%len(dashes)]
			p.Add(l)
			p.Legend.Add("theory: cavity prediction"+suffix, l)
		}
		if len(meas) == 0 {
			continue
		}
		join, err := plotter.NewLine(meas)
		if err != nil {
			return nil, err
		}
		join.Color, join.Width = col, vg.Points(0.8)
		sc, err := plotter.NewScatter(meas)
		if err != nil {
			return nil, err
		}
		sc.GlyphStyle.Color = col
		sc.GlyphStyle.Shape = glyphs[i%len(glyphs)]
		sc.GlyphStyle.Radius = vg.Points(3.5)
		eb, err := plotter.NewYErrorBars(meas)
		if err != nil {
			return nil, err
		}
		eb.Color = col
		eb.LineStyle.Width = vg.Points(1.2)
		eb.CapWidth = vg.Points(6)
		p.Add(join, eb, sc)
		p.Legend.Add("measured mean ± 1 s.e."+suffix, join, sc)
	}
	if opt.LogX {
		p.X.Scale, p.X.Tick.Marker = gplot.LogScale{}, gplot.LogTicks{Prec: -1}
	}
	if opt.LogY {
		p.Y.Scale, p.Y.Tick.Marker = gplot.LogScale{}, gplot.LogTicks{Prec: -1}
	} else {
		p.Y.Min = 0
		if max := maxY(series); max > 0 {
			// Headroom for the legend, which sits top right.
			p.Y.Max = math.Min(1, max*(1.1+0.16*float64(len(series))))
		}
	}
	return p, nil
}

func maxY(series []Series) float64 {
	m := 0.0
	for _, s := range series {
		for _, pt := range s.Points {
			m = math.Max(m, pt.Mean+pt.StdErr)
			if !math.IsNaN(pt.Predicted) {
				m = math.Max(m, pt.Predicted)
			}
		}
	}
	return m
}

// WriteFile draws rows to path, SVG or PNG by its extension, titled
// title.
func WriteFile(path string, rows []sweepcsv.Row, title string) error {
	return WriteFileWith(path, rows, Options{Title: title})
}

// WriteFileWith draws rows to path, SVG or PNG by its extension, at
// slide size (SlideWidth x SlideHeight).
func WriteFileWith(path string, rows []sweepcsv.Row, opt Options) error {
	format := strings.TrimPrefix(strings.ToLower(filepath.Ext(path)), ".")
	if format != "svg" && format != "png" {
		return fmt.Errorf("plot: %s: want a .svg or .png file", path)
	}
	p, err := NewWith(rows, opt)
	if err != nil {
		return err
	}
	wt, err := p.WriterTo(SlideWidth, SlideHeight, format)
	if err != nil {
		return err
	}
	var buf bytes.Buffer
	if _, err := wt.WriteTo(&buf); err != nil {
		return err
	}
	return fileout.Write(path, nil, func(w io.Writer) error {
		_, err := w.Write(buf.Bytes())
		return err
	})
}
