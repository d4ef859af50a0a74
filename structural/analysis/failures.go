package analysis

import (
	"time"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/failure"
)

// FailuresRequest asks what the loss of one device, link or state does to
// a design: inputs for controllability, outputs for observability.
type FailuresRequest struct {
	Inputs, Outputs *structural.Design
	// Actuators and Sensors give the costs and allowed states of the
	// replacements and fixes (Existing is not used).
	Actuators, Sensors structural.Devices
	// States adds the loss of each state; Detail, Partners and Budget as
	// in failure.Request (0: the defaults).
	States   bool
	Detail   int
	Partners int
	Budget   int64
}

// FailuresResult is the answer for each design given.
type FailuresResult struct {
	Summary
	Controllability *failure.Assessment `json:"controllability,omitempty"`
	Observability   *failure.Assessment `json:"observability,omitempty"`
	Timings         Timings             `json:"timings"`
}

// Assessments returns the assessments made, controllability first.
func (r *FailuresResult) Assessments() []*failure.Assessment {
	var out []*failure.Assessment
	for _, a := range []*failure.Assessment{r.Controllability, r.Observability} {
		if a != nil {
			out = append(out, a)
		}
	}
	return out
}

// Survives reports whether every design holds and no single device or
// link loss (nor state loss, when judged) breaks it.
func (r *FailuresResult) Survives() bool {
	for _, a := range r.Assessments() {
		if !a.Intact.Holds || a.EssentialDevices > 0 || len(a.Links) > 0 || len(a.States) > 0 {
			return false
		}
	}
	return true
}

// Failures judges every single loss of each design (failure.Assess): each
// device classified after Commault, Dion & Trinh (IEEE TAC 53(6), 2008), every
// breaking link split by cause, with the cheapest replacement or fix.
func Failures(g *structural.Network, req FailuresRequest) (*FailuresResult, error) {
	if req.Inputs == nil && req.Outputs == nil {
		return nil, ErrNoDesign
	}
	r := &FailuresResult{Summary: summary(g)}
	t := time.Now()
	for _, x := range []struct {
		p   structural.Property
		d   *structural.Design
		dev structural.Devices
		to  **failure.Assessment
	}{
		{structural.Controllability, req.Inputs, req.Actuators, &r.Controllability},
		{structural.Observability, req.Outputs, req.Sensors, &r.Observability},
	} {
		if x.d == nil {
			continue
		}
		dev := x.dev
		dev.Existing = nil
		a, err := failure.Assess(g, failure.Request{Property: x.p, Design: *x.d, Devices: dev, States: req.States,
			Detail: req.Detail, Partners: req.Partners, Budget: req.Budget})
		if err != nil {
			return nil, err
		}
		*x.to = a
		t = r.Timings.Add("failures_"+x.p.String(), t)
	}
	return r, nil
}
