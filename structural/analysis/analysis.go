package analysis

import (
	"time"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/failure"
	"github.com/netsteer/netsteer/structural/numeric"
	"github.com/netsteer/netsteer/structural/placement"
	"github.com/netsteer/netsteer/structural/strong"
	"github.com/netsteer/netsteer/structural/target"
)

// Summary describes the network a result is about. File is left to the
// caller, who knows where the network came from.
type Summary struct {
	File             string `json:"file,omitempty"`
	Nodes            int    `json:"nodes"`
	Edges            int    `json:"edges"`
	SelfLoops        int    `json:"self_loops"`
	DuplicatesMerged int    `json:"duplicates_merged"`

	g *structural.Network
}

// Network returns the network the result is about.
func (s Summary) Network() *structural.Network { return s.g }

func summary(g *structural.Network) Summary {
	return Summary{Nodes: g.N(), Edges: g.Edges(), SelfLoops: g.SelfLoops(), DuplicatesMerged: g.DuplicatesMerged(), g: g}
}

// DriversRequest says what Drivers computes beyond the driver set.
type DriversRequest struct {
	// Roles adds the role of every state across all minimum driver sets
	// and of every edge across all maximum matchings.
	Roles bool
	// Targets, when not nil, also finds the fewest independent signals
	// that steer only these states (structural/target: target control).
	Targets []int32
	// Seed makes the samples of a target search reproducible.
	Seed uint64
}

// DriversResult is the answer to "how many independent signals, and
// where?".
type DriversResult struct {
	Summary
	// MatchingSize is |M*|, the size of a maximum matching.
	MatchingSize int `json:"matching_size"`
	// DriverCount is N_D = max(N - |M*|, 1).
	DriverCount int `json:"driver_count"`
	// DriverFraction is N_D / N.
	DriverFraction float64 `json:"driver_fraction"`
	// Drivers are the driver nodes.
	Drivers structural.States `json:"drivers"`
	// Inputs is a complete structurally controllable design with N_D
	// signals: signal i drives Drivers[i] and possibly states of source
	// components that hold no driver.
	Inputs structural.Design `json:"inputs"`
	// NodeRoles and LinkRoles, with DriversRequest.Roles.
	NodeRoles *structural.NodeRoles `json:"node_roles,omitempty"`
	LinkRoles *structural.LinkRoles `json:"link_roles,omitempty"`
	// Targets, with DriversRequest.Targets: the fewest signals that steer
	// the targets, with bounds and the saving against full control.
	Targets *target.Selection `json:"targets,omitempty"`
	Timings Timings           `json:"timings"`
}

// Perfect reports whether the maximum matching is perfect: every state is
// matched, so one signal suffices and node roles are all redundant.
func (r *DriversResult) Perfect() bool { return r.MatchingSize == r.Nodes }

// Drivers finds the fewest independent control signals, N_D = max(N -
// |M*|, 1) (Liu, Slotine & Barabási, Nature 473:167, 2011), one set of
// driver nodes and a complete design that achieves it; with req.Roles, the
// node and link roles. Time: one maximum matching, one strongly connected
// components pass, and O(N + E) for the roles.
func Drivers(g *structural.Network, req DriversRequest) (*DriversResult, error) {
	r := &DriversResult{Summary: summary(g)}
	t := time.Now()
	// Both at once, on two cores for large networks: one stage.
	g.MatchingAndComponents()
	t = r.Timings.Add("match_components", t)
	ds := structural.Drivers(g)
	r.MatchingSize, r.DriverCount = ds.MatchingSize, ds.Count()
	r.DriverFraction = float64(ds.Count()) / float64(g.N())
	r.Drivers, r.Inputs = ds.Drivers, ds.Inputs
	if req.Roles {
		r.NodeRoles = structural.StateRoles(g)
		r.LinkRoles = structural.EdgeRoles(g)
		t = r.Timings.Add("roles", t)
	}
	if req.Targets != nil {
		sel, err := target.Select(g, target.SelectRequest{Property: structural.Controllability, Targets: req.Targets, Mode: target.Signals, Seed: req.Seed})
		if err != nil {
			return nil, err
		}
		r.Targets = sel
		r.Timings.Add("targets", t)
	}
	return r, nil
}

// CheckRequest is a design to judge: inputs for controllability, outputs
// for observability (at least one).
type CheckRequest struct {
	Inputs, Outputs *structural.Design
	// Actuators and Sensors give the costs and allowed states of the
	// dedicated devices that complete a failing design (Existing is not
	// used: the design says what is in place). Zero values: unit costs,
	// every state allowed.
	Actuators, Sensors structural.Devices
	// SkipCompletion leaves out the cheapest completion of a failing
	// design (a picture does not show it).
	SkipCompletion bool
	// Strong, when not nil, also decides strong structural
	// controllability (observability): for every parameter value of this
	// class (structural/strong). WitnessEntries bounds the witness printed
	// (0: strong.DefaultWitnessEntries).
	Strong         *strong.Class
	WitnessEntries int
	// Targets, when not nil, also judges whether each design steers
	// (tells, for outputs) only these states: target control.
	Targets []int32
	// Seed makes the samples of the target check reproducible.
	Seed uint64
}

// PropertyResult is the answer for one property of a design: the structural
// verdict and, when the design fails, its cheapest completion. It has one
// shape wherever a property is reported.
type PropertyResult struct {
	*structural.Verdict
	// DesignFile names where the design came from; set by the caller.
	DesignFile string `json:"design_file,omitempty"`
	// Completion is the cheapest set of dedicated devices to add to a
	// failing design; nil when the design holds.
	Completion *placement.Placement `json:"completion,omitempty"`
	// Strong is the verdict for every parameter value of the class asked
	// (CheckRequest.Strong); nil when not asked.
	Strong *strong.Result `json:"strong,omitempty"`
	// Targets is the target-control verdict (CheckRequest.Targets); nil
	// when not asked.
	Targets *target.Verdict `json:"targets,omitempty"`
	// Design is the design judged.
	Design structural.Design `json:"-"`
}

// CheckResult is the answer to "does this design work, and if not, what
// is wrong and what fixes it?".
type CheckResult struct {
	Summary
	Controllability *PropertyResult `json:"controllability,omitempty"`
	Observability   *PropertyResult `json:"observability,omitempty"`
	Timings         Timings         `json:"timings"`
}

// Holds reports whether every property asked for holds, strongly when
// the strong verdict was asked.
func (r *CheckResult) Holds() bool {
	for _, p := range r.Properties() {
		if p.Targets != nil {
			if !p.Targets.Holds || p.Strong != nil && !p.Strong.Holds {
				return false
			}
			continue
		}
		if !p.Holds || p.Strong != nil && !p.Strong.Holds {
			return false
		}
	}
	return true
}

// Properties returns the properties judged, controllability first.
func (r *CheckResult) Properties() []*PropertyResult {
	var out []*PropertyResult
	for _, p := range []*PropertyResult{r.Controllability, r.Observability} {
		if p != nil {
			out = append(out, p)
		}
	}
	return out
}

// ErrNoDesign is returned by Check when the request holds no design.
var ErrNoDesign = errorString("analysis: no design to check: give inputs, outputs or both")

type errorString string

func (e errorString) Error() string { return string(e) }

// Check judges the designs of req by Lin's theorem (structural.Check), with
// the generic dimension of a failing design and its cheapest completion by
// dedicated devices (placement.Complete). Time: one matching per property
// for a design that holds; a failing one adds the dimension's min-cost
// flow and the completion's.
func Check(g *structural.Network, req CheckRequest) (*CheckResult, error) {
	if req.Inputs == nil && req.Outputs == nil {
		return nil, ErrNoDesign
	}
	r := &CheckResult{Summary: summary(g)}
	t := time.Now()
	for _, x := range []struct {
		p   structural.Property
		d   *structural.Design
		dev structural.Devices
		to  **PropertyResult
	}{
		{structural.Controllability, req.Inputs, req.Actuators, &r.Controllability},
		{structural.Observability, req.Outputs, req.Sensors, &r.Observability},
	} {
		if x.d == nil {
			continue
		}
		v, err := structural.Check(g, x.p, *x.d)
		if err != nil {
			return nil, err
		}
		t = r.Timings.Add("check_"+x.p.String(), t)
		prop := &PropertyResult{Verdict: v, Design: *x.d}
		if req.Strong != nil {
			prop.Strong, err = strong.Check(g, strong.Request{Property: x.p, Design: *x.d, Class: *req.Strong, WitnessEntries: req.WitnessEntries})
			if err != nil {
				return nil, err
			}
			t = r.Timings.Add("strong_"+x.p.String(), t)
		}
		if req.Targets != nil {
			prop.Targets, err = target.Check(g, target.CheckRequest{Property: x.p, Targets: req.Targets, Inputs: *x.d, Seed: req.Seed})
			if err != nil {
				return nil, err
			}
			t = r.Timings.Add("targets_"+x.p.String(), t)
		}
		if !v.Holds && !req.SkipCompletion && req.Targets == nil {
			dev := x.dev
			dev.Existing = nil
			if prop.Completion, err = placement.Complete(g, x.p, *x.d, dev); err != nil {
				return nil, err
			}
			t = r.Timings.Add("complete_"+x.p.String(), t)
		}
		*x.to = prop
	}
	return r, nil
}

// PlaceRequest asks for the cheapest dedicated devices for a property.
type PlaceRequest struct {
	// Property: Controllability places actuators, Observability sensors.
	Property structural.Property
	// Devices gives costs, forbidden states and existing devices.
	Devices structural.Devices
	// Roles says for each new device whether every cheapest placement has
	// it, and lists up to Alternatives states that could take its place.
	Roles        bool
	Alternatives int
	// RankEffort, when not nil, ranks the placement and each single swap
	// the roles list (all equally cheap) by control effort on numbers
	// (numeric.RankCandidates); it implies Roles. Its Property is set
	// from the request's.
	RankEffort *numeric.RankRequest
	// Strong, when not nil, places the cheapest devices for strong
	// structural controllability (observability) of this class as well
	// (strong.Place: exact on small networks, bounded beyond); ExactStates
	// and SearchNodes tune its search (0: the defaults).
	Strong      *strong.Class
	ExactStates int
	SearchNodes int64
	// Targets, when not nil, also finds the cheapest dedicated devices
	// that steer (tell) only these states.
	Targets []int32
	// Seed makes the samples of a target search reproducible.
	Seed uint64
	// Survive, when not nil, also places the cheapest devices that keep
	// the property after the loss of any one device or any one link
	// (failure.Robust); Spares allows a second device on a state.
	// ExactStates and SearchNodes tune its exact search too.
	Survive *failure.Threat
	Spares  bool
}

// PlaceResult is the answer to "where do the cheapest devices go?".
type PlaceResult struct {
	Summary
	Property structural.Property `json:"property"`
	// Device is "actuator" or "sensor".
	Device string `json:"device"`
	*placement.Placement
	// DeviceCount is the size of the complete set (existing included).
	DeviceCount int `json:"device_count"`
	// Count gives the closed form m + beta - alpha when every allowed
	// state costs the same and no device exists yet; nil otherwise.
	Count *placement.DeviceCount `json:"count,omitempty"`
	// Roles, with PlaceRequest.Roles: one entry per added device.
	Roles []placement.DeviceRole `json:"roles,omitempty"`
	// Ranking, with PlaceRequest.RankEffort: the equally cheap placements
	// by control effort.
	Ranking *numeric.Ranking `json:"ranking,omitempty"`
	// Strong, with PlaceRequest.Strong: the placement for every parameter
	// value, with its lower bound and gap.
	Strong *strong.Placement `json:"strong,omitempty"`
	// Targets, with PlaceRequest.Targets: the cheapest devices for the
	// targets alone, with bounds and the saving against full control.
	Targets *target.Selection `json:"targets,omitempty"`
	// Robust, with PlaceRequest.Survive: the placement that survives one
	// failure, with its lower bound and gap.
	Robust  *failure.RobustPlacement `json:"robust,omitempty"`
	Timings Timings                  `json:"timings"`
}

// Succeeds reports whether the placement asked is feasible: the strong one
// when it was asked; for targets, a design proved to steer them.
func (r *PlaceResult) Succeeds() bool {
	if r.Robust != nil {
		return r.Robust.Feasible
	}
	if r.Targets != nil {
		return r.Targets.Feasible && r.Targets.Proved
	}
	if r.Strong != nil {
		return r.Strong.Feasible
	}
	return r.Placement.Feasible
}

// Place finds the cheapest dedicated devices that make g structurally
// controllable (actuators) or observable (sensors) under req.Devices
// (placement.Place), the closed-form count when costs are uniform
// (placement.Count) and, with req.Roles, the devices' roles.
func Place(g *structural.Network, req PlaceRequest) (*PlaceResult, error) {
	r := &PlaceResult{Summary: summary(g), Property: req.Property, Device: req.Property.Device()}
	t := time.Now()
	pl, err := placement.Place(g, req.Property, req.Devices)
	if err != nil {
		return nil, err
	}
	t = r.Timings.Add("place", t)
	r.Placement, r.DeviceCount = pl, pl.Devices.Len()
	if req.Devices.Uniform() {
		c, err := placement.Count(g, req.Property, req.Devices.Forbidden)
		if err != nil {
			return nil, err
		}
		if c.Feasible {
			r.Count = c
		}
		t = r.Timings.Add("count", t)
	}
	if req.Roles || req.RankEffort != nil {
		r.Roles = pl.Roles(max(req.Alternatives, 0))
		t = r.Timings.Add("roles", t)
	}
	if rr := req.RankEffort; rr != nil && pl.Feasible {
		cands, err := numeric.PlacementCandidates(g, pl, r.Roles)
		if err != nil {
			return nil, err
		}
		rq := *rr
		rq.Property = req.Property
		if r.Ranking, err = numeric.RankCandidates(g, cands, rq); err != nil {
			return nil, err
		}
		t = r.Timings.Add("rank", t)
	}
	if req.Strong != nil {
		if r.Strong, err = strong.Place(g, strong.PlaceRequest{Property: req.Property, Class: *req.Strong, Devices: req.Devices,
			ExactStates: req.ExactStates, SearchNodes: req.SearchNodes}); err != nil {
			return nil, err
		}
		t = r.Timings.Add("strong", t)
	}
	if req.Targets != nil {
		sel, err := target.Select(g, target.SelectRequest{Property: req.Property, Targets: req.Targets, Mode: target.Actuators, Devices: req.Devices, Seed: req.Seed})
		if err != nil {
			return nil, err
		}
		r.Targets = sel
		r.Timings.Add("targets", t)
	}
	if req.Survive != nil {
		t0 := time.Now()
		rp, err := failure.Robust(g, failure.RobustRequest{Property: req.Property, Survive: *req.Survive, Devices: req.Devices,
			Spares: req.Spares, ExactStates: req.ExactStates, Nodes: int(req.SearchNodes)})
		if err != nil {
			return nil, err
		}
		r.Robust = rp
		r.Timings.Add("robust", t0)
	}
	return r, nil
}
