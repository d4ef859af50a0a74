package names

import (
	"errors"
	"fmt"
	"hash/maphash"
	"math"
	"strconv"
	"sync/atomic"

	"github.com/netsteer/netsteer/matching/bigmem"
)

// MaxStates is the largest number of names a table holds (int32 indices).
const MaxStates = 1<<31 - 2

// ErrIntTable is returned by Intern on an integer-named table.
var ErrIntTable = errors.New("names: Intern on an integer-named table")

// Interner fills a Table: it interns names while a network is read and
// seals the table when the network is built.
type Interner struct {
	t *Table
	// Canonical decimal names: dense[v] is the state named v plus one, 0
	// when absent; overflow lists those hashed instead.
	dense       []int32
	denseShared atomic.Pointer[[]int32] // dense as published to LookupInt
	overflow    []overflowName
	unindexed   bool // some names are missing from the hash index
	// idx indexes the other names while building (see internName).
	idx     []nameSlot
	idxUsed int
}

// NewInterner returns an Interner for names given as bytes.
func NewInterner() *Interner {
	return &Interner{t: &Table{off: []int64{0}, seed: maphash.MakeSeed(), table: make([]int32, 1024)}}
}

// NewIntInterner returns an Interner for n states named base..base+n-1;
// it interns nothing more.
func NewIntInterner(n, base int) *Interner { return &Interner{t: Ints(n, base)} }

// Len returns the number of names so far.
func (b *Interner) Len() int { return b.t.n }

// Intern returns the index of name, adding it when new. The bytes are
// copied.
func (b *Interner) Intern(name []byte) (int32, error) {
	if b.t.ints {
		return -1, ErrIntTable
	}
	if v, ok := canonicalDecimal(name); ok {
		return b.InternInt(v)
	}
	if b.t.n >= MaxStates {
		return -1, fmt.Errorf("names: more than %d states", MaxStates)
	}
	return b.internName(name), nil
}

// Release drops the interning indexes; the Interner then only seals.
func (b *Interner) Release() {
	b.dense, b.overflow, b.idx = nil, nil, nil
	b.denseShared.Store(nil)
}

// Seal returns the table, which is read-only from then on; names added
// without the hash index are indexed on the table's first Lookup. It may
// run on another goroutine than Release.
func (b *Interner) Seal() *Table {
	if b.unindexed {
		b.t.stale = true
		b.unindexed = false
	}
	return b.t
}

// Integer names. Most large networks name their states by decimal
// integers. A Builder maps such a name, when written canonically (digits
// only, no leading zero: "7" but not "007" or "+7", which stay distinct
// names), through a dense table indexed by its value instead of hashing the
// bytes; the name still goes into the arena verbatim. The dense table covers
// values below a bound that grows with the number of states, so sparse
// large identifiers cannot make it huge; canonical names beyond it are
// hashed like any other name and move into the table when it grows past
// them. Other names go through the Builder's own index (internName), built
// for lookups during reading. Every name is kept verbatim in the arena of the
// name table, whose hash index (for Lookup) Build completes in one pass.

// canonicalDecimal reports the value of a canonical decimal name below
// 2^31-1.
func canonicalDecimal(name []byte) (uint32, bool) {
	n := len(name)
	if n == 0 || n > 10 || (name[0] == '0' && n > 1) {
		return 0, false
	}
	var v uint64
	for _, c := range name {
		d := c - '0'
		if d > 9 {
			return 0, false
		}
		v = v*10 + uint64(d)
	}
	if v >= math.MaxInt32 {
		return 0, false
	}
	return uint32(v), true
}

// InternInt returns the index of the state named by the canonical decimal
// form of v ("0", "7", "1200"), adding it when new. It is equivalent to
// Intern(strconv.AppendUint(nil, uint64(v), 10)) and much faster for
// integer-named inputs. v must be below 2^31-1.
func (b *Interner) InternInt(v uint32) (int32, error) {
	if int(v) < len(b.dense) {
		if s := atomic.LoadInt32(&b.dense[v]); s != 0 {
			return s - 1, nil
		}
	}
	if b.t.ints {
		return -1, ErrIntTable
	}
	if b.t.n >= MaxStates {
		return -1, fmt.Errorf("names: more than %d states", MaxStates)
	}
	if int(v) >= len(b.dense) {
		if !b.growDense(v) {
			return b.internOverflow(v)
		}
		if s := atomic.LoadInt32(&b.dense[v]); s != 0 {
			return s - 1, nil // it was hashed before and has just moved in
		}
	}
	t := b.t
	id := int32(t.n)
	t.n++
	t.growArena(10)
	t.arena = strconv.AppendUint(t.arena, uint64(v), 10)
	t.off = append(t.off, int64(len(t.arena)))
	b.unindexed = true
	atomic.StoreInt32(&b.dense[v], id+1)
	return id, nil
}

// LookupInt returns the state named by the canonical decimal form of v if
// the Builder has it in its dense table, as InternInt would, without adding
// it. It may be called from any number of goroutines while one other
// goroutine calls InternInt and Intern: it then sees a subset of the names
// interned so far (a state, once seen, never changes), so a reader that
// parses ahead of the goroutine interning in order can resolve the names
// already known and leave the rest to it.
//
// It finds nothing once the table exceeds 2^21 entries (8 MiB): lookups in
// a table that large miss the cache, and measured on 2*10^7-edge inputs,
// parsing goroutines that spend their time there slow the whole read down
// more than they relieve the interning goroutine.
func (b *Interner) LookupInt(v uint32) (int32, bool) {
	p := b.denseShared.Load()
	if p == nil || int(v) >= len(*p) || len(*p) > maxSharedDense {
		return -1, false
	}
	s := atomic.LoadInt32(&(*p)[v])
	return s - 1, s != 0
}

// maxSharedDense bounds the dense table that LookupInt reads.
const maxSharedDense = 1 << 21

// growDense extends the dense table to cover v when v is within the bound
// (eight slots per state plus 2^20) and the table can at least double, so
// copies stay linear, and reports whether it does.
func (b *Interner) growDense(v uint32) bool {
	if !b.extendDense(v) {
		return false
	}
	b.publishDense()
	return true
}

// publishDense hands the dense table to LookupInt.
func (b *Interner) publishDense() {
	shared := b.dense // readers get their own header: b.dense is reassigned
	b.denseShared.Store(&shared)
}

// extendDense is growDense without handing the new table to LookupInt.
func (b *Interner) extendDense(v uint32) bool {
	limit := 8*int64(b.t.n) + 1<<20
	n := max(2*len(b.dense), int(v)+1, 1<<12)
	if int64(n) > limit {
		if int64(v) >= limit || len(b.dense) > int(limit/2) {
			return false // grow by doubling only, to keep copies linear
		}
		n = int(limit)
	}
	d := bigmem.Make[int32](n, n)
	copy(d, b.dense)
	b.dense = d
	// Canonical names hashed while they were out of range move in.
	k := 0
	for _, o := range b.overflow {
		if int(o.v) < n {
			d[o.v] = o.id + 1
		} else {
			b.overflow[k] = o
			k++
		}
	}
	b.overflow = b.overflow[:k]
	return true
}

// internOverflow interns a canonical decimal name beyond the dense table
// through the hash index, remembering it for when the table grows.
func (b *Interner) internOverflow(v uint32) (int32, error) {
	var buf [10]byte
	name := strconv.AppendUint(buf[:0], uint64(v), 10)
	n := b.t.n
	id := b.internName(name)
	if b.t.n > n {
		b.overflow = append(b.overflow, overflowName{v, id})
	}
	return id, nil
}

// nameSeed keys the Builder's own name index.
var nameSeed = maphash.MakeSeed()

// nameSlot is a slot of the Builder's name index. tag holds the top 24
// bits of the name's hash and, in its low byte, the name's length when it
// is at most 8 bytes (then data holds the name itself) or 9 (then data is
// the name's arena offset << 13 | its length). id is the state plus one, 0
// for an empty slot.
type nameSlot struct {
	tag  uint32
	id   int32
	data uint64
}

// slotKey returns the tag and data that identify name.
func slotKey(name []byte, h uint64) (uint32, uint64, bool) {
	tag := uint32(h>>32) &^ 0xff
	if len(name) <= 8 {
		var d uint64
		for i, c := range name {
			d |= uint64(c) << (8 * i)
		}
		return tag | uint32(len(name)), d, true
	}
	return tag | 9, 0, false
}

// internName interns a name that the dense table does not cover, through
// the Builder's own open-addressing index (linear probing, at most half
// full). A slot holds a hash tag beside the state and either the name
// itself (up to 8 bytes) or where it lies in the arena, so a lookup costs
// one cache miss for a short name and two for a long one, instead of a
// miss for the slot, the offsets and the arena at every probe. The name
// table's own index is completed by Build.
func (b *Interner) internName(name []byte) int32 {
	if 2*(b.idxUsed+1) > len(b.idx) {
		b.growIndex()
	}
	h := maphash.Bytes(nameSeed, name)
	tag, data, short := slotKey(name, h)
	mask := uint64(len(b.idx) - 1)
	i := h & mask
	t := b.t
	for {
		s := &b.idx[i]
		if s.id == 0 {
			break
		}
		if s.tag == tag {
			if short {
				if s.data == data {
					return s.id - 1
				}
			} else if off, n := s.data>>13, s.data&(1<<13-1); int(n) == len(name) && string(t.arena[off:off+n]) == string(name) {
				return s.id - 1
			}
		}
		i = (i + 1) & mask
	}
	id := int32(t.n)
	t.n++
	t.growArena(len(name))
	if !short {
		data = uint64(len(t.arena))<<13 | uint64(len(name))
	}
	t.arena = append(t.arena, name...)
	t.off = append(t.off, int64(len(t.arena)))
	b.idx[i] = nameSlot{tag: tag, id: id + 1, data: data}
	b.idxUsed++
	b.unindexed = true
	return id
}

// growIndex doubles the Builder's name index.
func (b *Interner) growIndex() {
	old := b.idx
	b.idx = bigmem.Make[nameSlot](max(2*len(old), 1024), max(2*len(old), 1024))
	mask := uint64(len(b.idx) - 1)
	t := b.t
	for _, s := range old {
		if s.id == 0 {
			continue
		}
		h := maphash.Bytes(nameSeed, t.arena[t.off[s.id-1]:t.off[s.id]])
		i := h & mask
		for b.idx[i].id != 0 {
			i = (i + 1) & mask
		}
		b.idx[i] = s
	}
}

// overflowName is a canonical decimal name interned through the hash index.
type overflowName struct {
	v  uint32
	id int32
}

// Sealed returns an Interner over a sealed table that interns nothing more:
// for networks built on the states of another.
func Sealed(t *Table) *Interner { return &Interner{t: t} }

// InternNewInts adds the states named by the canonical decimal forms of
// vs, in order, as InternInt of each in turn would: the first gets state
// Len(). None may be interned yet and no two may be equal. Each v must be
// below 2^31-1; after an error the Interner must not be used.
// It grows the arena and offsets once, for inputs numbered in bulk.
func (b *Interner) InternNewInts(vs []uint32) error {
	if len(vs) == 0 {
		return nil
	}
	if b.t.ints {
		return ErrIntTable
	}
	if b.t.n+len(vs) > MaxStates {
		return fmt.Errorf("names: more than %d states", MaxStates)
	}
	digits, maxV := 0, uint32(0)
	for _, v := range vs {
		if v >= math.MaxInt32 {
			return fmt.Errorf("names: InternNewInts: %d out of range", v)
		}
		digits += decimalDigits(v)
		maxV = max(maxV, v)
	}
	// The dense table covers what the last InternInt would let it cover.
	// It is filled while LookupInt does not see it (a new table, or a
	// copy), so plain writes do not race with lookups.
	fresh := false
	if int(maxV) >= len(b.dense) {
		b.t.n += len(vs)
		fresh = b.extendDense(maxV)
		b.t.n -= len(vs)
		if lim := 8*int64(b.t.n+len(vs)) + 1<<20 - 1; !fresh && lim < int64(maxV) {
			fresh = b.extendDense(uint32(lim))
		}
	}
	if !fresh {
		d := bigmem.Make[int32](len(b.dense), len(b.dense))
		copy(d, b.dense)
		b.dense = d
	}
	defer b.publishDense()
	t := b.t
	t.growArena(digits)
	if need := len(t.off) + len(vs); need > cap(t.off) {
		o := bigmem.Make[int64](len(t.off), need)
		copy(o, t.off)
		t.off = o
	}
	// The names in order, then the dense slots in a loop of its own: it
	// misses the cache at every value, and a short loop keeps many misses
	// in flight.
	n0 := t.n
	for _, v := range vs {
		if int(v) >= len(b.dense) {
			n := t.n
			if b.internOverflow(v); t.n == n {
				return fmt.Errorf("names: InternNewInts: %d interned twice", v)
			}
			continue
		}
		t.n++
		t.arena = strconv.AppendUint(t.arena, uint64(v), 10)
		t.off = append(t.off, int64(len(t.arena)))
	}
	d := b.dense
	var seen int32
	for i, v := range vs {
		if int(v) < len(d) {
			seen |= d[v]
			d[v] = int32(n0+i) + 1
		}
	}
	b.unindexed = true
	if seen != 0 {
		return errors.New("names: InternNewInts: a value interned twice")
	}
	return nil
}

// decimalDigits returns the length of the decimal form of v.
func decimalDigits(v uint32) int {
	d := 1
	for v >= 10 {
		v /= 10
		d++
	}
	return d
}
