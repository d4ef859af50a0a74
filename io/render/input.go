package render

import (
	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural"
)

// Input is what a picture is drawn from: a network and the answers to show
// on it. Only Net is required; every other field may be left empty.
type Input struct {
	Net *structural.Network
	// Components are Net's strongly connected components; computed when
	// Count is zero.
	Components *structural.Components

	// Inputs are the independent input signals: Inputs[i] lists the states
	// signal i drives. InputKind names them in the title and legend:
	// "driver node", "actuator" or "input" (the default).
	Inputs    [][]int32
	InputKind string
	// Outputs are the independent output signals: Outputs[i] lists the
	// states signal i senses. OutputKind is "sensor" by default.
	Outputs    [][]int32
	OutputKind string

	// Matching is a structural matching of Net whose stems and cycles carry
	// control: its paths that start at a state driven by an input are
	// stems (with no Inputs, every path is). Use the driver set's matching
	// for driver nodes and DesignMatching for a given design; nil draws
	// every edge alike.
	Matching *matching.Matching

	// Unreached lists the states no input reaches; Dilation a set of states
	// with fewer in-neighbours (inputs included) than members. Both come
	// from judging a design (structural.Check); either may be empty.
	Unreached []int32
	Dilation  []int32
	// Unobserved and ObservationDilation are their duals for an output
	// design (structural.CheckObservability).
	Unobserved          []int32
	ObservationDilation []int32

	// Role, when not nil, names the role of a state: "critical",
	// "intermittent" or "redundant" (Jia et al. 2013); other values and ""
	// draw no role.
	Role func(v int32) string
	// Label, when not nil, gives the name to show for a state ("" falls
	// back to the state's name, which always stays in the tooltip).
	Label func(v int32) string
	// Group, when not nil, gives the plant area a state belongs to; states
	// of one group are framed together.
	Group func(v int32) string

	// Title is the first line of the picture's title (a file name, say);
	// Notes are extra lines under the summary (a verdict, say).
	Title string
	Notes []string
}

func (in *Input) inputKind() string {
	if in.InputKind == "" {
		return "input"
	}
	return in.InputKind
}

func (in *Input) outputKind() string {
	if in.OutputKind == "" {
		return "sensor"
	}
	return in.OutputKind
}

// Edge kinds for drawing.
const (
	plainEdge uint8 = iota
	stemEdge
	cycleEdge
)

// Path marks for the states of a matching's paths and cycles.
const (
	onNone  uint8 = iota
	onStem        // on a path that starts at a driven state
	onCycle       // on a cycle of matched edges
	onOther       // on a path that starts at a state no input drives
)

// control marks every state by the matched structure it lies on. A path
// of matched edges starts at a state whose in-copy is unmatched; it is a
// stem when an input drives that state (or when driven is nil: then every
// such state is taken as driven, as for driver nodes). Matched edges on no
// path lie on cycles. O(N).
func control(n int, m *matching.Matching, driven []bool) []uint8 {
	on := make([]uint8, n)
	for v := 0; v < n; v++ {
		if m.ColMate[v] >= 0 {
			continue
		}
		mark := onStem
		if driven != nil && !driven[v] {
			mark = onOther
		}
		for u := int32(v); u >= 0 && on[u] == onNone; u = m.RowMate[u] {
			on[u] = mark
		}
	}
	for v := 0; v < n; v++ {
		if on[v] == onNone && m.RowMate[v] >= 0 {
			on[v] = onCycle
		}
	}
	return on
}

// edgeKind classifies u -> v given the marks of control (nil when there
// is no matching).
func edgeKind(m *matching.Matching, on []uint8, u, v int32) uint8 {
	if m == nil || m.RowMate[u] != v {
		return plainEdge
	}
	switch on[u] {
	case onStem:
		return stemEdge
	case onCycle:
		return cycleEdge
	}
	return plainEdge
}

// controlMarks runs control for in's matching and inputs.
func (in *Input) controlMarks() []uint8 {
	var driven []bool
	if len(in.Inputs) > 0 {
		driven = markAll(in.Net.N(), in.Inputs)
	}
	return control(in.Net.N(), in.Matching, driven)
}

// DesignMatching returns a matching of g's edges for drawing the design in
// which signal i drives the states inputs[i]: a maximum matching of the
// bipartite graph whose rows are the states and the inputs and whose
// columns are the states (the graph of [A B] in Lin's theorem), restricted
// to the edges between states. The states matched to an input head the
// stems; paths from states no input drives stay plain. Cost: one maximum
// matching on a copy of the edges.
func DesignMatching(g *structural.Network, inputs [][]int32) *matching.Matching {
	n := g.N()
	rows := n + len(inputs)
	b := &matching.CSR{Rows: rows, Cols: n, Ptr: make([]int64, rows+1)}
	size := int64(len(g.Out().Adj))
	for _, in := range inputs {
		size += int64(len(in))
	}
	b.Adj = make([]int32, 0, size)
	for u := 0; u < n; u++ {
		b.Adj = append(b.Adj, g.Succ(int32(u))...)
		b.Ptr[u+1] = int64(len(b.Adj))
	}
	for i, in := range inputs {
		b.Adj = append(b.Adj, in...)
		b.Ptr[n+i+1] = int64(len(b.Adj))
	}
	m := matching.Maximum(b, nil)
	out := &matching.Matching{RowMate: m.RowMate[:n], ColMate: m.ColMate}
	for v, r := range out.ColMate {
		if r >= int32(n) {
			out.ColMate[v] = -1 // matched to an input: heads a stem
		}
	}
	out.Size = 0
	for _, c := range out.RowMate {
		if c >= 0 {
			out.Size++
		}
	}
	return out
}
