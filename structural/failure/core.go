package failure

import (
	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/failure/internal/bip"
	"github.com/netsteer/netsteer/structural/failure/internal/dom"
)

// core is the analysis of one design on the network h on which the
// property is controllability: the bipartite graph [A B] with one maximum
// matching and its alternating structure, and the dominator tree of the
// reachability graph. Node numbering of the dominator graph: 0 is a
// virtual root acting on every signal, 1+i is signal i, 1+k+v is state v.
type core struct {
	h        *structural.Network
	sig      [][]int32
	n, k     int
	bg       *bip.Graph
	m        *matching.Matching
	freeable []bool // columns a maximum matching can leave free
	rd       *matching.CSR
	rscc     *structural.Components // of rd
	rsize    []int32
	tree     *dom.Tree
	reached  int // states the signals reach
	src      *sources
	mark     []int32 // search stamps, see reachersWithout
	stamp    int32
}

func newCore(h *structural.Network, sig [][]int32) *core {
	c := &core{h: h, sig: sig, n: h.N(), k: len(sig)}
	c.bg = bip.New(h.In(), sig)
	c.m = c.bg.Match()
	c.freeable = c.bg.Freeable(c.m)
	c.rd = c.bg.RowDigraph(c.m)
	c.rscc = structural.SCC(c.rd)
	c.rsize = make([]int32, c.rscc.Count)
	for _, x := range c.rscc.Of {
		c.rsize[x]++
	}
	c.tree = c.dominators()
	for v := 0; v < c.n; v++ {
		if c.tree.Reachable(c.node(int32(v))) {
			c.reached++
		}
	}
	return c
}

// node returns the dominator-graph node of state v; sigNode that of signal i.
func (c *core) node(v int32) int32    { return int32(1+c.k) + v }
func (c *core) sigNode(i int) int32   { return int32(1 + i) }
func (c *core) stateOf(x int32) int32 { return x - int32(1+c.k) }

// colNode maps a column of [A B] to its dominator-graph node.
func (c *core) colNode(col int32) int32 {
	if int(col) < c.n {
		return c.node(col)
	}
	return c.sigNode(int(col) - c.n)
}

// dominators builds the reachability graph (root -> signals -> states ->
// states) from the columns and rows of [A B] and returns its dominator
// tree.
func (c *core) dominators() *dom.Tree {
	n, k := c.n, c.k
	nodes := 1 + k + n
	cols, rows := &c.bg.Cols, &c.bg.Rows
	succ := &matching.CSR{Rows: nodes, Cols: nodes, Ptr: make([]int64, nodes+1)}
	succ.Adj = make([]int32, 0, int64(k)+int64(len(cols.Adj)))
	for i := 0; i < k; i++ {
		succ.Adj = append(succ.Adj, int32(1+i))
	}
	succ.Ptr[1] = int64(k)
	for i := 0; i < k; i++ {
		for _, r := range cols.Row(int32(n + i)) {
			succ.Adj = append(succ.Adj, c.node(r))
		}
		succ.Ptr[2+i] = int64(len(succ.Adj))
	}
	for u := 0; u < n; u++ {
		for _, r := range cols.Row(int32(u)) {
			succ.Adj = append(succ.Adj, c.node(r))
		}
		succ.Ptr[2+k+u] = int64(len(succ.Adj))
	}
	pred := &matching.CSR{Rows: nodes, Cols: nodes, Ptr: make([]int64, nodes+1)}
	pred.Adj = make([]int32, 0, int64(k)+int64(len(rows.Adj)))
	for i := 0; i < k; i++ {
		pred.Adj = append(pred.Adj, 0)
		pred.Ptr[2+i] = int64(len(pred.Adj))
	}
	for v := 0; v < n; v++ {
		for _, col := range rows.Row(int32(v)) {
			pred.Adj = append(pred.Adj, c.colNode(col))
		}
		pred.Ptr[2+k+v] = int64(len(pred.Adj))
	}
	return dom.New(succ, pred, 0)
}

// holds reports Lin's conditions: every state reached, no dilation.
func (c *core) holds() bool { return c.reached == c.n && c.m.Size == c.n }

// lostBySignal returns the states that signal i alone reaches: those its
// node dominates, in dominator-tree preorder.
func (c *core) lostBySignal(i int) []int32 {
	sub := c.tree.Subtree(c.sigNode(i))[1:]
	out := make([]int32, len(sub))
	for j, x := range sub {
		out[j] = c.stateOf(x)
	}
	return out
}

// coloop reports whether signal i is matched in every maximum matching:
// without it [A B] loses term rank.
func (c *core) coloop(i int) bool {
	col := c.n + i
	return c.m.ColMate[col] >= 0 && !c.freeable[col]
}

// bridge returns, for state v, the source u of the only edge by which
// paths from the signals enter v, when that edge is a state-to-state edge
// u -> v; -1 otherwise. Losing u -> v then leaves the states v dominates
// unreached.
func (c *core) bridge(v int32) int32 {
	x := c.node(v)
	if !c.tree.Reachable(x) {
		return -1
	}
	entries, last := 0, int32(-1)
	for _, col := range c.bg.Rows.Row(v) {
		w := c.colNode(col)
		if c.tree.Reachable(w) && !c.tree.Dominates(x, w) {
			entries++
			last = col
			if entries > 1 {
				return -1
			}
		}
	}
	if entries == 1 && int(last) < c.n {
		return last
	}
	return -1
}

// criticalIn returns the source u of the matched edge u -> v that every
// maximum matching of [A B] contains, or -1: losing it opens a dilation.
// A matched edge is avoidable exactly when its column can be freed by an
// even alternating path from a free column, or it lies on an alternating
// cycle (its row sits in a strongly connected component of the row digraph
// with other rows) (Dulmage–Mendelsohn).
func (c *core) criticalIn(v int32) int32 {
	u := c.m.RowMate[v]
	if u < 0 || int(u) >= c.n || c.freeable[u] || c.rsize[c.rscc.Of[v]] > 1 {
		return -1
	}
	return u
}

// subtreeStates returns the states dominated by state v, v first.
func (c *core) subtreeStates(v int32) []int32 {
	sub := c.tree.Subtree(c.node(v))
	out := make([]int32, len(sub))
	for j, x := range sub {
		out[j] = c.stateOf(x)
	}
	return out
}
