package main

import (
	"bufio"
	"encoding/csv"
	"fmt"
	"slices"
	"strconv"
	"strings"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/netwrite"
	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/gen"
)

var varyCmd = &command{
	name:    "vary",
	summary: "write a variant of a network: randomised, thinned, attacked, looped or replicated",
	usage: `Usage: netsteer vary NET --transform NAME=VALUE [--transform ...] -o FILE

Applies transforms to the network NET in the order given and writes the
result like generate does (edge list plus node table, or .mtx). The summary
compares the driver nodes before and after, and the degree-preserving
expectation (the cavity prediction for the variant's own degree sequence).

Transforms:
  swap=Q       degree-preserving randomisation: Q edge swaps attempted per
               edge (a->b, c->d become a->d, c->b; Maslov & Sneppen 2002);
               every in- and out-degree is kept; 10 or more mixes well
  rewire=P     move each edge with probability P to a random place (N and
               L kept, degrees not)
  dropout=P    remove each edge with probability P (random failures)
  remove=F     remove a fraction F of the states at random, with their edges
  attack=F     remove the fraction F of states of highest total degree
  loops=P      give each state a self-loop with probability P
  replicate=K  K copies of the whole network (state s of copy j is "s@j"),
               coupled as --coupling says

Example:
  netsteer vary plant.edges --transform swap=10 --seed 3 -o plant-random.edges
  netsteer vary unit.edges --transform replicate=4 --coupling ring --coupling-states outlet -o fleet.edges
`,
	run: runVary,
}

func init() { register(varyCmd) }

// couplingFlags set how replicate links copies.
type couplingFlags struct {
	pattern string
	twoWay  bool
	states  []string
}

func (c *couplingFlags) register(fs *pflag.FlagSet) {
	fs.StringVar(&c.pattern, "coupling", "chain", "how replicate couples copies: "+strings.Join(structural.CouplingPatterns, ", "))
	fs.BoolVar(&c.twoWay, "coupling-two-way", false, "couple copies both ways (chain, ring, star)")
	fs.StringSliceVar(&c.states, "coupling-states", nil, "states that couple to their own copies (default: every state)")
}

func (c *couplingFlags) coupling() structural.Coupling {
	return structural.Coupling{Pattern: c.pattern, TwoWay: c.twoWay, States: c.states}
}

func runVary(e *env, c *command, fs *pflag.FlagSet, args []string) int {
	var nf netFlags
	var cf couplingFlags
	nf.register(fs, e)
	cf.register(fs)
	specs := fs.StringArray("transform", nil, "NAME=VALUE, applied in order (repeatable)")
	seed := fs.Uint64("seed", 1, "random seed")
	output := fs.StringP("output", "o", "", "network file to write (- for standard output)")
	outFormat := fs.String("output-format", "", "network file format: edges or mtx (default: from the file name)")
	nodeTable := fs.String("output-node-table", "", "where the node table goes (default: beside the edge list)")
	format := fs.String("format", "text", "summary format: text, json or csv")
	if ok, st := parse(e, c, fs, args); !ok {
		return st
	}
	if fs.NArg() != 1 {
		return usageError(e, c, "want one network file, got %d arguments", fs.NArg())
	}
	if len(*specs) == 0 {
		return usageError(e, c, "give at least one --transform NAME=VALUE")
	}
	if *output == "" {
		return usageError(e, c, "-o FILE is required")
	}
	if err := (&outFlags{format: *format}).check(); err != nil {
		return usageError(e, c, "%v", err)
	}
	if !slices.Contains(structural.CouplingPatterns, cf.pattern) {
		return usageError(e, c, "--coupling %q: want %s", cf.pattern, strings.Join(structural.CouplingPatterns, ", "))
	}
	var ts []structural.Transform
	for _, s := range *specs {
		t, err := structural.ParseTransform(s)
		if err != nil {
			return usageError(e, c, "--transform: %s", strings.TrimPrefix(err.Error(), "structural: "))
		}
		t.Coupling = cf.coupling()
		ts = append(ts, t)
	}
	opt := netwrite.Options{Stdout: e.Stdout, NodeTable: *nodeTable}
	if *outFormat != "" {
		f, err := netwrite.ParseFormat(*outFormat)
		if err != nil {
			return usageError(e, c, "--output-format: %v", err)
		}
		opt.Format = f
	}
	if (opt.Format == netwrite.MatrixMarket || opt.Format == "" && netwrite.FormatOf(*output) == netwrite.MatrixMarket) && *nodeTable != "" {
		return usageError(e, c, "--output-node-table goes with an edge list; a Matrix Market file keeps N in its size line")
	}
	path := fs.Arg(0)
	nt := *nodeTable
	if nt == "" && *output != "-" {
		nt = netwrite.NodeTablePath(*output)
	}
	for _, out := range []string{*output, nt} {
		if err := overwritesInput(out, path, nf.nodeTable); err != nil {
			return usageError(e, c, "%v", err)
		}
	}
	g, _, err := nf.load(path, nil)
	if err != nil {
		return fail(e, err)
	}
	rng := gen.NewRand(*seed)
	h := g
	for _, t := range ts {
		if h, err = t.Apply(h, rng); err != nil {
			return fail(e, err)
		}
	}
	written, err := netwrite.WriteFile(*output, h, opt)
	if err != nil {
		return fail(e, err)
	}
	before := driverCount(g)
	after := driverCount(h)
	expect, _ := structural.ExpectedDriverFraction(h)
	w := e.Stdout
	if *output == "-" {
		w = e.Stderr
	}
	bw := bufio.NewWriter(w)
	if *format == "csv" {
		cw := csv.NewWriter(bw)
		cw.Write([]string{"file", "transforms", "seed", "output", "node_table", "nodes_before", "edges_before", "driver_count_before",
			"nodes", "edges", "driver_count", "driver_fraction", "predicted_fraction"})
		cw.Write([]string{path, strings.Join(*specs, ";"), strconv.FormatUint(*seed, 10), written.Network, written.NodeTable,
			strconv.Itoa(g.N()), strconv.Itoa(g.Edges()), strconv.Itoa(before),
			strconv.Itoa(h.N()), strconv.Itoa(h.Edges()), strconv.Itoa(after),
			strconv.FormatFloat(float64(after)/float64(h.N()), 'g', -1, 64), strconv.FormatFloat(expect, 'g', 10, 64)})
		cw.Flush()
		if err := cw.Error(); err != nil {
			return fail(e, err)
		}
		return genFinish(e, bw.Flush())
	}
	if *format == "json" {
		j := newJSON(bw)
		j.val("file", path)
		j.val("transforms", *specs)
		j.val("seed", *seed)
		j.val("output", written.Network)
		j.val("node_table", written.NodeTable)
		j.int("nodes_before", g.N())
		j.int("edges_before", g.Edges())
		j.int("driver_count_before", before)
		j.int("nodes", h.N())
		j.int("edges", h.Edges())
		j.int("driver_count", after)
		j.float("driver_fraction", float64(after)/float64(h.N()))
		j.float("predicted_fraction", expect)
		return genFinish(e, j.end())
	}
	fmt.Fprintf(bw, "The variant needs %d independent control %s for %s (driver fraction %.4f); %s needed %d for %d.\n",
		after, plural(after, "signal", "signals"), count(h.N(), "state", "states"), float64(after)/float64(h.N()), path, before, g.N())
	fmt.Fprintf(bw, "Degree-preserving expectation for the variant: %.4f (cavity prediction for its degree sequence).\n", expect)
	fmt.Fprintf(bw, "Wrote %s: %s, %s (was %d and %d)", written.Network, count(h.N(), "state", "states"), count(h.Edges(), "edge", "edges"), g.N(), g.Edges())
	if written.NodeTable != "" {
		fmt.Fprintf(bw, "; node table %s", written.NodeTable)
	}
	fmt.Fprintf(bw, ".\n")
	if written.Format == netwrite.MatrixMarket && !netwrite.NamesAreIndices(h) {
		fmt.Fprintf(bw, "Matrix Market numbers the states 1..%d; their names are in the file's comment lines \"%% state I NAME\".\n", h.N())
	}
	fmt.Fprintf(bw, "\ntransforms: %s; seed %d\n\n%s", strings.Join(*specs, ", "), *seed, caution)
	return genFinish(e, bw.Flush())
}

// driverCount returns N_D = max(N - |M*|, 1).
func driverCount(g *structural.Network) int {
	m := matching.Maximum(&g.Out, &g.In)
	return max(g.N()-m.Size, 1)
}
