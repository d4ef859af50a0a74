package numeric

import "github.com/netsteer/netsteer/structural/internal/uerr"

// errorf returns an error whose Message method gives its text without
// package names.
func errorf(format string, args ...any) error { return uerr.Errorf("numeric", format, args...) }
