package gen

import (
	"bufio"
	"fmt"
	"io"
	"math/rand/v2"
	"strconv"

	"github.com/netsteer/netsteer/structural"
)

// Edges collects a generated network as parallel int32 slices over states
// 0..N-1: Src[i] acts on Dst[i]. It is a Sink, for benchmarks, file
// writers and programs that want the raw edge list rather than a built
// Network.
type Edges struct {
	N        int
	Src, Dst []int32
}

// AddEdge appends the edge u -> v.
func (e *Edges) AddEdge(u, v int32) {
	e.Src = append(e.Src, u)
	e.Dst = append(e.Dst, v)
}

// Len returns the number of edges collected.
func (e *Edges) Len() int { return len(e.Src) }

// Edges generates the network into an edge collector sized for it (no
// copies while growing): the same edges, in the same order, as Generate
// emits and Network builds.
func (p Params) Edges(rng *rand.Rand) (*Edges, error) {
	if err := p.Check(); err != nil {
		return nil, err
	}
	e := &Edges{N: p.Nodes}
	if h := p.EdgeHint(); h > 0 && h <= maxEdges {
		e.Src = make([]int32, 0, h)
		e.Dst = make([]int32, 0, h)
	}
	if err := p.Generate(rng, e); err != nil {
		return nil, err
	}
	return e, nil
}

// Network builds the collected edges into a Network whose state i is named
// by the decimal integer i+base (base 1 gives the names Params.Network
// gives).
func (e *Edges) Network(base int) (*structural.Network, error) {
	b := structural.NewIntBuilder(e.N, base)
	b.Grow(len(e.Src))
	for i := range e.Src {
		b.AddEdge(e.Src[i], e.Dst[i])
	}
	return b.Build(structural.BuildOptions{})
}

// WriteEdgeList writes the edges as "u v" lines of integer names, state i
// named i+base, buffered.
func (e *Edges) WriteEdgeList(w io.Writer, base int) error {
	bw := bufio.NewWriterSize(w, 1<<20)
	buf := make([]byte, 0, 64)
	for i := range e.Src {
		buf = appendEdge(buf[:0], e.Src[i], e.Dst[i], base)
		if _, err := bw.Write(buf); err != nil {
			return fmt.Errorf("gen: %w", err)
		}
	}
	if err := bw.Flush(); err != nil {
		return fmt.Errorf("gen: %w", err)
	}
	return nil
}

// AppendEdgeList appends the edges to b as WriteEdgeList writes them and
// returns the extended slice.
func (e *Edges) AppendEdgeList(b []byte, base int) []byte {
	for i := range e.Src {
		b = appendEdge(b, e.Src[i], e.Dst[i], base)
	}
	return b
}

func appendEdge(b []byte, u, v int32, base int) []byte {
	b = strconv.AppendInt(b, int64(u)+int64(base), 10)
	b = append(b, ' ')
	b = strconv.AppendInt(b, int64(v)+int64(base), 10)
	return append(b, '\n')
}

// Workload returns the parameters of a named fixed workload of the
// project's benchmarks and of its comparison with other libraries, with n
// states. Generated with NewRand(1), they are the inputs every published
// figure refers to:
//
//   - "er": directed Erdős–Rényi G(N, L), mean total degree <k> = 10, so
//     L = N*10/2 distinct edges without self-loops (the comparison
//     workload; compare.sh takes other <k> through MeanDegree);
//   - "sf": the directed static model with gamma_out = gamma_in = 2.5,
//     <k> = 10;
//   - "sf2.1": the same with both exponents 2.1 (heavy hubs);
//   - "grid": a lattice of round(sqrt(N)) states a row, edges right and
//     down (a feed-forward mesh), about 2N edges.
func Workload(name string, n int) (Params, error) {
	p := Defaults("er", n)
	switch name {
	case "er":
		p.MeanDegree = 10
	case "sf":
		p.Model, p.MeanDegree, p.GammaOut, p.GammaIn = "scale-free", 10, 2.5, 2.5
	case "sf2.1":
		p.Model, p.MeanDegree, p.GammaOut, p.GammaIn = "scale-free", 10, 2.1, 2.1
	case "grid":
		p.Model = "grid"
	default:
		return Params{}, fmt.Errorf("gen: unknown workload %q (want er, sf, sf2.1 or grid)", name)
	}
	return p, p.Check()
}
