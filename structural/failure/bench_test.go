package failure_test

import (
	"fmt"
	"math/rand/v2"
	"testing"
	"time"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/failure"
	"github.com/netsteer/netsteer/structural/gen"
	"github.com/netsteer/netsteer/structural/placement"
)

// benchNet builds a fixed-seed network with the users' generators:
// directed Erdős–Rényi or static-model scale-free (gamma 2.5), mean total
// degree 10, so n states carry 5n edges.
func benchNet(b testing.TB, model string, n int) *structural.Network {
	p := gen.Params{Model: "er", Nodes: n, MeanDegree: 10}
	if model == "sf" {
		p = gen.Params{Model: "scale-free", Nodes: n, MeanDegree: 10, GammaOut: 2.5, GammaIn: 2.5}
	}
	g, err := p.Network(gen.NewRand(1))
	if err != nil {
		b.Fatal(err)
	}
	return g
}

// benchDesign is the cheapest dedicated placement (unit costs): a design
// that holds, with every device essential or close to it.
func benchDesign(b testing.TB, g *structural.Network, p structural.Property) structural.Design {
	pl, err := placement.Place(g, p, structural.Devices{})
	if err != nil || !pl.Feasible {
		b.Fatal("no placement", err)
	}
	d, err := structural.Dedicated(g, pl.Devices.IDs())
	if err != nil {
		b.Fatal(err)
	}
	return d
}

// BenchmarkAssess times every single-device and single-link loss of the
// cheapest dedicated actuator placement, or (under spare/) of that
// placement plus devices on one state in fifty drawn at random, so that
// many devices are useful or useless; and under states/ every state loss
// too. Each is timed against one structural.Check of the same design in the
// same run, each on a fresh copy of the network (nothing cached); ratio is
// Assess time over Check time (the target for devices and
// links is at most 10). Networks of 10^5 and 10^6 edges; the counts found
// are reported with the times.
func BenchmarkAssess(b *testing.B) {
	for _, model := range []string{"er", "sf"} {
		for _, n := range []int{20_000, 200_000} {
			g := benchNet(b, model, n)
			for _, variant := range []string{"", "spare/", "states/"} {
				d := benchDesign(b, g, structural.Controllability)
				if variant == "spare/" {
					rng := rand.New(rand.NewPCG(5, 5))
					extra := d.Touched()
					for k := 0; k < n/50; k++ {
						extra = append(extra, int32(rng.IntN(n)))
					}
					d, _ = structural.Dedicated(g, extra)
				}
				states := variant == "states/"
				b.Run(fmt.Sprintf("%s%s/edges=%d", variant, model, g.Edges()), func(b *testing.B) {
					var tc, ta time.Duration
					var as *failure.Assessment
					for i := 0; i < b.N; i++ {
						// A fresh copy of the network each time, so that
						// nothing it caches (its own matching) is reused.
						g, d := fresh(b, g, d)
						t0 := time.Now()
						if _, err := structural.Check(g, structural.Controllability, d); err != nil {
							b.Fatal(err)
						}
						t1 := time.Now()
						var err error
						as, err = failure.Assess(g, failure.Request{Design: d, States: states})
						if err != nil || !as.Intact.Holds {
							b.Fatal(err)
						}
						ta += time.Since(t1)
						tc += t1.Sub(t0)
					}
					b.ReportMetric(float64(tc.Nanoseconds())/float64(b.N)/1e6, "check-ms")
					b.ReportMetric(float64(ta.Nanoseconds())/float64(b.N)/1e6, "assess-ms")
					b.ReportMetric(float64(ta)/float64(tc), "ratio")
					b.ReportMetric(float64(d.Len()), "devices")
					b.ReportMetric(float64(as.EssentialDevices), "essential")
					b.ReportMetric(float64(as.UsefulDevices), "useful")
					b.ReportMetric(float64(as.UselessDevices), "useless")
					b.ReportMetric(float64(as.UnresolvedDevices), "unresolved")
					b.ReportMetric(float64(len(as.Links)), "breaking-links")
					b.ReportMetric(float64(len(as.States)), "breaking-states")
				})
			}
		}
	}
}

// fresh returns a copy of g, and of d on it, with nothing computed yet.
func fresh(b *testing.B, g *structural.Network, d structural.Design) (*structural.Network, structural.Design) {
	out := g.Out()
	src := make([]int32, 0, len(out.Adj))
	dst := make([]int32, 0, len(out.Adj))
	for u := int32(0); int(u) < g.N(); u++ {
		for _, v := range out.Row(u) {
			src = append(src, u)
			dst = append(dst, v)
		}
	}
	h, err := g.WithEdges(src, dst, nil)
	if err != nil {
		b.Fatal(err)
	}
	dd, err := structural.NewDesign(h, d.Signals(), nil)
	if err != nil {
		b.Fatal(err)
	}
	return h, dd
}

// BenchmarkRobustTwoStep times the two-step method (spares allowed) on
// networks of 10^5 and 10^6 edges and reports the cost, the proven lower
// bound and the gap in percent of the bound.
func BenchmarkRobustTwoStep(b *testing.B) {
	for _, model := range []string{"er", "sf"} {
		for _, n := range []int{20_000, 200_000} {
			g := benchNet(b, model, n)
			for _, threat := range []failure.Threat{failure.AnyDevice, failure.AnyLink} {
				b.Run(fmt.Sprintf("%s/%s/edges=%d", map[failure.Threat]string{failure.AnyDevice: "device", failure.AnyLink: "link"}[threat], model, g.Edges()), func(b *testing.B) {
					var rp *failure.RobustPlacement
					for i := 0; i < b.N; i++ {
						var err error
						rp, err = failure.Robust(g, failure.RobustRequest{Survive: threat, Spares: true})
						if err != nil || !rp.Feasible {
							b.Fatal(err)
						}
					}
					b.ReportMetric(float64(rp.Cost)/float64(structural.Unit), "cost")
					b.ReportMetric(float64(rp.LowerBound)/float64(structural.Unit), "lower-bound")
					b.ReportMetric(100*float64(rp.Gap)/float64(max(rp.LowerBound, 1)), "gap-%")
					if rp.Step != nil {
						b.ReportMetric(float64(rp.Step.BaseCost)/float64(structural.Unit), "base")
						b.ReportMetric(rp.Step.CoverFactor, "H(d)")
					}
				})
			}
		}
	}
}

// smallNet is a fixed-seed directed Erdős–Rényi network G(n, m) with
// m = 2n (mean total degree 4), the size the exact search is for.
func smallNet(b testing.TB, n int, seed uint64) *structural.Network {
	g, err := gen.Params{Model: "er", Nodes: n, MeanDegree: 4}.Network(gen.NewRand(seed))
	if err != nil {
		b.Fatal(err)
	}
	return g
}

// BenchmarkRobustExact times the exact search (spares allowed, so every
// network is feasible) on ER networks of 12 to 24 states, and reports the
// nodes searched and whether the search completed within its default
// limit.
func BenchmarkRobustExact(b *testing.B) {
	for _, threat := range []failure.Threat{failure.AnyDevice, failure.AnyLink} {
		for _, n := range []int{12, 16, 20, 24} {
			g := smallNet(b, n, 3)
			b.Run(fmt.Sprintf("%s/states=%d", map[failure.Threat]string{failure.AnyDevice: "device", failure.AnyLink: "link"}[threat], n), func(b *testing.B) {
				var rp *failure.RobustPlacement
				for i := 0; i < b.N; i++ {
					var err error
					rp, err = failure.Robust(g, failure.RobustRequest{Survive: threat, Spares: true})
					if err != nil || !rp.Feasible {
						b.Fatal(err)
					}
				}
				b.ReportMetric(float64(rp.SearchNodes), "nodes")
				opt := 0.0
				if rp.Optimal {
					opt = 1
				}
				b.ReportMetric(opt, "optimal")
				b.ReportMetric(float64(rp.Gap)/float64(structural.Unit), "gap")
			})
		}
	}
}
