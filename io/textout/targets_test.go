package textout

import (
	"bytes"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/target"
)

// The tree 0 -> 1, 0 -> 2 -> 3 with one input on 0 steers the targets
// {1, 3} (distinct distances from the root: Gao, Liu, D'Souza & Barabási,
// Nat. Commun. 5:5415, 2014), but with no sample allowed only a linking
// says so: the report is UNDECIDED, names the linking as no proof and does
// not list it among the lower bounds.
func TestTargetTextLinkingIsNoProof(t *testing.T) {
	b := structural.NewIntBuilder(4, 0)
	for _, e := range [][2]int32{{0, 1}, {0, 2}, {2, 3}} {
		b.AddEdge(e[0], e[1])
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	d, err := structural.NewDesign(g, [][]int32{{0}}, nil)
	if err != nil {
		t.Fatal(err)
	}
	v, err := target.Check(g, target.CheckRequest{Targets: []int32{1, 3}, Inputs: d, Limits: target.Limits{MaxSampleStates: -1}})
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	w := newTW(&buf, Options{})
	head := w.targetHeadline(v)
	w.targetDetails(v)
	w.w.Flush()
	if !strings.HasPrefix(head, "UNDECIDED") || !strings.Contains(head, "linking of 2") || !strings.Contains(head, "not a proof") {
		t.Errorf("headline %q", head)
	}
	details := strings.Join(strings.Fields(buf.String()), " ")
	if !strings.Contains(details, "at least 1 (static linking 1, from static linking)") || !strings.Contains(details, "not a proved lower bound") {
		t.Errorf("details %q", details)
	}

	// A selection that is not proved optimal says so, and why when the
	// search stopped at its work limit.
	sel, err := target.Select(g, target.SelectRequest{Targets: []int32{1, 3}, Mode: target.Signals})
	if err != nil {
		t.Fatal(err)
	}
	sel.Optimal, sel.Count, sel.Stopped = false, sel.Lower+1, 2
	buf.Reset()
	w = newTW(&buf, Options{})
	w.selection("net.edges", "", sel, true)
	w.w.Flush()
	if out := strings.Join(strings.Fields(buf.String()), " "); !strings.Contains(out, "not proved minimal, and the exhaustive search stopped at its work limit") {
		t.Errorf("selection %q", out)
	}

	// With no sample allowed, the walk's one-signal design has its linking
	// alone: Select keeps the proved two-signal design (full control of
	// the tree) and lists the other as a candidate; a selection that is
	// not proved says so in its first line.
	sel, err = target.Select(g, target.SelectRequest{Targets: []int32{1, 3}, Mode: target.Signals, WalkDepth: 4,
		Limits: target.Limits{MaxSampleStates: -1}})
	if err != nil {
		t.Fatal(err)
	}
	walk := false
	for _, c := range sel.Candidates {
		walk = walk || c.Method == "walk_greedy" && c.Found && c.Count == 1 && c.Proof == "dynamic_linking"
	}
	if !sel.Proved || sel.Count != 2 || !walk {
		t.Errorf("no sample: proved %v, %d signals, candidates %+v", sel.Proved, sel.Count, sel.Candidates)
	}
	sel.Proved, sel.Count, sel.Proof, sel.Optimal = false, 1, "dynamic_linking", false
	buf.Reset()
	w = newTW(&buf, Options{})
	w.selection("net.edges", "", sel, true)
	w.w.Flush()
	if out := strings.Join(strings.Fields(buf.String()), " "); !strings.Contains(out, "1 independent signal may steer the 2 targets") || !strings.Contains(out, "NOT PROVED") || strings.Contains(out, "Optimal:") {
		t.Errorf("unproved selection %q", out)
	}
}
