package numeric

import (
	"fmt"
	"math"
	"math/rand/v2"
	"strconv"
	"sync"
	"time"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/strong"
)

// maxWorkers bounds the trials run at once, and so their memory.
const maxWorkers = 8

// Defaults and bounds of Request.
const (
	DefaultTrials         = 3
	MaxTrials             = 1000
	DefaultMaxStates      = 2000
	DefaultMaxFloatStates = 1000
	// DefaultWarnMargin is the relative margin below which Verify warns:
	// the numbers of a plant model are rarely known to better than six
	// digits, so a smaller change is within their uncertainty.
	DefaultWarnMargin = 1e-6
)

// Request says what Verify checks and how.
type Request struct {
	// Inputs and Outputs are the designs to verify: controllability of
	// (A, B) from the inputs, observability of (A, C) from the outputs. At
	// least one must be given and hold a signal.
	Inputs, Outputs *structural.Design
	// Weights takes the model's own values instead of random ones: A from
	// the network's edge weights (g.Weights(); 1 for every edge when the
	// network has none), B and C from InputWeights and OutputWeights
	// (aligned with the designs' signals and their states; a nil list, or
	// a nil entry, means 1).
	Weights                     bool
	InputWeights, OutputWeights [][]float64
	// Trials is the number of independent random samples (0:
	// DefaultTrials, at most MaxTrials). With Weights there is one system,
	// the model's.
	Trials int
	// Seed makes the samples reproducible: trial t draws A's exact values
	// from the PCG stream (Seed, 4t), A's real values from (Seed, 4t+1),
	// and the inputs' (outputs') exact then real values from (Seed, 4t+2)
	// ((Seed, 4t+3)).
	Seed uint64
	// MaxStates is the largest network (or part) the exact check accepts
	// (0: DefaultMaxStates); above it Verify returns a *SizeError.
	MaxStates int
	// MaxFloatStates is the largest network the dense floating-point work
	// runs on (0: DefaultMaxFloatStates; negative: never). Above it the
	// margin is skipped (PropertyResult.FloatSkipped says why), and a
	// request for Modes or Effort is refused with a *SizeError.
	MaxFloatStates int
	// WarnMargin is the relative margin below which a warning is given
	// (0: DefaultWarnMargin; negative: never).
	WarnMargin float64
	// Part, when not nil, verifies only a connected part of the network
	// (see Part); the structural prediction is then made for the part too.
	Part *Part
	// Float tunes the floating-point margin; nil for the defaults.
	Float *FloatOptions
	// Modes adds, per trial and property, the modes the signals cannot
	// move (see): eigenvalues, multiplicities, the states they live on,
	// whether they are stable (stabilizability, detectability), and with
	// both designs the sizes of the four parts of the Kalman
	// decomposition (see Modes, KalmanParts).
	Modes bool
	// Effort adds the control effort of each trial's system (see Effort):
	// the Gramian over Horizon (0: infinite, for a stable A only).
	Effort  bool
	Horizon float64
	// Discrete reads the systems as x(k+1) = A x(k) + B u(k): stability
	// means |λ| < 1 and the Gramian is a sum. It affects Modes and Effort
	// only.
	Discrete bool
	// Progress, when not nil, receives progress reports, one at a time.
	Progress func(Progress)
	// Strong, when not nil, adds the verdict for every parameter value of
	// this class (structural/strong) beside the generic one; its marks are
	// aligned with g's edges, and carried over to a part.
	Strong *strong.Class
}

func (r *Request) trials() int {
	switch {
	case r.Weights:
		return 1
	case r.Trials <= 0:
		return DefaultTrials
	}
	return r.Trials
}

func (r *Request) maxFloat() int {
	if r.MaxFloatStates == 0 {
		return DefaultMaxFloatStates
	}
	return r.MaxFloatStates
}

func (r *Request) warnMargin() float64 {
	if r.WarnMargin == 0 {
		return DefaultWarnMargin
	}
	return r.WarnMargin
}

// Progress reports how far Verify has come.
type Progress struct {
	Stage         string // "exact", "float" or "modes"
	Kind          string // "controllability" or "observability"
	Trial, Trials int    // 1-based
	Done, Total   int    // dimension reached of the structural one (exact)
}

// Modulus is a prime modulus of the exact check. It marshals to JSON as
// its name ("2^61-1"), since a JSON number of that size loses digits in
// many readers.
type Modulus uint64

// String names the modulus: "2^61-1", "2^61-31" or its decimal digits.
func (m Modulus) String() string {
	switch uint64(m) {
	case Mersenne61:
		return "2^61-1"
	case Alt61:
		return "2^61-31"
	}
	return strconv.FormatUint(uint64(m), 10)
}

// MarshalJSON writes the name as a JSON string.
func (m Modulus) MarshalJSON() ([]byte, error) { return strconv.AppendQuote(nil, m.String()), nil }

// Result is the answer of Verify: the structural verdict of each design
// beside its numeric confirmation on sampled (or the model's own) values.
type Result struct {
	// File names where the network came from; set by the caller.
	File string `json:"file,omitempty"`
	// Nodes, Edges, SelfLoops and DuplicatesMerged describe the whole
	// network given, as in every result of this project.
	Nodes            int `json:"nodes"`
	Edges            int `json:"edges"`
	SelfLoops        int `json:"self_loops"`
	DuplicatesMerged int `json:"duplicates_merged"`
	// Part describes the part verified, nil when the whole network was.
	// Every dimension below then counts states of the part.
	Part *PartResult `json:"part,omitempty"`
	// Weights reports whether the model's own values were used;
	// NetworkWeights whether the network carried any.
	Weights        bool `json:"weights"`
	NetworkWeights bool `json:"network_weights"`
	// Prime is the modulus of the exact check.
	Prime Modulus `json:"prime"`
	// Trials is the number of systems checked (1 with Weights).
	Trials int `json:"trials"`
	// Seed is the seed of the samples; nil with Weights.
	Seed *uint64 `json:"seed,omitempty"`
	// InexactWeights counts the values whose decimal text could not be
	// recovered from float64 (more than 15 significant digits, or a sum of
	// merged duplicate edges); their exact binary values were used.
	InexactWeights int `json:"inexact_weights"`
	// ZeroEntries counts edges whose value is zero: repeated edges whose
	// weights cancel. They stay in the structure but not in the numbers.
	ZeroEntries int `json:"zero_entries"`
	// TimeDomain is "continuous" or "discrete" when modes or efforts were
	// computed.
	TimeDomain string `json:"time_domain,omitempty"`
	// Controllability and Observability are nil when no inputs (outputs)
	// were given.
	Controllability *PropertyResult `json:"controllability,omitempty"`
	Observability   *PropertyResult `json:"observability,omitempty"`
	// Kalman gives, per trial, the sizes of the four parts of the Kalman
	// decomposition, with Modes and both designs.
	Kalman []KalmanParts `json:"kalman,omitempty"`
	// Warnings are what an engineer must hear about the numbers, one per
	// kind of finding and property.
	Warnings []Warning `json:"warnings"`
	// Cautions are the standing reminders a report must carry with these
	// figures.
	Cautions []string `json:"cautions"`
	Timings  Timings  `json:"timings"`

	// Network is the network verified: the given one, or the part's own
	// network (whose state i is Part.States.At(i) of the given one).
	Network *structural.Network `json:"-"`
}

// Holds reports whether every sampled (or the model's) system is
// controllable and observable as asked: the answer "yes".
func (r *Result) Holds() bool {
	for _, p := range r.Properties() {
		if !p.SampledHolds {
			return false
		}
	}
	return true
}

// Properties returns the properties verified, controllability first.
func (r *Result) Properties() []*PropertyResult {
	var out []*PropertyResult
	for _, p := range []*PropertyResult{r.Controllability, r.Observability} {
		if p != nil {
			out = append(out, p)
		}
	}
	return out
}

// Timings are the wall times of the stages of Verify, in seconds.
type Timings struct {
	// Part is the time to cut out the part (0 without one).
	Part float64 `json:"part_s,omitempty"`
	// Structural is the structural verdicts (Lin's test and the generic
	// dimension).
	Structural float64 `json:"structural_s"`
	Exact      float64 `json:"exact_s"`
	// Float includes the efforts, computed on the same Schur forms.
	Float float64 `json:"float_s"`
	Modes float64 `json:"modes_s,omitempty"`
	Total float64 `json:"total_s"`
}

// KalmanParts are the dimensions of the four parts of the Kalman
// decomposition of one system (A, B, C) (Kalman, "Mathematical
// description of linear dynamical systems", SIAM J. Control 1(2), 1963):
// controllable and observable (the order of a minimal realisation of the
// transfer function), controllable but unobservable, uncontrollable but
// observable, neither. They add up to the number of states. Exact over
// GF(p): with C the controllable subspace and N the unobservable one,
// dim C∩N = dim C - rank(B_C·B_Oᵀ) for bases B_C of C and B_O of the row
// space of the observability matrix.
type KalmanParts struct {
	Trial                      int `json:"trial"`
	ControllableObservable     int `json:"controllable_observable"`
	ControllableUnobservable   int `json:"controllable_unobservable"`
	UncontrollableObservable   int `json:"uncontrollable_observable"`
	UncontrollableUnobservable int `json:"uncontrollable_unobservable"`
}

// PropertyResult is one property verified: the structural verdict, with
// the same keys as in a check of the design, and the sampled figures
// beside it.
type PropertyResult struct {
	*structural.Verdict
	Sample
	// Strong is the verdict for every parameter value of the class asked
	// (Request.Strong), nil when not asked.
	Strong *strong.Result `json:"strong,omitempty"`
}

// Sample is the numeric side of a property.
type Sample struct {
	// SampledDimension is the largest exact dimension over the trials.
	SampledDimension int `json:"sampled_dimension"`
	// SampledHolds reports SampledDimension == N: the sampled system (or
	// the model) is controllable (observable).
	SampledHolds bool `json:"sampled_holds"`
	// Agrees reports SampledDimension == Dimension, the structural one.
	Agrees bool `json:"agrees"`
	// Margin is the smallest relative margin over the trials (see
	// FloatResult.Margin); nil when the floating-point check did not run.
	Margin *float64 `json:"margin,omitempty"`
	// FailureBound is the Schwartz–Zippel bound n²/(p-1) on the chance
	// that one random trial falls short of the structural dimension; 0
	// with Weights (nothing is random then).
	FailureBound float64 `json:"failure_bound"`
	// FloatSkipped says why the floating-point check did not run; empty
	// when it ran.
	FloatSkipped string `json:"float_skipped,omitempty"`
	// ModesStable, with Request.Modes, reports that in every trial every
	// mode the signals cannot move (see) is proved stable: the pair is
	// stabilizable (detectable, for outputs).
	ModesStable *bool `json:"modes_stable,omitempty"`
	// Trials holds each trial's own figures.
	Trials []Trial `json:"trials"`
}

// Trial is one sampled system's figures for one property.
type Trial struct {
	// Number is the 1-based trial number.
	Number int
	// Dimension is the exact dimension over GF(2^61-1).
	Dimension int
	// SecondPrime is the dimension over GF(2^61-31), computed only with
	// Weights when Dimension falls short of the structural one, to rule
	// out a prime that happens to divide the system's minors; nil when not
	// computed.
	SecondPrime *int
	// Float is the floating-point check, nil when skipped.
	Float *FloatResult
	// Modes (with Request.Modes) and Effort (with Request.Effort); nil
	// otherwise.
	Modes  *Modes
	Effort *Effort
}

// Verify samples the parameters of g's pattern (or takes the model's own
// values) and checks controllability from req.Inputs and observability
// from req.Outputs, exactly over GF(2^61-1) and in floating point, beside
// the structural verdict (structural.Check) of each design. With
// req.Part it verifies a connected part of g instead.
//
// With req.Modes it adds, per trial and property, the modes the signals
// cannot move (see) with their stability (Modes), and with both designs
// the four parts of the Kalman decomposition (KalmanParts); with
// req.Effort the Gramian figures of control effort (Effort).
//
// Time: the structural verdicts (one matching each, plus the generic
// dimension of a failing design); per trial and property, the exact
// Krylov dimension r in O(r·(E + r·n)) field operations and r·n words,
// trials in parallel; and, up to req.MaxFloatStates, the dense check in
// O(n³) per trial, the effort included. The modes add a second exact
// Krylov basis (of the floating-point values taken exactly), an
// orthonormal basis in O(n·r²), O(n²·k) for the uncontrollable block of
// size k = n - r, and O(k³) for its eigenvalues and its exact
// characteristic polynomial. Networks above req.MaxStates (and, for modes
// or effort, above req.MaxFloatStates) are refused before any of it with a
// *SizeError that carries the estimated cost.
func Verify(g *structural.Network, req Request) (*Result, error) {
	start := time.Now()
	var in, out structural.Design
	if req.Inputs != nil {
		in = *req.Inputs
	}
	if req.Outputs != nil {
		out = *req.Outputs
	}
	if in.Len() == 0 && out.Len() == 0 {
		return nil, errorf("no inputs and no outputs to verify")
	}
	if !in.Of(g) || !out.Of(g) {
		return nil, structural.ErrForeignDesign
	}
	if req.Trials > MaxTrials {
		return nil, errorf("%d trials: at most %d (each trial already misses the generic dimension with probability at most n^2/p)", req.Trials, MaxTrials)
	}
	if req.Effort {
		if err := (EffortRequest{Discrete: req.Discrete, Horizon: req.Horizon}).check(); err != nil {
			return nil, err
		}
	}
	if (req.Modes || req.Effort) && req.maxFloat() < 0 {
		return nil, errorf("the modes and the effort need the floating-point check, which is turned off")
	}
	if err := checkWeights(in, req.InputWeights, "input"); err != nil {
		return nil, err
	}
	if err := checkWeights(out, req.OutputWeights, "output"); err != nil {
		return nil, err
	}
	res := &Result{File: "", Nodes: g.N(), Edges: g.Edges(), SelfLoops: g.SelfLoops(), DuplicatesMerged: g.DuplicatesMerged(),
		Weights: req.Weights, NetworkWeights: g.Weights() != nil, Prime: Modulus(Mersenne61), Trials: req.trials()}
	if !req.Weights {
		seed := req.Seed
		res.Seed = &seed
	}
	if req.Modes || req.Effort {
		res.TimeDomain = timeDomain(req.Discrete)
	}
	inW, outW := req.InputWeights, req.OutputWeights
	if req.Part == nil {
		if err := CheckSize(Counts{States: g.N(), Edges: g.Edges(), Inputs: in.Len(), Outputs: out.Len()}, req); err != nil {
			return nil, err
		}
	} else {
		t := time.Now()
		sub, pr, rin, rout, rinW, routW, err := cutPart(g, &req, in, out)
		if err != nil {
			return nil, err
		}
		if err := CheckSize(Counts{States: sub.N(), Edges: sub.Edges(), Inputs: rin.Len(), Outputs: rout.Len()}, req); err != nil {
			return nil, err
		}
		if req.Strong != nil {
			c, err := partClass(g, sub, *req.Strong)
			if err != nil {
				return nil, err
			}
			req.Strong = &c
		}
		g, in, out, inW, outW = sub, rin, rout, rinW, routW
		res.Part = pr
		res.Timings.Part = time.Since(t).Seconds()
	}
	res.Network = g
	if err := verify(g, &req, in, out, inW, outW, res); err != nil {
		return nil, err
	}
	res.Warnings = warnings(res, &req)
	res.Cautions = cautions(res)
	res.Timings.Total = time.Since(start).Seconds()
	return res, nil
}

// checkWeights checks that values, when given, align with the design.
func checkWeights(d structural.Design, w [][]float64, what string) error {
	if w == nil {
		return nil
	}
	if len(w) != d.Len() {
		return errorf("%d %s values for %d signals", len(w), what, d.Len())
	}
	for j, s := range w {
		if s == nil {
			continue
		}
		if len(s) != len(d.Signal(j)) {
			return errorf("%s %d has %d values for %d states", what, d.Number(j), len(s), len(d.Signal(j)))
		}
		for _, x := range s {
			if math.IsNaN(x) || math.IsInf(x, 0) {
				return errorf("%s %d has a value that is not a finite number", what, d.Number(j))
			}
		}
	}
	return nil
}

// kind is one property under verification.
type kind struct {
	prop      structural.Property
	res       *PropertyResult
	design    structural.Design
	signals   [][]int32
	weights   [][]float64
	transpose bool
	stream    uint64 // PCG stream of the signal values, plus 4t
	pat       *Pattern
	// The system of the model's own values (with Weights).
	wExact *Exact
	wReal  *Real
}

func (k *kind) name() string { return k.prop.String() }

// verify fills res for the network g (the part, when one was cut) and its
// designs.
func verify(g *structural.Network, req *Request, in, out structural.Design, inW, outW [][]float64, res *Result) error {
	n := g.N()
	trials := req.trials()
	maxFloat := req.maxFloat()
	var kinds []*kind
	t0 := time.Now()
	for _, x := range []struct {
		p      structural.Property
		d      structural.Design
		w      [][]float64
		stream uint64
		to     **PropertyResult
	}{
		{structural.Controllability, in, inW, 2, &res.Controllability},
		{structural.Observability, out, outW, 3, &res.Observability},
	} {
		asked := req.Inputs
		if x.p == structural.Observability {
			asked = req.Outputs
		}
		if asked == nil || asked.Len() == 0 {
			continue
		}
		v, err := structural.Check(g, x.p, x.d)
		if err != nil {
			return err
		}
		pr := &PropertyResult{Verdict: v}
		if req.Strong != nil {
			if pr.Strong, err = strong.Check(g, strong.Request{Property: x.p, Design: x.d, Class: *req.Strong}); err != nil {
				return err
			}
		}
		*x.to = pr
		kinds = append(kinds, &kind{prop: x.p, res: pr, design: x.d, signals: x.d.Signals(), weights: x.w,
			transpose: x.p == structural.Observability, stream: x.stream})
	}
	res.Timings.Structural = time.Since(t0).Seconds()

	f := NewField(Mersenne61)
	var progMu sync.Mutex
	report := func(p Progress) {
		if req.Progress != nil {
			progMu.Lock()
			req.Progress(p)
			progMu.Unlock()
		}
	}
	// Values of A: one set per trial, shared by both properties so that a
	// trial checks one sampled system (A, B, C). They are drawn when a
	// trial runs (and drawn again, identically, for the floating-point
	// check), so memory holds the systems of the running trials only.
	var wExact []uint64
	var wReal []float64
	if req.Weights {
		p := &Pattern{Out: g.Out()}
		x, inexact := ExactFromWeights(p, f, g.Weights(), nil)
		res.InexactWeights += inexact
		wExact = x.A
		wReal = RealFromWeights(p, g.Weights(), nil).A
		for _, v := range wReal {
			if v == 0 {
				res.ZeroEntries++
			}
		}
	}
	drawA := func(t int) ([]uint64, []float64) {
		if req.Weights {
			return wExact, wReal
		}
		rng := rand.New(rand.NewPCG(req.Seed, uint64(4*t)))
		ax := make([]uint64, g.Edges())
		for k := range ax {
			ax[k] = 1 + rng.Uint64N(f.P-1)
		}
		rr := rand.New(rand.NewPCG(req.Seed, uint64(4*t+1)))
		ar := make([]float64, g.Edges())
		for k := range ar {
			ar[k] = drawReal(rr)
		}
		return ax, ar
	}
	for _, k := range kinds {
		k.pat = &Pattern{Out: g.Out(), Signals: k.signals}
		k.res.Trials = make([]Trial, trials)
		for t := range k.res.Trials {
			k.res.Trials[t].Number = t + 1
		}
		if req.Weights {
			b, inexact := exactSignals(&f, k.signals, k.weights)
			res.InexactWeights += inexact
			k.wExact = &Exact{F: f, A: wExact, B: b}
			k.wReal = &Real{A: wReal, B: realSignals(k.signals, k.weights)}
		}
	}
	system := func(k *kind, t int) (*Exact, *Real) {
		if req.Weights {
			return k.wExact, k.wReal
		}
		ax, ar := drawA(t)
		rng := rand.New(rand.NewPCG(req.Seed, uint64(4*t)+k.stream))
		x := &Exact{F: f, A: ax, B: drawExactSignals(k.signals, f, rng)}
		return x, &Real{A: ar, B: drawRealSignals(k.signals, rng)}
	}

	// Exact check: trials in parallel, each property in turn.
	t0 = time.Now()
	workers := workersFor(trials)
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
					if req.Progress == nil || time.Since(last) < 200*time.Millisecond {
						return
					}
					last = time.Now()
					report(Progress{Stage: "exact", Kind: k.name(), Trial: t + 1, Trials: trials, Done: dim, Total: k.res.Dimension})
				}
				tr := &k.res.Trials[t]
				x, _ := system(k, t)
				tr.Dimension = Dimension(k.pat, x, k.transpose, prog)
				if req.Weights && tr.Dimension < k.res.Dimension {
					alt := NewField(Alt61)
					x, _ := ExactFromWeights(k.pat, alt, g.Weights(), k.weights)
					d := Dimension(k.pat, x, k.transpose, prog)
					tr.SecondPrime = &d
				}
			}(t)
		}
		wg.Wait()
		r := k.res
		for _, tr := range r.Trials {
			r.SampledDimension = max(r.SampledDimension, tr.Dimension)
			if tr.SecondPrime != nil {
				r.SampledDimension = max(r.SampledDimension, *tr.SecondPrime)
			}
		}
		r.SampledHolds = r.SampledDimension == n
		r.Agrees = r.SampledDimension == r.Dimension
		if !req.Weights {
			r.FailureBound = float64(n) * float64(n) / float64(Mersenne61-1)
		}
	}
	res.Timings.Exact = time.Since(t0).Seconds()

	// Floating-point check: one system at a time, eigenvalues in parallel.
	t0 = time.Now()
	for _, k := range kinds {
		r := k.res
		switch {
		case maxFloat < 0:
			r.FloatSkipped = "the floating-point check is turned off"
		case n > maxFloat:
			r.FloatSkipped = fmt.Sprintf("%d states exceed the limit of %d for the floating-point check", n, maxFloat)
		case req.Weights && !req.Modes && !req.Effort && squaresOverflow(k, system):
			// The model's own numbers only: sampled values are at most
			// one in size. Modes and Effort need the floating-point
			// system, so they stop with the error instead.
			r.FloatSkipped = "the model's numbers are too large for floating point (the sum of their squares overflows); scale them for the margin"
		}
		if r.FloatSkipped != "" {
			continue
		}
		for t := 0; t < trials; t++ {
			report(Progress{Stage: "float", Kind: k.name(), Trial: t + 1, Trials: trials})
			_, re := system(k, t)
			a, b := re.Dense(k.pat, k.transpose)
			fr, sf, c, err := floatCheck(a, b, n, len(k.signals), req.Float)
			if err != nil {
				return err
			}
			r.Trials[t].Float = fr
			if req.Effort {
				solver, err := newEffortSolver(sf, EffortRequest{Discrete: req.Discrete, Horizon: req.Horizon})
				if err != nil {
					return err
				}
				if r.Trials[t].Effort, err = solver.effort(c, len(k.signals)); err != nil {
					return err
				}
			}
			if r.Margin == nil || fr.Margin < *r.Margin {
				m := fr.Margin
				r.Margin = &m
			}
		}
	}
	res.Timings.Float = time.Since(t0).Seconds()
	if req.Modes {
		t0 = time.Now()
		if err := verifyModes(g, req, kinds, system, res); err != nil {
			return err
		}
		res.Timings.Modes = time.Since(t0).Seconds()
	}
	return nil
}

// squaresOverflow reports whether the sum of the squares of the entries of
// k's first system (A and B) overflows float64, so that no floating-point
// check can run on it.
func squaresOverflow(k *kind, system func(*kind, int) (*Exact, *Real)) bool {
	_, re := system(k, 0)
	var ss float64
	for _, x := range re.A {
		ss += x * x
	}
	for _, s := range re.B {
		for _, x := range s {
			ss += x * x
		}
	}
	return math.IsInf(ss, 0)
}

// verifyModes analyses the stuck modes of every trial's real system, and
// the Kalman parts when both properties are verified.
func verifyModes(g *structural.Network, req *Request, kinds []*kind, system func(*kind, int) (*Exact, *Real), res *Result) error {
	n := g.N()
	main, alt := NewField(Mersenne61), NewField(Alt61)
	for _, k := range kinds {
		stable := true
		k.res.ModesStable = &stable
	}
	for t := 0; t < req.trials(); t++ {
		report := func(p Progress) {
			if req.Progress != nil {
				req.Progress(p)
			}
		}
		type basis struct {
			kb *krylovBasis
			f  Field
		}
		var bases []basis
		for _, k := range kinds {
			report(Progress{Stage: "modes", Kind: k.name(), Trial: t + 1, Trials: req.trials()})
			_, re := system(k, t)
			image := func(f Field) *Exact {
				if req.Weights {
					x, _ := ExactFromWeights(k.pat, f, g.Weights(), k.weights)
					return x
				}
				return exactOf(re, f, false)
			}
			first, second := main, alt
			x := image(first)
			kb := krylov(k.pat, x, k.transpose, nil)
			if len(kb.rows) < k.res.Dimension {
				// A prime dividing the minors would invent modes: try the
				// other one and keep the larger dimension.
				x2 := image(second)
				if kb2 := krylov(k.pat, x2, k.transpose, nil); len(kb2.rows) > len(kb.rows) {
					x, kb, first, second = x2, kb2, second, first
				}
			}
			a, b := re.Dense(k.pat, k.transpose)
			other := second
			sys := &realSystem{p: k.pat, re: re, transpose: k.transpose, n: n, m: len(k.signals), a: a, b: b,
				exact: x, alt: func() *Exact { return image(other) }, decimal: req.Weights}
			md, err := stuckModes(sys, kb, req.Discrete, g.States)
			if err != nil {
				return err
			}
			k.res.Trials[t].Modes = md
			if !md.Stable {
				*k.res.ModesStable = false
			}
			bases = append(bases, basis{kb, first})
		}
		if len(kinds) == 2 {
			c, o := bases[0], bases[1]
			if c.f.P != o.f.P {
				// Bring both to the prime that found the larger dimension
				// (the second: the first is tried first): recompute the
				// kind still on the first.
				k := kinds[0]
				if c.f.P == alt.P {
					k = kinds[1]
				}
				_, re := system(k, t)
				var x *Exact
				if req.Weights {
					x, _ = ExactFromWeights(k.pat, alt, g.Weights(), k.weights)
				} else {
					x = exactOf(re, alt, false)
				}
				kb := krylov(k.pat, x, k.transpose, nil)
				if k == kinds[0] {
					c = basis{kb, alt}
				} else {
					o = basis{kb, alt}
				}
			}
			rc, ro := len(c.kb.rows), len(o.kb.rows)
			var co int
			switch {
			case rc == n:
				co = ro
			case ro == n:
				co = rc
			default:
				co = jointRank(&c.f, c.kb.rows, o.kb.rows)
			}
			res.Kalman = append(res.Kalman, KalmanParts{Trial: t + 1, ControllableObservable: co,
				ControllableUnobservable: rc - co, UncontrollableObservable: ro - co,
				UncontrollableUnobservable: n - rc - ro + co})
		}
	}
	return nil
}

// partClass carries the may-be-zero marks of c, aligned with g's edges,
// over to the part sub (whose states keep g's names).
func partClass(g, sub *structural.Network, c strong.Class) (strong.Class, error) {
	if c.MayBeZero == nil {
		return c, nil
	}
	var pairs []structural.Edge
	out := g.Out()
	for u := int32(0); int(u) < g.N(); u++ {
		for k := out.Ptr[u]; k < out.Ptr[u+1]; k++ {
			if !c.MayBeZero[k] {
				continue
			}
			a, ok1 := sub.Lookup(g.Name(u))
			b, ok2 := sub.Lookup(g.Name(out.Adj[k]))
			if ok1 && ok2 {
				pairs = append(pairs, structural.Edge{From: a, To: b})
			}
		}
	}
	marks, err := strong.Marks(sub, pairs)
	if err != nil {
		return c, err
	}
	c.MayBeZero = marks
	return c, nil
}
