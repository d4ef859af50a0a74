package textout

import (
	"fmt"
	"strings"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/analysis"
	"github.com/netsteer/netsteer/structural/target"
)

// TargetCaution closes every report of a target-control question.
const TargetCaution = analysis.TargetCaution

// targetHeadline answers the target question of one property.
func (t *tw) targetHeadline(v *target.Verdict) string {
	w := duals[v.Property]
	k := v.Targets.Len()
	verb := map[bool]string{true: "steerable", false: "observable"}[v.Property == structural.Controllability]
	sig := count(v.Signals, w.signal, w.signals)
	exact := "exact"
	if !v.Exact {
		exact = fmt.Sprintf("between %d and %d", v.Lower, v.Upper)
	}
	switch v.Status {
	case target.Controllable:
		return fmt.Sprintf("the %s %s %s with %s (target dimension %d of %d, %s)", count(k, "target", "targets"), plural(k, "is", "are"), verb, sig, v.Lower, k, exact)
	case target.NotControllable:
		return fmt.Sprintf("the %s %s NOT all %s with %s (target dimension %s of %d)", count(k, "target", "targets"), plural(k, "is", "are"), verb, sig,
			map[bool]string{true: fmt.Sprint(v.Upper), false: exact}[v.Exact], k)
	}
	why := fmt.Sprintf("the exact parts exceed the limits (%d states matter)", v.RelevantStates)
	switch {
	case v.SampleBelowLinking:
		why = fmt.Sprintf("a sample reaches only %d while a linking of %d in the time-expanded network suggests more, so the linking is not trusted", v.Lower, v.Linking)
	case v.ByTheorem:
		why = fmt.Sprintf("a linking of %d in the time-expanded network suggests so, which is not a proof, and no sample fits the limits (%d states matter)", v.Linking, v.RelevantStates)
	}
	return fmt.Sprintf("UNDECIDED whether the %s %s %s: the target dimension is %s; %s",
		count(k, "target", "targets"), plural(k, "is", "are"), verb, exact, why)
}

// targetFix says what to change when targets are out of reach.
func (t *tw) targetFix(v *target.Verdict) []string {
	w := duals[v.Property]
	var out []string
	if k := v.Unreached.Len(); k > 0 {
		out = append(out, fmt.Sprintf("%s %s: %s (%s)", count(k, "target is", "targets are"), w.unreached, strings.ReplaceAll(w.why, "them", plural(k, "it", "them")), t.names(v.Unreached, false)))
	}
	if b := v.Bottleneck; b != nil {
		in := t.names(b.Neighbours, false)
		if len(b.SignalNumbers) > 0 {
			nums := make([]string, len(b.SignalNumbers))
			for i, x := range b.SignalNumbers {
				nums[i] = fmt.Sprint(x)
			}
			in = strings.TrimPrefix(in+", ", ", ") + w.signals + " on lines " + strings.Join(nums, ", ")
		}
		out = append(out, fmt.Sprintf("these %d targets have only %d independent %s in (in-capacity %d: %s): at least %d more %s must act directly on them (%s)",
			b.Targets.Len(), b.Capacity, plural(b.Capacity, "way", "ways"), b.Capacity, in, b.Shortfall, plural(b.Shortfall, w.signal, w.signals), t.names(b.Targets, false)))
	}
	if f := v.Funnel; f != nil {
		out = append(out, fmt.Sprintf("every influence on the targets passes through %s %d %s before them (%s): at most %d of them can be set independently",
			count(f.States.Len(), "state", "states"), f.Depth, plural(f.Depth, "step", "steps"), t.names(f.States, false), f.Capacity))
	}
	return out
}

// targetDetails writes the bounds behind a target verdict.
func (t *tw) targetDetails(v *target.Verdict) {
	t.ip("  ", "targets (%d): %s", v.Targets.Len(), t.names(v.Targets, true))
	var up, lo []string
	for _, b := range v.Bounds {
		if b.Skipped != "" || b.ByTheorem {
			continue // a linking, not a proved bound, is written below
		}
		s := fmt.Sprintf("%s %d", strings.ReplaceAll(b.Name, "_", " "), b.Value)
		if b.Upper {
			up = append(up, s)
		} else {
			lo = append(lo, s)
		}
	}
	t.ip("  ", "target dimension at most %d (%s); at least %d (%s, from %s)", v.Upper, strings.Join(up, ", "), v.Lower, strings.Join(lo, ", "), strings.ReplaceAll(v.LowerFrom, "_", " "))
	if v.Linking > 0 {
		t.ip("  ", "largest linking found in the time-expanded network: %d (not a proved lower bound)", v.Linking)
	}
	t.ip("  ", "states that matter: %d (reached by a signal and acting on a target)", v.RelevantStates)
}

// selection writes the answer of a target selection first.
func (t *tw) selection(file, device string, s *target.Selection, signals bool) {
	k := s.Targets.Len()
	what, whats := device, device+"s"
	if signals {
		what, whats = "independent signal", "independent signals"
	}
	if !s.Feasible {
		t.p("  ", "%s: nothing allowed steers the %s: %s.", displayFile(file), count(k, "target", "targets"),
			orNone(t.names(s.Unreachable, false)))
		return
	}
	saved := fmt.Sprintf("full control needs %d: %d fewer", s.FullControl.Count, s.SignalsSaved)
	switch {
	case !s.FullControl.Feasible:
		saved = "full control is impossible with the devices allowed"
	case !signals && s.CostSaved != 0:
		saved = fmt.Sprintf("full control: %s, cost %s; %s saved", count(s.FullControl.Count, device, device+"s"), s.FullControl.Cost, s.CostSaved)
	}
	verb := plural(s.Count, "steers", "steer")
	if !s.Proved {
		verb = "may steer"
	}
	head := fmt.Sprintf("%s: %s %s the %s (%s)", displayFile(file), count(s.Count, what, whats), verb, count(k, "target", "targets"), saved)
	if !signals {
		head = fmt.Sprintf("%s: %s %s the %s, cost %s (%s)", displayFile(file), count(s.Count, what, whats), verb, count(k, "target", "targets"), s.Cost, saved)
	}
	t.p("  ", "%s.", head)
	if !s.Proved {
		alt := "full control is impossible with the devices allowed"
		if s.FullControl.Feasible {
			alt = fmt.Sprintf("where proof is needed, full control (%d) is proved", s.FullControl.Count)
		}
		t.p("  ", "NOT PROVED: the design rests on a linking in the time-expanded network alone (no sample of it finished within the size and work limits); judge it with check --targets and --inputs; %s.", alt)
	}
	met := s.Count <= s.Lower
	if !signals {
		met = s.Cost <= s.LowerCost
	}
	switch {
	case s.Optimal && met:
		t.p("  ", "Optimal: it meets the lower bound (%d).", s.Lower)
	case s.Optimal:
		t.p("  ", "Optimal: proved minimal (lower bound %d).", s.Lower)
	default:
		stop := ""
		if s.Stopped > 0 {
			stop = ", and the exhaustive search stopped at its work limit"
		}
		t.p("  ", "Best found: %d; at least %d needed (lower bound); not proved minimal%s.", s.Count, s.Lower, stop)
	}
	if signals {
		for i, sig := range s.Inputs.Signals() {
			names := make([]string, len(sig))
			for j, v := range sig {
				names[j] = quote(s.Targets.NameOf(v))
			}
			t.row(fmt.Sprintf("  signal %d drives: ", i+1), "%s", strings.Join(names, ", "))
		}
	} else {
		t.p("  ", "New %s (%d): %s", whats, s.Added.Len(), orNone(t.names(s.Added, false)))
		if s.Existing.Len() > 0 {
			t.p("  ", "Existing %s kept (%d): %s", whats, s.Existing.Len(), t.names(s.Existing, false))
		}
	}
	t.p("  ", "Targets (%d): %s", k, t.names(s.Targets, false))
	t.p("  ", "Method: %s; proof: %s.", phrase(s.Method), phrase(s.Proof))
	t.p("  ", "%s", TargetCaution)
}

// phrases word the method and proof codes of a target selection.
var phrases = map[string]string{
	"full_control":     "full control of the states that act on the targets",
	"stem_cycle_cover": "a stem-cycle cover",
	"walk_greedy":      "the greedy of Gao et al. (2014)",
	"all_allowed":      "every allowed state",
	"exact_search":     "exhaustive search",
	"ancestor_closed":  "full control of a part closed under its in-neighbours",
	"lin_subnetwork":   "Lin's theorem on a subnetwork holding the targets",
	"sampled_rank":     "an exact sampled rank over GF(2^61-1)",
	"dynamic_linking":  "a linking in the time-expanded network only (enough if the rank equals the largest linking, after Murota & Poljak 1990; not proved in general)",
}

func phrase(code string) string {
	if p, ok := phrases[code]; ok {
		return p
	}
	return strings.ReplaceAll(code, "_", " ")
}
