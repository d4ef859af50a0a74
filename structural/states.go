package structural

import (
	"errors"
	"fmt"
	"slices"
	"unicode/utf8"

	"github.com/netsteer/netsteer/structural/internal/names"
)

// States is a list of states of one network. Results hold their state
// lists as States, so that a result marshals to JSON with the states'
// names (written without building a string per name) while a Go program
// reads their indices.
type States struct {
	ids   []int32
	names *names.Table
}

// States returns the list ids of states of g. The slice is kept, not
// copied.
func (g *Network) States(ids []int32) States { return States{ids: ids, names: g.names} }

// Len returns the number of states in the list.
func (s States) Len() int { return len(s.ids) }

// At returns the i-th state.
func (s States) At(i int) int32 { return s.ids[i] }

// IDs returns the states' indices. The slice is shared and must not be
// modified.
func (s States) IDs() []int32 { return s.ids }

// Name returns the name of the i-th state.
func (s States) Name(i int) string { return s.names.Name(s.ids[i]) }

// Names returns the states' names.
func (s States) Names() []string {
	out := make([]string, len(s.ids))
	for i, v := range s.ids {
		out[i] = s.names.Name(v)
	}
	return out
}

// MarshalJSON writes the states' names as a JSON array of strings; an
// empty list is [], never null.
func (s States) MarshalJSON() ([]byte, error) { return marshalVia(s) }

// AppendJSONString appends s as a JSON string, escaped as encoding/json
// escapes it (HTML characters and U+2028/U+2029 included); invalid UTF-8
// bytes become U+FFFD.
func AppendJSONString[T string | []byte](b []byte, s T) []byte {
	const hex = "0123456789abcdef"
	b = append(b, '"')
	run := 0 // s[run:i] is copied as it is
	for i := 0; i < len(s); {
		c := s[i]
		if jsonPlain[c] {
			i++
			continue
		}
		if c >= utf8.RuneSelf {
			r, size := utf8.DecodeRuneInString(string(s[i:min(i+utf8.UTFMax, len(s))]))
			invalid := r == utf8.RuneError && size == 1
			if !invalid && r != '\u2028' && r != '\u2029' {
				i += size // a rune written as it is
				continue
			}
			b = append(b, s[run:i]...)
			if invalid {
				b = append(b, `\ufffd`...)
			} else {
				b = append(b, '\\', 'u', '2', '0', '2', hex[r&0xf])
			}
			i += size
			run = i
			continue
		}
		b = append(b, s[run:i]...)
		switch c {
		case '"', '\\':
			b = append(b, '\\', c)
		case '\b':
			b = append(b, '\\', 'b')
		case '\f':
			b = append(b, '\\', 'f')
		case '\n':
			b = append(b, '\\', 'n')
		case '\r':
			b = append(b, '\\', 'r')
		case '\t':
			b = append(b, '\\', 't')
		default: // control characters and <, >, &
			b = append(b, '\\', 'u', '0', '0', hex[c>>4], hex[c&0xf])
		}
		i++
		run = i
	}
	b = append(b, s[run:]...)
	return append(b, '"')
}

// Design is a set of independent signals on one network: the inputs
// (columns of B) of a controllability question, each driving the states it
// lists, or the outputs (rows of C) of an observability question, each
// sensing its states. A signal on one state is a dedicated actuator
// (sensor). Build one with NewDesign; io/design reads one from a file.
type Design struct {
	signals [][]int32
	lines   []int
	names   *names.Table
	n       int
}

// NewDesign returns the design whose signal i touches the states
// signals[i] of g. lines, when not nil, gives the design-file line of each
// signal, for messages and witnesses. The slices are kept, not copied.
func NewDesign(g *Network, signals [][]int32, lines []int) (Design, error) {
	if lines != nil && len(lines) != len(signals) {
		return Design{}, errors.New("structural: design lines and signals differ in length")
	}
	n := g.N()
	for i, s := range signals {
		for _, v := range s {
			if v < 0 || int(v) >= n {
				return Design{}, fmt.Errorf("structural: design signal %d touches state %d, not in [0,%d)", i+1, v, n)
			}
		}
	}
	return Design{signals: signals, lines: lines, names: g.names, n: n}, nil
}

// Dedicated returns the design with one signal on each of the states.
func Dedicated(g *Network, states []int32) (Design, error) {
	sig := make([][]int32, len(states))
	for i := range states {
		sig[i] = states[i : i+1 : i+1]
	}
	return NewDesign(g, sig, nil)
}

// Len returns the number of signals.
func (d Design) Len() int { return len(d.signals) }

// Signal returns the states that signal i touches. The slice is shared and
// must not be modified.
func (d Design) Signal(i int) []int32 { return d.signals[i] }

// Signals returns every signal's states. Shared; do not modify.
func (d Design) Signals() [][]int32 { return d.signals }

// Line returns the design-file line signal i was read from, or 0.
func (d Design) Line(i int) int {
	if d.lines == nil {
		return 0
	}
	return d.lines[i]
}

// Number returns how a signal is named to a reader: its design-file line
// when the design was read from a file, its 1-based position otherwise.
func (d Design) Number(i int) int {
	if d.lines == nil {
		return i + 1
	}
	return d.lines[i]
}

// Touched returns the states some signal touches, each once, in increasing
// order.
func (d Design) Touched() []int32 {
	seen := make([]bool, d.n)
	var out []int32
	for _, s := range d.signals {
		for _, v := range s {
			if !seen[v] {
				seen[v] = true
				out = append(out, v)
			}
		}
	}
	slices.Sort(out)
	return out
}

// Of reports whether d can be used with g: it was made for the states of
// g, or it has no signals.
func (d Design) Of(g *Network) bool {
	return len(d.signals) == 0 || (d.names == g.names && d.n == g.N())
}

// ErrForeignDesign is returned when a design made for one network is used
// with another.
var ErrForeignDesign = errors.New("structural: the design was made for another network")

// With returns the design with the dedicated signals on states appended
// (lines 0). The receiver is not changed.
func (d Design) With(states []int32) Design {
	sig := append(append([][]int32(nil), d.signals...), make([][]int32, len(states))...)
	for i := range states {
		sig[len(d.signals)+i] = states[i : i+1 : i+1]
	}
	var lines []int
	if d.lines != nil {
		lines = append(append([]int(nil), d.lines...), make([]int, len(states))...)
	}
	return Design{signals: sig, lines: lines, names: d.names, n: d.n}
}

// Without returns the design with signal i removed.
func (d Design) Without(i int) Design {
	sig := append(append([][]int32(nil), d.signals[:i]...), d.signals[i+1:]...)
	var lines []int
	if d.lines != nil {
		lines = append(append([]int(nil), d.lines[:i]...), d.lines[i+1:]...)
	}
	return Design{signals: sig, lines: lines, names: d.names, n: d.n}
}

// MarshalJSON writes the design as an array of signals, each the array of
// the names of its states.
func (d Design) MarshalJSON() ([]byte, error) { return marshalVia(d) }

// NameOf returns the name of state v of the list's network (any state,
// not only the listed ones).
func (s States) NameOf(v int32) string { return s.names.Name(v) }
