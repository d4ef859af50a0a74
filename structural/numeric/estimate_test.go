package numeric

import (
	"fmt"
	"math/rand/v2"
	"testing"

	"github.com/netsteer/netsteer/matching"
)

// The estimate follows the work model r·(E + r·n/2): doubling n with r = n
// and E proportional to n multiplies it by about eight, and memory by about
// four (common practice for dense elimination; no timing involved).
func TestEstimateScaling(t *testing.T) {
	d1, m1 := EstimateExact(1000, 3000, []int{1000}, 1, 1)
	d2, m2 := EstimateExact(2000, 6000, []int{2000}, 1, 1)
	if d1 <= 0 || m1 <= 0 {
		t.Fatalf("estimate %v, %d bytes", d1, m1)
	}
	r := float64(d2) / float64(d1)
	if r < 6 || r > 14 { // 8, times the cache factor step
		t.Errorf("time ratio %.2f, want about 8", r)
	}
	if rm := float64(m2) / float64(m1); rm < 3.5 || rm > 4.5 {
		t.Errorf("memory ratio %.2f, want about 4", rm)
	}
	// Two workers for three trials take two rounds.
	d3, m3 := EstimateExact(1000, 3000, []int{1000}, 3, 2)
	if float64(d3)/float64(d1) < 1.9 || float64(d3)/float64(d1) > 2.1 || m3 != 2*m1 {
		t.Errorf("3 trials on 2 workers: %v and %d bytes against %v and %d", d3, m3, d1, m1)
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
