// Package plot draws sweep results with gonum/plot: the measured mean
// driver fraction at each grid point, with error bars of one standard error
// over the replicates, against the curve the cavity method predicts.
//
// The x axis is the first coordinate of the rows' params that takes more
// than one value; rows that differ in other coordinates form separate
// series. Files are SVG or PNG by extension, written through fileout.
package plot

import (
	"bytes"
	"fmt"
	"io"
	"math"
	"path/filepath"
	"sort"
	"strconv"
	"strings"

	"gonum.org/v1/gonum/stat"
	gplot "gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/plotutil"
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

// New draws rows into a plot.
func New(rows []sweepcsv.Row, title string) (*gplot.Plot, error) {
	xName, series, err := Aggregate(rows)
	if err != nil {
		return nil, err
	}
	p := gplot.New()
	p.Title.Text = title
	p.X.Label.Text = axisLabels[xName]
	if p.X.Label.Text == "" {
		p.X.Label.Text = strings.TrimPrefix(xName, "+")
	}
	p.Y.Label.Text = YLabel
	p.Y.Min = 0
	p.Add(plotter.NewGrid())
	p.Legend.Top = true
	for i, s := range series {
		col := plotutil.Color(i)
		suffix := ""
		if s.Label != "" {
			suffix = " (" + s.Label + ")"
		}
		var pred plotter.XYs
		for _, pt := range s.Points {
			if !math.IsNaN(pt.Predicted) {
				pred = append(pred, plotter.XY{X: pt.X, Y: pt.Predicted})
			}
		}
		if len(pred) > 0 {
			l, err := plotter.NewLine(pred)
			if err != nil {
				return nil, err
			}
			l.Color = col
			l.Width = vg.Points(1.2)
			l.Dashes = []vg.Length{vg.Points(5), vg.Points(3)}
			p.Add(l)
			p.Legend.Add("cavity prediction"+suffix, l)
		}
		sc, err := plotter.NewScatter(errPoints(s.Points))
		if err != nil {
			return nil, err
		}
		sc.GlyphStyle.Color = col
		sc.GlyphStyle.Shape = draw.CircleGlyph{}
		sc.GlyphStyle.Radius = vg.Points(2.5)
		eb, err := plotter.NewYErrorBars(errPoints(s.Points))
		if err != nil {
			return nil, err
		}
		eb.Color = col
		p.Add(sc, eb)
		p.Legend.Add("measured mean ± s.e."+suffix, sc)
	}
	if max := maxY(series); max > 0 {
		p.Y.Max = math.Min(1, max*1.1)
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

// WriteFile draws rows to path, SVG or PNG by its extension.
func WriteFile(path string, rows []sweepcsv.Row, title string) error {
	format := strings.TrimPrefix(strings.ToLower(filepath.Ext(path)), ".")
	if format != "svg" && format != "png" {
		return fmt.Errorf("plot: %s: want a .svg or .png file", path)
	}
	p, err := New(rows, title)
	if err != nil {
		return err
	}
	wt, err := p.WriterTo(6*vg.Inch, 4*vg.Inch, format)
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
