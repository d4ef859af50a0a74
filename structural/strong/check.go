package strong

import (
	"fmt"

	"github.com/netsteer/netsteer/structural"
)

// DefaultWitnessEntries is the most entries a witness lists unless the
// request says otherwise.
const DefaultWitnessEntries = 100_000

// Request is one strong question: is Design strongly structurally
// controllable (Property Controllability: Design's signals are inputs) or
// observable (Observability: they are outputs) for every system of Class?
type Request struct {
	Property structural.Property
	Design   structural.Design
	Class    Class
	// WitnessEntries caps the entries of A, B (C) a witness may list; a
	// test that fails with a larger witness reports its unforced states
	// and says why no witness was built. 0 means DefaultWitnessEntries; a
	// negative value builds no witness.
	WitnessEntries int
	// ShrinkWork caps the work, in edge visits, spent making a witness's
	// support minimal, per failing test; 0 means 4(N + E) + 10^6 (about
	// four colourings per test, eight for both tests). A negative value
	// keeps the unforced states as the support, unless one of them is a
	// fort alone (found in one pass).
	ShrinkWork int64
}

// Result answers a Request.
//
// By Hautus' test the system is controllable exactly when
// rank [A - λI, B] = N for every complex λ. The two tests split λ = 0 from
// λ != 0, and each is exact for its part: AtZero holds exactly when
// [A B] has full row rank for every system of the class, AtNonzero exactly
// when [A - λI, B] has for every system and every λ != 0. Holds is their
// conjunction.
type Result struct {
	// Property is the property judged.
	Property structural.Property `json:"-"`
	// Diagonal and MayBeZero restate the class assumed: the kind of the
	// unlisted diagonal entries and the number of edges marked as
	// may-be-zero.
	Diagonal  Diagonal `json:"diagonal"`
	MayBeZero int      `json:"may_be_zero_edges"`
	// Signals is the number of signals judged.
	Signals int `json:"signals"`
	// Holds reports strong structural controllability (observability):
	// controllable (observable) for every system of the class.
	Holds bool `json:"holds"`
	// AtZero is the test at the eigenvalue 0, AtNonzero the test at every
	// other eigenvalue.
	AtZero    Test `json:"at_zero"`
	AtNonzero Test `json:"at_nonzero"`
	// Unforced lists the states that either test leaves uncoloured, in
	// increasing order; empty exactly when Holds.
	Unforced structural.States `json:"unforced"`
	// Caution is the standing caution of a strong answer (Caution).
	Caution string `json:"caution"`
}

// Caution is the standing caution every strong answer carries: it covers
// the stated class, all of it and nothing else.
const Caution = "Strong structural result: it holds for every value of the couplings in the stated class (every listed coupling nonzero unless marked may-be-zero, every unlisted one exactly zero, the states' own dynamics free, zero or nonzero as stated), and only there: a coupling the model omits, one that can vanish but is not marked may-be-zero, or a model that is wrong is not covered. Use it as a screening step; it does not replace dynamic studies, safety analysis, local codes or licensed engineering review."

// Test is the outcome of one forcing test.
type Test struct {
	// Holds reports that the colour change rule colours every state.
	Holds bool `json:"holds"`
	// Forced is the number of states coloured.
	Forced int `json:"forced"`
	// Unforced lists the states left white, in increasing order: every
	// vector that proves the test fails (w^T [A - λI, B] = 0 for some
	// system of the class) is zero outside them, and some system has such
	// a vector that is nonzero on each of them. It is where an
	// uncontrollable (unobservable) mode of this test can live.
	Unforced structural.States `json:"unforced"`
	// Witness is a confirmed system of the class that fails the test,
	// nil when Holds or when none was built (see NoWitness).
	Witness *Witness `json:"witness"`
	// NoWitness says why a failing test has no witness; empty otherwise.
	NoWitness string `json:"no_witness,omitempty"`
}

// MarshalText writes the diagonal class as free, zero or nonzero.
func (d Diagonal) MarshalText() ([]byte, error) { return []byte(d.String()), nil }

// Check decides strong structural controllability (observability) of one
// design for every system of the class, and when it fails says where and
// how.
//
// The test is the characterisation of Jia, van Waarde, Trentelman &
// Camlibel, "A unifying framework for strong structural controllability",
// IEEE TAC 66(1):391-398, 2021, for zero/nonzero/arbitrary patterns: the
// system is strongly structurally controllable exactly when both [A B]
// and [Ā B] have full row rank for every matrix of their patterns, where
// Ā is A with its diagonal shifted (zero -> nonzero, nonzero -> arbitrary,
// arbitrary stays), which stands for A - λI with λ != 0; and a pattern
// matrix has full row rank for all its matrices exactly when the colour
// change rule (a column with exactly one white row, whose entry is
// nonzero, colours that row; every row starts white) colours every row.
// Special cases, each exact for its class:
//
//   - free diagonal, edges nonzero: both tests coincide and become zero
//     forcing from the input nodes (Monshizadeh, Zhang & Camlibel, "Zero
//     forcing sets and controllability of dynamical systems defined on
//     graphs", IEEE TAC 59(9):2562-2567, 2014);
//   - given zero/nonzero diagonal (loop graphs): the two conditions of
//     Jarczyk, Svaricek & Alt (CDC-ECC 2011), run as the linear-time
//     colouring of Weber, Reissig & Svaricek (IEEE CDC 2014); the test at
//     zero is the loop-graph zero forcing of Trefois & Delvenne (Linear
//     Algebra Appl. 484:199-218, 2015).
//
// Each test is one colouring with per-column counters (see forcer), so
// Check takes O(N + E + signal entries) time and O(N + E) memory on
// top of the network (E bytes more when edges are marked), and never
// recurses.
//
// When a test fails, its white states W form a fort, and the indicator
// vector of W is a left eigenvector of a realisation that the inputs
// cannot see; the witness gives that realisation in integers of size at
// most N and Confirm checks it before it is returned. Its support is
// shrunk to a minimal fort (inclusion-minimal; see Witness.Minimal) when
// that costs at most about four colourings of the network per test
// (Request.ShrinkWork; eight for both tests). The witness
// lists the entries meeting its support; it is not built when they are
// more than Request.WitnessEntries.
func Check(g *structural.Network, r Request) (*Result, error) {
	if !r.Design.Of(g) {
		return nil, structural.ErrForeignDesign
	}
	if err := r.Class.Check(g); err != nil {
		return nil, err
	}
	s := newSystem(g, r.Property, r.Class, r.Design)
	res := &Result{Property: r.Property, Diagonal: r.Class.Diagonal, MayBeZero: r.Class.Marked(), Signals: r.Design.Len(), Caution: Caution}
	limit := int64(r.WitnessEntries)
	if limit == 0 {
		limit = DefaultWitnessEntries
	}
	f0 := newForcer(s, s.diag)
	f0.run()
	var f1 *forcer
	if s.shifted != nil {
		f1 = newForcer(s, s.shifted)
		f1.run()
	}
	tests := []struct {
		t      *Test
		f      *forcer
		lambda int64
	}{{&res.AtZero, f0, 0}, {&res.AtNonzero, f1, 1}}
	union := make([]bool, s.n)
	for _, x := range tests {
		f := x.f
		if f == nil {
			f = f0 // every diagonal entry arbitrary: the same colouring
		}
		white := f.white()
		*x.t = Test{Holds: len(white) == 0, Forced: f.done, Unforced: g.States(white)}
		for _, v := range white {
			union[v] = true
		}
	}
	// With every diagonal entry arbitrary both tests share one pattern, so
	// the fort found for the first serves the second.
	var shared []int32
	var sharedMinimal bool
	budget := r.ShrinkWork
	if budget == 0 {
		budget = 4*int64(s.n+g.Edges()+len(s.sigAdj)) + 1_000_000
	}
	for _, x := range tests {
		if x.t.Holds || limit < 0 {
			continue
		}
		var support []int32
		var minimal bool
		if x.f == nil && shared != nil {
			support, minimal = shared, sharedMinimal
		} else {
			support, minimal = shrink(x.f, budget)
			if x.f == f0 {
				shared, sharedMinimal = support, minimal
			}
		}
		if k := s.witnessEntries(support); k > limit {
			x.t.NoWitness = fmt.Sprintf("the witness would list %d entries, above the limit of %d", k, limit)
			continue
		}
		w, err := buildWitness(s, support, x.lambda, minimal, r.Design, r.Class)
		if err != nil {
			return nil, err
		}
		if err := w.Confirm(); err != nil {
			return nil, fmt.Errorf("strong: internal error: witness not confirmed: %w", err)
		}
		w.Confirmed = true
		x.t.Witness = w
	}
	var un []int32
	for v, u := range union {
		if u {
			un = append(un, int32(v))
		}
	}
	res.Unforced = g.States(un)
	if un == nil {
		res.Unforced = g.States([]int32{})
	}
	res.Holds = res.AtZero.Holds && res.AtNonzero.Holds
	return res, nil
}

// shrink makes the white set of f, a fort, inclusion-minimal.
//
// First, a white state that no column can force even with every other
// state coloured (each column holding it holds it as an arbitrary entry:
// an unreached source with free self-dynamics, say) is a fort alone, and
// is returned at once. Otherwise blocks of white states are coloured in
// turn, half the fort at a time, then a quarter, and so on down to single
// states: if the colouring then completes, no fort inside the current one
// avoids the block and the step is undone; otherwise the white set that
// remains is a smaller fort. The last round tries every remaining state
// alone; a state kept after its trial is in no smaller fort inside the
// final set (every later set is inside the one it was tried against), so
// the result is minimal. A trial only colours states of the current fort,
// the rest being coloured already. It stops after about work edge visits
// and returns the current fort (still a fort, not known to be minimal).
// f is left at the final fixpoint.
func shrink(f *forcer, work int64) ([]int32, bool) {
	s := f.s
	white := f.white()
	for _, v := range white {
		if f.alone(v) {
			return []int32{v}, true
		}
	}
	if work < 0 {
		return white, false
	}
	f.keep = true
	f.journal = f.journal[:0]
	defer func() { f.keep = false; f.journal = f.journal[:0] }()
	var spent int64
	for blk := max(len(white)/2, 1); ; blk /= 2 {
		for i := 0; i < len(white); {
			mark := len(f.journal)
			for k := 0; k < blk && i < len(white); i++ {
				if v := white[i]; !f.colored[v] {
					f.colour(v)
					k++
				}
			}
			f.run()
			var trial int64
			for _, r := range f.journal[mark:] {
				trial += s.inDegree(r) + 1
			}
			spent += trial
			if f.complete() {
				spent += trial // the undo costs as much
				f.undo(mark)
			}
			if spent > work {
				return f.white(), false
			}
		}
		if blk == 1 {
			return f.white(), true
		}
		white = f.white()
	}
}

// alone reports whether {v} is a fort: every column holding v holds it as
// an arbitrary entry, so none forces v whatever else is coloured.
func (f *forcer) alone(v int32) bool {
	s := f.s
	if f.diag[v] == Nonzero || s.sigPtr[v+1] > s.sigPtr[v] {
		return false
	}
	for k := s.in.Ptr[v]; k < s.in.Ptr[v+1]; k++ {
		if s.in.Adj[k] != v && (s.inMark == nil || !s.inMark[k]) {
			return false
		}
	}
	return true
}
