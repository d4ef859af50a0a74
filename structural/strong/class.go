package strong

import (
	"errors"
	"fmt"
	"strings"

	"github.com/netsteer/netsteer/structural"
)

// Kind is what the class of systems allows one entry of A (or B, C) to
// be: the zero / nonzero / arbitrary entries of the pattern matrices of
// Jia, van Waarde, Trentelman & Camlibel, "A unifying framework for strong
// structural controllability", IEEE TAC 66(1):391-398, 2021.
type Kind uint8

const (
	// Zero: the entry is exactly zero.
	Zero Kind = iota
	// Nonzero: the entry takes any nonzero value.
	Nonzero
	// Arbitrary: the entry takes any value, zero included.
	Arbitrary
)

// String returns "zero", "nonzero" or "arbitrary".
func (k Kind) String() string {
	switch k {
	case Zero:
		return "zero"
	case Nonzero:
		return "nonzero"
	}
	return "arbitrary"
}

// ParseKind reads the kind of one listed edge from a file token: "*" or
// "nonzero" for a coupling that is never zero, "?" or "arbitrary" for one
// that may be zero. Case is ignored. The command line does not use it (its
// --may-be-zero file lists the edges that may be zero); it is for Go
// programs that mark edges in files of their own.
func ParseKind(tok string) (Kind, error) {
	switch strings.ToLower(tok) {
	case "*", "nonzero":
		return Nonzero, nil
	case "?", "arbitrary":
		return Arbitrary, nil
	}
	return 0, fmt.Errorf("strong: edge kind %q is not one of *, nonzero, ?, arbitrary", tok)
}

// Diagonal says what the diagonal entries A[v][v] that the network does
// not list (states without a self-loop) are. A listed self-loop is always a
// nonzero entry unless it is marked as may-be-zero.
type Diagonal uint8

const (
	// FreeDiagonal: an unlisted self-dynamics may be zero or not
	// (Arbitrary). It is the zero value because it is the widest class: a
	// design strongly controllable under it is so under the other two.
	FreeDiagonal Diagonal = iota
	// ZeroDiagonal: an unlisted self-dynamics is exactly zero (the loop
	// graphs of Trefois & Delvenne 2015; the zero/nonzero patterns of
	// Mayeda & Yamada 1979 and Jarczyk, Svaricek & Alt 2011).
	ZeroDiagonal
	// NonzeroDiagonal: every unlisted self-dynamics is nonzero (every
	// state has its own damping or decay of unknown size).
	NonzeroDiagonal
)

// String returns "free", "zero" or "nonzero".
func (d Diagonal) String() string {
	switch d {
	case ZeroDiagonal:
		return "zero"
	case NonzeroDiagonal:
		return "nonzero"
	}
	return "free"
}

// ParseDiagonal reads "free", "zero" or "nonzero".
func ParseDiagonal(s string) (Diagonal, error) {
	switch strings.ToLower(s) {
	case "free":
		return FreeDiagonal, nil
	case "zero":
		return ZeroDiagonal, nil
	case "nonzero":
		return NonzeroDiagonal, nil
	}
	return 0, fmt.Errorf("strong: diagonal %q is not one of free, zero, nonzero", s)
}

// kind returns the Kind an unlisted diagonal entry has.
func (d Diagonal) kind() Kind {
	switch d {
	case ZeroDiagonal:
		return Zero
	case NonzeroDiagonal:
		return Nonzero
	}
	return Arbitrary
}

// Class is the class of systems dx/dt = A x + B u (y = C x) a strong
// question is asked about, with the edge convention of package structural
// (u -> v listed: A[v][u] is an entry of the pattern):
//
//   - every listed edge, self-loops included, is a Nonzero entry, unless
//     MayBeZero marks it Arbitrary;
//   - every unlisted off-diagonal entry is exactly zero;
//   - every unlisted diagonal entry is of the kind Diagonal says;
//   - every entry of B (C) on a state a signal lists is Nonzero, every
//     other entry zero.
//
// The zero Class is the widest of the common classes: listed edges
// nonzero, self-dynamics free.
type Class struct {
	// Diagonal is the kind of the diagonal entries the network does not
	// list.
	Diagonal Diagonal
	// MayBeZero, when not nil, has one entry per edge of the network,
	// aligned with g.Out().Adj: true marks an edge whose coupling may be
	// zero (Arbitrary). nil marks none.
	MayBeZero []bool
}

// ErrMarks is returned when Class.MayBeZero does not have one entry per
// edge of the network.
var ErrMarks = errors.New("strong: may-be-zero marks differ in length from the network's edges")

// Check reports an error when c cannot be used with g.
func (c Class) Check(g *structural.Network) error {
	if c.MayBeZero != nil && len(c.MayBeZero) != g.Edges() {
		return ErrMarks
	}
	if c.Diagonal > NonzeroDiagonal {
		return fmt.Errorf("strong: unknown diagonal class %d", c.Diagonal)
	}
	return nil
}

// Marked returns the number of edges marked as may-be-zero.
func (c Class) Marked() int {
	k := 0
	for _, m := range c.MayBeZero {
		if m {
			k++
		}
	}
	return k
}

// Marks returns the per-edge marks (aligned with g.Out().Adj) for the
// edges listed in pairs (u acts on v), for building a Class in programs
// and tests. An edge that g does not have is an error.
func Marks(g *structural.Network, pairs []structural.Edge) ([]bool, error) {
	marks := make([]bool, g.Edges())
	out := g.Out()
	for _, e := range pairs {
		if e.From < 0 || int(e.From) >= g.N() || e.To < 0 || int(e.To) >= g.N() {
			return nil, fmt.Errorf("strong: edge %d -> %d is outside the network", e.From, e.To)
		}
		row := out.Adj[out.Ptr[e.From]:out.Ptr[e.From+1]]
		k, ok := search(row, e.To)
		if !ok {
			return nil, fmt.Errorf("strong: %s -> %s is not an edge of the network", g.Name(e.From), g.Name(e.To))
		}
		marks[out.Ptr[e.From]+int64(k)] = true
	}
	return marks, nil
}

// search returns the position of x in the sorted row.
func search(row []int32, x int32) (int, bool) {
	lo, hi := 0, len(row)
	for lo < hi {
		m := int(uint(lo+hi) >> 1)
		if row[m] < x {
			lo = m + 1
		} else {
			hi = m
		}
	}
	return lo, lo < len(row) && row[lo] == x
}
