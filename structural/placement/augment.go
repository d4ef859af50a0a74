package placement

// sideAdj is the adjacency of the left side of a bipartite graph: left
// vertices [0, n0) use the primary compressed rows (ptr, adj), and left
// vertices n0, n0+1, ... use the extra rows (xptr, xadj). The extra rows let
// placement add one left vertex per source component without copying the
// network.
type sideAdj struct {
	n0   int32
	ptr  []int64
	adj  []int32
	xptr []int64
	xadj []int32
}

func (a *sideAdj) row(x int32) []int32 {
	if x < a.n0 {
		return a.adj[a.ptr[x]:a.ptr[x+1]]
	}
	k := x - a.n0
	return a.xadj[a.xptr[k]:a.xptr[k+1]]
}

// augmenter grows a bipartite matching by Hopcroft–Karp phases (a
// breadth-first layering, then vertex-disjoint shortest augmenting paths by
// iterative depth-first search) started from chosen free left vertices
// only. Augmenting never unmatches a vertex, so left and right vertices
// matched before stay matched. Scratch space is kept between calls and reset
// only where it was touched, so many small calls cost what they explore.
type augmenter struct {
	a         *sideAdj
	leftMate  []int32 // per left vertex: right mate or -1
	rightMate []int32 // per right vertex: left mate or -1
	// dead marks left vertices from which no augmenting path can exist
	// any more: every right vertex they reach by alternating paths is
	// matched, and augmentations elsewhere never change that.
	dead []bool

	dist    []int32 // BFS layer per left vertex, -1 unlabelled, -2 spent
	pos     []int32 // DFS position in the row of each left vertex
	touched []int32
	queue   []int32
	stack   []int32
	via     []int32 // right vertex taken from stack[i] to stack[i+1]
}

func newAugmenter(a *sideAdj, nLeft int, leftMate, rightMate []int32) *augmenter {
	au := &augmenter{a: a, leftMate: leftMate, rightMate: rightMate,
		dead: make([]bool, nLeft), dist: make([]int32, nLeft), pos: make([]int32, nLeft)}
	for i := range au.dist {
		au.dist[i] = -1
	}
	return au
}

// grow augments from the free, live left vertices in roots until no
// augmenting path from them is left, and returns the number of
// augmentations. When markDead is set, the left vertices reached from the
// roots that stay free are marked dead on return.
func (au *augmenter) grow(roots []int32, markDead bool) int {
	added := 0
	for {
		limit := au.layer(roots)
		if limit < 0 {
			if markDead {
				for _, x := range au.touched {
					au.dead[x] = true
				}
			}
			au.reset()
			return added
		}
		found := 0
		for _, r := range roots {
			if au.leftMate[r] < 0 && au.dist[r] == 0 && au.search(r, limit) {
				found++
			}
		}
		au.reset()
		added += found
		if found == 0 {
			// Cannot happen: the layering found a shortest path. Guard
			// against an endless loop all the same.
			return added
		}
	}
}

func (au *augmenter) reset() {
	for _, x := range au.touched {
		au.dist[x] = -1
	}
	au.touched = au.touched[:0]
}

// layer labels left vertices by their distance from the free roots along
// alternating paths. It returns the length (in left vertices) of a shortest
// augmenting path, or -1 when there is none.
func (au *augmenter) layer(roots []int32) int32 {
	q := au.queue[:0]
	for _, r := range roots {
		if au.leftMate[r] < 0 && !au.dead[r] && au.dist[r] < 0 {
			au.dist[r] = 0
			au.touched = append(au.touched, r)
			q = append(q, r)
		}
	}
	limit := int32(-1)
	for head := 0; head < len(q); head++ {
		x := q[head]
		d := au.dist[x]
		if limit >= 0 && d+1 >= limit {
			break
		}
		for _, y := range au.a.row(x) {
			x2 := au.rightMate[y]
			if x2 < 0 {
				if limit < 0 {
					limit = d + 1
				}
				continue
			}
			if au.dist[x2] >= 0 || au.dead[x2] {
				continue
			}
			au.dist[x2] = d + 1
			au.touched = append(au.touched, x2)
			q = append(q, x2)
		}
	}
	au.queue = q[:0]
	return limit
}

// search looks for a shortest augmenting path from root along the layers
// and applies it.
func (au *augmenter) search(root, limit int32) bool {
	st := append(au.stack[:0], root)
	via := au.via[:0]
	au.pos[root] = 0
	defer func() { au.stack, au.via = st[:0], via[:0] }()
	for len(st) > 0 {
		x := st[len(st)-1]
		row := au.a.row(x)
		d := au.dist[x]
		advanced := false
		for int(au.pos[x]) < len(row) {
			y := row[au.pos[x]]
			au.pos[x]++
			x2 := au.rightMate[y]
			if x2 < 0 {
				if d+1 != limit {
					continue
				}
				// Augment: the top takes y, each lower vertex the right
				// vertex that led to the one above it.
				au.leftMate[x] = y
				au.rightMate[y] = x
				for i := len(st) - 2; i >= 0; i-- {
					xi, yi := st[i], via[i]
					au.leftMate[xi] = yi
					au.rightMate[yi] = xi
				}
				for _, xi := range st {
					au.dist[xi] = -2
				}
				return true
			}
			if au.dist[x2] != d+1 {
				continue
			}
			au.pos[x2] = 0
			st = append(st, x2)
			via = append(via, y)
			advanced = true
			break
		}
		if !advanced {
			au.dist[x] = -2
			st = st[:len(st)-1]
			if len(via) > 0 {
				via = via[:len(via)-1]
			}
		}
	}
	return false
}
