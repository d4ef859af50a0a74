package main

import (
	"bufio"
	"context"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"os/signal"
	"path/filepath"
	"slices"
	"strings"
	"syscall"
	"time"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/plot"
	"github.com/netsteer/netsteer/io/sweepcsv"
	"github.com/netsteer/netsteer/structural"
)

var sweepCmd = &command{
	name:    "sweep",
	summary: "driver fraction over a grid of model parameters or transforms, with cavity predictions",
	usage: `Usage: netsteer sweep --model MODEL [model options] [--transform NAME=VALUES ...] -o FILE
       netsteer sweep --base NET --transform NAME=VALUES [...] -o FILE
       netsteer sweep merge FILES... -o FILE

Measures the driver fraction N_D/N over every combination of the values
given, times --replicates, and writes one CSV row per network. Values are
single ("4"), lists ("1,2,5") or ranges start:stop:step with stop included
("1:7:1"). Model options are those of generate; transforms those of vary,
applied after generating, or to the network NET with --base.

Columns: model, nodes, mean_degree (2L/N of the network measured),
replicate, seed, edges, driver_count, driver_fraction, predicted_fraction,
seconds, params (the row's coordinates, transforms written +name=value) and
prediction_from: "model" when the cavity prediction (Liu, Slotine &
Barabasi 2011) uses the model's own degree distributions, "degrees" when it
uses the measured network's degree sequence (the degree-preserving
expectation).

A row's seed derives from --seed and its coordinates only, so rows do not
depend on --workers or sharding, and "netsteer generate MODEL ... --seed S"
rebuilds a row's network (without transforms). Rows already in FILE are
kept and not computed again: rerun an interrupted sweep to finish it.
--shard i/k (0 <= i < k) computes every k-th row from the i-th; "sweep
merge" combines the shards' files into the file a single run writes (only
seconds differ). --plot draws the measured means with error bars against
the predicted curve (.svg or .png).

Example:
  netsteer sweep --model er --nodes 20000 --mean-degree 1:7:1 --replicates 2 --seed 11 -o er.csv --plot er.svg
  netsteer sweep --base plant.edges --transform dropout=0:0.3:0.05 --replicates 5 -o dropout.csv
  netsteer sweep --model er --nodes 100000 --mean-degree 1:10:0.5 --shard 3/8 -o part3.csv
  netsteer sweep merge part*.csv -o all.csv
`,
	run: runSweep,
}

func init() { register(sweepCmd) }

func runSweep(e *env, c *command, fs *pflag.FlagSet, args []string) int {
	if len(args) > 0 && args[0] == "merge" {
		return runSweepMerge(e, c, fs, args[1:])
	}
	var mf modelFlags
	var nf netFlags
	var cf couplingFlags
	model := fs.String("model", "", "model to generate: er, scale-free, small-world, regular, grid or tree")
	base := fs.String("base", "", "sweep variants of this network instead of a model")
	mf.register(fs)
	nf.register(fs, e)
	cf.register(fs)
	specs := fs.StringArray("transform", nil, "NAME=VALUES, applied in order (repeatable)")
	replicates := fs.Int("replicates", 1, "networks per grid point")
	seed := fs.Uint64("seed", 1, "sweep seed; every row's seed derives from it")
	workers := fs.Int("workers", 0, "rows computed at once (default: one per core)")
	shard := fs.String("shard", "", "run only share i of k (i/k, 0 <= i < k)")
	output := fs.StringP("output", "o", "", "CSV file to write and resume (- for standard output)")
	plotPath := fs.String("plot", "", "also draw the rows to this .svg or .png file")
	noTiming := fs.Bool("no-timing", false, "write 0 in the seconds column, so that reruns give byte-identical files")
	if ok, st := parse(e, c, fs, args); !ok {
		return st
	}
	if fs.NArg() != 0 {
		return usageError(e, c, "unexpected argument %q", fs.Arg(0))
	}
	if (*model == "") == (*base == "") {
		return usageError(e, c, "give --model or --base (one of them)")
	}
	if *output == "" {
		return usageError(e, c, "-o FILE is required")
	}
	if *replicates < 1 {
		return usageError(e, c, "--replicates must be at least 1")
	}
	if *plotPath != "" {
		if ext := strings.ToLower(filepath.Ext(*plotPath)); ext != ".svg" && ext != ".png" {
			return usageError(e, c, "--plot %s: want a .svg or .png file", *plotPath)
		}
	}
	if !slices.Contains(structural.CouplingPatterns, cf.pattern) {
		return usageError(e, c, "--coupling %q: want %s", cf.pattern, strings.Join(structural.CouplingPatterns, ", "))
	}
	pl := &sweepcsv.Plan{Model: *model, Replicates: *replicates, Seed: *seed, Coupling: cf.coupling()}
	if *model != "" {
		axes, err := sweepcsv.ModelAxes(*model, mf.given())
		if err != nil {
			return usageError(e, c, "%s", strings.TrimPrefix(err.Error(), "sweepcsv: "))
		}
		pl.Axes = axes
	} else {
		if len(mf.given()) > 0 {
			return usageError(e, c, "model options do not apply to --base sweeps")
		}
		if len(*specs) == 0 {
			return usageError(e, c, "--base needs at least one --transform NAME=VALUES")
		}
	}
	for _, s := range *specs {
		ax, err := sweepcsv.TransformAxis(s)
		if err != nil {
			return usageError(e, c, "--transform: %s", strings.TrimPrefix(strings.TrimPrefix(err.Error(), "sweepcsv: "), "structural: "))
		}
		pl.Axes = append(pl.Axes, ax)
	}
	opt := sweepcsv.RunOptions{Output: *output, Stdout: e.Stdout, Workers: *workers, NoTiming: *noTiming}
	if *shard != "" {
		sh, err := sweepcsv.ParseShard(*shard)
		if err != nil {
			return usageError(e, c, "--shard: %s", strings.TrimPrefix(err.Error(), "sweepcsv: "))
		}
		opt.Shard = sh
	}
	if *base != "" {
		g, _, err := nf.load(*base, nil)
		if err != nil {
			return fail(e, err)
		}
		pl.Base, pl.BaseName = g, filepath.Base(*base)
	}
	if e.StderrIsTTY {
		opt.Progress = progressBar(e.Stderr)
	}
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt, syscall.SIGTERM)
	defer stop()
	res, err := pl.Run(ctx, opt)
	if opt.Progress != nil {
		fmt.Fprintln(e.Stderr)
	}
	if errors.Is(err, context.Canceled) {
		fmt.Fprintf(e.Stderr, "netsteer: interrupted; %d rows are saved in %s; run the same command again to finish\n", res.Computed+res.Skipped, *output)
		return exitError
	}
	if err != nil {
		return fail(e, err)
	}
	if *plotPath != "" {
		title := "driver fraction, model " + *model
		if *base != "" {
			title = "driver fraction, variants of " + filepath.Base(*base)
		}
		if err := plot.WriteFile(*plotPath, res.Rows, title); err != nil {
			return fail(e, err)
		}
	}
	if *output == "-" {
		return exitOK
	}
	return genFinish(e, writeSweepSummary(e.Stdout, *output, *plotPath, res))
}

// writeSweepSummary prints the answer first: measured mean against
// prediction at each grid point.
func writeSweepSummary(w io.Writer, path, plotPath string, res *sweepcsv.Result) error {
	bw := bufio.NewWriter(w)
	fmt.Fprintf(bw, "Wrote %d %s to %s (%d computed now, %d already there", len(res.Rows), plural(len(res.Rows), "row", "rows"), path, res.Computed, res.Skipped)
	if res.Share != 0 && res.Share != res.Computed+res.Skipped {
		fmt.Fprintf(bw, "; this share has %d", res.Share)
	}
	fmt.Fprintf(bw, ").\n")
	if plotPath != "" {
		fmt.Fprintf(bw, "Plot: %s\n", plotPath)
	}
	xName, series, err := plot.Aggregate(res.Rows)
	if err == nil {
		fmt.Fprintf(bw, "\n%-28s %10s %10s %10s %4s\n", strings.TrimPrefix(xName, "+"), "measured", "s.e.", "predicted", "reps")
		for _, s := range series {
			if s.Label != "" {
				fmt.Fprintf(bw, "%s\n", s.Label)
			}
			for _, p := range s.Points {
				pred := "-"
				if !math.IsNaN(p.Predicted) {
					pred = fmt.Sprintf("%.4f", p.Predicted)
				}
				fmt.Fprintf(bw, "%-28.6g %10.4f %10.4f %10s %4d\n", p.X, p.Mean, p.StdErr, pred, p.Replicates)
			}
		}
	}
	fmt.Fprintf(bw, "\n%s", caution)
	return bw.Flush()
}

// progressBar returns a progress callback drawing a bar on a terminal, at
// most ten times a second.
func progressBar(w io.Writer) func(done, total int) {
	var last time.Time
	start := time.Now()
	return func(done, total int) {
		if done < total && time.Since(last) < 100*time.Millisecond {
			return
		}
		last = time.Now()
		const width = 30
		fill := 0
		if total > 0 {
			fill = done * width / total
		}
		eta := ""
		if done > 0 && done < total {
			left := time.Duration(float64(time.Since(start)) / float64(done) * float64(total-done))
			eta = ", about " + left.Round(time.Second).String() + " left"
		}
		fmt.Fprintf(w, "\rsweep [%s%s] %d/%d rows%s   ", strings.Repeat("#", fill), strings.Repeat(".", width-fill), done, total, eta)
	}
}

func runSweepMerge(e *env, c *command, fs *pflag.FlagSet, args []string) int {
	output := fs.StringP("output", "o", "", "merged CSV file (- for standard output)")
	plotPath := fs.String("plot", "", "also draw the merged rows to this .svg or .png file")
	if ok, st := parse(e, c, fs, args); !ok {
		return st
	}
	if fs.NArg() == 0 {
		return usageError(e, c, "merge wants one or more sweep files")
	}
	if *output == "" {
		return usageError(e, c, "-o FILE is required")
	}
	rows, err := sweepcsv.MergeFiles(fs.Args()...)
	if err != nil {
		return fail(e, errors.New(strings.TrimPrefix(err.Error(), "sweepcsv: ")))
	}
	if err := sweepcsv.WriteFile(*output, rows, e.Stdout); err != nil {
		return fail(e, err)
	}
	if *plotPath != "" {
		if err := plot.WriteFile(*plotPath, rows, "driver fraction"); err != nil {
			return fail(e, err)
		}
	}
	if *output != "-" {
		fmt.Fprintf(e.Stdout, "Merged %d %s into %s: %d %s.\n", fs.NArg(), plural(fs.NArg(), "file", "files"), *output, len(rows), plural(len(rows), "row", "rows"))
	}
	return exitOK
}
