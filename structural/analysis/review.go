package analysis

import (
	"time"

	"github.com/netsteer/netsteer/structural"
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
	Timings     Timings               `json:"timings"`
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
		r.Timings.Add("sensor_roles", t)
	}
	return r, nil
}
