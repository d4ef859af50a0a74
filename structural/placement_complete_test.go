package structural

import (
	"fmt"
	"math/bits"
	"math/rand/v2"
	"testing"
)

// withSignals extends the Lin's-theorem oracle with multi-state signals:
// sig[i] is the mask of states signal i drives (or senses).
func (o *plOracle) withSignals(sig []uint32, s uint32, sensors bool) bool {
	var driven uint32
	for _, m := range sig {
		driven |= m
	}
	adj, nbr := o.out, o.nbrIn
	if sensors {
		adj, nbr = o.in, o.nbrOut
	}
	if o.closure(driven|s, adj) != o.full {
		return false
	}
	for x := uint32(1); x <= o.full; x++ {
		touch := 0
		for _, m := range sig {
			if m&x != 0 {
				touch++
			}
		}
		if int(o.popX[x]) > bits.OnesCount32(nbr[x])+touch+bits.OnesCount32(x&s) {
			return false
		}
	}
	return true
}

// Source: brute force over every set of added dedicated devices, with the
// design's own signals, by the oracle above (Lin 1974).
func TestCompleteBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(17, 4))
	for i := 0; i < 300; i++ {
		n := 2 + rng.IntN(7)
		g := plRandom(t, rng, n, 0.2)
		o := newPlOracle(g)
		d := randomDevices(rng, n, []int64{0, 4}[i%2], []float64{0, 0.25}[i/2%2], []float64{0, 0.2}[i/4%2])
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
			complete := CompleteActuators
			if sensors {
				complete = CompleteSensors
			}
			pl, err := complete(g, signals, d)
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
			for s := uint32(0); s <= o.full; s++ {
				if s&must != must || s&banned != 0 || !o.withSignals(masks, s, sensors) {
					continue
				}
				var c int64
				k := 0
				for v := 0; v < n; v++ {
					if s&^must&(1<<v) != 0 {
						k++
						c += map[bool]int64{true: 1, false: 0}[d.Cost == nil]
						if d.Cost != nil {
							c += d.Cost[v]
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
			if pl.Cost != bestCost || len(pl.Added) != bestCount {
				t.Fatalf("%s: cost %d with %d added, brute force %d with %d", label, pl.Cost, len(pl.Added), bestCost, bestCount)
			}
			if !o.withSignals(masks, maskOf(pl.Devices), sensors) {
				t.Fatalf("%s: completion %v fails", label, pl.Devices)
			}
			for _, r := range pl.Roles(5) {
				for _, y := range r.Alternatives {
					if int(y) >= n {
						t.Fatalf("%s: alternative %d is not a state", label, y)
					}
				}
			}
		}
	}
}
