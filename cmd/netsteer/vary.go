package main

import (
	"slices"
	"strings"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/fileout"
	"github.com/netsteer/netsteer/io/netwrite"
	"github.com/netsteer/netsteer/io/textout"
	"github.com/netsteer/netsteer/structural/analysis"
	"github.com/netsteer/netsteer/structural/transform"
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

Edge weights are kept: an edge that stays keeps its weight, and a moved
edge (swap, rewire) takes its weight along to its new place. Edges the
transforms add (loops, the couplings of replicate) get weight 1, a value
of no physical meaning; with a weighted network, a warning says so, and
the weights of moved edges are warned about likewise.

Example:
  netsteer vary plant.edges --transform swap=10 --seed 3 -o plant-random.edges
  netsteer vary unit.edges --transform replicate=4 --coupling ring --coupling-states outlet -o fleet.edges
`,
	flags: varyFlags,
}

func init() { register(varyCmd) }

// couplingFlags set how replicate links copies.
type couplingFlags struct {
	pattern string
	twoWay  bool
	states  []string
}

func (c *couplingFlags) register(fs *pflag.FlagSet) {
	fs.StringVar(&c.pattern, "coupling", "chain", "how replicate couples copies: "+strings.Join(transform.CouplingPatterns, ", "))
	fs.BoolVar(&c.twoWay, "coupling-two-way", false, "couple copies both ways (chain, ring, star)")
	fs.StringSliceVar(&c.states, "coupling-states", nil, "states that couple to their own copies (default: every state)")
}

// transforms parses the --transform specs with the coupling.
func (c *couplingFlags) transforms(specs []string) ([]transform.Transform, error) {
	if !slices.Contains(transform.CouplingPatterns, c.pattern) {
		return nil, usagef("--coupling %q: want %s", c.pattern, strings.Join(transform.CouplingPatterns, ", "))
	}
	var ts []transform.Transform
	for _, s := range specs {
		t, err := transform.Parse(s)
		if err != nil {
			return nil, usagef("--transform: %s", describe(err))
		}
		t.Coupling = transform.Coupling{Pattern: c.pattern, TwoWay: c.twoWay, States: c.states}
		ts = append(ts, t)
	}
	return ts, nil
}

func varyFlags(e *env, fs *pflag.FlagSet) func([]string) error {
	var nf netFlags
	var cf couplingFlags
	var nw netOut
	nf.register(e, fs)
	cf.register(fs)
	specs := fs.StringArray("transform", nil, "NAME=VALUE, applied in order (repeatable)")
	seed := fs.Uint64("seed", 1, "random seed")
	nw.register(fs)
	sf := summaryFlags(fs)
	return func(args []string) error {
		path, err := oneArg(args)
		if err != nil {
			return err
		}
		if len(*specs) == 0 {
			return usagef("give at least one --transform NAME=VALUE")
		}
		if err := nw.check(); err != nil {
			return err
		}
		format, err := sf()
		if err != nil {
			return err
		}
		ts, err := cf.transforms(*specs)
		if err != nil {
			return err
		}
		if nt := nw.nodeTablePath(); nt != "" {
			if in := fileout.SameFile(nt, path, nf.nodeTable); in != "" {
				return usagef("%s would overwrite %s, which this command reads", nt, in)
			}
		}
		in, err := nf.load(path, nw.output, true)
		if err != nil {
			return err
		}
		if in.g.Weighted() {
			warnWeights(e, ts)
		}
		r, err := analysis.Vary(in.g, analysis.VaryRequest{Transforms: ts, Seed: *seed})
		if err != nil {
			return err
		}
		r.File = path
		written, err := netwrite.WriteFile(nw.output, r.Variant, netwrite.Options{Stdout: e.Stdout, NodeTable: nw.nodeTable, Format: nw.format()})
		if err != nil {
			return err
		}
		r.Output, r.NodeTable = written.Network, written.NodeTable
		mtx := written.Format == netwrite.MatrixMarket && !netwrite.NamesAreIndices(r.Variant)
		return writeSummary(e, format, nw.output == "-", textout.Vary{R: r, IndexedMTX: mtx})
	}
}

// warnWeights says which transforms give the variant's weights no meaning
// of the original's: added edges get weight 1, moved edges keep theirs.
func warnWeights(e *env, ts []transform.Transform) {
	for _, t := range ts {
		switch t.Name {
		case "loops":
			e.warn("%s: the self-loops added get weight 1", t)
		case "replicate":
			e.warn("%s: the coupling edges between copies get weight 1", t)
		case "swap", "rewire":
			e.warn("%s: a moved edge keeps its weight at its new place", t)
		}
	}
}
