package names

import (
	"hash/maphash"
	"strconv"
	"sync"

	"github.com/netsteer/netsteer/matching/bigmem"
)

// Table maps state indices to names and back. A table with an integer base
// and no arena names state i by the decimal integer i+base (Matrix Market
// indices, generated networks). A Table is read-only once sealed by its
// Interner.
type Table struct {
	arena []byte
	off   []int64 // name i is arena[off[i]:off[i+1]]
	table []int32 // hash slots: state index + 1, 0 = empty
	seed  maphash.Seed
	n     int
	base  int // for integer tables (arena == nil)
	ints  bool

	// stale says the hash index lacks names added without it; the first
	// Lookup after sealing rebuilds it (once: many questions never look a
	// name up, and the rebuild costs a pass over every name).
	stale     bool
	indexOnce sync.Once
}

// Ints returns a table naming n states by the integers base..base+n-1.
func Ints(n, base int) *Table { return &Table{n: n, base: base, ints: true} }

// Len returns the number of names.
func (t *Table) Len() int { return t.n }

// IntBase reports whether the table names state i by the integer i+base,
// and the base.
func (t *Table) IntBase() (int, bool) { return t.base, t.ints }

// Name returns name i.
func (t *Table) Name(i int32) string {
	if t.ints {
		return strconv.Itoa(int(i) + t.base)
	}
	return string(t.arena[t.off[i]:t.off[i+1]])
}

// Append appends name i to b.
func (t *Table) Append(b []byte, i int32) []byte {
	if t.ints {
		return strconv.AppendInt(b, int64(i)+int64(t.base), 10)
	}
	return append(b, t.arena[t.off[i]:t.off[i+1]]...)
}

// bytesOf returns name i without copying; only for arena tables.
func (t *Table) bytesOf(i int32) []byte { return t.arena[t.off[i]:t.off[i+1]] }

// Lookup returns the index of name.
func (t *Table) Lookup(name string) (int32, bool) {
	if t.ints {
		v, err := strconv.Atoi(name)
		if err != nil || strconv.Itoa(v) != name || v < t.base || v-t.base >= t.n {
			return -1, false
		}
		return int32(v - t.base), true
	}
	if t.stale {
		t.indexOnce.Do(t.reindex)
	}
	if len(t.table) == 0 {
		return -1, false
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

// reindex rebuilds the hash index of an arena table over all its names,
// with at most half of the slots in use.
func (t *Table) reindex() {
	size := 1024
	for size < 2*t.n+2 {
		size *= 2
	}
	if len(t.table) == size {
		clear(t.table)
	} else {
		t.table = make([]int32, size)
	}
	mask := uint64(size - 1)
	for i := 0; i < t.n; i++ {
		h := maphash.Bytes(t.seed, t.arena[t.off[i]:t.off[i+1]]) & mask
		for t.table[h] != 0 {
			h = (h + 1) & mask
		}
		t.table[h] = int32(i) + 1
	}
}

// growArena makes room for one more name of up to k bytes, doubling the
// arena and the offsets when they are full: append's gentler growth for
// large slices copies (and touches fresh memory) several times more.
func (t *Table) growArena(k int) {
	if len(t.arena)+k > cap(t.arena) {
		a := bigmem.Make[byte](len(t.arena), max(2*cap(t.arena), len(t.arena)+k, 1<<12))
		copy(a, t.arena)
		t.arena = a
	}
	if len(t.off) == cap(t.off) {
		o := bigmem.Make[int64](len(t.off), max(2*cap(t.off), 1<<10))
		copy(o, t.off)
		t.off = o
	}
}
