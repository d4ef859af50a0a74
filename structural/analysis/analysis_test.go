package analysis_test

import (
	"encoding/json"
	"errors"
	"math/rand/v2"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/analysis"
	"github.com/netsteer/netsteer/structural/internal/testnet"
	"github.com/netsteer/netsteer/structural/numeric"
)

// Each question's answer against the exhaustive Lin oracle (every subset
// of states, Hall's condition checked on every set; testnet.Oracle):
// Drivers' design holds, Place's count is the brute-force minimum, Check
// agrees with the oracle and a failing design's completion makes it hold.
func TestAnswersBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 10))
	for i := 0; i < 300; i++ {
		n := 1 + rng.IntN(8)
		g := testnet.Random(t, rng, n, []float64{0.1, 0.2, 0.35}[i%3])
		o := testnet.NewOracle(g)
		dr, err := analysis.Drivers(g, analysis.DriversRequest{Roles: true})
		if err != nil {
			t.Fatal(err)
		}
		if v := testnet.Check(t, g, structural.Controllability, dr.Inputs.Signals()); !v.Holds || dr.Inputs.Len() != dr.DriverCount {
			t.Fatalf("trial %d: drivers' design of %d signals holds %v", i, dr.Inputs.Len(), v.Holds)
		}
		for _, p := range []structural.Property{structural.Controllability, structural.Observability} {
			pr, err := analysis.Place(g, analysis.PlaceRequest{Property: p})
			if err != nil {
				t.Fatal(err)
			}
			want := testnet.BruteForce(o, p == structural.Observability, structural.Devices{})
			if !pr.Feasible || pr.DeviceCount != want.Count || pr.Count == nil || pr.Count.Count != want.Count {
				t.Fatalf("trial %d %v: placed %d (count %+v), brute force %d", i, p, pr.DeviceCount, pr.Count, want.Count)
			}
			// A random dedicated design, judged and completed.
			var s []int32
			var mask uint32
			for v := 0; v < n; v++ {
				if rng.IntN(3) == 0 {
					s = append(s, int32(v))
					mask |= 1 << v
				}
			}
			d, _ := structural.Dedicated(g, s)
			req := analysis.CheckRequest{Inputs: &d}
			holds := o.Controllable(mask)
			if p == structural.Observability {
				req = analysis.CheckRequest{Outputs: &d}
				holds = o.Observable(mask)
			}
			cr, err := analysis.Check(g, req)
			if err != nil {
				t.Fatal(err)
			}
			pp := cr.Properties()[0]
			if pp.Holds != holds || cr.Holds() != holds || pp.Property != p {
				t.Fatalf("trial %d %v: design %v holds %v, oracle %v", i, p, s, pp.Holds, holds)
			}
			if holds != (pp.Completion == nil) {
				t.Fatalf("trial %d %v: completion %v for a design that holds %v", i, p, pp.Completion, holds)
			}
			if c := pp.Completion; c != nil {
				all := mask | testnet.MaskOf(c.Added.IDs())
				if !c.Feasible || p == structural.Controllability && !o.Controllable(all) || p == structural.Observability && !o.Observable(all) {
					t.Fatalf("trial %d %v: completion %v of %v fails", i, p, c.Added.IDs(), s)
				}
			}
		}
	}
}

func TestCheckErrors(t *testing.T) {
	g := coolingLoop()
	if _, err := analysis.Check(g, analysis.CheckRequest{}); !errors.Is(err, analysis.ErrNoDesign) {
		t.Errorf("no design: %v", err)
	}
	other := testnet.Network(t, 3, []testnet.Edge{{0, 1}})
	d, _ := structural.Dedicated(other, []int32{0})
	if _, err := analysis.Check(g, analysis.CheckRequest{Inputs: &d}); !errors.Is(err, structural.ErrForeignDesign) {
		t.Errorf("foreign design: %v", err)
	}
}

// The JSON of a result uses the documented keys, names for states, and
// one shape for both properties.
func TestJSONShape(t *testing.T) {
	g := coolingLoop()
	r, err := analysis.Check(g, analysis.CheckRequest{Inputs: design(g, "chiller.setpoint"), Outputs: design(g, "chiller.load")})
	if err != nil {
		t.Fatal(err)
	}
	b, err := json.Marshal(r)
	if err != nil {
		t.Fatal(err)
	}
	var doc map[string]any
	if err := json.Unmarshal(b, &doc); err != nil {
		t.Fatal(err)
	}
	c, o := doc["controllability"].(map[string]any), doc["observability"].(map[string]any)
	for k := range c {
		if _, ok := o[k]; !ok && k != "design_file" {
			t.Errorf("controllability has %q, observability not", k)
		}
	}
	if !strings.Contains(string(b), `"unreached":["pump.speed","loop.flow"]`) {
		t.Errorf("unreached not listed by name: %s", b)
	}
	for k := range doc["timings"].(map[string]any) {
		if !strings.HasSuffix(k, "_s") {
			t.Errorf("timing key %q", k)
		}
	}
}

// The review's numeric check against the exhaustive Lin oracle
// (testnet.Oracle): the cheapest devices placed are structurally
// controllable and observable, so the sampled systems are too (a failure
// has probability at most n/p over GF(p), Schwartz–Zippel); a given
// design that fails Lin's test can never be controllable for any values.
func TestReviewVerify(t *testing.T) {
	rng := rand.New(rand.NewPCG(4, 11))
	failing := 0
	for i := 0; i < 100; i++ {
		n := 1 + rng.IntN(7)
		g := testnet.Random(t, rng, n, 0.25)
		rv, err := analysis.Analyse(g, analysis.ReviewRequest{PlaceActuators: true, PlaceSensors: true,
			Verify: &numeric.Request{Seed: uint64(i)}})
		if err != nil {
			t.Fatal(err)
		}
		if rv.NumericError != nil || rv.Numeric == nil || !rv.Numeric.Holds() ||
			strings.Join(rv.NumericChecked, ",") != "the cheapest actuators,the cheapest sensors" {
			t.Fatalf("trial %d: numeric %+v checked %v error %v", i, rv.Numeric, rv.NumericChecked, rv.NumericError)
		}
		d, _ := structural.Dedicated(g, []int32{int32(rng.IntN(n))})
		rv, err = analysis.Analyse(g, analysis.ReviewRequest{Inputs: &d, Verify: &numeric.Request{Seed: uint64(i)}})
		if err != nil || rv.NumericError != nil {
			t.Fatal(err, rv.NumericError)
		}
		o := testnet.NewOracle(g)
		if lin := o.Controllable(1 << d.Signals()[0][0]); !lin {
			failing++
			if rv.Numeric.Holds() {
				t.Fatalf("trial %d: fails Lin's test but sampled controllable", i)
			}
		}
	}
	if failing < 10 {
		t.Fatalf("only %d failing designs tried", failing)
	}
	rv, err := analysis.Analyse(testnet.Random(t, rng, 3, 0.5), analysis.ReviewRequest{Verify: &numeric.Request{}})
	if err != nil || !errors.Is(rv.NumericError, analysis.ErrNothingToVerify) || rv.Numeric != nil {
		t.Fatalf("nothing to verify: %v %v", err, rv.NumericError)
	}
}
