package netread

import (
	"encoding/json"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/structural"
)

// The fixtures in testdata/networkx were written by networkx 2.8.8 (Debian
// python3-networkx) with testdata/networkx/gen.py, fixed seeds; expected.json
// holds what networkx and scipy 1.10.1 say of each: states, distinct
// couplings and N_D = max(N - |M*|, 1) with |M*| from
// scipy.sparse.csgraph.maximum_bipartite_matching.
func TestNetworkxFixtures(t *testing.T) {
	compareWithNetworkx(t, filepath.Join("testdata", "networkx"))
}

// TestNetworkxRegenerated writes the fixtures again with the networkx and
// scipy on this machine, when python3 has them, and compares the same
// figures; it skips otherwise.
func TestNetworkxRegenerated(t *testing.T) {
	if testing.Short() {
		t.Skip("short")
	}
	py := ""
	for _, p := range []string{"/usr/bin/python3", "python3"} {
		if path, err := exec.LookPath(p); err == nil {
			if exec.Command(path, "-c", "import networkx, scipy").Run() == nil {
				py = path
				break
			}
		}
	}
	if py == "" {
		t.Skip("python3 with networkx and scipy not found")
	}
	dir := t.TempDir()
	if out, err := exec.Command(py, filepath.Join("testdata", "networkx", "gen.py"), dir).CombinedOutput(); err != nil {
		t.Fatalf("gen.py: %v\n%s", err, out)
	}
	compareWithNetworkx(t, dir)
}

type networkxFigures struct {
	States   int  `json:"states"`
	Edges    int  `json:"edges"`
	ND       int  `json:"n_d"`
	Labels   bool `json:"labels"`
	Groups   bool `json:"groups"`
	Parallel int  `json:"parallel"`
}

func compareWithNetworkx(t *testing.T, dir string) {
	t.Helper()
	raw, err := os.ReadFile(filepath.Join(dir, "expected.json"))
	if err != nil {
		t.Fatal(err)
	}
	var want map[string]networkxFigures
	if err := json.Unmarshal(raw, &want); err != nil {
		t.Fatal(err)
	}
	if len(want) < 10 {
		t.Fatalf("expected.json lists %d files", len(want))
	}
	// The same network in every format gives the same couplings and
	// weights, by name.
	byBase := map[string]map[string]float64{}
	byBaseFile := map[string]string{}
	for file, w := range want {
		path := filepath.Join(dir, file)
		in, err := ReadFile(path, Options{Weights: true})
		if err != nil {
			t.Errorf("%s: %v", file, err)
			continue
		}
		g := in.Network
		if err := checkNetwork(g); err != nil {
			t.Errorf("%s: %v", file, err)
		}
		nd := structural.Drivers(g).Count()
		if g.N() != w.States || g.Edges() != w.Edges || nd != w.ND {
			t.Errorf("%s: N %d, edges %d, N_D %d; networkx/scipy say %d, %d, %d", file, g.N(), g.Edges(), nd, w.States, w.Edges, w.ND)
		}
		if (in.Labels != nil) != w.Labels || (in.Groups != nil) != w.Groups {
			t.Errorf("%s: labels %v, groups %v; want %v, %v", file, in.Labels != nil, in.Groups != nil, w.Labels, w.Groups)
		}
		// gen.py labels every node "Unit " + its name in upper case and
		// puts it in one of three areas.
		for i := 0; i < g.N() && in.Labels != nil; i++ {
			if want := "Unit " + strings.ToUpper(g.Name(int32(i))); in.Labels[i] != want {
				t.Errorf("%s: state %q labelled %q, want %q", file, g.Name(int32(i)), in.Labels[i], want)
				break
			}
		}
		for i := 0; i < g.N() && in.Groups != nil; i++ {
			if s := in.Groups[i]; s != "boiler house" && s != "pump station" && s != "north & east" {
				t.Errorf("%s: state %q in group %q", file, g.Name(int32(i)), s)
				break
			}
		}
		if g.DuplicatesMerged() != w.Parallel {
			t.Errorf("%s: %d parallel edges merged, want %d", file, g.DuplicatesMerged(), w.Parallel)
		}
		if want := FormatOf(file); in.Format != want {
			t.Errorf("%s: read as %s, want %s", file, in.Format, want)
		}
		// By content alone, as from standard input.
		f, err := os.Open(path)
		if err != nil {
			t.Fatal(err)
		}
		sin, err := Read(f, "stdin", Options{})
		f.Close()
		if err != nil || sin.Format != in.Format || sin.Network.Edges() != g.Edges() {
			t.Errorf("%s on stdin: %v, format %v", file, err, sin)
		}
		base := strings.TrimSuffix(file, filepath.Ext(file))
		m := edgeMap(g)
		if prev, ok := byBase[base]; ok {
			if d := diffEdges(m, prev); d != "" {
				t.Errorf("%s and %s differ:%s", file, byBaseFile[base], d)
			}
		} else {
			byBase[base], byBaseFile[base] = m, file
		}
	}
}
