package gen

import (
	"errors"
	"fmt"
)

// Error is a problem with what the caller asked for. Message is its text
// without the package name, for a program to word.
type Error struct {
	msg string
	err error
}

func (e *Error) Error() string   { return "gen: " + e.msg }
func (e *Error) Message() string { return e.msg }
func (e *Error) Unwrap() error   { return e.err }

func errorf(format string, args ...any) error {
	err := fmt.Errorf(format, args...)
	return &Error{msg: err.Error(), err: errors.Unwrap(err)}
}
