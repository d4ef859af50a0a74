package transform

import (
	"math"
	"math/bits"
	"math/rand/v2"
	"strconv"
	"strings"

	"github.com/netsteer/netsteer/structural"
)

// Transform names one variant operation and its level.
type Transform struct {
	// Name is one of TransformNames.
	Name string
	// Value is the operation's level: swaps per edge (swap), the fraction
	// of edges (rewire, dropout) or states (remove, attack) affected, the
	// probability of a self-loop (loops), or the number of copies
	// (replicate).
	Value float64
	// Coupling links the copies made by replicate.
	Coupling Coupling
}

// TransformNames lists the transforms, with what their value means.
var TransformNames = []struct{ Name, Value string }{
	{"swap", "degree-preserving edge swaps attempted per edge"},
	{"rewire", "fraction of edges moved to uniformly random places (N and L kept)"},
	{"dropout", "probability that each edge fails (is removed)"},
	{"remove", "fraction of states removed at random, with their edges"},
	{"attack", "fraction of states removed, highest total degree first"},
	{"loops", "probability that each state gets a self-loop"},
	{"replicate", "number of copies of the whole network, coupled as chosen"},
}

// String writes the transform as Parse reads it: "dropout=0.1".
func (t Transform) String() string {
	return t.Name + "=" + strconv.FormatFloat(t.Value, 'g', -1, 64)
}

// Parse reads "name=value", e.g. "dropout=0.1".
func Parse(s string) (Transform, error) {
	name, val, ok := strings.Cut(s, "=")
	if !ok {
		return Transform{}, errorf("%q: want name=value", s)
	}
	v, err := strconv.ParseFloat(val, 64)
	if err != nil {
		return Transform{}, errorf("%q: value %q is not a number", s, val)
	}
	t := Transform{Name: name, Value: v}
	return t, t.check()
}

func (t Transform) check() error {
	v := t.Value
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return errorf("%s=%v is not a finite number", t.Name, v)
	}
	switch t.Name {
	case "swap":
		if v < 0 {
			return errorf("swap=%v: want swaps per edge >= 0", v)
		}
	case "rewire", "dropout", "remove", "attack", "loops":
		if v < 0 || v > 1 {
			return errorf("%s=%v: want a fraction in [0, 1]", t.Name, v)
		}
	case "replicate":
		if v < 1 || v != math.Trunc(v) {
			return errorf("replicate=%v: want a whole number of copies >= 1", v)
		}
	default:
		return errorf("unknown transform %q (want swap, rewire, dropout, remove, attack, loops or replicate)", t.Name)
	}
	return nil
}

// Apply returns the variant of g the transform makes, drawing from rng.
func (t Transform) Apply(g *structural.Network, rng *rand.Rand) (*structural.Network, error) {
	if err := t.check(); err != nil {
		return nil, err
	}
	switch t.Name {
	case "swap":
		return SwapEdges(g, t.Value, rng)
	case "rewire":
		return RewireEdges(g, t.Value, rng)
	case "dropout":
		return DropEdges(g, t.Value, rng)
	case "remove":
		return RemoveStates(g, t.Value, rng)
	case "attack":
		return AttackStates(g, t.Value, rng)
	case "loops":
		return AddSelfLoops(g, t.Value, rng)
	case "replicate":
		return Replicate(g, int(t.Value), t.Coupling)
	}
	return nil, errorf("unknown transform %q", t.Name)
}

// edgeArrays returns g's edges as parallel slices (and weights, or nil).
func edgeArrays(g *structural.Network) (src, dst []int32, w []float64) {
	m := g.Edges()
	src = make([]int32, m)
	dst = make([]int32, m)
	copy(dst, g.Out().Adj)
	for u := 0; u < g.N(); u++ {
		for k := g.Out().Ptr[u]; k < g.Out().Ptr[u+1]; k++ {
			src[k] = int32(u)
		}
	}
	if g.Weights() != nil {
		w = append([]float64(nil), g.Weights()...)
	}
	return src, dst, w
}

// edgeSet is an open-addressing hash set of edges u -> v (linear probing,
// deletion by backward shift), sized once for its capacity.
type edgeSet struct {
	slot  []uint64
	shift uint
}

const emptySlot = math.MaxUint64

func newEdgeSet(capacity int) *edgeSet {
	size := 1 << bits.Len(uint(2*capacity+16))
	s := &edgeSet{slot: make([]uint64, size), shift: uint(64 - bits.TrailingZeros(uint(size)))}
	for i := range s.slot {
		s.slot[i] = emptySlot
	}
	return s
}

func edgeKey(u, v int32) uint64 { return uint64(u)<<32 | uint64(uint32(v)) }

func (s *edgeSet) home(k uint64) int { return int((k * 0x9e3779b97f4a7c15) >> s.shift) }

func (s *edgeSet) has(u, v int32) bool {
	k := edgeKey(u, v)
	mask := len(s.slot) - 1
	for i := s.home(k); ; i = (i + 1) & mask {
		switch s.slot[i] {
		case k:
			return true
		case emptySlot:
			return false
		}
	}
}

func (s *edgeSet) add(u, v int32) {
	k := edgeKey(u, v)
	mask := len(s.slot) - 1
	for i := s.home(k); ; i = (i + 1) & mask {
		switch s.slot[i] {
		case k:
			return
		case emptySlot:
			s.slot[i] = k
			return
		}
	}
}

func (s *edgeSet) remove(u, v int32) {
	k := edgeKey(u, v)
	mask := len(s.slot) - 1
	i := s.home(k)
	for s.slot[i] != k {
		if s.slot[i] == emptySlot {
			return
		}
		i = (i + 1) & mask
	}
	// Backward-shift deletion: move later entries of the run into the gap
	// when their home does not lie cyclically in (gap, j].
	gap := i
	for j := (i + 1) & mask; s.slot[j] != emptySlot; j = (j + 1) & mask {
		h := s.home(s.slot[j])
		if (j > gap && (h <= gap || h > j)) || (j < gap && h <= gap && h > j) {
			s.slot[gap] = s.slot[j]
			gap = j
		}
	}
	s.slot[gap] = emptySlot
}

var errNoStates = errorf("the variant has no states left")
