// Package dom computes dominator trees of directed graphs in compressed
// sparse rows, iteratively and with int32 indices.
//
// A vertex d dominates v when every path from the root to v passes through
// d; the immediate dominator of v is its closest strict dominator, and the
// immediate dominators form a tree rooted at the root.
package dom

import "github.com/netsteer/netsteer/matching"

// Tree is the dominator tree of the vertices reachable from a root.
type Tree struct {
	// Idom[v] is the immediate dominator of v, Idom[root] = root, and -1
	// for a vertex the root does not reach.
	Idom []int32
	// Pre[v] is the preorder number of v in the dominator tree (0 for the
	// root), -1 when unreachable; Size[v] is the number of vertices v
	// dominates, v included (0 when unreachable). So v dominates w exactly
	// when Pre[v] <= Pre[w] < Pre[v]+Size[v].
	Pre, Size []int32
	// Order lists the reachable vertices by Pre: Order[Pre[v]] == v. The
	// vertices v dominates are Order[Pre[v] : Pre[v]+Size[v]].
	Order []int32
	Root  int32
}

// Dominates reports whether d dominates v (every vertex dominates itself).
// Both must be reachable.
func (t *Tree) Dominates(d, v int32) bool {
	pd, pv := t.Pre[d], t.Pre[v]
	return pd >= 0 && pv >= pd && pv < pd+t.Size[d]
}

// Reachable reports whether the root reaches v.
func (t *Tree) Reachable(v int32) bool { return t.Pre[v] >= 0 }

// Subtree returns the vertices v dominates, v first, in tree preorder. The
// slice is shared with the tree.
func (t *Tree) Subtree(v int32) []int32 {
	p := t.Pre[v]
	return t.Order[p : p+t.Size[v]]
}

// New returns the dominator tree of g from root; pred must be the
// transpose of g (row v lists the u with an edge u -> v).
//
// It is the algorithm of Lengauer and Tarjan ("A fast algorithm for finding
// dominators in a flowgraph", ACM TOPLAS 1(1):121-141, 1979) in its simple
// form, with path compression and without balanced linking: a depth-first
// numbering, semidominators computed in reverse preorder through EVAL on
// the forest of processed vertices, and a final pass turning relative into
// immediate dominators. The depth-first search and the path compression
// use explicit stacks, never recursion. Time O(E log V), memory about 40
// bytes per vertex beyond the graph.
func New(g, pred *matching.CSR, root int32) *Tree {
	n := g.Rows
	// Depth-first preorder from root: dfn[v] in 1..m, vertex[i] = v,
	// parent[i] = dfn of the tree parent.
	dfn := make([]int32, n)
	vertex := make([]int32, 1, 64) // vertex[0] unused
	parent := make([]int32, 1, 64)
	type frame struct {
		v   int32
		pos int64
	}
	stack := []frame{{root, g.Ptr[root]}}
	dfn[root] = 1
	vertex = append(vertex, root)
	parent = append(parent, 0)
	for len(stack) > 0 {
		f := &stack[len(stack)-1]
		if f.pos == g.Ptr[f.v+1] {
			stack = stack[:len(stack)-1]
			continue
		}
		w := g.Adj[f.pos]
		f.pos++
		if dfn[w] == 0 {
			dfn[w] = int32(len(vertex))
			vertex = append(vertex, w)
			parent = append(parent, dfn[f.v])
			stack = append(stack, frame{w, g.Ptr[w]})
		}
	}
	m := int32(len(vertex) - 1)
	semi := make([]int32, m+1)
	label := make([]int32, m+1)
	ancestor := make([]int32, m+1)
	idom := make([]int32, m+1)
	bucket := make([]int32, m+1) // head of the list of vertices with semi == i
	next := make([]int32, m+1)
	for i := int32(1); i <= m; i++ {
		semi[i], label[i] = i, i
	}
	var path []int32
	eval := func(v int32) int32 {
		if ancestor[v] == 0 {
			return v
		}
		// Compress the path from v up to the child of its forest root,
		// nearest the root first.
		path = path[:0]
		x := v
		for ancestor[ancestor[x]] != 0 {
			path = append(path, x)
			x = ancestor[x]
		}
		for k := len(path) - 1; k >= 0; k-- {
			y := path[k]
			a := ancestor[y]
			if semi[label[a]] < semi[label[y]] {
				label[y] = label[a]
			}
			ancestor[y] = ancestor[a]
		}
		return label[v]
	}
	for i := m; i >= 2; i-- {
		w := vertex[i]
		for _, v := range pred.Adj[pred.Ptr[w]:pred.Ptr[w+1]] {
			if dv := dfn[v]; dv != 0 {
				if u := eval(dv); semi[u] < semi[i] {
					semi[i] = semi[u]
				}
			}
		}
		s := semi[i]
		next[i] = bucket[s]
		bucket[s] = i
		p := parent[i]
		ancestor[i] = p
		for j := bucket[p]; j != 0; j = next[j] {
			if u := eval(j); semi[u] < semi[j] {
				idom[j] = u
			} else {
				idom[j] = p
			}
		}
		bucket[p] = 0
	}
	for i := int32(2); i <= m; i++ {
		if idom[i] != semi[i] {
			idom[i] = idom[idom[i]]
		}
	}
	t := &Tree{Idom: make([]int32, n), Pre: make([]int32, n), Size: make([]int32, n), Root: root}
	for v := range t.Idom {
		t.Idom[v], t.Pre[v] = -1, -1
	}
	t.Idom[root] = root
	for i := int32(2); i <= m; i++ {
		t.Idom[vertex[i]] = vertex[idom[i]]
	}
	// Sizes: a dominator precedes the vertices it dominates in depth-first
	// preorder, so one reverse sweep accumulates them.
	for i := m; i >= 1; i-- {
		v := vertex[i]
		t.Size[v]++
		if i > 1 {
			t.Size[vertex[idom[i]]] += t.Size[v]
		}
	}
	// Preorder of the dominator tree: children listed by counting sort of
	// their parent's depth-first number, then placed parent first.
	first := make([]int32, m+2) // children of dfn i: kids[first[i]:first[i+1]]
	for i := int32(2); i <= m; i++ {
		first[idom[i]+1]++
	}
	for i := int32(1); i <= m; i++ {
		first[i+1] += first[i]
	}
	kids := make([]int32, m)
	fill := append([]int32(nil), first...)
	for i := int32(2); i <= m; i++ {
		kids[fill[idom[i]]] = i
		fill[idom[i]]++
	}
	t.Order = make([]int32, m)
	// Each vertex gets the slot after its parent's earlier children's
	// subtrees: assign in depth-first preorder (parents first).
	slot := make([]int32, m+1)
	slot[1] = 0
	for i := int32(1); i <= m; i++ {
		v := vertex[i]
		p := slot[i]
		t.Pre[v] = p
		t.Order[p] = v
		q := p + 1
		for _, c := range kids[first[i]:first[i+1]] {
			slot[c] = q
			q += t.Size[vertex[c]]
		}
	}
	return t
}
