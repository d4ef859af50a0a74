package matching

import (
	"fmt"
	"math/rand/v2"
	"testing"
)

// kuhn is the reference: Kuhn's plain augmenting-path algorithm (Kuhn,
// Naval Res. Logist. Q. 2:83, 1955), one depth-first search per row, written
// independently of the package code. O(V E); for small graphs only.
func kuhn(g *CSR) int {
	colMate := make([]int, g.Cols)
	for i := range colMate {
		colMate[i] = -1
	}
	seen := make([]int, g.Cols)
	stamp := 0
	var try func(r int) bool
	try = func(r int) bool {
		for _, c := range g.Row(int32(r)) {
			if seen[c] == stamp {
				continue
			}
			seen[c] = stamp
			if colMate[c] < 0 || try(colMate[c]) {
				colMate[c] = r
				return true
			}
		}
		return false
	}
	size := 0
	for r := 0; r < g.Rows; r++ {
		stamp++
		if try(r) {
			size++
		}
	}
	return size
}

// checkMatching reports whether m is a matching of g: mates agree on both
// sides, every matched pair is an edge of g and Size counts the pairs.
func checkMatching(g *CSR, m *Matching) error {
	if len(m.RowMate) != g.Rows || len(m.ColMate) != g.Cols {
		return fmt.Errorf("mate slices have lengths %d, %d, want %d, %d", len(m.RowMate), len(m.ColMate), g.Rows, g.Cols)
	}
	pairs := 0
	for r, c := range m.RowMate {
		if c < 0 {
			if c != -1 {
				return fmt.Errorf("RowMate[%d] = %d", r, c)
			}
			continue
		}
		if int(c) >= g.Cols || m.ColMate[c] != int32(r) {
			return fmt.Errorf("RowMate[%d] = %d but ColMate disagrees", r, c)
		}
		found := false
		for _, x := range g.Row(int32(r)) {
			if x == c {
				found = true
				break
			}
		}
		if !found {
			return fmt.Errorf("pair (%d, %d) is not an edge", r, c)
		}
		pairs++
	}
	for c, r := range m.ColMate {
		if r < -1 || r >= 0 && (int(r) >= g.Rows || m.RowMate[r] != int32(c)) {
			return fmt.Errorf("ColMate[%d] = %d but RowMate disagrees", c, r)
		}
	}
	if pairs != m.Size {
		return fmt.Errorf("Size = %d, counted %d pairs", m.Size, pairs)
	}
	return nil
}

// family is a named generator of bipartite test graphs.
type family struct {
	name string
	make func(r *rand.Rand) *CSR
}

func randomGraph(r *rand.Rand, rows, cols int, p float64) *CSR {
	var er, ec []int32
	for i := 0; i < rows; i++ {
		for j := 0; j < cols; j++ {
			if r.Float64() < p {
				er = append(er, int32(i))
				ec = append(ec, int32(j))
			}
		}
	}
	return FromEdges(rows, cols, er, ec)
}

// permute relabels rows and columns at random and shuffles each row, so a
// structured family does not always meet the algorithm in its best order.
func permute(r *rand.Rand, g *CSR) *CSR {
	pr, pc := r.Perm(g.Rows), r.Perm(g.Cols)
	var er, ec []int32
	for i := 0; i < g.Rows; i++ {
		for _, c := range g.Row(int32(i)) {
			er = append(er, int32(pr[i]))
			ec = append(ec, int32(pc[c]))
		}
	}
	idx := r.Perm(len(er))
	sr, sc := make([]int32, len(er)), make([]int32, len(er))
	for k, i := range idx {
		sr[k], sc[k] = er[i], ec[i]
	}
	return FromEdges(g.Rows, g.Cols, sr, sc)
}

// ksHard is the family on which Karp–Sipser with the degree-one rule does
// badly (Duff, Kaya & Uçar, ACM TOMS 38(2):13, 2011, Sec. 5): n = 2h rows
// and columns in two halves; the (1,1) block is full, the (2,2) block empty,
// the off-diagonal blocks are identities, and the last t rows of the first
// row block and the last t columns of the first column block are full.
// The two identities form a perfect matching.
func ksHard(h, t int) *CSR {
	n := 2 * h
	var er, ec []int32
	add := func(i, j int) { er, ec = append(er, int32(i)), append(ec, int32(j)) }
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			switch {
			case i < h && j < h: // full (1,1) block
				add(i, j)
			case i < h && j == h+i, i >= h && j == i-h: // identities
				add(i, j)
			case i >= h-t && i < h: // dense rows
				add(i, j)
			case j >= h-t && j < h: // dense columns
				add(i, j)
			}
		}
	}
	return FromEdges(n, n, er, ec)
}

// zigzag is a path r0-c0-r1-c1-...: row i meets columns i and i+1. Extra
// "decoy" rows see only the odd columns, so greedy choices leave long
// augmenting paths.
func zigzag(n, decoys int) *CSR {
	var er, ec []int32
	for i := 0; i < n; i++ {
		er, ec = append(er, int32(i)), append(ec, int32(i))
		if i+1 < n {
			er, ec = append(er, int32(i)), append(ec, int32(i+1))
		}
	}
	for d := 0; d < decoys; d++ {
		for j := 1; j < n; j += 2 {
			er, ec = append(er, int32(n+d)), append(ec, int32(j))
		}
	}
	return FromEdges(n+decoys, n, er, ec)
}

var families = []family{
	{"sparse", func(r *rand.Rand) *CSR {
		rows, cols := 1+r.IntN(40), 1+r.IntN(40)
		return randomGraph(r, rows, cols, 2.5/float64(cols))
	}},
	{"medium", func(r *rand.Rand) *CSR {
		rows, cols := 1+r.IntN(60), 1+r.IntN(60)
		return randomGraph(r, rows, cols, r.Float64()*0.2)
	}},
	{"wide", func(r *rand.Rand) *CSR {
		rows := 1 + r.IntN(10)
		return randomGraph(r, rows, rows*(2+r.IntN(5)), 0.15)
	}},
	{"tall", func(r *rand.Rand) *CSR {
		cols := 1 + r.IntN(10)
		return randomGraph(r, cols*(2+r.IntN(5)), cols, 0.15)
	}},
	{"empty rows and columns", func(r *rand.Rand) *CSR {
		rows, cols := 1+r.IntN(50), 1+r.IntN(50)
		g := randomGraph(r, rows, cols, 0.1)
		// Drop every edge of a random third of rows and columns.
		deadR, deadC := make([]bool, rows), make([]bool, cols)
		for i := range deadR {
			deadR[i] = r.IntN(3) == 0
		}
		for i := range deadC {
			deadC[i] = r.IntN(3) == 0
		}
		var er, ec []int32
		for i := 0; i < rows; i++ {
			for _, c := range g.Row(int32(i)) {
				if !deadR[i] && !deadC[c] {
					er, ec = append(er, int32(i)), append(ec, c)
				}
			}
		}
		return FromEdges(rows, cols, er, ec)
	}},
	{"dense blocks", func(r *rand.Rand) *CSR {
		n := 10 + r.IntN(50)
		var er, ec []int32
		for b := 0; b < 1+r.IntN(4); b++ {
			r0, c0 := r.IntN(n), r.IntN(n)
			h, w := 1+r.IntN(n-r0), 1+r.IntN(n-c0)
			for i := r0; i < r0+h; i++ {
				for j := c0; j < c0+w; j++ {
					er, ec = append(er, int32(i)), append(ec, int32(j))
				}
			}
		}
		for k := 0; k < n; k++ {
			er, ec = append(er, int32(r.IntN(n))), append(ec, int32(r.IntN(n)))
		}
		return FromEdges(n, n, er, ec)
	}},
	{"duplicates", func(r *rand.Rand) *CSR {
		n := 1 + r.IntN(30)
		var er, ec []int32
		for k := 0; k < 3*n; k++ {
			i, j := int32(r.IntN(n)), int32(r.IntN(n))
			for d := 0; d < 1+r.IntN(3); d++ {
				er, ec = append(er, i), append(ec, j)
			}
		}
		return FromEdges(n, n, er, ec)
	}},
	{"Karp-Sipser hard", func(r *rand.Rand) *CSR {
		h := 2 + r.IntN(30)
		t := 1 + r.IntN(h/2+1)
		if t > h {
			t = h
		}
		return permute(r, ksHard(h, t))
	}},
	{"Karp-Sipser hard, ordered", func(r *rand.Rand) *CSR {
		h := 2 + r.IntN(30)
		return ksHard(h, 1+r.IntN(h))
	}},
	{"chain", func(r *rand.Rand) *CSR {
		// A directed path 0 -> 1 -> ... as rows (sources) and columns.
		n := 1 + r.IntN(80)
		var er, ec []int32
		for i := 0; i+1 < n; i++ {
			er, ec = append(er, int32(i)), append(ec, int32(i+1))
		}
		return permute(r, FromEdges(n, n, er, ec))
	}},
	{"zigzag", func(r *rand.Rand) *CSR {
		g := zigzag(2+r.IntN(60), r.IntN(3))
		if r.IntN(2) == 0 {
			return permute(r, g)
		}
		return g
	}},
	{"cycles and stars", func(r *rand.Rand) *CSR {
		n := 3 + r.IntN(40)
		var er, ec []int32
		for i := 0; i < n; i++ {
			if r.IntN(4) == 0 {
				er, ec = append(er, 0), append(ec, int32(i)) // hub row
			} else {
				er, ec = append(er, int32(i)), append(ec, int32((i+1)%n))
			}
		}
		return permute(r, FromEdges(n, n, er, ec))
	}},
}

// TestMaximumAgainstKuhn compares the size of Maximum's matching with
// Kuhn's algorithm on thousands of random and adversarial bipartite graphs,
// and checks that every matching returned is valid.
func TestMaximumAgainstKuhn(t *testing.T) {
	for _, f := range []int64{2, 0, -1} {
		t.Run(fmt.Sprintf("budget=%d", f), func(t *testing.T) {
			defer func(old int64) { kuhnEdgeFactor = old }(kuhnEdgeFactor)
			kuhnEdgeFactor = f
			testAgainstKuhn(t)
		})
	}
}

// testAgainstKuhn runs every family; the budget of the breadth-first pass
// (kuhnEdgeFactor) decides how much work the Pothen–Fan phases get.
func testAgainstKuhn(t *testing.T) {
	r := rand.New(rand.NewPCG(20240611, 3))
	perFamily := 250
	if testing.Short() {
		perFamily = 50
	}
	total := 0
	for _, f := range families {
		for k := 0; k < perFamily; k++ {
			g := f.make(r)
			if err := g.Validate(); err != nil {
				t.Fatalf("%s #%d: generator made a bad graph: %v", f.name, k, err)
			}
			for _, withT := range []bool{true, false} {
				var gt *CSR
				if withT {
					gt = Transpose(g)
				}
				m := Maximum(g, gt)
				if err := checkMatching(g, m); err != nil {
					t.Fatalf("%s #%d (%dx%d, %d edges): invalid matching: %v", f.name, k, g.Rows, g.Cols, g.Edges(), err)
				}
				if want := kuhn(g); m.Size != want {
					t.Fatalf("%s #%d (%dx%d, %d edges): got size %d, want %d (Kuhn)", f.name, k, g.Rows, g.Cols, g.Edges(), m.Size, want)
				}
			}
			total++
		}
	}
	t.Logf("%d graphs checked", total)
}

func TestMaximumSmall(t *testing.T) {
	for _, tc := range []struct {
		name       string
		rows, cols int
		er, ec     []int32
		want       int
	}{
		{"no rows", 0, 3, nil, nil, 0},
		{"no columns", 3, 0, nil, nil, 0},
		{"no edges", 2, 2, nil, nil, 0},
		{"one edge", 1, 1, []int32{0}, []int32{0}, 1},
		// Greedy row 0 -> column 0 must be undone to match row 1.
		{"augment once", 2, 2, []int32{0, 0, 1}, []int32{0, 1, 0}, 2},
		// Three rows that all see only two columns.
		{"Hall violation", 3, 2, []int32{0, 0, 1, 1, 2, 2}, []int32{0, 1, 0, 1, 0, 1}, 2},
		// A star: one row sees every column.
		{"star", 1, 4, []int32{0, 0, 0, 0}, []int32{0, 1, 2, 3}, 1},
	} {
		g := FromEdges(tc.rows, tc.cols, tc.er, tc.ec)
		m := Maximum(g, nil)
		if err := checkMatching(g, m); err != nil {
			t.Errorf("%s: %v", tc.name, err)
		}
		if m.Size != tc.want {
			t.Errorf("%s: got size %d, want %d", tc.name, m.Size, tc.want)
		}
	}
}

// The large shapes below must finish without stack growth (every
// traversal is iterative) or quadratic time.

// TestMaximumLongChain matches a directed chain of 10^7 states: the
// maximum matching leaves only the head unmatched (common practice: a path
// needs one driver).
func TestMaximumLongChain(t *testing.T) {
	n := 10_000_000
	if testing.Short() {
		n = 1_000_000
	}
	g := chainCSR(n)
	m := Maximum(g, nil)
	if m.Size != n-1 {
		t.Fatalf("got size %d, want %d", m.Size, n-1)
	}
	if m.ColMate[0] != -1 {
		t.Fatalf("column 0 (the head) is matched to %d, want unmatched", m.ColMate[0])
	}
}

func chainCSR(n int) *CSR {
	g := &CSR{Rows: n, Cols: n, Ptr: make([]int64, n+1), Adj: make([]int32, n-1)}
	for i := 0; i < n-1; i++ {
		g.Adj[i] = int32(i + 1)
		g.Ptr[i+1] = int64(i + 1)
	}
	g.Ptr[n] = int64(n - 1)
	return g
}

// TestAugmentLongPath starts augmentation from a matching whose only
// augmenting path runs through every vertex of a zigzag path of 2*10^6
// vertices (row i sees columns i and i+1 and holds column i+1; row n-1 and
// column 0 are free): a deep search that would overflow a recursive
// implementation's stack.
func TestAugmentLongPath(t *testing.T) {
	for _, f := range []int64{2, -1} {
		t.Run(fmt.Sprintf("budget=%d", f), func(t *testing.T) {
			defer func(old int64) { kuhnEdgeFactor = old }(kuhnEdgeFactor)
			kuhnEdgeFactor = f
			testAugmentLongPath(t)
		})
	}
}

func testAugmentLongPath(t *testing.T) {
	n := 1_000_000
	g := zigzag(n, 0)
	gt := Transpose(g)
	m := &Matching{RowMate: make([]int32, n), ColMate: make([]int32, n)}
	for i := 0; i+1 < n; i++ {
		m.RowMate[i] = int32(i + 1)
		m.ColMate[i+1] = int32(i)
	}
	m.RowMate[n-1] = -1
	m.ColMate[0] = -1
	m.Size = n - 1
	m.Size += augment(g, gt, m, nil)
	if err := checkMatching(g, m); err != nil {
		t.Fatal(err)
	}
	if m.Size != n {
		t.Fatalf("got size %d, want %d", m.Size, n)
	}
}

// TestMaximumCompleteBlock matches the complete bipartite graph K(3000,
// 3000): 9*10^6 edges, perfect matching.
func TestMaximumCompleteBlock(t *testing.T) {
	n := 3000
	g := &CSR{Rows: n, Cols: n, Ptr: make([]int64, n+1), Adj: make([]int32, n*n)}
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			g.Adj[i*n+j] = int32(j)
		}
		g.Ptr[i+1] = int64((i + 1) * n)
	}
	m := Maximum(g, nil)
	if m.Size != n {
		t.Fatalf("got size %d, want %d", m.Size, n)
	}
}

// TestMaximumKarpSipserHardLarge runs the Karp–Sipser-hard family at the
// size of Duff, Kaya & Uçar (2011), n = 3200, for several thicknesses t; the
// identities give a perfect matching.
func TestMaximumKarpSipserHardLarge(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 7))
	for _, th := range []int{2, 8, 32} {
		g := ksHard(1600, th)
		for _, gg := range []*CSR{g, permute(r, g)} {
			m := Maximum(gg, nil)
			if m.Size != 3200 {
				t.Fatalf("t=%d: got size %d, want 3200", th, m.Size)
			}
			if err := checkMatching(gg, m); err != nil {
				t.Fatalf("t=%d: %v", th, err)
			}
		}
	}
}
