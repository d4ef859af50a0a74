package main

import (
	"time"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/textout"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/analysis"
)

var failuresCmd = &command{
	name:    "failures",
	summary: "what the loss of one device, link or state does to a design",
	usage: `Usage: netsteer failures [options] NET --inputs FILE [--outputs FILE]

A design review asks what happens if an actuator or sensor fails, or a link
is cut. failures judges every single loss of a design that works, each by
Lin's two conditions: the states no signal reaches any more, and whether a
dilation opens.

Each device (a line of the design file) is classified after Commault, Dion
& Trinh (IEEE TAC 53(6), 2008), for each condition and overall: essential (its
loss alone breaks the design: the states it leaves unreached or the
dilation it opens, and the cheapest replacement, honouring --node-table),
useful (it matters once some other devices are lost too; --partners of
them are named) or useless (it belongs to no minimal working sub-design).
Every edge whose loss breaks the design is listed, worst first, split by
cause, with its cheapest fix; --state-losses adds the loss of each state (a
variable held constant by a fault). All single-device and single-link
losses come from one maximum matching of [A B] and one dominator tree, in a
few times the time of check; each claim is the verdict of Lin's test on the
design less the loss. --detail bounds the entries given in full.

To place devices that survive one loss, see actuators --survive.

Exit status: 0 when the design holds and no single device or link loss (nor
state loss, with --state-losses) breaks it, 1 when one does or the design
fails as it stands, 2 on error.

Example:
  netsteer failures testdata/plant/heating.edges --inputs testdata/plant/heating-completed.txt
  netsteer failures --state-losses --node-table testdata/plant/heating-nodes.csv -o losses.json testdata/plant/heating.edges --inputs testdata/plant/heating-completed.txt
`,
	flags: func(e *env, fs *pflag.FlagSet) func([]string) error {
		var nf netFlags
		var of outFlags
		nf.register(e, fs)
		inputs := fs.String("inputs", "", "input design: one input per line, the states it drives")
		outputs := fs.String("outputs", "", "output design: one output per line, the states it senses")
		states := fs.Bool("state-losses", false, "also judge the loss of each state (a variable held constant)")
		detail := fs.Int("detail", 0, "entries of each list given in full (default 10; --all: every one)")
		partners := fs.Int("partners", 0, "useful devices whose partners in a joint loss are named (default 3)")
		budget := fs.Int64("split-budget", 0, "work allowed to tell useful from useless devices (default 16 (N+E) + 65536); the rest are unresolved")
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
			if *detail < 0 || *partners < 0 || *budget < 0 {
				return usagef("--detail, --partners and --split-budget must not be negative")
			}
			start := time.Now()
			in, err := nf.load(path, of.output, false, *inputs, *outputs)
			if err != nil {
				return err
			}
			req := analysis.FailuresRequest{Actuators: in.devices(structural.Controllability), Sensors: in.devices(structural.Observability),
				States: *states, Detail: *detail, Partners: *partners, Budget: *budget}
			if of.all {
				req.Detail = in.g.N() + in.g.Edges()
			}
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
			e.status("judging every single loss (%d states, %d edges)", in.g.N(), in.g.Edges())
			r, err := analysis.Failures(in.g, req)
			if err != nil {
				return err
			}
			r.File = path
			finish(&r.Timings, in, start)
			if err := of.write(e, textout.Failures{R: r, Costed: in.table != nil, DetailHint: "--detail K works out more, --all every one"}); err != nil {
				return err
			}
			if !r.Survives() {
				return errNo
			}
			return nil
		}
	},
}

func init() { register(failuresCmd) }
