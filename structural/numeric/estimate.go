package numeric

import (
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"sync"
	"time"

	"gonum.org/v1/gonum/mat"
)

// Counts are the sizes a cost estimate needs: they can be read from a
// file's header or counted while reading, before a network is built.
type Counts struct {
	// States and Edges of the network (self-loops included).
	States, Edges int
	// Inputs and Outputs: the number of signals of each design (0: that
	// property is not verified).
	Inputs, Outputs int
}

// Estimate is the predicted cost of a computation on this machine. It is
// held in float64, not time.Duration, so that estimates of centuries do
// not overflow.
type Estimate struct {
	// Seconds of wall time.
	Seconds float64 `json:"seconds"`
	// Bytes of memory at the peak.
	Bytes float64 `json:"bytes"`
	// Operations: field multiply-adds for the exact check, floating-point
	// operations for the dense one.
	Operations float64 `json:"operations"`
}

// String prints the estimate as "about 3.2 h and 1.5 GiB of memory".
func (e Estimate) String() string {
	return "about " + FormatSeconds(e.Seconds) + " and " + FormatBytes(e.Bytes) + " of memory"
}

// Stage names a part of Verify with its own size limit.
type Stage string

const (
	// StageExact is the exact Krylov dimension over GF(p).
	StageExact Stage = "exact"
	// StageDense is the dense floating-point work: the margin, the modes
	// and the control effort.
	StageDense Stage = "dense"
)

// SizeError reports a network above the size limit of a stage, with the
// estimated cost of running it anyway.
type SizeError struct {
	// Stage is the computation refused.
	Stage Stage `json:"stage"`
	// States, Edges and Signals describe the network and designs.
	States  int `json:"states"`
	Edges   int `json:"edges"`
	Signals int `json:"signals"`
	// Limit is the largest number of states the stage accepts.
	Limit int `json:"limit"`
	// Estimate is the cost of the stage at this size; for the exact check
	// an upper bound that takes every dimension to be the number of
	// states.
	Estimate Estimate `json:"estimate"`
}

func (e *SizeError) Error() string {
	what := "the exact check"
	if e.Stage == StageDense {
		what = "the dense floating-point check"
	}
	return fmt.Sprintf("numeric: %d states exceed the limit of %d for %s, which would take up to %s",
		e.States, e.Limit, what, e.Estimate)
}

// exactOps estimates the field multiply-adds of one exact trial that
// reaches dimension r on n states and e edges with m signals: about 2r
// sparse products of e + n each (batches may overshoot a chain's end by as
// much as they keep), r kept vectors reduced against a basis growing to r
// rows of n entries (r²n/2), and each of the m signals reduced against at
// most r rows (m·r·n).
func exactOps(n, e, r, m int) float64 {
	fr, fn, fm := float64(r), float64(n), float64(min(m, n))
	return 2*fr*(float64(e)+fn) + fr*fr*fn/2 + fm*fr*fn
}

// exactBytes estimates the memory of one exact trial: the basis of r rows
// of n words, the waiting signals and the longest batch, doubled for the
// garbage collector's headroom (GOGC=100).
func exactBytes(n, r int) float64 {
	return 2 * float64(r+window+maxBatch) * float64(n) * 8
}

// cacheFactor scales the calibrated cost of a multiply-add, measured on a
// block that fits the cache, to bases that do not (measured on this
// project's benchmark machine: 1.0 at 500 states, about 1.5 at 2,000).
func cacheFactor(n, r int) float64 {
	if float64(r)*float64(n)*8 < 4<<20 {
		return 1
	}
	return 1.5
}

var calib struct {
	once  sync.Once
	ns    float64 // per grouped field multiply-add
	flops float64 // dense floating-point operations per second
}

// calibrate measures, once per process, the time of one grouped
// multiply-add of the elimination (about a millisecond of work, best of
// three runs) and the speed of a 192×192 dense product with gonum.
func calibrate() {
	calib.once.Do(func() {
		const n = 4096
		f := NewField(Mersenne61)
		rng := rand.New(rand.NewPCG(1, 1))
		v := make([]uint64, n)
		var rows [group][]uint64
		var coef [group]uint64
		for t := range rows {
			rows[t] = make([]uint64, n)
			for j := range rows[t] {
				rows[t][j] = rng.Uint64N(f.P)
			}
			coef[t] = rng.Uint64N(f.P)
		}
		best := time.Duration(1 << 62)
		for run := 0; run < 3; run++ {
			start := time.Now()
			for rep := 0; rep < 4; rep++ {
				sub8(&f, v, &coef, &rows)
			}
			best = min(best, time.Since(start))
		}
		calib.ns = math.Max(float64(best.Nanoseconds())/(4*group*n), 0.05)

		const d = 192
		a := mat.NewDense(d, d, nil)
		for i := 0; i < d; i++ {
			for j := 0; j < d; j++ {
				a.Set(i, j, rng.Float64())
			}
		}
		var c mat.Dense
		best = time.Duration(1 << 62)
		for run := 0; run < 3; run++ {
			start := time.Now()
			c.Mul(a, a)
			best = min(best, time.Since(start))
		}
		calib.flops = 2 * d * d * d / math.Max(best.Seconds(), 1e-6)
	})
}

// EstimateExact returns the estimated cost of the exact check on a
// network of the given counts, with trials run as Verify runs them. It is
// an upper bound: every dimension is taken to be the number of states
// (the structural dimension is not known before the network is built).
func EstimateExact(c Counts, trials int) Estimate {
	n := c.States
	var dims, sig []int
	if c.Inputs > 0 {
		dims, sig = append(dims, n), append(sig, c.Inputs)
	}
	if c.Outputs > 0 {
		dims, sig = append(dims, n), append(sig, c.Outputs)
	}
	return estimateExact(n, c.Edges, dims, sig, trials, workersFor(trials))
}

// workersFor is the number of exact trials Verify runs at once.
func workersFor(trials int) int { return max(1, min(trials, runtime.GOMAXPROCS(0), maxWorkers)) }

// estimateExact is EstimateExact for known dimensions dims (one per
// property) with sig signals each, trials run workers at a time.
func estimateExact(n, e int, dims, sig []int, trials, workers int) Estimate {
	calibrate()
	var ops, bytes float64
	for i, r := range dims {
		ops += exactOps(n, e, r, sig[i]) * cacheFactor(n, r)
		bytes = math.Max(bytes, exactBytes(n, r))
	}
	workers = max(1, min(workers, trials))
	rounds := float64((trials + workers - 1) / workers)
	return Estimate{
		Seconds:    ops * rounds * calib.ns / 1e9,
		Bytes:      bytes * float64(workers),
		Operations: ops * float64(trials),
	}
}

// denseFlops estimates the floating-point operations of the dense work on
// one system of n states per property: the real Schur form (about 25n³,
// Golub & Van Loan, Matrix Computations, 4th ed., §7.5.6, from memory),
// left eigenvectors (n³), the margin at every eigenvalue (about 4n³ per
// input column within the default budget) and the shifted Gramian (about
// 12n³ with the symmetric eigensolver); the modes add an orthogonal basis,
// a second Schur form and the exact quotient (about 30n³ at the worst),
// the effort a Lyapunov solve and an eigensolver (about 15n³) or, with a
// horizon, the exponential of a 2n×2n matrix (about 200n³).
func denseFlops(n int, modes, effort, horizon bool) float64 {
	f := float64(n) * float64(n) * float64(n)
	ops := 45 * f
	if modes {
		ops += 30 * f
	}
	if effort {
		ops += 15 * f
		if horizon {
			ops += 200 * f
		}
	}
	return ops
}

// EstimateDense returns the estimated cost of the dense floating-point
// work of Verify on n states for trials systems and props properties.
// Memory is about ten n×n matrices of float64 per property at the peak
// (twenty with a horizon, for the 2n×2n exponential).
func EstimateDense(n, props, trials int, modes, effort, horizon bool) Estimate {
	calibrate()
	ops := denseFlops(n, modes, effort, horizon) * float64(props*max(trials, 1))
	mats := 10.0
	if horizon && effort {
		mats = 20
	}
	// LAPACK-style routines run at about a quarter of the speed of a
	// matrix product in gonum (measured on the benchmark machine).
	return Estimate{
		Seconds:    ops / (calib.flops / 4),
		Bytes:      mats * float64(n) * float64(n) * 8,
		Operations: ops,
	}
}

// CheckSize refuses, from the counts alone, a network that Verify would
// refuse for req: more states than req.MaxStates (the exact check) or,
// when the modes or the effort are asked for, than req.MaxFloatStates
// (the dense floating-point work they need). It lets a caller refuse before reading a whole network. It does not
// apply to a request with a Part, whose size is known only once the part
// is cut out of the built network.
func CheckSize(c Counts, req Request) error {
	trials := req.trials()
	maxStates := req.MaxStates
	if maxStates <= 0 {
		maxStates = DefaultMaxStates
	}
	if c.States > maxStates {
		return &SizeError{Stage: StageExact, States: c.States, Edges: c.Edges, Signals: c.Inputs + c.Outputs,
			Limit: maxStates, Estimate: EstimateExact(c, trials)}
	}
	if limit := req.maxFloat(); (req.Modes || req.Effort) && limit >= 0 && c.States > limit {
		props := 0
		if c.Inputs > 0 {
			props++
		}
		if c.Outputs > 0 {
			props++
		}
		return &SizeError{Stage: StageDense, States: c.States, Edges: c.Edges, Signals: c.Inputs + c.Outputs,
			Limit: limit, Estimate: EstimateDense(c.States, props, trials, req.Modes, req.Effort, req.Horizon > 0)}
	}
	return nil
}

// FormatSeconds prints a time with two significant figures in the
// largest fitting unit, from "under a second" to years.
func FormatSeconds(s float64) string {
	const day, year = 86400, 365.25 * 86400
	switch {
	case math.IsNaN(s) || math.IsInf(s, 0):
		return "an unknown time"
	case s < 1:
		return "under a second"
	case s < 120:
		return fmt.Sprintf("%.2g s", s)
	case s < 7200:
		return fmt.Sprintf("%.2g min", s/60)
	case s < 2*day:
		return fmt.Sprintf("%.2g h", s/3600)
	case s < year:
		return fmt.Sprintf("%.2g days", s/day)
	}
	return fmt.Sprintf("%.2g years", s/year)
}

// FormatBytes prints a byte count in binary units, up to exbibytes.
func FormatBytes(b float64) string {
	switch {
	case math.IsNaN(b) || math.IsInf(b, 0):
		return "an unknown amount"
	case b < 1<<20:
		return fmt.Sprintf("%.0f KiB", math.Ceil(b/1024))
	case b < 1<<30:
		return fmt.Sprintf("%.3g MiB", b/(1<<20))
	case b < 1<<40:
		return fmt.Sprintf("%.3g GiB", b/(1<<30))
	case b < 1<<50:
		return fmt.Sprintf("%.3g TiB", b/(1<<40))
	case b < 1<<60:
		return fmt.Sprintf("%.3g PiB", b/(1<<50))
	}
	return fmt.Sprintf("%.3g EiB", b/(1<<60))
}
