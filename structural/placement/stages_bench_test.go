package placement

import (
	"fmt"
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/gen"
	"github.com/netsteer/netsteer/structural/internal/testnet"
)

// BenchmarkPlaceStages times the placement questions on the comparison
// workload (directed ER, <k> = 10, gen.Workload("er", N) with seed 1) at
// N = 2.5*10^5 .. 4*10^6 states, every iteration on a fresh copy of the
// network (its matching and components are computed inside the timing):
//
//   - place-unit: the fewest dedicated actuators (unit costs);
//   - place-costs: the cheapest ones with costs drawn from 1..1000 (seed 3);
//   - sensors: the fewest dedicated sensors (the transposed network);
//   - complete: the cheapest actuators completing every other signal of a
//     minimum design (unit costs), what check adds to a failing design.
//
// Run one size at a time on a quiet machine, e.g.
//
//	go test ./structural/placement -run '^$' -bench 'PlaceStages/.*/N=1000000$' -benchtime 3x
func BenchmarkPlaceStages(b *testing.B) {
	for _, n := range testnet.StageSizes {
		var g *structural.Network
		var half structural.Design
		var costs structural.Devices
		run := func(name string, f func(h *structural.Network) (*Placement, error)) {
			b.Run(fmt.Sprintf("%s/N=%d", name, n), func(b *testing.B) {
				if g == nil {
					g = testnet.Workload(b, "er", n)
					_, half = testnet.Designs(b, g)
					rng := gen.NewRand(3)
					costs.Cost = make([]structural.Cost, g.N())
					for v := range costs.Cost {
						costs.Cost[v] = structural.Cost(1+rng.Int64N(1000)) * structural.Unit
					}
				}
				for b.Loop() {
					b.StopTimer()
					h := testnet.Fresh(b, g)
					b.StartTimer()
					if pl, err := f(h); err != nil || !pl.Feasible {
						b.Fatalf("%v %+v", err, pl)
					}
				}
				b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(g.Edges()), "ns/edge")
			})
		}
		run("place-unit", func(h *structural.Network) (*Placement, error) {
			return Place(h, structural.Controllability, structural.Devices{})
		})
		run("place-costs", func(h *structural.Network) (*Placement, error) {
			return Place(h, structural.Controllability, costs)
		})
		run("sensors", func(h *structural.Network) (*Placement, error) {
			return Place(h, structural.Observability, structural.Devices{})
		})
		run("complete", func(h *structural.Network) (*Placement, error) {
			d, err := structural.NewDesign(h, half.Signals(), nil)
			if err != nil {
				return nil, err
			}
			return Complete(h, structural.Controllability, d, structural.Devices{})
		})
	}
}
