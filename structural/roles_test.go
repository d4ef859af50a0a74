package structural

import (
	"fmt"
	"math/bits"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/netsteer/netsteer/matching"
)

// plKuhn is a plain augmenting-path maximum matching (Kuhn's method, from
// memory) on the bipartite graph of g, skipping one row, one column and
// one edge when asked (-1 for none). It is the recomputation reference.
func plKuhn(g *Network, skipRow, skipCol int32, skipEdge [2]int32) int {
	n := g.N()
	colMate := make([]int32, n)
	for i := range colMate {
		colMate[i] = -1
	}
	var try func(u int32, seen []bool) bool
	try = func(u int32, seen []bool) bool {
		for _, v := range g.Out.Row(u) {
			if v == skipCol || seen[v] || u == skipEdge[0] && v == skipEdge[1] {
				continue
			}
			seen[v] = true
			if colMate[v] < 0 || try(colMate[v], seen) {
				colMate[v] = u
				return true
			}
		}
		return false
	}
	size := 0
	for u := int32(0); int(u) < n; u++ {
		if u != skipRow && try(u, make([]bool, n)) {
			size++
		}
	}
	return size
}

var noEdge = [2]int32{-1, -1}

// Node roles against the definition (Jia et al., Nature Communications
// 4:2002, 2013): enumerate every minimum driver set, i.e. every set of
// N - |M*| states whose complement can be matched (Hall's condition checked
// exhaustively), and see which states are in all, some or none.
func TestNodeRolesEnumeration(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 2))
	for i := 0; i < 300; i++ {
		n := 1 + rng.IntN(9)
		g := plRandom(t, rng, n, []float64{0.1, 0.2, 0.35}[i%3])
		o := newPlOracle(g)
		size := plKuhn(g, -1, -1, noEdge)
		nd := n - size
		in := make([]int, n) // sets containing each state
		sets := 0
		for f := uint32(0); f <= o.full; f++ {
			if bits.OnesCount32(f) != nd {
				continue
			}
			x := o.full &^ f
			ok := true
			for y := x; y > 0 && ok; y = (y - 1) & x {
				ok = bits.OnesCount32(o.nbrIn[y]) >= bits.OnesCount32(y)
			}
			if !ok {
				continue
			}
			sets++
			for v := 0; v < n; v++ {
				if f&(1<<v) != 0 {
					in[v]++
				}
			}
		}
		m := matching.Maximum(&g.Out, &g.In)
		roles := NodeRoles(g, m)
		for v := 0; v < n; v++ {
			want := Redundant
			switch {
			case nd > 0 && in[v] == sets:
				want = Critical
			case in[v] > 0:
				want = Intermittent
			}
			if roles[v] != want {
				t.Fatalf("trial %d: state %d is %v, enumeration of %d driver sets says %v", i, v, roles[v], sets, want)
			}
		}
	}
}

// Node and link roles by recomputation (remove a node's in-edges or a link,
// or force a link into the matching, and recount with a plain matching):
// the definitions of Liu et al. (Nature 473:167, 2011) and Jia et al.
// (2013), on networks too large to enumerate.
func TestRolesRecomputation(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 8))
	for i := 0; i < 40; i++ {
		n := 10 + rng.IntN(30)
		g := plRandom(t, rng, n, (1+rng.Float64()*2)/float64(n))
		size := plKuhn(g, -1, -1, noEdge)
		m := matching.Maximum(&g.Out, &g.In)
		roles := NodeRoles(g, m)
		for v := int32(0); int(v) < n; v++ {
			// In some maximum matching's unmatched set: removing column v
			// keeps the matching size.
			some := plKuhn(g, -1, v, noEdge) == size
			every := true
			for _, u := range g.In.Row(v) {
				if plKuhn(g, u, v, noEdge)+1 == size {
					every = false
				}
			}
			want := Redundant
			switch {
			case every:
				want = Critical
			case some:
				want = Intermittent
			}
			if roles[v] != want {
				t.Fatalf("trial %d: state %d is %v, recomputation says %v", i, v, roles[v], want)
			}
		}
		links := LinkRoles(g, m)
		for u := int32(0); int(u) < n; u++ {
			for k, v := range g.Out.Row(u) {
				want := Ordinary
				switch {
				case plKuhn(g, -1, -1, [2]int32{u, v}) < size:
					want = Critical
				case plKuhn(g, u, v, noEdge)+1 < size:
					want = Redundant
				}
				if got := links[g.Out.Ptr[u]+int64(k)]; got != want {
					t.Fatalf("trial %d: link %d -> %d is %v, recomputation says %v", i, u, v, got, want)
				}
			}
		}
	}
}

// Placement roles against brute force: a device is forced when every
// cheapest set holds it, and y is an alternative to x when S - x + y is a
// cheapest set.
func TestPlacementRolesBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 5))
	checked, forcedSeen, altSeen, moveTogether := 0, 0, 0, 0
	for i := 0; i < 500; i++ {
		n := 2 + rng.IntN(8)
		g := plRandom(t, rng, n, []float64{0.12, 0.2, 0.3}[i%3])
		o := newPlOracle(g)
		d := randomDevices(rng, n, []int64{0, 3, 2}[i%3], []float64{0, 0.2}[i%2], []float64{0, 0.15}[i/2%2])
		for _, sensors := range []bool{false, true} {
			place := PlaceActuators
			if sensors {
				place = PlaceSensors
			}
			pl, err := place(g, d)
			if err != nil {
				t.Fatal(err)
			}
			label := fmt.Sprintf("trial %d (n=%d, sensors=%v)", i, n, sensors)
			want := checkPlacement(t, label, o, sensors, d, pl)
			if !want.feasible {
				continue
			}
			s := maskOf(pl.Devices)
			for _, r := range pl.Roles(100) {
				x := r.State
				forced := true
				for _, opt := range want.optimal {
					if opt&(1<<x) == 0 {
						forced = false
					}
				}
				var alts []int32
				for y := int32(0); int(y) < n; y++ {
					if s&(1<<y) == 0 && slices.Contains(want.optimal, s&^(1<<x)|1<<y) {
						alts = append(alts, y)
					}
				}
				if r.Forced != forced {
					t.Fatalf("%s: device on %d forced = %v, brute force %v (set %v, optimal sets %b)", label, x, r.Forced, forced, pl.Devices, want.optimal)
				}
				if !slices.Equal(r.Alternatives, alts) || r.More {
					t.Fatalf("%s: device on %d alternatives %v (more %v), brute force %v (set %v)", label, x, r.Alternatives, r.More, alts, pl.Devices)
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
