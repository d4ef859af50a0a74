package nodetable

import "hash/maphash"

// rowIndex finds a table's rows by name: open addressing over row numbers
// (no string keys of its own, so a million rows cost 16 MB of slots and
// nothing for the collector to scan), at most half the slots in use. A
// slot holds the row and the top 32 bits of its name's hash, which place
// it (its home slot is the top bits of those) and spare almost every
// comparison of names.
type rowIndex struct {
	seed  maphash.Seed
	slots []uint64 // hash>>32 << 32 | row + 1; 0 is empty
	shift uint     // 32 - log2(len(slots))
	n     int
}

// find returns the row named name, or -1.
func (x *rowIndex) find(rows []Row, name string) int {
	if len(x.slots) == 0 {
		return -1
	}
	tag := maphash.String(x.seed, name) >> 32
	mask := uint64(len(x.slots) - 1)
	for h := tag >> x.shift; ; h = (h + 1) & mask {
		s := x.slots[h]
		if s == 0 {
			return -1
		}
		if s>>32 == tag && rows[uint32(s)-1].Node == name {
			return int(uint32(s) - 1)
		}
	}
}

// add records that row i (already in rows) holds its name, which find
// does not know yet.
func (x *rowIndex) add(rows []Row, i int) {
	if 2*(x.n+1) > len(x.slots) {
		x.grow()
	}
	x.put(maphash.String(x.seed, rows[i].Node)>>32<<32 | uint64(i+1))
	x.n++
}

// put stores slot value s at the first free slot from its home.
func (x *rowIndex) put(s uint64) {
	mask := uint64(len(x.slots) - 1)
	h := s >> 32 >> x.shift
	for x.slots[h] != 0 {
		h = (h + 1) & mask
	}
	x.slots[h] = s
}

func (x *rowIndex) grow() {
	if len(x.slots) == 0 {
		x.seed = maphash.MakeSeed()
	}
	old := x.slots
	n := max(2*len(old), 64)
	if n > 1<<32 {
		panic("nodetable: more rows than an index can hold")
	}
	x.slots = make([]uint64, n)
	x.shift = 32
	for m := n; m > 1; m >>= 1 {
		x.shift--
	}
	for _, s := range old {
		if s != 0 {
			x.put(s)
		}
	}
}
