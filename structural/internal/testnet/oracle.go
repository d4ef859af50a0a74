package testnet

import (
	"math/bits"
	"math/rand/v2"

	"github.com/netsteer/netsteer/structural"
)

// Oracle decides structural controllability and observability of small
// networks with dedicated devices plainly from Lin's theorem (C.-T. Lin,
// "Structural controllability", IEEE TAC 19(3):201-208, 1974): every state
// reached from a driven state, and no dilation, checked by Hall's condition
// on every subset of states (exhaustively, 2^n subsets). It shares no code
// with the placement algorithms.
type Oracle struct {
	N             int
	in, out       []uint32 // in[v]: bitmask of the u with u -> v
	nbrIn, nbrOut []uint32 // union of in (out) masks over each subset
	popX          []uint8
	full          uint32
}

// NewOracle prepares the exhaustive test for g (at most 20 states).
func NewOracle(g *structural.Network) *Oracle {
	n := g.N()
	o := &Oracle{N: n, in: make([]uint32, n), out: make([]uint32, n), full: 1<<n - 1}
	for u := 0; u < n; u++ {
		for _, v := range g.Succ(int32(u)) {
			o.in[v] |= 1 << u
			o.out[u] |= 1 << v
		}
	}
	o.nbrIn = make([]uint32, 1<<n)
	o.nbrOut = make([]uint32, 1<<n)
	o.popX = make([]uint8, 1<<n)
	for x := uint32(1); x <= o.full; x++ {
		low := bits.TrailingZeros32(x)
		rest := x & (x - 1)
		o.nbrIn[x] = o.nbrIn[rest] | o.in[low]
		o.nbrOut[x] = o.nbrOut[rest] | o.out[low]
		o.popX[x] = uint8(bits.OnesCount32(x))
	}
	return o
}

// Closure returns the states reached from s along the arcs in adj.
func (o *Oracle) Closure(s uint32, adj []uint32) uint32 {
	seen := s
	for {
		next := seen
		for v := 0; v < o.N; v++ {
			if seen&(1<<v) != 0 {
				next |= adj[v]
			}
		}
		if next == seen {
			return seen
		}
		seen = next
	}
}

// Controllable reports whether dedicated actuators on s make the network
// structurally controllable.
func (o *Oracle) Controllable(s uint32) bool {
	if o.Closure(s, o.out) != o.full {
		return false
	}
	for x := uint32(1); x <= o.full; x++ {
		if int(o.popX[x]) > bits.OnesCount32(o.nbrIn[x])+bits.OnesCount32(x&s) {
			return false
		}
	}
	return true
}

// Observable reports whether dedicated sensors on s make the network
// structurally observable (the dual statement: every state reaches a
// sensor, and no set has fewer out-neighbours and sensors than members).
func (o *Oracle) Observable(s uint32) bool {
	if o.Closure(s, o.in) != o.full {
		return false
	}
	for x := uint32(1); x <= o.full; x++ {
		if int(o.popX[x]) > bits.OnesCount32(o.nbrOut[x])+bits.OnesCount32(x&s) {
			return false
		}
	}
	return true
}

// Brute is the exhaustive answer to a placement problem.
type Brute struct {
	Feasible bool
	Cost     int64    // in the units of Devices.Cost (1 each when nil)
	Count    int      // added devices
	Optimal  []uint32 // every cheapest complete set (least cost, then fewest)
}

func BruteForce(o *Oracle, sensors bool, d structural.Devices) Brute {
	var must, banned uint32
	for v := 0; v < o.N; v++ {
		if d.Existing != nil && d.Existing[v] {
			must |= 1 << v
		}
		if d.Forbidden != nil && d.Forbidden[v] {
			banned |= 1 << v
		}
	}
	best := Brute{}
	for s := uint32(0); s <= o.full; s++ {
		if s&must != must || s&banned != 0 {
			continue
		}
		ok := o.Controllable(s)
		if sensors {
			ok = o.Observable(s)
		}
		if !ok {
			continue
		}
		var c int64
		k := 0
		for v := 0; v < o.N; v++ {
			if s&(1<<v) != 0 && must&(1<<v) == 0 {
				k++
				if d.Cost == nil {
					c++
				} else {
					c += int64(d.Cost[v])
				}
			}
		}
		switch {
		case !best.Feasible || c < best.Cost || c == best.Cost && k < best.Count:
			best = Brute{Feasible: true, Cost: c, Count: k, Optimal: []uint32{s}}
		case c == best.Cost && k == best.Count:
			best.Optimal = append(best.Optimal, s)
		}
		if s == o.full {
			break
		}
	}
	return best
}

// MaskOf returns the bitmask of the states ids.
func MaskOf(ids []int32) uint32 {
	var m uint32
	for _, v := range ids {
		m |= 1 << v
	}
	return m
}

// RandomDevices draws a device table: costs in 1..maxCost units (or nil),
// some forbidden and some existing states.
func RandomDevices(rng *rand.Rand, n int, maxCost int64, pForbid, pExist float64) structural.Devices {
	var d structural.Devices
	if maxCost > 0 {
		d.Cost = make([]structural.Cost, n)
		for v := range d.Cost {
			d.Cost[v] = structural.Cost(1 + rng.Int64N(maxCost))
		}
	}
	if pForbid > 0 {
		d.Forbidden = make([]bool, n)
		for v := range d.Forbidden {
			d.Forbidden[v] = rng.Float64() < pForbid
		}
	}
	if pExist > 0 {
		d.Existing = make([]bool, n)
		for v := range d.Existing {
			if (d.Forbidden == nil || !d.Forbidden[v]) && rng.Float64() < pExist {
				d.Existing[v] = true
			}
		}
	}
	return d
}

// Full returns the mask of all states.
func (o *Oracle) Full() uint32 { return o.full }

// InNeighbours returns the states acting on some state of the set x.
func (o *Oracle) InNeighbours(x uint32) uint32 { return o.nbrIn[x] }

// WithSignals extends the Lin's-theorem oracle with multi-state signals:
// sig[i] is the mask of states signal i drives (or senses).
func (o *Oracle) WithSignals(sig []uint32, s uint32, sensors bool) bool {
	var driven uint32
	for _, m := range sig {
		driven |= m
	}
	adj, nbr := o.out, o.nbrIn
	if sensors {
		adj, nbr = o.in, o.nbrOut
	}
	if o.Closure(driven|s, adj) != o.Full() {
		return false
	}
	for x := uint32(1); x <= o.Full(); x++ {
		touch := 0
		for _, m := range sig {
			if m&x != 0 {
				touch++
			}
		}
		if int(o.popX[x]) > bits.OnesCount32(nbr[x])+touch+bits.OnesCount32(x&s) {
			return false
		}
	}
	return true
}

// Units returns a brute-force cost c in the units of a placement's Cost:
// c itself when d has costs, c devices of structural.Unit each otherwise.
func Units(d structural.Devices, c int64) structural.Cost {
	if d.Cost == nil {
		return structural.Cost(c) * structural.Unit
	}
	return structural.Cost(c)
}
