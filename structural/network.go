package structural

import (
	"hash/maphash"
	"strconv"

	"github.com/netsteer/netsteer/matching"
)

// Network is a directed network of states; see the package comment for the
// edge convention.
type Network struct {
	// Out holds row u = the states u acts on; In holds row v = the states
	// acting on v. Rows are sorted and free of duplicates.
	Out, In matching.CSR
	// OutW, when not nil, holds the weight of each edge of Out (aligned
	// with Out.Adj). Merged duplicate edges have their weights summed.
	OutW []float64
	// SelfLoops is the number of states with a self-loop.
	SelfLoops int
	// DuplicatesMerged is the number of input edges dropped as repeats.
	DuplicatesMerged int

	names *Names
}

// N returns the number of states.
func (g *Network) N() int { return g.Out.Rows }

// Edges returns the number of distinct edges, self-loops included.
func (g *Network) Edges() int { return len(g.Out.Adj) }

// Name returns the name of state i.
func (g *Network) Name(i int32) string { return g.names.Name(i) }

// Lookup returns the index of the state with the given name.
func (g *Network) Lookup(name string) (int32, bool) { return g.names.Lookup(name) }

// Names returns the network's name table.
func (g *Network) Names() *Names { return g.names }

// Names maps state indices to names and back. Names are kept in one byte
// arena with an open-addressing hash index, so a network of 10^7 states costs
// a few allocations, not one per name. A table with an integer base and no
// arena names state i by the decimal integer i+base (Matrix Market indices,
// generated networks).
type Names struct {
	arena []byte
	off   []int64 // name i is arena[off[i]:off[i+1]]
	table []int32 // hash slots: state index + 1, 0 = empty
	seed  maphash.Seed
	n     int
	base  int // for integer tables (arena == nil)
	ints  bool
}

// IntNames returns a table naming n states by the integers base..base+n-1.
func IntNames(n, base int) *Names { return &Names{n: n, base: base, ints: true} }

// NewNames returns an empty table for arena names.
func NewNames() *Names {
	return &Names{off: []int64{0}, seed: maphash.MakeSeed(), table: make([]int32, 1024)}
}

// Len returns the number of names.
func (t *Names) Len() int { return t.n }

// Name returns name i.
func (t *Names) Name(i int32) string {
	if t.ints {
		return strconv.Itoa(int(i) + t.base)
	}
	return string(t.arena[t.off[i]:t.off[i+1]])
}

// bytesOf returns name i without copying; only for arena tables.
func (t *Names) bytesOf(i int32) []byte { return t.arena[t.off[i]:t.off[i+1]] }

// Lookup returns the index of name.
func (t *Names) Lookup(name string) (int32, bool) {
	if t.ints {
		v, err := strconv.Atoi(name)
		if err != nil || strconv.Itoa(v) != name || v < t.base || v-t.base >= t.n {
			return -1, false
		}
		return int32(v - t.base), true
	}
	mask := uint64(len(t.table) - 1)
	h := maphash.String(t.seed, name) & mask
	for {
		s := t.table[h]
		if s == 0 {
			return -1, false
		}
		if string(t.bytesOf(s-1)) == name {
			return s - 1, true
		}
		h = (h + 1) & mask
	}
}

// Intern returns the index of name, adding it when new. The bytes are
// copied. Only for arena tables.
func (t *Names) Intern(name []byte) int32 {
	mask := uint64(len(t.table) - 1)
	h := maphash.Bytes(t.seed, name) & mask
	for {
		s := t.table[h]
		if s == 0 {
			break
		}
		if string(t.bytesOf(s-1)) == string(name) {
			return s - 1
		}
		h = (h + 1) & mask
	}
	id := int32(t.n)
	t.n++
	t.arena = append(t.arena, name...)
	t.off = append(t.off, int64(len(t.arena)))
	t.table[h] = id + 1
	if 2*t.n > len(t.table) {
		t.grow()
	}
	return id
}

func (t *Names) grow() {
	table := make([]int32, 2*len(t.table))
	mask := uint64(len(table) - 1)
	for i := 0; i < t.n; i++ {
		h := maphash.Bytes(t.seed, t.bytesOf(int32(i))) & mask
		for table[h] != 0 {
			h = (h + 1) & mask
		}
		table[h] = int32(i) + 1
	}
	t.table = table
}
