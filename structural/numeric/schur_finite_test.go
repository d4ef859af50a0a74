package numeric

import (
	"math"
	"testing"
)

// A non-finite entry of A is refused before LAPACK sees it; the effort and
// the modes would otherwise read garbage blocks (an index out of range).
func TestNewSchurRefusesNonFinite(t *testing.T) {
	for _, x := range []float64{math.Inf(1), math.Inf(-1), math.NaN()} {
		a := []float64{-1, 0, x, -2}
		if _, err := newSchur(a, 2); err == nil {
			t.Errorf("entry %g: no error", x)
		}
	}
	if _, err := newSchur([]float64{-1, 0, 1, -2}, 2); err != nil {
		t.Errorf("finite A: %v", err)
	}
}
