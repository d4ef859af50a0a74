package sweep

import (
	"context"
	"fmt"
	"io"
	"math"
	"os"
	"runtime"
	"strconv"
	"time"

	"github.com/netsteer/netsteer/io/fileout"

	"github.com/netsteer/netsteer/io/sweepcsv"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/gen"
	"github.com/netsteer/netsteer/structural/transform"
)

// Compute builds the network of point p (generated from the model, or the
// base network) with p's transforms applied in order, all randomness drawn
// from gen.NewRand(p.Seed), and measures it.
func (pl *Plan) Compute(p Point) (sweepcsv.Row, error) {
	start := time.Now()
	rng := gen.NewRand(p.Seed)
	row := sweepcsv.Row{Model: p.Model, Params: p.Params, Replicate: p.Replicate, Seed: p.Seed, PredictedFraction: math.NaN()}
	var g *structural.Network
	var params gen.Params
	transforms := 0
	for _, c := range p.Coords {
		if c.Transform {
			transforms++
		}
	}
	if pl.Model != "" {
		vals := map[string]string{}
		for _, c := range p.Coords {
			if !c.Transform {
				vals[c.Name] = c.Values[0]
			}
		}
		var err error
		if params, err = gen.FromSettings(pl.Model, vals); err != nil {
			return row, err
		}
		if g, err = params.Network(rng); err != nil {
			return row, err
		}
	} else {
		if pl.Base == nil {
			return row, errorf("a plan needs a model or a base network")
		}
		g = pl.Base
	}
	for _, c := range p.Coords {
		if !c.Transform {
			continue
		}
		v, _ := strconv.ParseFloat(c.Values[0], 64)
		t := transform.Transform{Name: c.Name, Value: v, Coupling: pl.Coupling}
		var err error
		if g, err = t.Apply(g, rng); err != nil {
			return row, err
		}
	}
	m := g.Matching()
	n := g.N()
	row.Nodes = n
	row.Edges = int64(g.Edges())
	row.MeanDegree = 2 * float64(g.Edges()) / float64(n)
	row.DriverCount = max(n-m.Size, 1)
	row.DriverFraction = float64(row.DriverCount) / float64(n)
	if out, in, ok := params.Distributions(); pl.Model != "" && transforms == 0 && ok {
		if v, err := structural.CavityDriverFraction(out, in); err == nil {
			row.PredictedFraction, row.PredictionFrom = v, "model"
		}
	}
	if row.PredictionFrom == "" {
		if v, err := structural.ExpectedDriverFraction(g); err == nil {
			row.PredictedFraction, row.PredictionFrom = v, "degrees"
		}
	}
	row.Seconds = time.Since(start).Seconds()
	return row, nil
}

// RunOptions control Run.
type RunOptions struct {
	// Output is the sweep file: rows already in it are kept and not
	// computed again, and it is rewritten (atomically) as rows complete.
	// "" or "-" writes the rows to Stdout at the end instead.
	Output string
	Stdout io.Writer
	// Workers is the number of rows computed at once; 0 means GOMAXPROCS.
	Workers int
	// Shard limits the run to a share of the points.
	Shard Shard
	// Progress, when set, is called with rows done and rows in the share
	// after every row.
	Progress func(done, total int)
	// Checkpoint is the least time between rewrites of Output; 0 means
	// one second.
	Checkpoint time.Duration
	// NoTiming writes 0 seconds in every new row, so that reruns give
	// byte-identical files.
	NoTiming bool
}

// Result reports a run.
type Result struct {
	// Rows are all the rows of the output, in canonical order.
	Rows []sweepcsv.Row
	// Computed rows were measured by this run; Skipped ones were in the
	// output already; Share is the number of points in the shard.
	Computed, Skipped, Share int
}

// Run computes the plan's points of the shard that Output does not hold
// yet, in parallel, and writes all rows to Output. When ctx is cancelled it
// writes the rows done so far and returns ctx's error; running it again
// finishes the sweep, giving the file an uninterrupted run gives.
func (pl *Plan) Run(ctx context.Context, opt RunOptions) (*Result, error) {
	if pl.Replicates < 1 {
		return nil, errorf("replicates must be at least 1")
	}
	if err := pl.checkSize(); err != nil {
		return nil, err
	}
	toFile := opt.Output != "" && opt.Output != "-"
	if toFile {
		// One sweep writes an output at a time: a second one on the same
		// file would drop the first one's rows.
		lk, err := fileout.LockFile(opt.Output)
		if err != nil {
			return nil, err
		}
		defer lk.Unlock()
	}
	var have []sweepcsv.Row
	if toFile && fileExists(opt.Output) {
		rows, err := sweepcsv.ReadFile(opt.Output)
		if err != nil {
			return nil, err
		}
		have = rows
	}
	done := map[string]uint64{}
	for _, r := range have {
		done[r.Key()] = r.Seed
	}
	res := &Result{}
	var todo []Point
	for _, p := range pl.Points() {
		if !opt.Shard.Has(p.Index) {
			continue
		}
		res.Share++
		if s, ok := done[p.Key()]; ok {
			if s != p.Seed {
				return nil, &SeedError{File: opt.Output, Row: p.describe(), Have: s, Want: p.Seed}
			}
			res.Skipped++
			continue
		}
		todo = append(todo, p)
	}
	if pl.Model != "" {
		// Catch bad parameter combinations before any work.
		checked := map[string]bool{}
		for _, p := range todo {
			if checked[p.Params] {
				continue
			}
			checked[p.Params] = true
			vals := map[string]string{}
			for _, c := range p.Coords {
				if !c.Transform {
					vals[c.Name] = c.Values[0]
				}
			}
			if _, err := gen.FromSettings(pl.Model, vals); err != nil {
				return nil, errorf("grid point %s: %w", p.Params, err)
			}
		}
	}
	rows := append([]sweepcsv.Row(nil), have...)
	workers := opt.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	workers = min(workers, max(len(todo), 1))
	every := opt.Checkpoint
	if every <= 0 {
		every = time.Second
	}
	type result struct {
		row sweepcsv.Row
		err error
		key string
	}
	// Write what there is now, so that an output that cannot be written
	// is reported before the first row is computed, not after.
	if toFile {
		if err := sweepcsv.WriteFile(opt.Output, append([]sweepcsv.Row(nil), rows...), nil); err != nil {
			return nil, err
		}
	}
	jobs := make(chan Point)
	results := make(chan result, len(todo)+1)
	stop := make(chan struct{})
	for w := 0; w < workers; w++ {
		go func() {
			for p := range jobs {
				row, err := pl.Compute(p)
				results <- result{row, err, p.describe()}
			}
		}()
	}
	go func() {
		defer close(jobs)
		for _, p := range todo {
			select {
			case jobs <- p:
			case <-stop:
				return
			case <-ctx.Done():
				return
			}
		}
	}()
	checkpoint := func() error {
		if !toFile {
			return nil
		}
		return sweepcsv.WriteFile(opt.Output, append([]sweepcsv.Row(nil), rows...), nil)
	}
	last := time.Now()
	if opt.Progress != nil {
		opt.Progress(res.Skipped, res.Share)
	}
	for i := 0; i < len(todo); i++ {
		// A cancellation seen here wins over rows still arriving, so that
		// a run stops at the row where it was interrupted.
		if ctx.Err() != nil {
			close(stop)
			if err := checkpoint(); err != nil {
				return nil, err
			}
			return res, ctx.Err()
		}
		select {
		case <-ctx.Done():
			close(stop)
			if err := checkpoint(); err != nil {
				return nil, err
			}
			return res, ctx.Err()
		case r := <-results:
			if r.err != nil {
				close(stop)
				if err := checkpoint(); err != nil {
					return nil, err
				}
				return nil, errorf("row %s: %w", r.key, r.err)
			}
			if opt.NoTiming {
				r.row.Seconds = 0
			}
			rows = append(rows, r.row)
			res.Computed++
			if opt.Progress != nil {
				opt.Progress(res.Skipped+res.Computed, res.Share)
			}
			if time.Since(last) >= every {
				if err := checkpoint(); err != nil {
					close(stop)
					return nil, err
				}
				last = time.Now()
			}
		}
	}
	close(stop)
	sweepcsv.Sort(rows)
	res.Rows = rows
	if toFile {
		return res, sweepcsv.WriteFile(opt.Output, append([]sweepcsv.Row(nil), rows...), nil)
	}
	return res, sweepcsv.WriteFile("-", append([]sweepcsv.Row(nil), rows...), opt.Stdout)
}

// describe names a point for messages: model, coordinates, replicate.
func (p *Point) describe() string {
	return fmt.Sprintf("(model %s, %s, replicate %d)", p.Model, p.Params, p.Replicate)
}

func fileExists(path string) bool {
	_, err := os.Stat(path)
	return err == nil
}

// SeedError reports an output file holding a row of the plan computed from
// another sweep seed: resuming into it would mix two sweeps.
type SeedError struct {
	File string
	Row  string // the row, as (model MODEL, PARAMS, replicate R)
	Have uint64 // the seed in the file
	Want uint64 // the seed of the plan
}

func (e *SeedError) Error() string {
	return fmt.Sprintf("sweep: %s holds row %s with seed %d, not %d: it comes from a sweep with another seed; choose another output file", e.File, e.Row, e.Have, e.Want)
}
