package main

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"os"
	"path/filepath"
	"testing"

	"github.com/netsteer/netsteer/io/netread"
)

// A network written by generate and read back (edge list plus node table)
// has the N and L generate reports, isolated states included (issue 7's
// round-trip contract).
func TestGenerateReadBack(t *testing.T) {
	dir := t.TempDir()
	for _, args := range [][]string{
		{"er", "--nodes", "5000", "--mean-degree", "1"},
		{"scale-free", "--nodes", "5000", "--mean-degree", "3", "--gamma-out", "2.4", "--gamma-in", "3.5"},
		{"small-world", "--nodes", "3000", "--degree", "4", "--rewire", "0.2", "--two-way"},
		{"regular", "--nodes", "3000", "--degree", "3", "--side", "out"},
		{"grid", "--nodes", "1000", "--width", "30", "--directions", "all"},
		{"tree", "--nodes", "999", "--branching", "0"},
	} {
		path := filepath.Join(dir, args[0]+".edges.gz")
		var out, errb bytes.Buffer
		e := &env{Stdout: &out, Stderr: &errb}
		full := append([]string{"generate"}, args...)
		full = append(full, "--seed", "4", "--format", "json", "-o", path)
		if st := run(e, full); st != exitOK {
			t.Fatalf("%v: status %d: %s", args, st, errb.String())
		}
		var sum struct {
			Nodes     int    `json:"nodes"`
			Edges     int    `json:"edges"`
			NodeTable string `json:"node_table"`
		}
		if err := json.Unmarshal(out.Bytes(), &sum); err != nil {
			t.Fatalf("%v: %v\n%s", args, err, out.String())
		}
		f, err := os.Open(sum.NodeTable)
		if err != nil {
			t.Fatal(err)
		}
		recs, err := csv.NewReader(f).ReadAll()
		f.Close()
		if err != nil || recs[0][0] != "node" {
			t.Fatalf("%v: node table %v, %v", args, recs[:1], err)
		}
		var states []string
		for _, r := range recs[1:] {
			states = append(states, r[0])
		}
		in, err := netread.ReadFile(path, netread.Options{States: states})
		if err != nil {
			t.Fatal(err)
		}
		g := in.Network
		if g.N() != sum.Nodes || g.Edges() != sum.Edges || g.DuplicatesMerged() != 0 || g.SelfLoops() != 0 {
			t.Errorf("%v: read back N=%d L=%d (merged %d, loops %d), generate said N=%d L=%d",
				args, g.N(), g.Edges(), g.DuplicatesMerged(), g.SelfLoops(), sum.Nodes, sum.Edges)
		}
		if want := map[string]int{"er": 5000, "small-world": 3000, "regular": 3000, "grid": 1000, "tree": 999, "scale-free": 5000}[args[0]]; sum.Nodes != want {
			t.Errorf("%v: N=%d, want %d", args, sum.Nodes, want)
		}
	}
}
