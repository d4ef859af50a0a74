package transform

import (
	"strconv"

	"github.com/netsteer/netsteer/structural"
)

// Coupling says how Replicate links the copies of a unit.
type Coupling struct {
	// Pattern is "chain" (copy j acts on copy j+1), "ring" (a chain closed
	// from the last copy back to the first), "star" (copy 1 acts on every
	// other copy), "all" (every copy acts on every other) or "none"; empty
	// means chain.
	Pattern string
	// TwoWay adds the reverse of every coupling of a chain, ring or star.
	TwoWay bool
	// States names the coupled states; each couples to its own copies
	// (state s of copy j acts on state s of copy j'). Empty means every
	// state.
	States []string
}

// maxVariantEdges bounds the edges Replicate builds, as the generators
// bound theirs.
const maxVariantEdges = 1<<31 - 1

// CouplingPatterns lists the accepted Coupling.Pattern values.
var CouplingPatterns = []string{"chain", "ring", "star", "all", "none"}

// Replicate returns k copies of g, a fleet of identical units, with the
// couplings c between copies. State s of copy j (1-based) is named
// "s@j"; copy j's states are numbered (j-1) N + s.
func Replicate(g *structural.Network, k int, c Coupling) (*structural.Network, error) {
	n := g.N()
	if k < 1 {
		return nil, errorf("replicate %d copies: want at least one", k)
	}
	if int64(n)*int64(k) > structural.MaxStates {
		return nil, errorf("%d copies of %d states exceed %d states", k, n, structural.MaxStates)
	}
	// Count the couplings before building them: "all" grows as k^2.
	var npairs int64
	kk := int64(k)
	switch c.Pattern {
	case "", "chain", "star":
		npairs = kk - 1
	case "ring":
		npairs = kk - 1
		if k > 2 {
			npairs = kk
		}
	case "all":
		npairs = kk * (kk - 1)
	}
	if c.TwoWay && c.Pattern != "all" {
		npairs *= 2
	}
	ncoupled := int64(n)
	if len(c.States) > 0 {
		ncoupled = int64(len(c.States))
	}
	if copyEdges := int64(g.Edges()) * kk; copyEdges > maxVariantEdges ||
		ncoupled > 0 && npairs > (maxVariantEdges-copyEdges)/ncoupled {
		return nil, errorf("%d copies of %d edges with %d couplings of %d states exceed %d edges",
			k, g.Edges(), npairs, ncoupled, int64(maxVariantEdges))
	}
	var pairs [][2]int // (from copy, to copy), 0-based
	switch c.Pattern {
	case "", "chain", "ring":
		for j := 0; j+1 < k; j++ {
			pairs = append(pairs, [2]int{j, j + 1})
		}
		if c.Pattern == "ring" && k > 2 {
			pairs = append(pairs, [2]int{k - 1, 0})
		}
	case "star":
		for j := 1; j < k; j++ {
			pairs = append(pairs, [2]int{0, j})
		}
	case "all":
		for a := 0; a < k; a++ {
			for b := 0; b < k; b++ {
				if a != b {
					pairs = append(pairs, [2]int{a, b})
				}
			}
		}
	case "none":
	default:
		return nil, errorf("coupling %q: want chain, ring, star, all or none", c.Pattern)
	}
	if c.TwoWay && c.Pattern != "all" {
		// No reverse repeats a pair: chains and rings run j -> j+1 (and
		// k-1 -> 0 only for k > 2), stars 0 -> j.
		for _, p := range pairs[:len(pairs):len(pairs)] {
			pairs = append(pairs, [2]int{p[1], p[0]})
		}
	}
	var coupled []int32
	if len(c.States) == 0 {
		coupled = make([]int32, n)
		for i := range coupled {
			coupled[i] = int32(i)
		}
	} else {
		for _, s := range c.States {
			v, ok := g.Lookup(s)
			if !ok {
				return nil, errorf("coupling state %q is not in the network", s)
			}
			coupled = append(coupled, v)
		}
	}
	b := structural.NewBuilder()
	var buf []byte
	for j := 1; j <= k; j++ {
		for v := 0; v < n; v++ {
			buf = g.AppendName(buf[:0], int32(v))
			buf = append(buf, '@')
			buf = strconv.AppendInt(buf, int64(j), 10)
			if _, err := b.Intern(buf); err != nil {
				return nil, err
			}
		}
	}
	if b.States() != n*k {
		return nil, errorf("copy names collide (a state name ends in @<number>)")
	}
	m := g.Edges()
	total := m*k + len(pairs)*len(coupled)
	src := make([]int32, 0, total)
	dst := make([]int32, 0, total)
	var w []float64
	if g.Weights() != nil {
		w = make([]float64, 0, total)
	}
	for j := 0; j < k; j++ {
		off := int32(j * n)
		for u := 0; u < n; u++ {
			for e := g.Out().Ptr[u]; e < g.Out().Ptr[u+1]; e++ {
				src = append(src, off+int32(u))
				dst = append(dst, off+g.Out().Adj[e])
				if w != nil {
					w = append(w, g.Weights()[e])
				}
			}
		}
	}
	for _, p := range pairs {
		for _, s := range coupled {
			src = append(src, int32(p[0]*n)+s)
			dst = append(dst, int32(p[1]*n)+s)
			if w != nil {
				w = append(w, 1)
			}
		}
	}
	b.AddEdges(src, dst, w)
	return b.Build(structural.BuildOptions{})
}
