package main

import (
	"errors"
	"fmt"
	"time"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/textout"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/analysis"
	"github.com/netsteer/netsteer/structural/failure"
	"github.com/netsteer/netsteer/structural/numeric"
)

const placeUsage = `Usage: netsteer %[1]s [options] NET

Finds the cheapest dedicated %[2]s (one state each) that make the network
structurally %[3]s. %[4]s already in place (the node table's %[5]s
column) are kept and cost nothing. Without a node table every %[6]s costs 1
and the answer is the minimum count m + beta - alpha (Pequito, Kar & Aguiar,
IEEE TAC 2016); with one, the least total cost, then the fewest devices
(Pequito, Kar & Aguiar, Automatica 2016).

--roles says for each new %[6]s whether every cheapest placement has one
there (forced), or lists the states that could take its place at the same
cost (--alternatives bounds the list). --rank-effort ranks these equally
cheap placements by control effort (the worst-case input energy from the
Gramian, Pasqualetti, Zampieri & Bullo 2014) on random samples of the
parameters, or on the model's own numbers with --weights, over the infinite
horizon when A is stable and over --horizon T otherwise (an unstable A
without --horizon is refused); dense work, up to 1000 states.

--strong places for strong structural controllability instead: the
system works for every value of the couplings of the stated class (see
"netsteer help check"). This is NP-hard: the answer is proved optimal by
a search with bounds on small networks (by default up to 64 states; on
those, with at most 18 allowed states, the search always runs to the end)
and otherwise is a fast placement with a lower bound and the gap between
them.

--survive device (link) places the cheapest devices that keep the network
structurally %[3]s after the loss of any one of them (of any one
edge), honouring existing devices and costs; --spares allows a second
device on a state (the only protection for a state nothing acts on). This
is NP-hard (Liu, Mo, Pequito, Sinopoli, Kar & Aguiar, IEEE TCNS 2017): exact
by branch and bound up to --exact-states states (default 40), beyond by the
two-step method of that paper (a cheapest placement, then the fewest
additions as a weighted set cover), always with a proven lower bound and
the gap. To judge a given design under failures, see "netsteer help
failures".

--targets FILE places for the listed states only: the cheapest dedicated
%[2]s that make them steerable, with a lower bound and the saving against
full control (see "netsteer help drivers").

When no placement the node table allows can succeed, the exit status is 1
and the output names the states or components that block; with --targets,
also when the design found is not proved to steer the targets.

Example:
  netsteer %[1]s testdata/plant/heating.edges
  netsteer %[1]s --node-table testdata/plant/heating-nodes.csv --roles testdata/plant/heating.edges
  netsteer %[1]s --rank-effort --horizon 5 --seed 3 testdata/plant/heating.edges
  netsteer %[1]s --survive device --spares testdata/plant/heating.edges
`

func placeCommand(name string, p structural.Property, devices, adjective, column string) *command {
	return &command{
		name:    name,
		summary: "cheapest dedicated " + devices + " that make the network structurally " + adjective,
		usage:   sprintf(placeUsage, name, devices, adjective, capital(devices), column, p.Device()),
		flags: func(e *env, fs *pflag.FlagSet) func([]string) error {
			var nf netFlags
			var of outFlags
			nf.register(e, fs)
			of.register(fs)
			roles := fs.Bool("roles", false, "say which new "+devices+" are forced and where the others could go instead")
			alts := fs.Int("alternatives", 10, "with --roles, list at most this many alternatives per "+p.Device())
			timings := fs.Bool("timings", false, "print stage times on standard error")
			var sf strongFlags
			sf.register(fs, "place for strong structural "+map[bool]string{true: "observability", false: "controllability"}[p == structural.Observability]+": for every value of the couplings")
			exact := fs.Int("exact-states", 0, "with --strong or --survive, search exactly on networks of at most this many states (defaults 64 and 40)")
			nodes := fs.Int64("search-nodes", 0, "with --strong or --survive, node budget of the exact search (defaults 200000 and 20000)")
			var tf targetsFlag
			tf.register(fs)
			survive := fs.String("survive", "", "place devices that keep the property after the loss of any one device, or of any one link: device or link")
			spares := fs.Bool("spares", false, "with --survive, allow a second device on a state that already has one")
			rank := fs.Bool("rank-effort", false, "rank the equally cheap placements --roles lists by control effort on numbers (implies --roles)")
			weights := fs.Bool("weights", false, "with --rank-effort, use the model's own numbers (edge weights) instead of samples")
			trials := fs.Int("trials", numeric.DefaultTrials, "with --rank-effort, random samples averaged")
			seed := fs.Uint64("seed", 1, "with --rank-effort, seed of the samples")
			horizon := fs.Float64("horizon", 0, "with --rank-effort, finite horizon of the Gramian (default: infinite)")
			discrete := fs.Bool("discrete", false, "with --rank-effort, read the model as x(k+1) = A x(k) + B u(k)")
			return func(args []string) error {
				path, err := oneArg(args)
				if err != nil {
					return err
				}
				if err := of.resolve(); err != nil {
					return err
				}
				if *alts < 0 {
					return usagef("--alternatives %d: want 0 or more", *alts)
				}
				if err := sf.check(); err != nil {
					return err
				}
				var threat *failure.Threat
				switch *survive {
				case "":
				case "device", "link":
					th := failure.AnyDevice
					if *survive == "link" {
						th = failure.AnyLink
					}
					threat = &th
				default:
					return usagef("--survive %q: want device or link", *survive)
				}
				if *spares && threat == nil {
					return usagef("--spares goes with --survive")
				}
				start := time.Now()
				in, err := nf.load(path, of.output, *weights, sf.mayBeZero, tf.file)
				if err != nil {
					return err
				}
				targets, err := tf.states(e, in)
				if err != nil {
					return err
				}
				req := analysis.PlaceRequest{Property: p, Devices: in.devices(p), Roles: *roles, Alternatives: *alts, ExactStates: *exact, SearchNodes: *nodes, Targets: targets, Seed: *seed, Survive: threat, Spares: *spares}
				if req.Strong, err = sf.class(in); err != nil {
					return err
				}
				if *rank {
					req.RankEffort = &numeric.RankRequest{Weights: *weights, Trials: *trials, Seed: *seed,
						Effort: numeric.EffortRequest{Discrete: *discrete, Horizon: *horizon}}
				}
				e.status("placing %s (%d states, %d edges)", devices, in.g.N(), in.g.Edges())
				r, err := analysis.Place(in.g, req)
				var ue *numeric.UnstableError
				if errors.As(err, &ue) {
					return fmt.Errorf("%s (give --horizon T)", ue.Reason)
				}
				if err != nil {
					return err
				}
				r.File = path
				of.labels, of.groups = in.labelsGroups()
				finish(&r.Timings, in, start)
				if err := of.write(e, textout.Place{R: r, Costed: in.table != nil}); err != nil {
					return err
				}
				if *timings {
					printTimings(e, r.Timings)
				}
				if !r.Succeeds() {
					return errNo
				}
				return nil
			}
		},
	}
}

func init() {
	register(placeCommand("actuators", structural.Controllability, "actuators", "controllable", "has_actuator"))
	register(placeCommand("sensors", structural.Observability, "sensors", "observable", "has_sensor"))
}
