package placement_test

import (
	"testing"

	"github.com/netsteer/netsteer/io/netread"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/internal/testnet"
	"github.com/netsteer/netsteer/structural/placement"
)

// Wiki-Vote (SNAP; ../shared/datasets, skipped when absent). Critical
// nodes, those in every minimum driver set, are the 4,734 states with no
// incoming edge (Jia et al., Nature Communications 4:2002, 2013, classify
// this network; the figure is the count of in-degree-0 nodes of the SNAP
// file). Also: the two placement routes agree on the real network, and the
// cheapest placement with unit costs passes Lin's theorem.
func TestRolesWikiVote(t *testing.T) {
	path := testnet.Dataset(t, "wiki-vote.edges.gz")
	in, err := netread.ReadFile(path, netread.Options{})
	if err != nil {
		t.Fatal(err)
	}
	g := in.Network
	m := g.Matching()
	roles := structural.StateRoles(g).Of
	var count [4]int
	for _, r := range roles {
		count[r]++
	}
	if got := count[structural.Critical]; got != 4734 {
		t.Errorf("critical nodes: got %d, want 4734", got)
	}
	nd := g.N() - m.Size
	if count[structural.Critical]+count[structural.Intermittent] < nd {
		t.Errorf("only %d critical or intermittent nodes for N_D = %d", count[structural.Critical]+count[structural.Intermittent], nd)
	}
	c, err := placement.Count(g, structural.Controllability, nil)
	if err != nil {
		t.Fatal(err)
	}
	pl, err := placement.Place(g, structural.Controllability, structural.Devices{})
	if err != nil {
		t.Fatal(err)
	}
	if pl.Devices.Len() != c.Count || c.Unmatched != nd {
		t.Errorf("placement %d actuators, formula %d + %d - %d = %d, N - |M*| = %d",
			pl.Devices.Len(), c.Unmatched, c.SourceComponents, c.Alpha, c.Count, nd)
	}
	inputs := make([][]int32, pl.Devices.Len())
	for i, v := range pl.Devices.IDs() {
		inputs[i] = []int32{v}
	}
	if v := testnet.Check(t, g, structural.Controllability, inputs); !v.Holds {
		t.Errorf("placement of %d actuators is not controllable: %d unreached, dilation %v", pl.Devices.Len(), len(v.Unreached.IDs()), v.Dilation != nil)
	}
	t.Logf("N=%d N_D=%d roles: critical %d, intermittent %d, redundant %d; actuators %d (m=%d beta=%d alpha=%d)",
		g.N(), nd, count[structural.Critical], count[structural.Intermittent], count[structural.Redundant], c.Count, c.Unmatched, c.SourceComponents, c.Alpha)
}
