package target

import (
	"fmt"
	"math/rand/v2"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/numeric"
)

// SampleRequest asks for the exact rank of C·K on random samples of the
// parameters: the numeric check of a target-control answer.
type SampleRequest struct {
	// Property, Targets and Inputs as in CheckRequest.
	Property structural.Property
	Targets  []int32
	Inputs   structural.Design
	// Trials is the number of samples (default numeric.DefaultTrials, at
	// most numeric.MaxTrials).
	Trials int
	// Seed makes the samples reproducible: trial t draws from the PCG
	// stream (Seed, t).
	Seed uint64
	// MaxStates is the largest part H (states reached from an input and
	// reaching a target) accepted; default numeric.DefaultMaxStates. Above
	// it Sample returns a *structural.TooLargeError.
	MaxStates int
}

// SampleResult is the sampled rank of C·K beside the structural bounds.
type SampleResult struct {
	// Targets echoes the targets; Signals counts the inputs.
	Targets structural.States `json:"targets"`
	Signals int               `json:"signals"`
	// RelevantStates is |H|; Unreached the targets no input reaches.
	RelevantStates int               `json:"relevant_states"`
	Unreached      structural.States `json:"unreached"`
	// Rank is the largest exact rank over the trials, Trials each trial's.
	Rank   int   `json:"sampled_dimension"`
	Trials []int `json:"trial_dimensions"`
	// Holds reports Rank == |T|: the samples prove the targets steered (a
	// sample never exceeds the generic rank).
	Holds bool `json:"holds"`
	// Lower and Upper are the structural bounds of Check computed without
	// samples; Agrees reports Rank == Upper, which makes Rank the generic
	// rank. Rank below Upper means an unlucky draw (each trial misses the
	// generic rank with probability at most FailureBound) or a linking
	// bound above the rank.
	Lower  int  `json:"dimension"`
	Upper  int  `json:"dimension_upper"`
	Agrees bool `json:"agrees"`
	// FailureBound is numeric's per-trial bound N²/(p-1); Prime and Seed
	// say how to repeat the samples.
	FailureBound float64 `json:"failure_bound"`
	Prime        uint64  `json:"prime"`
	Seed         uint64  `json:"seed"`
}

// Sample draws every free parameter of the part H uniformly from the
// nonzero elements of GF(2^61-1) (numeric.DrawExact) and computes the rank
// of C·K of each sample exactly, beside the structural bounds of Check:
// first from the columns C·A^k·B depth by depth, which is the sample's
// rank as soon as it meets the structural upper bound (see rankProve), else
// by the full Krylov computation (see rankSample), on the same sample. Work per trial O(r·(E_H + r·|H|)) for a controllable
// subspace of dimension r; memory r·|H| words.
func Sample(g *structural.Network, req SampleRequest) (*SampleResult, error) {
	if !req.Inputs.Of(g) {
		return nil, structural.ErrForeignDesign
	}
	targets, err := cleanTargets(g, req.Targets)
	if err != nil {
		return nil, err
	}
	trials := req.Trials
	if trials <= 0 {
		trials = numeric.DefaultTrials
	}
	if trials > numeric.MaxTrials {
		return nil, fmt.Errorf("target: %d trials: at most %d", trials, numeric.MaxTrials)
	}
	maxStates := req.MaxStates
	if maxStates <= 0 {
		maxStates = numeric.DefaultMaxStates
	}
	h := on(g, req.Property)
	p, unreached := newPart(h, targets, req.Inputs.Signals())
	if p.n > maxStates {
		return nil, &structural.TooLargeError{What: "the sampled target rank (states reached and reaching a target)", States: p.n, Limit: maxStates}
	}
	res := &SampleResult{Targets: g.States(targets), Signals: req.Inputs.Len(), RelevantStates: p.n,
		Unreached: g.States(unreached), Prime: numeric.Mersenne61, Seed: req.Seed, FailureBound: failureBound(g.N())}
	b := p.bound(Limits{MaxSampleStates: -1}.withDefaults(), 0, func() (int, error) {
		return structural.Dimension(g, req.Property, req.Inputs)
	})
	if b.err != nil {
		return nil, b.err
	}
	res.Lower, res.Upper = b.lower, b.upper
	f := numeric.NewField(numeric.Mersenne61)
	for t := 0; t < trials; t++ {
		// The depth-by-depth columns of one sample first; when they reach
		// the upper bound that is the sample's rank, else the full
		// computation on the same sample.
		rng := rand.New(rand.NewPCG(req.Seed, uint64(t)))
		r, _, _ := rankProve(p, f, rng, p.n, res.Upper, checkProveWork)
		if r < res.Upper {
			r = rankSample(p, f, rand.New(rand.NewPCG(req.Seed, uint64(t))), res.Upper)
		}
		res.Trials = append(res.Trials, r)
		res.Rank = max(res.Rank, r)
	}
	res.Holds = res.Rank == len(targets)
	res.Agrees = res.Rank == res.Upper
	return res, nil
}
