package placement

import (
	"fmt"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/internal/testnet"
)

// Placement roles against brute force: a device is forced when every
// cheapest set holds it, and y is an alternative to x when S - x + y is a
// cheapest set.
func TestPlacementRolesBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 5))
	checked, forcedSeen, altSeen, moveTogether := 0, 0, 0, 0
	for i := 0; i < 500; i++ {
		n := 2 + rng.IntN(8)
		g := testnet.Random(t, rng, n, []float64{0.12, 0.2, 0.3}[i%3])
		o := testnet.NewOracle(g)
		d := testnet.RandomDevices(rng, n, []int64{0, 3, 2}[i%3], []float64{0, 0.2}[i%2], []float64{0, 0.15}[i/2%2])
		for _, sensors := range []bool{false, true} {
			prop := structural.Controllability
			if sensors {
				prop = structural.Observability
			}
			pl, err := Place(g, prop, d)
			if err != nil {
				t.Fatal(err)
			}
			label := fmt.Sprintf("trial %d (n=%d, sensors=%v)", i, n, sensors)
			want := checkPlacement(t, label, o, sensors, d, pl)
			if !want.Feasible {
				continue
			}
			s := testnet.MaskOf(pl.Devices.IDs())
			for _, r := range pl.Roles(100) {
				x := r.State
				forced := true
				for _, opt := range want.Optimal {
					if opt&(1<<x) == 0 {
						forced = false
					}
				}
				var alts []int32
				for y := int32(0); int(y) < n; y++ {
					if s&(1<<y) == 0 && slices.Contains(want.Optimal, s&^(1<<x)|1<<y) {
						alts = append(alts, y)
					}
				}
				if r.Forced != forced {
					t.Fatalf("%s: device on %d forced = %v, brute force %v (set %v, optimal sets %b)", label, x, r.Forced, forced, pl.Devices.IDs(), want.Optimal)
				}
				if !slices.Equal(r.Alternatives.IDs(), alts) || r.More {
					t.Fatalf("%s: device on %d alternatives %v (more %v), brute force %v (set %v)", label, x, r.Alternatives.IDs(), r.More, alts, pl.Devices.IDs())
				}
				checked++
				if !forced && len(alts) == 0 {
					moveTogether++
				}
				if forced {
					forcedSeen++
				}
				if len(alts) > 0 {
					altSeen++
				}
			}
		}
	}
	t.Logf("%d devices: %d forced, %d with alternatives, %d movable only with others", checked, forcedSeen, altSeen, moveTogether)
	if forcedSeen == 0 || altSeen == 0 || forcedSeen == checked {
		t.Fatalf("weak sample: %d devices, %d forced, %d with alternatives", checked, forcedSeen, altSeen)
	}
}
