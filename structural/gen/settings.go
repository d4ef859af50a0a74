package gen

import (
	"math"
	"strconv"
	"strings"
)

// Setting kinds.
const (
	kindInt = iota
	kindFloat
	kindBool
	kindWord
)

// ParamSpec describes one model parameter as the command line and sweep
// files name it: mean_degree is the option --mean-degree and the sweep
// parameter "mean_degree".
type ParamSpec struct {
	Name    string
	Default string // "" when required
	Help    string
	kind    int
}

// Numeric reports whether the parameter takes numbers (and so ranges).
func (s ParamSpec) Numeric() bool { return s.kind == kindInt || s.kind == kindFloat }

// Integer reports whether the parameter takes whole numbers only.
func (s ParamSpec) Integer() bool { return s.kind == kindInt }

var (
	specNodes      = ParamSpec{"nodes", "", "number of states N, isolated ones included", kindInt}
	specMeanDegree = ParamSpec{"mean_degree", "2", "mean degree <k> = 2L/N (in plus out)", kindFloat}
	specDegree     = ParamSpec{"degree", "2", "out-degree d of every state (regular: in-degree too)", kindInt}
	specGammaOut   = ParamSpec{"gamma_out", "3", "out-degree exponent (> 2; inf for none)", kindFloat}
	specGammaIn    = ParamSpec{"gamma_in", "3", "in-degree exponent (> 2; inf for none)", kindFloat}
	specRewire     = ParamSpec{"rewire", "0.1", "probability that a ring edge gets a random target", kindFloat}
	specTwoWay     = ParamSpec{"two_way", "false", "two-way ring (k/2 each side) or followers reporting to leaders", kindBool}
	specSide       = ParamSpec{"side", "both", "fixed side: both, out or in", kindWord}
	specWidth      = ParamSpec{"width", "auto", "states per grid row (auto: round(sqrt(N)))", kindInt}
	specDirections = ParamSpec{"directions", "right+down", "edge directions: right, left, down, up or all", kindWord}
	specBranching  = ParamSpec{"branching", "2", "followers per leader (0: random recursive tree)", kindInt}
)

// ParamSpecs returns the parameters of a model in their fixed order, or
// nil for an unknown model.
func ParamSpecs(model string) []ParamSpec {
	switch model {
	case "er":
		return []ParamSpec{specNodes, specMeanDegree}
	case "scale-free":
		return []ParamSpec{specNodes, specMeanDegree, specGammaOut, specGammaIn}
	case "small-world":
		return []ParamSpec{specNodes, specDegree, specRewire, specTwoWay}
	case "regular":
		return []ParamSpec{specNodes, specDegree, specSide}
	case "grid":
		return []ParamSpec{specNodes, specWidth, specDirections}
	case "tree":
		return []ParamSpec{specNodes, specBranching, specTwoWay}
	}
	return nil
}

// AllParamSpecs lists every model parameter once, for option tables.
func AllParamSpecs() []ParamSpec {
	return []ParamSpec{specNodes, specMeanDegree, specDegree, specGammaOut, specGammaIn,
		specRewire, specTwoWay, specSide, specWidth, specDirections, specBranching}
}

// FromSettings builds Params for model from named values (ParamSpecs
// names); missing ones take their defaults, names the model does not use
// are an error.
func FromSettings(model string, values map[string]string) (Params, error) {
	specs := ParamSpecs(model)
	if specs == nil {
		return Params{}, errorf("unknown model %q (want one of %s)", model, strings.Join(Models, ", "))
	}
	known := map[string]bool{}
	for _, s := range specs {
		known[s.Name] = true
	}
	for name := range values {
		if !known[name] {
			return Params{}, errorf("%s does not apply to the %s model", strings.ReplaceAll(name, "_", "-"), model)
		}
	}
	p := Params{Model: model}
	for _, s := range specs {
		v, ok := values[s.Name]
		if !ok {
			if s.Default == "" {
				return Params{}, errorf("the %s model needs %s", model, strings.ReplaceAll(s.Name, "_", "-"))
			}
			v = s.Default
		}
		if err := p.set(s, v); err != nil {
			return Params{}, err
		}
	}
	return p, p.Check()
}

func (p *Params) set(s ParamSpec, v string) error {
	bad := func() error {
		return errorf("%s %q is not %s", strings.ReplaceAll(s.Name, "_", "-"), v, map[int]string{
			kindInt: "a whole number", kindFloat: "a number", kindBool: "true or false", kindWord: "valid"}[s.kind])
	}
	var iv int
	var fv float64
	var bv bool
	var err error
	switch s.kind {
	case kindInt:
		if s.Name == "width" && v == "auto" {
			break
		}
		if iv, err = strconv.Atoi(v); err != nil || iv < 0 {
			return bad()
		}
		if s.Name == "width" && iv == 0 {
			// 0 would silently mean auto.
			return errorf("width 0: want a whole number of at least 1, or auto")
		}
	case kindFloat:
		if v == "inf" {
			fv = math.Inf(1)
			break
		}
		if fv, err = strconv.ParseFloat(v, 64); err != nil || math.IsNaN(fv) || math.IsInf(fv, 0) {
			return bad()
		}
	case kindBool:
		if bv, err = strconv.ParseBool(v); err != nil {
			return bad()
		}
	}
	switch s.Name {
	case "nodes":
		p.Nodes = iv
	case "mean_degree":
		p.MeanDegree = fv
	case "degree":
		p.Degree = iv
	case "gamma_out":
		p.GammaOut = fv
	case "gamma_in":
		p.GammaIn = fv
	case "rewire":
		p.Rewire = fv
	case "two_way":
		p.TwoWay = bv
	case "side":
		if p.Side, err = ParseSide(v); err != nil {
			return err
		}
	case "width":
		p.Width = iv
	case "directions":
		if p.Directions, err = ParseDirections(v); err != nil {
			return err
		}
	case "branching":
		p.Branching = iv
	}
	return nil
}
