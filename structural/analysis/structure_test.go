package analysis

import (
	"math/rand/v2"
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/internal/testnet"
)

// checkShape checks that s partitions the states into stems, cycles and
// loose chains along edges of h (the network in the property's
// orientation).
func checkShape(t *testing.T, h *structural.Network, s *Structure) {
	t.Helper()
	n := h.N()
	seen := make([]int, n)
	for _, st := range s.Stems {
		ids := st.States.IDs()
		for i, v := range ids {
			seen[v]++
			if i > 0 && !h.HasEdge(ids[i-1], v) {
				t.Fatalf("stem %d: %d -> %d is no edge", st.Number, ids[i-1], v)
			}
		}
		if len(ids) > 0 {
			touches := false
			for _, v := range s.Design.Signal(st.Signal) {
				touches = touches || v == ids[0]
			}
			if !touches {
				t.Fatalf("stem %d starts at %d, which its signal does not touch", st.Number, ids[0])
			}
		}
	}
	for i := 1; i < len(s.Stems); i++ {
		if s.Stems[i].States.Len() > s.Stems[i-1].States.Len() {
			t.Fatal("stems not ranked longest first")
		}
	}
	for _, c := range s.Cycles {
		ids := c.States.IDs()
		for i, v := range ids {
			seen[v]++
			if !h.HasEdge(v, ids[(i+1)%len(ids)]) {
				t.Fatalf("cycle: %d -> %d is no edge", v, ids[(i+1)%len(ids)])
			}
		}
		if c.Anchor.Len() == 1 {
			a := c.Anchor.At(0)
			if s.StemOf(a) < 0 && s.CycleOf(a) < 0 {
				t.Fatalf("cycle hung from %d, on no stem or cycle", a)
			}
		}
	}
	covered := 0
	for v := range seen {
		if seen[v] > 1 {
			t.Fatalf("state %d on %d parts", v, seen[v])
		}
		covered += seen[v]
	}
	if covered+s.Loose != n {
		t.Fatalf("%d states on stems and cycles, %d loose, of %d", covered, s.Loose, n)
	}
}

// TestStructureAgainstLin checks, on every small random network and
// design, that the structure read from the matching is a cactus cover
// exactly when the exhaustive Lin test (testnet.Oracle: reachability and
// every subset's in-neighbours, IEEE TAC 19(3), 1974) says the design is
// structurally controllable: no loose state and every cycle hung.
func TestStructureAgainstLin(t *testing.T) {
	rng := rand.New(rand.NewPCG(13, 1))
	agree := [2]int{}
	for trial := 0; trial < 400; trial++ {
		n := 1 + rng.IntN(9)
		g := testnet.Random(t, rng, n, 0.1+0.3*rng.Float64())
		var states []int32
		for v := 0; v < n; v++ {
			if rng.Float64() < 0.3 {
				states = append(states, int32(v))
			}
		}
		if len(states) == 0 {
			states = []int32{int32(rng.IntN(n))}
		}
		for _, p := range []structural.Property{structural.Controllability, structural.Observability} {
			d, _ := structural.Dedicated(g, states)
			v, err := structural.Check(g, p, d)
			if err != nil {
				t.Fatal(err)
			}
			rv := &Review{Summary: summary(g), Check: &CheckResult{}}
			pr := &PropertyResult{Verdict: v}
			if p == structural.Controllability {
				rv.Check.Controllability = pr
			} else {
				rv.Check.Observability = pr
			}
			s, err := rv.Structure(p, &d)
			if err != nil {
				t.Fatal(err)
			}
			h := g
			if p == structural.Observability {
				h = g.Transpose()
			}
			checkShape(t, h, s)
			hung := s.Loose == 0
			for _, c := range s.Cycles {
				hung = hung && c.Hung()
			}
			o := testnet.NewOracle(g)
			want := o.Controllable(testnet.MaskOf(states))
			if p == structural.Observability {
				want = o.Observable(testnet.MaskOf(states))
			}
			if hung != want || v.Holds != want {
				t.Fatalf("n=%d %v states %v: structure covers %v, check %v, oracle %v", n, p, states, hung, v.Holds, want)
			}
			if want {
				agree[0]++
			} else {
				agree[1]++
			}
		}
	}
	if agree[0] < 50 || agree[1] < 50 {
		t.Fatalf("too few cases of each answer: %v", agree)
	}
}

// TestStructureDrivers checks the driver set's structure: a cactus cover
// (the driver set's design always holds) with one stem per driver, and
// the stems' states together with the cycles' cover every state.
func TestStructureDrivers(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 9))
	for trial := 0; trial < 200; trial++ {
		n := 1 + rng.IntN(30)
		g := testnet.Random(t, rng, n, 2.0/float64(n))
		rv, err := Analyse(g, ReviewRequest{})
		if err != nil {
			t.Fatal(err)
		}
		s, err := rv.Structure(structural.Controllability, nil)
		if err != nil {
			t.Fatal(err)
		}
		checkShape(t, g, s)
		if s.Loose != 0 || len(s.Stems) != rv.Drivers.DriverCount {
			t.Fatalf("n=%d: %d loose, %d stems for N_D=%d", n, s.Loose, len(s.Stems), rv.Drivers.DriverCount)
		}
		for _, c := range s.Cycles {
			if !c.Hung() {
				t.Fatalf("n=%d: a cycle of %v hangs from nothing", n, c.States.Names())
			}
		}
		if s.Kind != "driver node" || s.Source != FromDrivers {
			t.Fatalf("kind %q source %q", s.Kind, s.Source)
		}
	}
}

// TestByGroupAndDistribute counts a small invented plant by hand.
func TestByGroupAndDistribute(t *testing.T) {
	// a -> b -> c, d -> c; groups: a,b in "x", c,d in "y".
	g := testnet.Network(t, 4, []testnet.Edge{{0, 1}, {1, 2}, {3, 2}})
	rv, err := Analyse(g, ReviewRequest{})
	if err != nil {
		t.Fatal(err)
	}
	s, err := rv.Structure(structural.Controllability, nil)
	if err != nil {
		t.Fatal(err)
	}
	group := func(v int32) string { return []string{"x", "x", "y", "y"}[v] }
	rows := ByGroup(g, group, s, nil)
	// Drivers: a and d (no in-edges), so x has 1 input and y 1.
	want := []GroupRow{{Group: "x", States: 2, Inputs: 1, Driven: 1}, {Group: "y", States: 2, Inputs: 1, Driven: 1}}
	if len(rows) != 2 || rows[0] != want[0] || rows[1] != want[1] {
		t.Fatalf("ByGroup = %+v, want %+v", rows, want)
	}
	d := Distribute(g, s)
	// In-degrees 0,1,2,0; the drivers a and d have in-degree 0.
	if len(d.InAll) != 3 || d.InAll[0] != (Bin{0, 2}) || d.InSignal[0] != (Bin{0, 2}) || len(d.InSignal) != 1 {
		t.Fatalf("in-degrees %+v, of signals %+v", d.InAll, d.InSignal)
	}
	// Two stems over all four states: a b c and d, or a b and d c,
	// as the matching falls.
	stems, states := 0, 0
	for _, b := range d.StemLengths {
		stems += b.Count
		states += b.K * b.Count
	}
	if stems != 2 || states != 4 {
		t.Fatalf("stem lengths %+v", d.StemLengths)
	}
}
