package gen

import (
	"math"
	"math/rand/v2"
	"strconv"

	"github.com/netsteer/netsteer/structural"
)

// Models lists the model names Params understands.
var Models = []string{"er", "scale-free", "small-world", "regular", "grid", "tree"}

// Params selects a model and its parameters. Fields a model does not use
// are ignored.
type Params struct {
	// Model is one of Models.
	Model string
	// Nodes is N, isolated states included.
	Nodes int
	// MeanDegree is <k> = 2L/N for er and scale-free: L = round(<k> N / 2).
	MeanDegree float64
	// Degree is the out-degree d of regular and small-world networks (for
	// regular with Side Both, the in-degree too).
	Degree int
	// GammaOut and GammaIn are the scale-free degree exponents (> 2;
	// +Inf for equal weights).
	GammaOut, GammaIn float64
	// Rewire is the small-world rewiring probability.
	Rewire float64
	// TwoWay makes small-world rings and trees two-way.
	TwoWay bool
	// Side is the fixed side of a regular network.
	Side Side
	// Width is the grid's row length; 0 means round(sqrt(N)).
	Width int
	// Directions are the grid's edge directions; 0 means Right|Down.
	Directions Direction
	// Branching is the tree's number of followers per leader; 0 makes a
	// random recursive tree.
	Branching int
}

// Defaults returns parameters with every model's defaults set: <k> = 2,
// degree 2, exponents 3, rewiring 0.1, directions right+down, branching 2.
func Defaults(model string, nodes int) Params {
	return Params{Model: model, Nodes: nodes, MeanDegree: 2, Degree: 2,
		GammaOut: 3, GammaIn: 3, Rewire: 0.1, Directions: Right | Down, Branching: 2}
}

// Check reports whether the model is known and its parameters usable.
func (p Params) Check() error {
	known := false
	for _, m := range Models {
		known = known || m == p.Model
	}
	if !known {
		return errorf("unknown model %q (want one of er, scale-free, small-world, regular, grid, tree)", p.Model)
	}
	if p.Nodes < 1 || p.Nodes > maxStates {
		return errorf("nodes %d out of range [1, %d]", p.Nodes, maxStates)
	}
	n := int64(p.Nodes)
	switch p.Model {
	case "er", "scale-free":
		if !(p.MeanDegree >= 0) || math.IsInf(p.MeanDegree, 0) {
			return errorf("mean-degree %v is not a nonnegative number", p.MeanDegree)
		}
		// The most edges without self-loops or repeats; the static model
		// draws by rejection and is held to half of them.
		most, what := n*(n-1), "without self-loops or repeats"
		if p.Model == "scale-free" {
			if n < 2 {
				return errorf("the scale-free model needs nodes of at least 2, not %d", n)
			}
			for _, x := range []struct {
				name string
				v    float64
			}{{"gamma-out", p.GammaOut}, {"gamma-in", p.GammaIn}} {
				if !(x.v > 2) {
					return errorf("%s %v must be greater than 2 (inf for none)", x.name, x.v)
				}
			}
			most, what = most/2, "in the static model (half of all possible edges)"
		}
		l := p.targetEdges()
		if l > most {
			return errorf("mean-degree %v asks for %d edges; %d states hold at most %d %s, mean-degree %v",
				p.MeanDegree, l, n, most, what, FormatFloat(2*float64(most)/float64(n)))
		}
		if l > maxEdges {
			return errorf("mean-degree %v asks for %d edges, more than the limit of %d", p.MeanDegree, l, int64(maxEdges))
		}
	case "small-world", "regular":
		if p.Degree < 0 || int64(p.Degree) > n-1 {
			return errorf("degree %d out of range [0, %d] for %d states", p.Degree, n-1, n)
		}
		if n*int64(p.Degree) > maxEdges {
			return errorf("degree %d gives %d edges, more than the limit of %d", p.Degree, n*int64(p.Degree), int64(maxEdges))
		}
		if p.Model == "small-world" {
			if p.TwoWay && p.Degree%2 != 0 {
				return errorf("a two-way ring needs an even degree, not %d", p.Degree)
			}
			if !(p.Rewire >= 0 && p.Rewire <= 1) {
				return errorf("rewire %v is not a probability in [0, 1]", p.Rewire)
			}
		}
	case "grid":
		if p.Width < 0 || int64(p.Width) > n {
			return errorf("width %d out of range [1, %d] for %d states", p.Width, n, n)
		}
		if e := p.EdgeHint(); e > maxEdges {
			return errorf("the grid has %d edges, more than the limit of %d", e, int64(maxEdges))
		}
	case "tree":
		if p.Branching < 0 {
			return errorf("branching %d is negative", p.Branching)
		}
	}
	return nil
}

// targetEdges returns L for er and scale-free, round(<k> N / 2).
func (p Params) targetEdges() int64 {
	return int64(math.Round(p.MeanDegree * float64(p.Nodes) / 2))
}

// EdgeHint returns the number of edges the model will emit, or an estimate.
func (p Params) EdgeHint() int64 {
	switch p.Model {
	case "er", "scale-free":
		return p.targetEdges()
	case "regular", "small-world":
		return int64(p.Nodes) * int64(p.Degree)
	case "grid":
		return GridEdges(p.Nodes, p.width(), p.dirs())
	case "tree":
		if p.TwoWay {
			return 2 * int64(p.Nodes-1)
		}
		return int64(p.Nodes - 1)
	}
	return 0
}

func (p Params) width() int {
	if p.Width > 0 {
		return p.Width
	}
	return max(1, int(math.Round(math.Sqrt(float64(p.Nodes)))))
}

func (p Params) dirs() Direction {
	if p.Directions == 0 {
		return Right | Down
	}
	return p.Directions
}

// Generate emits the network's edges to sink.
func (p Params) Generate(rng *rand.Rand, sink Sink) error {
	if err := p.Check(); err != nil {
		return err
	}
	switch p.Model {
	case "er":
		return ER(p.Nodes, p.targetEdges(), rng, sink)
	case "scale-free":
		return ScaleFree(p.Nodes, p.targetEdges(), p.GammaOut, p.GammaIn, rng, sink)
	case "small-world":
		return SmallWorld(p.Nodes, p.Degree, p.Rewire, p.TwoWay, rng, sink)
	case "regular":
		return Regular(p.Nodes, p.Degree, p.Side, rng, sink)
	case "grid":
		return Grid(p.Nodes, p.width(), p.dirs(), sink)
	case "tree":
		return Tree(p.Nodes, p.Branching, p.TwoWay, rng, sink)
	}
	return errorf("unknown model %q", p.Model)
}

// Network generates the network into a structural.Network. State i is
// named i+1 (1..N), as in Matrix Market files and the edge lists that
// generate writes.
func (p Params) Network(rng *rand.Rand) (*structural.Network, error) {
	if err := p.Check(); err != nil {
		return nil, err
	}
	b := structural.NewIntBuilder(p.Nodes, 1)
	if h := p.EdgeHint(); h > 0 && h <= maxEdges {
		b.Grow(int(h))
	}
	if err := p.Generate(rng, b); err != nil {
		return nil, err
	}
	return b.Build(structural.BuildOptions{})
}

// Distributions returns the model's own large-N in- and out-degree
// distributions when they are known in closed form (er: Poisson on both
// sides; regular: fixed degrees, binomial ~ Poisson on a free side), for
// the cavity prediction. ok is false for the other models, whose
// prediction comes from the degrees of each generated network.
func (p Params) Distributions() (out, in structural.DegreeDist, ok bool) {
	switch p.Model {
	case "er":
		c := float64(p.targetEdges()) / float64(p.Nodes)
		return structural.PoissonDegrees(c), structural.PoissonDegrees(c), true
	case "regular":
		d := p.Degree
		switch p.Side {
		case Out:
			return structural.FixedDegrees(d), structural.PoissonDegrees(float64(d)), true
		case In:
			return structural.PoissonDegrees(float64(d)), structural.FixedDegrees(d), true
		}
		return structural.FixedDegrees(d), structural.FixedDegrees(d), true
	}
	return nil, nil, false
}

// NominalMeanDegree returns the model's <k> = 2L/N when the parameters fix
// it (er, scale-free: the parameter; regular, small-world: 2d), and false
// for grids and trees.
func (p Params) NominalMeanDegree() (float64, bool) {
	switch p.Model {
	case "er", "scale-free":
		return p.MeanDegree, true
	case "regular", "small-world":
		return 2 * float64(p.Degree), true
	}
	return 0, false
}

// Setting is one named model parameter, formatted.
type Setting struct{ Name, Value string }

// Settings lists the parameters of p's model other than nodes and mean
// degree, in a fixed order, values formatted canonically.
func (p Params) Settings() []Setting {
	f := FormatFloat
	b := strconv.FormatBool
	switch p.Model {
	case "scale-free":
		return []Setting{{"gamma_out", f(p.GammaOut)}, {"gamma_in", f(p.GammaIn)}}
	case "small-world":
		return []Setting{{"degree", strconv.Itoa(p.Degree)}, {"rewire", f(p.Rewire)}, {"two_way", b(p.TwoWay)}}
	case "regular":
		return []Setting{{"degree", strconv.Itoa(p.Degree)}, {"side", p.Side.String()}}
	case "grid":
		return []Setting{{"width", strconv.Itoa(p.width())}, {"directions", p.dirs().String()}}
	case "tree":
		return []Setting{{"branching", strconv.Itoa(p.Branching)}, {"two_way", b(p.TwoWay)}}
	}
	return nil
}

// FormatFloat formats a parameter value canonically: the shortest form
// after rounding to 12 significant digits, so that 0.1+0.2 prints as 0.3.
func FormatFloat(v float64) string {
	if math.IsInf(v, 1) {
		return "inf"
	}
	r, _ := strconv.ParseFloat(strconv.FormatFloat(v, 'g', 12, 64), 64)
	return strconv.FormatFloat(r, 'g', -1, 64)
}
