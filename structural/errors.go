package structural

import (
	"errors"
	"fmt"
	"strconv"
)

// TooLargeError reports a network beyond the size a computation supports.
type TooLargeError struct {
	What   string // the computation, e.g. "the controllable dimension"
	States int    // the network's states
	Limit  int    // the most states it supports
}

func (e *TooLargeError) Error() string {
	return fmt.Sprintf("structural: %s supports at most %d states, the network has %d", e.What, e.Limit, e.States)
}

// ErrEmpty is returned when a network would have no states.
var ErrEmpty = errors.New("structural: empty network")

// StateError is a problem with one named state.
type StateError struct {
	State string
	Msg   string
}

func (e *StateError) Error() string {
	return "structural: state " + strconv.Quote(e.State) + ": " + e.Msg
}

// WeightError reports an edge whose weight is not a finite number. The
// weights of repeated edges add up, so the sum of finite weights can
// overflow to ±Inf (or, for a weight given as ±Inf or NaN, be one).
type WeightError struct {
	From, To string  // the edge's states
	Sum      float64 // the weight, the sum of the repeated entries' weights
	Entries  int     // the entries of the edge added up to Sum, 1 when not repeated
	// Edge is the index, in the order the edges were added to the
	// Builder, of the entry that made the sum non-finite (for an
	// undirected build, of the input edge whose mirror did); -1 when not
	// known.
	Edge int64
}

func (e *WeightError) Error() string {
	if e.Entries > 1 {
		return fmt.Sprintf("structural: edge %s -> %s is repeated, and the weights of its first %d entries add up to %g, not a finite number (the weights of a repeated edge are added)",
			strconv.Quote(e.From), strconv.Quote(e.To), e.Entries, e.Sum)
	}
	return fmt.Sprintf("structural: edge %s -> %s has weight %g, not a finite number", strconv.Quote(e.From), strconv.Quote(e.To), e.Sum)
}
