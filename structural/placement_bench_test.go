package structural

import (
	"fmt"
	"math/rand/v2"
	"testing"
)

// plER draws a directed Erdős–Rényi network G(n, m) with a fixed seed.
func plER(b testing.TB, n, m int, seed uint64) *Network {
	rng := rand.New(rand.NewPCG(seed, 1))
	bl := NewIntBuilder(n, 0)
	bl.Grow(m)
	for i := 0; i < m; i++ {
		bl.AddEdge(int32(rng.IntN(n)), int32(rng.IntN(n)))
	}
	g, err := bl.Build(BuildOptions{})
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
				if _, err := PlaceActuators(g, Devices{}); err != nil {
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
				if _, err := CountActuators(g, nil); err != nil {
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
		d := randomDevices(rand.New(rand.NewPCG(3, 3)), g.N(), 1000, 0.1, 0.05)
		b.Run(fmt.Sprintf("edges=%d", m), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				if _, err := PlaceActuators(g, d); err != nil {
					b.Fatal(err)
				}
			}
		})
		b.Run(fmt.Sprintf("roles/edges=%d", m), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				pl, err := PlaceActuators(g, d)
				if err != nil {
					b.Fatal(err)
				}
				pl.Roles(10)
			}
		})
	}
}

// Node and link roles after one matching.
func BenchmarkRoles(b *testing.B) {
	for _, m := range []int{100_000, 1_000_000} {
		g := plER(b, m/5, m, 4)
		b.Run(fmt.Sprintf("edges=%d", m), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				mm := MinimumDrivers(g).Matching
				NodeRoles(g, mm)
				LinkRoles(g, mm)
			}
		})
	}
}
