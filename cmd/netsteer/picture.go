package main

import (
	"context"
	"errors"
	"fmt"
	"strings"
	"time"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/render"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/analysis"
)

// What render and report share: the flags that choose what is analysed
// and drawn, the loading of every input with the SHA-256 of the bytes
// actually read, and the picture.

// pictureFlags are the options render and report share.
type pictureFlags struct {
	inputs, outputs string
	show            string
	roles           bool
	view            string
	maxNodes        int
	maxEdges        int
	maxStems        int
	around          string
	hops            int
	layout          string
	budget          float64
	nodeTable       string // --node-table, set by the command
}

func (p *pictureFlags) registerDesign(fs *pflag.FlagSet) {
	fs.StringVar(&p.inputs, "inputs", "", "input design to judge and draw: one input per line, the states it drives")
	fs.StringVar(&p.outputs, "outputs", "", "output design to judge and draw: one output per line, the states it senses")
}

func (p *pictureFlags) registerView(fs *pflag.FlagSet) {
	var views []string
	for _, v := range render.Views() {
		views = append(views, v[0])
	}
	fs.StringVar(&p.view, "view", "auto", "what to draw: "+strings.Join(views, ", ")+" (see above)")
	fs.BoolVar(&p.roles, "roles", false, "draw node roles across all minimum driver sets (critical box, intermittent octagon)")
	fs.IntVar(&p.maxNodes, "max-nodes", render.DefaultMaxNodes, "largest number of states (or components) a Graphviz view draws one by one")
	fs.IntVar(&p.maxEdges, "max-edges", 0, "largest number of edges a Graphviz view draws, control-carrying first (default 4 per node)")
	fs.IntVar(&p.maxStems, "max-stems", render.DefaultMaxStems, "stems the control view draws one by one (the rest are counted)")
	fs.StringVar(&p.around, "around", "", "draw the states within --hops links of these (comma-separated names); implies --view around")
	fs.IntVar(&p.hops, "hops", 2, "radius of --around, following edges either way")
	var names []string
	for _, l := range render.Layouts() {
		names = append(names, l[0])
	}
	fs.StringVar(&p.layout, "layout", render.AutoLayout, "Graphviz layout: "+strings.Join(names, ", "))
	fs.Float64Var(&p.budget, "budget", render.DefaultBudget.Seconds(), "refuse a Graphviz layout estimated to take more seconds than this")
}

// check validates the view flags.
func (p *pictureFlags) check() error {
	k, err := render.ParseKind(p.view)
	switch {
	case err != nil:
		return usagef("--view %q: want %s", p.view, viewNames())
	case p.maxNodes < 1:
		return usagef("--max-nodes must be at least 1")
	case p.maxEdges < 0:
		return usagef("--max-edges must not be negative")
	case p.maxStems < 1:
		return usagef("--max-stems must be at least 1")
	case p.hops < 1:
		return usagef("--hops must be at least 1")
	case p.budget <= 0:
		return usagef("--budget must be positive")
	case p.around != "" && k != render.Auto && k != render.Around:
		return usagef("--around draws the around view; drop --view %s", p.view)
	case p.around == "" && k == render.Around:
		return usagef("--view around needs --around NAMES")
	case k == render.Groups && p.nodeTable == "":
		return usagef("--view groups draws the groups of a node table: give --node-table FILE")
	case p.inputs == "-" && p.outputs == "-":
		return usagef("--inputs and --outputs cannot both read standard input")
	}
	if _, err := render.ChooseLayout(p.layout, &render.View{}); err != nil {
		return usagef("%s", strings.TrimPrefix(err.Error(), "render: "))
	}
	return nil
}

func viewNames() string {
	var v []string
	for _, x := range render.Views() {
		v = append(v, x[0])
	}
	return strings.Join(v, ", ")
}

// kind returns the view asked for.
func (p *pictureFlags) kind() render.Kind {
	if p.around != "" {
		return render.Around
	}
	k, _ := render.ParseKind(p.view)
	return k
}

// showSet parses --show.
type showSet struct{ drivers, actuators, sensors bool }

func parseShow(s string) (showSet, error) {
	var sh showSet
	if s == "" {
		return sh, nil
	}
	for _, w := range strings.Split(s, ",") {
		switch strings.TrimSpace(w) {
		case "drivers":
			sh.drivers = true
		case "actuators":
			sh.actuators = true
		case "sensors":
			sh.sensors = true
		default:
			return sh, usagef("--show %q: want drivers, actuators or sensors (comma-separated)", w)
		}
	}
	if sh.drivers && sh.actuators {
		return sh, usagef("--show: drivers and actuators are both inputs; choose one")
	}
	return sh, nil
}

// loaded is what render and report read: the network with its node table
// and designs.
type loaded struct {
	*input
	inputs, outputs *structural.Design
}

// loadAll reads the network, the node table and the designs once each
// (their SHA-256 taken from the bytes as they were read, standard input
// and FIFOs too).
func loadAll(e *env, nf *netFlags, pf *pictureFlags, path, out string, extra ...string) (*loaded, error) {
	in, err := nf.load(path, out, false, append([]string{pf.inputs, pf.outputs}, extra...)...)
	if err != nil {
		return nil, err
	}
	l := &loaded{input: in}
	if pf.inputs != "" {
		if l.inputs, _, err = in.design(e, pf.inputs, structural.Controllability); err != nil {
			return nil, err
		}
	}
	if pf.outputs != "" {
		if l.outputs, _, err = in.design(e, pf.outputs, structural.Observability); err != nil {
			return nil, err
		}
	}
	return l, nil
}

// displayName names a file in reader messages ("stdin" for "-").
func displayName(path string) string {
	if path == "-" {
		return "stdin"
	}
	return path
}

// review runs the analysis render and report draw.
func (l *loaded) review(sh showSet, roles, complete bool, alternatives int) analysis.ReviewRequest {
	return analysis.ReviewRequest{
		Inputs: l.inputs, Outputs: l.outputs,
		PlaceActuators: sh.actuators && l.inputs == nil, PlaceSensors: sh.sensors && l.outputs == nil,
		Actuators: l.devices(structural.Controllability), Sensors: l.devices(structural.Observability),
		Roles: roles, Alternatives: alternatives, Complete: complete,
	}
}

// analyse answers the review's questions, with a status line on a
// terminal.
func (l *loaded) analyse(e *env, req analysis.ReviewRequest) (*analysis.Review, error) {
	e.status("analysing (%d states, %d edges)", l.g.N(), l.g.Edges())
	defer e.status("")
	return analysis.Analyse(l.g, req)
}

// picture builds what render draws from the review, with the node
// table's labels and groups.
func (l *loaded) picture(rv *analysis.Review, title string, roles bool) (*render.Input, error) {
	in, err := render.FromReview(rv, l.inputs, l.outputs)
	if err != nil {
		return nil, err
	}
	if !roles {
		in.Role = nil
	}
	in.Title = title
	labels, groups := l.labelsGroups()
	if labels != nil {
		in.Label = func(v int32) string { return labels[v] }
	}
	if groups != nil {
		in.Group = func(v int32) string { return groups[v] }
	}
	return in, nil
}

// options turns the view flags into render options, resolving names.
func (p *pictureFlags) options(g *structural.Network) (render.Options, error) {
	opt := render.Options{View: p.kind(), MaxNodes: p.maxNodes, MaxEdges: p.maxEdges, Hops: p.hops, MaxStems: p.maxStems,
		Budget: time.Duration(p.budget * float64(time.Second))}
	if p.around != "" {
		for _, name := range strings.Split(p.around, ",") {
			name = strings.TrimSpace(name)
			v, ok := g.Lookup(name)
			if !ok {
				return opt, usagef("--around: no state named %q", name)
			}
			opt.Centres = append(opt.Centres, v)
		}
	}
	return opt, nil
}

// describeView words a refused view for the terminal, with the flags
// that draw what works.
func describeView(err error) error {
	var be *render.BudgetError
	if errors.As(err, &be) {
		return fmt.Errorf("%s (--view control, components, degrees or groups; --around NAMES for a neighbourhood; --budget SECONDS to wait longer)", strings.TrimPrefix(be.Error(), "render: "))
	}
	return errors.New(strings.TrimPrefix(err.Error(), "render: "))
}

// progress shows a long layout's progress on the terminal.
func progress(e *env, nodes int) context.Context {
	return render.WithProgress(context.Background(), func(elapsed, est time.Duration) {
		e.status("laying out %d nodes: %s of about %s", nodes, render.Duration(elapsed), render.Duration(est))
	})
}
