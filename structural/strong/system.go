package strong

import (
	"slices"

	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural"
)

// system is the pattern a strong question is decided on, in the
// orientation where the property is controllability: h is g for
// controllability and g.Transpose() for observability (A^T, C^T).
//
// The forcing tests read the pattern by columns. Column u (a state) holds
// the rows v with u -> v in h (the entries A[v][u]) and, when its diagonal
// kind is not Zero, the row u itself; column n+i holds the states signal i
// touches (B[v][i], all Nonzero).
type system struct {
	g, h *structural.Network
	prop structural.Property
	n, m int
	out  *matching.CSR // h.Out(): column u lists its off-diagonal rows
	in   *matching.CSR // h.In(): row v lists the columns holding it
	// outMark and inMark mark Arbitrary edges, aligned with out.Adj and
	// in.Adj; both nil when no edge is marked.
	outMark, inMark []bool
	// diag holds the kind of A[v][v]; shifted that of A[v][v] - λ for
	// λ != 0 (Zero -> Nonzero, Nonzero -> Arbitrary); shifted is nil when
	// every diagonal entry is Arbitrary, so that the two tests coincide.
	diag, shifted []Kind
	// sigStart/sigStates list the states of each signal (signal i is
	// sigStates[sigStart[i]:sigStart[i+1]]), sorted, without repeats;
	// sigPtr/sigAdj list, for each state, the signals touching it.
	sigStart  []int64
	sigStates []int32
	sigPtr    []int64
	sigAdj    []int32
}

func newSystem(g *structural.Network, p structural.Property, c Class, d structural.Design) *system {
	h := g
	if p == structural.Observability {
		h = g.Transpose()
	}
	s := &system{g: g, h: h, prop: p, n: g.N(), m: d.Len(), out: h.Out(), in: h.In()}
	if c.Marked() > 0 {
		tr := transposeMarks(g, c.MayBeZero)
		if p == structural.Observability {
			s.outMark, s.inMark = tr, c.MayBeZero
		} else {
			s.outMark, s.inMark = c.MayBeZero, tr
		}
	}
	n := s.n
	s.diag = make([]Kind, n)
	free := c.Diagonal.kind()
	allArbitrary := true
	for u := int32(0); int(u) < n; u++ {
		k := free
		lo := s.out.Ptr[u]
		if i, ok := search(s.out.Adj[lo:s.out.Ptr[u+1]], u); ok {
			k = Nonzero
			if s.outMark != nil && s.outMark[lo+int64(i)] {
				k = Arbitrary
			}
		}
		s.diag[u] = k
		allArbitrary = allArbitrary && k == Arbitrary
	}
	if !allArbitrary {
		s.shifted = make([]Kind, n)
		for u, k := range s.diag {
			switch k {
			case Zero:
				s.shifted[u] = Nonzero
			default:
				s.shifted[u] = Arbitrary
			}
		}
	}
	total := 0
	for _, sg := range d.Signals() {
		total += len(sg)
	}
	s.sigStart = make([]int64, s.m+1)
	s.sigStates = make([]int32, 0, total)
	s.sigPtr = make([]int64, n+1)
	for i, sg := range d.Signals() {
		lo := len(s.sigStates)
		s.sigStates = append(s.sigStates, sg...)
		if len(sg) > 1 {
			x := s.sigStates[lo:]
			slices.Sort(x)
			s.sigStates = s.sigStates[:lo+len(slices.Compact(x))]
		}
		s.sigStart[i+1] = int64(len(s.sigStates))
		for _, v := range s.sigStates[lo:] {
			s.sigPtr[v+1]++
		}
	}
	for v := 0; v < n; v++ {
		s.sigPtr[v+1] += s.sigPtr[v]
	}
	s.sigAdj = make([]int32, s.sigPtr[n])
	pos := slices.Clone(s.sigPtr[:n])
	for i := 0; i < s.m; i++ {
		for _, v := range s.signal(i) {
			s.sigAdj[pos[v]] = int32(i)
			pos[v]++
		}
	}
	return s
}

// transposeMarks returns marks aligned with g.In().Adj from marks aligned
// with g.Out().Adj. In row v lists the sources u in increasing order, the
// order in which a scan of Out row by row meets them.
func transposeMarks(g *structural.Network, marks []bool) []bool {
	out, in := g.Out(), g.In()
	n := g.N()
	pos := slices.Clone(in.Ptr[:n])
	t := make([]bool, len(marks))
	for u := 0; u < n; u++ {
		for k := out.Ptr[u]; k < out.Ptr[u+1]; k++ {
			v := out.Adj[k]
			t[pos[v]] = marks[k]
			pos[v]++
		}
	}
	return t
}

// signal returns the states of signal i.
func (s *system) signal(i int) []int32 { return s.sigStates[s.sigStart[i]:s.sigStart[i+1]] }

// kindOut returns the kind of the off-diagonal entry at out.Adj[k].
func (s *system) kindOut(k int64) Kind {
	if s.outMark != nil && s.outMark[k] {
		return Arbitrary
	}
	return Nonzero
}
