package textout

import (
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/analysis"
	"github.com/netsteer/netsteer/structural/numeric"
)

// Verify is the report of numeric.Verify.
type Verify struct {
	R *analysis.VerifyResult
	// Modes selects the CSV table of modes instead of the trials.
	Modes bool
	// Hints follow a warning of the given kind (how to act on it in the
	// command line).
	Hints map[numeric.WarningKind]string
}

// Value returns the result, for JSON.
func (v Verify) Value() any { return v.R }

func (v Verify) headline(p *numeric.PropertyResult, n int) string {
	w := duals[p.Property]
	r := v.R
	subject := "the sampled system is"
	switch {
	case r.Weights:
		subject = "with its own numbers the model is"
	case len(p.Trials) > 1:
		subject = "the sampled systems are"
	}
	verdict := w.adj
	if !p.SampledHolds {
		verdict = "NOT " + w.adj
	}
	s := fmt.Sprintf("%s %s: exact dimension %d of %d", subject, verdict, p.SampledDimension, n)
	if pt := r.Part; pt != nil {
		s = fmt.Sprintf("on the part made of %s (%d of %d states), %s", pt.Describe(), pt.Nodes, r.Nodes, s)
	}
	switch {
	case p.SampledDimension > p.Dimension:
		s += fmt.Sprintf(", above the structural prediction %d. This cannot happen; please report it as a bug.", p.Dimension)
	case p.Agrees && p.SampledHolds:
		s += ", as the structure predicts."
	case p.Agrees:
		s += fmt.Sprintf(": the numbers confirm the structural answer (dimension %d).", p.Dimension)
	case r.Weights:
		d := p.Dimension - p.SampledDimension
		s += fmt.Sprintf(", although the structure predicts %d: ties or cancellations among the weights lose %s.", p.Dimension, count(d, "direction", "directions"))
	default:
		s += fmt.Sprintf(", below the structural prediction %d in every trial; by chance with probability at most %.2g. Rerun with another seed; if it persists, please report it.",
			p.Dimension, math.Pow(p.FailureBound, float64(len(p.Trials))))
	}
	return s
}

// Text writes each property's verdict on the numbers first, then the
// margins, the network and the trials, the warnings and the cautions.
func (v Verify) Text(w io.Writer, o Options) error {
	r := v.R
	t := newTW(w, o)
	n := r.Nodes
	if r.Part != nil {
		n = r.Part.Nodes
	}
	if ts := r.Targets; ts != nil {
		verdict := "steer"
		if !ts.Holds {
			verdict = "do NOT steer"
		}
		agree := "the samples agree with the structural bounds"
		if !ts.Agrees {
			agree = "the samples do not reach the structural bound"
		}
		t.p("  ", "Targets: the samples %s the %s: rank of C*K %d of %d (structural bounds %d..%d; %s).", verdict,
			count(ts.Targets.Len(), "target", "targets"), ts.Rank, ts.Targets.Len(), ts.Lower, ts.Upper, agree)
	}
	for _, p := range r.Properties() {
		t.p("  ", "%s: %s", capital(p.Property.String()), v.headline(p, n))
		switch {
		case p.Margin == nil:
			t.ip("  ", "Margin not computed: %s.", p.FloatSkipped)
		case !p.SampledHolds:
			t.ip("  ", "Margin %.3g: zero up to rounding, as it must be for a system that is not %s.", *p.Margin, duals[p.Property].adj)
		default:
			t.ip("  ", "Margin %.3g: the smallest singular value of [A - lambda I, %s] over the eigenvalues of A, relative to the norm of [A %s].", *p.Margin, matrix(p.Property), matrix(p.Property))
		}
		if p.Strong != nil {
			t.ip("  ", "For every value of the couplings: %s.", t.strongLine(p.Property, p.Strong))
		}
		if p.ModesStable != nil {
			word := map[bool]string{true: "stabilizable", false: "NOT stabilizable"}
			if p.Property == structural.Observability {
				word = map[bool]string{true: "detectable", false: "NOT detectable"}
			}
			t.ip("  ", "%s: %s.", capital(word[*p.ModesStable]), stuckSummary(p))
		}
		if r.Weights {
			s := "Exact over GF(2^61-1) on the model's numbers"
			if tr := p.Trials; len(tr) > 0 && tr[0].SecondPrime != nil {
				if alt := *tr[0].SecondPrime; alt == tr[0].Dimension {
					s += fmt.Sprintf("; confirmed over GF(2^61-31): dimension %d", alt)
				} else {
					s += fmt.Sprintf("; over GF(2^61-31) the dimension is %d and over GF(2^61-1) %d: the first prime divides the minors, and the larger value is kept", alt, tr[0].Dimension)
				}
			}
			t.ip("  ", "%s.", s)
		} else {
			t.ip("  ", "A random sample falls short of the generic dimension with probability at most %.2g per trial (Schwartz-Zippel, N^2/(p-1), p = 2^61-1).", p.FailureBound)
		}
	}
	t.blank()
	s := fmt.Sprintf("Network: %s, %s (%s)", count(r.Nodes, "state", "states"), count(r.Edges, "edge", "edges"), count(r.SelfLoops, "self-loop", "self-loops"))
	if pt := r.Part; pt != nil {
		s += fmt.Sprintf("; verified: the part made of %s (%d of %d states, %s)", pt.Describe(), pt.Nodes, r.Nodes, count(pt.Edges, "edge", "edges"))
	}
	t.p("  ", "%s.", s)
	if r.Seed != nil {
		t.p("  ", "%s, seed %d (rerun with the same seed to reproduce).", count(r.Trials, "trial", "trials"), *r.Seed)
	}
	for _, k := range r.Kalman {
		t.p("  ", "Kalman decomposition (trial %d): %d controllable and observable, %d controllable only, %d observable only, %d neither.",
			k.Trial, k.ControllableObservable, k.ControllableUnobservable, k.UncontrollableObservable, k.UncontrollableUnobservable)
	}
	for _, p := range r.Properties() {
		v.trialTable(t, p)
	}
	if len(r.Warnings) > 0 {
		t.blank()
		t.raw("Warnings:\n")
		for _, x := range r.Warnings {
			msg := x.Message
			if h := v.Hints[x.Kind]; h != "" {
				msg += " " + h
			}
			t.row("- ", "%s", msg)
		}
	}
	if len(r.Cautions) > 0 {
		t.blank()
		t.raw("Cautions:\n")
		for _, c := range r.Cautions {
			t.row("- ", "%s", c)
		}
	}
	return t.done()
}

func (v Verify) trialTable(t *tw, p *numeric.PropertyResult) {
	t.blank()
	t.raw(p.Property.String() + "\n")
	withModes, withEffort := false, false
	for _, tr := range p.Trials {
		withModes = withModes || tr.Modes != nil
		withEffort = withEffort || tr.Effort != nil
	}
	head := "trial  dimension  margin     at eigenvalue      "
	if withModes {
		head += "  stuck modes          "
	}
	if withEffort {
		head += "  worst-case energy"
	}
	t.raw(strings.TrimRight(head, " ") + "\n")
	for _, tr := range p.Trials {
		dim := strconv.Itoa(tr.Dimension)
		if tr.SecondPrime != nil {
			dim += "/" + strconv.Itoa(*tr.SecondPrime)
		}
		margin, at := "-", "-"
		if f := tr.Float; f != nil {
			margin = fmt.Sprintf("%.3g", f.Margin)
			at = numeric.FormatEigenvalue(f.At, f.Scale)
		}
		stuck, energy := "-", "-"
		if m := tr.Modes; m != nil {
			stuck = modeList(m)
		}
		if e := tr.Effort; e != nil {
			if e.Skipped != "" {
				energy = "(" + e.Skipped + ")"
			} else if !math.IsInf(e.WorstCaseEnergy, 0) && !math.IsNaN(e.WorstCaseEnergy) {
				energy = fmt.Sprintf("%.3g", e.WorstCaseEnergy)
			}
		}
		line := fmt.Sprintf("%5d  %9s  %-9s  %-19s", tr.Number, dim, margin, at)
		if withModes {
			line += fmt.Sprintf("  %-21s", stuck)
		}
		if withEffort {
			line += "  " + energy
		}
		t.raw(strings.TrimRight(line, " ") + "\n")
	}
}

func modeList(m *numeric.Modes) string {
	if len(m.List) == 0 {
		return "none"
	}
	var parts []string
	for _, x := range m.List {
		s := numeric.FormatEigenvalue(x.Eigenvalue, 1)
		if x.Multiplicity > 1 {
			s += fmt.Sprintf(" (x%d)", x.Multiplicity)
		}
		parts = append(parts, s+" "+string(x.Stability))
	}
	return strings.Join(parts, "; ")
}

// stuckSummary words the modes of the first trial that has them.
func stuckSummary(p *numeric.PropertyResult) string {
	for _, tr := range p.Trials {
		m := tr.Modes
		if m == nil {
			continue
		}
		k := 0
		for _, x := range m.List {
			k += x.Multiplicity
		}
		if k == 0 {
			return "no mode is stuck"
		}
		var parts []string
		for i, x := range m.List {
			if i == 6 {
				parts = append(parts, fmt.Sprintf("%d more", len(m.List)-i))
				break
			}
			s := "lambda = " + numeric.FormatEigenvalue(x.Eigenvalue, 1)
			if x.Exact != "" {
				s += " (exact)"
			}
			s += fmt.Sprintf(", multiplicity %d, %s", x.Multiplicity, x.Stability)
			if x.States.Len() > 0 {
				s += ", on " + strings.Join(quoteAll(x.States), ", ")
			}
			parts = append(parts, s)
		}
		return fmt.Sprintf("%s that feedback cannot move (trial %d): %s", count(k, "mode", "modes"), tr.Number, strings.Join(parts, "; "))
	}
	return "no modes computed"
}

func matrix(p structural.Property) string {
	if p == structural.Observability {
		return "C^T"
	}
	return "B"
}

func capital(s string) string {
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}

// CSV writes one row per property and trial (the columns are the trials'
// JSON keys), or with Modes one row per mode.
func (v Verify) CSV(w io.Writer) error {
	header, rows := v.R.Table()
	if v.Modes {
		header, rows = v.R.ModeTable()
	}
	cw := csv.NewWriter(w)
	cw.Write(header)
	for _, r := range rows {
		cw.Write(r)
	}
	cw.Flush()
	return cw.Error()
}
