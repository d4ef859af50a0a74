package strong

import (
	"fmt"
	"math/rand/v2"
	"runtime"
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/gen"
)

// benchNet draws a directed Erdős–Rényi network G(n, l) (or the static
// scale-free model with both exponents 2.5) with a fixed seed.
func benchNet(b *testing.B, model string, n int, l int64) *structural.Network {
	b.Helper()
	bl := structural.NewIntBuilder(n, 0)
	bl.Grow(int(l))
	rng := gen.NewRand(1)
	var err error
	if model == "er" {
		err = gen.ER(n, l, rng, bl)
	} else {
		err = gen.ScaleFree(n, l, 2.5, 2.5, rng, bl)
	}
	if err != nil {
		b.Fatal(err)
	}
	g, err := bl.Build(structural.BuildOptions{})
	if err != nil {
		b.Fatal(err)
	}
	return g
}

// Check on networks of up to 10^7 edges (mean degree 20), for the design
// of the generic driver nodes (not strong: the colouring stops early and a
// witness is built, shrunk and confirmed, or refused at the default size
// limit) and for one actuator on every state (strong: every state
// coloured, both tests run to the end), with free and with zero
// self-dynamics (one colouring, or two); and Lin's generic test
// (structural.Check) on the same design in the same run, for the ratio.
// cpu-ms/op is the calling thread's CPU time (Linux), steadier than wall
// time on a shared machine; the generic test's matching is sequential
// too.
func BenchmarkCheck(b *testing.B) {
	for _, c := range []struct {
		model string
		n     int
		l     int64
	}{{"er", 100_000, 1_000_000}, {"er", 1_000_000, 10_000_000}, {"scale-free", 1_000_000, 10_000_000}} {
		g := benchNet(b, c.model, c.n, c.l)
		all := make([]int32, g.N())
		for i := range all {
			all[i] = int32(i)
		}
		full, _ := structural.Dedicated(g, all)
		designs := []struct {
			name string
			d    structural.Design
		}{{"drivers", structural.Drivers(g).Inputs}, {"all", full}}
		for _, ds := range designs {
			for _, diag := range []Diagonal{FreeDiagonal, ZeroDiagonal} {
				b.Run(fmt.Sprintf("%s/E=%.0e/%s/%s", c.model, float64(g.Edges()), ds.name, diag), func(b *testing.B) {
					var r *Result
					runtime.LockOSThread()
					defer runtime.UnlockOSThread()
					cpu := threadCPU()
					for i := 0; i < b.N; i++ {
						var err error
						if r, err = Check(g, Request{Design: ds.d, Class: Class{Diagonal: diag}}); err != nil {
							b.Fatal(err)
						}
					}
					b.ReportMetric(float64(threadCPU()-cpu)/float64(b.N)/1e6, "cpu-ms/op")
					b.ReportMetric(float64(r.AtZero.Forced), "forced")
				})
			}
			b.Run(fmt.Sprintf("%s/E=%.0e/%s/generic", c.model, float64(g.Edges()), ds.name), func(b *testing.B) {
				runtime.LockOSThread()
				defer runtime.UnlockOSThread()
				cpu := threadCPU()
				for i := 0; i < b.N; i++ {
					if _, err := structural.Check(g, structural.Controllability, ds.d); err != nil {
						b.Fatal(err)
					}
				}
				b.ReportMetric(float64(threadCPU()-cpu)/float64(b.N)/1e6, "cpu-ms/op")
			})
		}
	}
}

// Place with the heuristic alone on ER networks of mean degree 4 up to
// 2·10^6 edges, reporting the devices, the generic lower bound and the
// gap.
func BenchmarkPlaceHeuristic(b *testing.B) {
	for _, n := range []int{10_000, 100_000, 1_000_000} {
		g := benchNet(b, "er", n, int64(2*n))
		b.Run(fmt.Sprintf("N=%.0e/E=%.0e", float64(n), float64(g.Edges())), func(b *testing.B) {
			var pl *Placement
			runtime.LockOSThread()
			defer runtime.UnlockOSThread()
			cpu := threadCPU()
			for i := 0; i < b.N; i++ {
				var err error
				if pl, err = Place(g, PlaceRequest{ExactStates: -1}); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(threadCPU()-cpu)/float64(b.N)/1e6, "cpu-ms/op")
			b.ReportMetric(float64(pl.Added.Len()), "devices")
			b.ReportMetric(float64(pl.GenericDevices), "generic")
			b.ReportMetric(float64(pl.Gap/structural.Unit), "gap")
		})
	}
}

// The exact search on random sparse networks of 30 and 60 states (mean
// out-degree 2.5), reporting nodes and whether it finished.
func BenchmarkPlaceExact(b *testing.B) {
	for _, n := range []int{30, 60} {
		rng := rand.New(rand.NewPCG(uint64(n), 1))
		bl := structural.NewIntBuilder(n, 0)
		for i := 0; i < 5*n/2; i++ {
			bl.AddEdge(int32(rng.IntN(n)), int32(rng.IntN(n)))
		}
		g, err := bl.Build(structural.BuildOptions{})
		if err != nil {
			b.Fatal(err)
		}
		b.Run(fmt.Sprintf("N=%d/E=%d", n, g.Edges()), func(b *testing.B) {
			var pl *Placement
			for i := 0; i < b.N; i++ {
				if pl, err = Place(g, PlaceRequest{}); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(pl.SearchNodes), "nodes")
			b.ReportMetric(float64(pl.Added.Len()), "devices")
			opt := 0.0
			if pl.Optimal {
				opt = 1
			}
			b.ReportMetric(opt, "optimal")
		})
	}
}
