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
	"github.com/netsteer/netsteer/structural/placement"
)

// Check is the report of analysis.Check.
type Check struct {
	R *analysis.CheckResult
	// Costed says the completion's costs came from a node table.
	Costed bool
}

// Value returns the result, for JSON.
func (c Check) Value() any { return c.R }

// words differ between the two properties.
type dual struct {
	adj, signal, signals, device string
	unreached, why, allReached   string
	dilation, neighbours, matrix string
}

var duals = map[structural.Property]dual{
	structural.Controllability: {"controllable", "input", "inputs", "actuator", "unreached",
		"no input acts on them, directly or through other states",
		"every state is reached from an input", "dilation", "in-neighbours", "[A B]"},
	structural.Observability: {"observable", "output", "outputs", "sensor", "unobserved",
		"no output senses them, directly or through the states they act on",
		"every state reaches an output", "observation dilation", "out-neighbours", "[A; C]"},
}

// Headline is the one-line verdict of one property.
func Headline(p *analysis.PropertyResult, n int) string {
	w := duals[p.Property]
	sig := plural(p.Signals, w.signal, w.signals)
	if p.Holds {
		return fmt.Sprintf("%s with %d %s", w.adj, p.Signals, sig)
	}
	return fmt.Sprintf("NOT %s with %d %s (dimension %d of %d)", w.adj, p.Signals, sig, p.Dimension, n)
}

// fix says what to change for a failing property.
func (t *tw) fix(p *analysis.PropertyResult) string {
	w := duals[p.Property]
	var parts []string
	if k := p.Unreached.Len(); k > 0 {
		parts = append(parts, fmt.Sprintf("%d %s %s: %s (%s)", k, plural(k, "state is", "states are"), w.unreached,
			strings.ReplaceAll(w.why, "them", plural(k, "it", "them")), t.names(p.Unreached, false)))
	}
	if d := p.Dilation; d != nil {
		one := strings.TrimSuffix(w.neighbours, "s")
		if d.States.Len() == 1 {
			parts = append(parts, fmt.Sprintf("%s has no %s at all: it needs its own %s", quote(d.States.Name(0)), one, w.device))
		} else {
			m := d.Neighbours.Len() + len(d.Signals)
			parts = append(parts, fmt.Sprintf("these %d states share only %d %s: one more %s needed among them (%s)",
				d.States.Len(), m, plural(m, one, w.neighbours), w.device, t.names(d.States, false)))
		}
	}
	return strings.Join(parts, "; and ")
}

// Text writes the verdicts first, what to fix, then the details of each
// property and the cheapest completion.
func (c Check) Text(w io.Writer, o Options) error {
	r := c.R
	t := newTW(w, o)
	props := r.Properties()
	heads := make([]string, len(props))
	for i, p := range props {
		heads[i] = Headline(p, r.Nodes)
		if p.Targets != nil {
			heads[i] = t.targetHeadline(p.Targets)
		}
	}
	t.p("  ", "%s: %s.", displayFile(r.File), strings.Join(heads, "; "))
	for _, p := range props {
		if p.Strong != nil {
			t.p("  ", "%s.", capital(t.strongLine(p.Property, p.Strong)))
		}
	}
	for _, p := range props {
		lead := "To fix"
		if len(props) > 1 {
			lead += " " + p.Property.String()
		}
		if p.Targets != nil {
			for _, f := range t.targetFix(p.Targets) {
				t.p("  ", "%s: %s.", lead, f)
			}
			continue
		}
		if !p.Holds {
			t.p("  ", "%s: %s.", lead, t.fix(p))
		}
	}
	t.blank()
	t.network(r.Nodes, r.Edges, r.SelfLoops, r.DuplicatesMerged)
	for _, p := range props {
		c.details(t, p, r.Nodes)
	}
	targets := false
	for _, p := range props {
		if p.Completion != nil {
			t.blank()
			t.completion(p.Property, p.Completion, c.Costed)
		}
		targets = targets || p.Targets != nil
	}
	if targets {
		t.blank()
		t.p("  ", "%s", TargetCaution)
	}
	return t.done()
}

func (c Check) details(t *tw, p *analysis.PropertyResult, n int) {
	w := duals[p.Property]
	t.blank()
	t.p("  ", "%s from %s:", count(p.Signals, w.signal, w.signals), displayFile(p.DesignFile))
	t.ip("  ", "%s dimension: %d of %d (generic, Hosoe 1980)", w.adj, p.Dimension, n)
	s := fmt.Sprintf("term rank of %s: %d of %d", w.matrix, p.TermRank, n)
	if d := p.Deficiency(); d > 0 {
		s += fmt.Sprintf(" (at least %d more %s needed to remove every %s)", d, plural(d, w.signal, w.signals), w.dilation)
	}
	t.ip("  ", "%s", s)
	if p.Unreached.Len() == 0 {
		t.ip("  ", "%s", w.allReached)
	} else {
		t.ip("  ", "%d %s %s:", p.Unreached.Len(), w.unreached, plural(p.Unreached.Len(), "state", "states"))
		t.ip("    ", "%s", t.names(p.Unreached, true))
	}
	if p.Strong != nil {
		defer t.strongDetails(p.Property, p.Strong)
	}
	if p.Targets != nil {
		defer t.targetDetails(p.Targets)
	}
	d := p.Dilation
	if d == nil {
		t.ip("  ", "no %s", w.dilation)
		return
	}
	t.ip("  ", "%s of %s:", w.dilation, count(d.States.Len(), "state", "states"))
	t.ip("    ", "%s", t.names(d.States, true))
	if m := d.Neighbours.Len() + len(d.Signals); m == 0 {
		t.ip("  ", "their %s: none", w.neighbours)
	} else {
		t.ip("  ", "their %s (%d):", w.neighbours, m)
	}
	if d.Neighbours.Len() > 0 {
		t.ip("    ", "%s", t.names(d.Neighbours, true))
	}
	if k := len(d.SignalNumbers); k > 0 {
		nums := make([]string, k)
		for i, x := range d.SignalNumbers {
			nums[i] = strconv.Itoa(x)
		}
		t.ip("    ", "the %s on %s %s of %s", plural(k, w.signal, w.signals), plural(k, "line", "lines"), strings.Join(nums, ", "), displayFile(p.DesignFile))
	}
}

// completion writes the cheapest completion of a failing design, with
// where its costs come from.
func (t *tw) completion(p structural.Property, pl *placement.Placement, costed bool) {
	w := duals[p]
	source := "every device costs 1"
	if costed {
		source = "costs and allowed states from the node table"
	}
	if pl.Feasible {
		t.p("  ", "Cheapest completion (%s): add %d dedicated %s, total cost %s: %s", source, pl.Added.Len(),
			plural(pl.Added.Len(), w.device, w.device+"s"), pl.Cost, t.names(pl.Added, false))
		return
	}
	s := fmt.Sprintf("No completion by dedicated %ss exists (%s):", w.device, source)
	if pl.Deficit > 0 {
		s += fmt.Sprintf(" %s may not take %s %s but need %d more (%s: %s);", count(pl.Unmatchable.Len(), "state", "states"),
			article(w.device), w.device, pl.Deficit, w.dilation, t.names(pl.Unmatchable, false))
	}
	for _, comp := range pl.Unreached {
		s += fmt.Sprintf(" nothing allowed can reach {%s};", t.names(comp, false))
	}
	t.p("  ", "%s the rest needs %d: %s", s, pl.Added.Len(), orNone(t.names(pl.Added, false)))
}

func article(word string) string {
	if word != "" && strings.ContainsRune("aeiou", rune(word[0])) {
		return "an"
	}
	return "a"
}

// CSV writes key,value rows whose keys are the JSON keys of the result,
// joined by dots; a list gives one row per entry.
func (c Check) CSV(w io.Writer) error {
	r := c.R
	cw := csv.NewWriter(w)
	cw.Write([]string{"key", "value"})
	kv := func(k, v string) { cw.Write([]string{k, v}) }
	kv("file", r.File)
	kv("nodes", strconv.Itoa(r.Nodes))
	kv("edges", strconv.Itoa(r.Edges))
	for _, p := range r.Properties() {
		k := p.Property.String() + "."
		kv(k+"design_file", p.DesignFile)
		kv(k+"signals", strconv.Itoa(p.Signals))
		kv(k+"holds", strconv.FormatBool(p.Holds))
		kv(k+"term_rank", strconv.Itoa(p.TermRank))
		kv(k+"dimension", strconv.Itoa(p.Dimension))
		states(kv, k+"unreached", p.Unreached)
		if d := p.Dilation; d != nil {
			states(kv, k+"dilation.states", d.States)
			states(kv, k+"dilation.neighbours", d.Neighbours)
			for _, x := range d.SignalNumbers {
				kv(k+"dilation.signals", strconv.Itoa(x))
			}
		}
		if pl := p.Completion; pl != nil {
			completionCSV(kv, k+"completion.", pl)
		}
	}
	cw.Flush()
	return cw.Error()
}

func states(kv func(k, v string), key string, s structural.States) {
	for i := 0; i < s.Len(); i++ {
		kv(key, s.Name(i))
	}
}

func completionCSV(kv func(k, v string), k string, pl *placement.Placement) {
	kv(k+"feasible", strconv.FormatBool(pl.Feasible))
	states(kv, k+"added", pl.Added)
	kv(k+"total_cost", pl.Cost.String())
}

// Annotated returns the network with the answer as attributes.
func (c Check) Annotated() *netwrite.Annotated { return netwrite.FromCheck(c.R) }
