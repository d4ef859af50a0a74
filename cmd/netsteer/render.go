package main

import (
	"io"
	"strings"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/fileout"
	"github.com/netsteer/netsteer/io/render"
)

var renderCmd = &command{
	name:    "render",
	summary: "draw the answer: the control structure, or the network with the answer on it (SVG, PNG, DOT)",
	usage: `Usage: netsteer render [options] NET -o FILE.svg|FILE.png|FILE.dot

Draws the answer for a design review. What it answers:
  --inputs FILE / --outputs FILE   a design judged as by "check"
  --show drivers                   the minimum driver nodes (default)
  --show actuators / sensors       the cheapest dedicated devices; combine
                                   as --show actuators,sensors
  --roles                          node roles across all minimum driver sets

Views (--view), so that a network of any size gets a picture that reads:
  auto        the whole network up to --max-nodes states (150), else the
              control structure; the title says which view was drawn
  control     each signal's stem in order (the states it steers, one
              matched edge after another), cycles marked where they hang,
              long stems shortened with a count, longest first
  groups      a table and a chart by node-table group (plant area)
  degrees     in- and out-degree of the states the signals act on against
              all states, and the stem lengths
  components  one node per strongly connected component, labelled by what
              it is ("largest strongly connected component: 635 states,
              12 driven")
  whole       every state and edge
  around      the states within --hops links of --around NAMES
control, groups and degrees are laid out by netsteer and take seconds at
a million states. whole, around and components are laid out by Graphviz,
whose time grows with the cube of the nodes drawn: a view estimated to
take more than --budget seconds is refused before it starts, with the
estimate.

Colours follow the legend, from a colour-blind-safe palette (Okabe & Ito),
each paired with a second cue (line width, dash, shape): stems heavy blue,
cycles heavy vermilion, other edges thin grey; new devices hollow and
dashed with their cost. The SVG scales to its container.

Graphviz (compiled to WebAssembly) runs in a companion program,
netsteer-layout, looked for in $NETSTEER_LAYOUT, then next to netsteer,
then on $PATH. Install both with
  go install ./cmd/...
The control, groups and degrees views and .dot output need no layout
program.

Exit status: 0 when the picture was written and every design it judges
holds, 1 when a judged design fails or no placement can succeed (the
picture is written), 2 on error.

Example:
  netsteer render testdata/plant/heating.edges -o heating.svg
  netsteer render --view control -o stems.svg big.edges
  netsteer render --node-table testdata/plant/heating-nodes.csv --view groups -o areas.svg testdata/plant/heating.edges
  netsteer render --inputs testdata/plant/heating-actuators.txt -o review.png testdata/plant/heating.edges
  netsteer render --around supply.header_temp --hops 2 -o pump.svg big.edges
`,
	flags: func(e *env, fs *pflag.FlagSet) func([]string) error {
		var nf netFlags
		var pf pictureFlags
		nf.register(e, fs)
		pf.registerDesign(fs)
		fs.StringVar(&pf.show, "show", "", "what to place and draw when no design is given: drivers, actuators, sensors (comma-separated)")
		pf.registerView(fs)
		output := fs.StringP("output", "o", "", "the picture: FILE.svg, FILE.png or FILE.dot (- with --format for standard output)")
		format := fs.String("format", "", "svg, png or dot (default: from the output's extension)")
		title := fs.String("title", "", "first line of the picture's title (default: the network file's name)")
		return func(args []string) error {
			path, err := oneArg(args)
			if err != nil {
				return err
			}
			if *output == "" {
				return usagef("give the picture's file with -o FILE.svg (or .png, .dot)")
			}
			pf.nodeTable = nf.nodeTable
			if err := pf.check(); err != nil {
				return err
			}
			f, err := pictureFormat(*format, *output)
			if err != nil {
				return err
			}
			sh, err := parseShow(pf.show)
			if err != nil {
				return err
			}
			if pf.inputs != "" && (sh.drivers || sh.actuators) {
				return usagef("--inputs gives the inputs to draw; drop --show drivers/actuators")
			}
			if pf.outputs != "" && sh.sensors {
				return usagef("--outputs gives the sensors to draw; drop --show sensors")
			}
			l, err := loadAll(e, &nf, &pf, path, *output)
			if err != nil {
				return err
			}
			opt, err := pf.options(l.g)
			if err != nil {
				return err
			}
			if err := render.Precheck(opt.View, l.g.N(), l.g.Edges(), opt); err != nil {
				return describeView(err)
			}
			if f != render.FormatDOT && opt.ViewFor(l.g.N()).Graph() {
				// Before the analysis, which may take long.
				if _, err := render.FindLayoutProgram(); err != nil {
					return describeView(err)
				}
			}
			rv, err := l.analyse(e, l.review(sh, pf.roles, true, 0))
			if err != nil {
				return err
			}
			t := *title
			if t == "" {
				t = displayFile(path)
			}
			in, err := l.picture(rv, t, pf.roles)
			if err != nil {
				return err
			}
			v, err := render.Select(in, opt)
			if err != nil {
				return describeView(err)
			}
			if f == render.FormatDOT && !v.Graph() {
				return usagef("the %s view is drawn by netsteer itself and has no DOT text; write .svg or .png, or choose --view whole, around or components", v.Kind)
			}
			err = fileout.Write(*output, e.Stdout, func(w io.Writer) error {
				return render.DrawView(progress(e, v.Nodes()), in, v, pf.layout, f, w)
			})
			if err != nil {
				return err
			}
			if *output != "-" {
				if err := render.WriteSummary(e.Stdout, *output, in, v, e.Width); err != nil {
					return err
				}
			}
			if !rv.Holds() {
				return errNo
			}
			return nil
		}
	},
}

func init() { register(renderCmd) }

// pictureFormat settles the picture's format: --format, else -o's
// extension.
func pictureFormat(format, output string) (render.Format, error) {
	switch strings.ToLower(format) {
	case "":
		if output == "-" {
			return "", usagef("-o - needs --format svg, png or dot")
		}
		f, err := render.FormatOf(output)
		if err != nil {
			return "", usagef("%s", strings.TrimPrefix(err.Error(), "render: "))
		}
		return f, nil
	case "svg", "png", "dot":
		f := render.Format(strings.ToLower(format))
		if output != "-" {
			if g, err := render.FormatOf(output); err == nil && g != f {
				return "", usagef("--format %s contradicts -o %s", format, output)
			}
		}
		return f, nil
	}
	return "", usagef("--format %q: want svg, png or dot", format)
}
