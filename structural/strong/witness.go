package strong

import (
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"slices"

	"github.com/netsteer/netsteer/structural"
)

// Witness is a concrete system of the class that is not controllable (not
// observable), with the vector that proves it.
//
// For controllability it is a left eigenvector w of A for the eigenvalue λ
// that B cannot see: w^T A = λ w^T and w^T B = 0, so no input ever moves
// w^T x (Hautus' test fails at λ). For observability it is a right
// eigenvector v: A v = λ v and C v = 0, a motion the outputs never see.
// The vector is 1 on Support and 0 elsewhere; Entries give the values of
// every entry of the pattern that multiplies it (the rows of A in Support
// for controllability, the columns for observability); every other entry
// of A and B (C) may take any value the class allows, and the system stays
// uncontrollable (unobservable).
type Witness struct {
	// Property is the property that fails.
	Property structural.Property `json:"-"`
	// Eigenvalue is λ: 0 for the test at zero, 1 for the test at nonzero
	// eigenvalues.
	Eigenvalue int64
	// Support lists the states where the vector is 1, in increasing order.
	Support structural.States
	// Minimal reports that Support is inclusion-minimal: no vector with a
	// smaller support proves the same test fails, for any system of the
	// class (the support of every such vector is a fort of the test's
	// pattern, and Support is a minimal one).
	Minimal bool
	// Entries are the values of A that the witness fixes, as edges From
	// -> To of the network (A[To][From] = Value), diagonal entries as
	// From == To, in increasing (From, To) order.
	Entries []Entry
	// SignalEntries are the values of B (C) that the witness fixes.
	SignalEntries []SignalEntry
	// Confirmed reports that Confirm found the vector, the values and the
	// class consistent in exact integer arithmetic. Check returns only
	// confirmed witnesses.
	Confirmed bool

	g      *structural.Network
	class  Class
	design structural.Design
}

// Entry is one value of A: A[To][From] = Value.
type Entry struct {
	From, To int32
	Value    int64
}

// SignalEntry is one value of B (C): the entry of signal Signal (0-based
// index into the design) on State. For inputs B[State][Signal] = Value;
// for outputs C[Signal][State] = Value.
type SignalEntry struct {
	Signal int
	State  int32
	Value  int64
}

// witnessEntries returns the number of entries a witness with the given
// support lists (for the size limit, before building it).
func (s *system) witnessEntries(support []int32) int64 {
	var k int64
	for _, r := range support {
		k += s.inDegree(r)
	}
	return k
}

// buildWitness assigns values to the entries of A and B that meet the
// fort support so that the indicator vector w of support satisfies
// w^T (A - λI) = 0 and w^T B = 0 (on h, the controllability orientation).
//
// Column j of A holds, among the support's rows, entries L of kinds
// Nonzero and Arbitrary (the diagonal with A's own kind), and must sum to
// t = λ when j is in the support (the -λ of A - λI) and to 0 otherwise;
// signal columns sum to 0. With an Arbitrary entry the sum is met at once
// (Nonzero ones at 1, one Arbitrary entry takes the rest). With k >= 2
// Nonzero entries only: 1, ..., 1, -(k-1) for t = 0; 2, -1 for t = 1,
// k = 2; 1, ..., 1, 2-k for t = 1, k >= 3. A single Nonzero entry meets
// t = 1 and never t = 0. This is the construction in the necessity part
// of the theorem of Jia et al. (2021), and on the free diagonal of
// Monshizadeh et al. (2014): since support is a fort of the test's
// pattern (no column has exactly one Nonzero entry in it, counting the
// shifted diagonal for λ = 1), no column falls in the impossible case, and
// an error here means the support was not a fort. Values stay within
// [-N, N]. Time O(N + E + signal entries).
func buildWitness(s *system, support []int32, lambda int64, minimal bool, design structural.Design, class Class) (*Witness, error) {
	n := s.n
	in := make([]bool, n)
	for _, v := range support {
		in[v] = true
	}
	w := &Witness{Property: s.prop, Eigenvalue: lambda, Support: s.g.States(support), Minimal: minimal, g: s.g, class: class, design: design}
	type item struct {
		row  int32
		kind Kind
	}
	var list []item
	var vals []int64
	assign := func(t int64) error {
		nonzero, arb := 0, -1
		for i, it := range list {
			if it.kind == Arbitrary {
				if arb < 0 {
					arb = i
				}
			} else {
				nonzero++
			}
		}
		vals = vals[:0]
		for range list {
			vals = append(vals, 0)
		}
		switch {
		case len(list) == 0:
			if t != 0 {
				return errors.New("strong: internal error: witness column with no entries must sum to the eigenvalue")
			}
		case arb >= 0:
			for i, it := range list {
				if it.kind == Nonzero {
					vals[i] = 1
				}
			}
			vals[arb] = t - int64(nonzero)
		case len(list) == 1:
			if t == 0 {
				return errors.New("strong: internal error: witness support is not a fort (a column forces)")
			}
			vals[0] = t
		default:
			k := int64(len(list))
			for i := range vals {
				vals[i] = 1
			}
			switch {
			case t == 0:
				vals[k-1] = -(k - 1)
			case k == 2:
				vals[0], vals[1] = t+1, -1
			default:
				vals[k-1] = t - (k - 1)
			}
		}
		return nil
	}
	out := s.out
	for j := int32(0); int(j) < n; j++ {
		list = list[:0]
		for k := out.Ptr[j]; k < out.Ptr[j+1]; k++ {
			if v := out.Adj[k]; v != j && in[v] {
				list = append(list, item{v, s.kindOut(k)})
			}
		}
		var t int64
		if in[j] {
			t = lambda
			if d := s.diag[j]; d != Zero {
				list = append(list, item{j, d})
			}
		}
		if len(list) == 0 && t == 0 {
			continue
		}
		if err := assign(t); err != nil {
			return nil, err
		}
		for i, it := range list {
			e := Entry{From: j, To: it.row, Value: vals[i]}
			if s.prop == structural.Observability {
				e.From, e.To = e.To, e.From
			}
			w.Entries = append(w.Entries, e)
		}
	}
	for i := 0; i < s.m; i++ {
		list = list[:0]
		for _, v := range s.signal(i) {
			if in[v] {
				list = append(list, item{v, Nonzero})
			}
		}
		if len(list) == 0 {
			continue
		}
		if err := assign(0); err != nil {
			return nil, err
		}
		for k, it := range list {
			w.SignalEntries = append(w.SignalEntries, SignalEntry{Signal: i, State: it.row, Value: vals[k]})
		}
	}
	slices.SortFunc(w.Entries, func(a, b Entry) int {
		if a.From != b.From {
			return int(a.From) - int(b.From)
		}
		return int(a.To) - int(b.To)
	})
	return w, nil
}

// Confirm checks the witness against its network, class and design in
// exact integer arithmetic, without the forcing machinery that built it:
// the support is not empty; every listed entry is an entry of the pattern
// (a listed edge, or an unlisted diagonal the class leaves free or
// nonzero), listed once, with a value its kind allows; every entry of the
// pattern that multiplies the vector is listed; and the sums of
// w^T (A - λI) and w^T B (for observability (A - λI) v and C v) are zero
// in every column (row). Sums are checked for overflow. Confirm is what
// makes the witness a proof: any system of the class agreeing with the
// listed values is uncontrollable (unobservable) by Hautus' test.
func (w *Witness) Confirm() error {
	g := w.g
	n := g.N()
	obs := w.Property == structural.Observability
	if w.Support.Len() == 0 {
		return errors.New("strong: witness has an empty support")
	}
	sup := make(map[int32]bool, w.Support.Len())
	for i := 0; i < w.Support.Len(); i++ {
		v := w.Support.At(i)
		if v < 0 || int(v) >= n || sup[v] {
			return errors.New("strong: witness support holds a bad or repeated state")
		}
		sup[v] = true
	}
	out := g.Out()
	kindOf := func(u, v int32) (Kind, bool) {
		row := out.Adj[out.Ptr[u]:out.Ptr[u+1]]
		k, ok := search(row, v)
		if !ok {
			if u == v {
				return w.class.Diagonal.kind(), true
			}
			return Zero, false
		}
		if w.class.MayBeZero != nil && w.class.MayBeZero[out.Ptr[u]+int64(k)] {
			return Arbitrary, true
		}
		return Nonzero, true
	}
	add := func(a, b int64) (int64, error) {
		if (b > 0 && a > math.MaxInt64-b) || (b < 0 && a < math.MinInt64-b) {
			return 0, errors.New("strong: witness sum overflows")
		}
		return a + b, nil
	}
	// sums[x]: for controllability the column sum over the support's rows
	// of column x; for observability the row sum over the support's
	// columns of row x.
	sums := make(map[int32]int64)
	listed := make(map[int32]int64) // entries listed per support state
	seen := make(map[[2]int32]bool, len(w.Entries))
	for _, e := range w.Entries {
		if e.From < 0 || int(e.From) >= n || e.To < 0 || int(e.To) >= n {
			return errors.New("strong: witness entry outside the network")
		}
		key := [2]int32{e.From, e.To}
		if seen[key] {
			return fmt.Errorf("strong: witness lists %s -> %s twice", g.Name(e.From), g.Name(e.To))
		}
		seen[key] = true
		k, ok := kindOf(e.From, e.To)
		if !ok || k == Zero {
			return fmt.Errorf("strong: witness gives a value to %s -> %s, a fixed zero of the class", g.Name(e.From), g.Name(e.To))
		}
		if k == Nonzero && e.Value == 0 {
			return fmt.Errorf("strong: witness sets the nonzero entry %s -> %s to zero", g.Name(e.From), g.Name(e.To))
		}
		// The vector's state and the other end of the entry.
		mine, other := e.To, e.From
		if obs {
			mine, other = e.From, e.To
		}
		if !sup[mine] {
			return fmt.Errorf("strong: witness lists %s -> %s, which does not meet the support", g.Name(e.From), g.Name(e.To))
		}
		listed[mine]++
		s, err := add(sums[other], e.Value)
		if err != nil {
			return err
		}
		sums[other] = s
	}
	// Every pattern entry meeting the support is listed.
	for v := range sup {
		var want int64
		var row []int32
		if obs {
			row = g.Succ(v)
		} else {
			row = g.Pred(v)
		}
		want = int64(len(row))
		if _, loop := search(row, v); !loop && w.class.Diagonal.kind() != Zero {
			want++
		}
		if listed[v] != want {
			return fmt.Errorf("strong: witness lists %d of the %d entries that meet %s", listed[v], want, g.Name(v))
		}
	}
	for x, s := range sums {
		if want := w.eigenvalueAt(sup[x]); s != want {
			return fmt.Errorf("strong: witness fails at %s: sum %d, want %d", g.Name(x), s, want)
		}
	}
	for v := range sup {
		if _, ok := sums[v]; !ok && w.Eigenvalue != 0 {
			return fmt.Errorf("strong: witness fails at %s: sum 0, want %d", g.Name(v), w.Eigenvalue)
		}
	}
	// Signals: every (signal, support state) entry listed once, nonzero,
	// and each signal's sum zero.
	sigs := w.design.Signals()
	type pair struct {
		i int
		v int32
	}
	want := make(map[pair]bool)
	for i, sg := range sigs {
		for _, v := range sg {
			if sup[v] {
				want[pair{i, v}] = true
			}
		}
	}
	if len(want) != len(w.SignalEntries) {
		return fmt.Errorf("strong: witness lists %d signal entries, the support meets %d", len(w.SignalEntries), len(want))
	}
	sigSum := make(map[int]int64)
	for _, e := range w.SignalEntries {
		p := pair{e.Signal, e.State}
		if !want[p] {
			return errors.New("strong: witness lists a signal entry that is not in the design or misses the support")
		}
		delete(want, p)
		if e.Value == 0 {
			return errors.New("strong: witness sets a signal entry to zero")
		}
		s, err := add(sigSum[e.Signal], e.Value)
		if err != nil {
			return err
		}
		sigSum[e.Signal] = s
	}
	for i, s := range sigSum {
		if s != 0 {
			return fmt.Errorf("strong: witness fails at signal %d: sum %d", w.design.Number(i), s)
		}
	}
	return nil
}

// eigenvalueAt is the sum a column (row) of the support must reach.
func (w *Witness) eigenvalueAt(inSupport bool) int64 {
	if inSupport {
		return w.Eigenvalue
	}
	return 0
}

type entryJSON struct {
	From  string `json:"from"`
	To    string `json:"to"`
	Value int64  `json:"value"`
}

type signalEntryJSON struct {
	Signal int    `json:"signal"`
	State  string `json:"state"`
	Value  int64  `json:"value"`
}

// MarshalJSON writes the witness with state names: eigenvalue, support,
// minimal, entries [{from, to, value}], signal_entries [{signal (its
// design-file line or 1-based position), state, value}], confirmed.
func (w *Witness) MarshalJSON() ([]byte, error) {
	es := make([]entryJSON, len(w.Entries))
	for i, e := range w.Entries {
		es[i] = entryJSON{w.g.Name(e.From), w.g.Name(e.To), e.Value}
	}
	ss := make([]signalEntryJSON, len(w.SignalEntries))
	for i, e := range w.SignalEntries {
		ss[i] = signalEntryJSON{w.design.Number(e.Signal), w.g.Name(e.State), e.Value}
	}
	return json.Marshal(struct {
		Eigenvalue    int64             `json:"eigenvalue"`
		Support       structural.States `json:"support"`
		Minimal       bool              `json:"minimal"`
		Entries       []entryJSON       `json:"entries"`
		SignalEntries []signalEntryJSON `json:"signal_entries"`
		Confirmed     bool              `json:"confirmed"`
	}{w.Eigenvalue, w.Support, w.Minimal, es, ss, w.Confirmed})
}
