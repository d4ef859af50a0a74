package textout

import (
	"fmt"
	"io"
	"math"
	"strings"

	"github.com/netsteer/netsteer/io/plot"
	"github.com/netsteer/netsteer/io/sweepcsv"
	"github.com/netsteer/netsteer/structural/sweep"
)

// Sweep is the summary of a sweep run: the measured mean against the
// prediction at each grid point. The rows themselves are the CSV file.
type Sweep struct {
	R            *sweep.Result
	Output, Plot string
}

// Value returns the result, for JSON.
func (s Sweep) Value() any { return s.R }

// CSV is not offered: the sweep's CSV file is its output.
func (s Sweep) CSV(w io.Writer) error { return sweepcsv.Write(w, s.R.Rows) }

// Text writes the row counts first, then the table of grid points.
func (s Sweep) Text(w io.Writer, o Options) error {
	res := s.R
	t := newTW(w, o)
	head := fmt.Sprintf("Wrote %s to %s (%d computed now, %d already there", count(len(res.Rows), "row", "rows"), s.Output, res.Computed, res.Skipped)
	if res.Share != 0 && res.Share != res.Computed+res.Skipped {
		head += fmt.Sprintf("; this share has %d", res.Share)
	}
	t.p("  ", "%s).", head)
	if s.Plot != "" {
		t.p("  ", "Plot: %s", s.Plot)
	}
	xName, series, err := plot.Aggregate(res.Rows)
	if err == nil {
		t.raw(fmt.Sprintf("\n%-28s %10s %10s %10s %4s\n", strings.TrimPrefix(xName, "+"), "measured", "s.e.", "predicted", "reps"))
		for _, sr := range series {
			if sr.Label != "" {
				t.raw(sr.Label + "\n")
			}
			for _, p := range sr.Points {
				pred := "-"
				if !math.IsNaN(p.Predicted) {
					pred = fmt.Sprintf("%.4f", p.Predicted)
				}
				t.raw(fmt.Sprintf("%-28.6g %10.4f %10.4f %10s %4d\n", p.X, p.Mean, p.StdErr, pred, p.Replicates))
			}
		}
	}
	return t.done()
}
