package sweepcsv

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func TestReadErrors(t *testing.T) {
	dir := t.TempDir()
	for name, body := range map[string]string{
		"nohead.csv": "a,b\n1,2\n",
		"badnum.csv": strings.Join(Columns, ",") + "\ner,x,2,1,5,10,3,0.3,0.3,0.1,nodes=10,model\n",
	} {
		p := filepath.Join(dir, name)
		os.WriteFile(p, []byte(body), 0o644)
		_, err := ReadFile(p)
		if err == nil {
			t.Errorf("%s: got no error", name)
			continue
		}
		if !strings.HasPrefix(err.Error(), p+":") {
			t.Errorf("%s: error %q lacks FILE:LINE", name, err)
		}
	}
	_, err := ReadFile(filepath.Join(dir, "badnum.csv"))
	if err == nil || !strings.Contains(err.Error(), ":2: nodes") {
		t.Errorf("bad number: got %v, want line 2", err)
	}
}

// A row whose numbers contradict each other (a damaged or hand-edited
// file) is refused with its line, so that a resumed sweep does not keep
// it. The consistent row is the one a run writes (N_D/N, Liu et al. 2011).
func TestReadRejectsInconsistentRows(t *testing.T) {
	const header = "model,nodes,mean_degree,replicate,seed,edges,driver_count,driver_fraction,predicted_fraction,seconds,params,prediction_from\n"
	good := "er,2000,1,1,7,1000,1298,0.649,0.6543680523,0.005,nodes=2000;mean_degree=1,model\n"
	if _, err := Read(strings.NewReader(header+good), "ok.csv"); err != nil {
		t.Fatalf("consistent row: %v", err)
	}
	for _, tc := range []struct{ row, want string }{
		{"er,2000,1,1,7,1000,9999,0.649,0.65,0.005,nodes=2000;mean_degree=1,model\n", "driver_count 9999 out of range"},
		{"er,2000,1,1,7,1000,1298,0.5,0.65,0.005,nodes=2000;mean_degree=1,model\n", "driver_fraction 0.5 is not driver_count/nodes"},
		{"er,2000,1,0,7,1000,1298,0.649,0.65,0.005,nodes=2000;mean_degree=1,model\n", "replicate 0"},
		{"er,2000,1,1,7,1000,1298,0.649,1.5,0.005,nodes=2000;mean_degree=1,model\n", "predicted_fraction 1.5"},
		{"er,2000,1,1,7,1000,1298,0.649,0.65,0.005,nodes=2000;mean_degree=1,modelX\n", `prediction_from "modelX"`},
	} {
		_, err := Read(strings.NewReader(header+good+tc.row), "bad.csv")
		if err == nil || !strings.Contains(err.Error(), "bad.csv:3: "+tc.want) {
			t.Errorf("row %q: got %v, want bad.csv:3: %s...", tc.row, err, tc.want)
		}
	}
}

// Merge keeps one row per key in canonical order (numbers compared as
// numbers: 10 after 9), counts agreeing repeats once and refuses rows of
// the same key from different seeds or with different results.
func TestMergeAndOrder(t *testing.T) {
	row := func(params string, rep int, seed uint64, drivers int) Row {
		return Row{Model: "er", Nodes: 100, Replicate: rep, Seed: seed, Edges: 200,
			DriverCount: drivers, DriverFraction: float64(drivers) / 100, Params: params}
	}
	a := []Row{row("nodes=100;mean_degree=10", 1, 7, 5), row("nodes=100;mean_degree=9", 2, 8, 6)}
	b := []Row{row("nodes=100;mean_degree=9", 2, 8, 6), row("nodes=100;mean_degree=9", 1, 9, 7)}
	got, err := Merge(a, b)
	if err != nil {
		t.Fatal(err)
	}
	var keys []string
	for _, r := range got {
		keys = append(keys, r.Key())
	}
	want := "er|nodes=100;mean_degree=9|1 er|nodes=100;mean_degree=9|2 er|nodes=100;mean_degree=10|1"
	if strings.Join(keys, " ") != want {
		t.Errorf("merged keys %v, want %s", keys, want)
	}
	if _, err := Merge(a, []Row{row("nodes=100;mean_degree=10", 1, 70, 5)}); err == nil || !strings.Contains(err.Error(), "seeds 7 and 70") {
		t.Errorf("different seeds: got %v", err)
	}
	if _, err := Merge(a, []Row{row("nodes=100;mean_degree=10", 1, 7, 4)}); err == nil || !strings.Contains(err.Error(), "different results") {
		t.Errorf("different results: got %v", err)
	}
}
