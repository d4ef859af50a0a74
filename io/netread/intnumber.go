package netread

import (
	"math"
	"runtime"
	"sync"
	"sync/atomic"

	"github.com/netsteer/netsteer/matching/bigmem"
	"github.com/netsteer/netsteer/structural"
)

// Numbering integer-named inputs in parallel. Most large edge lists name
// their states by canonical decimal integers only. Interning those names
// one by one in file order (mergeBlock) is a random access into the dense
// name table per name, on one core. Instead, while every block holds only
// such names, the reader keeps each block's edges as values (intRun) and,
// at the end of the input, numbers the states in parallel:
//
//  1. every name's position in the file (record, then source before
//     target) is a key; an atomic minimum per value over all blocks, on
//     all cores, finds where each value first appears;
//  2. the values present, sorted by that key (a radix sort), are the
//     states in first-appearance order: the numbering mergeBlock gives;
//  3. the runs' values are replaced by their states, on all cores, and the
//     runs go to the Builder whole (AddEdges), in file order.
//
// The first block holding anything else (a name that is not a canonical
// decimal, an error, a failed read) ends the collection: the runs so far
// are numbered the same way and the rest of the input goes through
// mergeBlock, so the network is the one mergeBlock alone builds. Tables
// (Columns, Separator) and the second read that finds an edge's line
// (Options.locate) are never collected: the checks mergeBlock makes there
// need it to see every row. Values
// are indexed by an array of 4 bytes per value, allowed only while the
// largest value is below two per record read (edge or single name) plus
// 2^20 (at most 8 bytes per edge); beyond it (sparse large identifiers)
// the runs are interned in order as mergeBlock does.
//
// Memory per edge: a run holds 8 bytes (16 with weights), as the Builder's
// own segments would, and becomes them; numbering adds the value array (4
// bytes per value, at most 8 per edge, 0.4 per edge at 10 edges per
// state) and 20 bytes per state for the sort and the list of states, all
// released before Build. At 10^8 edges between 10^7 states: 800 MB of
// runs (the Builder's edges), 40 MB of values and 200 MB for the sort
// while numbering, against 2.08 GB that Build and the matching peak at.

// intNumbering enables the parallel numbering; tests switch it off to
// compare with mergeBlock.
var intNumbering = true

// numberedRuns counts the runs numbered in parallel, for tests to see
// which path a read took.
var numberedRuns atomic.Int64

// intRun is a block's records between canonical decimal names, as values.
type intRun struct {
	src, dst []int32   // one per edge: values, then states
	w        []float64 // one per edge, 1 for none; nil when no edge has a weight
	iso      []isoName // lines of a single name
	recs     int       // records: edges and iso lines
	maxV     int32
}

// isoName is a line of a single name (an isolated state): its record
// within the block and its value.
type isoName struct{ rec, v int32 }

// intRun returns blk's records as an intRun, or nil when a name is not a
// canonical decimal or was resolved while parsing.
func (blk *block) intRun(weights bool) *intRun {
	toks := blk.toks
	edges := 0
	for e := 0; e+1 < len(toks); e += 2 {
		if toks[e+1] != isoTok {
			edges++
		}
	}
	run := &intRun{src: make([]int32, edges), dst: make([]int32, edges), recs: len(toks) / 2}
	var w []float64
	hasW := false
	if weights {
		w = make([]float64, edges)
	}
	val := func(t int32) (int32, bool) {
		if t >= 0 {
			return 0, false
		}
		p := blk.pend[^t]
		if p < 0 {
			return 0, false
		}
		return int32(p), true
	}
	k := 0
	maxV := int32(0)
	for e := 0; e+1 < len(toks); e += 2 {
		u, ok := val(toks[e])
		if !ok {
			return nil
		}
		maxV = max(maxV, u)
		if toks[e+1] == isoTok {
			run.iso = append(run.iso, isoName{int32(e / 2), u})
			continue
		}
		v, ok := val(toks[e+1])
		if !ok {
			return nil
		}
		maxV = max(maxV, v)
		run.src[k], run.dst[k] = u, v
		if weights {
			x := blk.ws[e/2]
			if math.IsNaN(x) {
				x = 1
			} else {
				hasW = true
			}
			w[k] = x
		}
		k++
	}
	if hasW {
		run.w = w
	}
	run.maxV = maxV
	return run
}

// intCollector holds the runs of the blocks read so far.
type intCollector struct {
	runs []*intRun
	on   bool
}

// take keeps blk's run and reports whether it did; once it refuses a
// block, it refuses all later ones.
func (c *intCollector) take(blk *block) bool {
	if !c.on || blk.run == nil || blk.err != nil || blk.readErr != nil || blk.tooLong {
		c.on = false
		return false
	}
	c.runs = append(c.runs, blk.run)
	blk.run = nil
	return true
}

// flush numbers the states of the runs kept, adds them and their edges to
// b, and stops the collection.
func (c *intCollector) flush(b *structural.Builder) error {
	runs := c.runs
	c.runs, c.on = nil, false
	if len(runs) == 0 {
		return nil
	}
	recs, maxV := 0, int32(0)
	for _, r := range runs {
		recs += r.recs
		maxV = max(maxV, r.maxV)
	}
	// Keys are 2*record+side+1 in a uint32; names at most 2 per record.
	if b.States() != 0 || 2*int64(recs)+2 >= math.MaxUint32 || int64(maxV) >= 2*int64(recs)+1<<20 {
		return internRuns(b, runs)
	}
	return numberRuns(b, runs, int(maxV)+1)
}

// internRuns interns the runs' names in file order, as mergeBlock does,
// and adds their edges.
func internRuns(b *structural.Builder, runs []*intRun) error {
	for _, r := range runs {
		k, e := 0, 0
		for rec := 0; rec < r.recs; rec++ {
			if k < len(r.iso) && int(r.iso[k].rec) == rec {
				if _, err := b.InternInt(uint32(r.iso[k].v)); err != nil {
					return err
				}
				k++
				continue
			}
			u, err := b.InternInt(uint32(r.src[e]))
			if err != nil {
				return err
			}
			v, err := b.InternInt(uint32(r.dst[e]))
			if err != nil {
				return err
			}
			r.src[e], r.dst[e] = u, v
			e++
		}
		b.AddEdges(r.src, r.dst, r.w)
	}
	return nil
}

// numberRuns numbers the runs' states in first-appearance order on all
// cores; values are below nv.
func numberRuns(b *structural.Builder, runs []*intRun, nv int) error {
	numberedRuns.Add(int64(len(runs)))
	base := make([]uint32, len(runs)) // the first record of each run
	recs := uint32(0)
	for i, r := range runs {
		base[i] = recs
		recs += uint32(r.recs)
	}
	// first[v] is 1 + the key of v's first appearance, 0 for none.
	first := bigmem.Make[uint32](nv, nv)
	parallelRuns(len(runs), func(i int) {
		r := runs[i]
		k, e := 0, 0
		key := 2*base[i] + 1
		for rec := 0; rec < r.recs; rec++ {
			if k < len(r.iso) && int(r.iso[k].rec) == rec {
				minKey(&first[r.iso[k].v], key)
				k++
			} else {
				minKey(&first[r.src[e]], key)
				minKey(&first[r.dst[e]], key+1)
				e++
			}
			key += 2
		}
	})
	// The values present, by key: key << 32 | value, sorted on the key.
	n := 0
	for _, k := range first {
		if k != 0 {
			n++
		}
	}
	pairs := bigmem.Make[uint64](0, n)
	for v, k := range first {
		if k != 0 {
			pairs = append(pairs, uint64(k)<<32|uint64(v))
		}
	}
	radixSortHigh(pairs)
	// The states in order; first[v] becomes v's state.
	vs := bigmem.Make[uint32](len(pairs), len(pairs))
	for i, p := range pairs {
		vs[i] = uint32(p)
		first[uint32(p)] = uint32(i)
	}
	if err := b.InternNewInts(vs); err != nil {
		return err
	}
	vs = nil
	pairs = nil
	parallelRuns(len(runs), func(i int) {
		r := runs[i]
		for e, u := range r.src {
			r.src[e] = int32(first[u])
		}
		for e, v := range r.dst {
			r.dst[e] = int32(first[v])
		}
	})
	for i, r := range runs {
		b.AddEdges(r.src, r.dst, r.w)
		runs[i] = nil
	}
	return nil
}

// minKey lowers *p to k unless it holds a smaller nonzero key.
func minKey(p *uint32, k uint32) {
	for {
		c := atomic.LoadUint32(p)
		if c != 0 && c <= k {
			return
		}
		if atomic.CompareAndSwapUint32(p, c, k) {
			return
		}
	}
}

// parallelRuns calls f(0..n-1) on all cores, handing out indices in
// order, so the cores sweep the file together.
func parallelRuns(n int, f func(i int)) {
	workers := min(runtime.GOMAXPROCS(0), n)
	var next atomic.Int64
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				i := int(next.Add(1) - 1)
				if i >= n {
					return
				}
				f(i)
			}
		}()
	}
	wg.Wait()
}

// radixSortHigh sorts a by its high 32 bits (least significant digit
// first, 16 bits a pass).
func radixSortHigh(a []uint64) {
	if len(a) < 2 {
		return
	}
	tmp := bigmem.Make[uint64](len(a), len(a))
	src, dst := a, tmp
	for shift := uint(32); shift < 64; shift += 16 {
		var count [1<<16 + 1]int
		for _, x := range src {
			count[int(x>>shift&0xffff)+1]++
		}
		for i := 1; i < len(count); i++ {
			count[i] += count[i-1]
		}
		for _, x := range src {
			d := x >> shift & 0xffff
			dst[count[d]] = x
			count[d]++
		}
		src, dst = dst, src
	}
	// Two passes: the result is back in a.
}
