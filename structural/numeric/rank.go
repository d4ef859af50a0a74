package numeric

import (
	"encoding/json"
	"math"
	"math/rand/v2"
	"slices"
	"sort"

	"gonum.org/v1/gonum/mat"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/placement"
)

// RankRequest says on which numbers candidate designs are compared.
type RankRequest struct {
	// Property: Controllability ranks input designs by the input energy
	// they need, Observability output designs by how well they see.
	Property structural.Property
	// Weights takes A from the network's weights (1 where it has none)
	// and the signals' values from SignalWeights (nil: 1). Otherwise A is
	// drawn at random, as the floating-point check of Verify draws it for
	// trial t (the same PCG stream (Seed, 4t+1)), and every signal entry
	// is 1: a device's gain is its own design choice, so dedicated
	// devices are compared at unit gain (common practice in actuator
	// placement metrics).
	Weights       bool
	SignalWeights [][][]float64
	// Trials and Seed: the random systems (Trials 0: 1; ignored with
	// Weights). A design's figures are the geometric mean over the trials
	// of the worst-case energy and the mean of the trace.
	Trials int
	Seed   uint64
	// Effort chooses continuous or discrete time and the horizon.
	Effort EffortRequest
	// MaxStates bounds the network (0: DefaultMaxFloatStates); above it
	// RankDesigns returns a *SizeError.
	MaxStates int
}

// Ranking is the answer of RankDesigns: the candidates by least effort.
type Ranking struct {
	// Property ranked, and the numbers: the model's (Weights) or Trials
	// random systems from Seed.
	Property string  `json:"property"`
	Weights  bool    `json:"weights"`
	Trials   int     `json:"trials"`
	Seed     *uint64 `json:"seed,omitempty"`
	// TimeDomain is "continuous" or "discrete"; Horizon 0 is infinite.
	TimeDomain string  `json:"time_domain"`
	Horizon    float64 `json:"horizon,omitempty"`
	// Candidates, least effort first.
	Candidates []RankedDesign `json:"candidates"`
}

// RankedDesign is one candidate's place and figures.
type RankedDesign struct {
	// Candidate is the 1-based position in the list given; Rank the place
	// by effort (1 = least); equal figures (to 9 digits) share a rank.
	Candidate int `json:"candidate"`
	Rank      int `json:"rank"`
	// Swap names the change from the placement when the candidates came
	// from PlacementCandidates; nil for the placement itself and for
	// candidates given directly.
	Swap *Swap `json:"swap,omitempty"`
	// Design is the candidate.
	Design structural.Design `json:"design"`
	// WorstCaseEnergy is the geometric mean over the trials of 1/λ_min of
	// the Gramian, +Inf (left out of JSON) when some trial's Gramian is
	// singular; GramianTrace the mean trace (average controllability).
	WorstCaseEnergy float64 `json:"-"`
	GramianTrace    float64 `json:"gramian_trace"`
	// Efforts are the trials' own figures.
	Efforts []*Effort `json:"trials"`
}

// Conditioning returns the smallest ratio λ_min/λ_max of the trials'
// Gramians (0 when rounding made λ_min negative) and the 1-based trial it
// comes from (0 without trials). At or
// below RoundingLevel the Gramian is singular within rounding and the
// worst-case energy is +Inf: too large to tell from floating-point noise,
// not proof that a direction cannot be reached.
func (r RankedDesign) Conditioning() (ratio float64, trial int) {
	ratio = math.Inf(1)
	for i, e := range r.Efforts {
		q := max(e.GramianMin/e.GramianMax, 0) // rounding can make it negative
		if e.GramianMax <= 0 || math.IsNaN(q) {
			q = 0
		}
		if q < ratio {
			ratio, trial = q, i+1
		}
	}
	return ratio, trial
}

// MarshalJSON leaves an infinite energy out.
func (r RankedDesign) MarshalJSON() ([]byte, error) {
	type plain RankedDesign
	return json.Marshal(struct {
		plain
		WorstCaseEnergy *float64 `json:"worst_case_energy,omitempty"`
	}{plain(r), ptr(r.WorstCaseEnergy)})
}

// Swap is one device moved: the placement with From replaced by To.
type Swap struct {
	From, To int32
	names    structural.States
}

// MarshalJSON writes the states' names.
func (s *Swap) MarshalJSON() ([]byte, error) {
	return json.Marshal(struct {
		From string `json:"from"`
		To   string `json:"to"`
	}{s.names.NameOf(s.From), s.names.NameOf(s.To)})
}

// Candidate is a design to rank, with the swap it makes from a placement.
type Candidate struct {
	Design structural.Design
	Swap   *Swap
}

// PlacementCandidates returns the placement's dedicated design (every
// device, existing ones included) followed by each single swap that
// roles (placement.Placement.Roles) lists: the device on role.State moved
// to one of its alternatives. All have the placement's cost.
func PlacementCandidates(g *structural.Network, pl *placement.Placement, roles []placement.DeviceRole) ([]Candidate, error) {
	if !pl.Feasible {
		return nil, errorf("the placement is infeasible: no design to rank")
	}
	base := append([]int32(nil), pl.Devices.IDs()...)
	d, err := structural.Dedicated(g, base)
	if err != nil {
		return nil, err
	}
	out := []Candidate{{Design: d}}
	for _, r := range roles {
		i := slices.Index(base, r.State)
		if i < 0 {
			return nil, errorf("role of state %d, which holds no device of the placement", r.State)
		}
		for _, alt := range r.Alternatives.IDs() {
			states := append([]int32(nil), base...)
			states[i] = alt
			slices.Sort(states)
			d, err := structural.Dedicated(g, states)
			if err != nil {
				return nil, err
			}
			out = append(out, Candidate{Design: d, Swap: &Swap{From: r.State, To: alt, names: g.States(nil)}})
		}
	}
	return out, nil
}

// RankDesigns ranks candidate designs of g by control effort (see
// Effort): least worst-case energy first, then largest trace, then the
// order given. A is shared by all candidates (its Schur form is computed
// once per trial); each candidate costs a Lyapunov solve and a symmetric
// eigensolver, O(n³), or with a continuous horizon a 2n×2n matrix
// exponential. Equally cheap placements (PlacementCandidates) differ in
// this effort, which the structure cannot see.
func RankDesigns(g *structural.Network, candidates []structural.Design, req RankRequest) (*Ranking, error) {
	cs := make([]Candidate, len(candidates))
	for i, d := range candidates {
		cs[i] = Candidate{Design: d}
	}
	return RankCandidates(g, cs, req)
}

// RankCandidates is RankDesigns for candidates that carry their swaps.
func RankCandidates(g *structural.Network, candidates []Candidate, req RankRequest) (*Ranking, error) {
	if len(candidates) == 0 {
		return nil, errorf("no candidate designs to rank")
	}
	if req.SignalWeights != nil && len(req.SignalWeights) != len(candidates) {
		return nil, errorf("%d signal value lists for %d candidates", len(req.SignalWeights), len(candidates))
	}
	n := g.N()
	limit := req.MaxStates
	if limit <= 0 {
		limit = DefaultMaxFloatStates
	}
	trials := req.Trials
	if trials <= 0 || req.Weights {
		trials = 1
	}
	if trials > MaxTrials {
		return nil, errorf("%d trials: at most %d", trials, MaxTrials)
	}
	if n > limit {
		return nil, &SizeError{Stage: StageDense, States: n, Edges: g.Edges(), Limit: limit,
			Estimate: EstimateDense(n, len(candidates), trials, false, true, req.Effort.Horizon > 0)}
	}
	transpose := req.Property == structural.Observability
	for i, c := range candidates {
		if !c.Design.Of(g) {
			return nil, structural.ErrForeignDesign
		}
		if req.SignalWeights != nil {
			if err := checkWeights(c.Design, req.SignalWeights[i], "signal"); err != nil {
				return nil, err
			}
		}
	}
	res := &Ranking{Property: req.Property.String(), Weights: req.Weights, Trials: trials,
		TimeDomain: timeDomain(req.Effort.Discrete), Horizon: req.Effort.Horizon}
	if !req.Weights {
		seed := req.Seed
		res.Seed = &seed
	}
	out := make([]RankedDesign, len(candidates))
	for i, c := range candidates {
		out[i] = RankedDesign{Candidate: i + 1, Design: c.Design, Swap: c.Swap}
	}
	pat := &Pattern{Out: g.Out()}
	for t := 0; t < trials; t++ {
		var av []float64
		if req.Weights {
			av = RealFromWeights(pat, g.Weights(), nil).A
		} else {
			rr := rand.New(rand.NewPCG(req.Seed, uint64(4*t+1)))
			av = make([]float64, g.Edges())
			for k := range av {
				av[k] = drawReal(rr)
			}
		}
		a, _ := (&Real{A: av}).Dense(pat, transpose)
		sf, err := newSchur(a, n)
		if err != nil {
			return nil, err
		}
		solver, err := newEffortSolver(sf, req.Effort)
		if err != nil {
			return nil, err
		}
		zt := mat.NewDense(n, n, sf.z).T()
		for i, c := range candidates {
			m := c.Design.Len()
			var w [][]float64
			if req.Weights && req.SignalWeights != nil {
				w = req.SignalWeights[i]
			}
			b := make([]float64, n*m)
			for j, s := range c.Design.Signals() {
				for l, v := range s {
					x := 1.0
					if w != nil && w[j] != nil {
						x = w[j][l]
					}
					b[int(v)*m+j] += x
				}
			}
			cz := make([]float64, n*m)
			if m > 0 {
				mat.NewDense(n, m, cz).Mul(zt, mat.NewDense(n, m, b))
			}
			e, err := solver.effort(cz, m)
			if err != nil {
				return nil, err
			}
			if e.Skipped != "" {
				return nil, &UnstableError{Reason: e.Skipped}
			}
			out[i].Efforts = append(out[i].Efforts, e)
		}
	}
	for i := range out {
		logSum, tr := 0.0, 0.0
		for _, e := range out[i].Efforts {
			logSum += math.Log(e.WorstCaseEnergy)
			tr += e.GramianTrace
		}
		k := float64(len(out[i].Efforts))
		out[i].WorstCaseEnergy = math.Exp(logSum / k)
		out[i].GramianTrace = tr / k
	}
	sort.SliceStable(out, func(a, b int) bool {
		ea, eb := out[a].WorstCaseEnergy, out[b].WorstCaseEnergy
		if !close9(ea, eb) {
			return ea < eb
		}
		if !close9(out[a].GramianTrace, out[b].GramianTrace) {
			return out[a].GramianTrace > out[b].GramianTrace
		}
		return false
	})
	for i := range out {
		out[i].Rank = i + 1
		if i > 0 && close9(out[i].WorstCaseEnergy, out[i-1].WorstCaseEnergy) && close9(out[i].GramianTrace, out[i-1].GramianTrace) {
			out[i].Rank = out[i-1].Rank
		}
	}
	res.Candidates = out
	return res, nil
}

// close9 reports equality to nine significant digits (infinities equal).
func close9(a, b float64) bool {
	if math.IsInf(a, 1) || math.IsInf(b, 1) {
		return a == b
	}
	return math.Abs(a-b) <= 1e-9*math.Max(math.Abs(a), math.Abs(b))
}

func timeDomain(discrete bool) string {
	if discrete {
		return "discrete"
	}
	return "continuous"
}

// UnstableError reports a ranking on the infinite horizon of a system
// whose A is not stable: the Gramian does not exist, and a finite horizon
// is needed.
type UnstableError struct{ Reason string }

func (e *UnstableError) Error() string   { return "numeric: " + e.Reason }
func (e *UnstableError) Message() string { return e.Reason }
