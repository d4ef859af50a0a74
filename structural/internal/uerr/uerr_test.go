package uerr

import (
	"errors"
	"io/fs"
	"testing"
)

func TestErrorf(t *testing.T) {
	inner := Errorf("gen", "mean-degree %d is too large", 100)
	outer := Errorf("sweep", "grid point %s: %w", "n=10", inner)
	if got := outer.Error(); got != "sweep: grid point n=10: mean-degree 100 is too large" {
		t.Errorf("Error() = %q", got)
	}
	if got := outer.(*Error).Message(); got != "grid point n=10: mean-degree 100 is too large" {
		t.Errorf("Message() = %q", got)
	}
	if !errors.Is(outer, inner) {
		t.Error("the wrapped error is lost")
	}
	if e := Errorf("gen", "open: %w", fs.ErrNotExist); !errors.Is(e, fs.ErrNotExist) || e.Error() != "gen: open: file does not exist" {
		t.Errorf("%v", e)
	}
	if got := replaceW("100%% %w %d"); got != "100%% %v %d" {
		t.Errorf("replaceW = %q", got)
	}
}
