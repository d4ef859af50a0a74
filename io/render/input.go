package render

import (
	"fmt"
	"github.com/netsteer/netsteer/io/internal/words"
	"strconv"
	"strings"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/analysis"
	"github.com/netsteer/netsteer/structural/placement"
)

// Input is what a picture is drawn from: a network and the answers to show
// on it, normally built by FromReview. Only Net is required.
type Input struct {
	Net *structural.Network
	// Components are Net's strongly connected components; Net's own when
	// nil.
	Components *structural.Components

	// In is the control structure drawn (analysis.Review.Structure for
	// controllability): its signals, stems and cycles, and its verdict's
	// unreached states and dilation. Out is the observation structure of
	// the outputs; only its signals and its verdict are drawn. Either may
	// be nil.
	In, Out *analysis.Structure
	// CompleteIn and CompleteOut are the cheapest completions of a
	// failing design: their added devices are marked as new.
	CompleteIn, CompleteOut *placement.Placement

	// Role, when not nil, names the role of a state: "critical",
	// "intermittent" or "redundant" (Jia et al. 2013); other values draw
	// no role.
	Role func(v int32) string
	// Label, when not nil, gives the name to show for a state ("" falls
	// back to the state's name, which always stays in the tooltip).
	Label func(v int32) string
	// Group, when not nil, gives the plant area a state belongs to.
	Group func(v int32) string

	// Title is the first line of the picture's title (a file name, say);
	// Notes are extra lines under the summary (a verdict, say).
	Title string
	Notes []string

	prepared                                 bool
	inputs, outputs                          [][]int32
	unreached, dilation, unobserved, obsDila []int32
	next                                     []int32 // matched successor on a stem or cycle, -1
	inStem, outStem                          []int32 // signal -> index in Stems
	stemOf, cycOf                            func(int32) int
}

// FromReview builds the picture of a review: the control structure of the
// inputs it judges or places (else of its driver set), the outputs it
// judges or places, the completions of failing designs, node roles when
// the review has them, and one note per answer. inputs and outputs are the
// designs the request gave (nil for none).
func FromReview(rv *analysis.Review, inputs, outputs *structural.Design) (*Input, error) {
	in := &Input{Net: rv.Network()}
	var err error
	if in.In, err = rv.Structure(structural.Controllability, inputs); err != nil {
		return nil, err
	}
	if in.Out, err = rv.Structure(structural.Observability, outputs); err != nil {
		return nil, err
	}
	if c := rv.Check; c != nil {
		if p := c.Controllability; p != nil && p.Completion != nil {
			in.CompleteIn = p.Completion
		}
		if p := c.Observability; p != nil && p.Completion != nil {
			in.CompleteOut = p.Completion
		}
	}
	if r := rv.Drivers.NodeRoles; r != nil {
		in.Role = func(v int32) string { return r.Of[v].String() }
	}
	for _, s := range []*analysis.Structure{in.In, in.Out} {
		if s != nil {
			in.Notes = append(in.Notes, Verdict(s))
		}
	}
	return in, nil
}

// Verdict says in one line what a structure answers: the verdict of a
// judged design, the cost of a placement, the driver count.
func Verdict(s *analysis.Structure) string {
	n := s.Design.Len()
	adj := "controllable"
	if s.Property == structural.Observability {
		adj = "observable"
	}
	switch s.Source {
	case analysis.FromDrivers:
		return fmt.Sprintf("Minimum number of independent control signals N_D = %s (driver nodes of a maximum matching).", num(n))
	case analysis.FromPlacement:
		added, cost := 0, structural.Cost(0)
		for _, st := range s.Stems {
			if st.New {
				added++
				if st.Cost != nil {
					cost += *st.Cost
				}
			}
		}
		if s.Verdict != nil && !s.Verdict.Holds {
			return fmt.Sprintf("No placement of dedicated %ss can make it structurally %s; %s placed where allowed.", s.Kind, adj, num(n))
		}
		return fmt.Sprintf("Cheapest dedicated %s: %s (%s new, total cost %s).", pluralKind(n, s.Kind), num(n), num(added), words.Thousands(cost.String()))
	}
	v := s.Verdict
	what := "Design of " + num(n) + " " + pluralKind(n, s.Kind)
	if v.Holds {
		return fmt.Sprintf("%s: structurally %s.", what, adj)
	}
	var why []string
	if k := v.Unreached.Len(); k > 0 {
		word := "unreached"
		if s.Property == structural.Observability {
			word = "unobserved"
		}
		why = append(why, num(k)+" "+plural(k, "state", "states")+" "+word)
	}
	if d := v.Deficiency(); d > 0 {
		sig := "input"
		if s.Property == structural.Observability {
			sig = "output"
		}
		why = append(why, fmt.Sprintf("a dilation (at least %s more %s)", num(d), plural(d, sig, sig+"s")))
	}
	return fmt.Sprintf("%s: NOT structurally %s: %s; %s dimension %s of %s.", what, adj, strings.Join(why, "; "),
		adj, num(v.Dimension), num(len(v.MatchedFrom())))
}

// prep derives the lists and marks the drawing code reads.
func (in *Input) prep() {
	if in.prepared {
		return
	}
	in.prepared = true
	if in.Components == nil {
		in.Components = in.Net.Components()
	}
	n := in.Net.N()
	in.stemOf = func(int32) int { return -1 }
	in.cycOf = in.stemOf
	if s := in.In; s != nil {
		in.inputs = s.Design.Signals()
		if v := s.Verdict; v != nil {
			in.unreached = v.Unreached.IDs()
			if v.Dilation != nil {
				in.dilation = v.Dilation.States.IDs()
			}
		}
		in.next = make([]int32, n)
		for i := range in.next {
			in.next[i] = -1
		}
		for _, st := range s.Stems {
			ids := st.States.IDs()
			for i := 1; i < len(ids); i++ {
				in.next[ids[i-1]] = ids[i]
			}
		}
		for _, c := range s.Cycles {
			ids := c.States.IDs()
			for i := range ids {
				in.next[ids[i]] = ids[(i+1)%len(ids)]
			}
		}
		in.stemOf, in.cycOf = s.StemOf, s.CycleOf
		in.inStem = stemIndex(s)
	}
	if s := in.Out; s != nil {
		in.outStem = stemIndex(s)
		in.outputs = s.Design.Signals()
		if v := s.Verdict; v != nil {
			in.unobserved = v.Unreached.IDs()
			if v.Dilation != nil {
				in.obsDila = v.Dilation.States.IDs()
			}
		}
	}
}

func (in *Input) inputKind() string {
	if in.In == nil {
		return "input"
	}
	return in.In.Kind
}

func (in *Input) outputKind() string {
	if in.Out == nil {
		return "sensor"
	}
	return in.Out.Kind
}

func (in *Input) inputPrefix() string  { return "u" }
func (in *Input) outputPrefix() string { return "y" }

// signalName names input (or output) signal i as every table of the
// review does: the prefix and structural.Design.Number.
func (in *Input) signalName(output bool, i int) string {
	if output {
		return in.outputPrefix() + strconv.Itoa(in.Out.Design.Number(i))
	}
	return in.inputPrefix() + strconv.Itoa(in.In.Design.Number(i))
}

// stemOfSignal returns the stem of signal i of structure s (In or Out).
func (in *Input) stemOfSignal(s *analysis.Structure, i int) *analysis.Stem {
	idx := in.inStem
	if s == in.Out {
		idx = in.outStem
	}
	if i < 0 || i >= len(idx) {
		return nil
	}
	return &s.Stems[idx[i]]
}

// stemIndex maps each signal of s to its stem's index.
func stemIndex(s *analysis.Structure) []int32 {
	idx := make([]int32, s.Design.Len())
	for k := range s.Stems {
		idx[s.Stems[k].Signal] = int32(k)
	}
	return idx
}

// Edge kinds for drawing.
const (
	plainEdge uint8 = iota
	stemEdge
	cycleEdge
)

// edgeKind classifies u -> v: on a stem, on a cycle of the control
// structure, or neither.
func (in *Input) edgeKind(u, v int32) uint8 {
	if in.next == nil || in.next[u] != v {
		return plainEdge
	}
	if in.stemOf(u) >= 0 {
		return stemEdge
	}
	if in.cycOf(u) >= 0 {
		return cycleEdge
	}
	return plainEdge
}

// shownName is the label of state v: its node-table label or its name.
func (in *Input) shownName(v int32) string {
	if in.Label != nil {
		if l := in.Label(v); l != "" {
			return name(l)
		}
	}
	return name(in.Net.Name(v))
}
