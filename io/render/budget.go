package render

import (
	"fmt"
	"math"
	"time"
)

// DefaultBudget is the longest a Graphviz layout may be expected to take
// before Select refuses it: a picture of any network is due within 10
// seconds (60 for a million states); the views netsteer lays out itself
// always are.
const DefaultBudget = 10 * time.Second

func (o *Options) budget() time.Duration {
	if o.Budget <= 0 {
		return DefaultBudget
	}
	return o.Budget
}

// estimate returns the expected Graphviz layout time of a graph of n
// nodes and e edges: 0.9 s at 100 nodes of three edges each, growing as
// the 2.8th power of max(n, e/3). Measured here with netsteer-layout
// (go-graphviz v0.2.10, Graphviz 12.1.2) on random digraphs of three edges
// per node: dot 0.9, 6.4, 30 and 210 s at 100, 200, 400 and 800 nodes
// (peak 55 MB, 136 MB, 580 MB and 2.3 GB); sfdp 0.9, 2.1, 13 and 219 s.
// The fit errs on the slow side between the points.
func estimate(n, e int) time.Duration {
	x := math.Max(float64(n), float64(e)/3) / 100
	s := 0.9 * math.Pow(math.Max(x, 0.05), 2.8)
	if s > 1e7 {
		s = 1e7
	}
	return time.Duration(s * float64(time.Second))
}

// size returns the nodes and edges a Graphviz view lays out.
func (v *View) size() (nodes, edges int) {
	if v.Kind == Components {
		return len(v.Comps), len(v.CompEdges)
	}
	return len(v.States), len(v.Edges)
}

// BudgetError refuses a Graphviz view that would be too large to read
// (more than Limit states, for a whole view) or to lay out within Budget.
type BudgetError struct {
	View         Kind
	Nodes, Edges int
	// Limit is the largest number of states the view draws one by one
	// (0 when the limit is the budget).
	Limit    int
	Estimate time.Duration
	Budget   time.Duration
}

func (e *BudgetError) Error() string {
	what := fmt.Sprintf("the %s view of %s %s and %s %s", e.View, num(e.Nodes), plural(e.Nodes, "node", "nodes"), num(e.Edges), plural(e.Edges, "edge", "edges"))
	if e.Limit > 0 {
		return fmt.Sprintf("render: %s draws more than the limit of %s states one by one (its layout would take about %s); the control, components, degrees and groups views draw a network of any size",
			what, num(e.Limit), Duration(e.Estimate))
	}
	return fmt.Sprintf("render: %s would take about %s to lay out, more than the budget of %s; the control, degrees and groups views draw a network of any size, or draw fewer nodes",
		what, Duration(e.Estimate), Duration(e.Budget))
}

// Duration words a duration with two significant figures.
func Duration(d time.Duration) string {
	s := d.Seconds()
	switch {
	case s < 1:
		return "under a second"
	case s < 90:
		return fmt.Sprintf("%.2g s", s)
	case s < 5400:
		return fmt.Sprintf("%.2g min", s/60)
	case s < 2*86400:
		return fmt.Sprintf("%.2g h", s/3600)
	case s < 100*86400:
		return fmt.Sprintf("%.2g days", s/86400)
	}
	return "over 100 days"
}

// Precheck refuses a whole view of a network of n states and e edges
// before anything is computed, as Select would after the analysis: more
// than opt.MaxNodes states, or a layout estimated past opt.Budget. Other
// views return nil (their size is known only after the analysis).
func Precheck(kind Kind, n, e int, opt Options) error {
	if kind != Whole {
		return nil
	}
	est := estimate(n, e)
	if n > opt.maxNodes() {
		return &BudgetError{View: Whole, Nodes: n, Edges: e, Limit: opt.maxNodes(), Estimate: est}
	}
	if b := opt.budget(); est > b {
		return &BudgetError{View: Whole, Nodes: n, Edges: e, Estimate: est, Budget: b}
	}
	return nil
}
