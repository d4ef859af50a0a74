package testnet

import (
	"math/bits"

	"github.com/netsteer/netsteer/structural"
)

// Masks is a small network (at most 20 states) as bitmasks, for tests that
// remove edges or states and judge the result plainly by Lin's theorem
// (C.-T. Lin, "Structural controllability", IEEE TAC 19(3):201-208, 1974),
// each condition on its own: In[v] holds the u with u -> v, Out[u] the v,
// Alive the states present.
type Masks struct {
	N       int
	In, Out []uint32
	Alive   uint32
}

// MasksOf returns the masks of g.
func MasksOf(g *structural.Network) Masks {
	n := g.N()
	m := Masks{N: n, In: make([]uint32, n), Out: make([]uint32, n), Alive: 1<<n - 1}
	for u := 0; u < n; u++ {
		for _, v := range g.Succ(int32(u)) {
			m.In[v] |= 1 << u
			m.Out[u] |= 1 << v
		}
	}
	return m
}

// WithoutEdge returns the masks without the edge u -> v.
func (m Masks) WithoutEdge(u, v int32) Masks {
	r := Masks{N: m.N, In: append([]uint32(nil), m.In...), Out: append([]uint32(nil), m.Out...), Alive: m.Alive}
	r.In[v] &^= 1 << u
	r.Out[u] &^= 1 << v
	return r
}

// WithoutState returns the masks with state x removed (its row and column).
func (m Masks) WithoutState(x int32) Masks {
	r := Masks{N: m.N, In: make([]uint32, m.N), Out: make([]uint32, m.N), Alive: m.Alive &^ (1 << x)}
	for v := 0; v < m.N; v++ {
		if int32(v) != x {
			r.In[v] = m.In[v] &^ (1 << x)
			r.Out[v] = m.Out[v] &^ (1 << x)
		}
	}
	return r
}

// Lin judges the signals sig (masks of the states each touches) for
// property p: the states the signals reach (for observability: the states
// that reach a sensor), and whether some nonempty set X of live states has
// fewer in-neighbours (out-neighbours) among the live states plus signals
// touching it than members. It checks every subset.
func (m Masks) Lin(p structural.Property, sig []uint32) (reached uint32, dilation bool) {
	fwd, back := m.Out, m.In
	if p == structural.Observability {
		fwd, back = m.In, m.Out
	}
	var driven uint32
	for _, s := range sig {
		driven |= s
	}
	reached = driven & m.Alive
	for {
		next := reached
		for v := 0; v < m.N; v++ {
			if reached&(1<<v) != 0 {
				next |= fwd[v] & m.Alive
			}
		}
		if next == reached {
			break
		}
		reached = next
	}
	for x := m.Alive; x != 0; x = (x - 1) & m.Alive {
		var nb uint32
		for v := 0; v < m.N; v++ {
			if x&(1<<v) != 0 {
				nb |= back[v]
			}
		}
		touch := 0
		for _, s := range sig {
			if s&x != 0 {
				touch++
			}
		}
		if bits.OnesCount32(x) > bits.OnesCount32(nb&m.Alive)+touch {
			return reached, true
		}
	}
	return reached, false
}

// Works reports Lin's two conditions together.
func (m Masks) Works(p structural.Property, sig []uint32) bool {
	r, dil := m.Lin(p, sig)
	return r == m.Alive && !dil
}
