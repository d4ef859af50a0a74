package numeric

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/matching"
)

// The estimate follows the work model r·(E + r·n/2): doubling n with r = n
// and E proportional to n multiplies it by about eight, and memory by about
// four (common practice for dense elimination; no timing involved).
func TestEstimateScaling(t *testing.T) {
	e1 := estimateExact(1000, 3000, []int{1000}, []int{10}, 1, 1)
	e2 := estimateExact(2000, 6000, []int{2000}, []int{20}, 1, 1)
	if e1.Seconds <= 0 || e1.Bytes <= 0 {
		t.Fatalf("estimate %+v", e1)
	}
	r := e2.Seconds / e1.Seconds
	if r < 6 || r > 14 { // 8, times the cache factor step
		t.Errorf("time ratio %.2f, want about 8", r)
	}
	if rm := e2.Bytes / e1.Bytes; rm < 3.5 || rm > 4.5 {
		t.Errorf("memory ratio %.2f, want about 4", rm)
	}
	// Two workers for three trials take two rounds.
	e3 := estimateExact(1000, 3000, []int{1000}, []int{10}, 3, 2)
	if e3.Seconds/e1.Seconds < 1.9 || e3.Seconds/e1.Seconds > 2.1 || e3.Bytes != 2*e1.Bytes {
		t.Errorf("3 trials on 2 workers: %+v against %+v", e3, e1)
	}
}

// Two million states: the refusal must say years and tebibytes, not
// "under a second" (a time.Duration overflows past 292 years). By the work
// model with r = n = 2·10^6 and E = 10^7 the elimination alone is
// r²n/2 = 4·10^18 multiply-adds, over a century at a nanosecond each, and
// the basis r·n words = 32 TB, doubled for the collector (arithmetic by
// hand). The refusal comes from the counts alone, before any network.
func TestSizeErrorTwoMillion(t *testing.T) {
	c := Counts{States: 2_000_000, Edges: 10_000_000, Inputs: 100}
	err := CheckSize(c, Request{Trials: 1})
	var se *SizeError
	if !errors.As(err, &se) {
		t.Fatalf("CheckSize: %v, want a *SizeError", err)
	}
	const year = 365.25 * 86400
	ops := 4e18
	if se.Estimate.Operations < ops || se.Estimate.Seconds < ops*0.05e-9 {
		t.Errorf("estimate %+v below the elimination alone", se.Estimate)
	}
	if se.Estimate.Bytes < 2*2e6*2e6*8 {
		t.Errorf("memory %g below the basis", se.Estimate.Bytes)
	}
	msg := se.Error()
	if !strings.Contains(msg, "years") || !strings.Contains(msg, "TiB") || strings.Contains(msg, "under a second") {
		t.Errorf("message %q", msg)
	}
	if se.Estimate.Seconds < year {
		t.Errorf("%g s is less than a year", se.Estimate.Seconds)
	}
	if CheckSize(Counts{States: 2000, Edges: 10000, Inputs: 3}, Request{}) != nil {
		t.Errorf("2000 states refused at the default limit")
	}
}

// The human forms of times and sizes across their ranges (common practice).
func TestFormat(t *testing.T) {
	for _, tc := range []struct {
		s    float64
		want string
	}{{0.2, "under a second"}, {42, "42 s"}, {600, "10 min"}, {3 * 3600, "3 h"}, {5 * 86400, "5 days"}, {3e9, "95 years"}, {math.Inf(1), "an unknown time"}} {
		if got := FormatSeconds(tc.s); got != tc.want {
			t.Errorf("FormatSeconds(%g) = %q, want %q", tc.s, got, tc.want)
		}
	}
	for _, tc := range []struct {
		b    float64
		want string
	}{{1000, "1 KiB"}, {3 << 20, "3 MiB"}, {5 << 30, "5 GiB"}, {64e12, "58.2 TiB"}, {3 << 50, "3 PiB"}} {
		if got := FormatBytes(tc.b); got != tc.want {
			t.Errorf("FormatBytes(%g) = %q, want %q", tc.b, got, tc.want)
		}
	}
}

// Example: a ring of four states driven at one of them is controllable
// (the cycle covers every state and the input reaches it; common
// practice), and a sample of it
// has the full dimension.
func ExampleDimension() {
	out := matching.FromEdges(4, 4, []int32{0, 1, 2, 3}, []int32{1, 2, 3, 0})
	p := &Pattern{Out: out, Signals: [][]int32{{0}}}
	x := DrawExact(p, NewField(Mersenne61), rand.New(rand.NewPCG(1, 2)))
	fmt.Println(Dimension(p, x, false, nil), "of", p.N())
	// Output: 4 of 4
}
