package strong

// forcer runs the colour change rule of one forcing test on a system:
// rows (states) start white; a column forces its row r when r is the only
// white row the column holds and the entry (r, column) is Nonzero; r then
// turns black (coloured). Rows the design or a device colours directly are
// coloured from the start. The rule is that of Jia et al. 2021 for
// zero/nonzero/arbitrary patterns; on the free diagonal it is the zero
// forcing rule of Monshizadeh, Zhang & Camlibel 2014 (a white state's own
// Arbitrary diagonal keeps its column from forcing), on given diagonals
// that of loop graphs (Trefois & Delvenne 2015).
//
// Each column keeps the number of its white rows, how many of them are
// Arbitrary, and the XOR of their indices, so that the last white row is
// known in O(1) when the count reaches one. Colouring row r visits every
// column holding r once; a whole closure is O(N + E + signal entries), and
// a closure grown in steps (more rows coloured later) costs the same in
// total. Memory: three int32 per column and a byte per state.
type forcer struct {
	s    *system
	diag []Kind
	// Per column (states 0..n-1, then the signals), in one record so
	// that an update touches one cache line.
	col     []column
	colored []bool
	done    int
	queue   []int32
	// journal, when keep is set, lists the rows coloured in order, so
	// that undo can return to an earlier fixpoint.
	journal []int32
	keep    bool
	// stall, when not nil, collects columns whose white rows dropped to
	// between 2 and len(stall)-1, by count (see place.go).
	stall [][]int32
}

// column is one column's white rows: how many, how many of them
// arbitrary, and the XOR of their indices.
type column struct{ cnt, arb, xr int32 }

func newForcer(s *system, diag []Kind) *forcer {
	n, m := s.n, s.m
	f := &forcer{s: s, diag: diag, col: make([]column, n+m), colored: make([]bool, n)}
	out := s.out
	for u := int32(0); int(u) < n; u++ {
		var c, a, x int32
		for k := out.Ptr[u]; k < out.Ptr[u+1]; k++ {
			v := out.Adj[k]
			if v == u {
				continue
			}
			c++
			x ^= v
			if s.outMark != nil && s.outMark[k] {
				a++
			}
		}
		switch diag[u] {
		case Nonzero:
			c, x = c+1, x^u
		case Arbitrary:
			c, x, a = c+1, x^u, a+1
		}
		f.col[u] = column{c, a, x}
		if c == 1 && a == 0 {
			f.queue = append(f.queue, u)
		}
	}
	for i := 0; i < m; i++ {
		sg := s.signal(i)
		j := n + i
		var x int32
		for _, v := range sg {
			x ^= v
		}
		f.col[j] = column{cnt: int32(len(sg)), xr: x}
		if len(sg) == 1 {
			f.queue = append(f.queue, int32(j))
		}
	}
	return f
}

// drop removes white row r from column j.
func (f *forcer) drop(j, r int32, arbitrary bool) {
	cl := &f.col[j]
	c := cl.cnt - 1
	cl.cnt = c
	cl.xr ^= r
	if arbitrary {
		cl.arb--
	}
	if c == 1 {
		if cl.arb == 0 {
			f.queue = append(f.queue, j)
		}
	} else if f.stall != nil && c >= 2 && int(c) < len(f.stall) && cl.arb < c {
		f.stall[c] = append(f.stall[c], j)
	}
}

// colour turns row r black and updates every column holding it.
func (f *forcer) colour(r int32) {
	if f.colored[r] {
		return
	}
	f.colored[r] = true
	f.done++
	if f.keep {
		f.journal = append(f.journal, r)
	}
	s := f.s
	in := s.in
	for k := in.Ptr[r]; k < in.Ptr[r+1]; k++ {
		j := in.Adj[k]
		if j == r {
			continue
		}
		f.drop(j, r, s.inMark != nil && s.inMark[k])
	}
	if d := f.diag[r]; d != Zero {
		f.drop(r, r, d == Arbitrary)
	}
	for k := s.sigPtr[r]; k < s.sigPtr[r+1]; k++ {
		f.drop(int32(s.n)+s.sigAdj[k], r, false)
	}
}

// run applies the colour change rule until no column can force.
func (f *forcer) run() {
	for len(f.queue) > 0 {
		j := f.queue[len(f.queue)-1]
		f.queue = f.queue[:len(f.queue)-1]
		if cl := f.col[j]; cl.cnt == 1 && cl.arb == 0 {
			f.colour(cl.xr)
		}
	}
}

// complete reports whether every row is coloured.
func (f *forcer) complete() bool { return f.done == f.s.n }

// white returns the rows not coloured, in increasing order.
func (f *forcer) white() []int32 {
	out := make([]int32, 0, f.s.n-f.done)
	for v, c := range f.colored {
		if !c {
			out = append(out, int32(v))
		}
	}
	return out
}

// uncolour reverses colour(r); the caller restores a fixpoint.
func (f *forcer) uncolour(r int32) {
	f.colored[r] = false
	f.done--
	s := f.s
	in := s.in
	lift := func(j int32, arbitrary bool) {
		cl := &f.col[j]
		cl.cnt++
		cl.xr ^= r
		if arbitrary {
			cl.arb++
		}
	}
	for k := in.Ptr[r]; k < in.Ptr[r+1]; k++ {
		if j := in.Adj[k]; j != r {
			lift(j, s.inMark != nil && s.inMark[k])
		}
	}
	if d := f.diag[r]; d != Zero {
		lift(r, d == Arbitrary)
	}
	for k := s.sigPtr[r]; k < s.sigPtr[r+1]; k++ {
		lift(int32(s.n)+s.sigAdj[k], false)
	}
}

// undo uncolours the journal's rows after position mark, newest first.
// Called at a fixpoint reached from the fixpoint at mark, it returns the
// forcer to that fixpoint exactly (counts, XORs, colours; the queue is
// empty at both).
func (f *forcer) undo(mark int) {
	for i := len(f.journal) - 1; i >= mark; i-- {
		f.uncolour(f.journal[i])
	}
	f.journal = f.journal[:mark]
	f.queue = f.queue[:0]
}

// inDegree returns the number of entries row r holds: the columns that
// would list it in a witness (off-diagonal in-edges, the diagonal unless
// Zero in A itself, and the signals touching it).
func (s *system) inDegree(r int32) int64 {
	d := s.in.Ptr[r+1] - s.in.Ptr[r] + s.sigPtr[r+1] - s.sigPtr[r]
	lo := s.in.Ptr[r]
	if _, ok := search(s.in.Adj[lo:s.in.Ptr[r+1]], r); ok {
		d-- // the self-loop is counted as the diagonal below
	}
	if s.diag[r] != Zero {
		d++
	}
	return d
}
