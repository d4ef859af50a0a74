package numeric

import (
	"encoding/json"
	"math/rand/v2"
	"slices"
	"sort"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/structural"
)

func keysOf(m map[string]any) []string {
	var k []string
	for s := range m {
		k = append(k, s)
	}
	sort.Strings(k)
	return k
}

// The JSON contract of a verify result: the property objects carry every
// key of structural.Verdict's own JSON (one shape in check, verify and
// report) beside the sampled keys; timing keys end in _s; a figure that is
// not finite (the next modal bound when every eigenvalue was evaluated)
// is left out rather than written as NaN or Inf; the CSV columns are
// exactly the trials' JSON keys; and the part's states are counted once.
func TestVerifyJSONContract(t *testing.T) {
	g, in := erNetwork(30, 3, 7)
	out := [][]int32{{0}, {5}}
	res, err := Verify(g, Request{Inputs: dz(g, in), Outputs: dz(g, out), Seed: 2, Trials: 2, Part: &Part{Hops: NoLimit, Limit: 20},
		Modes: true, Effort: true, Horizon: 0.5})
	if err != nil {
		t.Fatal(err)
	}
	b, err := json.Marshal(res)
	if err != nil {
		t.Fatal(err)
	}
	var top map[string]any
	if err := json.Unmarshal(b, &top); err != nil {
		t.Fatal(err)
	}
	wantTop := []string{"cautions", "controllability", "duplicates_merged", "edges", "inexact_weights", "kalman", "network_weights", "nodes",
		"observability", "part", "prime", "seed", "self_loops", "time_domain", "timings", "trials", "warnings", "weights", "zero_entries"}
	if got := keysOf(top); !slices.Equal(got, wantTop) {
		t.Errorf("top-level keys %v, want %v", got, wantTop)
	}
	part := top["part"].(map[string]any)
	if part["nodes"].(float64) != 20 || len(part["states"].([]any)) != 20 {
		t.Errorf("part %v", part)
	}
	if top["nodes"].(float64) != 30 {
		t.Errorf("nodes %v: the whole network's", top["nodes"])
	}
	for k := range top["timings"].(map[string]any) {
		if !strings.HasSuffix(k, "_s") {
			t.Errorf("timing key %q", k)
		}
	}
	cols := map[string]bool{}
	for _, c := range TrialColumns[1:] {
		cols[c] = true
	}
	seen := map[string]bool{}
	for i, p := range res.Properties() {
		name := []string{"controllability", "observability"}[i]
		obj := top[name].(map[string]any)
		vb, err := json.Marshal(p.Verdict)
		if err != nil {
			t.Fatal(err)
		}
		var verdict map[string]any
		json.Unmarshal(vb, &verdict)
		for _, k := range keysOf(verdict) {
			if _, ok := obj[k]; !ok {
				t.Errorf("%s: verdict key %q missing", name, k)
			}
		}
		for _, k := range []string{"sampled_dimension", "sampled_holds", "agrees", "margin", "failure_bound", "trials"} {
			if _, ok := obj[k]; !ok {
				t.Errorf("%s: key %q missing", name, k)
			}
		}
		for _, tr := range obj["trials"].([]any) {
			m := tr.(map[string]any)
			if _, ok := m["next_bound"]; ok {
				t.Errorf("next_bound written although every eigenvalue was evaluated")
			}
			for k := range m {
				seen[k] = true
				if k == "modes" {
					continue // the list of modes: ModeTable's rows
				}
				if !cols[k] {
					t.Errorf("trial key %q is not a CSV column", k)
				}
			}
		}
	}
	// Columns never seen here: second_prime_dimension (weights only),
	// next_bound (a partial margin only), effort_skipped (an infinite
	// horizon on an unstable A), worst_case_energy (left out for a singular
	// Gramian).
	for c := range cols {
		if !seen[c] && !slices.Contains([]string{"second_prime_dimension", "next_bound", "effort_skipped", "worst_case_energy"}, c) {
			t.Errorf("CSV column %q is no trial key", c)
		}
	}
	// Mode rows carry the keys of the mode objects.
	mh, mrows := res.ModeTable()
	if !slices.Equal(mh, ModeColumns) {
		t.Errorf("mode columns %v", mh)
	}
	nModes := 0
	for _, p := range res.Properties() {
		for _, tr := range p.Trials {
			for _, md := range tr.Modes.List {
				nModes++
				b, _ := json.Marshal(md)
				var mm map[string]any
				json.Unmarshal(b, &mm)
				for k := range mm {
					if !slices.Contains(ModeColumns, k) {
						t.Errorf("mode key %q is no column", k)
					}
				}
			}
		}
	}
	if len(mrows) != nModes || nModes == 0 {
		t.Errorf("%d mode rows for %d modes", len(mrows), nModes)
	}
	header, rows := res.Table()
	if !slices.Equal(header, TrialColumns) || len(rows) != 4 || rows[2][0] != "observability" {
		t.Errorf("table %v with %d rows", header, len(rows))
	}
	// A margin evaluated at part of the eigenvalues writes next_bound, and
	// the CSV cell agrees with the JSON value.
	g2, in2 := erNetwork(40, 3, 9)
	res, err = Verify(g2, Request{Inputs: dz(g2, in2), Seed: 1, Trials: 1, Float: &FloatOptions{Flops: 1}})
	if err != nil {
		t.Fatal(err)
	}
	b, _ = json.Marshal(res.Controllability.Trials[0])
	var tr map[string]any
	json.Unmarshal(b, &tr)
	_, rows = res.Table()
	col := slices.Index(TrialColumns, "next_bound")
	if nb, ok := tr["next_bound"].(float64); !ok || rows[0][col] == "" || cell(nb) != rows[0][col] {
		t.Errorf("next_bound JSON %v, CSV %q", tr["next_bound"], rows[0][col])
	}
}

// No NaN or Inf reaches JSON, whatever the numbers: encoding/json refuses
// them, so marshalling every result of random weighted systems (unstable,
// singular, uncontrollable, with zero entries, in both time domains, with
// and without a horizon) must succeed.
func TestVerifyJSONNeverNaN(t *testing.T) {
	rng := rand.New(rand.NewPCG(61, 62))
	vals := []float64{-2, -1, -0.5, 0.5, 1, 2, 3}
	for c := 0; c < 200; c++ {
		n := 1 + rng.IntN(6)
		b := structural.NewIntBuilder(n, 0)
		for u := 0; u < n; u++ {
			for v := 0; v < n; v++ {
				if rng.Float64() < 0.35 {
					b.AddWeightedEdge(int32(u), int32(v), vals[rng.IntN(len(vals))])
				}
			}
		}
		g, err := b.Build(structural.BuildOptions{})
		if err != nil {
			t.Fatal(err)
		}
		in := [][]int32{{int32(rng.IntN(n))}}
		out := [][]int32{{int32(rng.IntN(n))}}
		req := Request{Inputs: dz(g, in), Outputs: dz(g, out), Weights: c%2 == 0, Seed: uint64(c), Trials: 1,
			Modes: true, Effort: true, Discrete: c%3 == 0}
		if c%4 == 1 {
			req.Horizon = float64(1 + rng.IntN(3))
		}
		res, err := Verify(g, req)
		if err != nil {
			t.Fatalf("case %d: %v", c, err)
		}
		if _, err := json.Marshal(res); err != nil {
			t.Fatalf("case %d: %v", c, err)
		}
		_, rows := res.Table()
		_, mrows := res.ModeTable()
		for _, row := range append(rows, mrows...) {
			for _, cl := range row {
				if strings.Contains(cl, "NaN") || strings.Contains(cl, "Inf") {
					t.Fatalf("case %d: CSV cell %q", c, cl)
				}
			}
		}
	}
}
