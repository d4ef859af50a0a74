package textout

import (
	"encoding/csv"
	"fmt"
	"io"
	"strconv"
	"strings"

	"github.com/netsteer/netsteer/io/netwrite"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/analysis"
)

// Drivers is the report of analysis.Drivers.
type Drivers struct{ R *analysis.DriversResult }

// Value returns the result, for JSON.
func (d Drivers) Value() any { return d.R }

// Text writes the driver count first, then the driver nodes, the network,
// the signals and, with roles, the role counts.
func (d Drivers) Text(w io.Writer, o Options) error {
	r := d.R
	t := newTW(w, o)
	if r.Targets != nil {
		t.selection(r.File, "", r.Targets, true)
		t.blank()
		t.p("  ", "For full control:")
	}
	nd := r.DriverCount
	t.p("  ", "%s needs %d independent control %s for %s (driver fraction %.4f).",
		displayFile(r.File), nd, plural(nd, "signal", "signals"), count(r.Nodes, "state", "states"), r.DriverFraction)
	t.p("  ", "Drive: %s", t.names(r.Drivers, false))
	attached := 0
	for _, s := range r.Inputs.Signals() {
		attached += len(s) - 1
	}
	if attached > 0 {
		t.p("  ", "Also wired to existing signals: %s in source components that hold no driver.", count(attached, "state", "states"))
	}
	if r.Perfect() {
		t.p("  ", "The maximum matching is perfect (every state has a matched in-neighbour), so one signal suffices; it goes to a source component.")
	}
	t.blank()
	t.network(r.Nodes, r.Edges, r.SelfLoops, r.DuplicatesMerged)
	t.p("  ", "Maximum matching: %d.", r.MatchingSize)
	t.blank()
	t.raw("signal  driven states (the first is the driver node)\n")
	limit := r.Inputs.Len()
	if !o.All {
		limit = min(limit, 10*o.max())
	}
	for i := 0; i < limit; i++ {
		s := r.Inputs.Signal(i)
		names := make([]string, len(s))
		for k, v := range s {
			names[k] = quote(r.Network().Name(v))
		}
		t.row(fmt.Sprintf("%6d  ", i+1), "%s", strings.Join(names, ", "))
	}
	if limit < r.Inputs.Len() {
		more := fmt.Sprintf("        (%d more signals", r.Inputs.Len()-limit)
		if o.MoreHint != "" {
			more += "; " + o.MoreHint
		}
		t.raw(more + ")\n")
	}
	if r.NodeRoles != nil {
		d.rolesText(t)
	}
	return t.done()
}

var nodeRoleMeaning = map[structural.Role]string{
	structural.Critical:     "in every minimum driver set (no incoming edge)",
	structural.Intermittent: "in some minimum driver sets, not all",
	structural.Redundant:    "in no minimum driver set",
}

func (d Drivers) rolesText(t *tw) {
	r := d.R
	t.blank()
	t.raw("Node roles across all minimum driver sets (Jia et al., Nat. Commun. 2013):\n")
	if r.Perfect() {
		t.ip("  ", "(the maximum matching is perfect: no state is ever left unmatched, so every state is redundant by this measure, although one signal is still needed)")
	}
	for _, role := range structural.NodeRoleOrder {
		s := r.NodeRoles.With(role)
		t.row(fmt.Sprintf("  %-12s %8d  ", role, s.Len()), "%s", nodeRoleMeaning[role])
		if s.Len() > 0 && role != structural.Redundant {
			t.row(strings.Repeat(" ", 25), "%s", t.names(s, false))
		}
	}
	critical := "in every maximum matching: removing one raises N_D"
	if r.Perfect() {
		critical = "in every maximum matching: removing one leaves the matching imperfect, so one more signal can be needed"
	}
	meaning := map[structural.Role]string{
		structural.Critical:  critical,
		structural.Ordinary:  "in some maximum matchings, not all",
		structural.Redundant: "in no maximum matching: removing one never changes N_D",
	}
	t.raw("Link roles across all maximum matchings (Liu, Slotine & Barabasi, Nature 2011):\n")
	for _, role := range structural.LinkRoleOrder {
		es := r.LinkRoles.With(role)
		t.row(fmt.Sprintf("  %-12s %8d  ", role, len(es)), "%s", meaning[role])
		if len(es) > 0 && role == structural.Critical {
			m := len(es)
			if !t.o.All {
				m = min(m, t.o.max())
			}
			items := make([]string, m)
			for i, e := range es[:m] {
				items[i] = quote(r.Network().Name(e.From)) + " -> " + quote(r.Network().Name(e.To))
			}
			more := ""
			if m < len(es) {
				more = fmt.Sprintf(" (%d more", len(es)-m)
				if t.o.MoreHint != "" {
					more += "; " + t.o.MoreHint
				}
				more += ")"
			}
			t.row(strings.Repeat(" ", 25), "%s%s", strings.Join(items, ", "), more)
		}
	}
}

// CSV writes one row per driven state (signal, state, role: driver or
// source-component), or with roles one row per state and per edge (kind,
// source, target, role).
func (d Drivers) CSV(w io.Writer) error {
	r := d.R
	cw := csv.NewWriter(w)
	if r.NodeRoles != nil {
		cw.Write([]string{"kind", "source", "target", "role"})
		for v, role := range r.NodeRoles.Of {
			cw.Write([]string{"node", r.Network().Name(int32(v)), "", role.String()})
		}
		k := 0
		for u := 0; u < r.Nodes; u++ {
			for _, v := range r.Network().Succ(int32(u)) {
				cw.Write([]string{"link", r.Network().Name(int32(u)), r.Network().Name(v), r.LinkRoles.Of[k].String()})
				k++
			}
		}
	} else {
		cw.Write([]string{"signal", "state", "role"})
		for i, s := range r.Inputs.Signals() {
			for k, v := range s {
				role := "driver"
				if k > 0 {
					role = "source-component"
				}
				cw.Write([]string{strconv.Itoa(i + 1), r.Network().Name(v), role})
			}
		}
	}
	cw.Flush()
	return cw.Error()
}

// Annotated returns the network with the answer as attributes.
func (d Drivers) Annotated() *netwrite.Annotated { return netwrite.FromDrivers(d.R) }
