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
