package textout

import (
	"encoding/csv"
	"fmt"
	"io"
	"strconv"
	"strings"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/analysis"
	"github.com/netsteer/netsteer/structural/failure"
)

// Failures is the report of analysis.Failures.
type Failures struct {
	R      *analysis.FailuresResult
	Costed bool
	// DetailHint says how to have more entries worked out in full (for
	// the command line, the flag that does it).
	DetailHint string
}

// Value returns the result, for JSON.
func (f Failures) Value() any { return f.R }

// Text writes, per design, whether it survives every single loss first,
// then the single points of failure with their fixes, then the tables.
func (f Failures) Text(w io.Writer, o Options) error {
	r := f.R
	t := newTW(w, o)
	for _, a := range r.Assessments() {
		f.answer(t, a)
	}
	judged := false
	for _, a := range r.Assessments() {
		if a.Intact.Holds {
			f.details(t, a)
			judged = true
		}
	}
	if !judged {
		return t.done()
	}
	t.blank()
	t.p("  ", "Classes after Commault, Dion & Trinh (IEEE TAC 53(6), 2008): essential = its loss alone breaks the design; useful = it matters once some other devices are lost too; useless = in no minimal working sub-design. Each claim is the verdict of Lin's test on the design less the loss.")
	return t.done()
}

func (f Failures) answer(t *tw, a *failure.Assessment) {
	w := duals[a.Property]
	r := f.R
	n := a.Intact.Signals
	if !a.Intact.Holds {
		t.p("  ", "%s: NOT %s with %s as it stands (dimension %d of %d): fix the design first (see check); single losses are judged on a design that works.", displayFile(r.File), w.adj, count(n, w.signal, w.signals), a.Intact.Dimension, r.Nodes)
		if a.Completion != nil {
			t.completion(a.Property, a.Completion, f.Costed)
		}
		return
	}
	var spf []string
	if k := a.EssentialDevices; k > 0 {
		spf = append(spf, count(k, w.signal, w.signals))
	}
	if k := len(a.Links); k > 0 {
		spf = append(spf, count(k, "link", "links"))
	}
	if k := len(a.States); k > 0 {
		spf = append(spf, count(k, "state", "states"))
	}
	if len(spf) == 0 {
		what := "device or link"
		if a.StatesJudged {
			what = "device, link or state"
		}
		t.p("  ", "%s: %s with %s, and it stays so after the loss of any one %s.", displayFile(r.File), w.adj, count(n, w.signal, w.signals), what)
		return
	}
	t.p("  ", "%s: %s with %s, but %s %s.", displayFile(r.File), w.adj, count(n, w.signal, w.signals), strings.Join(spf, " and "),
		plural(a.EssentialDevices+len(a.Links)+len(a.States), "is a single point of failure", "are single points of failure"))
	shown := 0
	for _, d := range a.Devices {
		if d.Class != failure.Essential {
			continue
		}
		if shown == t.o.max() && !t.o.All {
			t.p("  ", "(%d more essential %s%s)", a.EssentialDevices-shown, w.signals, hint(t.o))
			break
		}
		shown++
		fix := fixText(d.Replacement, w.device)
		if d.Replacement == nil {
			fix = "; replacement not worked out."
		}
		t.p("  ", "Losing %s %d (%s) %s%s", w.signal, d.Number, t.names(d.Touches, false), f.effectCount(t, d.Unreached.Len(), d.Unreached, d.Dilation, d.Witness, a.Property), fix)
	}
	for i, l := range a.Links {
		if i == t.o.max() && !t.o.All {
			t.p("  ", "(%d more breaking links%s)", len(a.Links)-i, hint(t.o))
			break
		}
		var un structural.States
		if l.Unreached != nil {
			un = *l.Unreached
		}
		fix := fixText(l.Fix, w.device)
		if l.Fix == nil {
			fix = "; fix not worked out."
		}
		t.p("  ", "Losing the link %s -> %s %s%s", quote(r.Network().Name(l.From)), quote(r.Network().Name(l.To)), f.effectCount(t, l.UnreachedCount, un, l.Dilation, l.Witness, a.Property), fix)
	}
	if brief(a) > 0 {
		s := "Replacements, fixes, dilations and the states behind each count are worked out for the worst entries of each list only"
		if f.DetailHint != "" {
			s += " (" + f.DetailHint + ")"
		}
		t.p("  ", "%s.", s)
	}
}

func (f Failures) effectCount(t *tw, k int, unreached structural.States, dilation bool, dil *structural.Dilation, p structural.Property) string {
	w := duals[p]
	var parts []string
	if k > 0 {
		s := fmt.Sprintf("leaves %s %s", count(k, "state", "states"), w.unreached)
		if unreached.Len() > 0 {
			s += " (" + t.names(unreached, false) + ")"
		}
		parts = append(parts, s)
	}
	if dilation {
		s := "opens a " + w.dilation
		switch {
		case dil != nil && dil.States.Len() == 1 && dil.Neighbours.Len() == 0:
			s += fmt.Sprintf(" (%s has no %s left)", quote(dil.States.Name(0)), strings.TrimSuffix(w.neighbours, "s"))
		case dil != nil:
			s += fmt.Sprintf(" (%s share %s)", t.names(dil.States, false), orNone(t.names(dil.Neighbours, false)))
		}
		parts = append(parts, s)
	}
	return strings.Join(parts, " and ")
}

// brief counts the entries given without their details (beyond the
// request's Detail): essential devices without a replacement, links
// without a fix, states without the states behind their count or their
// dilation.
func brief(a *failure.Assessment) int {
	k := 0
	for _, d := range a.Devices {
		if d.Class == failure.Essential && d.Replacement == nil {
			k++
		}
	}
	for _, l := range a.Links {
		if l.Fix == nil {
			k++
		}
	}
	for _, s := range a.States {
		if s.UnreachedCount > 0 && s.Unreached == nil || s.Dilation && s.Witness == nil {
			k++
		}
	}
	return k
}

func fixText(x *failure.Fix, device string) string {
	switch {
	case x == nil:
		return "."
	case !x.Feasible:
		return "; no allowed state can take its place."
	case x.Added.Len() == 0:
		return "; nothing needs adding."
	}
	return fmt.Sprintf("; dedicated %s on %s (cost %s) %s the design.", plural(x.Added.Len(), device, device+"s"), strings.Join(quoteAll(x.Added), ", "), x.Cost,
		plural(x.Added.Len(), "restores", "restore"))
}

func (f Failures) details(t *tw, a *failure.Assessment) {
	w := duals[a.Property]
	t.blank()
	t.p("  ", "%s (%d): %d essential, %d useful, %d useless, %d unresolved", capital(w.signals), len(a.Devices), a.EssentialDevices, a.UsefulDevices, a.UselessDevices, a.UnresolvedDevices)
	limit := len(a.Devices)
	if !t.o.All {
		limit = min(limit, 10*t.o.max())
	}
	t.raw(fmt.Sprintf("  %-6s %-11s %-11s %-11s %s\n", "line", "class", "reach", "matching", "states"))
	for _, d := range a.Devices[:limit] {
		with := ""
		if len(d.With) > 0 {
			nums := make([]string, len(d.With))
			for i, x := range d.With {
				nums[i] = strconv.Itoa(x)
			}
			with = "; useful with " + w.signals + " " + strings.Join(nums, ", ")
		}
		t.row(fmt.Sprintf("  %-6d %-11s %-11s %-11s ", d.Number, d.Class, d.Reach, d.Matching), "%s%s", t.names(d.Touches, false), with)
	}
	if limit < len(a.Devices) {
		t.ip("  ", "(%d more%s)", len(a.Devices)-limit, hint(t.o))
	}
	t.p("  ", "Links: %d of %d break the design (%d leave states %s, %d open a %s, %d both).", len(a.Links), a.LinksJudged,
		a.UnreachingLinks, w.unreached, a.DilatingLinks, w.dilation, a.BothLinks)
	if a.StatesJudged {
		t.p("  ", "States: %d of %d break the design when held constant.", len(a.States), f.R.Nodes)
		for i, s := range a.States {
			if i == t.o.max() && !t.o.All {
				t.ip("  ", "(%d more%s)", len(a.States)-i, hint(t.o))
				break
			}
			var un structural.States
			if s.Unreached != nil {
				un = *s.Unreached
			}
			t.ip("  ", "%s: %s", quote(f.R.Network().Name(s.State)), f.effectCount(t, s.UnreachedCount, un, s.Dilation, s.Witness, a.Property))
		}
	}
}

// CSV writes the devices table and, after a blank line, the links table.
func (f Failures) CSV(w io.Writer) error {
	cw := csv.NewWriter(w)
	g := f.R.Network()
	for _, a := range f.R.Assessments() {
		p := a.Property.String()
		cw.Write([]string{"property", "signal", "states", "class", "reach_class", "matching_class", "unreached_count", "opens_dilation", "replacement", "replacement_cost"})
		for _, d := range a.Devices {
			rep, cost := "", ""
			if x := d.Replacement; x != nil && x.Feasible {
				rep, cost = strings.Join(x.Added.Names(), ";"), x.Cost.String()
			}
			cw.Write([]string{p, strconv.Itoa(d.Number), strings.Join(d.Touches.Names(), ";"), d.Class.String(), d.Reach.String(), d.Matching.String(),
				strconv.Itoa(d.Unreached.Len()), strconv.FormatBool(d.Dilation), rep, cost})
		}
		cw.Write(nil)
		cw.Write([]string{"property", "from", "to", "unreached_count", "opens_dilation", "fix", "fix_cost"})
		for _, l := range a.Links {
			fix, cost := "", ""
			if x := l.Fix; x != nil && x.Feasible {
				fix, cost = strings.Join(x.Added.Names(), ";"), x.Cost.String()
			}
			cw.Write([]string{p, g.Name(l.From), g.Name(l.To), strconv.Itoa(l.UnreachedCount), strconv.FormatBool(l.Dilation), fix, cost})
		}
		cw.Write(nil)
	}
	cw.Flush()
	return cw.Error()
}

// robustPlacement writes a placement that survives one failure: the
// answer first, then how sure it is.
func (t *tw) robustPlacement(file, device string, p structural.Property, rp *failure.RobustPlacement, costed bool) {
	w := duals[p]
	devs := device + "s"
	if !rp.Feasible {
		which := "no placement"
		if costed {
			which = "no placement the node table allows"
		}
		s := fmt.Sprintf("%s: %s keeps the network %s after the loss of %s", displayFile(file), which, w.adj, strings.Replace(rp.Survive.String(), "any ", "any one ", 1))
		if rp.BlockingDevices.Len() > 0 {
			s += fmt.Sprintf(": losing the %s on %s breaks it whatever else is placed", device, t.names(rp.BlockingDevices, false))
		}
		t.p("  ", "%s.", s)
		return
	}
	n := rp.Devices.Len() + rp.Spares.Len()
	t.p("  ", "%s: %s keep the network %s after the loss of %s (cost %s).", displayFile(file), count(n, device, devs), w.adj, strings.Replace(rp.Survive.String(), "any ", "any one ", 1), rp.Cost)
	if rp.Optimal {
		t.p("  ", "Proved least (%s).", rp.Method)
	} else {
		t.p("  ", "Not proved least (%s): at least %s needed, gap %s.", rp.Method, rp.LowerBound, rp.Gap)
	}
	t.p("  ", "New %s (%d): %s", devs, rp.Added.Len(), orNone(t.names(rp.Added, false)))
	if rp.Spares.Len() > 0 {
		t.p("  ", "Spare %s beside another on the same state (%d): %s", devs, rp.Spares.Len(), t.names(rp.Spares, false))
	}
	if rp.Existing.Len() > 0 {
		t.p("  ", "Existing %s kept (%d): %s", devs, rp.Existing.Len(), t.names(rp.Existing, false))
	}
}
