package textout

import (
	"bytes"
	"strings"
	"testing"
)

// TestCautionWrapsToWidth checks that the closing caution is wrapped to
// the report's width like every other paragraph (it was once wrapped by
// hand at 75 columns whatever the width), and keeps every word.
func TestCautionWrapsToWidth(t *testing.T) {
	for _, width := range []int{40, 60, 100, 160} {
		var b bytes.Buffer
		if err := newTW(&b, Options{Width: width}).done(); err != nil {
			t.Fatal(err)
		}
		lines := strings.Split(strings.TrimSpace(b.String()), "\n")
		longest := 0
		for _, l := range lines {
			if len(l) > width {
				t.Errorf("width %d: line %q is %d long", width, l, len(l))
			}
			longest = max(longest, len(l))
		}
		if got := strings.Join(strings.Fields(b.String()), " "); got != Caution {
			t.Errorf("width %d: caution reads %q, want %q", width, got, Caution)
		}
		// Greedy filling: no line could have taken the next word.
		for i := 0; i+1 < len(lines); i++ {
			next := strings.Fields(lines[i+1])[0]
			if len(lines[i])+1+len(next) <= width {
				t.Errorf("width %d: line %q could have taken %q", width, lines[i], next)
			}
		}
	}
}
