package textout

import (
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"github.com/netsteer/netsteer/io/netwrite"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/analysis"
	"github.com/netsteer/netsteer/structural/numeric"
)

// Place is the report of analysis.Place.
type Place struct {
	R *analysis.PlaceResult
	// Costed says the costs came from a node table.
	Costed bool
}

// Value returns the result, for JSON.
func (p Place) Value() any { return p.R }

type placeWords struct{ property, component, reach, dilation, neighbours, canColumn string }

var placeDuals = map[structural.Property]placeWords{
	structural.Controllability: {"structurally controllable", "source component", "reach", "dilation", "in-neighbours", "can_actuate"},
	structural.Observability:   {"structurally observable", "sink component", "observe", "contraction", "out-neighbours", "can_sense"},
}

// Text writes how many devices and what they cost first, then where, the
// closed-form count, and with roles whether each new device must go where
// it is.
func (p Place) Text(w io.Writer, o Options) error {
	r := p.R
	pl := r.Placement
	t := newTW(w, o)
	pw := placeDuals[r.Property]
	dev, devs := r.Device, r.Device+"s"
	nd := pl.Devices.Len()
	if r.Robust != nil {
		t.robustPlacement(r.File, dev, r.Property, r.Robust, p.Costed)
		t.blank()
		t.p("  ", "Without the loss of a device or link:")
	}
	if r.Targets != nil {
		t.selection(r.File, dev, r.Targets, false)
		t.blank()
		t.p("  ", "For full control:")
	}
	if r.Strong != nil {
		t.strongPlacement(r.File, dev, r.Property, r.Strong)
		t.blank()
		t.p("  ", "For almost all values of the couplings (structural %s):", map[bool]string{true: "observability", false: "controllability"}[r.Property == structural.Observability])
	}
	if pl.Feasible {
		head := fmt.Sprintf("%s: %s %s the network %s", displayFile(r.File), count(nd, dev, devs), plural(nd, "makes", "make"), pw.property)
		switch {
		case pl.Added.Len() == 0:
			t.p("  ", "%s: the existing %s enough; no new one is needed.", head, plural(nd, "one is", "ones are"))
		case pl.Existing.Len() == 0:
			t.p("  ", "%s, at a total cost of %s.", head, pl.Cost)
		default:
			t.p("  ", "%s: %d new (total cost %s) and %d existing.", head, pl.Added.Len(), pl.Cost, pl.Existing.Len())
		}
	} else {
		t.p("  ", "%s: no placement the node table allows makes the network %s.", displayFile(r.File), pw.property)
		if pl.Deficit > 0 {
			t.p("  ", "Cannot be matched: %d %s a %s (fewer %s than states) that needs %s, but none of them may take one (%s=no): %s",
				pl.Unmatchable.Len(), plural(pl.Unmatchable.Len(), "state forms", "states form"), pw.dilation, pw.neighbours,
				count(pl.Deficit, "more "+dev, "more "+devs), pw.canColumn, t.names(pl.Unmatchable, false))
		}
		if k := len(pl.Unreached); k > 0 {
			t.p("  ", "Cannot %s: %d %s %s no state that may take %s %s:", pw.reach, k,
				plural(k, pw.component, pw.component+"s"), plural(k, "holds", "hold"), article(dev), dev)
			for i, comp := range pl.Unreached {
				if i == o.max() && !o.All {
					t.ip("  ", "(%d more)", k-i)
					break
				}
				t.ip("  ", "{%s}", t.names(comp, false))
			}
		}
		t.p("  ", "Cheapest placement for the rest: %d new %s (cost %s).", pl.Added.Len(), plural(pl.Added.Len(), dev, devs), pl.Cost)
	}
	t.p("  ", "New %s (%d): %s", devs, pl.Added.Len(), orNone(t.names(pl.Added, false)))
	if pl.Existing.Len() > 0 {
		t.p("  ", "Existing %s kept (%d): %s", devs, pl.Existing.Len(), t.names(pl.Existing, false))
	}
	t.blank()
	t.network(r.Nodes, r.Edges, r.SelfLoops, r.DuplicatesMerged)
	if c := r.Count; c != nil {
		t.p("  ", "Count: m + beta - alpha = %d + %d - %d = %d: %s unmatched by a maximum matching, %s, %d of which can hold one of them.",
			c.Unmatched, c.SourceComponents, c.Alpha, c.Count, count(c.Unmatched, "state", "states"),
			count(c.SourceComponents, pw.component, pw.component+"s"), c.Alpha)
	}
	if p.Costed {
		tie := "then the fewest " + devs
		if !pl.FewestDevices {
			tie = "ties in cost not broken (costs too large)"
		}
		t.p("  ", "Cheapest: least total cost of new %s, %s.", devs, tie)
	}
	if r.Roles != nil {
		p.rolesText(t)
		p.rankingText(t)
	} else if pl.Added.Len() > o.max() || pl.Existing.Len() > o.max() {
		t.blank()
		t.p("  ", "All %d %s (%d new, %d existing):", nd, devs, pl.Added.Len(), pl.Existing.Len())
		limit := nd
		if !o.All {
			limit = min(nd, 10*o.max())
		}
		for i := 0; i < limit; i++ {
			v := pl.Devices.At(i)
			tag := "existing"
			if pl.IsAdded(v) {
				tag = "new"
			}
			t.row(fmt.Sprintf("  %-8s ", tag), "%s", quote(pl.Devices.Name(i)))
		}
		if limit < nd {
			t.ip("  ", "(%d more%s)", nd-limit, hint(o))
		}
	}
	return t.done()
}

func hint(o Options) string {
	if o.MoreHint == "" {
		return ""
	}
	return "; " + o.MoreHint
}

func (p Place) rolesText(t *tw) {
	r := p.R
	if len(r.Roles) == 0 {
		return
	}
	forced := 0
	for _, x := range r.Roles {
		if x.Forced {
			forced++
		}
	}
	rest := "; each other one could move, on its own, to a state listed"
	if forced == len(r.Roles) {
		rest = ""
	}
	t.blank()
	t.p("  ", "Must each new %s go where it is? %d of %d %s forced (every cheapest placement has one there)%s.",
		r.Device, forced, len(r.Roles), plural(forced, "is", "are"), rest)
	width := 0
	for _, x := range r.Roles {
		if l := len(quote(r.Network().Name(x.State))); l > width && l <= 40 {
			width = l
		}
	}
	for _, x := range r.Roles {
		var say string
		switch {
		case x.Forced:
			say = "forced: it must go here"
		case x.Alternatives.Len() > 0:
			more := ""
			if x.More {
				more = " and more"
			}
			say = "could go instead on " + strings.Join(quoteAll(x.Alternatives), ", ") + more + " (same cost)"
		case x.More:
			say = "could go elsewhere at the same cost (list more alternatives to see where)"
		default:
			say = "not forced, but it can only move together with other " + r.Device + "s"
		}
		t.row(fmt.Sprintf("  %-*s  ", width, quote(r.Network().Name(x.State))), "%s", say)
	}
}

func quoteAll(s structural.States) []string {
	out := make([]string, s.Len())
	for i := range out {
		out[i] = quote(s.Name(i))
	}
	return out
}

// CSV writes one row per state of the answer: the devices (new or existing,
// with cost and, with roles, whether forced and the alternatives) and,
// when infeasible, the states that block.
func (p Place) CSV(w io.Writer) error {
	r := p.R
	pl := r.Placement
	g := r.Network()
	cw := csv.NewWriter(w)
	cw.Write([]string{"state", "device", "cost", "forced", "alternatives"})
	roles := map[int32]int{}
	for i, x := range r.Roles {
		roles[x.State] = i
	}
	for i := 0; i < pl.Devices.Len(); i++ {
		v := pl.Devices.At(i)
		kind, cost := "existing", "0"
		if pl.IsAdded(v) {
			kind, cost = "new", pl.CostOf(v).String()
		}
		forced, alts := "", ""
		if k, ok := roles[v]; ok {
			forced = strconv.FormatBool(r.Roles[k].Forced)
			alts = strings.Join(r.Roles[k].Alternatives.Names(), ";")
		}
		cw.Write([]string{g.Name(v), kind, cost, forced, alts})
	}
	for i := 0; i < pl.Unmatchable.Len(); i++ {
		cw.Write([]string{pl.Unmatchable.Name(i), "unmatchable", "", "", ""})
	}
	for _, comp := range pl.Unreached {
		for i := 0; i < comp.Len(); i++ {
			cw.Write([]string{comp.Name(i), "unreached", "", "", ""})
		}
	}
	cw.Flush()
	return cw.Error()
}

func (p Place) rankingText(t *tw) {
	k := p.R.Ranking
	if k == nil {
		return
	}
	src := "random samples of the parameters"
	if k.Weights {
		src = "the model's numbers"
	}
	hz := "infinite horizon"
	if k.Horizon > 0 {
		hz = fmt.Sprintf("horizon %g", k.Horizon)
	}
	t.blank()
	t.p("  ", "Equally cheap placements by control effort (%s, %s, %s time; least worst-case energy first):", src, hz, k.TimeDomain)
	g := p.R.Network()
	for _, c := range k.Candidates {
		what := "as placed"
		if c.Swap != nil {
			what = quote(g.Name(c.Swap.From)) + " -> " + quote(g.Name(c.Swap.To))
		}
		energy := fmt.Sprintf("%.3g", c.WorstCaseEnergy)
		if math.IsInf(c.WorstCaseEnergy, 0) || math.IsNaN(c.WorstCaseEnergy) {
			q, tr := c.Conditioning()
			why := fmt.Sprintf("its smallest eigenvalue is zero within rounding in trial %d", tr)
			if q > 0 {
				why = fmt.Sprintf("smallest/largest eigenvalue %.2g in trial %d, below the rounding level %.2g", q, tr, numeric.RoundingLevel(g.N()))
			}
			energy = "too large to compute: the Gramian is numerically singular (" + why + "; ill-conditioned)"
		}
		t.row(fmt.Sprintf("  %3d. %-36s ", c.Rank, what), "worst-case energy %s, trace %.3g", energy, c.GramianTrace)
	}
}

// Annotated returns the network with the answer as attributes.
func (p Place) Annotated() *netwrite.Annotated { return netwrite.FromPlace(p.R) }
