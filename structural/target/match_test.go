package target

import (
	"math/rand/v2"
	"testing"

	"github.com/netsteer/netsteer/matching"
)

// priorityMatch against matching.Maximum on random bipartite graphs with
// random classes: the matching is maximum and, for every class, the rows
// matched in that class and the earlier ones are as many as a maximum
// matching of those rows alone has (the property of the greedy basis of a
// matroid: it is a largest independent set in every prefix).
func TestPriorityMatch(t *testing.T) {
	rng := rand.New(rand.NewPCG(16, 8))
	for it := 0; it < 2000; it++ {
		rows, cols := 1+rng.IntN(12), 1+rng.IntN(12)
		var er, ec []int32
		for r := 0; r < rows; r++ {
			for c := 0; c < cols; c++ {
				if rng.Float64() < 0.25 {
					er, ec = append(er, int32(r)), append(ec, int32(c))
				}
			}
		}
		g := matching.FromEdges(rows, cols, er, ec)
		order := rng.Perm(rows)
		ord := make([]int32, rows)
		for i, r := range order {
			ord[i] = int32(r)
		}
		var classEnd []int
		for i := 1; i <= rows; i++ {
			if i == rows || rng.IntN(3) == 0 {
				classEnd = append(classEnd, i)
			}
		}
		var prefer []uint8
		if it%2 == 0 {
			prefer = make([]uint8, cols)
			for c := range prefer {
				prefer[c] = uint8(rng.IntN(3))
			}
		}
		rowMate, colMate := priorityMatch(g, ord, classEnd, prefer)
		size := 0
		for r, c := range rowMate {
			if c >= 0 {
				size++
				if colMate[c] != int32(r) {
					t.Fatalf("case %d: mates disagree", it)
				}
				found := false
				for _, x := range g.Row(int32(r)) {
					found = found || x == c
				}
				if !found {
					t.Fatalf("case %d: row %d matched to a column it is not adjacent to", it, r)
				}
			}
		}
		if want := matching.Maximum(g, nil).Size; size != want {
			t.Fatalf("case %d: size %d, maximum %d", it, size, want)
		}
		for _, end := range classEnd {
			keep := make([]bool, rows)
			for _, r := range ord[:end] {
				keep[r] = true
			}
			var sr, sc []int32
			for i := range er {
				if keep[er[i]] {
					sr, sc = append(sr, er[i]), append(sc, ec[i])
				}
			}
			want := matching.Maximum(matching.FromEdges(rows, cols, sr, sc), nil).Size
			got := 0
			for _, r := range ord[:end] {
				if rowMate[r] >= 0 {
					got++
				}
			}
			if got != want {
				t.Fatalf("case %d: %d rows of the first classes (to %d) matched, %d possible", it, got, end, want)
			}
		}
	}
}
