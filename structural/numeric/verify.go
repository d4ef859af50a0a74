package numeric

import (
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"sync"
	"time"

	"github.com/netsteer/netsteer/structural"
)

// maxWorkers bounds the trials run at once, and so their memory.
const maxWorkers = 8

// Defaults of Options.
const (
	DefaultTrials         = 3
	MaxTrials             = 1000
	DefaultMaxStates      = 2000
	DefaultMaxFloatStates = 1000
)

// Options configure Verify.
type Options struct {
	// Trials is the number of independent random samples (default 3, at
	// most MaxTrials). It is ignored with Weights: the model's values are
	// one system.
	Trials int
	// Seed makes the samples reproducible: trial t draws A's exact values
	// from the PCG stream (Seed, 4t), A's real values from (Seed, 4t+1),
	// and the inputs' (outputs') exact then real values from (Seed, 4t+2)
	// ((Seed, 4t+3)).
	Seed uint64
	// Weights takes the model's own values instead of random ones: A from
	// the network's edge weights (g.Weights(); 1 for every edge when the
	// network has none), B and C from InputWeights and OutputWeights
	// (aligned with the signals; a nil list means 1 everywhere).
	Weights                     bool
	InputWeights, OutputWeights [][]float64
	// MaxStates is the largest network the exact check accepts (default
	// DefaultMaxStates); above it Verify returns a *SizeError with the
	// estimated cost.
	MaxStates int
	// MaxFloatStates is the largest network the floating-point check runs
	// on (default DefaultMaxFloatStates; negative: never).
	MaxFloatStates int
	// Float tunes the floating-point check; nil for the defaults.
	Float *FloatOptions
	// Progress, when not nil, receives progress reports, one at a time.
	Progress func(Progress)
}

// Progress reports how far Verify has come.
type Progress struct {
	Stage         string // "exact" or "float"
	Kind          string // "controllability" or "observability"
	Trial, Trials int    // 1-based
	Done, Total   int    // dimension reached of the structural one (exact)
}

// Report is the outcome of Verify.
type Report struct {
	// N and Edges describe the network checked (self-loops included).
	N, Edges int
	// Prime is the modulus of the exact check; Seed the seed used.
	Prime uint64
	Seed  uint64
	// Weights reports whether the model's own values were used;
	// NetworkWeights whether the network file carried any.
	Weights, NetworkWeights bool
	// Inexact counts the weights whose decimal text could not be recovered
	// from float64 (more than 15 significant digits, or a sum of merged
	// duplicate edges); their exact binary values were used instead.
	Inexact int
	// ZeroEntries counts edges whose value is zero: repeated edges whose
	// weights cancel. They stay in the structure but not in the numbers.
	ZeroEntries int
	// Controllability and Observability are nil when no inputs
	// (outputs) were given.
	Controllability, Observability *Result
	// Exact is the wall time of the exact check, Float that of the
	// floating-point check.
	Exact, Float time.Duration
}

// Result is the verification of one property (controllability of (A, B)
// or observability of (A, C)).
type Result struct {
	// Signals is the number of inputs (outputs).
	Signals int
	// Structural is the generic dimension predicted from the wiring
	// (structural.Check); Sampled the largest exact dimension over the
	// trials.
	Structural, Sampled int
	// Full reports Sampled == N: the sample is controllable (observable).
	Full bool
	// Agrees reports Sampled == Structural.
	Agrees bool
	// FailureBound is the Schwartz–Zippel bound on the chance that one
	// random trial falls short of the structural dimension: n²/(p-1). It
	// is 0 with Weights (nothing is random then).
	FailureBound float64
	// Trials holds each trial's own figures.
	Trials []Trial
	// Margin is the smallest relative margin over the trials (see
	// FloatResult.Margin); NaN when the floating-point check did not run.
	Margin float64
	// FloatSkipped says why the floating-point check did not run; empty
	// when it ran.
	FloatSkipped string
}

// Trial is one sample's figures.
type Trial struct {
	// Dimension is the exact dimension over GF(Prime).
	Dimension int
	// AltDimension is the dimension over GF(Alt61), computed only with
	// Weights when Dimension falls short of the structural one, to rule
	// out a prime that happens to divide the system's minors; -1 when not
	// computed.
	AltDimension int
	// Float is the floating-point check, nil when skipped.
	Float *FloatResult
}

// SizeError reports a network too large for the exact check under the
// current limit, with the estimated cost of running it anyway.
type SizeError struct {
	N, Max  int
	Time    time.Duration
	Bytes   int64
	Ops     float64
	Signals int
}

func (e *SizeError) Error() string {
	return fmt.Sprintf("numeric: %d states exceed the limit of %d for the exact check, which would take about %s and %s of memory",
		e.N, e.Max, FormatDuration(e.Time), FormatBytes(e.Bytes))
}

// FormatDuration prints a duration with two significant figures in the
// largest fitting unit.
func FormatDuration(d time.Duration) string {
	s := d.Seconds()
	switch {
	case s < 1:
		return "under a second"
	case s < 120:
		return fmt.Sprintf("%.2g s", s)
	case s < 7200:
		return fmt.Sprintf("%.2g min", s/60)
	case s < 2*86400:
		return fmt.Sprintf("%.2g h", s/3600)
	}
	return fmt.Sprintf("%.2g days", s/86400)
}

// FormatBytes prints a byte count in binary units.
func FormatBytes(b int64) string {
	switch {
	case b < 1<<20:
		return fmt.Sprintf("%d KiB", (b+1023)>>10)
	case b < 1<<30:
		return fmt.Sprintf("%.3g MiB", float64(b)/(1<<20))
	}
	return fmt.Sprintf("%.3g GiB", float64(b)/(1<<30))
}

// Verify samples the parameters of g's pattern (or takes its weights) and
// checks controllability from inputs and observability from outputs
// exactly and in floating point, beside the structural prediction. Input i
// drives the states inputs[i]; output i senses outputs[i]; either may be
// empty but not both.
func Verify(g *structural.Network, in, out structural.Design, opt Options) (*Report, error) {
	n := g.N()
	inputs, outputs := in.Signals(), out.Signals()
	if len(inputs) == 0 && len(outputs) == 0 {
		return nil, fmt.Errorf("numeric: no inputs and no outputs to verify")
	}
	trials := opt.Trials
	if trials <= 0 {
		trials = DefaultTrials
	}
	if trials > MaxTrials {
		return nil, fmt.Errorf("numeric: %d trials: at most %d (each trial already misses the generic dimension with probability at most n^2/p)", trials, MaxTrials)
	}
	if opt.Weights {
		trials = 1
	}
	maxStates := opt.MaxStates
	if maxStates <= 0 {
		maxStates = DefaultMaxStates
	}
	maxFloat := opt.MaxFloatStates
	if maxFloat == 0 {
		maxFloat = DefaultMaxFloatStates
	}
	rep := &Report{N: n, Edges: g.Edges(), Prime: Mersenne61, Seed: opt.Seed, Weights: opt.Weights,
		NetworkWeights: g.Weights() != nil}
	var kinds []*kind
	if len(inputs) > 0 {
		rep.Controllability = &Result{Signals: len(inputs)}
		d, err := structural.Dimension(g, structural.Controllability, in)
		if err != nil {
			return nil, err
		}
		rep.Controllability.Structural = d
		kinds = append(kinds, &kind{name: "controllability", res: rep.Controllability, signals: inputs, weights: opt.InputWeights, stream: 2})
	}
	if len(outputs) > 0 {
		rep.Observability = &Result{Signals: len(outputs)}
		d, err := structural.Dimension(g, structural.Observability, out)
		if err != nil {
			return nil, err
		}
		rep.Observability.Structural = d
		kinds = append(kinds, &kind{name: "observability", res: rep.Observability, signals: outputs, weights: opt.OutputWeights, transpose: true, stream: 3})
	}
	workers := min(trials, runtime.GOMAXPROCS(0), maxWorkers)
	if n > maxStates {
		var dims []int
		for _, k := range kinds {
			dims = append(dims, max(k.res.Structural, 1))
		}
		d, b := EstimateExact(n, g.Edges(), dims, trials, workers)
		e := &SizeError{N: n, Max: maxStates, Time: d, Bytes: b, Signals: len(inputs) + len(outputs)}
		for _, r := range dims {
			e.Ops += exactOps(n, g.Edges(), r) * float64(trials)
		}
		return nil, e
	}
	f := NewField(Mersenne61)
	var progMu sync.Mutex
	report := func(p Progress) {
		if opt.Progress != nil {
			progMu.Lock()
			opt.Progress(p)
			progMu.Unlock()
		}
	}
	// Values of A: one set per trial, shared by both properties so that a
	// trial checks one sampled system (A, B, C). They are drawn when a
	// trial runs (and drawn again, identically, for the floating-point
	// check), so memory holds the systems of the running trials only.
	var wExact []uint64
	var wReal []float64
	if opt.Weights {
		p := &Pattern{Out: g.Out()}
		x, inexact := ExactFromWeights(p, f, g.Weights(), nil)
		rep.Inexact += inexact
		wExact = x.A
		wReal = RealFromWeights(p, g.Weights(), nil).A
		for _, v := range wReal {
			if v == 0 {
				rep.ZeroEntries++
			}
		}
	}
	drawA := func(t int) ([]uint64, []float64) {
		if opt.Weights {
			return wExact, wReal
		}
		rng := rand.New(rand.NewPCG(opt.Seed, uint64(4*t)))
		ax := make([]uint64, g.Edges())
		for k := range ax {
			ax[k] = 1 + rng.Uint64N(f.P-1)
		}
		rr := rand.New(rand.NewPCG(opt.Seed, uint64(4*t+1)))
		ar := make([]float64, g.Edges())
		for k := range ar {
			ar[k] = drawReal(rr)
		}
		return ax, ar
	}
	// Values of B (C): per property and trial; the model's own values are
	// one system.
	for _, k := range kinds {
		k.pat = &Pattern{Out: g.Out(), Signals: k.signals}
		k.res.Trials = make([]Trial, trials)
		for t := range k.res.Trials {
			k.res.Trials[t].AltDimension = -1
		}
		if opt.Weights {
			b, inexact := exactSignals(&f, k.signals, k.weights)
			rep.Inexact += inexact
			k.wExact = &Exact{F: f, A: wExact, B: b}
			k.wReal = &Real{A: wReal, B: realSignals(k.signals, k.weights)}
		}
	}
	system := func(k *kind, t int) (*Exact, *Real) {
		if opt.Weights {
			return k.wExact, k.wReal
		}
		ax, ar := drawA(t)
		rng := rand.New(rand.NewPCG(opt.Seed, uint64(4*t)+k.stream))
		x := &Exact{F: f, A: ax, B: drawExactSignals(k.signals, f, rng)}
		return x, &Real{A: ar, B: drawRealSignals(k.signals, rng)}
	}
	// Exact check: trials in parallel, each property in turn.
	start := time.Now()
	for _, k := range kinds {
		var wg sync.WaitGroup
		sem := make(chan struct{}, workers)
		for t := 0; t < trials; t++ {
			wg.Add(1)
			sem <- struct{}{}
			go func(t int) {
				defer wg.Done()
				defer func() { <-sem }()
				last := time.Time{}
				prog := func(dim int) {
					if opt.Progress == nil || time.Since(last) < 200*time.Millisecond {
						return
					}
					last = time.Now()
					report(Progress{Stage: "exact", Kind: k.name, Trial: t + 1, Trials: trials, Done: dim, Total: k.res.Structural})
				}
				tr := &k.res.Trials[t]
				x, _ := system(k, t)
				tr.Dimension = Dimension(k.pat, x, k.transpose, prog)
				if opt.Weights && tr.Dimension < k.res.Structural {
					alt := NewField(Alt61)
					x, _ := ExactFromWeights(k.pat, alt, g.Weights(), k.weights)
					tr.AltDimension = Dimension(k.pat, x, k.transpose, prog)
				}
			}(t)
		}
		wg.Wait()
		r := k.res
		for _, tr := range r.Trials {
			r.Sampled = max(r.Sampled, tr.Dimension, tr.AltDimension)
		}
		r.Full = r.Sampled == n
		r.Agrees = r.Sampled == r.Structural
		if !opt.Weights {
			r.FailureBound = float64(n) * float64(n) / float64(Mersenne61-1)
		}
		r.Margin = math.NaN()
	}
	rep.Exact = time.Since(start)
	// Floating-point check: one system at a time, eigenvalues in parallel.
	start = time.Now()
	for _, k := range kinds {
		r := k.res
		switch {
		case maxFloat < 0:
			r.FloatSkipped = "turned off"
		case n > maxFloat:
			r.FloatSkipped = fmt.Sprintf("%d states exceed the limit of %d for the floating-point check", n, maxFloat)
		}
		if r.FloatSkipped != "" {
			continue
		}
		for t := 0; t < trials; t++ {
			report(Progress{Stage: "float", Kind: k.name, Trial: t + 1, Trials: trials})
			_, re := system(k, t)
			a, b := re.Dense(k.pat, k.transpose)
			fr, err := Float(a, b, n, len(k.signals), opt.Float)
			if err != nil {
				return nil, err
			}
			r.Trials[t].Float = fr
			if math.IsNaN(r.Margin) || fr.Margin < r.Margin {
				r.Margin = fr.Margin
			}
		}
	}
	rep.Float = time.Since(start)
	return rep, nil
}

// kind is one property under verification.
type kind struct {
	name      string
	res       *Result
	signals   [][]int32
	weights   [][]float64
	transpose bool
	stream    uint64 // PCG stream of the signal values, plus 4t
	pat       *Pattern
	// The system of the model's own values (with Weights).
	wExact *Exact
	wReal  *Real
}
