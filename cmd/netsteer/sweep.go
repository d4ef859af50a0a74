package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"os/signal"
	"path/filepath"
	"strings"
	"syscall"
	"time"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/fileout"
	"github.com/netsteer/netsteer/io/plot"
	"github.com/netsteer/netsteer/io/sweepcsv"
	"github.com/netsteer/netsteer/io/textout"
	"github.com/netsteer/netsteer/structural/sweep"
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
	flags: sweepFlags,
}

func init() {
	register(sweepCmd)
	register(&command{name: "sweep merge", usage: sweepCmd.usage, flags: sweepMergeFlags})
}

func sweepFlags(e *env, fs *pflag.FlagSet) func([]string) error {
	var mf modelFlags
	var nf netFlags
	var cf couplingFlags
	model := fs.String("model", "", "model to generate: er, scale-free, small-world, regular, grid or tree")
	base := fs.String("base", "", "sweep variants of this network instead of a model")
	mf.register(fs)
	nf.register(e, fs)
	cf.register(fs)
	specs := fs.StringArray("transform", nil, "NAME=VALUES, applied in order (repeatable)")
	replicates := fs.Int("replicates", 1, "networks per grid point")
	seed := fs.Uint64("seed", 1, "sweep seed; every row's seed derives from it")
	workers := fs.Int("workers", 0, "rows computed at once (default: one per core)")
	shard := fs.String("shard", "", "run only share i of k (i/k, 0 <= i < k)")
	output := fs.StringP("output", "o", "", "CSV file to write and resume (- for standard output)")
	plotPath := fs.String("plot", "", "also draw the rows to this .svg or .png file")
	noTiming := fs.Bool("no-timing", false, "write 0 in the seconds column, so that reruns give byte-identical files")
	plotLog := fs.String("plot-log", "", "logarithmic plot axes: x, y or xy")
	return func(args []string) error {
		switch {
		case len(args) != 0:
			return usagef("unexpected argument %q", args[0])
		case (*model == "") == (*base == ""):
			return usagef("give --model or --base (one of them)")
		case *output == "":
			return usagef("-o FILE is required")
		case isGzipName(*output):
			return refuseGzip("-o", *output, "the sweep file is plain CSV, which a rerun reads to resume")
		case *replicates < 1:
			return usagef("--replicates must be at least 1")
		}
		if err := checkPlot(*plotPath, *plotLog); err != nil {
			return err
		}
		if _, err := cf.transforms(nil); err != nil {
			return err // the coupling pattern is checked there
		}
		pl := &sweep.Plan{Model: *model, Replicates: *replicates, Seed: *seed}
		pl.Coupling.Pattern, pl.Coupling.TwoWay, pl.Coupling.States = cf.pattern, cf.twoWay, cf.states
		if *model != "" {
			axes, err := sweep.ModelAxes(*model, mf.given())
			if err != nil {
				return usagef("%s", describe(err))
			}
			pl.Axes = axes
		} else if len(mf.given()) > 0 {
			return usagef("model options do not apply to --base sweeps")
		} else if len(*specs) == 0 {
			return usagef("--base needs at least one --transform NAME=VALUES")
		}
		for _, s := range *specs {
			ax, err := sweep.TransformAxis(s)
			if err != nil {
				return usagef("--transform: %s", describe(err))
			}
			pl.Axes = append(pl.Axes, ax)
		}
		opt := sweep.RunOptions{Output: *output, Stdout: e.Stdout, Workers: *workers, NoTiming: *noTiming}
		if *shard != "" {
			var err error
			if opt.Shard, err = sweep.ParseShard(*shard); err != nil {
				return usagef("--shard: %s", describe(err))
			}
		}
		if *base != "" {
			in, err := nf.load(*base, *output, false)
			if err != nil {
				return err
			}
			pl.Base, pl.BaseName = in.g, filepath.Base(*base)
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
			return fmt.Errorf("interrupted; %d rows are saved in %s; run the same command again to finish", res.Computed+res.Skipped, *output)
		}
		if err != nil {
			return err
		}
		if *plotPath != "" {
			title := "driver fraction, model " + *model
			if *base != "" {
				title = "driver fraction, variants of " + filepath.Base(*base)
			}
			if err := plot.WriteFileWith(*plotPath, res.Rows, plotOptions(title, *plotLog)); err != nil {
				return err
			}
		}
		if *output == "-" {
			return nil
		}
		return writeSummary(e, "text", false, textout.Sweep{R: res, Output: *output, Plot: *plotPath})
	}
}

func checkPlot(path, log string) error {
	if path != "" {
		if ext := strings.ToLower(filepath.Ext(path)); ext != ".svg" && ext != ".png" {
			return usagef("--plot %s: want a .svg or .png file", path)
		}
	}
	if log != "" && log != "x" && log != "y" && log != "xy" {
		return usagef("--plot-log %q: want x, y or xy", log)
	}
	return nil
}

func plotOptions(title, log string) plot.Options {
	return plot.Options{Title: title, LogX: strings.Contains(log, "x"), LogY: strings.Contains(log, "y")}
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

func sweepMergeFlags(e *env, fs *pflag.FlagSet) func([]string) error {
	output := fs.StringP("output", "o", "", "merged CSV file (- for standard output)")
	plotPath := fs.String("plot", "", "also draw the merged rows to this .svg or .png file")
	plotLog := fs.String("plot-log", "", "logarithmic plot axes: x, y or xy")
	return func(args []string) error {
		if len(args) == 0 {
			return usagef("merge wants one or more sweep files")
		}
		if *output == "" {
			return usagef("-o FILE is required")
		}
		if err := refuseGzip("-o", *output, "the merged file is plain CSV"); err != nil {
			return err
		}
		if err := checkPlot(*plotPath, *plotLog); err != nil {
			return err
		}
		if in := fileout.SameFile(*output, args...); in != "" {
			return usagef("-o %s would overwrite %s, which this command reads", *output, in)
		}
		rows, err := sweep.MergeFiles(args...)
		if err != nil {
			return err
		}
		if err := sweepcsv.WriteFile(*output, rows, e.Stdout); err != nil {
			return err
		}
		if *plotPath != "" {
			if err := plot.WriteFileWith(*plotPath, rows, plotOptions("driver fraction", *plotLog)); err != nil {
				return err
			}
		}
		if *output != "-" {
			fmt.Fprintf(e.Stdout, "Merged %d %s into %s: %d %s.\n", len(args), plural(len(args), "file", "files"), *output, len(rows), plural(len(rows), "row", "rows"))
		}
		return nil
	}
}
