package structural_test

import (
	"fmt"
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/internal/testnet"
)

// BenchmarkStages times each question of the commands on the comparison
// workload (directed ER, <k> = 10, gen.Workload("er", N) with seed 1) at
// N = 2.5*10^5 .. 4*10^6 states, every iteration on a fresh copy of the
// network, so that the matching and components a command computes are
// inside the timing (copying is not):
//
//   - drivers: structural.Drivers (matching, components, driver set);
//   - roles: Drivers, then StateRoles and EdgeRoles (drivers --roles);
//   - check-pass: Check of a minimum design;
//   - check-fail: Check of every other signal of it (the dimension runs);
//   - dimension: Dimension of that failing design alone.
//
// Run one size at a time on a quiet machine, e.g.
//
//	go test ./structural -run '^$' -bench 'Stages/.*/N=1000000$' -benchtime 3x
//
// Reading is timed in io/netread; placements in structural/placement
// (BenchmarkPlaceStages); cmd/netsteer-bench scale runs them all in
// separate processes with peak memory and the fitted exponents.
func BenchmarkStages(b *testing.B) {
	for _, n := range testnet.StageSizes {
		// The network and designs, made once per size when a benchmark
		// of that size runs.
		var g *structural.Network
		var full, half structural.Design
		run := func(name string, f func(h *structural.Network)) {
			b.Run(fmt.Sprintf("%s/N=%d", name, n), func(b *testing.B) {
				if g == nil {
					g = testnet.Workload(b, "er", n)
					full, half = testnet.Designs(b, g)
				}
				for b.Loop() {
					b.StopTimer()
					h := testnet.Fresh(b, g)
					b.StartTimer()
					f(h)
				}
				b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(g.Edges()), "ns/edge")
			})
		}
		on := func(h *structural.Network, d structural.Design) structural.Design {
			dd, err := structural.NewDesign(h, d.Signals(), nil)
			if err != nil {
				b.Fatal(err)
			}
			return dd
		}
		run("drivers", func(h *structural.Network) { structural.Drivers(h) })
		run("roles", func(h *structural.Network) {
			structural.Drivers(h)
			structural.StateRoles(h)
			structural.EdgeRoles(h)
		})
		run("check-pass", func(h *structural.Network) {
			if v, err := structural.Check(h, structural.Controllability, on(h, full)); err != nil || !v.Holds {
				b.Fatalf("%v %+v", err, v)
			}
		})
		run("check-fail", func(h *structural.Network) {
			if v, err := structural.Check(h, structural.Controllability, on(h, half)); err != nil || v.Holds {
				b.Fatalf("%v %+v", err, v)
			}
		})
		run("dimension", func(h *structural.Network) {
			if _, err := structural.Dimension(h, structural.Controllability, on(h, half)); err != nil {
				b.Fatal(err)
			}
		})
	}
}
