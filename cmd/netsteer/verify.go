package main

import (
	"errors"
	"fmt"
	"math/rand/v2"
	"time"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/design"
	"github.com/netsteer/netsteer/io/textout"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/analysis"
	"github.com/netsteer/netsteer/structural/numeric"
)

var verifyCmd = &command{
	name:    "verify",
	summary: "confirm the structural answer on sampled (or the model's own) parameter values",
	usage: `Usage: netsteer verify [options] NET --inputs FILE [--outputs FILE]

Structural results hold for almost all parameter values. verify shows it on
numbers: it draws a random nonzero value for every structural nonzero of A
(each edge u -> v is A[v][u], self-loops included), of B (each state an
input drives) and of C (each state an output senses), and measures the
controllable (observable) subspace of that sample.

Exact: the dimension of span{B, AB, A^2 B, ...} is computed over the prime
field GF(p), p = 2^61 - 1, with no rounding. A sample can never exceed the
structural (generic) dimension, and by the Schwartz-Zippel lemma a random
sample falls short of it with probability at most n^2/(p - 1) per trial.
Work grows as r (E + r N) for dimension r, so networks above --max-states
are refused with an estimate of the time and memory; verify a connected
part of them instead: --around NAMES --hops K keeps the states within K
steps of the named ones (edges followed either way), --sample K the first
K states met breadth-first from them (or from the states the first input
acts on). Signals are restricted to the part, and the structural
prediction is made for the part too.

Floating point (up to --max-float-states): the margin is the smallest
singular value of [A - lambda I, B] over the eigenvalues lambda of A,
relative to the Frobenius norm of [A B]: the relative size of the smallest
change of the numbers that makes some eigenvalue uncontrollable. Beside it,
the extreme eigenvalues of the controllability Gramian of the stable shift
A - sI (s = largest real part of an eigenvalue + ||A||_F / sqrt(N)).
A margin below --warn-margin draws a warning (default 1e-6: the numbers of
a plant model are rarely known to better than six digits, so a smaller
change is within their uncertainty); one at the rounding level (100 N eps,
a generous multiple of the rounding error of the computation) means
floating point cannot tell the design from an uncontrollable one.

--weights uses the model's own numbers instead: the third column of the
edge list for A and "name:value" on the input (output) lines for B (C);
missing values are 1. Decimals are mapped into GF(p) exactly as the
fractions they are (0.1 is 1/10); a value with more than 15 significant
digits cannot be recovered from its binary form, and its exact binary value
is used (reported). Ties and cancellations among real numbers can make a
model uncontrollable where the structure says it is not; the report shows
both verdicts.

--modes lists, for each sampled system (or the model), the eigenvalues
lambda of A that the inputs cannot move: rank [A - lambda I, B] < N (the PBH
test). Their number is exact (N minus the exact dimension); a rational value
(or a complex pair with a rational quadratic) is confirmed exactly, with its
multiplicity and the states its left eigenvector lives on; the others carry
an error bound. The pair is stabilizable when every such mode is stable
(negative real part; magnitude below 1 with --discrete). With --outputs: the
modes the outputs cannot see, detectability, and the four parts of the
Kalman decomposition; --format csv --table modes writes the modes as CSV
instead of the trials. --effort measures how hard the inputs must work
(Pasqualetti, Zampieri & Bullo, IEEE TCNS 1(1), 2014): the Gramian W over
--horizon (infinite for a stable A), the worst-case energy 1/lambda_min(W)
to reach a unit state, and trace(W). A model's numbers are only as good as
its fit.

--targets FILE adds the exact sampled rank of C*K over GF(p), C selecting
the listed states, beside their structural bounds.

Exit status: 0 when the sample (or the model) is controllable, and
observable when --outputs is given; 1 when not; 2 on error.

Example:
  netsteer verify testdata/plant/heating.edges --inputs testdata/plant/heating-actuators.txt
  netsteer verify --weights --outputs sensors.txt --format json model.edges --inputs actuators.txt
  netsteer verify --around pump.p1_speed --hops 3 big.edges --inputs actuators.txt
  netsteer verify --sample 1500 big.edges --inputs actuators.txt
  netsteer verify --weights --modes --effort model.edges --inputs actuators.txt
`,
	flags: verifyFlags,
}

func init() { register(verifyCmd) }

func verifyFlags(e *env, fs *pflag.FlagSet) func([]string) error {
	var nf netFlags
	var of outFlags
	nf.register(e, fs)
	of.register(fs)
	inputs := fs.String("inputs", "", "input design: one input per line, the states it drives")
	outputs := fs.String("outputs", "", "output design: one output per line, the states it senses")
	trials := fs.Int("trials", numeric.DefaultTrials, "independent random samples")
	seed := fs.Uint64("seed", 0, "seed of the samples (default: a fresh one, printed)")
	weights := fs.Bool("weights", false, "use the model's own numbers (edge weights, name:value on design lines)")
	maxStates := fs.Int("max-states", numeric.DefaultMaxStates, "largest network the exact check accepts")
	maxFloat := fs.Int("max-float-states", numeric.DefaultMaxFloatStates, "largest network the floating-point check runs on (0: never)")
	warnMargin := fs.Float64("warn-margin", numeric.DefaultWarnMargin, "warn when the relative margin is below this (0: never)")
	around := fs.String("around", "", "verify only a part of the network around these states (comma-separated names)")
	hops := fs.Int("hops", numeric.DefaultHops, "radius of --around in steps, following edges either way")
	sample := fs.Int("sample", 0, "verify only the first K states met breadth-first from --around (or the first signal)")
	modes := fs.Bool("modes", false, "list the modes the signals cannot move (see) and whether they are stable")
	effort := fs.Bool("effort", false, "control effort from the Gramian: worst-case energy and trace")
	horizon := fs.Float64("horizon", 0, "finite horizon of the Gramian: a time, or whole steps with --discrete (default: infinite)")
	discrete := fs.Bool("discrete", false, "read the model as x(k+1) = A x(k) + B u(k): stable means |lambda| < 1")
	table := fs.String("table", "trials", "with --format csv: which table to write, trials or modes (modes needs --modes)")
	var sf strongFlags
	sf.register(fs, "show the strong structural verdict (every value of the couplings) beside the generic one")
	var tf targetsFlag
	tf.register(fs)
	return func(args []string) error {
		path, err := oneArg(args)
		if err != nil {
			return err
		}
		if err := of.resolve(); err != nil {
			return err
		}
		switch {
		case *inputs == "" && *outputs == "":
			return usagef("give --inputs FILE (and/or --outputs FILE)")
		case *trials < 1 || *trials > numeric.MaxTrials:
			return usagef("--trials must be between 1 and %d", numeric.MaxTrials)
		case *maxStates < 1:
			return usagef("--max-states must be at least 1")
		case *maxFloat < 0:
			return usagef("--max-float-states must be 0 or more")
		case *hops < 0 || *sample < 0:
			return usagef("--hops and --sample must not be negative")
		case !(*warnMargin >= 0):
			return usagef("--warn-margin must be a number >= 0")
		case fs.Changed("hops") && !fs.Changed("around") && *sample == 0:
			return usagef("--hops needs --around NAMES (or --sample K)")
		case *table != "trials" && *table != "modes":
			return usagef("--table %q: want trials or modes", *table)
		case fs.Changed("table") && of.format != "csv":
			return usagef("--table chooses a CSV table: it goes with --format csv (text and JSON show every table)")
		case *table == "modes" && !*modes:
			return usagef("--table modes needs --modes")
		}
		if err := sf.check(); err != nil {
			return err
		}
		if !fs.Changed("seed") {
			*seed = rand.Uint64N(1_000_000_000)
		}
		start := time.Now()
		in, err := nf.load(path, of.output, *weights, *inputs, *outputs, sf.mayBeZero, tf.file)
		if err != nil {
			return err
		}
		targets, err := tf.states(e, in)
		if err != nil {
			return err
		}
		if targets != nil && (*weights || *inputs == "") {
			return usagef("--targets takes random samples of an input design: give --inputs, without --weights")
		}
		req := numeric.Request{Trials: *trials, Seed: *seed, Weights: *weights, MaxStates: *maxStates,
			MaxFloatStates: *maxFloat, WarnMargin: *warnMargin, Modes: *modes, Effort: *effort, Horizon: *horizon, Discrete: *discrete}
		if req.Strong, err = sf.class(in); err != nil {
			return err
		}
		if *maxFloat == 0 {
			req.MaxFloatStates = -1
		}
		if *warnMargin == 0 {
			req.WarnMargin = -1
		}
		for _, x := range []struct {
			file string
			p    structural.Property
			d    **structural.Design
			w    *[][]float64
		}{{*inputs, structural.Controllability, &req.Inputs, &req.InputWeights}, {*outputs, structural.Observability, &req.Outputs, &req.OutputWeights}} {
			if x.file == "" {
				continue
			}
			d, sigs, err := in.weightedDesign(e, x.file, x.p, *weights)
			if err != nil {
				return err
			}
			*x.d = d
			if *weights {
				for _, s := range sigs {
					*x.w = append(*x.w, s.Weights)
				}
			}
		}
		if fs.Changed("around") || *sample > 0 {
			var centres []int32
			if fs.Changed("around") {
				if centres, err = stateList(in.g, "--around", *around, path); err != nil {
					return err
				}
			}
			var radius *int
			if fs.Changed("hops") {
				radius = hops
			}
			req.Part = numeric.NewPart(centres, radius, *sample)
		}
		if e.StderrIsTTY {
			req.Progress = func(p numeric.Progress) {
				e.status("%s check of %s, trial %d of %d: %d of %d", p.Stage, p.Kind, p.Trial, p.Trials, p.Done, p.Total)
			}
		}
		r, err := analysis.Verify(in.g, analysis.VerifyRequest{Request: req, Targets: targets})
		e.status("")
		var se *numeric.SizeError
		if errors.As(err, &se) {
			return sizeRefusal(path, se)
		}
		if err != nil {
			return err
		}
		r.File = path
		r.Timings.Total = time.Since(start).Seconds()
		hints := map[numeric.WarningKind]string{numeric.WarnLowMargin: "(see --warn-margin)"}
		if err := of.write(e, textout.Verify{R: r, Modes: *table == "modes", Hints: hints}); err != nil {
			return err
		}
		if !r.Holds() {
			return errNo
		}
		return nil
	}
}

// weightedDesign reads a design file, with name:value weights when asked.
func (in *input) weightedDesign(e *env, path string, p structural.Property, weights bool) (*structural.Design, []design.Signal, error) {
	if !weights {
		return in.design(e, path, p)
	}
	return in.readDesign(e, path, p, true)
}

// sizeRefusal words a refusal for size with its estimate and what to do.
func sizeRefusal(path string, se *numeric.SizeError) error {
	what, flag := "the exact check", "--max-states"
	if se.Stage == numeric.StageDense {
		what, flag = "the dense floating-point work", "--max-float-states"
	}
	return fmt.Errorf("verify: %s has %d states, above %s %d: %s would take up to about %s and %s of memory here (work grows as r(E + rN) for dimension r). Raise %s to run it anyway, or verify a part with --around NAME --hops K or --sample K.",
		displayFile(path), se.States, flag, se.Limit, what, numeric.FormatSeconds(se.Estimate.Seconds), numeric.FormatBytes(se.Estimate.Bytes), flag)
}
