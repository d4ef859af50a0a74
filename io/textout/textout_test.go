package textout

import (
	"bytes"
	"fmt"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/strong"
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

// TestStrongWitnessCapped checks that a strong witness with many signal
// entries is capped like its coupling entries, with a count of the rest,
// and listed in full with All.
func TestStrongWitnessCapped(t *testing.T) {
	const n = 300
	b := structural.NewIntBuilder(n, 1)
	for i := uint32(1); i < n; i++ {
		u, _ := b.InternInt(i)
		v, _ := b.InternInt(i + 1)
		b.AddEdge(u, v)
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	all := make([]int32, n)
	sig := make([]strong.SignalEntry, n)
	for i := range all {
		all[i] = int32(i)
		sig[i] = strong.SignalEntry{Signal: i + 1, State: int32(i), Value: 1}
	}
	res := &strong.Result{Property: structural.Controllability, AtZero: strong.Test{Unforced: g.States(all),
		Witness: &strong.Witness{Support: g.States(all), SignalEntries: sig, Confirmed: true}}, Unforced: g.States(all)}
	for _, c := range []struct {
		all        bool
		rows, more int
	}{{false, 120, n - 120}, {true, n, 0}} {
		var buf bytes.Buffer
		tw := newTW(&buf, Options{All: c.all, MoreHint: "--all lists them"})
		tw.strongDetails(structural.Controllability, res)
		tw.w.Flush()
		out := buf.String()
		if got := strings.Count(out, "        input "); got != c.rows {
			t.Errorf("all=%v: %d signal entries listed, want %d", c.all, got, c.rows)
		}
		more := fmt.Sprintf("(%d more input entries; --all lists them)", c.more)
		if strings.Contains(out, more) != (c.more > 0) {
			t.Errorf("all=%v: count of the rest %q given: %v, want %v", c.all, more, !(c.more > 0), c.more > 0)
		}
	}
}
