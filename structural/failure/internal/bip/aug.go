package bip

import "github.com/netsteer/netsteer/matching"

// Aug keeps a working matching of a Graph in which columns can be switched
// off and on. Every change is logged, so Undo returns to any earlier Mark.
// Searches are breadth-first and iterative; Work counts the adjacency
// entries they scan.
type Aug struct {
	g                *Graph
	RowMate, ColMate []int32
	Off              []bool // switched-off columns
	Work             int64

	log     []change
	seen    []int32 // search stamp per row
	dead    []int32 // phase stamp per row: no augmenting path from here
	stamp   int32
	phase   int32
	from    []int32 // row: the row (or column, in column searches) it was reached from
	queue   []int32
	reached []int32
}

type change struct {
	kind uint8 // 0 RowMate, 1 ColMate, 2 Off
	at   int32
	old  int32
}

// NewAug starts from a copy of m, every column on.
func NewAug(g *Graph, m *matching.Matching) *Aug {
	a := &Aug{g: g, RowMate: append([]int32(nil), m.RowMate...), ColMate: append([]int32(nil), m.ColMate...),
		Off: make([]bool, g.N+g.K), seen: make([]int32, g.N), dead: make([]int32, g.N), from: make([]int32, g.N)}
	return a
}

// Mark returns a checkpoint for Undo.
func (a *Aug) Mark() int { return len(a.log) }

// Undo reverts every change made since the checkpoint.
func (a *Aug) Undo(mark int) {
	for i := len(a.log) - 1; i >= mark; i-- {
		c := a.log[i]
		switch c.kind {
		case 0:
			a.RowMate[c.at] = c.old
		case 1:
			a.ColMate[c.at] = c.old
		default:
			a.Off[c.at] = c.old != 0
		}
	}
	a.log = a.log[:mark]
}

func (a *Aug) setRow(r, c int32) {
	a.log = append(a.log, change{0, r, a.RowMate[r]})
	a.RowMate[r] = c
}

func (a *Aug) setCol(c, r int32) {
	a.log = append(a.log, change{1, c, a.ColMate[c]})
	a.ColMate[c] = r
}

func (a *Aug) setOff(c int32, off bool) {
	old := int32(0)
	if a.Off[c] {
		old = 1
	}
	a.log = append(a.log, change{2, c, old})
	a.Off[c] = off
}

func (a *Aug) next() int32 {
	a.stamp++
	if a.stamp == 1<<30 {
		for i := range a.seen {
			a.seen[i] = 0
		}
		a.stamp = 1
	}
	return a.stamp
}

// Disable switches column c off and returns the row it was matched to,
// now free, or -1.
func (a *Aug) Disable(c int32) int32 {
	if a.Off[c] {
		return -1
	}
	a.setOff(c, true)
	r := a.ColMate[c]
	if r >= 0 {
		a.setCol(c, -1)
		a.setRow(r, -1)
	}
	return r
}

// Enable switches column c on (unmatched).
func (a *Aug) Enable(c int32) {
	if a.Off[c] {
		a.setOff(c, false)
	}
}

// AugmentRows tries to match each free row of rows by an augmenting path
// over the columns that are on, and returns the rows left free. Rows whose
// search fails are not searched again within the call (nothing reachable
// from them can lead to a free column while the columns stay as they are),
// so failures cost one pass over the edges in all.
func (a *Aug) AugmentRows(rows []int32) []int32 {
	a.phase++
	var left []int32
	for _, r := range rows {
		if a.RowMate[r] >= 0 {
			continue
		}
		if !a.augmentRow(r) {
			left = append(left, r)
		}
	}
	return left
}

func (a *Aug) augmentRow(r0 int32) bool {
	if a.dead[r0] == a.phase {
		return false
	}
	st := a.next()
	q := a.queue[:0]
	a.seen[r0] = st
	a.from[r0] = -1
	q = append(q, r0)
	rows := &a.g.Rows
	for h := 0; h < len(q); h++ {
		r := q[h]
		lo, hi := rows.Ptr[r], rows.Ptr[r+1]
		a.Work += hi - lo
		for _, c := range rows.Adj[lo:hi] {
			if a.Off[c] {
				continue
			}
			x := a.ColMate[c]
			if x < 0 {
				// Flip the path r0 ... r, c.
				for {
					old := a.RowMate[r]
					a.setRow(r, c)
					a.setCol(c, r)
					if r == r0 {
						break
					}
					c = old
					r = a.from[r]
				}
				a.queue = q
				return true
			}
			if a.seen[x] != st && a.dead[x] != a.phase {
				a.seen[x] = st
				a.from[x] = r
				q = append(q, x)
			}
		}
	}
	for _, r := range q {
		a.dead[r] = a.phase
	}
	a.queue = q
	return false
}

// AugmentCol looks for an augmenting path starting at the unmatched column
// c (which must be on) and flips it; it reports whether the matching grew.
func (a *Aug) AugmentCol(c int32) bool { return a.colSearch(c, true) }

// CanAugmentCol reports whether adding column c (on or off, unmatched)
// would let the matching grow, without changing anything: c is outside the
// closure of the columns that are on.
func (a *Aug) CanAugmentCol(c int32) bool { return a.colSearch(c, false) }

func (a *Aug) colSearch(c0 int32, flip bool) bool {
	if a.ColMate[c0] >= 0 {
		return false
	}
	st := a.next()
	q := a.queue[:0]
	cols := &a.g.Cols
	// Rows are queued; the column a row was scanned from is from[row]
	// (c0 for the first layer, else the mate of the row it came from).
	visit := func(c int32) (int32, bool) {
		lo, hi := cols.Ptr[c], cols.Ptr[c+1]
		a.Work += hi - lo
		for _, r := range cols.Adj[lo:hi] {
			if a.seen[r] == st {
				continue
			}
			a.seen[r] = st
			a.from[r] = c
			if a.RowMate[r] < 0 {
				return r, true
			}
			q = append(q, r)
		}
		return -1, false
	}
	end, ok := visit(c0)
	for h := 0; !ok && h < len(q); h++ {
		end, ok = visit(a.RowMate[q[h]])
	}
	a.queue = q
	if !ok || !flip {
		return ok
	}
	r := end
	for {
		c := a.from[r]
		old := a.ColMate[c]
		a.setRow(r, c)
		a.setCol(c, r)
		if c == c0 {
			break
		}
		r = old
	}
	return true
}

// FreeRows returns the unmatched rows.
func (a *Aug) FreeRows() []int32 {
	var out []int32
	for r, c := range a.RowMate {
		if c < 0 {
			out = append(out, int32(r))
		}
	}
	return out
}

// AltReach returns the rows reached from the rows start by alternating
// paths over the columns that are on (a row, then any column on adjacent to
// it, then that column's mate), start included. The slice is reused by the
// next call; InReach tells whether a row is in it until then.
func (a *Aug) AltReach(start []int32) []int32 { r, _ := a.altReach(start, -1, -1, 0); return r }

// AltReachSkip is AltReach with the adjacency between row skipRow and column
// skipCol ignored (a lost link).
func (a *Aug) AltReachSkip(start []int32, skipRow, skipCol int32) []int32 {
	r, _ := a.altReach(start, skipRow, skipCol, 0)
	return r
}

// AltReachLimit is AltReachSkip stopping once limit rows are reached
// (nearest first, in breadth-first order); it reports whether it stopped
// early.
func (a *Aug) AltReachLimit(start []int32, skipRow, skipCol int32, limit int) ([]int32, bool) {
	return a.altReach(start, skipRow, skipCol, limit)
}

func (a *Aug) altReach(start []int32, skipRow, skipCol int32, limit int) ([]int32, bool) {
	st := a.next()
	q := a.reached[:0]
	for _, r := range start {
		if a.seen[r] != st {
			a.seen[r] = st
			q = append(q, r)
		}
	}
	rows := &a.g.Rows
	for h := 0; h < len(q); h++ {
		r := q[h]
		lo, hi := rows.Ptr[r], rows.Ptr[r+1]
		a.Work += hi - lo
		for _, c := range rows.Adj[lo:hi] {
			if a.Off[c] || r == skipRow && c == skipCol {
				continue
			}
			if x := a.ColMate[c]; x >= 0 && a.seen[x] != st {
				if limit > 0 && len(q) >= limit {
					a.reached = q
					return q, true
				}
				a.seen[x] = st
				q = append(q, x)
			}
		}
	}
	a.reached = q
	return q, false
}

// InReach reports whether row r was reached by the last AltReach.
func (a *Aug) InReach(r int32) bool { return a.seen[r] == a.stamp }

// Unmatch removes row r's matched edge, if any.
func (a *Aug) Unmatch(r int32) {
	if c := a.RowMate[r]; c >= 0 {
		a.setCol(c, -1)
		a.setRow(r, -1)
	}
}

// Rows returns the rows adjacent to column c.
func (a *Aug) Rows(c int32) []int32 { return a.g.Cols.Row(c) }

// NewAugOff starts from the matching rowMate/colMate (copied) with the
// columns marked in off switched off; they must be unmatched.
func NewAugOff(g *Graph, rowMate, colMate []int32, off []bool) *Aug {
	return &Aug{g: g, RowMate: append([]int32(nil), rowMate...), ColMate: append([]int32(nil), colMate...),
		Off: append([]bool(nil), off...), seen: make([]int32, g.N), dead: make([]int32, g.N), from: make([]int32, g.N)}
}
