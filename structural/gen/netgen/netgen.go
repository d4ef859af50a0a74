// Package netgen generates synthetic directed networks for benchmarks and
// the comparison script: Erdős–Rényi, static-model scale-free and grids.
// Every generator is deterministic for a given seed (math/rand/v2 PCG), so
// benchmark inputs are the same on every run and machine.
//
// Edges are returned as parallel int32 slices: src[i] -> dst[i] means src[i]
// acts on dst[i]. Self-loops are never produced; rare repeated edges are kept
// (readers merge them), as in the G(N, M) sampling they come from.
package netgen

import (
	"bufio"
	"io"
	"math"
	"math/rand/v2"
	"strconv"
)

// Edges is a directed edge list over states 0..N-1.
type Edges struct {
	N        int
	Src, Dst []int32
}

func newRand(seed uint64) *rand.Rand { return rand.New(rand.NewPCG(seed, 0x6e65747374656572)) }

// ER returns a directed Erdős–Rényi network G(N, M) with M = N*k/2 edges, so
// that the mean total degree (in + out) is k. Endpoints are drawn uniformly;
// self-loops are redrawn.
func ER(n int, k float64, seed uint64) *Edges {
	m := int(float64(n) * k / 2)
	r := newRand(seed)
	e := &Edges{N: n, Src: make([]int32, m), Dst: make([]int32, m)}
	for i := 0; i < m; i++ {
		u := int32(r.IntN(n))
		v := int32(r.IntN(n))
		for v == u {
			v = int32(r.IntN(n))
		}
		e.Src[i], e.Dst[i] = u, v
	}
	return e
}

// ScaleFree returns a directed network of the static model (Goh, Kahng &
// Kim, Phys. Rev. Lett. 87:278701, 2001) with M = N*k/2 edges: state i has
// out-weight (i+1)^-a and, under an independent random relabelling, the same
// in-weight, a = 1/(gamma-1), so in- and out-degrees follow P(k) ~ k^-gamma.
// Endpoints are drawn from the weights (Walker's alias method); self-loops
// are redrawn.
func ScaleFree(n int, k, gamma float64, seed uint64) *Edges {
	m := int(float64(n) * k / 2)
	r := newRand(seed)
	a := 1 / (gamma - 1)
	w := make([]float64, n)
	for i := range w {
		w[i] = math.Pow(float64(i+1), -a)
	}
	al := newAlias(w)
	outPerm := r.Perm(n)
	inPerm := r.Perm(n)
	e := &Edges{N: n, Src: make([]int32, m), Dst: make([]int32, m)}
	for i := 0; i < m; i++ {
		u := int32(outPerm[al.draw(r)])
		v := int32(inPerm[al.draw(r)])
		for v == u {
			v = int32(inPerm[al.draw(r)])
		}
		e.Src[i], e.Dst[i] = u, v
	}
	return e
}

// Grid returns a side x side square lattice (N = side^2, about 2N links)
// whose every link points in a random direction.
func Grid(side int, seed uint64) *Edges {
	r := newRand(seed)
	n := side * side
	e := &Edges{N: n}
	add := func(a, b int) {
		if r.IntN(2) == 0 {
			a, b = b, a
		}
		e.Src = append(e.Src, int32(a))
		e.Dst = append(e.Dst, int32(b))
	}
	e.Src = make([]int32, 0, 2*n)
	e.Dst = make([]int32, 0, 2*n)
	for y := 0; y < side; y++ {
		for x := 0; x < side; x++ {
			v := y*side + x
			if x+1 < side {
				add(v, v+1)
			}
			if y+1 < side {
				add(v, v+side)
			}
		}
	}
	return e
}

// alias is Walker's alias table for drawing indices with given weights.
type alias struct {
	prob  []float64
	alias []int32
}

func newAlias(w []float64) *alias {
	n := len(w)
	sum := 0.0
	for _, x := range w {
		sum += x
	}
	t := &alias{prob: make([]float64, n), alias: make([]int32, n)}
	scaled := make([]float64, n)
	small := make([]int32, 0, n)
	large := make([]int32, 0, n)
	for i, x := range w {
		scaled[i] = x * float64(n) / sum
		if scaled[i] < 1 {
			small = append(small, int32(i))
		} else {
			large = append(large, int32(i))
		}
	}
	for len(small) > 0 && len(large) > 0 {
		s := small[len(small)-1]
		small = small[:len(small)-1]
		l := large[len(large)-1]
		t.prob[s] = scaled[s]
		t.alias[s] = l
		scaled[l] -= 1 - scaled[s]
		if scaled[l] < 1 {
			large = large[:len(large)-1]
			small = append(small, l)
		}
	}
	for _, i := range large {
		t.prob[i] = 1
	}
	for _, i := range small {
		t.prob[i] = 1
	}
	return t
}

func (t *alias) draw(r *rand.Rand) int {
	i := r.IntN(len(t.prob))
	if r.Float64() < t.prob[i] {
		return i
	}
	return int(t.alias[i])
}

// WriteEdgeList writes e as "u v" lines with integer names offset by base.
func (e *Edges) WriteEdgeList(w io.Writer, base int) error {
	bw := bufio.NewWriterSize(w, 1<<20)
	var buf []byte
	for i := range e.Src {
		buf = strconv.AppendInt(buf[:0], int64(e.Src[i])+int64(base), 10)
		buf = append(buf, ' ')
		buf = strconv.AppendInt(buf, int64(e.Dst[i])+int64(base), 10)
		buf = append(buf, '\n')
		if _, err := bw.Write(buf); err != nil {
			return err
		}
	}
	return bw.Flush()
}

// AppendEdgeList appends e as edge-list text to b and returns it.
func (e *Edges) AppendEdgeList(b []byte, base int) []byte {
	for i := range e.Src {
		b = strconv.AppendInt(b, int64(e.Src[i])+int64(base), 10)
		b = append(b, ' ')
		b = strconv.AppendInt(b, int64(e.Dst[i])+int64(base), 10)
		b = append(b, '\n')
	}
	return b
}
