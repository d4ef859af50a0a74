package target

import (
	"fmt"
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/gen"
)

// benchNet draws a fixed-seed generated network (structural/gen).
func benchNet(b *testing.B, p gen.Params) *structural.Network {
	b.Helper()
	g, err := p.Network(gen.NewRand(7))
	if err != nil {
		b.Fatal(err)
	}
	return g
}

// everyKth lists the states 0, k, 2k, ...: a spread-out target set.
func everyKth(n, k int) []int32 {
	var out []int32
	for v := 0; v < n; v += k {
		out = append(out, int32(v))
	}
	return out
}

var benchModels = []struct {
	name string
	p    gen.Params
}{
	{"er", gen.Params{Model: "er", Nodes: 200_000, MeanDegree: 10}},
	{"scale-free", gen.Params{Model: "scale-free", Nodes: 200_000, MeanDegree: 10, GammaOut: 2.5, GammaIn: 2.5}},
}

// Select on 10^6-edge networks (N = 2·10^5, <k> = 10), targets 1% and
// 10% of the states, both modes. Reported: the signals found, today's
// full-control count, and their ratio.
func BenchmarkSelect(b *testing.B) {
	for _, m := range benchModels {
		g := benchNet(b, m.p)
		for _, every := range []int{100, 10} {
			tg := everyKth(g.N(), every)
			for _, mode := range []Mode{Signals, Actuators} {
				b.Run(fmt.Sprintf("%s/edges=%d/targets=%d/%s", m.name, g.Edges(), len(tg), mode), func(b *testing.B) {
					var sel *Selection
					for i := 0; i < b.N; i++ {
						var err error
						if sel, err = Select(g, SelectRequest{Targets: tg, Mode: mode, Seed: 1}); err != nil {
							b.Fatal(err)
						}
					}
					b.ReportMetric(float64(sel.Count), "signals")
					b.ReportMetric(float64(sel.Lower), "lower")
					b.ReportMetric(float64(sel.FullControl.Count), "full_control")
					b.ReportMetric(float64(sel.Count)/float64(sel.FullControl.Count), "ratio")
				})
			}
		}
	}
}

// Check of the stem–cycle design Select returns for 1% targets on the
// same networks (proved by the Lin certificate, no sample).
func BenchmarkCheckLarge(b *testing.B) {
	for _, m := range benchModels {
		g := benchNet(b, m.p)
		tg := everyKth(g.N(), 100)
		sel, err := Select(g, SelectRequest{Targets: tg, Mode: Actuators, Seed: 1})
		if err != nil {
			b.Fatal(err)
		}
		b.Run(fmt.Sprintf("%s/edges=%d/targets=%d", m.name, g.Edges(), len(tg)), func(b *testing.B) {
			var v *Verdict
			for i := 0; i < b.N; i++ {
				if v, err = Check(g, CheckRequest{Targets: tg, Inputs: sel.Inputs}); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(v.Lower), "dimension")
			b.ReportMetric(float64(v.Upper), "upper")
		})
	}
}

// The exact parts on a 2,000-state network: the sampled rank of C·K and
// the dynamic linking, for a design with half the signals the targets
// need (so no cheap bound decides).
func BenchmarkCheckExact(b *testing.B) {
	g := benchNet(b, gen.Params{Model: "er", Nodes: 2000, MeanDegree: 4})
	tg := everyKth(g.N(), 5)
	sel, err := Select(g, SelectRequest{Targets: tg, Mode: Actuators, Seed: 1})
	if err != nil {
		b.Fatal(err)
	}
	half := structural.Design(sel.Inputs)
	for half.Len() > sel.Inputs.Len()/2 {
		half = half.Without(half.Len() - 1)
	}
	p, _ := newPart(g, tg, half.Signals())
	b.Run("sample", func(b *testing.B) {
		for i := 0; i < b.N; i++ {
			if _, err := Sample(g, SampleRequest{Targets: tg, Inputs: half, Trials: 1}); err != nil {
				b.Fatal(err)
			}
		}
		b.ReportMetric(float64(p.n), "states")
	})
	b.Run("linking", func(b *testing.B) {
		var lam int
		for i := 0; i < b.N; i++ {
			lam = dynamicLinking(p, p.n)
		}
		b.ReportMetric(float64(lam), "linking")
		b.ReportMetric(float64(linkWork(p, p.n)), "arcs")
	})
}
