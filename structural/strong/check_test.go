package strong

import (
	"encoding/json"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/internal/testnet"
)

// build returns a network of n states named 0..n-1; undirected reads each
// edge both ways.
func build(t testing.TB, n int, edges [][2]int32, undirected bool) *structural.Network {
	t.Helper()
	b := structural.NewIntBuilder(n, 0)
	for _, e := range edges {
		b.AddEdge(e[0], e[1])
	}
	g, err := b.Build(structural.BuildOptions{Undirected: undirected})
	if err != nil {
		t.Fatal(err)
	}
	return g
}

func path(n int) [][2]int32 {
	var e [][2]int32
	for i := int32(0); i+1 < int32(n); i++ {
		e = append(e, [2]int32{i, i + 1})
	}
	return e
}

func cycle(n int) [][2]int32 {
	return append(path(n), [2]int32{int32(n - 1), 0})
}

func star(k int) [][2]int32 {
	var e [][2]int32
	for i := int32(1); i <= int32(k); i++ {
		e = append(e, [2]int32{0, i})
	}
	return e
}

func complete(n int) [][2]int32 {
	var e [][2]int32
	for i := int32(0); i < int32(n); i++ {
		for j := i + 1; j < int32(n); j++ {
			e = append(e, [2]int32{i, j})
		}
	}
	return e
}

func mustCheck(t testing.TB, g *structural.Network, p structural.Property, states []int32, c Class) *Result {
	t.Helper()
	d, err := structural.Dedicated(g, states)
	if err != nil {
		t.Fatal(err)
	}
	r, err := Check(g, Request{Property: p, Design: d, Class: c})
	if err != nil {
		t.Fatal(err)
	}
	for _, x := range []*Test{&r.AtZero, &r.AtNonzero} {
		if !x.Holds && (x.Witness == nil || x.Witness.Confirm() != nil) {
			t.Fatalf("failing test without a confirmed witness: %s", x.NoWitness)
		}
	}
	return r
}

// TestPublishedExamples: worked examples on paths, stars, cycles and
// complete graphs with the stated diagonal class.
func TestPublishedExamples(t *testing.T) {
	free, zero, nonzero := Class{}, Class{Diagonal: ZeroDiagonal}, Class{Diagonal: NonzeroDiagonal}
	for _, c := range []struct {
		name, source string
		g            *structural.Network
		inputs       []int32
		class        Class
		holds        bool
		unforced     []int32
	}{
		// Zero forcing on simple graphs, free diagonal (Monshizadeh,
		// Zhang & Camlibel 2014: strong iff the leaders are a zero forcing
		// set). Zero forcing numbers of paths, cycles, stars and complete
		// graphs: AIM Minimum Rank - Special Graphs Work Group, "Zero
		// forcing sets and the minimum rank of graphs", Linear Algebra
		// Appl. 428:1628-1648, 2008 (values from memory: Z(P_n) = 1 with
		// an end vertex, Z(C_n) = 2 with two adjacent vertices, Z(K_1,k)
		// = k-1, Z(K_n) = n-1).
		{"path end", "AIM 2008, Z(P_n)=1", build(t, 6, path(6), true), []int32{0}, free, true, nil},
		{"path interior", "AIM 2008 (an interior vertex has two white neighbours)", build(t, 6, path(6), true), []int32{2}, free, false, []int32{0, 1, 3, 4, 5}},
		{"cycle one", "AIM 2008, Z(C_n)=2", build(t, 6, cycle(6), true), []int32{0}, free, false, []int32{1, 2, 3, 4, 5}},
		{"cycle adjacent two", "AIM 2008, Z(C_n)=2", build(t, 6, cycle(6), true), []int32{0, 1}, free, true, nil},
		{"cycle opposite two", "AIM 2008 (no vertex has a single white neighbour)", build(t, 6, cycle(6), true), []int32{0, 3}, free, false, []int32{1, 2, 4, 5}},
		{"star k-1 leaves", "AIM 2008, Z(K_1,k)=k-1", build(t, 5, star(4), true), []int32{1, 2, 3}, free, true, nil},
		{"star centre", "AIM 2008", build(t, 5, star(4), true), []int32{0}, free, false, []int32{1, 2, 3, 4}},
		{"complete n-1", "AIM 2008, Z(K_n)=n-1", build(t, 5, complete(5), true), []int32{0, 1, 2, 3}, free, true, nil},
		{"complete n-2", "AIM 2008, Z(K_n)=n-1", build(t, 5, complete(5), true), []int32{0, 1, 2}, free, false, []int32{3, 4}},
		// Directed graphs, free diagonal: a directed path driven at its
		// head and a directed cycle driven anywhere are zero forced, since
		// every state has one out-neighbour (common practice).
		{"directed path head", "common practice", build(t, 6, path(6), false), []int32{0}, free, true, nil},
		{"directed path middle", "common practice (upstream never reached)", build(t, 6, path(6), false), []int32{3}, free, false, []int32{0, 1, 2}},
		{"directed cycle", "common practice", build(t, 6, cycle(6), false), []int32{4}, free, true, nil},
		{"directed out-star centre", "common practice (k leaves share one in-neighbour)", build(t, 4, star(3), false), []int32{0}, free, false, []int32{1, 2, 3}},
		// Given diagonals (loop graphs; Trefois & Delvenne 2015, Jarczyk,
		// Svaricek & Alt 2011). Worked by hand and covered by the
		// three-state brute force: the feed-forward triangle 0->1->2,
		// 0->2 driven at 0 is strong with zero self-dynamics (2's column
		// forces 2 at eigenvalue 0, and its nonzero shifted diagonal does
		// at the others), not with free ones (y = z on the diagonal
		// leaves a double eigenvalue a single input cannot split).
		{"triangle zero diagonal", "by hand; brute force", build(t, 3, [][2]int32{{0, 1}, {1, 2}, {0, 2}}, false), []int32{0}, zero, true, nil},
		{"triangle free diagonal", "by hand; brute force", build(t, 3, [][2]int32{{0, 1}, {1, 2}, {0, 2}}, false), []int32{0}, free, false, []int32{1, 2}},
		// A self-damped star (every diagonal nonzero) driven at the
		// centre: two leaves with equal damping are indistinguishable
		// (a symmetric pair), so not strong (common practice).
		{"self-damped star", "common practice", build(t, 3, star(2), true), []int32{0}, nonzero, false, []int32{1, 2}},
		{"self-damped path", "common practice", build(t, 5, path(5), false), []int32{0}, nonzero, true, nil},
		{"zero-diagonal path", "common practice", build(t, 5, path(5), false), []int32{0}, zero, true, nil},
		// Two states acting on each other, zero self-dynamics, one input:
		// [e1, A e1] = [[1, 0], [0, b]] has rank 2 for every b != 0
		// (common practice).
		{"two-cycle zero diagonal", "common practice", build(t, 2, [][2]int32{{0, 1}}, true), []int32{0}, zero, true, nil},
	} {
		t.Run(c.name, func(t *testing.T) {
			r := mustCheck(t, c.g, structural.Controllability, c.inputs, c.class)
			if r.Holds != c.holds || !slices.Equal(r.Unforced.IDs(), c.unforced) && !(len(c.unforced) == 0 && r.Unforced.Len() == 0) {
				t.Errorf("%s (%s): holds %v unforced %v, want %v %v", c.name, c.source, r.Holds, r.Unforced.IDs(), c.holds, c.unforced)
			}
		})
	}
}

// TestMayBeZeroEdge: a directed path whose first coupling may vanish is
// not strong, and the witness sets it to zero (common practice: the
// arbitrary entries of Jia et al. 2021).
func TestMayBeZeroEdge(t *testing.T) {
	g := build(t, 3, path(3), false)
	m, err := Marks(g, []structural.Edge{{From: 0, To: 1}})
	if err != nil {
		t.Fatal(err)
	}
	r := mustCheck(t, g, structural.Controllability, []int32{0}, Class{MayBeZero: m})
	if r.Holds || !slices.Equal(r.Unforced.IDs(), []int32{1, 2}) {
		t.Fatalf("holds %v unforced %v", r.Holds, r.Unforced.IDs())
	}
	w := r.AtZero.Witness
	for _, e := range w.Entries {
		if e.From == 0 && e.To == 1 && e.Value != 0 {
			t.Fatalf("witness keeps the may-be-zero coupling at %d", e.Value)
		}
	}
	if _, err := Marks(g, []structural.Edge{{From: 1, To: 0}}); err == nil {
		t.Fatal("Marks accepted an edge the network does not have")
	}
	if _, err := Check(g, Request{Class: Class{MayBeZero: []bool{true}}}); err != ErrMarks {
		t.Fatalf("short marks: %v", err)
	}
}

// TestStrongImpliesGeneric: on thousands of random networks and designs,
// every strong yes (any class) is a generic yes by Lin's test
// (structural.Check), and the class inclusions hold: strong with a free
// diagonal implies strong with a zero and with a nonzero one; marking
// edges as may-be-zero can only turn yes into no. Common practice: a
// wider class of systems has fewer guarantees.
func TestStrongImpliesGeneric(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 9))
	trials := 4000
	if testing.Short() {
		trials = 800
	}
	yes := 0
	for trial := 0; trial < trials; trial++ {
		n := 2 + rng.IntN(14)
		g := testnet.Random(t, rng, n, 0.5*rng.Float64())
		var sig [][]int32
		for k := rng.IntN(n + 1); k > 0; k-- {
			s := []int32{int32(rng.IntN(n))}
			if rng.IntN(4) == 0 {
				s = append(s, int32(rng.IntN(n)))
			}
			sig = append(sig, s)
		}
		d := testnet.Design(t, g, sig)
		prop := structural.Property(rng.IntN(2))
		marks := make([]bool, g.Edges())
		for i := range marks {
			marks[i] = rng.IntN(5) == 0
		}
		var holds [3]bool
		for _, diag := range []Diagonal{FreeDiagonal, ZeroDiagonal, NonzeroDiagonal} {
			r, err := Check(g, Request{Property: prop, Design: d, Class: Class{Diagonal: diag}})
			if err != nil {
				t.Fatal(err)
			}
			holds[diag] = r.Holds
			rm, err := Check(g, Request{Property: prop, Design: d, Class: Class{Diagonal: diag, MayBeZero: marks}})
			if err != nil {
				t.Fatal(err)
			}
			if rm.Holds && !r.Holds {
				t.Fatalf("trial %d: marking edges may-be-zero made a design strong", trial)
			}
			if r.Holds {
				yes++
				v, err := structural.Check(g, prop, d)
				if err != nil {
					t.Fatal(err)
				}
				if !v.Holds {
					t.Fatalf("trial %d: strong (%v diagonal) but not structurally %v", trial, diag, prop)
				}
			}
		}
		if holds[FreeDiagonal] && !(holds[ZeroDiagonal] && holds[NonzeroDiagonal]) {
			t.Fatalf("trial %d: strong with a free diagonal but not with a given one", trial)
		}
	}
	t.Logf("%d trials, %d strong answers, each structurally controllable (observable)", trials, yes)
}

// TestObservabilityIsTransposedControllability: Check for outputs on g
// equals Check for inputs on g's transpose, witnesses included (in the
// orientation of each network). Duality, common practice.
func TestObservabilityIsTransposedControllability(t *testing.T) {
	rng := rand.New(rand.NewPCG(2, 2))
	for trial := 0; trial < 300; trial++ {
		n := 2 + rng.IntN(10)
		g := testnet.Random(t, rng, n, 0.3)
		var sig [][]int32
		for k := rng.IntN(3); k > 0; k-- {
			sig = append(sig, []int32{int32(rng.IntN(n))})
		}
		d := testnet.Design(t, g, sig)
		diag := Diagonal(rng.IntN(3))
		ro, err := Check(g, Request{Property: structural.Observability, Design: d, Class: Class{Diagonal: diag}})
		if err != nil {
			t.Fatal(err)
		}
		h := g.Transpose()
		rc, err := Check(h, Request{Property: structural.Controllability, Design: d, Class: Class{Diagonal: diag}})
		if err != nil {
			t.Fatal(err)
		}
		if ro.Holds != rc.Holds || !slices.Equal(ro.Unforced.IDs(), rc.Unforced.IDs()) {
			t.Fatalf("trial %d: observability %v %v, transposed controllability %v %v", trial, ro.Holds, ro.Unforced.IDs(), rc.Holds, rc.Unforced.IDs())
		}
		if wo, wc := ro.AtZero.Witness, rc.AtZero.Witness; wo != nil {
			if len(wo.Entries) != len(wc.Entries) {
				t.Fatalf("trial %d: witnesses differ in size", trial)
			}
			for _, e := range wo.Entries {
				if !slices.ContainsFunc(wc.Entries, func(f Entry) bool { return f.From == e.To && f.To == e.From && f.Value == e.Value }) {
					t.Fatalf("trial %d: observability witness entry %v has no transposed twin", trial, e)
				}
			}
		}
	}
}

// TestWitnessRejectsTampering: Confirm refuses a witness whose values,
// support or class no longer fit (common practice: a proof checker must
// reject wrong proofs).
func TestWitnessRejectsTampering(t *testing.T) {
	g := build(t, 4, star(3), false)
	r := mustCheck(t, g, structural.Controllability, []int32{0}, Class{})
	w := r.AtZero.Witness
	if w == nil || w.Confirm() != nil {
		t.Fatal("no confirmed witness")
	}
	for name, tamper := range map[string]func(w *Witness){
		"value":   func(w *Witness) { w.Entries[0].Value++ },
		"drop":    func(w *Witness) { w.Entries = w.Entries[1:] },
		"zero":    func(w *Witness) { w.Entries = append(w.Entries, Entry{From: 1, To: 2, Value: 0}) },
		"support": func(w *Witness) { w.Support = g.States(append(slices.Clone(w.Support.IDs()), 0)) },
		"lambda":  func(w *Witness) { w.Eigenvalue = 5 },
		"class":   func(w *Witness) { w.class = Class{Diagonal: ZeroDiagonal} },
	} {
		c := *w
		c.Entries = slices.Clone(w.Entries)
		tamper(&c)
		if err := c.Confirm(); err == nil {
			t.Errorf("tampered witness (%s) confirmed", name)
		}
	}
}

// TestResultJSON: the documented keys, names for states, no null lists.
func TestResultJSON(t *testing.T) {
	g := build(t, 4, star(3), false)
	r := mustCheck(t, g, structural.Controllability, []int32{0}, Class{Diagonal: ZeroDiagonal})
	b, err := json.Marshal(r)
	if err != nil {
		t.Fatal(err)
	}
	s := string(b)
	for _, key := range []string{`"diagonal":"zero"`, `"holds":false`, `"at_zero":{`, `"at_nonzero":{`, `"unforced":["1","2","3"]`, `"witness":{"eigenvalue":0,"support":[`, `"entries":[{"from":"0","to":`, `"signal_entries":[]`, `"confirmed":true`, `"may_be_zero_edges":0`, `"signals":1`} {
		if !strings.Contains(s, key) {
			t.Errorf("JSON lacks %s:\n%s", key, s)
		}
	}
	if strings.Count(s, "null") != strings.Count(s, `"witness":null`) {
		t.Errorf("JSON holds a null list:\n%s", s)
	}
}

// TestWitnessLimit: a witness above the entry limit is not built, and the
// test says why.
func TestWitnessLimit(t *testing.T) {
	g := build(t, 50, star(49), false)
	d, _ := structural.Dedicated(g, []int32{0})
	r, err := Check(g, Request{Design: d, WitnessEntries: 3})
	if err != nil {
		t.Fatal(err)
	}
	if r.AtZero.Witness != nil || !strings.Contains(r.AtZero.NoWitness, "above the limit of 3") {
		t.Fatalf("witness %v, reason %q", r.AtZero.Witness, r.AtZero.NoWitness)
	}
	r, _ = Check(g, Request{Design: d, WitnessEntries: -1})
	if r.AtZero.Witness != nil {
		t.Fatal("witness built though none was asked for")
	}
}

// TestLongChain: a directed chain is coloured without recursion (10^6
// states; 10^5 with -short), and the minimal witness of a chain driven in
// the middle is its upstream part's source alone.
func TestLongChain(t *testing.T) {
	n := 1_000_000
	if testing.Short() {
		n = 100_000
	}
	b := structural.NewIntBuilder(n, 0)
	for i := int32(0); i+1 < int32(n); i++ {
		b.AddEdge(i, i+1)
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	r := mustCheck(t, g, structural.Controllability, []int32{0}, Class{})
	if !r.Holds {
		t.Fatal("a chain driven at its head is strong")
	}
	r = mustCheck(t, g, structural.Controllability, []int32{int32(n / 2)}, Class{})
	if r.Holds || r.Unforced.Len() != n/2 {
		t.Fatalf("holds %v, %d unforced", r.Holds, r.Unforced.Len())
	}
	if w := r.AtZero.Witness; w == nil || !w.Minimal || w.Support.Len() != 1 || w.Support.At(0) != 0 {
		t.Fatalf("witness %+v", w)
	}
}

// TestParse: the tokens and names the readers and flags use.
func TestParse(t *testing.T) {
	for tok, want := range map[string]Kind{"*": Nonzero, "nonzero": Nonzero, "?": Arbitrary, "Arbitrary": Arbitrary} {
		if k, err := ParseKind(tok); err != nil || k != want {
			t.Errorf("ParseKind(%q) = %v, %v", tok, k, err)
		}
	}
	for _, bad := range []string{"", "0", "x", "??"} {
		if _, err := ParseKind(bad); err == nil {
			t.Errorf("ParseKind(%q) accepted", bad)
		}
	}
	for _, d := range []Diagonal{FreeDiagonal, ZeroDiagonal, NonzeroDiagonal} {
		if e, err := ParseDiagonal(d.String()); err != nil || e != d {
			t.Errorf("ParseDiagonal(%q) = %v, %v", d, e, err)
		}
	}
	if _, err := ParseDiagonal("loops"); err == nil {
		t.Error("ParseDiagonal accepted an unknown class")
	}
	g := build(t, 2, path(2), false)
	if err := (Class{Diagonal: 7}).Check(g); err == nil {
		t.Error("unknown diagonal class accepted")
	}
}
