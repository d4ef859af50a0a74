package main

import (
	"time"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/textout"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/analysis"
)

var checkCmd = &command{
	name:    "check",
	summary: "judge a given actuator (and sensor) design: controllable or not, and what to fix",
	usage: `Usage: netsteer check [options] NET --inputs FILE [--outputs FILE]

Judges a given design by Lin's theorem (IEEE TAC 19(3), 1974): the network
with these inputs is structurally controllable exactly when every state is
reached from some input and there is no dilation, that is no set of states
whose in-neighbours, inputs included, number fewer than the states.

When the design fails, check names the states no input reaches and one
dilation (a set of states with its in-neighbours, one fewer than the
states: one more actuator is needed among them), the controllable dimension
(the generic dimension of the controllable subspace, Hosoe 1980: how many
independent state directions the design steers; not the term rank of
[A B], reported beside it), and the cheapest dedicated actuators that
complete the design (costs and allowed states from --node-table).

FILE holds one independent input per line; the names on a line are the
states that input drives (one name is a dedicated actuator). Names are
separated by white space or commas and may be double-quoted; lines starting
with '#' or '%' are comments. --outputs FILE judges a sensor design the same
way for structural observability (the dual, on the network with every edge
reversed); each line is one output and the states it senses.

--strong asks the stronger question: is the design controllable for every
value of the couplings, not only for almost all? The class is stated: every
listed coupling is nonzero (a coupling listed in --may-be-zero FILE may be
zero or not), every unlisted one exactly zero, and a state's own dynamics
that the file does not list is free (may be zero or not; --diagonal free,
the default), exactly zero or never zero. The test is exact for that class
(zero forcing: Monshizadeh, Zhang & Camlibel 2014; Jia, van Waarde,
Trentelman & Camlibel 2021) and linear in the network's size. When it
fails, check names the states where an uncontrollable mode can live and
prints a witness: integer values for the couplings, an eigenvalue and a
vector the inputs cannot move, confirmed in exact arithmetic.

--targets FILE judges the design for the listed states only: whether they
are steerable (target controllable: the generic rank of C[B, AB, ...], C
selecting them, equals their number), by proved upper and lower bounds,
exact when they meet (linking in the time-expanded network, Murota & Poljak
1990; disjoint paths, van der Woude 1991; an exact sample over GF(p)), and,
when not, which targets are out of reach and why.

Exit status: 0 when the design is controllable (and observable, with
--outputs; strongly, with --strong), 1 when not, 2 on error.

Example:
  netsteer check testdata/plant/heating.edges --inputs testdata/plant/heating-actuators.txt
  netsteer check --node-table testdata/plant/heating-nodes.csv -o check.json testdata/plant/heating.edges --inputs testdata/plant/heating-actuators.txt
  netsteer check --strong --diagonal zero testdata/plant/heating.edges --inputs testdata/plant/heating-actuators.txt
`,
	flags: func(e *env, fs *pflag.FlagSet) func([]string) error {
		var nf netFlags
		var of outFlags
		nf.register(e, fs)
		inputs := fs.String("inputs", "", "input design: one input per line, the states it drives")
		outputs := fs.String("outputs", "", "output design: one output per line, the states it senses")
		var sf strongFlags
		sf.register(fs, "also decide strong structural controllability (observability): for every value of the couplings")
		witness := fs.Int("witness-entries", 0, "with --strong, the largest witness to print, in matrix entries (default 100000)")
		var tf targetsFlag
		tf.register(fs)
		seed := fs.Uint64("seed", 1, "with --targets, seed of the samples that decide undecided bounds")
		of.register(fs)
		return func(args []string) error {
			path, err := oneArg(args)
			if err != nil {
				return err
			}
			if err := of.resolve(); err != nil {
				return err
			}
			if *inputs == "" && *outputs == "" {
				return usagef("give --inputs FILE (and/or --outputs FILE)")
			}
			if err := sf.check(); err != nil {
				return err
			}
			start := time.Now()
			in, err := nf.load(path, of.output, false, *inputs, *outputs, sf.mayBeZero, tf.file)
			if err != nil {
				return err
			}
			targets, err := tf.states(e, in)
			if err != nil {
				return err
			}
			req := analysis.CheckRequest{Actuators: in.devices(structural.Controllability), Sensors: in.devices(structural.Observability), WitnessEntries: *witness, Targets: targets, Seed: *seed}
			if req.Strong, err = sf.class(in); err != nil {
				return err
			}
			t0 := time.Now()
			if *inputs != "" {
				if req.Inputs, _, err = in.design(e, *inputs, structural.Controllability); err != nil {
					return err
				}
			}
			if *outputs != "" {
				if req.Outputs, _, err = in.design(e, *outputs, structural.Observability); err != nil {
					return err
				}
			}
			designT := time.Since(t0)
			e.status("checking (%d states, %d edges)", in.g.N(), in.g.Edges())
			r, err := analysis.Check(in.g, req)
			if err != nil {
				return err
			}
			r.File = path
			of.labels, of.groups = in.labelsGroups()
			if p := r.Controllability; p != nil {
				p.DesignFile = *inputs
			}
			if p := r.Observability; p != nil {
				p.DesignFile = *outputs
			}
			r.Timings.Prepend("design", designT)
			finish(&r.Timings, in, start)
			if err := of.write(e, textout.Check{R: r, Costed: in.table != nil}); err != nil {
				return err
			}
			if !r.Holds() {
				return errNo
			}
			return nil
		}
	},
}

func init() { register(checkCmd) }
