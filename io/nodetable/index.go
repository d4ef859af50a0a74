package nodetable

import "hash/maphash"

// rowIndex finds a table's rows by name: open addressing over row numbers
// (no string keys of its own, so a million rows cost 8 MB of int32 slots
// and nothing for the collector to scan), at most half the slots in use.
type rowIndex struct {
	seed  maphash.Seed
	slots []int32 // row + 1; 0 is empty
	n     int
}

// find returns the row named name, or -1.
func (x *rowIndex) find(rows []Row, name string) int {
	if len(x.slots) == 0 {
		return -1
	}
	mask := uint64(len(x.slots) - 1)
	for h := maphash.String(x.seed, name) & mask; ; h = (h + 1) & mask {
		s := x.slots[h]
		if s == 0 {
			return -1
		}
		if rows[s-1].Node == name {
			return int(s - 1)
		}
	}
}

// add records that row i (already in rows) holds its name, which find
// does not know yet.
func (x *rowIndex) add(rows []Row, i int) {
	if 2*(x.n+1) > len(x.slots) {
		x.grow(rows)
	}
	x.put(rows[i].Node, i)
	x.n++
}

func (x *rowIndex) put(name string, i int) {
	mask := uint64(len(x.slots) - 1)
	h := maphash.String(x.seed, name) & mask
	for x.slots[h] != 0 {
		h = (h + 1) & mask
	}
	x.slots[h] = int32(i + 1)
}

func (x *rowIndex) grow(rows []Row) {
	if len(x.slots) == 0 {
		x.seed = maphash.MakeSeed()
	}
	old := x.slots
	x.slots = make([]int32, max(2*len(old), 64))
	for _, s := range old {
		if s != 0 {
			x.put(rows[s-1].Node, int(s-1))
		}
	}
}
