package failure_test

import (
	"math/bits"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/failure"
	"github.com/netsteer/netsteer/structural/internal/testnet"
	"github.com/netsteer/netsteer/structural/placement"
)

// randomDesign draws k signals on n states: dedicated ones, or touching
// one to three states, now and then one touching nothing or repeating a
// state.
func randomDesign(rng *rand.Rand, n, k int, pDedicated float64) [][]int32 {
	sig := make([][]int32, k)
	for i := range sig {
		switch rng.IntN(40) {
		case 0:
			sig[i] = []int32{}
			continue
		case 1:
			v := int32(rng.IntN(n))
			sig[i] = []int32{v, v}
			continue
		}
		if rng.Float64() < pDedicated {
			sig[i] = []int32{int32(rng.IntN(n))}
			continue
		}
		for len(sig[i]) == 0 {
			for j := rng.IntN(3); j >= 0; j-- {
				v := int32(rng.IntN(n))
				if !slices.Contains(sig[i], v) {
					sig[i] = append(sig[i], v)
				}
			}
		}
	}
	return sig
}

func masksOf(sig [][]int32) []uint32 {
	out := make([]uint32, len(sig))
	for i, s := range sig {
		out[i] = testnet.MaskOf(s)
	}
	return out
}

func without(ms []uint32, drop uint32) []uint32 {
	var out []uint32
	for i, m := range ms {
		if drop&(1<<i) == 0 {
			out = append(out, m)
		}
	}
	return out
}

// classes classifies every signal by brute force over all sub-designs,
// for the family works: essential when the design without it fails,
// useless when adding it to a failing sub-design never makes it work
// (the definitions of Commault, Dion & Trinh 2008), useful otherwise.
func classes(k int, works func(keep uint32) bool) []failure.Class {
	full := uint32(1)<<k - 1
	out := make([]failure.Class, k)
	for i := 0; i < k; i++ {
		bit := uint32(1) << i
		if !works(full &^ bit) {
			out[i] = failure.Essential
			continue
		}
		out[i] = failure.Useless
		for t := uint32(0); t <= full; t++ {
			if t&bit == 0 && !works(t) && works(t|bit) {
				out[i] = failure.Useful
				break
			}
		}
	}
	return out
}

func keepSignals(ms []uint32, keep uint32) []uint32 {
	var out []uint32
	for i, m := range ms {
		if keep&(1<<i) != 0 {
			out = append(out, m)
		}
	}
	return out
}

// checkWitness verifies a dilation witness against masks m for the
// signals sig (indices into the original design, the lost ones excluded
// by the caller through alive): its neighbours are exactly the live
// in-neighbours of its states, its signals exactly those touching them,
// and it has one member more than both together.
func checkWitness(t *testing.T, what string, m testnet.Masks, p structural.Property, sig []uint32, lost int, w *structural.Dilation) {
	t.Helper()
	if w == nil {
		t.Fatalf("%s: no dilation witness", what)
	}
	back := m.In
	if p == structural.Observability {
		back = m.Out
	}
	x := testnet.MaskOf(w.States.IDs())
	var nb uint32
	for v := 0; v < m.N; v++ {
		if x&(1<<v) != 0 {
			nb |= back[v]
		}
	}
	nb &= m.Alive
	var want []int
	for i, s := range sig {
		if i != lost && s&x&m.Alive != 0 {
			want = append(want, i)
		}
	}
	if x&^m.Alive != 0 || testnet.MaskOf(w.Neighbours.IDs()) != nb || !slices.Equal(w.Signals, want) ||
		w.States.Len() != w.Neighbours.Len()+len(w.Signals)+1 {
		t.Fatalf("%s: witness %v / %v / %v is not the dilation it claims (neighbours %b, signals %v)",
			what, w.States.IDs(), w.Neighbours.IDs(), w.Signals, nb, want)
	}
}

// bruteCompletion returns the least cost (structural.Cost units) of
// dedicated devices on allowed states that make sig work on m, the fewest
// devices at that cost, and whether there is one.
func bruteCompletion(m testnet.Masks, p structural.Property, sig []uint32, dev structural.Devices, bar uint32) (structural.Cost, int, bool) {
	best, fewest, ok := structural.Cost(0), 0, false
	for a := uint32(0); a < 1<<m.N; a++ {
		if a&bar != 0 || a&^m.Alive != 0 {
			continue
		}
		var c structural.Cost
		s := append([]uint32(nil), sig...)
		for v := 0; v < m.N; v++ {
			if a&(1<<v) != 0 {
				if !dev.Allowed(int32(v)) {
					c = -1
					break
				}
				c += dev.CostOf(int32(v))
				s = append(s, 1<<v)
			}
		}
		k := bits.OnesCount32(a)
		if c < 0 || ok && (c > best || c == best && k >= fewest) {
			continue
		}
		if m.Works(p, s) {
			best, fewest, ok = c, k, true
		}
	}
	return best, fewest, ok
}

// checkFix verifies a cheapest completion (feasibility, the devices
// added, their cost) against the brute-force one.
func checkFix(t *testing.T, what string, m testnet.Masks, p structural.Property, sig []uint32, dev structural.Devices, bar uint32, feasible bool, added []int32, cost structural.Cost) {
	t.Helper()
	want, fewest, ok := bruteCompletion(m, p, sig, dev, bar)
	if feasible != ok {
		t.Fatalf("%s: completion feasible %v, brute force %v", what, feasible, ok)
	}
	if !ok {
		return
	}
	s := append([]uint32(nil), sig...)
	for _, v := range added {
		if bar&(1<<v) != 0 || !dev.Allowed(v) {
			t.Fatalf("%s: completion uses barred state %d", what, v)
		}
		s = append(s, 1<<v)
	}
	if !m.Works(p, s) || cost != want || len(added) != fewest {
		t.Fatalf("%s: completion %v costs %v (works %v), brute force %v with %d devices", what, added, cost, m.Works(p, s), want, fewest)
	}
}

func checkPlacement(t *testing.T, what string, m testnet.Masks, p structural.Property, sig []uint32, dev structural.Devices, bar uint32, pl *placement.Placement) {
	t.Helper()
	if pl == nil {
		t.Fatalf("%s: no placement", what)
	}
	checkFix(t, what, m, p, sig, dev, bar, pl.Feasible, pl.Added.IDs(), pl.Cost)
}

func checkOwnFix(t *testing.T, what string, m testnet.Masks, p structural.Property, sig []uint32, dev structural.Devices, bar uint32, f *failure.Fix, ref *placement.Placement) {
	t.Helper()
	if f == nil {
		t.Fatalf("%s: no fix", what)
	}
	checkFix(t, what, m, p, sig, dev, bar, f.Feasible, f.Added.IDs(), f.Cost)
	// placement.Complete on the same remaining design, as a second route.
	if ref.Feasible != f.Feasible || f.Feasible && ref.Cost != f.Cost {
		t.Fatalf("%s: fix %v at %v, placement.Complete %v at %v", what, f.Added.IDs(), f.Cost, ref.Added.IDs(), ref.Cost)
	}
}

// Every single failure recomputed by brute force: thousands of random
// small networks and designs (dedicated and multi-state signals, both
// properties), each device, each edge and each state removed in turn and
// the remaining system judged by Lin's theorem on every subset of states
// (testnet.Masks, and testnet.Oracle for the overall verdict). The
// classes are checked against their definitions by Commault, Dion & Trinh
// (IEEE TAC 53(6), 2008) over every sub-design; the replacements and fixes
// against exhaustive search over device sets.
func TestAssessAgainstBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(2008, 53))
	trials, holding := 3000, 0
	if testing.Short() {
		trials = 600
	}
	for trial := 0; trial < trials; trial++ {
		n := 1 + rng.IntN(7)
		g := testnet.Random(t, rng, n, []float64{0.12, 0.2, 0.3, 0.45}[rng.IntN(4)])
		p := structural.Controllability
		if rng.IntN(2) == 0 {
			p = structural.Observability
		}
		k := 1 + rng.IntN(7)
		sig := randomDesign(rng, n, k, []float64{1, 0.7, 0.3}[rng.IntN(3)])
		d := testnet.Design(t, g, sig)
		var dev structural.Devices
		if rng.IntN(2) == 0 {
			dev = testnet.RandomDevices(rng, n, 5, 0.2, 0)
		}
		as, err := failure.Assess(g, failure.Request{Property: p, Design: d, Devices: dev, States: true, Detail: -1, Partners: -1, Budget: -1})
		if err != nil {
			t.Fatalf("trial %d: %v", trial, err)
		}
		m := testnet.MasksOf(g)
		ms := masksOf(sig)
		o := testnet.NewOracle(g)
		works := m.Works(p, ms)
		if works != o.WithSignals(ms, 0, p == structural.Observability) {
			t.Fatalf("trial %d: the two brute-force routes disagree", trial)
		}
		if as.Intact.Holds != works {
			t.Fatalf("trial %d: intact holds %v, brute force %v", trial, as.Intact.Holds, works)
		}
		if !works {
			if len(as.Devices) != 0 || len(as.Links) != 0 {
				t.Fatalf("trial %d: failure lists for a failing design", trial)
			}
			checkPlacement(t, "completion", m, p, ms, dev, 0, as.Completion)
			continue
		}
		holding++
		checkDevices(t, trial, g, p, d, dev, m, ms, as)
		// With almost no budget the split may stay open, never wrong.
		lean, err := failure.Assess(g, failure.Request{Property: p, Design: d, Budget: 1})
		if err != nil {
			t.Fatal(err)
		}
		for i, dl := range lean.Devices {
			if full := as.Devices[i].Class; dl.Class != full && (dl.Class != failure.Unresolved || full == failure.Essential) {
				t.Fatalf("trial %d: signal %d with budget 1: %v, unbounded %v", trial, i, dl.Class, full)
			}
		}
		checkLinks(t, trial, g, p, d, dev, m, ms, as)
		checkStates(t, trial, p, m, ms, as)
	}
	if holding < trials/5 {
		t.Fatalf("only %d of %d designs hold: the draw tests little", holding, trials)
	}
}

func checkDevices(t *testing.T, trial int, g *structural.Network, p structural.Property, d structural.Design, dev structural.Devices, m testnet.Masks, ms []uint32, as *failure.Assessment) {
	k := len(ms)
	full := uint32(1)<<k - 1
	overall := classes(k, func(keep uint32) bool { return m.Works(p, keepSignals(ms, keep)) })
	reach := classes(k, func(keep uint32) bool { r, _ := m.Lin(p, keepSignals(ms, keep)); return r == m.Alive })
	match := classes(k, func(keep uint32) bool { _, dil := m.Lin(p, keepSignals(ms, keep)); return !dil })
	counts := map[failure.Class]int{}
	for i, dl := range as.Devices {
		counts[dl.Class]++
		if dl.Class != overall[i] || dl.Reach != reach[i] || dl.Matching != match[i] {
			t.Fatalf("trial %d: signal %d classes %v/%v/%v, brute force %v/%v/%v", trial, i, dl.Class, dl.Reach, dl.Matching, overall[i], reach[i], match[i])
		}
		rest := without(ms, 1<<i)
		r, dil := m.Lin(p, rest)
		if testnet.MaskOf(dl.Unreached.IDs()) != m.Alive&^r || dl.Dilation != dil {
			t.Fatalf("trial %d: signal %d loss: unreached %v dilation %v, brute force %b %v", trial, i, dl.Unreached.IDs(), dl.Dilation, m.Alive&^r, dil)
		}
		if dil {
			checkWitness(t, "device", m, p, ms, i, dl.Witness)
		}
		if dl.Class == failure.Essential {
			bar := make([]bool, g.N())
			if dev.Forbidden != nil {
				copy(bar, dev.Forbidden)
			}
			for _, v := range d.Signal(i) {
				bar[v] = true
			}
			ref, err := placement.Complete(g, p, d.Without(i), structural.Devices{Cost: dev.Cost, Forbidden: bar})
			if err != nil {
				t.Fatal(err)
			}
			checkOwnFix(t, "replacement", m, p, rest, dev, ms[i], dl.Replacement, ref)
		}
		if dl.Class == failure.Useful {
			q := uint32(0)
			for _, j := range dl.WithSignals {
				q |= 1 << j
			}
			if q&(1<<i) != 0 || !m.Works(p, keepSignals(ms, full&^q)) || m.Works(p, keepSignals(ms, full&^q&^(1<<i))) {
				t.Fatalf("trial %d: signal %d useful with %v: the claim does not recompute", trial, i, dl.WithSignals)
			}
		}
	}
	if counts[failure.Essential] != as.EssentialDevices || counts[failure.Useful] != as.UsefulDevices || counts[failure.Useless] != as.UselessDevices || as.UnresolvedDevices != 0 {
		t.Fatalf("trial %d: counts %+v vs %d/%d/%d/%d", trial, counts, as.EssentialDevices, as.UsefulDevices, as.UselessDevices, as.UnresolvedDevices)
	}
}

func checkLinks(t *testing.T, trial int, g *structural.Network, p structural.Property, d structural.Design, dev structural.Devices, m testnet.Masks, ms []uint32, as *failure.Assessment) {
	type key struct{ u, v int32 }
	got := map[key]failure.LinkLoss{}
	for _, l := range as.Links {
		got[key{l.From, l.To}] = l
	}
	if len(got) != len(as.Links) || as.LinksJudged != g.Edges() {
		t.Fatalf("trial %d: repeated links or %d judged of %d", trial, as.LinksJudged, g.Edges())
	}
	breaking, unreach, dilating, both := 0, 0, 0, 0
	for u := int32(0); int(u) < g.N(); u++ {
		for _, v := range g.Succ(u) {
			me := m.WithoutEdge(u, v)
			r, dil := me.Lin(p, ms)
			lost := bits.OnesCount32(me.Alive &^ r)
			l, listed := got[key{u, v}]
			if listed != (lost > 0 || dil) {
				t.Fatalf("trial %d: edge %d->%d listed %v, brute force unreached %d dilation %v", trial, u, v, listed, lost, dil)
			}
			if !listed {
				continue
			}
			breaking++
			if lost > 0 {
				unreach++
			}
			if dil {
				dilating++
			}
			if lost > 0 && dil {
				both++
			}
			if l.UnreachedCount != lost || l.Dilation != dil || lost > 0 && testnet.MaskOf(l.Unreached.IDs()) != me.Alive&^r {
				t.Fatalf("trial %d: edge %d->%d: unreached %d %v dilation %v, brute force %d %b %v", trial, u, v, l.UnreachedCount, l.Unreached.IDs(), l.Dilation, lost, me.Alive&^r, dil)
			}
			if dil {
				checkWitness(t, "link", me, p, ms, -1, l.Witness)
			}
			var es []testnet.Edge
			for x := int32(0); int(x) < g.N(); x++ {
				for _, y := range g.Succ(x) {
					if x != u || y != v {
						es = append(es, testnet.Edge{x, y})
					}
				}
			}
			ge := testnet.Network(t, g.N(), es)
			ref, err := placement.Complete(ge, p, testnet.Design(t, ge, d.Signals()), dev)
			if err != nil {
				t.Fatal(err)
			}
			checkOwnFix(t, "link fix", me, p, ms, dev, 0, l.Fix, ref)
		}
	}
	if breaking != len(as.Links) || unreach != as.UnreachingLinks || dilating != as.DilatingLinks || both != as.BothLinks {
		t.Fatalf("trial %d: link counts", trial)
	}
	for i := 1; i < len(as.Links); i++ {
		a, b := as.Links[i-1], as.Links[i]
		if a.UnreachedCount < b.UnreachedCount || a.UnreachedCount == b.UnreachedCount && !a.Dilation && b.Dilation {
			t.Fatalf("trial %d: links not worst first", trial)
		}
	}
}

func checkStates(t *testing.T, trial int, p structural.Property, m testnet.Masks, ms []uint32, as *failure.Assessment) {
	if !as.StatesJudged {
		t.Fatalf("trial %d: states not judged", trial)
	}
	got := map[int32]failure.StateLoss{}
	for _, s := range as.States {
		got[s.State] = s
	}
	for x := int32(0); int(x) < m.N; x++ {
		mx := m.WithoutState(x)
		r, dil := mx.Lin(p, ms)
		lost := bits.OnesCount32(mx.Alive &^ r)
		s, listed := got[x]
		if listed != (lost > 0 || dil) {
			t.Fatalf("trial %d: state %d listed %v, brute force unreached %d dilation %v", trial, x, listed, lost, dil)
		}
		if !listed {
			continue
		}
		if s.UnreachedCount != lost || s.Dilation != dil || lost > 0 && testnet.MaskOf(s.Unreached.IDs()) != mx.Alive&^r {
			t.Fatalf("trial %d: state %d: unreached %d %v dilation %v, brute force %d %b %v", trial, x, s.UnreachedCount, s.Unreached.IDs(), s.Dilation, lost, mx.Alive&^r, dil)
		}
		if dil {
			checkWitness(t, "state", mx, p, ms, -1, s.Witness)
		}
	}
}
