package structural

import (
	"math"

	"github.com/netsteer/netsteer/matching"
)

// Dimension returns the generic dimension of the controllable subspace of
// design d (the observable subspace, for Observability): the rank of
// [B AB ... A^(N-1)B] for almost all values of the free parameters. It is
// N exactly when the design is structurally controllable. Networks of more
// than 2^29 states give a *TooLargeError.
//
// Hosoe ("Determination of generic dimensions of controllable subspaces and
// its application", IEEE TAC 25(6):1208-1213, 1980) shows that on the part
// R of the network the inputs reach, the dimension is the largest number of
// states covered by vertex-disjoint cycles and stems (paths starting at
// distinct inputs). States outside R never move from zero, so they add
// nothing. This is not the term rank of [A B], which also counts paths
// that start at an uncovered state: u -> x1, x1 -> x2, x1 -> x3,
// x2 -> x4, x3 -> x5 has term rank 4 but dimension 3.
//
// The largest cover is a minimum-cost assignment. Rows are the states of
// R, each needing one feeder; columns are the states of R and the inputs,
// each feeding at most one row. Row w may take column v for an edge
// v -> w inside R and column i for an input i driving w, at cost 0, or its
// own column at cost 1: w is then uncovered, and its own column feeds
// nobody else. In an assignment of every row, the covered states each
// have one feeder (a covered state or an input) and at most one successor
// (a covered state), so they form cycles and paths; a path cannot start at
// a state, whose column would then be its own, so every path starts at an
// input: the covered states are a family of cycles and stems, and the cost
// counts the uncovered states, so dimension = |R| - minimum cost. (The
// columns left free are the stem ends and the unused inputs.)
//
// The assignment starts from a maximum matching of [A B] restricted to R
// (all cost-0 choices) and is completed by successive shortest augmenting
// paths from the rows still without a feeder, in levels: a multi-source
// Dial search on reduced costs gives the next distance and raises the
// potentials so that the shortest paths become admissible (reduced cost
// 0); then every row still without a feeder is searched once,
// breadth-first along admissible arcs, and augmented at once when the
// search finds a free column. A search that fails proves that every row it
// visited can reach no free column admissibly, and augmenting elsewhere
// never changes that while the potentials stay (the arcs that change lie
// on augmenting paths, whose rows could reach one): those rows are marked
// dead and never entered again in the level, so the failing searches of a
// level together scan each arc once. Costs are 0 and 1 and the optimum is
// at most |R|, so the distance rises at every level and there are
// O(sqrt |R|) levels (in practice a handful: on directed Erdős–Rényi
// networks with <k> = 10 judged with half of a minimum design, 3 or 4);
// each Dial search is O(N + E + the input entries), and so are the failing
// searches of a level. Each column has a single residual arc (to the row
// it feeds, or out when free), so it is contracted away: the residual
// network is implicit in a few int32 arrays over the states and inputs,
// and every traversal is iterative.
func Dimension(g *Network, p Property, d Design) (int, error) {
	if !d.Of(g) {
		return 0, ErrForeignDesign
	}
	h := g.on(p)
	n := h.N()
	var reached []bool
	var nR int
	reachDone := make(chan struct{})
	go func() {
		defer close(reachDone)
		reached, nR = reach(h, d.signals)
	}()
	var b *matching.CSR
	m := h.designMatching(d.signals, &b)
	<-reachDone
	if nR == n && m.Size == n {
		return n, nil
	}
	if b == nil {
		b = inNeighbourCSR(h, d.signals)
	}
	return dimension(h, d.signals, reached, nR, b, m)
}

// Assignment records. For the row of state w, pred is the column feeding
// it: state v (0 <= v < n), input i (n+i), coverSelf (w is uncovered) or
// coverNone (a row still without a feeder). For the column of state v,
// succ is the row it feeds, coverSelf (v is uncovered) or coverNone (free);
// for input i, inSucc[i] likewise (never coverSelf).
const (
	coverNone  = -1
	coverSelf  = -2
	infinity32 = math.MaxInt32
)

// coverNode is what a search reads for every arc into a row, kept together
// so that following an arc touches one cache line: the row's potential and
// visit stamp, and the column of the same state (whose mate the arcs
// through it lead to).
type coverNode struct {
	pred  int32 // the row's feeder (see the records)
	succ  int32 // the row the state's column feeds
	q     int32 // potential: the reduced cost c + q[x] - q[y] is >= 0
	stamp int32 // search of the last visit, or -level when dead
}

// cover is the residual network of the assignment, contracted to the rows.
// An arc from row x leads through a column c that x may take to the row c
// feeds now (which must then find another feeder), or out of the network
// when c is free. Free columns keep potential 0 throughout.
type cover struct {
	g        *Network
	n        int32
	inR      []bool
	node     []coverNode
	inSucc   []int32 // per input: the row it feeds, or coverNone
	inPtr    []int64 // inputs driving each state w: inputsOf[inPtr[w]:inPtr[w+1]]
	inputsOf []int32
	inputs   [][]int32
	dist     []int32 // Dial distances, infinity32 outside a search
	parent   []int32 // the row a search came from
	via      []int32 // the column the parent takes (state, n+i, or viaSelf)
	level    int32   // potentials' generation; stamp -level marks dead rows
	search   int32
	visited  []int32
	queue    []int32
	hot      []int32
	touched  []int32
	buckets  [][]int32
}

// viaSelf marks the arc by which a row takes its own column at cost 1.
const viaSelf = -1

// arcEnd is where an arc of the contracted network leads: a row (>= 0),
// out through a free column (arcOut), or nowhere (arcNone: the arc is not
// residual, or leads back to its tail).
const (
	arcOut  = -1
	arcNone = -2
)

// throughState follows the arc of row x through the column of state c:
// where it leads and its cost. The column must be one x may take (c acts
// on x inside R).
func (f *cover) throughState(x, c int32) (int32, int32) {
	if f.node[x].pred == c {
		return arcNone, 0
	}
	switch s := f.node[c].succ; s {
	case coverNone:
		return arcOut, 0
	case coverSelf:
		if c == x {
			return arcNone, 0
		}
		return c, -1 // c's row loses its own column: c is covered again
	default:
		return s, 0
	}
}

// throughInput follows the arc of row x through input column n+i.
func (f *cover) throughInput(x, i int32) (int32, int32) {
	if f.node[x].pred == f.n+i {
		return arcNone, 0
	}
	if s := f.inSucc[i]; s != coverNone {
		return s, 0
	}
	return arcOut, 0
}

// throughOwn follows the arc by which row x takes its own column (cost 1).
func (f *cover) throughOwn(x int32) (int32, int32) {
	if f.node[x].pred == coverSelf {
		return arcNone, 0
	}
	switch s := f.node[x].succ; {
	case s == coverNone:
		return arcOut, 1
	case s == x:
		return arcNone, 0 // covered by its own loop already
	default:
		return s, 1
	}
}

// dimension computes the largest stem-cycle cover on the reached states,
// starting from m, a maximum matching of b = inNeighbourCSR(g, inputs).
func dimension(g *Network, inputs [][]int32, inR []bool, nR int, b *matching.CSR, m *matching.Matching) (int, error) {
	n := g.N()
	if nR == 0 {
		return 0, nil
	}
	if int64(n)+1+int64(len(inputs)) > math.MaxInt32/2 || nR > math.MaxInt32/4 {
		return 0, &TooLargeError{What: "the controllable dimension", States: n, Limit: math.MaxInt32 / 4}
	}
	f := &cover{g: g, n: int32(n), inR: inR, inputs: inputs, level: 1}
	f.node = make([]coverNode, n)
	f.inSucc = make([]int32, len(inputs))
	f.dist = make([]int32, n)
	f.parent = make([]int32, n)
	f.via = make([]int32, n)
	f.inPtr = make([]int64, n+1)
	for _, in := range inputs {
		for _, w := range in {
			f.inPtr[w+1]++
		}
	}
	for w := 0; w < n; w++ {
		f.inPtr[w+1] += f.inPtr[w]
	}
	f.inputsOf = make([]int32, f.inPtr[n])
	next := make([]int64, n)
	copy(next, f.inPtr[:n])
	for i, in := range inputs {
		for _, w := range in {
			f.inputsOf[next[w]] = int32(i)
			next[w]++
		}
	}
	next = nil
	for i := range f.node {
		f.node[i] = coverNode{pred: coverNone, succ: coverNone}
		f.dist[i] = infinity32
	}
	for i := range f.inSucc {
		f.inSucc[i] = coverNone
	}
	// Cost-0 start: a maximum matching of [A B] restricted to R. Rows are
	// states needing a feeder; column c < n is a state, c >= n an input.
	m = restrictedMatching(g, inputs, b, m, inR)
	var open []int32
	for w := 0; w < n; w++ {
		if !inR[w] {
			continue
		}
		switch c := m.RowMate[w]; {
		case c >= int32(n):
			f.node[w].pred, f.inSucc[c-int32(n)] = c, int32(w)
		case c >= 0 && inR[c]:
			f.node[w].pred, f.node[c].succ = c, int32(w)
		default:
			open = append(open, int32(w))
		}
	}
	// Levels: the next distance, then one search from every open row. The
	// first level's potentials come from the free columns' side, whose
	// cheap region is often far smaller than the open rows' one.
	guessed := len(open) > 0 && f.nearPotentials()
	for len(open) > 0 {
		var d int32 = 1
		if !guessed {
			d = f.shortest(open)
		}
		if d > 0 {
			f.level++ // new potentials: earlier dead marks no longer hold
		}
		if f.augment(open) == 0 && !guessed {
			panic("structural: internal error: the cover assignment makes no progress")
		}
		guessed = false
		k := 0
		for _, w := range open {
			if f.node[w].pred == coverNone {
				open[k] = w
				k++
			}
		}
		open = open[:k]
	}
	uncovered := 0
	for v := 0; v < n; v++ {
		if inR[v] && f.node[v].pred == coverSelf {
			uncovered++
		}
	}
	return nR - uncovered, nil
}

// restrictedMatching returns a maximum matching of the part of b on the
// reached states (rows of R, columns of R and the inputs), from m, a maximum
// matching of b: m itself when no row of R is matched to an unreached
// state, else m without those pairs, completed by augmenting paths that
// avoid the unreached states' columns (a few, as the unreached part is
// closed under in-neighbours and meets R only along its edges into R; the
// rows of unreached states have no other columns, so they stay free).
func restrictedMatching(g *Network, inputs [][]int32, b *matching.CSR, m *matching.Matching, inR []bool) *matching.Matching {
	n := int32(len(inR))
	dropped := false
	for w, c := range m.RowMate {
		if c >= 0 && c < n && !inR[c] && inR[w] {
			dropped = true
			break
		}
	}
	if !dropped {
		return m
	}
	without := make([]bool, b.Cols)
	for c := range n {
		without[c] = !inR[c]
	}
	mr := &matching.Matching{RowMate: make([]int32, b.Rows), ColMate: make([]int32, b.Cols)}
	for i := range mr.ColMate {
		mr.ColMate[i] = -1
	}
	for w, c := range m.RowMate {
		mr.RowMate[w] = -1
		if c >= 0 && !without[c] {
			mr.RowMate[w], mr.ColMate[c] = c, int32(w)
			mr.Size++
		}
	}
	matching.AugmentWithout(b, inNeighbourCSRT(g, inputs), mr, without)
	return mr
}

// nearPotentials sets the potentials of the first level from the free
// columns' side, before any state is uncovered (no arc costs -1): rows that
// reach a free column at cost 0 ("near" rows, found by one backward search
// from the free columns) keep potential 0, and every other row of R gets
// -1, which is min(t, 1) - 1 for t a row's distance to a free column. Every
// reduced cost stays non-negative (a row with a cost-0 arc to a near row,
// or to a free column, is near itself) and the paths of cost 1 become
// admissible; if the distance of the open rows is 2 or more, no search of
// the level succeeds and the next level's Dial search finds it. It reports
// false when there are no free columns.
func (f *cover) nearPotentials() bool {
	nd := f.node
	out := f.g.out
	n := f.n
	queue := f.queue[:0]
	near := func(x int32) {
		if f.inR[x] && nd[x].stamp != -1 {
			nd[x].stamp = -1
			queue = append(queue, x)
		}
	}
	// A column leads rows it may feed to itself: the states it acts on,
	// or those the input drives.
	from := func(c int32) {
		if c >= n {
			for _, x := range f.inputs[c-n] {
				near(x)
			}
			return
		}
		for _, x := range out.Adj[out.Ptr[c]:out.Ptr[c+1]] {
			near(x)
		}
	}
	free := 0
	for c := int32(0); c < n; c++ {
		if f.inR[c] && nd[c].succ == coverNone {
			free++
			from(c)
		}
	}
	for i, s := range f.inSucc {
		if s == coverNone {
			free++
			from(n + int32(i))
		}
	}
	if free == 0 {
		f.queue = queue
		return false
	}
	// Backwards: x reaches near row y at cost 0 through y's feeder.
	for k := 0; k < len(queue); k++ {
		if c := nd[queue[k]].pred; c >= 0 {
			from(c)
		}
	}
	f.queue = queue
	for x := range nd {
		switch {
		case nd[x].stamp == -1:
			nd[x].stamp = 0
		case f.inR[x]:
			nd[x].q = -1
		}
	}
	return true
}

// shortest runs Dial's algorithm on reduced costs from all open rows until
// the nearest free column, at distance D, and raises the potentials: q[x]
// += min(dist[x], D) - D, which keeps every reduced cost non-negative and
// makes the arcs of shortest paths admissible (reduced cost 0). It
// returns D.
func (f *cover) shortest(open []int32) int32 {
	nd := f.node
	inAdj, inPtr := f.g.in.Adj, f.g.in.Ptr
	bound := int32(infinity32) // the best distance out so far
	push := func(x, d int32) {
		if f.dist[x] == infinity32 {
			f.touched = append(f.touched, x)
		}
		f.dist[x] = d
		for int(d) >= len(f.buckets) {
			f.buckets = append(f.buckets, nil)
		}
		f.buckets[d] = append(f.buckets[d], x)
	}
	// relax records the arc from x (at distance d) to y at cost c.
	relax := func(x, d, y, c int32) {
		switch y {
		case arcNone:
		case arcOut:
			if t := d + c + nd[x].q; t < bound {
				bound = t
			}
		default:
			if t := d + c + nd[x].q - nd[y].q; t < f.dist[y] && t < bound {
				push(y, t)
			}
		}
	}
	for _, w := range open {
		push(w, 0)
	}
scan:
	for d := int32(0); int(d) < len(f.buckets); d++ {
		for i := 0; i < len(f.buckets[d]); i++ {
			if d >= bound {
				break scan // every row nearer than the way out is final
			}
			x := f.buckets[d][i]
			if f.dist[x] != d {
				continue // a stale entry: x was pushed again nearer
			}
			for _, c := range inAdj[inPtr[x]:inPtr[x+1]] {
				if f.inR[c] {
					y, cost := f.throughState(x, c)
					relax(x, d, y, cost)
				}
			}
			for _, i := range f.inputsOf[f.inPtr[x]:f.inPtr[x+1]] {
				y, cost := f.throughInput(x, i)
				relax(x, d, y, cost)
			}
			y, cost := f.throughOwn(x)
			relax(x, d, y, cost)
		}
	}
	if bound == infinity32 {
		panic("structural: internal error: no augmenting path in the cover assignment")
	}
	for _, x := range f.touched {
		if d := f.dist[x]; d < bound {
			nd[x].q += d - bound
		}
		f.dist[x] = infinity32
	}
	f.touched = f.touched[:0]
	for i := range f.buckets {
		f.buckets[i] = f.buckets[i][:0]
	}
	return bound
}

// arcs returns the number of residual arc positions of row x: its own
// column first, then the columns of its in-neighbours, then those of the
// inputs driving it.
func (f *cover) arcs(x int32) int64 {
	return 1 + f.g.in.Ptr[x+1] - f.g.in.Ptr[x] + f.inPtr[x+1] - f.inPtr[x]
}

// arcAt returns where the arc at position p of row x leads, its cost and
// the column x takes by it (a state, n+i, or viaSelf).
func (f *cover) arcAt(x int32, p int64) (y, cost, via int32) {
	if p == 0 {
		y, cost = f.throughOwn(x)
		return y, cost, viaSelf
	}
	p--
	lo, hi := f.g.in.Ptr[x], f.g.in.Ptr[x+1]
	if p < hi-lo {
		c := f.g.in.Adj[lo+p]
		if !f.inR[c] {
			return arcNone, 0, 0
		}
		y, cost = f.throughState(x, c)
		return y, cost, c
	}
	i := f.inputsOf[f.inPtr[x]+p-(hi-lo)]
	y, cost = f.throughInput(x, i)
	return y, cost, f.n + i
}

// augment searches once from every open row that is not dead along
// admissible arcs, and augments along the first way out it finds. The
// search is breadth-first, with one lookahead: a row just reached is
// tried at once through its own column, and the row that leads to, and
// all rows reached from there, are explored before the breadth-first
// queue goes on. On the networks met in practice most open rows lie in a
// large region from which free columns are reached only through some
// row's own column, into a small region where they are near; the
// lookahead stops the search at the row that crosses, without expanding
// the whole last layer. A search that finds no way out marks every row it
// visited dead for the level. It returns the number of augmentations.
func (f *cover) augment(open []int32) int {
	nd := f.node
	dead := -f.level
	found := 0
	for _, root := range open {
		if nd[root].pred != coverNone || nd[root].stamp == dead {
			continue
		}
		if f.search == math.MaxInt32 {
			// Search numbers run out: forget the visits (dead marks stay).
			for i := range nd {
				if nd[i].stamp > 0 {
					nd[i].stamp = 0
				}
			}
			f.search = 0
		}
		f.search++
		search := f.search
		nd[root].stamp = search
		visited := append(f.visited[:0], root) // every row this search visited
		fifo := append(f.queue[:0], root)      // rows to expand, in order
		hot := f.hot[:0]                       // rows to expand first
		next := 0                              // fifo[next:] are still to expand
		out, outVia := int32(-1), int32(0)
		// visit records that x reaches y by the admissible arc through
		// column via; it reports a way out found by the lookahead.
		visit := func(x, y, via int32, first bool) bool {
			nd[y].stamp = search
			f.parent[y], f.via[y] = x, via
			visited = append(visited, y)
			if first {
				hot = append(hot, y)
			} else {
				fifo = append(fifo, y)
			}
			if w, c := f.throughOwn(y); w == arcOut {
				if c+nd[y].q == 0 {
					out, outVia = y, viaSelf
					return true
				}
			} else if w >= 0 && c+nd[y].q == nd[w].q {
				if st := nd[w].stamp; st != search && st != dead {
					nd[w].stamp = search
					f.parent[w], f.via[w] = y, viaSelf
					visited = append(visited, w)
					hot = append(hot, w)
				}
			}
			return false
		}
	search:
		for {
			var x int32
			first := len(hot) > 0
			switch {
			case first:
				x = hot[len(hot)-1]
				hot = hot[:len(hot)-1]
			case next < len(fifo):
				x = fifo[next]
				next++
			default:
				break search
			}
			qx := nd[x].q
			end := f.arcs(x)
			for p := int64(0); p < end; p++ {
				y, c, via := f.arcAt(x, p)
				switch y {
				case arcNone:
					continue
				case arcOut:
					if c+qx == 0 {
						out, outVia = x, via
						break search
					}
					continue
				}
				if st := nd[y].stamp; st == search || st == dead || c+qx != nd[y].q {
					continue
				}
				if visit(x, y, via, first) {
					break search
				}
			}
		}
		f.visited, f.queue, f.hot = visited, fifo, hot
		if out < 0 {
			for _, y := range visited {
				nd[y].stamp = dead
			}
			continue
		}
		// Augment back along the parents: each row takes the column of
		// its arc, whose old row is the next one on the path.
		x, c := out, outVia
		for {
			f.take(x, c)
			if x == root {
				break
			}
			x, c = f.parent[x], f.via[x]
		}
		found++
	}
	return found
}

// take assigns column c (a state, n+i for an input, or viaSelf for its own
// column) to row x.
func (f *cover) take(x, c int32) {
	switch {
	case c == viaSelf:
		f.node[x].pred, f.node[x].succ = coverSelf, coverSelf
	case c >= f.n:
		f.node[x].pred, f.inSucc[c-f.n] = c, x
	default:
		f.node[x].pred, f.node[c].succ = c, x
	}
}
