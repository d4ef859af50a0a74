package structural

import (
	"fmt"
	"slices"

	"github.com/netsteer/netsteer/matching"
)

// Verdict judges an input design by Lin's theorem and measures how much of
// the state space it controls.
type Verdict struct {
	// Inputs is the number of independent inputs judged.
	Inputs int
	// Controllable reports structural controllability: every state is
	// reached from some input and there is no dilation (Lin, "Structural
	// controllability", IEEE TAC 19(3):201-208, 1974).
	Controllable bool
	// Unreached lists, in increasing order, the states that no input
	// reaches, directly or downstream.
	Unreached []int32
	// Dilation is a witness of a dilation, nil when there is none.
	Dilation *Dilation
	// Deficiency is N minus the term rank of [A B]: the number of states a
	// maximum matching leaves without a distinct in-neighbour (state or
	// input). It is 0 exactly when there is no dilation; every added input
	// lowers it by at most one, so at least this many inputs are missing.
	Deficiency int
	// ControllableDimension is the generic dimension of the controllable
	// subspace (see ControllableDimension); N when Controllable. It is -1
	// when the network is too large for the computation (over 2^30 states).
	ControllableDimension int
}

// Dilation is a set of states whose in-neighbours, inputs included, number
// fewer than the states: here exactly one fewer, len(InNeighbours) +
// len(Inputs) == len(States) - 1. One more input acting on one of States
// removes this deficit.
type Dilation struct {
	// States is the set S, in increasing order.
	States []int32
	// InNeighbours are the states acting on some state of S, in
	// increasing order.
	InNeighbours []int32
	// Inputs are the inputs (0-based indices into the design) acting on
	// some state of S, in increasing order.
	Inputs []int
}

// Check judges the design in which independent input i drives the states
// inputs[i] (a column of B with nonzero entries on those states). Every
// index must be a state of g; Check panics otherwise (io/design validates
// names read from files).
//
// Reachability is one breadth-first search from the driven states. The
// dilation test is a maximum matching of the bipartite graph whose rows are
// the states, each needing a distinct in-neighbour, and whose columns are
// the states and the inputs; by Hall's theorem there is a dilation exactly
// when the matching leaves a row unmatched. The witness is the set of rows
// reached by alternating paths from one unmatched row: every column those
// rows touch is matched (else the matching would not be maximum) to another
// reached row, so the neighbour set has exactly one member fewer. Time is
// that of one matching, plus ControllableDimension when the design fails.
func Check(g *Network, inputs [][]int32) *Verdict {
	n := g.N()
	for i, in := range inputs {
		for _, v := range in {
			if v < 0 || int(v) >= n {
				panic(fmt.Sprintf("structural: Check: input %d drives state %d, not in [0,%d)", i, v, n))
			}
		}
	}
	vd := &Verdict{Inputs: len(inputs)}
	reached, nR := reach(g, inputs)
	if nR < n {
		vd.Unreached = make([]int32, 0, n-nR)
		for v := 0; v < n; v++ {
			if !reached[v] {
				vd.Unreached = append(vd.Unreached, int32(v))
			}
		}
	}
	b := inNeighbourCSR(g, inputs)
	m := matching.Maximum(b, nil)
	vd.Deficiency = n - m.Size
	if vd.Deficiency > 0 {
		vd.Dilation = dilationWitness(b, m, n)
	}
	vd.Controllable = nR == n && vd.Deficiency == 0
	if vd.Controllable {
		vd.ControllableDimension = n
	} else {
		vd.ControllableDimension = dimension(g, inputs, reached, nR, m)
	}
	return vd
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
		for _, v := range g.Out.Adj[g.Out.Ptr[u]:g.Out.Ptr[u+1]] {
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
		b.Ptr[v+1] = b.Ptr[v] + (g.In.Ptr[v+1] - g.In.Ptr[v]) + extra[v+1]
	}
	b.Adj = make([]int32, b.Ptr[n])
	pos := extra[:n] // reused: next free slot of each row's input part
	for v := 0; v < n; v++ {
		k := copy(b.Adj[b.Ptr[v]:], g.In.Adj[g.In.Ptr[v]:g.In.Ptr[v+1]])
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

// dilationWitness grows the alternating tree of the first unmatched row of
// b (states are rows 0..n-1, columns n.. are inputs).
func dilationWitness(b *matching.CSR, m *matching.Matching, n int) *Dilation {
	root := int32(-1)
	for r := 0; r < b.Rows; r++ {
		if m.RowMate[r] < 0 {
			root = int32(r)
			break
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
	d := &Dilation{States: rows}
	slices.Sort(d.States)
	for _, c := range cols {
		if int(c) < n {
			d.InNeighbours = append(d.InNeighbours, c)
		} else {
			d.Inputs = append(d.Inputs, int(c)-n)
		}
	}
	slices.Sort(d.InNeighbours)
	slices.Sort(d.Inputs)
	return d
}

// ObservabilityVerdict judges an output (sensor) design: the dual of a
// Verdict, computed on the transposed network.
type ObservabilityVerdict struct {
	// Outputs is the number of independent outputs judged.
	Outputs int
	// Observable reports structural observability: every state reaches
	// some output and there is no observation dilation.
	Observable bool
	// Unobserved lists, in increasing order, the states from which no
	// output can be reached, so that no output ever sees them.
	Unobserved []int32
	// Dilation is a witness of an observation dilation, nil when there is
	// none.
	Dilation *ObservationDilation
	// Deficiency is N minus the term rank of [A; C].
	Deficiency int
	// ObservableDimension is the generic dimension of the observable
	// subspace (the rank of the observability matrix); N when Observable.
	ObservableDimension int
}

// ObservationDilation is a set of states whose out-neighbours, outputs
// included, number one fewer than the states.
type ObservationDilation struct {
	// States is the set S, in increasing order.
	States []int32
	// OutNeighbours are the states some state of S acts on, in increasing
	// order.
	OutNeighbours []int32
	// Outputs are the outputs (0-based indices into the design) sensing
	// some state of S, in increasing order.
	Outputs []int
}

// CheckObservability judges the design in which independent output i
// senses the states outputs[i] (a row of C). By duality it is Check on the
// transposed network.
func CheckObservability(g *Network, outputs [][]int32) *ObservabilityVerdict {
	v := Check(Transpose(g), outputs)
	o := &ObservabilityVerdict{
		Outputs:             v.Inputs,
		Observable:          v.Controllable,
		Unobserved:          v.Unreached,
		Deficiency:          v.Deficiency,
		ObservableDimension: v.ControllableDimension,
	}
	if d := v.Dilation; d != nil {
		o.Dilation = &ObservationDilation{States: d.States, OutNeighbours: d.InNeighbours, Outputs: d.Inputs}
	}
	return o
}

// Transpose returns the network with every edge reversed (A^T), sharing
// g's names and adjacency arrays; only the weights, if any, are copied into
// the new edge order. Controllability of the transpose is observability of
// g.
func Transpose(g *Network) *Network {
	t := &Network{Out: g.In, In: g.Out, SelfLoops: g.SelfLoops, DuplicatesMerged: g.DuplicatesMerged, names: g.names}
	if g.OutW != nil {
		// In row v lists the sources u of v in increasing u, the order in
		// which scanning Out row by row meets them.
		n := g.N()
		pos := make([]int64, n)
		copy(pos, g.In.Ptr[:n])
		t.OutW = make([]float64, len(g.OutW))
		for u := 0; u < n; u++ {
			for k := g.Out.Ptr[u]; k < g.Out.Ptr[u+1]; k++ {
				v := g.Out.Adj[k]
				t.OutW[pos[v]] = g.OutW[k]
				pos[v]++
			}
		}
	}
	return t
}
