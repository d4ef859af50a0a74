package failure_test

import (
	"math/rand/v2"
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/failure"
	"github.com/netsteer/netsteer/structural/internal/testnet"
)

// survivesBrute judges a multiset of dedicated devices (mult[v] devices on
// state v) by Lin's theorem after every single failure: each device unit
// removed in turn, or each edge.
func survivesBrute(m testnet.Masks, g *structural.Network, p structural.Property, t failure.Threat, mult []int) bool {
	var sig []uint32
	for v, k := range mult {
		for j := 0; j < k; j++ {
			sig = append(sig, 1<<v)
		}
	}
	if !m.Works(p, sig) {
		return false
	}
	if t == failure.AnyDevice {
		for i := range sig {
			if !m.Works(p, without(sig, 1<<i)) {
				return false
			}
		}
		return true
	}
	for u := int32(0); int(u) < g.N(); u++ {
		for _, v := range g.Succ(u) {
			if !m.WithoutEdge(u, v).Works(p, sig) {
				return false
			}
		}
	}
	return true
}

// bruteRobust searches every multiset of devices allowed by dev (at most
// maxMult per state, existing ones kept) for the cheapest that survives,
// restricted to multisets at least floor (nil: none) and, where fixed[v]
// >= 0 (nil: nowhere), to fixed[v] units on v, which the cost leaves out.
func bruteRobust(m testnet.Masks, g *structural.Network, p structural.Property, t failure.Threat, dev structural.Devices, maxMult int, floor []int, fixed []int8) (structural.Cost, bool) {
	n := g.N()
	mult := make([]int, n)
	best, ok := structural.Cost(0), false
	var rec func(v int, c structural.Cost)
	rec = func(v int, c structural.Cost) {
		if ok && c >= best {
			return
		}
		if v == n {
			if survivesBrute(m, g, p, t, mult) {
				best, ok = c, true
			}
			return
		}
		if fixed != nil && fixed[v] >= 0 {
			mult[v] = int(fixed[v])
			rec(v+1, c)
			mult[v] = 0
			return
		}
		lo, hi := 0, maxMult
		if dev.Has(int32(v)) {
			lo = 1
		}
		if floor != nil {
			lo = max(lo, floor[v])
		}
		if !dev.Allowed(int32(v)) {
			hi = 0
		}
		for k := lo; k <= hi; k++ {
			mult[v] = k
			extra := k
			if dev.Has(int32(v)) {
				extra--
			}
			rec(v+1, c+structural.Cost(extra)*dev.CostOf(int32(v)))
		}
		mult[v] = 0
	}
	rec(0, 0)
	return best, ok
}

func multOf(rp *failure.RobustPlacement, n int) []int {
	mult := make([]int, n)
	for _, v := range rp.Devices.IDs() {
		mult[v] = 1
	}
	for _, v := range rp.Spares.IDs() {
		mult[v] = 2
	}
	return mult
}

// Robust placements against exhaustive search over every multiset of
// devices on thousands of small random networks, both threats, both
// properties, with costs, forbidden states, existing devices, spares on
// and off: feasibility agrees; the exact search's cost is the optimum; the
// two-step answer survives every single failure (recomputed by Lin's
// theorem), costs no less than the optimum, and its lower bounds hold,
// the cover bounds against the cheapest additions to its own base (the
// problem and the two-step method of Liu, Mo, Pequito, Sinopoli, Kar &
// Aguiar, IEEE TCNS 2017).
func TestRobustAgainstBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(2017, 4))
	trials := 1500
	if testing.Short() {
		trials = 300
	}
	feasible, gaps := 0, 0
	for trial := 0; trial < trials; trial++ {
		n := 1 + rng.IntN(6)
		g := testnet.Random(t, rng, n, []float64{0.15, 0.25, 0.4, 0.6}[rng.IntN(4)])
		p := structural.Controllability
		if rng.IntN(2) == 0 {
			p = structural.Observability
		}
		threat := failure.Threat(rng.IntN(2))
		spares := rng.IntN(2) == 0
		maxMult := 1
		if spares {
			maxMult = 2
		}
		var dev structural.Devices
		if rng.IntN(3) > 0 {
			dev = testnet.RandomDevices(rng, n, 4, 0.15, 0.15)
		}
		m := testnet.MasksOf(g)
		opt, ok := bruteRobust(m, g, p, threat, dev, maxMult, nil, nil)
		for _, exactStates := range []int{0, -1} {
			rp, err := failure.Robust(g, failure.RobustRequest{Property: p, Survive: threat, Devices: dev, Spares: spares, ExactStates: exactStates})
			if err != nil {
				t.Fatalf("trial %d: %v", trial, err)
			}
			if rp.Feasible != ok {
				t.Fatalf("trial %d: feasible %v, brute force %v", trial, rp.Feasible, ok)
			}
			if !ok {
				if rp.BlockingDevices.Len()+len(rp.BlockingLinks) == 0 && rp.Unplaceable == nil {
					t.Fatalf("trial %d: infeasible without a blocking loss", trial)
				}
				// Each blocking loss breaks the design with every allowed
				// device (and spare).
				all := make([]int, n)
				for v := range all {
					if dev.Allowed(int32(v)) {
						all[v] = maxMult
					}
				}
				var sig []uint32
				for v, k := range all {
					for j := 0; j < k; j++ {
						sig = append(sig, 1<<v)
					}
				}
				if rp.Unplaceable != nil && m.Works(p, sig) {
					t.Fatalf("trial %d: every allowed device works, yet reported unplaceable", trial)
				}
				for _, v := range rp.BlockingDevices.IDs() {
					i := 0
					for u := 0; u < int(v); u++ {
						i += all[u]
					}
					if m.Works(p, without(sig, 1<<i)) {
						t.Fatalf("trial %d: blocking device on %d is not a single point of failure", trial, v)
					}
				}
				for _, l := range rp.BlockingLinks {
					if m.WithoutEdge(l.From, l.To).Works(p, sig) {
						t.Fatalf("trial %d: blocking link %d->%d does not break", trial, l.From, l.To)
					}
				}
				continue
			}
			mult := multOf(rp, n)
			var c structural.Cost
			for v, k := range mult {
				if dev.Has(int32(v)) {
					if k == 0 {
						t.Fatalf("trial %d: existing device on %d dropped", trial, v)
					}
					k--
				}
				if k > 0 && !dev.Allowed(int32(v)) {
					t.Fatalf("trial %d: device on forbidden %d", trial, v)
				}
				c += structural.Cost(k) * dev.CostOf(int32(v))
			}
			if !spares && rp.Spares.Len() > 0 || c != rp.Cost || !survivesBrute(m, g, p, threat, mult) {
				t.Fatalf("trial %d: %s placement %v spares %v (cost %v, stated %v) does not survive %v", trial, rp.Method, rp.Devices.IDs(), rp.Spares.IDs(), c, rp.Cost, threat)
			}
			if rp.Cost < opt || rp.LowerBound > opt || rp.Gap != rp.Cost-rp.LowerBound || rp.Optimal && rp.Cost != opt {
				t.Fatalf("trial %d: %s cost %v bound %v optimal %v, brute-force optimum %v", trial, rp.Method, rp.Cost, rp.LowerBound, rp.Optimal, opt)
			}
			if exactStates == 0 && (!rp.Optimal || rp.Cost != opt) {
				t.Fatalf("trial %d: exact search %s cost %v optimal %v, optimum %v", trial, rp.Method, rp.Cost, rp.Optimal, opt)
			}
			if exactStates < 0 && rp.Step != nil {
				base := make([]int, n)
				for _, v := range rp.Step.Base.IDs() {
					base[v] = 1
				}
				add, ok2 := bruteRobust(m, g, p, threat, dev, maxMult, base, nil)
				s := rp.Step
				if ok2 {
					add -= s.BaseCost
				}
				if rp.Method == "two-step" && (!ok2 || s.CoverCost < add || !s.Restricted && (s.CoverLowerBound > add || s.CoverOptimal && s.CoverCost != add)) {
					t.Fatalf("trial %d: cover %v bound %v optimal %v, least additions %v (%v)", trial, s.CoverCost, s.CoverLowerBound, s.CoverOptimal, add, ok2)
				}
				if rp.Gap > 0 {
					gaps++
				}
			}
		}
		if ok {
			feasible++
		}
	}
	if feasible < trials/4 {
		t.Fatalf("only %d of %d feasible: the draw tests little", feasible, trials)
	}
	t.Logf("%d feasible, %d two-step answers with a gap", feasible, gaps)
}

// A hub acting on four leaves that act on nothing (common practice: the
// leaves compete for the hub, so all but one need an actuator, and the
// hub, acted on by nothing, needs its own). Surviving the loss of any one
// actuator takes a spare on the hub and an actuator on every leaf: six.
// The two-step method finds it, and its lower bound (two units in the
// hub's source component, one on each leaf) proves it without search.
func TestRobustStar(t *testing.T) {
	var es []testnet.Edge
	for v := int32(1); v <= 4; v++ {
		es = append(es, testnet.Edge{0, v})
	}
	g := testnet.Network(t, 5, es)
	rp, err := failure.Robust(g, failure.RobustRequest{Survive: failure.AnyDevice, Spares: true, ExactStates: -1})
	if err != nil {
		t.Fatal(err)
	}
	opt, _ := bruteRobust(testnet.MasksOf(g), g, structural.Controllability, failure.AnyDevice, structural.Devices{}, 2, nil, nil)
	if rp.Cost != 6*structural.Unit || opt != rp.Cost || rp.LowerBound != rp.Cost || !rp.Optimal || rp.Spares.Len() != 1 {
		t.Fatalf("star: %s cost %v bound %v optimal %v spares %v; brute force %v", rp.Method, rp.Cost, rp.LowerBound, rp.Optimal, rp.Spares.IDs(), opt)
	}
}
