package textout

import (
	"encoding/csv"
	"fmt"
	"io"
	"strconv"
	"strings"

	"github.com/netsteer/netsteer/structural/analysis"
)

// Vary is the report of analysis.Vary.
type Vary struct {
	R *analysis.VaryResult
	// IndexedMTX says the variant went to a Matrix Market file whose
	// indices are not the states' names.
	IndexedMTX bool
}

// Value returns the result, for JSON.
func (v Vary) Value() any { return v.R }

// Text writes the variant's driver count against the original's first.
func (v Vary) Text(w io.Writer, o Options) error {
	r := v.R
	t := newTW(w, o)
	t.p("  ", "The variant needs %d independent control %s for %s (driver fraction %.4f); %s needed %d for %s.",
		r.DriverCount, plural(r.DriverCount, "signal", "signals"), count(r.Nodes, "state", "states"), r.DriverFraction,
		displayFile(r.File), r.DriverCountBefore, count(r.NodesBefore, "state", "states"))
	if r.PredictedFraction != nil {
		t.p("  ", "Degree-preserving expectation for the variant: %.4f (cavity prediction for its degree sequence).", *r.PredictedFraction)
	}
	s := fmt.Sprintf("Wrote %s: %s, %s (was %d and %d)", r.Output, count(r.Nodes, "state", "states"), count(r.Edges, "edge", "edges"), r.NodesBefore, r.EdgesBefore)
	if r.NodeTable != "" {
		s += "; node table " + r.NodeTable
	}
	t.p("  ", "%s.", s)
	if v.IndexedMTX {
		t.p("  ", "Matrix Market numbers the states 1..%d; their names are in the file's comment lines \"%% state I NAME\".", r.Nodes)
	}
	t.blank()
	t.p("  ", "transforms: %s; seed %d", strings.Join(r.Transforms, ", "), r.Seed)
	return t.done()
}

// CSV writes one header row and one row with the JSON keys.
func (v Vary) CSV(w io.Writer) error {
	r := v.R
	cw := csv.NewWriter(w)
	cw.Write([]string{"file", "transforms", "seed", "output", "node_table", "nodes_before", "edges_before", "driver_count_before",
		"nodes", "edges", "driver_count", "driver_fraction", "predicted_fraction"})
	cw.Write([]string{r.File, strings.Join(r.Transforms, ";"), strconv.FormatUint(r.Seed, 10), r.Output, r.NodeTable,
		strconv.Itoa(r.NodesBefore), strconv.Itoa(r.EdgesBefore), strconv.Itoa(r.DriverCountBefore),
		strconv.Itoa(r.Nodes), strconv.Itoa(r.Edges), strconv.Itoa(r.DriverCount),
		strconv.FormatFloat(r.DriverFraction, 'g', -1, 64), optFloat(r.PredictedFraction)})
	cw.Flush()
	return cw.Error()
}

func optFloat(x *float64) string {
	if x == nil {
		return ""
	}
	return strconv.FormatFloat(*x, 'g', 10, 64)
}

// Generate is the report of a generated network.
type Generate struct {
	R *analysis.GenerateResult
	// EdgeList says the network went to an edge list (which loses isolated
	// states unless a node table goes beside it).
	EdgeList bool
}

// Value returns the result, for JSON.
func (g Generate) Value() any { return g.R }

// Text writes what was written first, then the prediction and parameters.
func (g Generate) Text(w io.Writer, o Options) error {
	r := g.R
	t := newTW(w, o)
	t.p("  ", "Wrote %s: %s, %s (model %s, mean degree <k> = 2L/N = %.4g).",
		r.Output, count(r.Nodes, "state", "states"), count(int(r.Edges), "edge", "edges"), r.Model, r.MeanDegree)
	if r.NodeTable != "" {
		t.p("  ", "Node table with all %d states: %s (read back with --node-table %s).", r.Nodes, r.NodeTable, r.NodeTable)
	} else if g.EdgeList {
		t.p("  ", "No node table written: states without edges are missing from the edge list.")
	}
	if r.PredictedFraction != nil {
		t.p("  ", "Cavity prediction of the driver fraction for this model: n_D = %.4g (Liu, Slotine & Barabasi 2011).", *r.PredictedFraction)
	}
	s := fmt.Sprintf("seed %d", r.Seed)
	for _, kv := range r.Settings() {
		s += fmt.Sprintf(", %s %s", kv.Name, kv.Value)
	}
	t.blank()
	t.p("  ", "%s", s)
	return t.done()
}

// CSV writes one header row and one row with the JSON keys.
func (g Generate) CSV(w io.Writer) error {
	r := g.R
	var ps []string
	for _, kv := range r.Settings() {
		ps = append(ps, kv.Name+"="+kv.Value)
	}
	cw := csv.NewWriter(w)
	cw.Write([]string{"model", "nodes", "edges", "mean_degree", "seed", "params", "output", "node_table", "predicted_fraction"})
	cw.Write([]string{r.Model, strconv.Itoa(r.Nodes), strconv.FormatInt(r.Edges, 10),
		strconv.FormatFloat(r.MeanDegree, 'g', 12, 64), strconv.FormatUint(r.Seed, 10),
		strings.Join(ps, ";"), r.Output, r.NodeTable, optFloat(r.PredictedFraction)})
	cw.Flush()
	return cw.Error()
}
