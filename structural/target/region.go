package target

import (
	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural"
)

// region is the part of a network that can act on the targets: every
// state with a walk to a target. It is closed under predecessors, so its
// states evolve on their own (x_R' = A_RR x_R + B_R u) and a design steers
// the targets in the network exactly when its restriction to the region
// steers them in the region. Indices are local, 0..n-1.
type region struct {
	net      *structural.Network // the region as a network (h itself when it is all of h)
	whole    bool
	n        int
	global   []int32 // local -> state of h
	local    []int32 // state of h -> local, or -1
	out, in  *matching.CSR
	targets  []int32 // local, increasing
	isTarget []bool
	// Devices in local indices (Actuators mode; nil slices otherwise).
	dev structural.Devices
}

// newRegion builds the region of h for the targets (sorted, distinct).
func newRegion(h *structural.Network, targets []int32, d structural.Devices) (*region, error) {
	n := h.N()
	back, cnt := forward(h.In(), targets)
	r := &region{whole: cnt == n, n: cnt}
	if r.whole {
		r.net = h
		r.global = make([]int32, n)
		r.local = make([]int32, n)
		for v := range r.global {
			r.global[v], r.local[v] = int32(v), int32(v)
		}
		r.dev = d
	} else {
		r.local = make([]int32, n)
		for v := 0; v < n; v++ {
			r.local[v] = -1
			if back[v] {
				r.local[v] = int32(len(r.global))
				r.global = append(r.global, int32(v))
			}
		}
		var src, dst []int32
		for lu, u := range r.global {
			for _, v := range h.Succ(u) {
				if lv := r.local[v]; lv >= 0 {
					src = append(src, int32(lu))
					dst = append(dst, lv)
				}
			}
		}
		b := structural.NewIntBuilder(r.n, 0)
		b.AddEdges(src, dst, nil)
		net, err := b.Build(structural.BuildOptions{})
		if err != nil {
			return nil, err
		}
		r.net = net
		if d.Cost != nil {
			r.dev.Cost = make([]structural.Cost, r.n)
		}
		if d.Forbidden != nil {
			r.dev.Forbidden = make([]bool, r.n)
		}
		if d.Existing != nil {
			r.dev.Existing = make([]bool, r.n)
		}
		for l, v := range r.global {
			if d.Cost != nil {
				r.dev.Cost[l] = d.Cost[v]
			}
			if d.Forbidden != nil {
				r.dev.Forbidden[l] = d.Forbidden[v]
			}
			if d.Existing != nil {
				r.dev.Existing[l] = d.Existing[v]
			}
		}
	}
	r.out, r.in = r.net.Out(), r.net.In()
	r.isTarget = make([]bool, r.n)
	for _, t := range targets {
		l := r.local[t]
		r.targets = append(r.targets, l)
		r.isTarget[l] = true
	}
	return r, nil
}

// toGlobal maps local states to states of h.
func (r *region) toGlobal(ls []int32) []int32 {
	out := make([]int32, len(ls))
	for i, l := range ls {
		out[i] = r.global[l]
	}
	return out
}

// existing lists the local states with a device already.
func (r *region) existing() []int32 {
	var out []int32
	for v := int32(0); int(v) < r.n; v++ {
		if r.dev.Has(v) {
			out = append(out, v)
		}
	}
	return out
}

// dedicated returns one signal per state.
func dedicated(states []int32) [][]int32 {
	sig := make([][]int32, len(states))
	for i := range states {
		sig[i] = states[i : i+1 : i+1]
	}
	return sig
}
