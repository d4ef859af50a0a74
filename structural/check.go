package structural

import (
	"slices"

	"github.com/netsteer/netsteer/matching"
)

// Property is the structural property a question is about.
type Property uint8

const (
	// Controllability: every state can be steered by the inputs (columns
	// of B).
	Controllability Property = iota
	// Observability: every state can be told from the outputs (rows of
	// C); by duality, controllability of the transposed network.
	Observability
)

// String returns "controllability" or "observability".
func (p Property) String() string {
	if p == Observability {
		return "observability"
	}
	return "controllability"
}

// Verdict judges a design by Lin's theorem for one property and measures
// how much of the state space it controls (observes). For observability
// every word is read on the transposed network: "reached" means that the
// state reaches an output, "in-neighbours" are out-neighbours.
type Verdict struct {
	// Property is the property judged.
	Property Property `json:"-"`
	// Signals is the number of independent signals (inputs or outputs)
	// judged.
	Signals int `json:"signals"`
	// Holds reports structural controllability (observability): every
	// state is reached and there is no dilation (Lin, "Structural
	// controllability", IEEE TAC 19(3):201-208, 1974).
	Holds bool `json:"holds"`
	// Unreached lists, in increasing order, the states that no input
	// reaches, directly or downstream (for observability: the states from
	// which no output can be reached).
	Unreached States `json:"unreached"`
	// Dilation is a witness of a dilation, nil when there is none.
	Dilation *Dilation `json:"dilation"`
	// TermRank is the term rank of [A B] ([A; C] for observability): N
	// minus the number of states a maximum matching leaves without a
	// distinct in-neighbour (state or signal). It is N exactly when there
	// is no dilation; every added signal raises it by at most one, so at
	// least N - TermRank signals are missing.
	TermRank int `json:"term_rank"`
	// Dimension is the generic dimension of the controllable (observable)
	// subspace (see Dimension); N when Holds.
	Dimension int `json:"dimension"`

	n    int
	from []int32
}

// MatchedFrom returns, for each state v, where the maximum matching of
// [A B] behind the verdict feeds v from: a state u (0..N-1) with u -> v,
// N+i for signal i, or -1 when v is left without (a dilation member).
// Followed backwards from the states fed by signals these are the stems,
// and the matched edges on no stem form cycles: the structure that
// carries control (Lin's cactus). For observability the edges are those of
// the transposed network. The slice is shared and must not be modified.
func (v *Verdict) MatchedFrom() []int32 { return v.from }

// Deficiency returns N - TermRank: the fewest signals that must be added to
// remove every dilation.
func (v *Verdict) Deficiency() int { return v.n - v.TermRank }

// Dilation is a set of states whose in-neighbours, signals included,
// number fewer than the states: here exactly one fewer, len(Neighbours) +
// len(Signals) == len(States) - 1. One more signal acting on one of States
// removes this deficit. For observability, Neighbours are out-neighbours
// and the signals are outputs.
type Dilation struct {
	// States is the set S, in increasing order.
	States States `json:"states"`
	// Neighbours are the states acting on some state of S, in increasing
	// order.
	Neighbours States `json:"neighbours"`
	// Signals are the signals (0-based indices into the design) acting on
	// some state of S, in increasing order.
	Signals []int `json:"-"`
	// SignalNumbers names Signals for a reader: their design-file lines,
	// or their 1-based positions for a design not read from a file.
	SignalNumbers []int `json:"signals"`
}

// Check judges design d of g for property p: the inputs for
// Controllability, the outputs for Observability (computed on the
// transposed network).
//
// Reachability is one breadth-first search from the driven states. The
// dilation test is a maximum matching of the bipartite graph whose rows are
// the states, each needing a distinct in-neighbour, and whose columns are
// the states and the signals; by Hall's theorem there is a dilation exactly
// when the matching leaves a row unmatched. The witness is the set of rows
// reached by alternating paths from one unmatched row: every column those
// rows touch is matched (else the matching would not be maximum) to another
// reached row, so the neighbour set has exactly one member fewer. Time is
// that of one matching (the search for the reached states runs beside it
// on another goroutine), plus Dimension when the design fails.
func Check(g *Network, p Property, d Design) (*Verdict, error) {
	if !d.Of(g) {
		return nil, ErrForeignDesign
	}
	h := g.on(p)
	inputs := d.signals
	n := h.N()
	vd := &Verdict{Property: p, Signals: len(inputs), n: n}
	// Reachability and the matching of [A B] are independent: the search
	// runs on another goroutine meanwhile.
	var reached []bool
	var nR int
	reachDone := make(chan struct{})
	go func() {
		defer close(reachDone)
		reached, nR = reach(h, inputs)
	}()
	var b *matching.CSR // built only when a search or a failure needs it
	m := h.designMatching(inputs, &b)
	<-reachDone
	var unreached []int32
	if nR < n {
		unreached = make([]int32, 0, n-nR)
		for v := 0; v < n; v++ {
			if !reached[v] {
				unreached = append(unreached, int32(v))
			}
		}
	}
	vd.Unreached = g.States(unreached)
	vd.TermRank = m.Size
	vd.from = m.RowMate
	if (nR < n || m.Size < n) && b == nil {
		b = inNeighbourCSR(h, inputs)
	}
	if m.Size < n {
		vd.Dilation = dilationWitness(g, b, m, n, d)
	}
	vd.Holds = nR == n && m.Size == n
	if vd.Holds {
		vd.Dimension = n
	} else {
		dim, err := dimension(h, inputs, reached, nR, b, m)
		if err != nil {
			return nil, err
		}
		vd.Dimension = dim
	}
	return vd, nil
}

// reach marks the states reached from the driven states along g.Out and
// returns the marks and their count.
func reach(g *Network, inputs [][]int32) ([]bool, int) {
	n := g.N()
	seen := make([]bool, n)
	queue := make([]int32, 0, 64)
	for _, in := range inputs {
		for _, v := range in {
			if !seen[v] {
				seen[v] = true
				queue = append(queue, v)
			}
		}
	}
	for i := 0; i < len(queue); i++ {
		u := queue[i]
		for _, v := range g.out.Adj[g.out.Ptr[u]:g.out.Ptr[u+1]] {
			if !seen[v] {
				seen[v] = true
				queue = append(queue, v)
			}
		}
	}
	return seen, len(queue)
}

// inNeighbourCSR returns the bipartite graph of [A B]: row v lists the
// states acting on v (columns 0..N-1) and the inputs driving v (column N+i
// for input i), each once.
func inNeighbourCSR(g *Network, inputs [][]int32) *matching.CSR {
	n := g.N()
	extra := make([]int64, n+1)
	mark := make([]int32, n) // input index + 1 of the last input counted at v
	for i, in := range inputs {
		for _, v := range in {
			if mark[v] != int32(i+1) {
				mark[v] = int32(i + 1)
				extra[v+1]++
			}
		}
	}
	b := &matching.CSR{Rows: n, Cols: n + len(inputs), Ptr: make([]int64, n+1)}
	for v := 0; v < n; v++ {
		b.Ptr[v+1] = b.Ptr[v] + (g.in.Ptr[v+1] - g.in.Ptr[v]) + extra[v+1]
	}
	b.Adj = make([]int32, b.Ptr[n])
	pos := extra[:n] // reused: next free slot of each row's input part
	for v := 0; v < n; v++ {
		k := copy(b.Adj[b.Ptr[v]:], g.in.Adj[g.in.Ptr[v]:g.in.Ptr[v+1]])
		pos[v] = b.Ptr[v] + int64(k)
		mark[v] = 0
	}
	for i, in := range inputs {
		for _, v := range in {
			if mark[v] != int32(i+1) {
				mark[v] = int32(i + 1)
				b.Adj[pos[v]] = int32(n + i)
				pos[v]++
			}
		}
	}
	return b
}

// inNeighbourCSRT returns the transpose of inNeighbourCSR(g, inputs), as
// matching.Transpose would build it, by copying the out-rows (row u lists
// the states u acts on) and adding one row per input (the states it
// drives, in increasing order, each once): sequential copies instead of a
// scatter over every edge.
func inNeighbourCSRT(g *Network, inputs [][]int32) *matching.CSR {
	n := g.N()
	t := &matching.CSR{Rows: n + len(inputs), Cols: n, Ptr: make([]int64, n+len(inputs)+1)}
	copy(t.Ptr, g.out.Ptr)
	rows := make([][]int32, len(inputs))
	extra := 0
	for i, in := range inputs {
		r := slices.Clone(in)
		slices.Sort(r)
		rows[i] = slices.Compact(r)
		extra += len(rows[i])
		t.Ptr[n+i+1] = t.Ptr[n+i] + int64(len(rows[i]))
	}
	t.Adj = make([]int32, 0, len(g.out.Adj)+extra)
	t.Adj = append(t.Adj, g.out.Adj...)
	for _, r := range rows {
		t.Adj = append(t.Adj, r...)
	}
	return t
}

// dilationWitness grows the alternating tree of the first unmatched row of
// b (states are rows 0..n-1, columns n.. are inputs) that has a feed at
// all, else of the first unmatched row: a state with neither in-neighbour
// nor signal is reported unreached already, and the tree of a fed one
// shows the states that share too few feeds, whichever maximum matching
// was found.
func dilationWitness(g *Network, b *matching.CSR, m *matching.Matching, n int, design Design) *Dilation {
	root := int32(-1)
	for r := 0; r < b.Rows; r++ {
		if m.RowMate[r] < 0 {
			if root < 0 {
				root = int32(r)
			}
			if b.Ptr[r+1] > b.Ptr[r] {
				root = int32(r)
				break
			}
		}
	}
	rowSeen := make([]bool, b.Rows)
	colSeen := make([]bool, b.Cols)
	rows := []int32{root}
	rowSeen[root] = true
	var cols []int32
	for i := 0; i < len(rows); i++ {
		for _, c := range b.Row(rows[i]) {
			if colSeen[c] {
				continue
			}
			colSeen[c] = true
			cols = append(cols, c)
			r := m.ColMate[c]
			if r < 0 {
				panic("structural: internal error: augmenting path after a maximum matching")
			}
			if !rowSeen[r] {
				rowSeen[r] = true
				rows = append(rows, r)
			}
		}
	}
	slices.Sort(rows)
	var nb []int32
	var sig []int
	for _, c := range cols {
		if int(c) < n {
			nb = append(nb, c)
		} else {
			sig = append(sig, int(c)-n)
		}
	}
	slices.Sort(nb)
	slices.Sort(sig)
	num := make([]int, len(sig))
	for i, x := range sig {
		num[i] = design.Number(x)
	}
	return &Dilation{States: g.States(rows), Neighbours: g.States(nb), Signals: sig, SignalNumbers: num}
}

// MarshalText writes the property's name.
func (p Property) MarshalText() ([]byte, error) { return []byte(p.String()), nil }

// Device names the dedicated device that provides the property:
// "actuator" or "sensor".
func (p Property) Device() string {
	if p == Observability {
		return "sensor"
	}
	return "actuator"
}
