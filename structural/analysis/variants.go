package analysis

import (
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/gen"
	"github.com/netsteer/netsteer/structural/transform"
)

// VaryRequest lists transforms to apply in order, with the seed of their
// random choices.
type VaryRequest struct {
	Transforms []transform.Transform
	Seed       uint64
}

// VaryResult compares a network with its variant.
type VaryResult struct {
	File       string   `json:"file,omitempty"`
	Transforms []string `json:"transforms"`
	Seed       uint64   `json:"seed"`
	// Output and NodeTable name the files written; set by the caller.
	Output            string  `json:"output,omitempty"`
	NodeTable         string  `json:"node_table,omitempty"`
	NodesBefore       int     `json:"nodes_before"`
	EdgesBefore       int     `json:"edges_before"`
	DriverCountBefore int     `json:"driver_count_before"`
	Nodes             int     `json:"nodes"`
	Edges             int     `json:"edges"`
	DriverCount       int     `json:"driver_count"`
	DriverFraction    float64 `json:"driver_fraction"`
	// PredictedFraction is the degree-preserving expectation of the
	// variant's driver fraction (the cavity prediction for its own degree
	// sequence); nil when it cannot be computed.
	PredictedFraction *float64 `json:"predicted_fraction"`
	// Variant is the network made.
	Variant *structural.Network `json:"-"`
}

// Vary applies the transforms of req to g in order and compares the
// driver counts before and after with the degree-preserving expectation.
func Vary(g *structural.Network, req VaryRequest) (*VaryResult, error) {
	rng := gen.NewRand(req.Seed)
	h := g
	r := &VaryResult{Seed: req.Seed, NodesBefore: g.N(), EdgesBefore: g.Edges()}
	for _, t := range req.Transforms {
		var err error
		if h, err = t.Apply(h, rng); err != nil {
			return nil, err
		}
		r.Transforms = append(r.Transforms, t.String())
	}
	r.DriverCountBefore = structural.Drivers(g).Count()
	r.Variant, r.Nodes, r.Edges = h, h.N(), h.Edges()
	r.DriverCount = structural.Drivers(h).Count()
	r.DriverFraction = float64(r.DriverCount) / float64(h.N())
	if x, err := structural.ExpectedDriverFraction(h); err == nil {
		r.PredictedFraction = &x
	}
	return r, nil
}

// GenerateResult describes a generated network.
type GenerateResult struct {
	Model      string            `json:"model"`
	Nodes      int               `json:"nodes"`
	Edges      int64             `json:"edges"`
	MeanDegree float64           `json:"mean_degree"`
	Seed       uint64            `json:"seed"`
	Params     map[string]string `json:"params"`
	// Output and NodeTable name the files written; set by the caller.
	Output    string `json:"output,omitempty"`
	NodeTable string `json:"node_table,omitempty"`
	// PredictedFraction is the cavity prediction of the driver fraction
	// for the model's own degree distributions (Liu, Slotine & Barabási
	// 2011, Eq. 3), nil when they are not known in closed form.
	PredictedFraction *float64 `json:"predicted_fraction"`
	settings          []gen.Setting
}

// Settings returns the model's parameters in their documented order.
func (r *GenerateResult) Settings() []gen.Setting { return r.settings }

// Generated describes a network of model p generated with seed that came
// out with the given number of edges.
func Generated(p gen.Params, seed uint64, edges int64) *GenerateResult {
	r := &GenerateResult{Model: p.Model, Nodes: p.Nodes, Edges: edges, Seed: seed, Params: map[string]string{}, settings: p.Settings()}
	r.MeanDegree = 2 * float64(edges) / float64(p.Nodes)
	for _, s := range r.settings {
		r.Params[s.Name] = s.Value
	}
	if out, in, ok := p.Distributions(); ok {
		if v, err := structural.CavityDriverFraction(out, in); err == nil {
			r.PredictedFraction = &v
		}
	}
	return r
}
