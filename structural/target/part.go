package target

import (
	"errors"
	"fmt"
	"slices"

	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural"
)

// ErrNoTargets is returned when a question names no target.
var ErrNoTargets = errors.New("target: no target states")

// on returns the network on which property p is controllability.
func on(g *structural.Network, p structural.Property) *structural.Network {
	if p == structural.Observability {
		return g.Transpose()
	}
	return g
}

// cleanTargets checks that every target is a state of g and returns them
// sorted, each once.
func cleanTargets(g *structural.Network, targets []int32) ([]int32, error) {
	if len(targets) == 0 {
		return nil, ErrNoTargets
	}
	n := g.N()
	out := slices.Clone(targets)
	for _, v := range out {
		if v < 0 || int(v) >= n {
			return nil, fmt.Errorf("target: target state %d not in [0,%d)", v, n)
		}
	}
	slices.Sort(out)
	return slices.Compact(out), nil
}

// forward marks the states reached from seeds along out and returns the
// marks and their number; backward does the same along in (the states
// from which a seed is reached).
func forward(out *matching.CSR, seeds []int32) ([]bool, int) {
	seen := make([]bool, out.Rows)
	queue := make([]int32, 0, 64)
	for _, v := range seeds {
		if !seen[v] {
			seen[v] = true
			queue = append(queue, v)
		}
	}
	for i := 0; i < len(queue); i++ {
		u := queue[i]
		for _, v := range out.Adj[out.Ptr[u]:out.Ptr[u+1]] {
			if !seen[v] {
				seen[v] = true
				queue = append(queue, v)
			}
		}
	}
	return seen, len(queue)
}

// part is the part of a network that a target question depends on: the
// states H that some input reaches and that reach some target. Every walk
// from a driven state to a target stays in H, so C·A^k·B = C_H·A_H^k·B_H
// and the question can be asked of H alone, with local indices 0..n-1.
type part struct {
	n      int
	global []int32 // local -> state of the network
	local  []int32 // state -> local index, or -1 outside H
	out    matching.CSR
	in     matching.CSR
	// targets are the reached targets, as local indices in increasing
	// order; tpos[v] is v's position among them, or -1.
	targets []int32
	tpos    []int32
	// signals[i] lists the local states signal i drives; sigPtr/sigOf list,
	// for each local state, the signals driving it.
	signals [][]int32
	sigPtr  []int64
	sigOf   []int32
	edges   int // len(out.Adj)
	entries int // sum of len(signals[i])
	whole   int // states of the whole network
}

// newPart builds the part of h that matters for the targets (sorted,
// distinct) and signals, and returns the targets no signal reaches.
func newPart(h *structural.Network, targets []int32, signals [][]int32) (*part, []int32) {
	n := h.N()
	var seeds []int32
	for _, s := range signals {
		seeds = append(seeds, s...)
	}
	reached, _ := forward(h.Out(), seeds)
	back, _ := forward(h.In(), targets)
	p := &part{local: make([]int32, n), whole: n}
	for v := 0; v < n; v++ {
		p.local[v] = -1
		if reached[v] && back[v] {
			p.local[v] = int32(len(p.global))
			p.global = append(p.global, int32(v))
		}
	}
	p.n = len(p.global)
	var unreached []int32
	p.tpos = make([]int32, p.n)
	for i := range p.tpos {
		p.tpos[i] = -1
	}
	for _, t := range targets {
		if l := p.local[t]; l >= 0 {
			p.tpos[l] = int32(len(p.targets))
			p.targets = append(p.targets, l)
		} else {
			unreached = append(unreached, t)
		}
	}
	p.out = p.induce(h.Out())
	p.in = p.induce(h.In())
	p.edges = len(p.out.Adj)
	p.signals = make([][]int32, len(signals))
	p.sigPtr = make([]int64, p.n+1)
	mark := make([]int32, p.n) // signal number + 1 of the last signal to list v
	for i, s := range signals {
		for _, v := range s {
			if l := p.local[v]; l >= 0 && mark[l] != int32(i+1) {
				mark[l] = int32(i + 1)
				p.signals[i] = append(p.signals[i], l)
				p.sigPtr[l+1]++
			}
		}
		p.entries += len(p.signals[i])
	}
	for v := 0; v < p.n; v++ {
		p.sigPtr[v+1] += p.sigPtr[v]
	}
	p.sigOf = make([]int32, p.sigPtr[p.n])
	pos := slices.Clone(p.sigPtr[:p.n])
	for i, s := range p.signals {
		for _, l := range s {
			p.sigOf[pos[l]] = int32(i)
			pos[l]++
		}
	}
	return p, unreached
}

// induce returns the rows of c between states of H, in local indices.
func (p *part) induce(c *matching.CSR) matching.CSR {
	r := matching.CSR{Rows: p.n, Cols: p.n, Ptr: make([]int64, p.n+1)}
	for l, v := range p.global {
		k := int64(0)
		for _, w := range c.Adj[c.Ptr[v]:c.Ptr[v+1]] {
			if p.local[w] >= 0 {
				k++
			}
		}
		r.Ptr[l+1] = r.Ptr[l] + k
	}
	r.Adj = make([]int32, r.Ptr[p.n])
	k := 0
	for _, v := range p.global {
		for _, w := range c.Adj[c.Ptr[v]:c.Ptr[v+1]] {
			if lw := p.local[w]; lw >= 0 {
				r.Adj[k] = lw
				k++
			}
		}
	}
	return r
}

// signalsOf returns the signals driving local state v.
func (p *part) signalsOf(v int32) []int32 { return p.sigOf[p.sigPtr[v]:p.sigPtr[v+1]] }
