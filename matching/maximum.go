package matching

import "github.com/netsteer/netsteer/matching/bigmem"

// Matching is a matching of a bipartite graph: RowMate[r] is the column
// matched to row r and ColMate[c] the row matched to column c, -1 when
// unmatched. Size is the number of matched pairs.
type Matching struct {
	RowMate []int32
	ColMate []int32
	Size    int
}

// Maximum returns a maximum-cardinality matching of g. gt must be the
// transpose of g (see Transpose) or nil, in which case it is computed.
//
// The matching is initialised by Karp–Sipser (degree-one reductions first,
// then the free edge to the column of fewest free neighbours) and completed
// by augmenting paths. A search that fails proves that the vertices it
// visited lead to no free vertex, now or after later augmentations (they
// and their mates form a closed alternating set); they are marked dead and
// never entered again, so failing searches together scan each edge once.
// Searches run breadth-first with lookahead, one per free vertex (Kuhn's
// method with dead marks), from the free rows and from the free columns in
// turn, and stop as soon as one side is exhausted, since an augmenting path
// needs a free vertex on both sides: on many networks one side is far
// cheaper to exhaust than the other. If successful searches grow expensive,
// the remaining free rows go on in phases of Pothen–Fan with lookahead and
// fairness (PF+; Duff, Kaya & Uçar, ACM TOMS 38(2):13, 2011), depth-first
// with a visit mark shared by the phase, so a phase costs at most one pass.
//
// Every search is iterative. Time is O(|E|) for the initialisation and
// O(|V||E|) in the worst case for the augmentation, near-linear on the
// sparse networks met in practice; memory is about 16 bytes per row and
// column during Karp–Sipser and 32 during augmentation, beyond the graph.
func Maximum(g, gt *CSR) *Matching {
	if gt == nil {
		gt = Transpose(g)
	}
	m := &Matching{RowMate: bigmem.Make[int32](g.Rows, g.Rows), ColMate: bigmem.Make[int32](g.Cols, g.Cols)}
	m.Size = karpSipser(g, gt, m)
	m.Size += augment(g, gt, m, nil)
	return m
}

// Augment grows m, a matching of g, to a maximum matching of g by the
// augmenting searches of Maximum (without its Karp–Sipser start), updates
// m.Size and returns the number of pairs added. Pairs of m stay matched
// rows and columns: an augmentation never leaves a matched vertex free. gt
// must be the transpose of g or nil. It suits a matching that is nearly
// maximum already, such as a maximum matching of a subgraph.
func Augment(g, gt *CSR, m *Matching) int {
	if gt == nil {
		gt = Transpose(g)
	}
	k := augment(g, gt, m, nil)
	m.Size += k
	return k
}

// AugmentWithout is Augment on g with the columns marked in without
// removed: it grows m to a maximum matching of that subgraph. m must match
// none of those columns; they stay free. gt must be the transpose of g
// (or nil). It spares a copy of the graph when only a few columns are
// removed.
func AugmentWithout(g, gt *CSR, m *Matching, without []bool) int {
	if gt == nil {
		gt = Transpose(g)
	}
	k := augment(g, gt, m, without)
	m.Size += k
	return k
}

// karpSipser fills m with a greedy matching: a vertex with exactly one free
// neighbour is matched to it (an optimal choice), and when none is left the
// next free row takes the free column with the fewest free neighbours.
//
// Each vertex keeps its state in one word, so a neighbour update touches one
// cache line: st >= 0 is the mate, st < 0 a free vertex with -1-st free
// incidences, and x the exclusive or of those incidences' indices, which is
// the last free neighbour itself once one is left (repeated edges cancel in
// pairs as they leave together).
func karpSipser(g, gt *CSR, m *Matching) int {
	nr, nc := g.Rows, g.Cols
	rs := bigmem.Make[ksState](nr, nr)
	cs := bigmem.Make[ksState](nc, nc)
	queue := make([]int32, 0, 1024) // degree-one vertices: rows r, columns as ^c
	gp, ga, tp, ta := g.Ptr, g.Adj, gt.Ptr, gt.Adj
	for r := 0; r < nr; r++ {
		x := int32(0)
		for _, c := range ga[gp[r]:gp[r+1]] {
			x ^= c
		}
		d := int32(gp[r+1] - gp[r])
		rs[r] = ksState{-1 - d, x}
		if d == 1 {
			queue = append(queue, int32(r))
		}
	}
	for c := 0; c < nc; c++ {
		x := int32(0)
		for _, r := range ta[tp[c]:tp[c+1]] {
			x ^= r
		}
		d := int32(tp[c+1] - tp[c])
		cs[c] = ksState{-1 - d, x}
		if d == 1 {
			queue = append(queue, ^int32(c))
		}
	}
	size := 0
	// Rows below lo have been passed by the greedy sweep below: each is
	// matched or has no free neighbour, so none is a neighbour of a free
	// column and match skips them without touching their state (a cache
	// miss each; about half of a column's rows once the sweep is under way).
	lo := int32(0)
	// match pairs row r with column c and removes them from the free
	// neighbourhoods of their neighbours, queueing those left with one.
	match := func(r, c int32) {
		rs[r].st = c
		cs[c].st = r
		size++
		for _, c2 := range ga[gp[r]:gp[r+1]] {
			if s := &cs[c2]; s.st < 0 {
				s.st++
				s.x ^= r
				if s.st == -2 {
					queue = append(queue, ^c2)
				}
			}
		}
		for _, r2 := range ta[tp[c]:tp[c+1]] {
			if r2 < lo {
				continue
			}
			if s := &rs[r2]; s.st < 0 {
				s.st++
				s.x ^= c
				if s.st == -2 {
					queue = append(queue, r2)
				}
			}
		}
	}
	drain := func() {
		for len(queue) > 0 {
			v := queue[len(queue)-1]
			queue = queue[:len(queue)-1]
			if v >= 0 {
				if s := rs[v]; s.st == -2 {
					match(v, s.x)
				}
			} else if s := cs[^v]; s.st == -2 {
				match(s.x, ^v)
			}
		}
	}
	drain()
	for r := int32(0); int(r) < nr; r++ {
		lo = r
		if rs[r].st >= -1 {
			continue // matched, or no free neighbour left
		}
		best, bestSt := int32(-1), int32(0)
		for _, c := range ga[gp[r]:gp[r+1]] {
			// The largest negative state has the fewest free neighbours.
			if st := cs[c].st; st < 0 && (best < 0 || st > bestSt) {
				best, bestSt = c, st
				if st == -2 {
					break
				}
			}
		}
		if best >= 0 {
			match(r, best)
			drain()
		}
	}
	for r := range rs {
		m.RowMate[r] = max(rs[r].st, -1)
	}
	for c := range cs {
		m.ColMate[c] = max(cs[c].st, -1)
	}
	return size
}

// ksState is a vertex during Karp–Sipser; see karpSipser.
type ksState struct{ st, x int32 }

// vinfo is the search state of one vertex, row or column, in one cache
// line's worth of words: its mate, the mark left on it by searches from the
// other side, and its own lookahead offset and search link, used when
// searches start from its side.
type vinfo struct {
	mate int32 // the matched vertex of the other side, or -1
	mark int32 // 0, visiting (1), dead, or a Pothen–Fan search number
	look int32 // lookahead offset: neighbours before it are matched
	link int32 // breadth-first: the vertex it was reached from; depth-first: scan offset
}

// dead marks a vertex from which no alternating path reaches a free vertex
// of the searching side's target.
const dead = -1

// visiting marks the vertices visited by the current breadth-first search.
const visiting = 1

// removedMate is the mate of a column AugmentWithout removes while it
// runs: not negative, so the column is never free, and never read as a
// row, since the column is dead.
const removedMate = 1<<31 - 1

// augment completes m to a maximum matching and returns the number of
// augmentations.
//
// An augmenting path joins a free row to a free column, so the matching is
// maximum as soon as every free row, or every free column, has been shown to
// start none. Searches run from both sides, each side with its own dead
// marks, always on the side that has done less work so far, and stop when
// one side has tried all its roots. Which side is cheaper depends on the
// graph: on a random directed network with <k> = 10 after Karp–Sipser, the
// failing searches from the rows touch 95% of the columns and those from the
// columns under 0.1% of the rows, or the other way round.
func augment(g, gt *CSR, m *Matching, without []bool) int {
	nr, nc := g.Rows, g.Cols
	var side [2]kuhnSide
	for r := 0; r < nr; r++ {
		if m.RowMate[r] < 0 && g.Ptr[r+1] > g.Ptr[r] {
			side[0].roots = append(side[0].roots, int32(r))
		}
	}
	for c := 0; c < nc; c++ {
		if m.ColMate[c] < 0 && gt.Ptr[c+1] > gt.Ptr[c] && (without == nil || !without[c]) {
			side[1].roots = append(side[1].roots, int32(c))
		}
	}
	if len(side[0].roots) == 0 || len(side[1].roots) == 0 {
		return 0 // no augmenting path can start or end anywhere
	}
	rows := bigmem.Make[vinfo](nr, nr)
	cols := bigmem.Make[vinfo](nc, nc)
	for r, c := range m.RowMate {
		rows[r].mate = c
	}
	for c, r := range m.ColMate {
		cols[c].mate = r
	}
	// Removed columns look matched and dead: no lookahead takes them and
	// no search enters them (both read the mark before the mate).
	for c, x := range without {
		if x {
			cols[c] = vinfo{mate: removedMate, mark: dead}
		}
	}
	copyBack := func() {
		for r, x := range rows {
			m.RowMate[r] = x.mate
		}
		for c, x := range cols {
			if x.mate == removedMate {
				x.mate = -1
			}
			m.ColMate[c] = x.mate
		}
	}
	side[0].g, side[0].own, side[0].other, side[0].cur = g, rows, cols, -1
	side[1].g, side[1].own, side[1].other, side[1].cur = gt, cols, rows, -1
	added := 0
	budget := kuhnEdgeFactor*int64(len(g.Adj)) + int64(nr+nc)
	if kuhnEdgeFactor < 0 {
		budget = -1 // tests: Pothen–Fan phases only
	}
	var spent int64 // scans by successful searches
	for spent <= budget {
		s := pickSide(&side[0], &side[1])
		if s.cur >= 0 {
			if s.own[s.cur].mate >= 0 {
				s.abandon() // the other side matched this root
			} else if s.stale {
				s.restart() // the other side changed mates this search followed
			}
		}
		if s.cur < 0 {
			for s.next < len(s.roots) && s.own[s.roots[s.next]].mate >= 0 {
				s.next++
			}
			if s.next == len(s.roots) {
				// Every root of this side matched or proved dead.
				copyBack()
				return added
			}
			s.start(s.roots[s.next])
			s.next++
		}
		done, ok, stale := s.advance(searchSlice)
		if done && ok {
			added++
			spent += s.scans
			if stale {
				o := &side[0]
				if s == o {
					o = &side[1]
				}
				o.stale = true
			}
		}
	}
	// A suspended row search is not finished: its root goes on too.
	if s := &side[0]; s.cur >= 0 {
		s.abandon()
		s.next--
	}
	if s := &side[1]; s.cur >= 0 {
		s.abandon() // its marks are on rows, which the phases below ignore
	}
	// Successful searches grew expensive: the rows not yet tried go on in
	// Pothen–Fan phases. Marks left by the column side are on rows, which
	// those phases do not read.
	free := side[0].roots[side[0].next:]
	added += pothenFan(g, rows, cols, free)
	copyBack()
	return added
}

// pickSide returns the side that gets the next slice of scans: the one
// whose remaining roots, at its cost per root so far, should take less work
// to exhaust, unless it has already done more than ahead times the other's
// work, which bounds the loss when the estimate misleads. Searches are
// suspended between slices, so one huge failing search on the expensive
// side cannot hold up the cheap side.
func pickSide(a, b *kuhnSide) *kuhnSide {
	const ahead = 3
	switch {
	case a.work > ahead*b.work+searchSlice:
		return b
	case b.work > ahead*a.work+searchSlice:
		return a
	}
	if b.estimate() < a.estimate() {
		return b
	}
	return a
}

// estimate is the work this side's remaining roots should take, at the
// mean cost of the roots finished so far (counting the current search as
// finished), plus the work of the current search.
func (s *kuhnSide) estimate() float64 {
	done := float64(s.next)
	if s.cur >= 0 {
		done-- // started, not finished
	}
	left := float64(len(s.roots) - s.next)
	perRoot := float64(s.work) / max(done, 1)
	return perRoot * left
}

// searchSlice is the number of edge scans a side runs before the other
// side may take its turn.
const searchSlice = 1 << 12

// kuhnSide runs searches from the free vertices of one side: the rows
// (g the graph, own the rows, other the columns) or the columns (g the
// transpose, own the columns, other the rows).
type kuhnSide struct {
	g          *CSR
	own, other []vinfo
	roots      []int32
	next       int   // roots[:next] have been started
	work       int64 // edges scanned in all

	// The current search, breadth-first from cur (-1 for none): queue[qi:]
	// are still to be expanded, visited lists the vertices of the other side
	// it marked, scans counts its edge scans, and stale is set when an
	// augmentation from the other side went through a vertex it visited.
	cur     int32
	queue   []int32
	qi      int
	visited []int32
	scans   int64
	stale   bool
}

// start begins a search from root.
func (s *kuhnSide) start(root int32) {
	s.cur = root
	s.queue = append(s.queue[:0], root)
	s.qi = 0
	s.visited = s.visited[:0]
	s.scans = 0
	s.stale = false
}

// abandon drops the current search.
func (s *kuhnSide) abandon() {
	for _, w := range s.visited {
		s.other[w].mark = 0
	}
	s.cur = -1
}

// restart begins the current search again: an augmentation from the other
// side changed mates it followed.
func (s *kuhnSide) restart() {
	root := s.cur
	s.abandon()
	s.start(root)
}

// advance runs the current search for about quota edge scans. It looks for
// an augmenting path breadth-first, with lookahead for a free neighbour
// (Kuhn's method, one search per root, in the manner of Duff, Kaya & Uçar,
// ACM TOMS 38(2):13, 2011), and augments along it. A search that fails
// leaves every vertex it visited on the other side dead: they and their
// mates form a closed alternating set with no free vertex, which no
// augmentation, from either side, can ever enter, so failing searches
// together scan each edge once. Breadth-first order lets the memory
// accesses for one vertex's neighbours overlap. It reports whether the
// search ended and, if so, whether it augmented, and whether the path went
// through a vertex that the other side's suspended search has visited
// (marked on this side's vertices), which makes that search stale.
func (s *kuhnSide) advance(quota int64) (done, success, stale bool) {
	ptr, adj := s.g.Ptr, s.g.Adj
	own, other := s.own, s.other
	root := s.cur
	queue, visited := s.queue, s.visited
	var used int64
	qi := s.qi
search:
	for ; qi < len(queue); qi++ {
		if used >= quota {
			s.queue, s.visited, s.qi = queue, visited, qi
			s.scans += used
			s.work += used
			return false, false, false
		}
		v := queue[qi]
		vi := &own[v]
		lo, hi := ptr[v], ptr[v+1]
		deg := int32(hi - lo)
		for vi.look < deg {
			w := adj[lo+int64(vi.look)]
			vi.look++
			if other[w].mate < 0 {
				// Augment back along the links.
				for {
					if own[v].mark == visiting {
						stale = true
					}
					prev := own[v].mate
					own[v].mate = w
					other[w].mate = v
					if v == root {
						break
					}
					w = prev
					v = own[v].link
				}
				success = true
				break search
			}
		}
		used += hi - lo + 1
		for _, w := range adj[lo:hi] {
			wi := &other[w]
			if wi.mark != 0 {
				continue // dead, or visited by this search
			}
			wi.mark = visiting
			visited = append(visited, w)
			v2 := wi.mate // matched: lookahead saw every free neighbour
			own[v2].link = v
			queue = append(queue, v2)
		}
	}
	mark := int32(dead)
	if success {
		mark = 0
	}
	for _, w := range visited {
		other[w].mark = mark
	}
	s.queue, s.visited = queue, visited
	s.scans += used
	s.work += used + 1
	s.cur = -1
	return true, success, stale
}

// pothenFan augments from the free rows in phases of Pothen–Fan with
// lookahead and fairness (PF+; Duff, Kaya & Uçar 2011): each phase runs a
// depth-first search from every free row with a visit mark shared by the
// phase, so a phase finds vertex-disjoint augmenting paths in one pass over
// the graph, and phases alternate the scan direction. Columns marked dead
// are skipped; a search that fails without meeting a column claimed by a
// successful search of its phase marks its columns dead and drops its root.
// It returns the number of augmentations.
func pothenFan(g *CSR, rows, cols []vinfo, free []int32) int {
	ptr, adj := g.Ptr, g.Adj
	unmatchedCols := 0
	for _, x := range cols {
		if x.mate < 0 {
			unmatchedCols++
		}
	}
	added := 0
	search := int32(visiting)       // search numbers start above the Kuhn marks
	stack := make([]int32, 0, 64)   // rows on the current alternating path
	visited := make([]int32, 0, 64) // columns visited by the current search
	free = append([]int32(nil), free...)
	for phase := 0; len(free) > 0 && unmatchedCols > 0; phase++ {
		forward := phase%2 == 0
		phaseStart := search + 1
		found := 0
		k := 0 // free[:k] are the roots kept for the next phase
		for _, root := range free {
			if rows[root].mate >= 0 {
				continue
			}
			if unmatchedCols == 0 {
				break
			}
			search++
			cur := search
			touchedLive := false
			visited = visited[:0]
			stack = append(stack[:0], root)
			rows[root].link = 0
			success := false
			for len(stack) > 0 {
				r := stack[len(stack)-1]
				ri := &rows[r]
				lo, hi := ptr[r], ptr[r+1]
				deg := int32(hi - lo)
				// Lookahead: a free column adjacent to r ends the path.
				endCol := int32(-1)
				for ri.look < deg {
					c := adj[lo+int64(ri.look)]
					ri.look++
					if cols[c].mate < 0 {
						endCol = c
						break
					}
				}
				if endCol >= 0 {
					c := endCol
					for i := len(stack) - 1; i >= 0; i-- {
						rr := stack[i]
						prev := rows[rr].mate
						rows[rr].mate = c
						cols[c].mate = rr
						c = prev
					}
					success = true
					break
				}
				// Descend to an unvisited live column; all of r's columns
				// are matched now (columns never lose their mates).
				advanced := false
				for ri.link < deg {
					var c int32
					if forward {
						c = adj[lo+int64(ri.link)]
					} else {
						c = adj[hi-1-int64(ri.link)]
					}
					ri.link++
					ci := &cols[c]
					mk := ci.mark
					if mk == dead {
						continue
					}
					if mk >= phaseStart {
						if mk != cur {
							touchedLive = true
						}
						continue
					}
					ci.mark = cur
					visited = append(visited, c)
					r2 := ci.mate
					rows[r2].link = 0
					stack = append(stack, r2)
					advanced = true
					break
				}
				if !advanced {
					stack = stack[:len(stack)-1]
				}
			}
			if success {
				found++
				unmatchedCols--
				continue
			}
			if touchedLive {
				free[k] = root
				k++
				continue
			}
			// A clean failure: the visited columns and their rows form a
			// closed alternating set with no free column; no later
			// augmentation can enter it, so it is dead for good.
			for _, c := range visited {
				cols[c].mark = dead
			}
		}
		free = free[:k]
		added += found
		if found == 0 {
			break
		}
	}
	return added
}

// kuhnEdgeFactor sets the budget of the breadth-first searches, in edges
// scanned by successful searches per edge of the graph; tests set it below
// zero to exercise the Pothen–Fan phases alone.
var kuhnEdgeFactor int64 = 2
