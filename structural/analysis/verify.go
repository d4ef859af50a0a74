package analysis

import (
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/numeric"
	"github.com/netsteer/netsteer/structural/target"
)

// VerifyRequest is numeric.Verify's request, and the targets whose
// steerability a sample is to confirm.
type VerifyRequest struct {
	numeric.Request
	// Targets, when not nil, adds the exact sampled rank of C·K over
	// GF(2^61-1), C selecting these states, for the input design.
	Targets []int32
}

// VerifyResult is numeric.Verify's result, with the targets' sample.
type VerifyResult struct {
	*numeric.Result
	// Targets, with VerifyRequest.Targets: the sampled target rank.
	Targets *target.SampleResult `json:"targets,omitempty"`
}

// Holds reports whether the samples confirm every property asked, the
// targets' steerability included.
func (r *VerifyResult) Holds() bool {
	if r.Targets != nil {
		return r.Targets.Holds && (r.Observability == nil || r.Observability.SampledHolds)
	}
	return r.Result.Holds()
}

// Verify confirms the structural answers on numbers (numeric.Verify) and,
// with targets, samples the rank of C·K (target.Sample).
func Verify(g *structural.Network, req VerifyRequest) (*VerifyResult, error) {
	res, err := numeric.Verify(g, req.Request)
	if err != nil {
		return nil, err
	}
	r := &VerifyResult{Result: res}
	if req.Targets != nil && req.Inputs != nil {
		r.Targets, err = target.Sample(g, target.SampleRequest{Property: structural.Controllability, Targets: req.Targets, Inputs: *req.Inputs,
			Trials: req.Trials, Seed: req.Seed, MaxStates: req.MaxStates})
		if err != nil {
			return nil, err
		}
		r.Cautions = append(r.Cautions, TargetCaution)
	}
	return r, nil
}

// TargetCaution is the caution every target-control answer carries.
const TargetCaution = "Target control means the targets can be brought to any values at some time; the other states may then be anywhere, and holding the targets on a trajectory is a stronger requirement not checked here."
