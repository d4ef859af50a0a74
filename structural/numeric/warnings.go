package numeric

import (
	"fmt"
	"math"
	"strconv"
)

// WarningKind names a kind of finding about the numbers.
type WarningKind string

// The kinds of warnings. Each is given at most once per property (or once
// for the whole result), with the trials concerned and the worst figure.
const (
	// WarnRoundingLevel: the system is controllable exactly, but its
	// margin is at the rounding level of floating point (Level =
	// RoundingLevel(N)): numerically it cannot be told from one that is
	// not.
	WarnRoundingLevel WarningKind = "margin_at_rounding_level"
	// WarnLowMargin: the margin is below the warning level (Level):
	// a change of that relative size in the numbers makes an eigenvalue
	// uncontrollable.
	WarnLowMargin WarningKind = "margin_below_warning_level"
	// WarnShiftedGramian: the Gramian of the shifted system is numerically
	// singular (Value = smallest/largest eigenvalue, Level = rounding
	// level).
	WarnShiftedGramian WarningKind = "shifted_gramian_singular"
	// WarnPartialMargin: the margin was evaluated at some eigenvalues
	// only, those most weakly coupled to the signals (Value = the smallest
	// relative coupling bound of those left out).
	WarnPartialMargin WarningKind = "margin_partial"
	// WarnBelowStructure: the sample (or the model) falls short of the
	// structural dimension (Count = the directions lost). With the model's
	// numbers ties or cancellations among them cause it; with random
	// samples it happens by chance with probability at most Value.
	WarnBelowStructure WarningKind = "below_structure"
	// WarnAboveStructure: a sample exceeds the structural dimension, which
	// cannot happen: a bug to report.
	WarnAboveStructure WarningKind = "above_structure"
	// WarnPrimesDisagree: with the model's numbers the two primes give
	// different dimensions: the first divides the minors; the larger
	// dimension is kept.
	WarnPrimesDisagree WarningKind = "primes_disagree"
	// WarnNoNetworkWeights: the model's numbers were asked for, but the
	// network has none: every entry of A is 1.
	WarnNoNetworkWeights WarningKind = "network_without_weights"
	// WarnInexactWeights: Count values had more than 15 significant
	// digits (or were sums of repeated edges); their binary values were
	// used, not their decimal text.
	WarnInexactWeights WarningKind = "inexact_weights"
	// WarnZeroEntries: Count entries of A are zero (repeated edges whose
	// weights cancel).
	WarnZeroEntries WarningKind = "zero_entries"
	// WarnPartOnly: only a part of the network was verified.
	WarnPartOnly WarningKind = "part_only"
	// WarnSignalsLeftOut: Count signals act only outside the part.
	WarnSignalsLeftOut WarningKind = "signals_left_out"
	// WarnModesUndecided: Count modes lie within their error bound of the
	// stability boundary: whether feedback must move them is not decided.
	WarnModesUndecided WarningKind = "modes_undecided"
	// WarnKalmanResidual: the floating-point basis of the controllable
	// subspace is far from invariant (Value = the residual, Level =
	// KalmanResidualLevel): the floating-point modes are unreliable.
	WarnKalmanResidual WarningKind = "kalman_residual"
	// WarnEffortSkipped: the infinite-horizon Gramian does not exist for
	// an unstable A (Value = the spectral abscissa or radius).
	WarnEffortSkipped WarningKind = "effort_skipped"
	// WarnGramianSingular: the system is controllable exactly, but its
	// Gramian is singular within rounding: some direction needs input
	// energy beyond the precision of the others (Value =
	// smallest/largest eigenvalue).
	WarnGramianSingular WarningKind = "gramian_singular"
)

// KalmanResidualLevel is the Kalman residual above which the
// floating-point modes are flagged: a basis this far from invariant moves
// eigenvalues by about as much, relative to ‖A‖.
const KalmanResidualLevel = 1e-6

// Warning is one finding about the numbers, as data, with a sentence that
// words it for a report.
type Warning struct {
	Kind WarningKind `json:"kind"`
	// Property is "controllability" or "observability"; empty for a
	// finding about the whole system.
	Property string `json:"property,omitempty"`
	// Trials are the 1-based trials concerned, WorstTrial the one with the
	// worst figure.
	Trials     []int `json:"trials,omitempty"`
	WorstTrial int   `json:"worst_trial,omitempty"`
	// Value is the worst figure and Level the threshold it was compared
	// with, when the kind has them.
	Value *float64 `json:"value,omitempty"`
	Level *float64 `json:"level,omitempty"`
	// AtRe and AtIm give the eigenvalue concerned, when there is one.
	AtRe *float64 `json:"at_re,omitempty"`
	AtIm *float64 `json:"at_im,omitempty"`
	// Count is the number of items concerned, when the kind counts.
	Count int `json:"count,omitempty"`
	// Message words the finding in one sentence.
	Message string `json:"message"`
}

func ptr(x float64) *float64 {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return nil
	}
	return &x
}

// FormatEigenvalue prints an eigenvalue with four significant digits,
// parts below 1e-12 of scale shown as 0 (rounding noise of the Schur
// form).
func FormatEigenvalue(z complex128, scale float64) string {
	re, im := real(z), imag(z)
	if math.Abs(re) < 1e-12*scale {
		re = 0
	}
	if math.Abs(im) < 1e-12*scale {
		im = 0
	}
	if im == 0 {
		return strconv.FormatFloat(re, 'g', 4, 64)
	}
	return fmt.Sprintf("%.4g%+.4gi", re, im)
}

// warnings lists the findings of res, computed from its numbers.
func warnings(res *Result, req *Request) []Warning {
	out := []Warning{}
	n := res.Network.N()
	round := RoundingLevel(n)
	warnAt := req.warnMargin()
	for _, p := range res.Properties() {
		prop := p.Property.String()
		adj := "controllable"
		if p.Property.String() == "observability" {
			adj = "observable"
		}
		who := func(idx []int) string {
			switch {
			case res.Weights:
				return "With the model's numbers"
			case len(p.Trials) == 1:
				return "In the sample"
			}
			return fmt.Sprintf("In %d of %d trials", len(idx), len(p.Trials))
		}
		var atRound, fragile, singular, partial []int
		for i, tr := range p.Trials {
			f := tr.Float
			if f == nil || !p.SampledHolds {
				continue
			}
			switch {
			case f.Margin <= round:
				atRound = append(atRound, i)
			case warnAt > 0 && f.Margin < warnAt:
				fragile = append(fragile, i)
			}
			if f.GramianMin <= 0 || f.GramianMin < round*f.GramianMax {
				singular = append(singular, i)
			}
			if f.Evaluated < f.Eigenvalues {
				partial = append(partial, i)
			}
		}
		worst := func(idx []int, val func(*FloatResult) float64) (int, float64) {
			best, bv := -1, math.Inf(1)
			for _, i := range idx {
				if x := val(p.Trials[i].Float); x < bv {
					best, bv = i, x
				}
			}
			return best, bv
		}
		numbers := func(idx []int) []int {
			out := make([]int, len(idx))
			for k, i := range idx {
				out[k] = i + 1
			}
			return out
		}
		margin := func(f *FloatResult) float64 { return f.Margin }
		if len(atRound) > 0 {
			i, m := worst(atRound, margin)
			f := p.Trials[i].Float
			out = append(out, Warning{Kind: WarnRoundingLevel, Property: prop, Trials: numbers(atRound), WorstTrial: i + 1,
				Value: ptr(m), Level: ptr(round), AtRe: ptr(real(f.At)), AtIm: ptr(imag(f.At)),
				Message: fmt.Sprintf("%s the system is %s exactly, but its margin %.2g is at the rounding level of floating point (100 N eps = %.2g): numerically it cannot be told from one that is not (eigenvalue %s).",
					who(atRound), adj, m, round, FormatEigenvalue(f.At, f.Scale))})
		}
		if len(fragile) > 0 {
			i, m := worst(fragile, margin)
			f := p.Trials[i].Float
			out = append(out, Warning{Kind: WarnLowMargin, Property: prop, Trials: numbers(fragile), WorstTrial: i + 1,
				Value: ptr(m), Level: ptr(warnAt), AtRe: ptr(real(f.At)), AtIm: ptr(imag(f.At)),
				Message: fmt.Sprintf("%s the system is close to losing %s: a change of relative size %.2g in the numbers makes eigenvalue %s un%s (warning level %g).",
					who(fragile), prop, m, FormatEigenvalue(f.At, f.Scale), adj, warnAt)})
		}
		if len(singular) > 0 {
			i, g := worst(singular, func(f *FloatResult) float64 { return f.GramianMin / f.GramianMax })
			out = append(out, Warning{Kind: WarnShiftedGramian, Property: prop, Trials: numbers(singular), WorstTrial: i + 1,
				Value: ptr(g), Level: ptr(round),
				Message: fmt.Sprintf("%s the Gramian of the shifted system is numerically singular (smallest/largest eigenvalue %.2g, below 100 N eps): some directions take input energy beyond the precision of the strongest ones, common in large networks with few signals.",
					who(singular), g)})
		}
		if len(partial) > 0 {
			i, _ := worst(partial, margin)
			f := p.Trials[i].Float
			out = append(out, Warning{Kind: WarnPartialMargin, Property: prop, Trials: numbers(partial), WorstTrial: i + 1,
				Value: ptr(f.NextBound / f.Scale), Count: f.Evaluated,
				Message: fmt.Sprintf("%s the margin was evaluated at %d of %d eigenvalues, those with the weakest coupling to the signals (the time for all grows as N^3 times the signals); the others' coupling bound is at least %.2g.",
					who(partial), f.Evaluated, f.Eigenvalues, f.NextBound/f.Scale)})
		}
		var undecided, resid, skipped, gsing []int
		undecidedCount, worstResid := 0, 0.0
		for i, tr := range p.Trials {
			if m := tr.Modes; m != nil {
				if m.Undecided > 0 {
					undecided = append(undecided, i)
					undecidedCount = max(undecidedCount, m.Undecided)
				}
				if m.KalmanResidual > KalmanResidualLevel {
					resid = append(resid, i)
					worstResid = math.Max(worstResid, m.KalmanResidual)
				}
			}
			if e := tr.Effort; e != nil {
				if e.Skipped != "" {
					skipped = append(skipped, i)
				} else if math.IsInf(e.WorstCaseEnergy, 1) && tr.Dimension == n {
					gsing = append(gsing, i)
				}
			}
		}
		if len(undecided) > 0 {
			out = append(out, Warning{Kind: WarnModesUndecided, Property: prop, Trials: numbers(undecided), WorstTrial: undecided[0] + 1, Count: undecidedCount,
				Message: fmt.Sprintf("%s %d %s that the signals cannot move lie within rounding of the stability boundary: whether feedback must move them is not decided.",
					who(undecided), undecidedCount, plural(undecidedCount, "mode", "modes"))})
		}
		if len(resid) > 0 {
			out = append(out, Warning{Kind: WarnKalmanResidual, Property: prop, Trials: numbers(resid), Value: ptr(worstResid), Level: ptr(KalmanResidualLevel),
				Message: fmt.Sprintf("%s the floating-point basis of the controllable subspace is far from invariant (residual %.2g): the values of the modes known in floating point only are unreliable; their number and the exact ones are not affected.",
					who(resid), worstResid)})
		}
		if len(skipped) > 0 {
			e := p.Trials[skipped[0]].Effort
			v := e.SpectralAbscissa
			if req.Discrete {
				v = e.SpectralRadius
			}
			out = append(out, Warning{Kind: WarnEffortSkipped, Property: prop, Trials: numbers(skipped), WorstTrial: skipped[0] + 1, Value: ptr(v),
				Message: fmt.Sprintf("%s A is not stable, so the infinite-horizon Gramian does not exist: the control effort needs a finite horizon.", who(skipped))})
		}
		if len(gsing) > 0 {
			e := p.Trials[gsing[0]].Effort
			out = append(out, Warning{Kind: WarnGramianSingular, Property: prop, Trials: numbers(gsing), WorstTrial: gsing[0] + 1,
				Value: ptr(e.GramianMin / e.GramianMax), Level: ptr(round),
				Message: fmt.Sprintf("%s the system is %s exactly, but its Gramian is singular within rounding (smallest/largest eigenvalue %.2g): some direction needs input energy beyond the precision of the others.",
					who(gsing), adj, e.GramianMin/e.GramianMax)})
		}
		lost := p.Dimension - p.SampledDimension
		switch {
		case lost < 0:
			out = append(out, Warning{Kind: WarnAboveStructure, Property: prop, Count: -lost,
				Message: fmt.Sprintf("The exact dimension %d exceeds the structural prediction %d. This cannot happen; please report it as a bug.", p.SampledDimension, p.Dimension)})
		case lost > 0 && res.Weights:
			out = append(out, Warning{Kind: WarnBelowStructure, Property: prop, Count: lost,
				Message: fmt.Sprintf("With the model's numbers the dimension is %d, although the structure predicts %d: ties or cancellations among the weights lose %d %s.",
					p.SampledDimension, p.Dimension, lost, plural(lost, "direction", "directions"))})
		case lost > 0:
			chance := math.Pow(p.FailureBound, float64(len(p.Trials)))
			out = append(out, Warning{Kind: WarnBelowStructure, Property: prop, Count: lost, Value: ptr(chance),
				Message: fmt.Sprintf("Every trial falls below the structural dimension %d (best %d), by chance with probability at most %.2g; rerun with another seed, and if it persists, please report it.",
					p.Dimension, p.SampledDimension, chance)})
		}
		for _, tr := range p.Trials {
			if tr.SecondPrime != nil && *tr.SecondPrime != tr.Dimension {
				out = append(out, Warning{Kind: WarnPrimesDisagree, Property: prop, Trials: []int{tr.Number},
					Message: fmt.Sprintf("Over GF(2^61-31) the dimension is %d and over GF(2^61-1) %d: the first prime divides the minors, and the larger value is kept.", *tr.SecondPrime, tr.Dimension)})
				break
			}
		}
	}
	if res.Weights && !res.NetworkWeights {
		out = append(out, Warning{Kind: WarnNoNetworkWeights, Message: "The network has no weights: every entry of A is 1."})
	}
	if k := res.InexactWeights; k > 0 {
		out = append(out, Warning{Kind: WarnInexactWeights, Count: k,
			Message: fmt.Sprintf("%d %s more than 15 significant digits (or %s a sum of repeated edges): %s exact binary value was used, not the decimal text.",
				k, plural(k, "weight has", "weights have"), plural(k, "is", "are"), plural(k, "its", "their"))})
	}
	if k := res.ZeroEntries; k > 0 {
		out = append(out, Warning{Kind: WarnZeroEntries, Count: k,
			Message: fmt.Sprintf("%d %s of A %s zero: repeated edges whose weights cancel.", k, plural(k, "entry", "entries"), plural(k, "is", "are"))})
	}
	if pr := res.Part; pr != nil {
		out = append(out, Warning{Kind: WarnPartOnly, Count: pr.Nodes,
			Message: fmt.Sprintf("Only a part of the network was verified, %s (%d of %d states): it lacks the couplings from the rest of the network, and the structural prediction is made for the part too.",
				pr.Describe(), pr.Nodes, res.Nodes)})
		if k := pr.SignalsLeftOut; k > 0 {
			out = append(out, Warning{Kind: WarnSignalsLeftOut, Count: k,
				Message: fmt.Sprintf("%d %s acting only outside that part %s left out.", k, plural(k, "signal", "signals"), plural(k, "was", "were"))})
		}
	}
	return out
}

// Standing cautions of a result.
const (
	CautionScreening    = "Numeric results describe the numbers checked. Like the structural results they are a screening step, no substitute for dynamic studies, safety analysis, local codes or licensed engineering review."
	CautionMargin       = "The margin is for unstructured changes of A and B and is evaluated at the eigenvalues of A only, so the true distance to an uncontrollable design can be smaller."
	CautionFit          = "A model's numbers are only as good as its fit: these figures hold for the values given, and a change within the uncertainty of the identified parameters can change them."
	CautionSamples      = "Random samples show what almost all parameter values do; a particular plant's values can be one of the exceptions (ties, cancellations, symmetric designs)."
	CautionSampledModes = "The modes and efforts of random samples are those of made-up numbers: exact modes that recur in every trial (such as the zero mode of an unreached state without dynamics) hold for every system of the pattern; the other values only illustrate."
	CautionLinear       = "Modes, stabilizability and control effort are properties of the linear model about one operating point; input limits, nonlinearity and uncertainty of the numbers are not accounted for."
)

// cautions returns the standing cautions that apply to res.
func cautions(res *Result) []string {
	out := []string{}
	if res.Weights {
		out = append(out, CautionFit)
	} else {
		out = append(out, CautionSamples)
	}
	for _, p := range res.Properties() {
		if p.Margin != nil {
			out = append(out, CautionMargin)
			break
		}
	}
	if res.TimeDomain != "" {
		if !res.Weights {
			out = append(out, CautionSampledModes)
		}
		out = append(out, CautionLinear)
	}
	return append(out, CautionScreening)
}

func plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}
