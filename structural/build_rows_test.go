package structural

import (
	"math/rand/v2"
	"slices"
	"testing"
)

// TestBuildHubRows builds networks with hub rows long enough for the radix
// sort (and short ones for the other sorts), weighted and not, with many
// repeats, and checks every row against a map of the input: targets sorted
// and unique, weights summed in input order (bit for bit), in-rows the exact transpose (common practice:
// CSR rows sorted and duplicate-free is the convention of doc.go).
func TestBuildHubRows(t *testing.T) {
	r := rand.New(rand.NewPCG(8, 9))
	for trial := 0; trial < 24; trial++ {
		n := []int{300, 3000, 30000}[trial%3]
		weighted := trial%2 == 0
		// Trials 12.. add the options, on inputs spanning many segments.
		opt := BuildOptions{Undirected: trial >= 12 && trial%4 < 2, SelfDynamics: trial >= 12 && trial%4 >= 1}
		b := NewIntBuilder(n, 0)
		type key struct{ u, v int32 }
		want := map[key]float64{}
		type wedge struct {
			u, v int32
			w    float64
		}
		var in []wedge
		for k := 0; k < 6*n; k++ {
			u := int32(r.IntN(n))
			if r.IntN(3) == 0 {
				u = int32(r.IntN(3)) // hubs 0, 1, 2
			}
			v := int32(r.IntN(n))
			if r.IntN(4) == 0 {
				v = int32(r.IntN(40)) // many repeats
			}
			if weighted {
				x := float64(1+r.IntN(7)) / 10 // sums depend on order: repeats must add up in input order
				b.AddWeightedEdge(u, v, x)
				want[key{u, v}] += x
				in = append(in, wedge{u, v, x})
			} else {
				b.AddEdge(u, v)
				want[key{u, v}] = 1
				in = append(in, wedge{u, v, 1})
			}
		}
		if opt.Undirected {
			// The reversed copies follow all input edges, in input order.
			for _, e := range in {
				if e.u != e.v {
					if weighted {
						want[key{e.v, e.u}] += e.w
					} else {
						want[key{e.v, e.u}] = 1
					}
				}
			}
		}
		if opt.SelfDynamics {
			for u := int32(0); int(u) < n; u++ {
				if _, ok := want[key{u, u}]; !ok {
					want[key{u, u}] = 1
				}
			}
		}
		g, err := b.Build(opt)
		if err != nil {
			t.Fatal(err)
		}
		if g.Edges() != len(want) {
			t.Fatalf("trial %d: got %d edges, want %d", trial, g.Edges(), len(want))
		}
		var ins [][]int32 = make([][]int32, n)
		for u := int32(0); int(u) < n; u++ {
			row := g.Succ(u)
			if !slices.IsSorted(row) {
				t.Fatalf("trial %d: out-row %d not sorted", trial, u)
			}
			for k, v := range row {
				x, ok := want[key{u, v}]
				if !ok || k > 0 && row[k-1] == v {
					t.Fatalf("trial %d: out-row %d has %d (in input: %v; repeated: %v)", trial, u, v, ok, k > 0 && row[k-1] == v)
				}
				if weighted && g.Weights()[g.Out().Ptr[u]+int64(k)] != x {
					t.Fatalf("trial %d: weight of %d -> %d is %g, want %g", trial, u, v, g.Weights()[g.Out().Ptr[u]+int64(k)], x)
				}
				ins[v] = append(ins[v], u)
			}
		}
		for v := int32(0); int(v) < n; v++ {
			if got := g.Pred(v); !slices.Equal(got, ins[v]) {
				t.Fatalf("trial %d: in-row %d = %v, want %v", trial, v, got, ins[v])
			}
		}
	}
}
