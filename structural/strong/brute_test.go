package strong

import (
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/netsteer/netsteer/structural"
)

// The brute force of this file searches the realisations of each pattern
// on the value grid {-1, 1, 2} (nonzero entries) and {0, 1, -1}
// (arbitrary entries), dedicated input entries 1, with the exact Kalman
// rank of oracle_test.go.
//
// Why the grid suffices for "not strong" on at most 4 states: an
// uncontrollable realisation exists exactly when some vector w != 0 has
// w^T [A - λI, B] = 0; take w the indicator of a set W of states. The
// equations split by column: the entries of column j in the rows of W must
// sum to λ when j is in W and to 0 otherwise (signal columns: 0). With at
// most 4 entries per column every solvable such sum has a solution on the
// grid with λ in {0, 1}: sum 0 by (1,-1), (2,-1,-1), (1,1,-1,-1); sum 1 by
// 1, (2,-1), (1,1,-1), (2,1,-1,-1). With an arbitrary entry among them
// the rest lies in {-1, 0, 1}: set two or more nonzero entries to one of
// the sums above (0 or the target) and the arbitrary one to 0 or the
// target; a single nonzero entry to 1 (the arbitrary one -1 or 0); none
// (the arbitrary one 0 or 1); further arbitrary entries 0.
// So when netsteer's colouring leaves a fort W (every column meets W in no
// entry, in two or more, or in one arbitrary one), the grid holds an
// uncontrollable realisation, and the search must find it; when it says
// "strong", the search must find none (the grid is a finite sample of the
// class, so this side is consistency, not proof).

// decode3 fills p.a from a base-3 code of the 9 entries of a 3x3 pattern.
func decode(n int, code int) pat {
	p := pat{n: n}
	for v := 0; v < n; v++ {
		for u := 0; u < n; u++ {
			p.a[v][u] = Kind(code % 3)
			code /= 3
		}
	}
	return p
}

func encode(p pat) int {
	code, mul := 0, 1
	for v := 0; v < p.n; v++ {
		for u := 0; u < p.n; u++ {
			code += int(p.a[v][u]) * mul
			mul *= 3
		}
	}
	return code
}

// permutations returns every permutation of 0..n-1.
func permutations(n int) [][]int32 {
	var out [][]int32
	p := make([]int32, n)
	for i := range p {
		p[i] = int32(i)
	}
	var rec func(k int)
	rec = func(k int) { // depth n <= 4: a test helper, not a traversal of states
		if k == n {
			out = append(out, slices.Clone(p))
			return
		}
		for i := k; i < n; i++ {
			p[k], p[i] = p[i], p[k]
			rec(k + 1)
			p[k], p[i] = p[i], p[k]
		}
	}
	rec(0)
	return out
}

// canonSignals writes signals in a canonical order for comparison.
func canonSignals(sig [][]int32) [][]int32 {
	out := make([][]int32, len(sig))
	for i, s := range sig {
		out[i] = slices.Clone(s)
		slices.Sort(out[i])
	}
	slices.SortFunc(out, slices.Compare)
	return out
}

func permute(p pat, pi []int32) pat {
	q := pat{n: p.n}
	for v := 0; v < p.n; v++ {
		for u := 0; u < p.n; u++ {
			q.a[pi[v]][pi[u]] = p.a[v][u]
		}
	}
	for _, s := range p.sig {
		t := make([]int32, len(s))
		for i, v := range s {
			t[i] = pi[v]
		}
		q.sig = append(q.sig, t)
	}
	return q
}

// stabiliser returns the permutations that map the design to itself.
func stabiliser(n int, sig [][]int32) [][]int32 {
	want := canonSignals(sig)
	var out [][]int32
	for _, pi := range permutations(n) {
		if q := permute(pat{n: n, sig: sig}, pi); slices.EqualFunc(canonSignals(q.sig), want, slices.Equal) {
			out = append(out, pi)
		}
	}
	return out
}

// canonical reports whether p has the least code among its images under
// the permutations that keep its design.
func canonical(p pat, stab [][]int32) bool {
	c := encode(p)
	for _, pi := range stab {
		if encode(permute(p, pi)) < c {
			return false
		}
	}
	return true
}

// judge runs Check on p under every diagonal class that can write it and
// requires one answer; it returns the result of the first.
func judge(t *testing.T, p pat, obs bool) (*Result, *structural.Network) {
	t.Helper()
	var first *Result
	var g0 *structural.Network
	prop := structural.Controllability
	if obs {
		prop = structural.Observability
	}
	for _, d := range []Diagonal{FreeDiagonal, ZeroDiagonal, NonzeroDiagonal} {
		g, c, ok := p.network(t, d)
		if !ok {
			continue
		}
		des, err := structural.NewDesign(g, p.sig, nil)
		if err != nil {
			t.Fatal(err)
		}
		r, err := Check(g, Request{Property: prop, Design: des, Class: c})
		if err != nil {
			t.Fatal(err)
		}
		if first == nil {
			first, g0 = r, g
			continue
		}
		if r.Holds != first.Holds || !slices.Equal(r.AtZero.Unforced.IDs(), first.AtZero.Unforced.IDs()) || !slices.Equal(r.AtNonzero.Unforced.IDs(), first.AtNonzero.Unforced.IDs()) {
			t.Fatalf("pattern %v: diagonal classes %v and %v disagree on one pattern", p, FreeDiagonal, d)
		}
	}
	return first, g0
}

// witnessRealisation completes a witness into a realisation of p: the
// listed values, and random values of the right kind everywhere else
// (the witness must hold whatever they are).
func witnessRealisation(p pat, w *Witness, rng *rand.Rand) realisation {
	r := p.base()
	draw := func(k Kind) int64 {
		x := int64(rng.IntN(7)) - 3
		for k == Nonzero && x == 0 {
			x = int64(rng.IntN(7)) - 3
		}
		return x
	}
	for v := 0; v < p.n; v++ {
		for u := 0; u < p.n; u++ {
			r.a[v][u] = draw(p.a[v][u])
			if p.a[v][u] == Zero {
				r.a[v][u] = 0
			}
		}
	}
	for i, sg := range p.sig {
		for _, v := range sg {
			r.b[i][v] = draw(Nonzero)
		}
	}
	for _, e := range w.Entries {
		r.a[e.To][e.From] = e.Value
	}
	for _, e := range w.SignalEntries {
		r.b[e.Signal][e.State] = e.Value
	}
	return r
}

// checkWitnesses re-checks every witness of r independently: Confirm, the
// exact Kalman rank of a completion with random other values, and the
// class of every listed value.
func checkWitnesses(t *testing.T, p pat, r *Result, obs bool, rng *rand.Rand) {
	t.Helper()
	for _, x := range []*Test{&r.AtZero, &r.AtNonzero} {
		if x.Holds {
			if x.Witness != nil {
				t.Fatalf("pattern %v: a witness for a test that holds", p)
			}
			continue
		}
		w := x.Witness
		if w == nil {
			t.Fatalf("pattern %v: failing test without witness: %s", p, x.NoWitness)
		}
		if !w.Confirmed || w.Confirm() != nil {
			t.Fatalf("pattern %v: witness not confirmed: %v", p, w.Confirm())
		}
		for _, e := range w.Entries {
			if k := p.a[e.To][e.From]; k == Zero || k == Nonzero && e.Value == 0 {
				t.Fatalf("pattern %v: witness value %d on an entry of kind %v", p, e.Value, k)
			}
		}
		for trial := 0; trial < 3; trial++ {
			re := witnessRealisation(p, w, rng)
			if re.controllable(obs) {
				t.Fatalf("pattern %v (obs %v): the witness realisation %v is controllable by Kalman's test", p, obs, re)
			}
		}
	}
}

// TestBruteForceThreeStates: every pattern of 3 states (each of the 9
// entries of A zero, nonzero or arbitrary, the diagonal included), with
// five designs (one actuator; two; one signal on two states; one signal
// on all three; a signal on two states and an actuator on the third), up
// to relabelling that keeps the design. Controllability on all; with
// -short a seeded tenth. Source: brute force over the value grid with
// exact Kalman rank (see the top of this file).
func TestBruteForceThreeStates(t *testing.T) {
	designs := [][][]int32{{{0}}, {{0}, {1}}, {{0, 1}}, {{0, 1, 2}}, {{0, 1}, {2}}}
	rng := rand.New(rand.NewPCG(3, 3))
	var cases, strong, realisations int
	for di, sig := range designs {
		stab := stabiliser(3, sig)
		for code := 0; code < 19683; code++ {
			if testing.Short() && (code*7+di)%10 != 0 {
				continue
			}
			p := decode(3, code)
			p.sig = sig
			if !canonical(p, stab) {
				continue
			}
			cases++
			r, _ := judge(t, p, false)
			found, _, tried := p.search(false, 0)
			realisations += tried
			if r.Holds {
				strong++
			}
			if r.Holds == found {
				t.Fatalf("pattern %v design %v: netsteer says strong=%v, the grid search found an uncontrollable realisation: %v", p.a, sig, r.Holds, found)
			}
			checkWitnesses(t, p, r, false, rng)
		}
	}
	t.Logf("%d patterns with designs, %d strong (no uncontrollable realisation on the grid), %d realisations tried", cases, strong, realisations)
}

// TestBruteForceThreeStatesObservability repeats the three-state search
// for observability (the signals are outputs) on every third pattern
// (every thirtieth with -short). Source: brute force, as above.
func TestBruteForceThreeStatesObservability(t *testing.T) {
	designs := [][][]int32{{{0}}, {{0}, {1}}, {{0, 1}}}
	rng := rand.New(rand.NewPCG(5, 5))
	step := 3
	if testing.Short() {
		step = 30
	}
	var cases, strong int
	for _, sig := range designs {
		stab := stabiliser(3, sig)
		for code := 0; code < 19683; code += step {
			p := decode(3, code)
			p.sig = sig
			if !canonical(p, stab) {
				continue
			}
			cases++
			r, _ := judge(t, p, true)
			found, _, _ := p.search(true, 0)
			if r.Holds {
				strong++
			}
			if r.Holds == found {
				t.Fatalf("pattern %v outputs %v: netsteer says strongly observable=%v, grid search found an unobservable realisation: %v", p.a, sig, r.Holds, found)
			}
			checkWitnesses(t, p, r, true, rng)
		}
	}
	t.Logf("%d patterns with output designs, %d strongly observable", cases, strong)
}

// TestBruteForceFourStates: every zero/nonzero pattern of 4 states (each
// off-diagonal entry zero or nonzero) with the diagonal free or given
// (each state with or without a nonzero self-loop, the rest zero), and
// one, two or three actuators, up to relabelling that keeps the design.
// A "not strong" answer is confirmed by its witness (Confirm, and the
// exact Kalman rank of the witness completed with random values of the
// class); a "strong" answer by the whole grid when it has at most 729
// points, otherwise by 100 random grid points (consistency only; the
// count of those is logged). With -short a seeded tenth.
// Source: brute force with exact Kalman rank (see the top of this file).
func TestBruteForceFourStates(t *testing.T) {
	designs := [][][]int32{{{0}}, {{0}, {1}}, {{0}, {1}, {2}}}
	rng := rand.New(rand.NewPCG(4, 4))
	var cases, strong, exhaustive, sampled int
	for _, sig := range designs {
		stab := stabiliser(4, sig)
		for off := 0; off < 1<<12; off++ {
			for diag := -1; diag < 16; diag++ { // -1: free; else the loop set
				if testing.Short() && (off*17+diag)%10 != 0 {
					continue
				}
				p := pat{n: 4, sig: sig}
				bit := 0
				for v := 0; v < 4; v++ {
					for u := 0; u < 4; u++ {
						if u == v {
							switch {
							case diag < 0:
								p.a[v][v] = Arbitrary
							case diag>>v&1 != 0:
								p.a[v][v] = Nonzero
							}
							continue
						}
						if off>>bit&1 != 0 {
							p.a[v][u] = Nonzero
						}
						bit++
					}
				}
				if !canonical(p, stab) {
					continue
				}
				cases++
				r, _ := judge(t, p, false)
				checkWitnesses(t, p, r, false, rng)
				if !r.Holds {
					continue
				}
				strong++
				var found bool
				if p.grid() <= 729 {
					found, _, _ = p.search(false, 0)
					exhaustive++
				} else {
					found = p.sample(false, 100, rng)
					sampled++
				}
				if found {
					t.Fatalf("pattern %v design %v: netsteer says strong, the grid holds an uncontrollable realisation", p.a, sig)
				}
			}
		}
	}
	t.Logf("%d patterns with designs; %d not strong, each confirmed by its witness; %d strong: %d checked on the whole grid, %d on 100 grid samples (consistent)", cases, cases-strong, strong, exhaustive, sampled)
}

// TestBruteForceFourStatesArbitrary: random three-valued patterns of 4
// states (entries zero, nonzero or arbitrary), random designs of
// dedicated and shared signals, both properties; witnesses re-checked,
// strong answers searched on the grid (whole when at most 20000 points,
// else 3000 samples), and a blind search of up to 20000 grid points must
// find an uncontrollable realisation for every "not strong" answer whose
// grid it covers. Source: brute force with exact Kalman rank.
func TestBruteForceFourStatesArbitrary(t *testing.T) {
	rng := rand.New(rand.NewPCG(6, 6))
	trials := 3000
	if testing.Short() {
		trials = 600
	}
	var strong, blindFound, blindTried int
	for trial := 0; trial < trials; trial++ {
		p := pat{n: 4}
		for v := 0; v < 4; v++ {
			for u := 0; u < 4; u++ {
				x := rng.IntN(10)
				switch {
				case x < 5:
					p.a[v][u] = Zero
				case x < 8:
					p.a[v][u] = Nonzero
				default:
					p.a[v][u] = Arbitrary
				}
			}
		}
		for k := 1 + rng.IntN(3); k > 0; k-- {
			var s []int32
			for v := int32(0); v < 4; v++ {
				if rng.IntN(3) == 0 {
					s = append(s, v)
				}
			}
			if len(s) == 0 {
				s = []int32{int32(rng.IntN(4))}
			}
			p.sig = append(p.sig, s)
		}
		obs := rng.IntN(2) == 0
		r, _ := judge(t, p, obs)
		checkWitnesses(t, p, r, obs, rng)
		if r.Holds {
			strong++
			var found bool
			if p.grid() <= 20000 {
				found, _, _ = p.search(obs, 0)
			} else {
				found = p.sample(obs, 3000, rng)
			}
			if found {
				t.Fatalf("pattern %v signals %v obs %v: strong, yet the grid holds a failing realisation", p.a, p.sig, obs)
			}
			continue
		}
		if p.grid() <= 20000 {
			blindTried++
			found, complete, _ := p.search(obs, 0)
			if !found && complete {
				t.Fatalf("pattern %v signals %v obs %v: not strong, yet no failing realisation on the whole grid", p.a, p.sig, obs)
			}
			if found {
				blindFound++
			}
		}
	}
	t.Logf("%d random patterns, %d strong; of the others %d searched blind on the whole grid, %d found", trials, strong, blindTried, blindFound)
}
