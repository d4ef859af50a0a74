package textout

import (
	"fmt"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/strong"
)

// className words the class of systems a strong answer covers.
func className(d strong.Diagonal, marked int) string {
	self := map[strong.Diagonal]string{strong.FreeDiagonal: "free self-dynamics", strong.ZeroDiagonal: "zero self-dynamics", strong.NonzeroDiagonal: "nonzero self-dynamics"}[d]
	return fmt.Sprintf("%s, %s", self, count(marked, "coupling may be zero", "couplings may be zero"))
}

// strongLine is the one-line strong verdict of a property.
func (t *tw) strongLine(p structural.Property, s *strong.Result) string {
	t.strong = true
	w := duals[p]
	if s.Holds {
		return fmt.Sprintf("strongly %s: for every value of the couplings (%s)", w.adj, className(s.Diagonal, s.MayBeZero))
	}
	k := s.Unforced.Len()
	return fmt.Sprintf("NOT strongly %s (%s): %s can host an %s mode (%s)", w.adj, className(s.Diagonal, s.MayBeZero),
		count(k, "state", "states"), map[bool]string{true: "unobservable", false: "uncontrollable"}[p == structural.Observability], t.names(s.Unforced, false))
}

// strongDetails writes the two tests and the witness.
func (t *tw) strongDetails(p structural.Property, s *strong.Result) {
	w := duals[p]
	t.ip("  ", "strong: %s", t.strongLine(p, s))
	for _, x := range []struct {
		name string
		test strong.Test
	}{{"at eigenvalue 0", s.AtZero}, {"at every other eigenvalue", s.AtNonzero}} {
		if x.test.Holds {
			t.ip("    ", "%s: every state forced", x.name)
			continue
		}
		t.ip("    ", "%s: %d forced, %s not: %s", x.name, x.test.Forced, count(x.test.Unforced.Len(), "state", "states"), t.names(x.test.Unforced, true))
		wt := x.test.Witness
		if wt == nil {
			if x.test.NoWitness != "" {
				t.ip("      ", "no witness printed: %s", x.test.NoWitness)
			}
			continue
		}
		conf := "confirmed in exact integer arithmetic"
		if !wt.Confirmed {
			conf = "NOT confirmed (please report it)"
		}
		t.ip("      ", "witness (%s): with these values, and any the class allows elsewhere,", conf)
		g := wt.Support
		limit := len(wt.Entries)
		if !t.o.All {
			limit = min(limit, 10*t.o.max())
		}
		for _, e := range wt.Entries[:limit] {
			t.ip("        ", "A[%s][%s] = %d", quote(g.NameOf(e.To)), quote(g.NameOf(e.From)), e.Value)
		}
		if limit < len(wt.Entries) {
			t.ip("        ", "(%d more entries%s)", len(wt.Entries)-limit, hint(t.o))
		}
		slimit := len(wt.SignalEntries)
		if !t.o.All {
			slimit = min(slimit, 10*t.o.max())
		}
		for _, e := range wt.SignalEntries[:slimit] {
			t.ip("        ", "%s %d on %s = %d", w.signal, e.Signal, quote(g.NameOf(e.State)), e.Value)
		}
		if slimit < len(wt.SignalEntries) {
			t.ip("        ", "(%d more %s entries%s)", len(wt.SignalEntries)-slimit, w.signal, hint(t.o))
		}
		minimal := ""
		if wt.Minimal {
			minimal = " (a minimal support: one more " + w.device + " on any of these states removes it)"
		}
		t.ip("      ", "the vector that is 1 on {%s} and 0 elsewhere is never moved by the %s at eigenvalue %d%s.",
			t.names(wt.Support, false), w.signals, wt.Eigenvalue, minimal)
	}
}

// strongPlacement writes a strong placement: the answer first, then how
// sure it is.
func (t *tw) strongPlacement(file, device string, p structural.Property, s *strong.Placement) {
	t.strong = true
	w := duals[p]
	devs := device + "s"
	if !s.Feasible {
		t.p("  ", "%s: no placement the node table allows makes the network strongly %s (%s): with a %s on every allowed state, %s stay unforced (%s).",
			displayFile(file), w.adj, className(s.Diagonal, s.MayBeZero), device, count(s.Blocked.Len(), "state", "states"), t.names(s.Blocked, false))
		return
	}
	nd := s.Devices.Len()
	t.p("  ", "%s: %s %s the network strongly %s (%s), cost %s.", displayFile(file), count(nd, device, devs), plural(nd, "makes", "make"), w.adj,
		className(s.Diagonal, s.MayBeZero), s.Cost)
	if s.Optimal {
		t.p("  ", "Proved optimal by exact search (%d nodes, %d forts).", s.SearchNodes, s.Forts)
	} else {
		t.p("  ", "Not proved optimal (%s): at least %s needed (lower bound from the %s), gap %s.", s.Method, s.LowerBound, s.BoundFrom, s.Gap)
	}
	t.p("  ", "New %s (%d): %s", devs, s.Added.Len(), orNone(t.names(s.Added, false)))
	if s.Existing.Len() > 0 {
		t.p("  ", "Existing %s kept (%d): %s", devs, s.Existing.Len(), t.names(s.Existing, false))
	}
	t.p("  ", "For comparison: %s (cost %s) %s for structural %s (almost all values).", count(s.GenericDevices, device, devs), s.GenericCost, plural(s.GenericDevices, "suffices", "suffice"),
		map[bool]string{true: "observability", false: "controllability"}[p == structural.Observability])
}
