package placement

import (
	"fmt"
	"math/rand/v2"
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/internal/testnet"
)

// plER draws a directed Erdős–Rényi network G(n, m) with a fixed seed.
func plER(b testing.TB, n, m int, seed uint64) *structural.Network {
	rng := rand.New(rand.NewPCG(seed, 1))
	bl := structural.NewIntBuilder(n, 0)
	bl.Grow(m)
	for i := 0; i < m; i++ {
		bl.AddEdge(int32(rng.IntN(n)), int32(rng.IntN(n)))
	}
	g, err := bl.Build(structural.BuildOptions{})
	if err != nil {
		b.Fatal(err)
	}
	return g
}

// Unit-cost placement (the minimum number of dedicated actuators) on ER
// networks of mean degree 5, up to 10^6 edges.
func BenchmarkPlaceActuatorsUnit(b *testing.B) {
	for _, m := range []int{10_000, 100_000, 1_000_000} {
		g := plER(b, m/5, m, 1)
		b.Run(fmt.Sprintf("edges=%d", m), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				if _, err := Place(g, structural.Controllability, structural.Devices{}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// The count formula alone (m + beta - alpha) on the same networks.
func BenchmarkCountActuators(b *testing.B) {
	for _, m := range []int{10_000, 100_000, 1_000_000} {
		g := plER(b, m/5, m, 1)
		b.Run(fmt.Sprintf("edges=%d", m), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				if _, err := Count(g, structural.Controllability, nil); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// Placement with random costs 1..1000 on every state, a tenth of the states
// forbidden and a twentieth already equipped, up to 10^6 edges; and the
// same with roles.
func BenchmarkPlaceActuatorsCosts(b *testing.B) {
	for _, m := range []int{10_000, 100_000, 1_000_000} {
		g := plER(b, m/5, m, 2)
		d := testnet.RandomDevices(rand.New(rand.NewPCG(3, 3)), g.N(), 1000, 0.1, 0.05)
		b.Run(fmt.Sprintf("edges=%d", m), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				if _, err := Place(g, structural.Controllability, d); err != nil {
					b.Fatal(err)
				}
			}
		})
		b.Run(fmt.Sprintf("roles/edges=%d", m), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				pl, err := Place(g, structural.Controllability, d)
				if err != nil {
					b.Fatal(err)
				}
				pl.Roles(10)
			}
		})
	}
}

// Node and link roles after the network's one matching (kept between
// iterations).
func BenchmarkRoles(b *testing.B) {
	for _, m := range []int{100_000, 1_000_000} {
		g := plER(b, m/5, m, 4)
		b.Run(fmt.Sprintf("edges=%d", m), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				structural.StateRoles(g)
				structural.EdgeRoles(g)
			}
		})
	}
}

// plSourceCycles draws k source 3-cycles, each with one edge into a random
// state of an ER core of 2k states and 8k edges: every cycle is perfectly
// matched, so each source component needs a routed path (the hard case of
// the routing stage).
func plSourceCycles(b testing.TB, k int, seed uint64) *structural.Network {
	rng := rand.New(rand.NewPCG(seed, 7))
	core := 2 * k
	n := 3*k + core
	bl := structural.NewIntBuilder(n, 0)
	for c := 0; c < k; c++ {
		a := int32(3 * c)
		bl.AddEdge(a, a+1)
		bl.AddEdge(a+1, a+2)
		bl.AddEdge(a+2, a)
		bl.AddEdge(a+int32(rng.IntN(3)), int32(3*k+rng.IntN(core)))
	}
	for i := 0; i < 4*core; i++ {
		bl.AddEdge(int32(3*k+rng.IntN(core)), int32(3*k+rng.IntN(core)))
	}
	g, err := bl.Build(structural.BuildOptions{})
	if err != nil {
		b.Fatal(err)
	}
	return g
}

// Many perfectly matched source components, unit costs and random costs
// 1..1000 (2% existing), about 1.2*10^5 and 1.2*10^6 edges.
func BenchmarkPlaceSourceCycles(b *testing.B) {
	for _, k := range []int{10_000, 100_000} {
		g := plSourceCycles(b, k, 1)
		d := testnet.RandomDevices(rand.New(rand.NewPCG(5, 5)), g.N(), 1000, 0, 0.02)
		for _, tc := range []struct {
			name string
			d    structural.Devices
		}{{"unit", structural.Devices{}}, {"costs", d}} {
			b.Run(fmt.Sprintf("%s/edges=%d", tc.name, g.Edges()), func(b *testing.B) {
				for i := 0; i < b.N; i++ {
					if _, err := Place(g, structural.Controllability, tc.d); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}
