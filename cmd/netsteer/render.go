//go:build netsteer_pending

package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"strconv"
	"strings"
	"time"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/design"
	"github.com/netsteer/netsteer/io/fileout"
	"github.com/netsteer/netsteer/io/nodetable"
	"github.com/netsteer/netsteer/io/render"
	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural"
)

var renderCmd = &command{
	name:    "render",
	summary: "draw the network with the answer on it (SVG, PNG or DOT)",
	usage: `Usage: netsteer render [options] NET -o FILE.svg|FILE.png|FILE.dot

Draws the network for a design review: the independent input signals and
the states they drive, the sensors, the matched edges that carry control
(stems heavy blue, cycles heavy vermillion), unreached and unobserved states,
the dilation witness of a failing design and the source components, with a
title carrying the summary numbers and a legend. The format follows the
output's extension; .dot writes the annotated Graphviz text without laying
it out.

What is drawn on it:
  --inputs FILE / --outputs FILE   a design judged as by "check" (one signal
                                   per line, the states it drives/senses)
  --show drivers                   the minimum driver nodes (default)
  --show actuators / sensors       the cheapest dedicated devices; combine
                                   as --show actuators,sensors
  --roles                          node roles across all minimum driver sets
                                   (critical box, intermittent octagon)

A picture a person can read holds about 150 states, and layout time grows
fast beyond that. A network with more than --max-nodes states is drawn as
its condensation (one node per strongly connected component, sized by its
states, with the driven states counted inside; beyond --max-nodes
components the single-state ones are summarised). --around NAMES --hops K
draws the neighbourhood of some states instead, and --only drivers the
driven states and their stems. The title says which view it is.

Layouts (--layout): auto picks dot (left to right in layers) when the view
has few layers and sfdp (force-directed) otherwise; both take a few seconds
at 150 nodes.

SVG and PNG are laid out by Graphviz, compiled to WebAssembly (go-graphviz),
in a companion program, netsteer-layout, so that the commands that do not
draw start fast. netsteer looks for it in $NETSTEER_LAYOUT, then next to the
netsteer program, then on $PATH. Install both from the source tree with
  go install ./cmd/...
or build them side by side with go build -o DIR ./cmd/... . The .dot output needs
no layout program.

Exit status: 0 when the picture was written (whatever it shows), 2 on error.

Example:
  netsteer render testdata/plant/heating.edges -o heating.svg
  netsteer render --show actuators,sensors --roles -o heating.png testdata/plant/heating.edges
  netsteer render --inputs design.txt -o review.svg testdata/plant/heating.edges
  netsteer render --around supply.header_temp --hops 2 -o pump.svg big.edges
`,
	run: runRender,
}

func init() { register(renderCmd) }

// pictureFlags are the options render and report share.
type pictureFlags struct {
	inputs, outputs string
	show            string
	roles           bool
	maxNodes        int
	maxEdges        int
	around          string
	hops            int
	only            string
	layout          string
}

func (p *pictureFlags) registerDesign(fs *pflag.FlagSet) {
	fs.StringVar(&p.inputs, "inputs", "", "input design to judge and draw: one input per line, the states it drives")
	fs.StringVar(&p.outputs, "outputs", "", "output design to judge and draw: one output per line, the states it senses")
}

func (p *pictureFlags) registerView(fs *pflag.FlagSet) {
	fs.BoolVar(&p.roles, "roles", false, "draw node roles across all minimum driver sets (critical, intermittent, redundant)")
	fs.IntVar(&p.maxNodes, "max-nodes", render.DefaultMaxNodes, "largest number of states (or components) drawn one by one")
	fs.IntVar(&p.maxEdges, "max-edges", 0, "largest number of edges drawn, control-carrying first (default 4 per node)")
	fs.StringVar(&p.around, "around", "", "draw only the states within --hops links of these (comma-separated names)")
	fs.IntVar(&p.hops, "hops", 2, "radius of --around, following edges either way")
	fs.StringVar(&p.only, "only", "", `"drivers": draw only the driven states and their stems`)
	var names []string
	for _, l := range render.Layouts() {
		names = append(names, l[0])
	}
	fs.StringVar(&p.layout, "layout", render.AutoLayout, "layout: "+strings.Join(names, ", "))
}

// check validates the view flags.
func (p *pictureFlags) check() error {
	switch {
	case p.maxNodes < 1:
		return errors.New("--max-nodes must be at least 1")
	case p.maxEdges < 0:
		return errors.New("--max-edges must not be negative")
	case p.hops < 1:
		return errors.New("--hops must be at least 1")
	case p.only != "" && p.only != "drivers":
		return fmt.Errorf("--only %q: the one choice is \"drivers\"", p.only)
	case p.only != "" && p.around != "":
		return errors.New("--only and --around choose different views; give one")
	case p.inputs == "-" && p.outputs == "-":
		return errors.New("--inputs and --outputs cannot both read standard input")
	}
	if _, err := render.ChooseLayout(p.layout, &render.View{}); err != nil {
		return errors.New(strings.TrimPrefix(err.Error(), "render: "))
	}
	return nil
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
			return sh, fmt.Errorf("--show %q: want drivers, actuators or sensors (comma-separated)", w)
		}
	}
	if sh.drivers && sh.actuators {
		return sh, errors.New("--show: drivers and actuators are both inputs; choose one")
	}
	return sh, nil
}

// analysis holds what a picture or a review page shows, each part computed
// by its library function.
type analysis struct {
	path string
	g    *structural.Network
	c    structural.Components
	ds   *structural.DriverSet

	inputs, outputs []design.Signal
	verdict         *structural.Verdict
	obsVerdict      *structural.ObservabilityVerdict

	// table is the node table (nil without --node-table): device costs
	// and restrictions, and each state's group and label.
	table          *nodetable.Table
	labels, groups map[int32]string
	actDev, senDev structural.Devices

	actuators, sensors *structural.Placement
	// completion and sensorCompletion are the cheapest dedicated devices
	// that complete a failing input (output) design.
	completion, sensorCompletion *structural.Placement
	// roles are node roles across all minimum driver sets; sensorRoles
	// the same for sensors (on the transposed network).
	roles, sensorRoles []structural.Role

	times []stage
}

func (a *analysis) timed(name string, f func()) {
	t0 := time.Now()
	f()
	a.times = append(a.times, stage{name, time.Since(t0)})
}

// analyse reads the network and the designs and runs what is asked; with
// complete, a failing design also gets its cheapest completion.
func analyse(nf *netFlags, pf *pictureFlags, path string, sh showSet, complete bool) (*analysis, error) {
	a := &analysis{path: path}
	g, readT, err := nf.load(path, nil)
	if err != nil {
		return nil, err
	}
	a.g = g
	a.times = append(a.times, stage{"read", readT})
	if t := nf.table; t != nil {
		a.table = t
		a.labels, a.groups = map[int32]string{}, map[int32]string{}
		for _, r := range t.Rows {
			v, ok := g.Lookup(r.Node)
			if !ok {
				continue
			}
			if r.Label != "" {
				a.labels[v] = r.Label
			}
			if r.Group != "" {
				a.groups[v] = r.Group
			}
		}
		a.actDev, a.senDev = t.Actuators(g), t.Sensors(g)
	}
	a.timed("drivers", func() {
		a.c = structural.SCC(g.Out())
		a.ds = structural.DriversFrom(g, matching.Maximum(g.Out(), g.In()), a.c)
	})
	if pf.inputs != "" {
		if a.inputs, err = designSignals(pf.inputs, g, false); err != nil {
			return nil, err
		}
		if len(a.inputs) == 0 {
			return nil, fmt.Errorf("%s: no inputs in the design file", pf.inputs)
		}
		a.timed("check", func() { a.verdict = structural.Check(g, design.States(a.inputs)) })
		if !a.verdict.Controllable && complete {
			a.timed("complete", func() { a.completion, err = structural.CompleteActuators(g, design.States(a.inputs), a.actDev) })
			if err != nil {
				return nil, err
			}
		}
	}
	if pf.outputs != "" {
		if a.outputs, err = designSignals(pf.outputs, g, false); err != nil {
			return nil, err
		}
		if len(a.outputs) == 0 {
			return nil, fmt.Errorf("%s: no outputs in the design file", pf.outputs)
		}
		a.timed("check_outputs", func() { a.obsVerdict = structural.CheckObservability(g, design.States(a.outputs)) })
		if !a.obsVerdict.Observable && complete {
			a.timed("complete_outputs", func() {
				a.sensorCompletion, err = structural.CompleteSensors(g, design.States(a.outputs), a.senDev)
			})
			if err != nil {
				return nil, err
			}
		}
	}
	if sh.actuators {
		a.timed("actuators", func() { a.actuators, err = structural.PlaceActuators(g, a.actDev) })
		if err != nil {
			return nil, err
		}
	}
	if sh.sensors {
		a.timed("sensors", func() { a.sensors, err = structural.PlaceSensors(g, a.senDev) })
		if err != nil {
			return nil, err
		}
	}
	if pf.roles {
		a.timed("roles", func() {
			a.roles = structural.NodeRoles(g, a.ds.Matching)
			t := structural.Transpose(g)
			a.sensorRoles = structural.NodeRoles(t, matching.Maximum(t.Out(), t.In()))
		})
	}
	return a, nil
}

// singletons turns dedicated devices into one signal each.
func singletons(states []int32) [][]int32 {
	out := make([][]int32, len(states))
	for i, s := range states {
		out[i] = []int32{s}
	}
	return out
}

// dedicated reports whether every signal drives (senses) one state.
func dedicated(signals []design.Signal) bool {
	for _, s := range signals {
		if len(s.States) != 1 {
			return false
		}
	}
	return true
}

// picture builds what render draws from the analysis.
func (a *analysis) picture(pf *pictureFlags, sh showSet, title string) *render.Input {
	g := a.g
	in := &render.Input{Net: g, Components: a.c, Title: title}
	switch {
	case a.inputs != nil:
		in.Inputs = design.States(a.inputs)
		in.InputKind = "input"
		if dedicated(a.inputs) {
			in.InputKind = "actuator"
		}
		in.Matching = render.DesignMatching(g, in.Inputs)
		v := a.verdict
		in.Unreached = v.Unreached
		if v.Dilation != nil {
			in.Dilation = v.Dilation.States
		}
		in.Notes = append(in.Notes, verdictLine(pf.inputs, v))
	case sh.actuators:
		p := a.actuators
		in.Inputs = singletons(p.Devices)
		in.InputKind = "actuator"
		in.Matching = render.DesignMatching(g, in.Inputs)
		in.Notes = append(in.Notes, a.placementLine("actuator", p))
	default:
		in.Inputs = a.ds.Inputs
		in.InputKind = "driver node"
		in.Matching = a.ds.Matching
		nd := len(a.ds.Drivers)
		in.Notes = append(in.Notes, fmt.Sprintf("Minimum number of independent control signals N_D = %d (driver nodes from a maximum matching).", nd))
	}
	switch {
	case a.outputs != nil:
		in.Outputs = design.States(a.outputs)
		in.OutputKind = "output"
		if dedicated(a.outputs) {
			in.OutputKind = "sensor"
		}
		v := a.obsVerdict
		in.Unobserved = v.Unobserved
		if v.Dilation != nil {
			in.ObservationDilation = v.Dilation.States
		}
		in.Notes = append(in.Notes, obsVerdictLine(pf.outputs, v))
	case sh.sensors:
		in.Outputs = singletons(a.sensors.Devices)
		in.OutputKind = "sensor"
		in.Notes = append(in.Notes, a.placementLine("sensor", a.sensors))
	}
	if a.roles != nil {
		roles := a.roles
		in.Role = func(v int32) string { return roles[v].String() }
	}
	if len(a.labels) > 0 {
		in.Label = func(v int32) string { return a.labels[v] }
	}
	if len(a.groups) > 0 {
		in.Group = func(v int32) string { return a.groups[v] }
	}
	return in
}

// cost formats a device cost: node-table units when a table gave costs,
// else a count of unit-cost devices.
func (a *analysis) cost(units int64) string {
	if a.table != nil {
		return nodetable.FormatCost(units)
	}
	return strconv.FormatInt(units, 10)
}

func verdictLine(file string, v *structural.Verdict) string {
	if v.Controllable {
		return fmt.Sprintf("Inputs %s: structurally controllable.", file)
	}
	var why []string
	if k := len(v.Unreached); k > 0 {
		why = append(why, fmt.Sprintf("%d %s unreached", k, plural(k, "state", "states")))
	}
	if v.Dilation != nil {
		why = append(why, fmt.Sprintf("a dilation of %d states (at least %d more %s needed)", len(v.Dilation.States), v.Deficiency, plural(v.Deficiency, "input", "inputs")))
	}
	s := fmt.Sprintf("Inputs %s: NOT structurally controllable: %s", file, strings.Join(why, "; "))
	if v.ControllableDimension >= 0 {
		s += fmt.Sprintf("; controllable dimension %d", v.ControllableDimension)
	}
	return s + "."
}

func obsVerdictLine(file string, v *structural.ObservabilityVerdict) string {
	if v.Observable {
		return fmt.Sprintf("Outputs %s: structurally observable.", file)
	}
	var why []string
	if k := len(v.Unobserved); k > 0 {
		why = append(why, fmt.Sprintf("%d %s unobserved", k, plural(k, "state", "states")))
	}
	if v.Dilation != nil {
		why = append(why, fmt.Sprintf("an observation dilation of %d states (at least %d more %s needed)", len(v.Dilation.States), v.Deficiency, plural(v.Deficiency, "output", "outputs")))
	}
	return fmt.Sprintf("Outputs %s: NOT structurally observable: %s; observable dimension %d.", file, strings.Join(why, "; "), v.ObservableDimension)
}

func (a *analysis) placementLine(kind string, p *structural.Placement) string {
	if !p.Feasible {
		return fmt.Sprintf("No placement of dedicated %ss can succeed under the restrictions; %d placed where allowed.", kind, len(p.Devices))
	}
	return fmt.Sprintf("Cheapest dedicated %ss: %d (%d new, total cost %s).", kind, len(p.Devices), len(p.Added), a.cost(p.Cost))
}

// viewOptions turns the view flags into render options, resolving names.
func (a *analysis) viewOptions(pf *pictureFlags) (render.Options, error) {
	opt := render.Options{MaxNodes: pf.maxNodes, MaxEdges: pf.maxEdges, Hops: pf.hops}
	switch {
	case pf.around != "":
		opt.View = render.Around
		for _, name := range strings.Split(pf.around, ",") {
			name = strings.TrimSpace(name)
			v, ok := a.g.Lookup(name)
			if !ok {
				return opt, fmt.Errorf("--around: no state named %q in %s", name, a.path)
			}
			opt.Centres = append(opt.Centres, v)
		}
	case pf.only == "drivers":
		opt.View = render.OnlyDriven
	}
	return opt, nil
}

func runRender(e *env, c *command, fs *pflag.FlagSet, args []string) int {
	var nf netFlags
	var pf pictureFlags
	nf.register(fs, e)
	pf.registerDesign(fs)
	fs.StringVar(&pf.show, "show", "", "what to place and draw when no design is given: drivers, actuators, sensors (comma-separated)")
	pf.registerView(fs)
	output := fs.StringP("output", "o", "", "the picture: FILE.svg, FILE.png or FILE.dot (- with --format for standard output)")
	format := fs.String("format", "", "svg, png or dot (default: from the output's extension)")
	title := fs.String("title", "", "first line of the picture's title (default: the network file's name)")
	if ok, st := parse(e, c, fs, args); !ok {
		return st
	}
	if fs.NArg() != 1 {
		return usageError(e, c, "want one network file, got %d arguments", fs.NArg())
	}
	if *output == "" {
		return usageError(e, c, "give the picture's file with -o FILE.svg (or .png, .dot)")
	}
	if err := pf.check(); err != nil {
		return usageError(e, c, "%v", err)
	}
	var f render.Format
	switch *format {
	case "":
		if *output == "-" {
			return usageError(e, c, "-o - needs --format svg, png or dot")
		}
		var err error
		if f, err = render.FormatOf(*output); err != nil {
			return usageError(e, c, "%s", strings.TrimPrefix(err.Error(), "render: "))
		}
	case "svg", "png", "dot":
		f = render.Format(*format)
	default:
		return usageError(e, c, "--format %q: want svg, png or dot", *format)
	}
	if f != render.FormatDOT {
		// Before the analysis, which may take long on a large network.
		if _, err := render.FindLayoutProgram(); err != nil {
			return fail(e, err)
		}
	}
	sh, err := parseShow(pf.show)
	if err != nil {
		return usageError(e, c, "%v", err)
	}
	if pf.inputs != "" && (sh.drivers || sh.actuators) {
		return usageError(e, c, "--inputs gives the inputs to draw; drop --show drivers/actuators")
	}
	if pf.outputs != "" && sh.sensors {
		return usageError(e, c, "--outputs gives the sensors to draw; drop --show sensors")
	}
	if pf.only == "drivers" && pf.inputs == "" && !sh.actuators {
		sh.drivers = true
	}
	path := fs.Arg(0)
	a, err := analyse(&nf, &pf, path, sh, false)
	if err != nil {
		return fail(e, err)
	}
	t := *title
	if t == "" {
		t = path
	}
	in := a.picture(&pf, sh, t)
	opt, err := a.viewOptions(&pf)
	if err != nil {
		return usageError(e, c, "%v", err)
	}
	v, err := render.Select(in, opt)
	if err != nil {
		return fail(e, err)
	}
	if v.Nodes() > render.SlowNodes && f != render.FormatDOT {
		fmt.Fprintf(e.Stderr, "netsteer: drawing %d nodes: the layout may take minutes (see --max-nodes)\n", v.Nodes())
	}
	t0 := time.Now()
	err = fileout.Write(*output, e.Stdout, func(w io.Writer) error {
		return render.DrawView(context.Background(), in, v, pf.layout, f, w)
	})
	if err != nil {
		return fail(e, err)
	}
	if *output != "-" {
		drawn, what := v.Nodes(), plural(v.Nodes(), "state", "states")
		if v.Kind == render.Condensation {
			what = plural(drawn, "node", "nodes")
		}
		fmt.Fprintf(e.Stdout, "%s: %s; %d %s drawn (%s).\n", *output, render.Summary(in), drawn, what, v.Desc)
		for _, n := range in.Notes {
			fmt.Fprintln(e.Stdout, n)
		}
		if e.StderrIsTTY {
			fmt.Fprintf(e.Stderr, "drawn in %.2f s\n", time.Since(t0).Seconds())
		}
	}
	return exitOK
}
