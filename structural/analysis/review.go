package analysis

import (
	"time"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/numeric"
	"github.com/netsteer/netsteer/structural/strong"
)

// ReviewRequest says what a picture or a review page shows. Every part is
// computed by the call that answers it alone (Drivers, Check, Place).
type ReviewRequest struct {
	// Inputs and Outputs are designs to judge; nil for none.
	Inputs, Outputs *structural.Design
	// PlaceActuators (PlaceSensors) adds the cheapest dedicated actuators
	// (sensors); typically asked when no input (output) design is given.
	PlaceActuators, PlaceSensors bool
	// Actuators and Sensors give device costs, forbidden states and
	// existing devices.
	Actuators, Sensors structural.Devices
	// Roles adds node roles across all minimum driver sets (and across
	// all minimum sensor sets, on the transposed network) and the roles of
	// placed devices with up to Alternatives alternatives each.
	Roles        bool
	Alternatives int
	// Complete adds the cheapest completion of a failing design.
	Complete bool
	// Strong adds the strong structural verdict of each given design, for
	// this class of systems (see CheckRequest.Strong).
	Strong *strong.Class
	// Verify, when not nil, adds the numeric check (numeric.Verify with
	// this request) of the designs the review answers for: the given
	// ones, else the cheapest devices placed. Its designs are filled in.
	Verify *numeric.Request
}

// Review is everything a design-review picture or page shows.
type Review struct {
	Summary
	// Drivers is always computed: the minimum number of signals frames
	// every other answer.
	Drivers *DriversResult `json:"drivers"`
	// Check judges the given designs; nil without any.
	Check *CheckResult `json:"check,omitempty"`
	// Actuators and Sensors are the cheapest dedicated devices, when asked.
	Actuators *PlaceResult `json:"actuators,omitempty"`
	Sensors   *PlaceResult `json:"sensors,omitempty"`
	// SensorRoles are node roles for sensors: across all minimum output
	// sets, on the transposed network (Drivers.NodeRoles are for inputs).
	SensorRoles *structural.NodeRoles `json:"sensor_roles,omitempty"`
	// Numeric is the numeric check (ReviewRequest.Verify) and
	// NumericChecked names the designs it checked ("the given inputs",
	// "the cheapest sensors", ...). NumericError says why it did not run
	// (a *numeric.SizeError for a network too large), nil when it ran or
	// was not asked.
	Numeric        *numeric.Result `json:"numeric,omitempty"`
	NumericChecked []string        `json:"numeric_checked,omitempty"`
	NumericError   error           `json:"-"`
	Timings        Timings         `json:"timings"`
}

// Holds reports whether every design the review judges holds and every
// placement it makes is feasible.
func (r *Review) Holds() bool {
	if r.Check != nil && !r.Check.Holds() {
		return false
	}
	for _, p := range []*PlaceResult{r.Actuators, r.Sensors} {
		if p != nil && !p.Feasible {
			return false
		}
	}
	return true
}

// Analyse answers every question of req on g: what a review shows.
func Analyse(g *structural.Network, req ReviewRequest) (*Review, error) {
	r := &Review{Summary: summary(g)}
	t := time.Now()
	var err error
	if r.Drivers, err = Drivers(g, DriversRequest{Roles: req.Roles}); err != nil {
		return nil, err
	}
	t = r.Timings.Add("drivers", t)
	if req.Inputs != nil || req.Outputs != nil {
		cr := CheckRequest{Inputs: req.Inputs, Outputs: req.Outputs, Actuators: req.Actuators, Sensors: req.Sensors, SkipCompletion: !req.Complete, Strong: req.Strong}
		if r.Check, err = Check(g, cr); err != nil {
			return nil, err
		}
		t = r.Timings.Add("check", t)
	}
	for _, x := range []struct {
		ask bool
		p   structural.Property
		dev structural.Devices
		to  **PlaceResult
	}{
		{req.PlaceActuators, structural.Controllability, req.Actuators, &r.Actuators},
		{req.PlaceSensors, structural.Observability, req.Sensors, &r.Sensors},
	} {
		if !x.ask {
			continue
		}
		if *x.to, err = Place(g, PlaceRequest{Property: x.p, Devices: x.dev, Roles: req.Roles, Alternatives: req.Alternatives}); err != nil {
			return nil, err
		}
		t = r.Timings.Add("place_"+x.p.String(), t)
	}
	if req.Roles {
		r.SensorRoles = structural.StateRoles(g.Transpose())
		t = r.Timings.Add("sensor_roles", t)
	}
	if req.Verify != nil {
		r.verify(g, req)
		r.Timings.Add("numeric", t)
	}
	return r, nil
}

// verify runs the numeric check on the designs the review answers for.
func (r *Review) verify(g *structural.Network, req ReviewRequest) {
	var ins, outs structural.Design
	switch {
	case req.Inputs != nil:
		ins = *req.Inputs
		r.NumericChecked = append(r.NumericChecked, "the given inputs")
	case r.Actuators != nil:
		ins, _ = structural.Dedicated(g, r.Actuators.Devices.IDs())
		r.NumericChecked = append(r.NumericChecked, "the cheapest actuators")
	}
	switch {
	case req.Outputs != nil:
		outs = *req.Outputs
		r.NumericChecked = append(r.NumericChecked, "the given outputs")
	case r.Sensors != nil:
		outs, _ = structural.Dedicated(g, r.Sensors.Devices.IDs())
		r.NumericChecked = append(r.NumericChecked, "the cheapest sensors")
	}
	if ins.Len() == 0 && outs.Len() == 0 {
		r.NumericError = ErrNothingToVerify
		return
	}
	vr := *req.Verify
	vr.Inputs, vr.Outputs = &ins, &outs
	r.Numeric, r.NumericError = numeric.Verify(g, vr)
}

// ErrNothingToVerify is the NumericError of a review with no design to
// check numerically.
var ErrNothingToVerify = errorString("analysis: nothing to check: no inputs or outputs")
