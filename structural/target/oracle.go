package target

import (
	"math/rand/v2"

	"github.com/netsteer/netsteer/structural/numeric"
)

// oracle decides target controllability of designs on a region, for the
// searches of Select.
type oracle struct {
	r     *region
	lim   Limits
	f     numeric.Field
	seed  uint64
	draws uint64
	calls int
	// work bounds the quick proof of one judge (judgeWork by default).
	work int64
	// unsure counts designs rejected on samples alone (short); stopped
	// counts designs left unjudged at a work or size limit (unknown) and
	// rejected all the same, which voids any claim of an exhaustive search.
	unsure, stopped int
	ops             int64
}

// Work limits of the oracle: one quick proof, and the region size up to
// which a failed quick proof is followed by full samples.
const (
	judgeWork        = 500_000_000
	confirmWork      = checkProveWork
	fullSampleStates = 300
	// maxProveWords bounds the memory of a quick proof: one vector of the
	// part per signal.
	maxProveWords = 20_000_000
)

func newOracle(r *region, lim Limits, seed uint64) *oracle {
	return &oracle{r: r, lim: lim, f: numeric.NewField(numeric.Mersenne61), seed: seed, work: judgeWork}
}

// verdict outcomes.
const (
	proved  = iota // the design steers the targets (a sample of full rank)
	refuted        // a proved upper bound is below the number of targets
	short          // the exact rank of a whole sample is below |T|: refuted unless every sample missed the generic rank
	unknown        // no sample judged within the work and size limits
)

// possible reports whether the design can steer the targets as far as the
// proved upper bounds tell (reach, in-capacity, layer cuts, and the
// dynamic linking within the limit). It is monotone: adding signals never
// turns it false.
func (o *oracle) possible(signals [][]int32) bool {
	p, _ := newPart(o.r.net, o.r.targets, signals)
	return o.upper(p)
}

func (o *oracle) upper(p *part) bool {
	nt := len(o.r.targets)
	if len(p.targets) < nt {
		return false
	}
	if c, _ := inCapacity(p); c < nt {
		return false
	}
	if c, _ := layerCut(p, min(p.n, max(o.lim.LayerCutDepth, 0))); c < nt {
		return false
	}
	return true
}

// judge decides the design: proved by a sample of full rank (rankProve
// first, then, on regions of at most fullSampleStates states, the full
// rankSample), refuted by an upper bound, short when the exact rank of a
// whole sample falls below the targets, unknown when the work or size
// limits stopped every sample first (the budget is o.work).
func (o *oracle) judge(signals [][]int32) int { return o.judgeWithin(signals, o.work) }

// judgeWithin is judge with the quick proof bounded by budget field
// operations.
func (o *oracle) judgeWithin(signals [][]int32, budget int64) int {
	o.calls++
	p, _ := newPart(o.r.net, o.r.targets, signals)
	if !o.upper(p) {
		return refuted
	}
	nt := len(o.r.targets)
	if int64(len(p.signals))*int64(p.n) > maxProveWords {
		return unknown
	}
	o.draws++
	got, ops, complete := rankProve(p, o.f, rand.New(rand.NewPCG(o.seed, o.draws)), p.n, nt, budget)
	o.ops += ops
	if got == nt {
		return proved
	}
	if o.lim.MaxSampleStates >= 0 && p.n <= min(o.lim.MaxSampleStates, fullSampleStates) {
		for t := 0; t < max(o.lim.Trials, 1); t++ {
			o.draws++
			rng := rand.New(rand.NewPCG(o.seed, o.draws))
			if rankSample(p, o.f, rng, nt) == nt {
				return proved
			}
			if t == 0 && o.lim.MaxLinkingArcs >= 0 && linkWork(p, p.n) <= o.lim.MaxLinkingArcs {
				if dynamicLinking(p, p.n) < nt {
					return refuted
				}
			}
		}
		return short
	}
	if complete {
		// Every column C·A^k·B, k < |H|, of the sample was taken.
		return short
	}
	return unknown
}

// accept reports whether the design is proved. A short verdict counts as
// an unsure rejection, an unknown one as a stopped rejection.
func (o *oracle) accept(signals [][]int32) bool {
	switch o.judge(signals) {
	case proved:
		return true
	case short:
		o.unsure++
	case unknown:
		o.stopped++
	}
	return false
}
