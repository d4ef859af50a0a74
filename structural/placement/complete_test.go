package placement

import (
	"fmt"
	"math/rand/v2"
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/internal/testnet"
)

// Source: brute force over every set of added dedicated devices, with the
// design's own signals, by the oracle above (Lin 1974).
func TestCompleteBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(17, 4))
	for i := 0; i < 300; i++ {
		n := 2 + rng.IntN(7)
		g := testnet.Random(t, rng, n, 0.2)
		o := testnet.NewOracle(g)
		d := testnet.RandomDevices(rng, n, []int64{0, 4}[i%2], []float64{0, 0.25}[i/2%2], []float64{0, 0.2}[i/4%2])
		var signals [][]int32
		var masks []uint32
		for k := rng.IntN(3); k > 0; k-- {
			var s []int32
			var m uint32
			for v := 0; v < n; v++ {
				if rng.IntN(3) == 0 {
					s = append(s, int32(v))
					m |= 1 << v
				}
			}
			signals = append(signals, s)
			masks = append(masks, m)
		}
		for _, sensors := range []bool{false, true} {
			prop := structural.Controllability
			if sensors {
				prop = structural.Observability
			}
			pl, err := Complete(g, prop, testnet.Design(t, g, signals), d)
			if err != nil {
				t.Fatal(err)
			}
			label := fmt.Sprintf("trial %d (n=%d, sensors=%v, signals %v)", i, n, sensors, signals)
			var must, banned uint32
			for v := 0; v < n; v++ {
				if d.Existing != nil && d.Existing[v] {
					must |= 1 << v
				}
				if d.Forbidden != nil && d.Forbidden[v] {
					banned |= 1 << v
				}
			}
			feasible, bestCost, bestCount := false, int64(0), 0
			for s := uint32(0); s <= o.Full(); s++ {
				if s&must != must || s&banned != 0 || !o.WithSignals(masks, s, sensors) {
					continue
				}
				var c int64
				k := 0
				for v := 0; v < n; v++ {
					if s&^must&(1<<v) != 0 {
						k++
						if d.Cost == nil {
							c++
						} else {
							c += int64(d.Cost[v])
						}
					}
				}
				if !feasible || c < bestCost || c == bestCost && k < bestCount {
					feasible, bestCost, bestCount = true, c, k
				}
			}
			if pl.Feasible != feasible {
				t.Fatalf("%s: feasible %v, brute force %v", label, pl.Feasible, feasible)
			}
			if !feasible {
				continue
			}
			if pl.Cost != testnet.Units(d, bestCost) || len(pl.Added.IDs()) != bestCount {
				t.Fatalf("%s: cost %d with %d added, brute force %d with %d", label, pl.Cost, len(pl.Added.IDs()), bestCost, bestCount)
			}
			if !o.WithSignals(masks, testnet.MaskOf(pl.Devices.IDs()), sensors) {
				t.Fatalf("%s: completion %v fails", label, pl.Devices.IDs())
			}
			for _, r := range pl.Roles(5) {
				for _, y := range r.Alternatives.IDs() {
					if int(y) >= n {
						t.Fatalf("%s: alternative %d is not a state", label, y)
					}
				}
			}
		}
	}
}
