package failure_test

import (
	"math/rand/v2"
	"testing"

	"github.com/netsteer/netsteer/io/netread"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/failure"
	"github.com/netsteer/netsteer/structural/internal/testnet"
	"github.com/netsteer/netsteer/structural/placement"
)

// withoutEdge returns g without the edge from -> to (names kept).
func withoutEdge(t *testing.T, g *structural.Network, from, to int32) *structural.Network {
	t.Helper()
	var src, dst []int32
	for u := int32(0); int(u) < g.N(); u++ {
		for _, v := range g.Succ(u) {
			if u != from || v != to {
				src = append(src, u)
				dst = append(dst, v)
			}
		}
	}
	h, err := g.WithEdges(src, dst, nil)
	if err != nil {
		t.Fatal(err)
	}
	return h
}

func check(t *testing.T, g *structural.Network, p structural.Property, sig [][]int32) *structural.Verdict {
	t.Helper()
	d, err := structural.NewDesign(g, sig, nil)
	if err != nil {
		t.Fatal(err)
	}
	v, err := structural.Check(g, p, d)
	if err != nil {
		t.Fatal(err)
	}
	return v
}

// On the Gnutella peer-to-peer network (SNAP p2p-Gnutella04, the "p2p-1"
// row of Liu, Slotine & Barabási, Nature 473:167, 2011, Table 1;
// ../shared/datasets, skipped when absent), for both properties: a sample
// of the claims about device and link losses, the partners of useful
// devices, the replacements and the link fixes, each recomputed by
// structural.Check on the network or design with the loss applied.
func TestAssessGnutella(t *testing.T) {
	if testing.Short() {
		t.Skip("dataset test")
	}
	path := testnet.Dataset(t, "p2p-gnutella04.edges.gz")
	in, err := netread.ReadFile(path, netread.Options{})
	if err != nil {
		t.Fatal(err)
	}
	g := in.Network
	rng := rand.New(rand.NewPCG(4, 8))
	for _, p := range []structural.Property{structural.Controllability, structural.Observability} {
		pl, err := placement.Place(g, p, structural.Devices{})
		if err != nil {
			t.Fatal(err)
		}
		// The cheapest placement plus one device on a state in twenty, so
		// that some devices back others up.
		var sig [][]int32
		for _, v := range pl.Devices.IDs() {
			sig = append(sig, []int32{v})
		}
		for k := 0; k < g.N()/20; k++ {
			sig = append(sig, []int32{int32(rng.IntN(g.N()))})
		}
		d, _ := structural.NewDesign(g, sig, nil)
		as, err := failure.Assess(g, failure.Request{Property: p, Design: d, Detail: 20, Partners: 20})
		if err != nil {
			t.Fatal(err)
		}
		if !as.Intact.Holds || as.UnresolvedDevices != 0 || as.EssentialDevices == 0 || as.UsefulDevices == 0 || len(as.Links) == 0 {
			t.Fatalf("%v: holds %v, %d essential, %d useful, %d unresolved, %d breaking links", p, as.Intact.Holds, as.EssentialDevices, as.UsefulDevices, as.UnresolvedDevices, len(as.Links))
		}
		rest := func(drop ...int) [][]int32 {
			out := [][]int32{}
			for i, s := range sig {
				keep := true
				for _, j := range drop {
					keep = keep && i != j
				}
				if keep {
					out = append(out, s)
				}
			}
			return out
		}
		checked := map[failure.Class]int{}
		for _, i := range rng.Perm(len(as.Devices)) {
			dl := as.Devices[i]
			if checked[dl.Class] >= 15 {
				continue
			}
			checked[dl.Class]++
			v := check(t, g, p, rest(i))
			if v.Holds == (dl.Class == failure.Essential) || v.Unreached.Len() != dl.Unreached.Len() || (v.Dilation != nil) != dl.Dilation {
				t.Fatalf("%v: signal %d %v: recomputed holds %v, %d unreached (claimed %d), dilation %v (claimed %v)", p, i, dl.Class, v.Holds, v.Unreached.Len(), dl.Unreached.Len(), v.Dilation != nil, dl.Dilation)
			}
			if len(dl.WithSignals) > 0 {
				q := append([]int(nil), dl.WithSignals...)
				if !check(t, g, p, rest(q...)).Holds || check(t, g, p, rest(append(q, i)...)).Holds {
					t.Fatalf("%v: signal %d useful with %d others: the claim does not recompute", p, i, len(q))
				}
			}
			if r := dl.Replacement; r != nil && r.Feasible {
				s := rest(i)
				for _, v := range r.Added.IDs() {
					s = append(s, []int32{v})
				}
				if !check(t, g, p, s).Holds {
					t.Fatalf("%v: replacement of signal %d does not work", p, i)
				}
			}
		}
		for k, l := range as.Links {
			if k >= 20 {
				break
			}
			h := withoutEdge(t, g, l.From, l.To)
			v := check(t, h, p, sig)
			if v.Holds || v.Unreached.Len() != l.UnreachedCount || (v.Dilation != nil) != l.Dilation {
				t.Fatalf("%v: link %d->%d: recomputed holds %v, %d unreached (claimed %d), dilation %v (claimed %v)", p, l.From, l.To, v.Holds, v.Unreached.Len(), l.UnreachedCount, v.Dilation != nil, l.Dilation)
			}
			if l.Fix.Feasible {
				s := append([][]int32(nil), sig...)
				for _, x := range l.Fix.Added.IDs() {
					s = append(s, []int32{x})
				}
				if !check(t, h, p, s).Holds {
					t.Fatalf("%v: fix of link %d->%d does not work", p, l.From, l.To)
				}
			}
		}
		// Links not listed keep the design working.
		breaking := map[[2]int32]bool{}
		for _, l := range as.Links {
			breaking[[2]int32{l.From, l.To}] = true
		}
		for k := 0; k < 20; k++ {
			u := int32(rng.IntN(g.N()))
			succ := g.Succ(u)
			if len(succ) == 0 || breaking[[2]int32{u, succ[0]}] {
				continue
			}
			if !check(t, withoutEdge(t, g, u, succ[0]), p, sig).Holds {
				t.Fatalf("%v: link %d->%d not listed, but its loss breaks the design", p, u, succ[0])
			}
		}
		t.Logf("%v: %d devices (%d essential, %d useful, %d useless), %d of %d links break (%d unreach, %d dilate)", p, len(as.Devices), as.EssentialDevices, as.UsefulDevices, as.UselessDevices, len(as.Links), as.LinksJudged, as.UnreachingLinks, as.DilatingLinks)
	}
}
