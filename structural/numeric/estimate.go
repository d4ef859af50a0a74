package numeric

import (
	"math/rand/v2"
	"sync"
	"time"
)

// exactOps estimates the field multiply-adds of one exact trial that
// reaches dimension r on n states and e edges: about 2r sparse products of
// e + n each (batches may overshoot a chain's end by as much as they
// keep) and r reductions against a basis growing to r rows of n entries.
func exactOps(n, e, r int) float64 {
	fr, fn := float64(r), float64(n)
	return 2*fr*(float64(e)+fn) + fr*fr*fn/2
}

// exactBytes estimates the memory of one exact trial: the basis of r rows
// of n words, the waiting signals and the longest batch, doubled for the
// garbage collector's headroom (GOGC=100).
func exactBytes(n, r int) int64 {
	return 2 * int64(r+window+maxBatch) * int64(n) * 8
}

// cacheFactor scales the calibrated cost of a multiply-add, measured on a
// block that fits the cache, to bases that do not (measured on this
// project's benchmark machine: 1.0 at 500 states, about 1.5 at 2,000).
func cacheFactor(n, r int) float64 {
	if int64(r)*int64(n)*8 < 4<<20 {
		return 1
	}
	return 1.5
}

var calib struct {
	once sync.Once
	ns   float64
}

// nsPerOp measures, once per process, the time of one grouped multiply-add
// of the elimination on this machine (about a millisecond of work, best of
// three runs).
func nsPerOp() float64 {
	calib.once.Do(func() {
		const n = 4096
		f := NewField(Mersenne61)
		rng := rand.New(rand.NewPCG(1, 1))
		v := make([]uint64, n)
		var rows [group][]uint64
		var coef [group]uint64
		for t := range rows {
			rows[t] = make([]uint64, n)
			for j := range rows[t] {
				rows[t][j] = rng.Uint64N(f.P)
			}
			coef[t] = rng.Uint64N(f.P)
		}
		best := time.Duration(1 << 62)
		for run := 0; run < 3; run++ {
			start := time.Now()
			for rep := 0; rep < 4; rep++ {
				sub8(&f, v, &coef, &rows)
			}
			best = min(best, time.Since(start))
		}
		calib.ns = float64(best.Nanoseconds()) / (4 * group * n)
		if calib.ns <= 0 {
			calib.ns = 1
		}
	})
	return calib.ns
}

// EstimateExact returns the estimated time and memory of the exact check
// with the given number of trials on n states and e edges, when the
// dimensions to reach are dims (one per kind checked: controllability,
// observability). Trials run workers at a time.
func EstimateExact(n, e int, dims []int, trials, workers int) (time.Duration, int64) {
	var ops float64
	var bytes int64
	for _, r := range dims {
		ops += exactOps(n, e, r) * cacheFactor(n, r)
		bytes = max(bytes, exactBytes(n, r))
	}
	workers = max(1, min(workers, trials))
	rounds := (trials + workers - 1) / workers
	sec := ops * float64(rounds) * nsPerOp() / 1e9
	return time.Duration(sec * float64(time.Second)), bytes * int64(workers)
}
