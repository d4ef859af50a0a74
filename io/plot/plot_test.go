package plot

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/io/sweepcsv"
)

func rows() []sweepcsv.Row {
	mk := func(params string, rep int, meas, pred float64) sweepcsv.Row {
		return sweepcsv.Row{Model: "er", Params: params, Replicate: rep, DriverFraction: meas, PredictedFraction: pred}
	}
	return []sweepcsv.Row{
		mk("nodes=100;mean_degree=2", 1, 0.40, 0.45),
		mk("nodes=100;mean_degree=2", 2, 0.50, 0.45),
		mk("nodes=100;mean_degree=1", 1, 0.60, 0.65),
		mk("nodes=200;mean_degree=1", 1, 0.70, math.NaN()),
	}
}

// Means and standard errors by hand: at <k> = 2, (0.4 + 0.5)/2 = 0.45 and
// s.e. = sd/sqrt(2) = 0.0707.../1.414... = 0.05.
func TestAggregate(t *testing.T) {
	x, series, err := Aggregate(rows())
	if err != nil {
		t.Fatal(err)
	}
	if x != "nodes" {
		t.Fatalf("x axis %q, want nodes (the first coordinate that varies)", x)
	}
	x, series, err = Aggregate(rows()[:3])
	if err != nil || x != "mean_degree" || len(series) != 1 {
		t.Fatalf("got %q, %d series, %v", x, len(series), err)
	}
	pts := series[0].Points
	if len(pts) != 2 || pts[0].X != 1 || pts[1].X != 2 {
		t.Fatalf("points %+v", pts)
	}
	if math.Abs(pts[1].Mean-0.45) > 1e-12 || math.Abs(pts[1].StdErr-0.05) > 1e-12 || pts[1].Predicted != 0.45 || pts[1].Replicates != 2 {
		t.Errorf("<k>=2: got %+v, want mean 0.45, s.e. 0.05, predicted 0.45", pts[1])
	}
	_, series, _ = Aggregate(rows())
	if len(series) != 2 || series[0].Label != "mean_degree=2" {
		t.Errorf("series %+v, want one per mean degree", series)
	}
}

func TestWriteFile(t *testing.T) {
	dir := t.TempDir()
	svg := filepath.Join(dir, "p.svg")
	if err := WriteFile(svg, rows()[:3], "test"); err != nil {
		t.Fatal(err)
	}
	b, _ := os.ReadFile(svg)
	for _, want := range []string{"driver fraction n_D = N_D/N (driver nodes per state)", "mean degree &lt;k&gt; = 2L/N (edges per state)", "cavity prediction"} {
		if !strings.Contains(string(b), want) {
			t.Errorf("svg lacks %q", want)
		}
	}
	png := filepath.Join(dir, "p.png")
	if err := WriteFile(png, rows()[:3], "test"); err != nil {
		t.Fatal(err)
	}
	if b, _ := os.ReadFile(png); len(b) < 8 || string(b[1:4]) != "PNG" {
		t.Error("not a PNG file")
	}
	if err := WriteFile(filepath.Join(dir, "p.gif"), rows(), ""); err == nil {
		t.Error(".gif: got no error")
	}
}

// TestDescribeAndStyle: the subtitle names the model, N, the fixed
// parameters and the replicates per point; the SVG is set in a sans-serif
// face, sized 16:9, and draws each series with its own colour; a log axis
// leaves out points at zero.
func TestDescribeAndStyle(t *testing.T) {
	rs := rows()[:3]
	for i := range rs {
		rs[i].Nodes = 100
	}
	if got, want := Describe(rs), "model er; N = 100; 1-2 replicates per point"; got != want {
		t.Errorf("Describe = %q, want %q", got, want)
	}
	dir := t.TempDir()
	svg := filepath.Join(dir, "p.svg")
	all := rows()
	if err := WriteFileWith(svg, all, Options{Title: "driver fraction", LogX: true, LogY: true}); err != nil {
		t.Fatal(err)
	}
	b, _ := os.ReadFile(svg)
	s := string(b)
	if !strings.Contains(s, "Liberation Sans") || strings.Contains(s, "Liberation Serif") {
		t.Errorf("plot not set in a sans-serif face")
	}
	if !strings.Contains(s, `width="720pt" height="405pt"`) {
		t.Errorf("plot not at slide size: %.200s", s)
	}
	for _, c := range []string{"#0072B2", "#D55E00"} {
		if !strings.Contains(s, c) {
			t.Errorf("series colour %s missing", c)
		}
	}
	for _, want := range []string{"theory: cavity prediction", "measured mean ± 1 s.e."} {
		if !strings.Contains(s, want) {
			t.Errorf("legend lacks %q", want)
		}
	}
}
