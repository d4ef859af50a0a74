package main

import (
	"fmt"
	"time"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/textout"
	"github.com/netsteer/netsteer/structural/analysis"
)

var driversCmd = &command{
	name:    "drivers",
	summary: "fewest independent signals that control the network, and where they go",
	usage: `Usage: netsteer drivers [options] NET

Finds the minimum number of independent control signals N_D = max(N - |M*|, 1)
(Liu, Slotine & Barabasi 2011), where |M*| is the size of a maximum matching,
and one set of driver nodes that achieves it. Source components that hold no
driver are wired to an existing signal, so the listed inputs form a complete
structurally controllable design (Lin's theorem) with exactly N_D signals.

--roles classifies every state across all minimum driver sets (Jia et al.,
Nat. Commun. 2013): critical (in every one: exactly the states no edge
enters), intermittent (in some) or redundant (in none); and every edge across
all maximum matchings (Liu et al. 2011): critical (in every one), ordinary
or redundant (in none). Linear time after the one matching.

--targets FILE asks only for the states listed (zone temperatures, bus
voltages...): the fewest signals that make them steerable (the generic rank
of C[B, AB, ...], C selecting them, equals their number). Choosing them is
NP-hard (Czeizler et al. 2018): netsteer compares full control of the part
that acts on the targets, a stem-cycle cover, the greedy of Gao et al.
(Nat. Commun. 2014) and, on small networks, an exhaustive search, and
reports a lower bound and the saving against full control.

NET is a network file (see "netsteer help formats"); - reads standard input.

Example:
  netsteer drivers testdata/plant/heating.edges
  netsteer drivers --roles testdata/plant/heating.edges
  netsteer drivers -o drivers.json big.edges.gz
  netsteer drivers --targets testdata/plant/heating-rooms.txt testdata/plant/heating.edges
`,
	flags: func(e *env, fs *pflag.FlagSet) func([]string) error {
		var nf netFlags
		var of outFlags
		nf.register(e, fs)
		of.register(fs)
		timings := fs.Bool("timings", false, "print stage times on standard error")
		roles := fs.Bool("roles", false, "classify states (critical, intermittent, redundant) and edges (critical, ordinary, redundant)")
		var tf targetsFlag
		tf.register(fs)
		seed := fs.Uint64("seed", 1, "with --targets, seed of the samples that confirm a choice")
		return func(args []string) error {
			path, err := oneArg(args)
			if err != nil {
				return err
			}
			if err := of.resolve(); err != nil {
				return err
			}
			start := time.Now()
			in, err := nf.load(path, of.output, false, tf.file)
			if err != nil {
				return err
			}
			targets, err := tf.states(e, in)
			if err != nil {
				return err
			}
			e.status("matching and components (%d states, %d edges)", in.g.N(), in.g.Edges())
			r, err := analysis.Drivers(in.g, analysis.DriversRequest{Roles: *roles, Targets: targets, Seed: *seed})
			e.status("")
			if err != nil {
				return err
			}
			r.File = path
			of.labels, of.groups = in.labelsGroups()
			finish(&r.Timings, in, start)
			if err := of.write(e, textout.Drivers{R: r}); err != nil {
				return err
			}
			if *timings && of.format == "text" {
				printTimings(e, r.Timings)
			}
			return nil
		}
	},
}

func init() { register(driversCmd) }

// finish adds the reading time first and the total last.
func finish(t *analysis.Timings, in *input, start time.Time) {
	t.Prepend("read", in.readT)
	*t = append(*t, analysis.Stage{Name: "total", Seconds: time.Since(start).Seconds()})
}

func printTimings(e *env, t analysis.Timings) {
	s := "timings (s):"
	for i, x := range t {
		if i > 0 {
			s += ","
		}
		s += fmt.Sprintf(" %s %.3f", x.Name, x.Seconds)
	}
	fmt.Fprintln(e.Stderr, s)
}
