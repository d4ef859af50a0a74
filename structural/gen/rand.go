package gen

import "math/rand/v2"

// NewRand returns the seeded generator used by every model: PCG with both
// words derived from seed by SplitMix64.
func NewRand(seed uint64) *rand.Rand {
	s := seed
	a := SplitMix64(&s)
	b := SplitMix64(&s)
	return rand.New(rand.NewPCG(a, b))
}

// SplitMix64 advances *state and returns the next SplitMix64 output
// (Steele, Lea & Flood, OOPSLA 2014), a good mixer for deriving seeds.
func SplitMix64(state *uint64) uint64 {
	*state += 0x9e3779b97f4a7c15
	z := *state
	z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9
	z = (z ^ (z >> 27)) * 0x94d049bb133111eb
	return z ^ (z >> 31)
}

// Sink receives the edges of a generated network. *structural.Builder
// implements it.
type Sink interface {
	AddEdge(u, v int32)
}

// permute fills p with a uniformly random permutation of 0..len(p)-1
// (Fisher–Yates).
func permute(rng *rand.Rand, p []int32) {
	for i := range p {
		p[i] = int32(i)
	}
	for i := len(p) - 1; i > 0; i-- {
		j := rng.IntN(i + 1)
		p[i], p[j] = p[j], p[i]
	}
}
