package sweep

import (
	"errors"
	"fmt"
	"hash/fnv"
	"math"
	"strconv"
	"strings"

	"github.com/netsteer/netsteer/io/sweepcsv"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/gen"
	"github.com/netsteer/netsteer/structural/transform"
)

// ParseValues expands a value specification: "start:stop:step" (stop
// included when the steps reach it), a comma-separated list, or a single
// value. Numbers come back formatted canonically (gen.FormatFloat); with
// integer set, they must be whole. A non-numeric single value or list is
// returned as given when numeric is false.
func ParseValues(spec string, numeric, integer bool) ([]string, error) {
	v, err := parseValues(spec, numeric, integer)
	if err != nil {
		return nil, errorf("%w", err)
	}
	return v, nil
}

func parseValues(spec string, numeric, integer bool) ([]string, error) {
	spec = strings.TrimSpace(spec)
	if spec == "" {
		return nil, errors.New("empty value")
	}
	if !numeric {
		if strings.Contains(spec, ":") {
			return nil, fmt.Errorf("%q: ranges need a numeric parameter", spec)
		}
		return []string{spec}, nil
	}
	num := func(s string) (float64, error) {
		s = strings.TrimSpace(s)
		if s == "inf" {
			return math.Inf(1), nil
		}
		v, err := strconv.ParseFloat(s, 64)
		if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
			return 0, fmt.Errorf("%q is not a number", s)
		}
		if integer && v != math.Trunc(v) {
			return 0, fmt.Errorf("%q is not a whole number", s)
		}
		return v, nil
	}
	var vals []float64
	if parts := strings.Split(spec, ":"); len(parts) > 1 {
		if len(parts) != 3 {
			return nil, fmt.Errorf("range %q: want start:stop:step", spec)
		}
		var a [3]float64
		for i, p := range parts {
			v, err := num(p)
			if err != nil {
				return nil, err
			}
			a[i] = v
		}
		start, stop, step := a[0], a[1], a[2]
		if math.IsInf(start, 0) || math.IsInf(stop, 0) || math.IsInf(step, 0) {
			return nil, fmt.Errorf("range %q: infinite bound", spec)
		}
		if step <= 0 || stop < start {
			return nil, fmt.Errorf("range %q: want start <= stop and step > 0", spec)
		}
		count := math.Floor((stop-start)/step+1e-9) + 1
		if count > 1e6 {
			return nil, fmt.Errorf("range %q has %.0f values; the limit is 10^6", spec, count)
		}
		for i := 0; i < int(count); i++ {
			vals = append(vals, start+float64(i)*step)
		}
	} else {
		for _, p := range strings.Split(spec, ",") {
			v, err := num(p)
			if err != nil {
				return nil, err
			}
			vals = append(vals, v)
		}
	}
	out := make([]string, len(vals))
	for i, v := range vals {
		out[i] = gen.FormatFloat(v)
	}
	return out, nil
}

// Axis is one coordinate of the grid with its values, formatted.
type Axis struct {
	Name      string
	Values    []string
	Transform bool // a transform applied in order, written "+name=value"
}

// Plan is a sweep: a model or a base network, its axes, replicates and
// seed.
type Plan struct {
	// Model is a gen model name, or "" for variants of Base.
	Model string
	// Base is the given network for variant sweeps; BaseName labels it in
	// params (the file's base name, say).
	Base     *structural.Network
	BaseName string
	// Axes are the model parameters (every one the model takes, swept or
	// fixed) followed by transforms.
	Axes []Axis
	// Coupling applies to replicate transforms.
	Coupling transform.Coupling
	// Replicates is the number of rows per grid point (>= 1).
	Replicates int
	// Seed is the sweep seed every row seed derives from.
	Seed uint64
}

// Point is one row to compute.
type Point struct {
	Index     int // position in the plan's order
	Model     string
	Params    string
	Coords    []Axis // one value each
	Replicate int
	Seed      uint64
}

// Key returns the point's row identity.
func (p *Point) Key() string { return sweepcsv.Key(p.Model, p.Params, p.Replicate) }

// ModelAxes builds the axes of a model sweep from option values (ParamSpecs
// names to value specifications); parameters not given take their
// defaults, so that every row names all of its model's parameters.
func ModelAxes(model string, specs map[string]string) ([]Axis, error) {
	ps := gen.ParamSpecs(model)
	if ps == nil {
		return nil, errorf("unknown model %q (want one of %s)", model, strings.Join(gen.Models, ", "))
	}
	known := map[string]bool{}
	for _, s := range ps {
		known[s.Name] = true
	}
	for name := range specs {
		if !known[name] {
			return nil, errorf("%s does not apply to the %s model", strings.ReplaceAll(name, "_", "-"), model)
		}
	}
	var axes []Axis
	for _, s := range ps {
		spec, ok := specs[s.Name]
		if !ok {
			if s.Default == "" {
				return nil, errorf("the %s model needs %s", model, strings.ReplaceAll(s.Name, "_", "-"))
			}
			spec = s.Default
		}
		numeric := s.Numeric() && !(s.Name == "width" && spec == "auto")
		vals, err := parseValues(spec, numeric, s.Integer())
		if err != nil {
			return nil, errorf("%s: %w", strings.ReplaceAll(s.Name, "_", "-"), err)
		}
		if s.Name == "directions" {
			d, err := gen.ParseDirections(vals[0])
			if err != nil {
				return nil, err
			}
			vals[0] = d.String()
		}
		axes = append(axes, Axis{Name: s.Name, Values: vals})
	}
	return axes, nil
}

// TransformAxis builds a transform axis from "name=values", e.g.
// "dropout=0:0.3:0.05".
func TransformAxis(spec string) (Axis, error) {
	name, vals, ok := strings.Cut(spec, "=")
	if !ok {
		return Axis{}, errorf("transform %q: want name=values", spec)
	}
	integer := name == "replicate"
	values, err := parseValues(vals, true, integer)
	if err != nil {
		return Axis{}, errorf("transform %s: %w", name, err)
	}
	for _, v := range values {
		if _, err := transform.Parse(name + "=" + v); err != nil {
			return Axis{}, err
		}
	}
	return Axis{Name: name, Values: values, Transform: true}, nil
}

// MaxRows bounds the rows of one plan: a sweep of more rows is refused
// before anything is allocated (its point list alone would take over a
// gigabyte); split it into several sweeps or shards of separate plans.
const MaxRows = 10_000_000

// SizeError reports a plan with more rows than MaxRows.
type SizeError struct {
	Rows float64 // points times replicates
	Max  int
	// Seconds estimates the time to compute them on one core, at the
	// measured rate of a maximum matching (about 5*10^7 edges a second)
	// and the plan's largest network.
	Seconds float64
}

func (e *SizeError) Error() string {
	return fmt.Sprintf("sweep: the plan has %.3g rows, more than %d (about %.3g core-hours to compute)", e.Rows, e.Max, e.Seconds/3600)
}

// Rows returns the number of rows the plan has: every combination of the
// axes' values times the replicates (as a float, so a product too large
// for an int is still reported).
func (pl *Plan) Rows() float64 {
	total := float64(max(pl.Replicates, 0))
	for _, a := range pl.Axes {
		total *= float64(len(a.Values))
	}
	return total
}

// checkSize refuses a plan of more than MaxRows rows with an estimate.
func (pl *Plan) checkSize() error {
	rows := pl.Rows()
	if rows <= MaxRows {
		return nil
	}
	edges := 0.0
	if pl.Base != nil {
		edges = float64(pl.Base.Edges())
	}
	for _, a := range pl.Axes {
		if a.Name == "nodes" {
			for _, v := range a.Values {
				if x, err := strconv.ParseFloat(v, 64); err == nil {
					edges = max(edges, 5*x) // <k> = 10 as a typical mean degree
				}
			}
		}
	}
	return &SizeError{Rows: rows, Max: MaxRows, Seconds: rows * max(edges, 1) / 5e7}
}

// Points expands the plan in its order: the first axis varies slowest,
// replicates fastest. It returns nil for a plan of more than MaxRows rows
// (Run reports it).
func (pl *Plan) Points() []Point {
	if pl.checkSize() != nil {
		return nil
	}
	model := pl.Model
	if model == "" {
		model = "base"
	}
	total := pl.Replicates
	for _, a := range pl.Axes {
		total *= len(a.Values)
	}
	pts := make([]Point, 0, total)
	idx := make([]int, len(pl.Axes))
	for {
		coords := make([]Axis, len(pl.Axes))
		var parts []string
		if pl.Model == "" {
			parts = append(parts, "base="+pl.BaseName)
		}
		for i, a := range pl.Axes {
			coords[i] = Axis{Name: a.Name, Values: []string{a.Values[idx[i]]}, Transform: a.Transform}
			prefix := ""
			if a.Transform {
				prefix = "+"
			}
			parts = append(parts, prefix+a.Name+"="+a.Values[idx[i]])
		}
		params := strings.Join(parts, ";")
		for r := 1; r <= pl.Replicates; r++ {
			p := Point{Index: len(pts), Model: model, Params: params, Coords: coords, Replicate: r}
			p.Seed = RowSeed(pl.Seed, p.Key())
			pts = append(pts, p)
		}
		// Advance the odometer, last axis fastest.
		i := len(idx) - 1
		for ; i >= 0; i-- {
			idx[i]++
			if idx[i] < len(pl.Axes[i].Values) {
				break
			}
			idx[i] = 0
		}
		if i < 0 {
			break
		}
	}
	return pts
}

// RowSeed derives a row's seed from the sweep seed and the row key alone
// (FNV-1a of the key, mixed with the seed by SplitMix64).
func RowSeed(seed uint64, key string) uint64 {
	s := seed ^ keyHash(key)
	return gen.SplitMix64(&s)
}

func keyHash(key string) uint64 {
	h := fnv.New64a()
	h.Write([]byte(key))
	return h.Sum64()
}

// Shard selects a share of a plan: point i belongs to shard I of K when
// i mod K == I (round robin, so shards get similar sizes).
type Shard struct{ I, K int }

// ParseShard reads "i/k" with 0 <= i < k.
func ParseShard(s string) (Shard, error) {
	a, b, ok := strings.Cut(s, "/")
	i, err1 := strconv.Atoi(a)
	k, err2 := strconv.Atoi(b)
	if !ok || err1 != nil || err2 != nil || k < 1 || i < 0 || i >= k {
		return Shard{}, errorf("shard %q: want i/k with 0 <= i < k", s)
	}
	return Shard{I: i, K: k}, nil
}

// Has reports whether the shard owns point index i.
func (s Shard) Has(i int) bool { return s.K <= 1 || i%s.K == s.I }
