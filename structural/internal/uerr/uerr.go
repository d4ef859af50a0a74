// Package uerr makes the errors the structural packages return for what a
// caller asked: their Error text starts with the package's name, as Go
// errors do, and their Message is the text without package names, for a
// program (the command line) to word.
package uerr

import "fmt"

// Error is a problem with what the caller asked for.
type Error struct {
	pkg string
	msg string
	err error
}

func (e *Error) Error() string   { return e.pkg + ": " + e.msg }
func (e *Error) Message() string { return e.msg }
func (e *Error) Unwrap() error   { return e.err }

// plain shows a wrapped error by its message when it has one.
type plain struct{ error }

func (p plain) Error() string {
	if m, ok := p.error.(interface{ Message() string }); ok {
		return m.Message()
	}
	return p.error.Error()
}

// Errorf formats an Error of package pkg; an error argument is shown by
// its Message and the one for %w is wrapped.
func Errorf(pkg, format string, args ...any) error {
	var wrapped error
	shown := make([]any, len(args))
	for i, a := range args {
		shown[i] = a
		if err, ok := a.(error); ok {
			shown[i] = plain{err}
			wrapped = err
		}
	}
	return &Error{pkg: pkg, msg: fmt.Sprintf(replaceW(format), shown...), err: wrapped}
}

// replaceW turns %w into %v for Sprintf.
func replaceW(format string) string {
	b := []byte(format)
	for i := 0; i+1 < len(b); i++ {
		if b[i] == '%' {
			if b[i+1] == 'w' {
				b[i+1] = 'v'
			}
			i++
		}
	}
	return string(b)
}
