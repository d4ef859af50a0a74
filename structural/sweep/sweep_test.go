package sweep

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/io/sweepcsv"
	"github.com/netsteer/netsteer/structural/gen"
)

func TestParseValues(t *testing.T) {
	for _, tc := range []struct {
		spec    string
		integer bool
		want    string
	}{
		{"1:7:1", false, "[1 2 3 4 5 6 7]"},
		{"0:0.3:0.05", false, "[0 0.05 0.1 0.15 0.2 0.25 0.3]"},
		{"0.1:0.35:0.1", false, "[0.1 0.2 0.3]"},
		{"5", true, "[5]"},
		{"1000,2000,5000", true, "[1000 2000 5000]"},
		{"2.5,inf", false, "[2.5 inf]"},
	} {
		got, err := ParseValues(tc.spec, true, tc.integer)
		if err != nil || fmt.Sprint(got) != tc.want {
			t.Errorf("ParseValues(%q) = %v, %v; want %s", tc.spec, got, err, tc.want)
		}
	}
	for _, bad := range []string{"1:2", "3:1:1", "1:2:0", "x", "1.5"} {
		if _, err := ParseValues(bad, true, true); err == nil {
			t.Errorf("ParseValues(%q): got no error", bad)
		}
	}
}

func erPlan(t *testing.T, seed uint64) *Plan {
	t.Helper()
	axes, err := ModelAxes("er", map[string]string{"nodes": "3000", "mean_degree": "1:4:1"})
	if err != nil {
		t.Fatal(err)
	}
	return &Plan{Model: "er", Axes: axes, Replicates: 2, Seed: seed}
}

// withoutSeconds drops the wall-clock column, the one column that differs
// between runs by design.
func withoutSeconds(t *testing.T, path string) string {
	t.Helper()
	rows, err := sweepcsv.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	for i := range rows {
		rows[i].Seconds = 0
	}
	var b bytes.Buffer
	sweepcsv.Write(&b, rows)
	return b.String()
}

// Rows depend on the sweep seed and their coordinates only: the same seed
// gives the same rows whatever the worker count; shards merged equal the
// single run; a run killed part-way and resumed gives the same file.
func TestReproducibleShardsResume(t *testing.T) {
	dir := t.TempDir()
	single := filepath.Join(dir, "single.csv")
	if _, err := erPlan(t, 11).Run(context.Background(), RunOptions{Output: single, Workers: 1}); err != nil {
		t.Fatal(err)
	}
	want := withoutSeconds(t, single)
	if n := strings.Count(want, "\n"); n != 1+4*2 {
		t.Fatalf("got %d lines, want header + 8 rows:\n%s", n, want)
	}
	again := filepath.Join(dir, "again.csv")
	if _, err := erPlan(t, 11).Run(context.Background(), RunOptions{Output: again, Workers: 3}); err != nil {
		t.Fatal(err)
	}
	if got := withoutSeconds(t, again); got != want {
		t.Errorf("same seed, 3 workers:\n%s\nwant\n%s", got, want)
	}
	// Shards.
	var parts []string
	for i := 0; i < 3; i++ {
		p := filepath.Join(dir, fmt.Sprintf("shard%d.csv", i))
		res, err := erPlan(t, 11).Run(context.Background(), RunOptions{Output: p, Shard: Shard{i, 3}, Workers: 2})
		if err != nil {
			t.Fatal(err)
		}
		if res.Share != []int{3, 3, 2}[i] {
			t.Errorf("shard %d/3 has %d points", i, res.Share)
		}
		parts = append(parts, p)
	}
	merged, err := sweepcsv.MergeFiles(parts...)
	if err != nil {
		t.Fatal(err)
	}
	mpath := filepath.Join(dir, "merged.csv")
	if err := sweepcsv.WriteFile(mpath, merged, nil); err != nil {
		t.Fatal(err)
	}
	if got := withoutSeconds(t, mpath); got != want {
		t.Errorf("merged shards:\n%s\nwant\n%s", got, want)
	}
	// Kill after three rows (the run writes what it has), then resume.
	killed := filepath.Join(dir, "killed.csv")
	ctx, cancel := context.WithCancel(context.Background())
	res, err := erPlan(t, 11).Run(ctx, RunOptions{Output: killed, Workers: 1, Checkpoint: 1,
		Progress: func(done, total int) {
			if done == 3 {
				cancel()
			}
		}})
	if err == nil || res == nil || res.Computed != 3 {
		t.Fatalf("cancelled run: %v, %+v", err, res)
	}
	if n := strings.Count(withoutSeconds(t, killed), "\n"); n != 4 {
		t.Fatalf("killed run left %d lines, want header + 3 rows", n)
	}
	res, err = erPlan(t, 11).Run(context.Background(), RunOptions{Output: killed, Workers: 2})
	if err != nil {
		t.Fatal(err)
	}
	if res.Skipped != 3 || res.Computed != 5 {
		t.Errorf("resume: skipped %d computed %d, want 3 and 5", res.Skipped, res.Computed)
	}
	if got := withoutSeconds(t, killed); got != want {
		t.Errorf("resumed:\n%s\nwant\n%s", got, want)
	}
	// A rerun with another seed refuses to mix rows.
	_, err = erPlan(t, 12).Run(context.Background(), RunOptions{Output: killed})
	var se *SeedError
	if !errors.As(err, &se) || se.File != killed || se.Want == se.Have {
		t.Errorf("rerun with another seed into the same file: got %v, want a *SeedError", err)
	}
	// Merging files from different seeds is refused too.
	other := filepath.Join(dir, "other.csv")
	if _, err := erPlan(t, 12).Run(context.Background(), RunOptions{Output: other}); err != nil {
		t.Fatal(err)
	}
	if _, err := sweepcsv.MergeFiles(single, other); err == nil {
		t.Error("merging sweeps of different seeds: got no error")
	}
}

// Measured ER rows lie near the cavity prediction (Liu, Slotine &
// Barabási 2011, Fig. 3a); at N = 3000 the sampling sd of n_D is about
// 0.006, so 0.03 is five of them.
func TestERRowsNearPrediction(t *testing.T) {
	res, err := erPlan(t, 5).Run(context.Background(), RunOptions{Output: "-", Stdout: &bytes.Buffer{}})
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range res.Rows {
		if r.PredictionFrom != "model" || math.Abs(r.DriverFraction-r.PredictedFraction) > 0.03 {
			t.Errorf("%s: measured %.4f, predicted %.4f (%s)", r.Key(), r.DriverFraction, r.PredictedFraction, r.PredictionFrom)
		}
		if r.Nodes != 3000 || r.Edges != int64(math.Round(r.MeanDegree*3000/2)) {
			t.Errorf("%s: N=%d L=%d <k>=%v", r.Key(), r.Nodes, r.Edges, r.MeanDegree)
		}
	}
}

// A base sweep: dropout variants of a given network, predicted by the
// degree-preserving expectation of each variant.
func TestBaseSweep(t *testing.T) {
	g, err := gen.Params{Model: "er", Nodes: 4000, MeanDegree: 6}.Network(gen.NewRand(1))
	if err != nil {
		t.Fatal(err)
	}
	ax, err := TransformAxis("dropout=0:0.6:0.3")
	if err != nil {
		t.Fatal(err)
	}
	pl := &Plan{Base: g, BaseName: "plant.edges", Axes: []Axis{ax}, Replicates: 1, Seed: 3}
	res, err := pl.Run(context.Background(), RunOptions{Output: "-", Stdout: &bytes.Buffer{}})
	if err != nil {
		t.Fatal(err)
	}
	if len(res.Rows) != 3 {
		t.Fatalf("got %d rows, want 3", len(res.Rows))
	}
	prev := -1.0
	for _, r := range res.Rows {
		if r.Model != "base" || !strings.HasPrefix(r.Params, "base=plant.edges;+dropout=") || r.PredictionFrom != "degrees" || r.Nodes != 4000 {
			t.Errorf("row %+v", r)
		}
		// Fewer edges, more drivers (Liu et al. 2011, Fig. 3: n_D falls
		// with <k>).
		if r.DriverFraction <= prev {
			t.Errorf("%s: n_D %.4f did not grow with dropout", r.Params, r.DriverFraction)
		}
		prev = r.DriverFraction
		if math.Abs(r.DriverFraction-r.PredictedFraction) > 0.03 {
			t.Errorf("%s: measured %.4f, expectation %.4f", r.Params, r.DriverFraction, r.PredictedFraction)
		}
	}
}

func TestPointsOrderAndSeeds(t *testing.T) {
	pl := erPlan(t, 1)
	pts := pl.Points()
	if len(pts) != 8 || pts[0].Params != "nodes=3000;mean_degree=1" || pts[7].Params != "nodes=3000;mean_degree=4" || pts[7].Replicate != 2 {
		t.Fatalf("points %+v", pts)
	}
	seen := map[uint64]bool{}
	for _, p := range pts {
		if seen[p.Seed] {
			t.Errorf("seed %d repeats", p.Seed)
		}
		seen[p.Seed] = true
		if p.Seed != RowSeed(1, p.Key()) {
			t.Errorf("seed of %s does not follow from its key", p.Key())
		}
	}
}

// An output that cannot be written is reported before any row is
// computed: a long sweep must not run for hours to fail at its first
// checkpoint.
func TestRunUnwritableOutput(t *testing.T) {
	computed := 0
	out := filepath.Join(t.TempDir(), "missing", "er.csv")
	_, err := erPlan(t, 11).Run(context.Background(), RunOptions{Output: out, Workers: 1,
		Progress: func(done, total int) { computed = done }})
	if err == nil || !strings.Contains(err.Error(), "does not exist") {
		t.Fatalf("got %v, want an error about the missing directory", err)
	}
	if computed != 0 {
		t.Errorf("%d rows computed before the error, want 0", computed)
	}
}

// A plan too large to hold is refused before anything is allocated, with
// its size (common practice: refuse what a flag merely claims).
func TestPlanTooLarge(t *testing.T) {
	axes, err := ModelAxes("er", map[string]string{"nodes": "1000", "mean_degree": "1:10:1"})
	if err != nil {
		t.Fatal(err)
	}
	pl := &Plan{Model: "er", Axes: axes, Replicates: 1_000_000_000, Seed: 1}
	_, err = pl.Run(context.Background(), RunOptions{})
	var se *SizeError
	if !errors.As(err, &se) || se.Rows != 1e10 || se.Seconds <= 0 {
		t.Fatalf("got %v", err)
	}
	if pl.Points() != nil {
		t.Fatal("Points expanded a plan past the limit")
	}
}

// SeedOf inverts RowSeed (the inverse constants of SplitMix64's
// multipliers are checked by the round trip itself, on random seeds).
func TestSeedOfInvertsRowSeed(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for i := 0; i < 1000; i++ {
		seed := rng.Uint64()
		key := strconv.Itoa(i) + ";er;nodes=10"
		if got := SeedOf(RowSeed(seed, key), key); got != seed {
			t.Fatalf("SeedOf(RowSeed(%d, %q)) = %d", seed, key, got)
		}
	}
}

// Shards of sweeps with different seeds are refused when merged; shards of
// one sweep merge into the single run's rows.
func TestMergeRefusesMixedSeeds(t *testing.T) {
	dir := t.TempDir()
	axes, err := ModelAxes("er", map[string]string{"nodes": "200", "mean_degree": "1:3:1"})
	if err != nil {
		t.Fatal(err)
	}
	run := func(seed uint64, shard string, name string) string {
		pl := &Plan{Model: "er", Axes: axes, Replicates: 2, Seed: seed}
		sh, _ := ParseShard(shard)
		path := filepath.Join(dir, name)
		if _, err := pl.Run(context.Background(), RunOptions{Output: path, Shard: sh, NoTiming: true}); err != nil {
			t.Fatal(err)
		}
		return path
	}
	a, b, c := run(7, "0/2", "a.csv"), run(7, "1/2", "b.csv"), run(8, "1/2", "c.csv")
	if rows, err := MergeFiles(a, b); err != nil || len(rows) != 6 {
		t.Fatalf("one sweep's shards: %d rows, %v", len(rows), err)
	}
	var me *MixedSeedsError
	if _, err := MergeFiles(a, c); !errors.As(err, &me) || me.SeedA != 7 || me.SeedB != 8 {
		t.Fatalf("mixed seeds: %v", err)
	}
}
