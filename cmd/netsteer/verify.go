package main

import (
	"bufio"
	"encoding/csv"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"math/rand/v2"
	"strconv"
	"strings"
	"time"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/design"
	"github.com/netsteer/netsteer/io/netread"
	"github.com/netsteer/netsteer/structural"
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

Exit status: 0 when the sample (or the model) is controllable, and
observable when --outputs is given; 1 when not; 2 on error.

Example:
  netsteer verify testdata/plant/heating.edges --inputs testdata/plant/heating-actuators.txt
  netsteer verify --weights --outputs sensors.txt --format json model.edges --inputs actuators.txt
  netsteer verify --around pump.p1_speed --hops 3 big.edges --inputs actuators.txt
  netsteer verify --sample 1500 big.edges --inputs actuators.txt
`,
	run: runVerify,
}

func init() { register(verifyCmd) }

type verifyFlags struct {
	inputs, outputs string
	trials          int
	seed            uint64
	weights         bool
	maxStates       int
	maxFloat        int
	warnMargin      float64
	around          string
	hops            int
	sample          int
}

func runVerify(e *env, c *command, fs *pflag.FlagSet, args []string) int {
	var nf netFlags
	var of outFlags
	var vf verifyFlags
	nf.register(fs, e)
	of.register(fs)
	fs.StringVar(&vf.inputs, "inputs", "", "input design: one input per line, the states it drives")
	fs.StringVar(&vf.outputs, "outputs", "", "output design: one output per line, the states it senses")
	fs.IntVar(&vf.trials, "trials", numeric.DefaultTrials, "independent random samples")
	fs.Uint64Var(&vf.seed, "seed", 0, "seed of the samples (default: a fresh one, printed)")
	fs.BoolVar(&vf.weights, "weights", false, "use the model's own numbers (edge weights, name:value on design lines)")
	fs.IntVar(&vf.maxStates, "max-states", numeric.DefaultMaxStates, "largest network the exact check accepts")
	fs.IntVar(&vf.maxFloat, "max-float-states", numeric.DefaultMaxFloatStates, "largest network the floating-point check runs on (0: never)")
	fs.Float64Var(&vf.warnMargin, "warn-margin", 1e-6, "warn when the relative margin is below this")
	fs.StringVar(&vf.around, "around", "", "verify only a part of the network around these states (comma-separated names)")
	fs.IntVar(&vf.hops, "hops", 2, "radius of --around in steps, following edges either way")
	fs.IntVar(&vf.sample, "sample", 0, "verify only the first K states met breadth-first (edges either way) from --around, or from the states the first signal acts on")
	if ok, st := parse(e, c, fs, args); !ok {
		return st
	}
	if fs.NArg() != 1 {
		return usageError(e, c, "want one network file, got %d arguments", fs.NArg())
	}
	if err := of.check(); err != nil {
		return usageError(e, c, "%v", err)
	}
	switch {
	case vf.inputs == "" && vf.outputs == "":
		return usageError(e, c, "give --inputs FILE (and/or --outputs FILE)")
	case (vf.inputs == "-" && vf.outputs == "-") || (fs.Arg(0) == "-" && (vf.inputs == "-" || vf.outputs == "-")):
		return usageError(e, c, "only one of NET, --inputs and --outputs can read standard input")
	case vf.trials < 1 || vf.trials > numeric.MaxTrials:
		return usageError(e, c, "--trials must be between 1 and %d", numeric.MaxTrials)
	case vf.maxStates < 1:
		return usageError(e, c, "--max-states must be at least 1")
	case vf.maxFloat < 0:
		return usageError(e, c, "--max-float-states must be 0 or more")
	case vf.hops < 0 || vf.sample < 0:
		return usageError(e, c, "--hops and --sample must not be negative")
	case !(vf.warnMargin >= 0):
		return usageError(e, c, "--warn-margin must be a number >= 0")
	case fs.Changed("hops") && vf.around == "" && vf.sample == 0:
		return usageError(e, c, "--hops needs --around NAMES (or --sample K)")
	}
	if !fs.Changed("seed") {
		vf.seed = rand.Uint64N(1_000_000_000)
	}
	path := fs.Arg(0)
	if err := overwritesInput(of.output, path, vf.inputs, vf.outputs, nf.nodeTable); err != nil {
		return usageError(e, c, "%v", err)
	}
	g, _, err := nf.load(path, func(o *netread.Options) error { o.Weights = vf.weights; return nil })
	if err != nil {
		return fail(e, err)
	}
	var ins, outs []design.Signal
	if vf.inputs != "" {
		if ins, err = designSignals(vf.inputs, g, vf.weights); err != nil {
			return fail(e, err)
		}
		if len(ins) == 0 {
			return fail(e, fmt.Errorf("%s: no inputs in the file", vf.inputs))
		}
	}
	if vf.outputs != "" {
		if outs, err = designSignals(vf.outputs, g, vf.weights); err != nil {
			return fail(e, err)
		}
		if len(outs) == 0 {
			return fail(e, fmt.Errorf("%s: no outputs in the file", vf.outputs))
		}
	}
	res := &verifyResult{file: path, full: g.N(), flags: vf}
	inS, inW := design.States(ins), signalWeights(ins)
	outS, outW := design.States(outs), signalWeights(outs)
	if vf.around != "" || vf.sample > 0 {
		var centres []int32
		from := vf.around
		if vf.around != "" {
			for _, name := range strings.Split(vf.around, ",") {
				name = strings.TrimSpace(name)
				v, ok := g.Lookup(name)
				if !ok {
					return usageError(e, c, "--around: no state named %q in %s", name, path)
				}
				centres = append(centres, v)
			}
		} else {
			first := append(append([]design.Signal(nil), ins...), outs...)[0]
			centres = first.States
			from = fmt.Sprintf("the states signal %s:%d acts on", firstFile(vf), first.Line)
		}
		hops := vf.hops
		if vf.sample > 0 && !fs.Changed("hops") {
			hops = -1
		}
		keep := numeric.Around(g, centres, hops, vf.sample)
		switch {
		case vf.sample > 0 && hops < 0:
			res.subnet = fmt.Sprintf("the first %s met from %s", count(len(keep), "state", "states"), from)
		case vf.sample > 0:
			res.subnet = fmt.Sprintf("the first %s met within %d %s of %s", count(len(keep), "state", "states"), hops, plural(hops, "step", "steps"), from)
		default:
			res.subnet = fmt.Sprintf("the states within %d %s of %s", hops, plural(hops, "step", "steps"), from)
		}
		sub, newOf, err := numeric.Induced(g, keep)
		if err != nil {
			return fail(e, err)
		}
		var di, do int
		inS, inW, di = numeric.Restrict(inS, inW, newOf)
		outS, outW, do = numeric.Restrict(outS, outW, newOf)
		res.droppedSignals = di + do
		if len(inS)+len(outS) == 0 {
			return fail(e, errors.New("verify: no input or output acts on the chosen part of the network"))
		}
		g = sub
	}
	res.g = g
	opt := numeric.Options{
		Trials: vf.trials, Seed: vf.seed, Weights: vf.weights, InputWeights: inW, OutputWeights: outW,
		MaxStates: vf.maxStates, MaxFloatStates: vf.maxFloat,
	}
	if vf.maxFloat == 0 {
		opt.MaxFloatStates = -1
	}
	var prog *progressLine
	if e.StderrIsTTY {
		prog = &progressLine{w: e.Stderr}
		opt.Progress = prog.report
	}
	start := time.Now()
	rep, err := numeric.Verify(g, inS, outS, opt)
	if prog != nil {
		prog.clear()
	}
	if err != nil {
		var se *numeric.SizeError
		if errors.As(err, &se) {
			fmt.Fprintf(e.Stderr, "netsteer: verify: %s has %d states, above --max-states %d: the exact check would take about %s and %s of memory here (work grows as r(E + rN) for dimension r). Raise --max-states to run it anyway, or verify a part of the network with --around NAME --hops K or --sample K.\n",
				path, se.N, se.Max, numeric.FormatDuration(se.Time), numeric.FormatBytes(se.Bytes))
			return exitError
		}
		return fail(e, err)
	}
	res.rep = rep
	res.total = time.Since(start)
	if err := of.write(e, res); err != nil {
		return fail(e, err)
	}
	for _, r := range []*numeric.Result{rep.Controllability, rep.Observability} {
		if r != nil && !r.Full {
			return exitNo
		}
	}
	return exitOK
}

// signalWeights returns the values of the signals, nil when read without.
func signalWeights(sigs []design.Signal) [][]float64 {
	if len(sigs) == 0 || sigs[0].Weights == nil {
		return nil
	}
	w := make([][]float64, len(sigs))
	for i, s := range sigs {
		w[i] = s.Weights
	}
	return w
}

// firstFile names the design file the first signal comes from.
func firstFile(vf verifyFlags) string {
	if vf.inputs != "" {
		return vf.inputs
	}
	return vf.outputs
}

// progressLine rewrites one status line on a terminal.
type progressLine struct {
	w     io.Writer
	shown bool
}

func (p *progressLine) report(pr numeric.Progress) {
	var msg string
	if pr.Stage == "exact" {
		msg = fmt.Sprintf("verify: exact %s, trial %d/%d: dimension %d of %d", pr.Kind, pr.Trial, pr.Trials, pr.Done, pr.Total)
	} else {
		msg = fmt.Sprintf("verify: floating-point %s, trial %d/%d", pr.Kind, pr.Trial, pr.Trials)
	}
	fmt.Fprintf(p.w, "\r%-72s", msg)
	p.shown = true
}

func (p *progressLine) clear() {
	if p.shown {
		fmt.Fprintf(p.w, "\r%72s\r", "")
	}
}

type verifyResult struct {
	file           string
	g              *structural.Network
	full           int // states of the whole network
	subnet         string
	droppedSignals int
	flags          verifyFlags
	rep            *numeric.Report
	total          time.Duration
}

// property names a Result for the text and the keys.
type property struct {
	r                          *numeric.Result
	noun, adj, dimKey, verdict string
	countKey                   string // the number of signals, named as in check
}

func (v *verifyResult) properties() []property {
	var ps []property
	if r := v.rep.Controllability; r != nil {
		ps = append(ps, property{r, "controllability", "controllable", "controllable_dimension", "controllable", "inputs_count"})
	}
	if r := v.rep.Observability; r != nil {
		ps = append(ps, property{r, "observability", "observable", "observable_dimension", "observable", "outputs_count"})
	}
	return ps
}

// headline answers the user's question for one property.
func (v *verifyResult) headline(p property) string {
	r, n := p.r, v.rep.N
	subject := "the sampled system is"
	if v.rep.Weights {
		subject = "with its own numbers the model is"
	}
	if len(r.Trials) > 1 && !v.rep.Weights {
		subject = "the sampled systems are"
	}
	verdict := p.adj
	if !r.Full {
		verdict = "NOT " + p.adj
	}
	s := fmt.Sprintf("%s %s: exact dimension %d of %d", subject, verdict, r.Sampled, n)
	switch {
	case r.Sampled > r.Structural:
		s += fmt.Sprintf(", above the structural prediction %d. This cannot happen; please report it as a bug.", r.Structural)
	case r.Agrees && r.Full:
		s += ", as the structure predicts."
	case r.Agrees:
		s += fmt.Sprintf(", as the structure predicts (%s %d).", strings.ReplaceAll(p.dimKey, "_", " "), r.Structural)
	case v.rep.Weights:
		s += fmt.Sprintf(", although the structure predicts %d: ties or cancellations among the weights lose %d %s.",
			r.Structural, r.Structural-r.Sampled, plural(r.Structural-r.Sampled, "direction", "directions"))
	default:
		s += fmt.Sprintf(", below the structural prediction %d in every trial; by chance with probability at most %.2g. Rerun with another --seed; if it persists, please report it.",
			r.Structural, math.Pow(r.FailureBound, float64(len(r.Trials))))
	}
	return s
}

// warnings lists what an engineer must hear about the margins, one line
// per kind of finding with the worst trial.
func (v *verifyResult) warnings(p property) []string {
	var out []string
	r, n := p.r, v.rep.N
	round := numeric.RoundingLevel(n)
	var atRound, fragile, singular, partial []int
	worst := func(idx []int, val func(*numeric.FloatResult) float64) (int, float64) {
		best, bv := -1, math.Inf(1)
		for _, i := range idx {
			if x := val(r.Trials[i].Float); x < bv {
				best, bv = i, x
			}
		}
		return best, bv
	}
	for i, tr := range r.Trials {
		f := tr.Float
		if f == nil || !r.Full {
			continue
		}
		switch {
		case f.Margin <= round:
			atRound = append(atRound, i)
		case f.Margin < v.flags.warnMargin:
			fragile = append(fragile, i)
		}
		if f.GramianMin <= 0 || f.GramianMin < round*f.GramianMax {
			singular = append(singular, i)
		}
		if f.Evaluated < f.Eigenvalues {
			partial = append(partial, i)
		}
	}
	which := func(idx []int, i int) string {
		if v.rep.Weights {
			return "With the model's numbers,"
		}
		if len(r.Trials) == 1 {
			return "In the sample,"
		}
		return fmt.Sprintf("In %d of %d trials (worst: trial %d),", len(idx), len(r.Trials), i+1)
	}
	margin := func(f *numeric.FloatResult) float64 { return f.Margin }
	if len(atRound) > 0 {
		i, m := worst(atRound, margin)
		out = append(out, fmt.Sprintf("%s the system is %s exactly, but its margin %.2g is at the rounding level of floating point (100 N eps = %.2g): numerically it cannot be told from one that is not (eigenvalue %s).",
			which(atRound, i), p.adj, m, round, fmtEig(r.Trials[i].Float)))
	}
	if len(fragile) > 0 {
		i, m := worst(fragile, margin)
		out = append(out, fmt.Sprintf("%s the system is close to losing %s: a change of relative size %.2g in the numbers makes eigenvalue %s un%s (warning below --warn-margin %g).",
			which(fragile, i), p.noun, m, fmtEig(r.Trials[i].Float), p.adj, v.flags.warnMargin))
	}
	if len(singular) > 0 {
		i, g := worst(singular, func(f *numeric.FloatResult) float64 { return f.GramianMin / f.GramianMax })
		out = append(out, fmt.Sprintf("%s the Gramian of the shifted system is numerically singular (smallest/largest eigenvalue %.2g, below 100 N eps): some directions take input energy beyond the precision of the strongest ones, common in large networks with few signals.",
			which(singular, i), g))
	}
	if len(partial) > 0 {
		i, _ := worst(partial, margin)
		f := r.Trials[i].Float
		out = append(out, fmt.Sprintf("%s the margin was evaluated at %d of %d eigenvalues, those with the weakest coupling to the signals (the time for all grows as N^3 times the signals); the others' coupling bound is at least %.2g.",
			which(partial, i), f.Evaluated, f.Eigenvalues, f.NextBound/f.Scale))
	}
	return out
}

// fmtEig prints the eigenvalue where a margin is attained, parts below
// 1e-12 of the data's scale shown as 0 (rounding noise of the Schur form).
func fmtEig(f *numeric.FloatResult) string {
	re, im := real(f.At), imag(f.At)
	if math.Abs(re) < 1e-12*f.Scale {
		re = 0
	}
	if math.Abs(im) < 1e-12*f.Scale {
		im = 0
	}
	return fmtComplex(complex(re, im))
}

func fmtComplex(z complex128) string {
	if imag(z) == 0 {
		return strconv.FormatFloat(real(z), 'g', 4, 64)
	}
	return fmt.Sprintf("%.4g%+.4gi", real(z), imag(z))
}

func (v *verifyResult) writeText(w io.Writer) error {
	rep := v.rep
	bw := bufio.NewWriterSize(w, 1<<16)
	var warn []string
	for _, p := range v.properties() {
		r := p.r
		fmt.Fprintf(bw, "%s: %s\n", strings.ToUpper(p.noun[:1])+p.noun[1:], v.headline(p))
		switch {
		case math.IsNaN(r.Margin) && v.flags.maxFloat == 0:
			fmt.Fprintf(bw, "  Margin not computed: the floating-point check is off (--max-float-states 0).\n")
		case math.IsNaN(r.Margin):
			fmt.Fprintf(bw, "  Margin not computed: %s (raise --max-float-states to run it; its time grows as N^3).\n", r.FloatSkipped)
		case !r.Full:
			fmt.Fprintf(bw, "  Margin %.3g: zero up to rounding, as it must be for a system that is not %s.\n", r.Margin, p.adj)
		default:
			fmt.Fprintf(bw, "  Margin %.3g: smallest singular value of [A - lambda I, %s] over the eigenvalues of A, relative to ||[A %s]||_F%s.\n",
				r.Margin, p.matrix(), p.matrix(), marginWhere(r))
		}
		if rep.Weights {
			fmt.Fprintf(bw, "  Exact over GF(2^61-1) on the model's numbers")
			switch alt := r.Trials[0].AltDimension; {
			case alt == r.Trials[0].Dimension:
				fmt.Fprintf(bw, "; confirmed over GF(2^61-31): dimension %d", alt)
			case alt >= 0:
				fmt.Fprintf(bw, "; over GF(2^61-31) the dimension is %d and over GF(2^61-1) %d: the first prime divides the minors, and the larger value is kept", alt, r.Trials[0].Dimension)
			}
			fmt.Fprintf(bw, ".\n")
		} else {
			fmt.Fprintf(bw, "  A random sample falls short of the generic dimension with probability at most %.2g per trial (Schwartz-Zippel, N^2/(p-1), p = 2^61-1); generic with probability at least 1 - %.2g.\n",
				r.FailureBound, r.FailureBound)
		}
		warn = append(warn, v.warnings(p)...)
	}
	fmt.Fprintf(bw, "\nNetwork: %s, %s (%s)", count(rep.N, "state", "states"), count(rep.Edges, "edge", "edges"), count(v.g.SelfLoops, "self-loop", "self-loops"))
	if v.subnet != "" {
		fmt.Fprintf(bw, ": the part of %s made of %s (%d of %d states)", v.file, v.subnet, rep.N, v.full)
	}
	fmt.Fprintf(bw, ".\n")
	if v.subnet != "" {
		fmt.Fprintf(bw, "The part lacks the couplings from the rest of the network: the verdicts concern the part, and the structural prediction is made for it too.\n")
	}
	if v.droppedSignals > 0 {
		fmt.Fprintf(bw, "%d %s acting only outside that part %s left out.\n", v.droppedSignals, plural(v.droppedSignals, "signal", "signals"), plural(v.droppedSignals, "was", "were"))
	}
	if rep.Weights {
		if !rep.NetworkWeights {
			fmt.Fprintf(bw, "The network file has no weights: every entry of A is 1.\n")
		}
		if rep.Inexact > 0 {
			fmt.Fprintf(bw, "%d %s more than 15 significant digits (or %s a sum of repeated edges): %s exact binary value was used, not the decimal text.\n",
				rep.Inexact, plural(rep.Inexact, "weight has", "weights have"), plural(rep.Inexact, "is", "are"), plural(rep.Inexact, "its", "their"))
		}
		if rep.ZeroEntries > 0 {
			fmt.Fprintf(bw, "%d %s of A %s zero: repeated edges whose weights cancel.\n", rep.ZeroEntries, plural(rep.ZeroEntries, "entry", "entries"), plural(rep.ZeroEntries, "is", "are"))
		}
	} else {
		fmt.Fprintf(bw, "%d %s, seed %d (rerun with --seed %d to reproduce).\n", len(v.properties()[0].r.Trials),
			plural(len(v.properties()[0].r.Trials), "trial", "trials"), rep.Seed, rep.Seed)
	}
	fmt.Fprintf(bw, "Time: exact %.2f s, floating point %.2f s.\n", rep.Exact.Seconds(), rep.Float.Seconds())
	for _, p := range v.properties() {
		fmt.Fprintf(bw, "\n%s\ntrial  dimension  margin     at eigenvalue        Gramian min  Gramian max  shift\n", p.noun)
		for i, tr := range p.r.Trials {
			dim := strconv.Itoa(tr.Dimension)
			if tr.AltDimension >= 0 {
				dim += "/" + strconv.Itoa(tr.AltDimension)
			}
			if f := tr.Float; f != nil {
				fmt.Fprintf(bw, "%5d  %9s  %-9.3g  %-19s  %-11.3g  %-11.3g  %.3g\n", i+1, dim, f.Margin, fmtEig(f), f.GramianMin, f.GramianMax, f.Shift)
			} else {
				fmt.Fprintf(bw, "%5d  %9s  -\n", i+1, dim)
			}
		}
	}
	if len(warn) > 0 {
		fmt.Fprintf(bw, "\nWarnings:\n")
		for _, s := range warn {
			fmt.Fprintf(bw, "- %s\n", s)
		}
	}
	fmt.Fprint(bw, "\nNumeric results describe the numbers checked; the margin is for unstructured\nchanges of A and B and is evaluated at the eigenvalues of A only, so the true\ndistance to an uncontrollable design can be smaller.\n")
	fmt.Fprint(bw, "\n"+caution)
	return bw.Flush()
}

func (p property) matrix() string {
	if p.noun == "observability" {
		return "C^T"
	}
	return "B"
}

func marginWhere(r *numeric.Result) string {
	best := -1
	for i, tr := range r.Trials {
		if tr.Float != nil && (best < 0 || tr.Float.Margin < r.Trials[best].Float.Margin) {
			best = i
		}
	}
	if best < 0 {
		return ""
	}
	f := r.Trials[best].Float
	s := "; at eigenvalue " + fmtEig(f)
	if len(r.Trials) > 1 {
		s += fmt.Sprintf(", trial %d (the smallest of %d)", best+1, len(r.Trials))
	}
	return s
}

func (v *verifyResult) writeJSON(w io.Writer) error {
	rep := v.rep
	j := newJSON(bufio.NewWriterSize(w, 1<<16))
	j.val("file", v.file)
	j.int("nodes", rep.N)
	j.int("edges", rep.Edges)
	if v.subnet != "" {
		j.key("subnetwork")
		b, _ := json.Marshal(map[string]any{"states": rep.N, "of": v.full, "selection": v.subnet, "signals_left_out": v.droppedSignals})
		j.w.Write(b)
	}
	j.bool("weights", rep.Weights)
	j.val("prime", "2^61-1")
	trials := 0
	for _, p := range v.properties() {
		trials = len(p.r.Trials)
	}
	j.int("trials", trials)
	if rep.Weights {
		j.int("inexact_weights", rep.Inexact)
		j.int("zero_entries", rep.ZeroEntries)
	} else {
		j.key("seed")
		j.w.WriteString(strconv.FormatUint(rep.Seed, 10))
	}
	var warn []string
	for i, p := range v.properties() {
		if i > 0 || p.noun == "observability" {
			j.key(p.noun)
			sub := newJSON(j.w) // writes the opening brace
			v.writeProperty(sub, p, "    ")
			j.w.WriteString("\n  }")
		} else {
			v.writeProperty(j, p, "  ")
		}
		warn = append(warn, v.warnings(p)...)
	}
	j.val("warnings", append([]string{}, warn...))
	j.timings([]stage{{"exact_s", rep.Exact}, {"float_s", rep.Float}, {"total_s", v.total}})
	return j.end()
}

// writeProperty writes one property's keys into j (the top level for
// controllability, a nested object for observability).
func (v *verifyResult) writeProperty(j *jsonw, p property, indent string) {
	r := p.r
	key := func(k string) {
		if !j.first {
			j.w.WriteString(",")
		}
		j.first = false
		j.w.WriteString("\n" + indent)
		j.w.Write(appendJSONString(nil, k))
		j.w.WriteString(": ")
	}
	num := func(k string, x float64) {
		key(k)
		if math.IsNaN(x) || math.IsInf(x, 0) {
			j.w.WriteString("null")
		} else {
			j.w.Write(strconv.AppendFloat(nil, x, 'g', -1, 64))
		}
	}
	key(p.verdict)
	j.w.WriteString(strconv.FormatBool(r.Full))
	key("sampled_dimension")
	j.w.WriteString(strconv.Itoa(r.Sampled))
	key(p.dimKey)
	j.w.WriteString(strconv.Itoa(r.Structural))
	key("agrees")
	j.w.WriteString(strconv.FormatBool(r.Agrees))
	key(p.countKey)
	j.w.WriteString(strconv.Itoa(r.Signals))
	num("margin", r.Margin)
	num("failure_bound", r.FailureBound)
	if r.FloatSkipped != "" {
		key("float_skipped")
		j.w.Write(appendJSONString(nil, r.FloatSkipped))
	}
	key("details")
	j.w.WriteString("[")
	for i, tr := range r.Trials {
		if i > 0 {
			j.w.WriteString(",")
		}
		d := trialJSON{Trial: i + 1, SampledDimension: tr.Dimension}
		if tr.AltDimension >= 0 {
			d.SecondPrime = &tr.AltDimension
		}
		if f := tr.Float; f != nil {
			d.Margin, d.Sigma, d.Scale = &f.Margin, &f.Sigma, &f.Scale
			d.At = []float64{real(f.At), imag(f.At)}
			d.Eigenvalues, d.Evaluated = &f.Eigenvalues, &f.Evaluated
			d.Shift, d.GramianMin, d.GramianMax = &f.Shift, &f.GramianMin, &f.GramianMax
		}
		b, err := json.Marshal(d)
		if err != nil && j.err == nil {
			j.err = err
		}
		j.w.WriteString("\n" + indent + "  ")
		j.w.Write(b)
	}
	if len(r.Trials) > 0 {
		j.w.WriteString("\n" + indent)
	}
	j.w.WriteString("]")
}

// trialJSON is one element of "details".
type trialJSON struct {
	Trial            int       `json:"trial"`
	SampledDimension int       `json:"sampled_dimension"`
	SecondPrime      *int      `json:"second_prime_dimension,omitempty"`
	Margin           *float64  `json:"margin,omitempty"`
	Sigma            *float64  `json:"smallest_singular_value,omitempty"`
	Scale            *float64  `json:"scale,omitempty"`
	At               []float64 `json:"at_eigenvalue,omitempty"`
	Eigenvalues      *int      `json:"eigenvalues,omitempty"`
	Evaluated        *int      `json:"eigenvalues_evaluated,omitempty"`
	Shift            *float64  `json:"shift,omitempty"`
	GramianMin       *float64  `json:"gramian_min,omitempty"`
	GramianMax       *float64  `json:"gramian_max,omitempty"`
}

func (v *verifyResult) writeCSV(w io.Writer) error {
	cw := csv.NewWriter(w)
	cw.Write([]string{"property", "trial", "sampled_dimension", "structural_dimension", "margin", "at_real", "at_imag", "gramian_min", "gramian_max", "shift"})
	g := func(x float64) string { return strconv.FormatFloat(x, 'g', -1, 64) }
	for _, p := range v.properties() {
		for i, tr := range p.r.Trials {
			row := []string{p.noun, strconv.Itoa(i + 1), strconv.Itoa(max(tr.Dimension, tr.AltDimension)), strconv.Itoa(p.r.Structural)}
			if f := tr.Float; f != nil {
				row = append(row, g(f.Margin), g(real(f.At)), g(imag(f.At)), g(f.GramianMin), g(f.GramianMax), g(f.Shift))
			} else {
				row = append(row, "", "", "", "", "", "")
			}
			cw.Write(row)
		}
	}
	cw.Flush()
	return cw.Error()
}
