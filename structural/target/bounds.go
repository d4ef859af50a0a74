package target

import (
	"math/bits"
	"slices"

	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural"
)

// capacityWitness is a set of reached targets T* whose in-neighbours
// (states of H and signals) number fewer than T*.
type capacityWitness struct {
	targets    []int32 // local
	neighbours []int32 // local states
	signals    []int   // 0-based signal indices
}

// inCapacity returns the largest matching of the reached targets, each to
// a distinct in-neighbour (a state of H or a signal), and, when it leaves
// targets unmatched, the union of their alternating trees: a set T* with
// |N(T*)| = |T*| - (unmatched targets).
//
// Why it bounds the rank: for any set T' of targets, C_T'·K = [C_T'·B,
// C_T'·A·K], C_T'·A has nonzero columns only at the in-neighbour states of
// T', and C_T'·B only at the signals driving T'; so rank C_T'·K is at most
// |N(T')|, and rank C·K at most |T \ T'| + |N(T')|. The minimum over T' is
// the matching size (König's theorem in Hall's deficiency form).
func inCapacity(p *part) (int, *capacityWitness) {
	nt := len(p.targets)
	m := len(p.signals)
	b := &matching.CSR{Rows: nt, Cols: p.n + m, Ptr: make([]int64, nt+1)}
	for i, t := range p.targets {
		b.Ptr[i+1] = b.Ptr[i] + int64(p.in.Degree(t)) + (p.sigPtr[t+1] - p.sigPtr[t])
	}
	b.Adj = make([]int32, 0, b.Ptr[nt])
	for _, t := range p.targets {
		b.Adj = append(b.Adj, p.in.Row(t)...)
		for _, s := range p.signalsOf(t) {
			b.Adj = append(b.Adj, int32(p.n)+s)
		}
	}
	mt := matching.Maximum(b, nil)
	if mt.Size == nt {
		return mt.Size, nil
	}
	rowSeen := make([]bool, b.Rows)
	colSeen := make([]bool, b.Cols)
	var rows, cols []int32
	for r := 0; r < nt; r++ {
		if mt.RowMate[r] < 0 {
			rowSeen[r] = true
			rows = append(rows, int32(r))
		}
	}
	for i := 0; i < len(rows); i++ {
		for _, c := range b.Row(rows[i]) {
			if colSeen[c] {
				continue
			}
			colSeen[c] = true
			cols = append(cols, c)
			if r := mt.ColMate[c]; r >= 0 && !rowSeen[r] {
				rowSeen[r] = true
				rows = append(rows, r)
			}
		}
	}
	w := &capacityWitness{}
	for _, r := range rows {
		w.targets = append(w.targets, p.targets[r])
	}
	for _, c := range cols {
		if int(c) < p.n {
			w.neighbours = append(w.neighbours, c)
		} else {
			w.signals = append(w.signals, int(c)-p.n)
		}
	}
	slices.Sort(w.targets)
	slices.Sort(w.neighbours)
	slices.Sort(w.signals)
	return mt.Size, w
}

// linkingMatching returns the size of the largest set of vertex-disjoint
// paths from the sources to the sinks of a digraph, as a maximum matching
// (the linkage construction of Ingleton & Piff, "Gammoids and transversal
// matroids", J. Combin. Theory B 15, 1973): rows are all vertices, columns
// the vertices that are not sources followed by the sinks; row x is
// adjacent to column y for every arc x -> y and to its own column (x "not
// on a path"). In a matching, following each row to its column traces
// vertex-disjoint paths and cycles; a path from a source to a sink adds
// one to the size beyond the |vertices| - |sources| columns that every
// maximum matching can cover, and any other path adds nothing, so the
// maximum matching has exactly |vertices| - |sources| + (largest linking)
// edges. The caller builds b accordingly and passes nonSources.
func linkingMatching(b *matching.CSR, nonSources int) int {
	return matching.Maximum(b, nil).Size - nonSources
}

// staticLinking returns the largest number of vertex-disjoint paths in H
// from distinct signals to distinct reached targets: by van der Woude ("A
// graph-theoretic characterization for the rank of the transfer matrix of
// a structured system", Math. Control Signals Systems 4:33-40, 1991) the
// generic rank of the transfer matrix C(sI - A)^-1 B. That rank never
// exceeds the rank of C·K: the transfer matrix is the series of C·A^k·B
// s^-(k+1), whose columns all lie in the span of the columns of C·K. So it
// is a proved lower bound.
//
// The digraph is read from the targets backwards: an output vertex y_t for
// each target (the sources), arcs y_t -> t, v -> u for every edge u -> v
// of H, and v -> signal i for every signal driving v (the sinks).
func staticLinking(p *part) int {
	nt, m := len(p.targets), len(p.signals)
	rows := p.n + nt
	b := &matching.CSR{Rows: rows, Cols: p.n + m, Ptr: make([]int64, rows+1)}
	for v := 0; v < p.n; v++ {
		b.Ptr[v+1] = b.Ptr[v] + int64(p.in.Degree(int32(v))) + 1 + (p.sigPtr[v+1] - p.sigPtr[v])
	}
	for i := 0; i < nt; i++ {
		b.Ptr[p.n+i+1] = b.Ptr[p.n+i] + 1
	}
	b.Adj = make([]int32, 0, b.Ptr[rows])
	for v := int32(0); int(v) < p.n; v++ {
		b.Adj = append(b.Adj, p.in.Row(v)...)
		b.Adj = append(b.Adj, v)
		for _, s := range p.signalsOf(v) {
			b.Adj = append(b.Adj, int32(p.n)+s)
		}
	}
	b.Adj = append(b.Adj, p.targets...)
	return linkingMatching(b, p.n)
}

// layerCut returns the smallest of the cuts |W_k| + sum_{j<k} (signals
// driving a state of W_j), k = 0..maxK, where W_k is the set of states with
// a walk of exactly k steps to a target. Every path of the dynamic graph
// from an input copy at depth j to a target either starts above depth k,
// through a signal driving W_j, or crosses depth k in W_k, so each value
// bounds the largest linking, and with it the rank of C·K. It also returns
// the k of the smallest cut. It stops early once W_k holds every state or
// repeats W_(k-1): later cuts are then no smaller.
func layerCut(p *part, maxK int) (best, bestK int) {
	cur := slices.Clone(p.targets)
	mark := make([]int32, p.n) // layer + 1 that last listed v
	sigMark := make([]int32, len(p.signals))
	above := 0 // signals driving W_j, summed over j < k
	best = len(cur)
	var prevSum uint64
	prevLen := -1
	for k := 0; k <= maxK && len(cur) > 0; k++ {
		if v := len(cur) + above; v < best {
			best, bestK = v, k
		}
		var sum uint64
		for _, v := range cur {
			sum += uint64(v)*0x9E3779B97F4A7C15 + 1
		}
		if len(cur) == p.n || len(cur) == prevLen && sum == prevSum {
			break
		}
		prevLen, prevSum = len(cur), sum
		for _, v := range cur {
			for _, s := range p.signalsOf(v) {
				if sigMark[s] != int32(k+1) {
					sigMark[s] = int32(k + 1)
					above++
				}
			}
		}
		var next []int32
		for _, v := range cur {
			for _, u := range p.in.Row(v) {
				if mark[u] != int32(k+2) {
					mark[u] = int32(k + 2)
					next = append(next, u)
				}
			}
		}
		cur = next
		if len(cur) == 0 && above < best {
			best, bestK = above, k+1
		}
	}
	return best, bestK
}

// linCertificate reports whether Lin's theorem holds, for the design, on a
// subnetwork S of H that holds the targets, every edge from outside S
// removed: each state of S matched to a distinct in-neighbour in S or a
// signal (no dilation), and every source component of S driven by some
// signal (all reached). Removing edges sets parameters to zero, which can
// only lower the rank, and S then evolves on its own and is controllable,
// so the targets are steered: a proof of rank |T|. S is found as in
// stemCycleCover, by a matching in which non-targets may match themselves
// ("not in S"), targets first; a false answer proves nothing.
func linCertificate(p *part) bool {
	n, m := p.n, len(p.signals)
	b := &matching.CSR{Rows: n, Cols: n + m, Ptr: make([]int64, n+1)}
	b.Adj = make([]int32, 0, p.edges+n+p.entries)
	for v := int32(0); int(v) < n; v++ {
		row := p.in.Row(v)
		b.Adj = append(b.Adj, row...)
		if p.tpos[v] < 0 {
			if _, loop := slices.BinarySearch(row, v); !loop {
				b.Adj = append(b.Adj, v)
			}
		}
		for _, s := range p.signalsOf(v) {
			b.Adj = append(b.Adj, int32(n)+s)
		}
		b.Ptr[v+1] = int64(len(b.Adj))
	}
	order := make([]int32, 0, n)
	order = append(order, p.targets...)
	for v := int32(0); int(v) < n; v++ {
		if p.tpos[v] < 0 {
			order = append(order, v)
		}
	}
	mate, _ := priorityMatch(b, order, []int{len(p.targets), n}, nil)
	inS := make([]bool, n)
	S := slices.Clone(p.targets)
	for _, t := range S {
		inS[t] = true
	}
	for i := 0; i < len(S); i++ {
		u := mate[S[i]]
		switch {
		case u < 0:
			return false
		case int(u) < n && !inS[u]:
			inS[u] = true
			S = append(S, u)
		}
	}
	pos := make([]int32, n)
	for i, v := range S {
		pos[v] = int32(i)
	}
	sg := &matching.CSR{Rows: len(S), Cols: len(S), Ptr: make([]int64, len(S)+1)}
	for i, v := range S {
		for _, w := range p.out.Row(v) {
			if inS[w] {
				sg.Adj = append(sg.Adj, pos[w])
			}
		}
		sg.Ptr[i+1] = int64(len(sg.Adj))
	}
	comps := structural.SCC(sg)
	driven := make([]bool, comps.Count)
	for i, v := range S {
		if p.sigPtr[v+1] > p.sigPtr[v] {
			driven[comps.Of[i]] = true
		}
	}
	for k, src := range comps.Source {
		if src && !driven[k] {
			return false
		}
	}
	return true
}

// greedyLinking builds a linking in the dynamic graph of L layers for the
// design, from the targets backwards: at each depth the heads that can
// end on a signal copy (signal, depth) are matched to distinct signals
// driving them and end there; the others are matched to distinct
// in-neighbours, which become the next heads; heads left over are lost.
// The result is a linking, so by the theorem of Murota & Poljak (1990) a
// lower bound on the rank of C·K (the upper-bound half of that theorem is
// dynamicLinking's). Time: per layer, two matchings on the heads.
func greedyLinking(p *part, L int) int {
	heads := slices.Clone(p.targets)
	cid := make([]int32, p.n)
	for i := range cid {
		cid[i] = -1
	}
	var cols []int32
	linked := 0
	for d := 0; d < L && len(heads) > 0; d++ {
		// End what can end here.
		b := &matching.CSR{Rows: len(heads), Cols: len(p.signals), Ptr: make([]int64, len(heads)+1)}
		for i, v := range heads {
			b.Adj = append(b.Adj, p.signalsOf(v)...)
			b.Ptr[i+1] = int64(len(b.Adj))
		}
		order := make([]int32, len(heads))
		for i := range order {
			order[i] = int32(i)
		}
		ended, _ := priorityMatch(b, order, []int{len(heads)}, nil)
		k := 0
		for i, v := range heads {
			if ended[i] >= 0 {
				linked++
			} else {
				heads[k] = v
				k++
			}
		}
		heads = heads[:k]
		if d+1 == L || len(heads) == 0 {
			break
		}
		// The rest go one step back, to distinct in-neighbours; those a
		// signal drives are preferred.
		for _, c := range cols {
			cid[c] = -1
		}
		cols = cols[:0]
		b = &matching.CSR{Rows: len(heads), Ptr: make([]int64, len(heads)+1)}
		for i, v := range heads {
			for _, u := range p.in.Row(v) {
				if cid[u] < 0 {
					cid[u] = int32(len(cols))
					cols = append(cols, u)
				}
				b.Adj = append(b.Adj, cid[u])
			}
			b.Ptr[i+1] = int64(len(b.Adj))
		}
		b.Cols = len(cols)
		prefer := make([]uint8, len(cols))
		for j, u := range cols {
			if p.sigPtr[u+1] > p.sigPtr[u] {
				prefer[j] = 1
			}
		}
		mate, _ := priorityMatch(b, order[:len(heads)], []int{len(heads)}, prefer)
		k = 0
		for i := range heads {
			if mate[i] >= 0 {
				heads[k] = cols[mate[i]]
				k++
			}
		}
		heads = heads[:k]
	}
	return linked
}

// linkWork estimates the arcs of the dynamic graph of L layers.
func linkWork(p *part, L int) int64 {
	return int64(L) * int64(p.edges+p.n+p.entries)
}

// dynamicLinking returns the largest linking, in the dynamic graph of L
// layers, from the input copies to the targets at the last time: paths
// that share no vertex (state, time) and start at distinct copies (signal,
// time). Read backwards from the targets, vertex (v, k) is state v k steps
// before the end; (v, k) -> (u, k+1) for every edge u -> v, and (v, k) ->
// (signal i, k) for every signal driving v. A path from (t, 0) to
// (i, k) is a walk of length k from a state that i drives to t, that is a
// term of the entry (t, i) of C·A^k·B.
//
// For L = |H| this bounds the rank of C·K from above: by the
// Lindström–Gessel–Viennot lemma, which holds for any weights on an
// acyclic digraph, shared ones included, every minor of C·K is a signed
// sum over the vertex-disjoint path systems joining its rows to its
// columns, so a minor larger than the largest linking vanishes
// identically. This is the dynamic-graph criterion of Murota & Poljak
// (IEEE TAC 35(8), 1990) for structural output controllability; the
// bound can be strict, because terms of different path systems may cancel
// when the parameters of A are shared across times. Only the vertices on
// some path from an input copy to a target are built: (v, k) with a walk
// of exactly k steps to a target and one of at most L-1-k steps from a
// driven state.
func dynamicLinking(p *part, L int) int {
	n := p.n
	if n == 0 || L <= 0 {
		return 0
	}
	words := (n + 63) / 64
	useful := make([]uint64, L*words)
	has := func(k int, v int32) bool { return useful[k*words+int(v)>>6]>>(uint(v)&63)&1 != 0 }
	set := func(bs []uint64, v int32) { bs[int(v)>>6] |= 1 << (uint(v) & 63) }
	for _, t := range p.targets {
		set(useful[:words], t)
	}
	forEach := func(bs []uint64, f func(v int32)) {
		for w, x := range bs {
			for x != 0 {
				f(int32(w<<6 + bits.TrailingZeros64(x)))
				x &= x - 1
			}
		}
	}
	for k := 0; k+1 < L; k++ {
		next := useful[(k+1)*words : (k+2)*words]
		forEach(useful[k*words:(k+1)*words], func(v int32) {
			for _, u := range p.in.Row(v) {
				set(next, u)
			}
		})
	}
	// Intersect with the states reached in time: U_{L-1} is the driven
	// states, U_k the driven states and the successors of U_{k+1}.
	driven := make([]uint64, words)
	for _, s := range p.signals {
		for _, v := range s {
			set(driven, v)
		}
	}
	u := slices.Clone(driven)
	for k := L - 1; k >= 0; k-- {
		lay := useful[k*words : (k+1)*words]
		for w := range lay {
			lay[w] &= u[w]
		}
		if k == 0 {
			break
		}
		nu := slices.Clone(driven)
		forEach(u, func(v int32) {
			for _, w := range p.out.Row(v) {
				set(nu, w)
			}
		})
		u = nu
	}
	// Number the useful copies, depth by depth; sources (depth 0) first.
	id := make([]int32, L*n)
	var x int32
	var sources int32
	for k := 0; k < L; k++ {
		for v := int32(0); int(v) < n; v++ {
			if has(k, v) {
				id[k*n+int(v)] = x
				x++
			} else {
				id[k*n+int(v)] = -1
			}
		}
		if k == 0 {
			sources = x
		}
	}
	m := len(p.signals)
	cid := make([]int32, L*m)
	var c int32
	for k := 0; k < L; k++ {
		for i, s := range p.signals {
			cid[k*m+i] = -1
			for _, v := range s {
				if has(k, v) {
					cid[k*m+i] = c
					c++
					break
				}
			}
		}
	}
	base := x - sources
	b := &matching.CSR{Rows: int(x), Cols: int(base + c), Ptr: make([]int64, 1, x+1)}
	b.Adj = make([]int32, 0, int(x)*4)
	for k := 0; k < L; k++ {
		for v := int32(0); int(v) < n; v++ {
			me := id[k*n+int(v)]
			if me < 0 {
				continue
			}
			if k+1 < L {
				for _, w := range p.in.Row(v) {
					if j := id[(k+1)*n+int(w)]; j >= 0 {
						b.Adj = append(b.Adj, j-sources)
					}
				}
			}
			if k > 0 {
				b.Adj = append(b.Adj, me-sources)
			}
			for _, s := range p.signalsOf(v) {
				b.Adj = append(b.Adj, base+cid[k*m+int(s)])
			}
			b.Ptr = append(b.Ptr, int64(len(b.Adj)))
		}
	}
	return linkingMatching(b, int(base))
}
