package analysis

import (
	"cmp"
	"slices"

	"github.com/netsteer/netsteer/structural"
)

// GroupRow counts what a review found in one group of states (a plant
// area of the node table).
type GroupRow struct {
	// Group is the group's name, "" for the states of no group.
	Group  string `json:"group"`
	States int    `json:"states"`
	// Inputs and Outputs count the signals that touch a state of the
	// group; Driven and Sensed the states they touch.
	Inputs  int `json:"inputs"`
	Outputs int `json:"outputs"`
	Driven  int `json:"driven"`
	Sensed  int `json:"sensed"`
	// New counts the devices a placement adds in the group.
	New int `json:"new_devices"`
	// Unreached, Unobserved and Dilation count states no input reaches,
	// states no output sees and members of a dilation witness.
	Unreached  int `json:"unreached"`
	Unobserved int `json:"unobserved"`
	Dilation   int `json:"dilation"`
}

// ByGroup counts, for each group of states, what the structures in and
// out (either may be nil) draw: signals, devices, unreached and
// unobserved states, dilation members. group gives a state's group ("" for
// none). Rows come in order of the groups' names, the row of no group
// last. Time O(N + signal entries).
func ByGroup(g *structural.Network, group func(v int32) string, in, out *Structure) []GroupRow {
	index := map[string]int{}
	var rows []GroupRow
	n := g.N()
	of := make([]int32, n)
	for v := 0; v < n; v++ {
		name := group(int32(v))
		k, ok := index[name]
		if !ok {
			k = len(rows)
			index[name] = k
			rows = append(rows, GroupRow{Group: name})
		}
		of[v] = int32(k)
		rows[k].States++
	}
	mark := make([]int32, len(rows)) // last signal seen +1, per group
	for _, s := range []*Structure{in, out} {
		if s == nil {
			continue
		}
		ctrl := s.Property == structural.Controllability
		for i := range mark {
			mark[i] = 0
		}
		seen := make([]bool, n)
		for i := 0; i < s.Design.Len(); i++ {
			for _, v := range s.Design.Signal(i) {
				r := &rows[of[v]]
				if mark[of[v]] != int32(i+1) {
					mark[of[v]] = int32(i + 1)
					if ctrl {
						r.Inputs++
					} else {
						r.Outputs++
					}
				}
				if !seen[v] {
					seen[v] = true
					if ctrl {
						r.Driven++
					} else {
						r.Sensed++
					}
				}
			}
		}
		for _, st := range s.Stems {
			if st.New {
				rows[of[s.Design.Signal(st.Signal)[0]]].New++
			}
		}
		if v := s.Verdict; v != nil {
			for _, x := range v.Unreached.IDs() {
				if ctrl {
					rows[of[x]].Unreached++
				} else {
					rows[of[x]].Unobserved++
				}
			}
			if v.Dilation != nil {
				for _, x := range v.Dilation.States.IDs() {
					rows[of[x]].Dilation++
				}
			}
		}
	}
	slices.SortStableFunc(rows, func(a, b GroupRow) int {
		if (a.Group == "") != (b.Group == "") {
			if a.Group == "" {
				return 1
			}
			return -1
		}
		return cmp.Compare(a.Group, b.Group)
	})
	return rows
}

// Bin is one bar of a histogram: Count values equal to K.
type Bin struct {
	K     int `json:"k"`
	Count int `json:"count"`
}

// Distributions are the histograms a review draws beside the network: the
// in- and out-degrees of all states and of the signals' states (driver
// nodes, actuators), and the lengths of the stems.
type Distributions struct {
	// Signals names the states singled out: the structure's Kind.
	Signals string `json:"signals"`
	// InAll, OutAll are the degree histograms over all states; InSignal,
	// OutSignal over the states at the head of a stem or touched by a
	// signal.
	InAll     []Bin `json:"in_degree_all"`
	OutAll    []Bin `json:"out_degree_all"`
	InSignal  []Bin `json:"in_degree_signal"`
	OutSignal []Bin `json:"out_degree_signal"`
	// StemLengths counts stems by their number of states.
	StemLengths []Bin `json:"stem_lengths"`
}

// Distribute returns the degree and stem-length histograms of g for the
// structure s (the controllability structure of a review, say). Time
// O(N + signal entries); memory O(largest degree) for the bins.
func Distribute(g *structural.Network, s *Structure) *Distributions {
	n := g.N()
	out, in := g.Out(), g.In()
	var inAll, outAll, inSig, outSig counter
	sig := make([]bool, n)
	if s != nil {
		for _, v := range s.Design.Touched() {
			sig[v] = true
		}
	}
	for v := 0; v < n; v++ {
		din := int(in.Ptr[v+1] - in.Ptr[v])
		dout := int(out.Ptr[v+1] - out.Ptr[v])
		inAll.add(din)
		outAll.add(dout)
		if sig[v] {
			inSig.add(din)
			outSig.add(dout)
		}
	}
	d := &Distributions{InAll: inAll.bins(), OutAll: outAll.bins(), InSignal: inSig.bins(), OutSignal: outSig.bins()}
	if s != nil {
		d.Signals = s.Kind
		var st counter
		for _, x := range s.Stems {
			st.add(x.States.Len())
		}
		d.StemLengths = st.bins()
	}
	return d
}

type counter struct{ c []int }

func (c *counter) add(k int) {
	for k >= len(c.c) {
		c.c = append(c.c, 0)
	}
	c.c[k]++
}

func (c *counter) bins() []Bin {
	var out []Bin
	for k, x := range c.c {
		if x > 0 {
			out = append(out, Bin{k, x})
		}
	}
	return out
}
