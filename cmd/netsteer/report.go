//go:build netsteer_pending

package main

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"io"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"time"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/design"
	"github.com/netsteer/netsteer/io/fileout"
	"github.com/netsteer/netsteer/io/htmlreport"
	"github.com/netsteer/netsteer/io/render"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/numeric"
)

var reportCmd = &command{
	name:    "report",
	summary: "write one self-contained HTML page for a design review",
	usage: `Usage: netsteer report [options] NET -o review.html

Writes one HTML file a reviewer can open offline, print and sign. The first
screen states the question and the answer: with --inputs (--outputs),
whether that design is structurally controllable (observable); without,
where the cheapest dedicated actuators (sensors) go and what they cost.
Below come the annotated picture (as "netsteer render" draws it), the
witness when a design fails (unreached states, the dilation set and its
in-neighbours), tables of drivers, actuators and sensors with their roles,
costs and alternatives, the numeric check with --verify (as "netsteer
verify" runs it), the input files with their SHA-256, the tool version and
options, and the cautions.

The page needs nothing else: no scripts, no fonts, style sheets or images
from elsewhere. Every name is escaped.

The picture is laid out by the companion program netsteer-layout, as for
"netsteer render" (see its help): install both from the source tree with
  go install ./cmd/...

Exit status: 0 when the page was written (whatever it says), 2 on error.

Example:
  netsteer report testdata/plant/heating.edges -o review.html
  netsteer report --inputs testdata/plant/heating-actuators.txt --verify -o review.html testdata/plant/heating.edges
`,
	run: runReport,
}

func init() { register(reportCmd) }

// maxTableRows bounds the rows of one table on the page.
const maxTableRows = 300

// reportCautions close every review page.
var reportCautions = []string{
	"Structural results hold for almost all values of the free parameters, not for every one: a design that is structurally controllable can still be uncontrollable, or nearly so, for the particular numbers of a real plant.",
	"Use them as a screening step. They do not replace dynamic studies, safety analysis, local codes and standards, or review by a licensed engineer.",
	"The network is only as good as the wiring it was given: a missing or wrong edge can change every answer on this page.",
}

func runReport(e *env, c *command, fs *pflag.FlagSet, args []string) int {
	var nf netFlags
	var pf pictureFlags
	nf.register(fs, e)
	pf.registerDesign(fs)
	pf.registerView(fs)
	output := fs.StringP("output", "o", "", "the review page, FILE.html (- for standard output)")
	verify := fs.Bool("verify", false, "add the numeric check on sampled parameters (as netsteer verify)")
	seed := fs.Uint64("seed", 0, "seed of the numeric check's samples (default: a fresh one, printed)")
	title := fs.String("title", "", "what the page reviews (default: the network file's name)")
	if ok, st := parse(e, c, fs, args); !ok {
		return st
	}
	if fs.NArg() != 1 {
		return usageError(e, c, "want one network file, got %d arguments", fs.NArg())
	}
	if *output == "" {
		return usageError(e, c, "give the page's file with -o FILE.html")
	}
	if err := pf.check(); err != nil {
		return usageError(e, c, "%v", err)
	}
	if !fs.Changed("seed") {
		*seed = rand.Uint64N(1_000_000_000)
	}
	path := fs.Arg(0)
	if path == "-" {
		return usageError(e, c, "report reads the network from a file, to record its checksum")
	}
	// The picture needs the layout program: say so before the analysis.
	if _, err := render.FindLayoutProgram(); err != nil {
		return fail(e, err)
	}
	sh := showSet{actuators: pf.inputs == "", sensors: pf.outputs == ""}
	roles := pf.roles
	pf.roles = true // the tables always give roles; the picture only with --roles
	a, err := analyse(&nf, &pf, path, sh, true)
	if err != nil {
		return fail(e, err)
	}
	pf.roles = roles

	r := &htmlreport.Review{
		Title:     *title,
		Tool:      "netsteer " + version(),
		Options:   append([]string{"netsteer", c.name}, args...),
		Generated: generated(),
		Cautions:  reportCautions,
	}
	if r.Title == "" {
		r.Title = filepath.Base(path)
	}
	for _, f := range [][2]string{{"network", path}, {"node table", nf.nodeTable}, {"inputs", pf.inputs}, {"outputs", pf.outputs}} {
		if f[1] == "" {
			continue
		}
		d, err := htmlreport.Describe(f[0], f[1])
		if err != nil {
			return fail(e, err)
		}
		r.Files = append(r.Files, d)
	}
	a.answers(r, &pf)
	a.tables(r)

	// The numeric check.
	if *verify {
		a.numericCheck(r, *seed)
	}

	// The picture.
	in := a.picture(&pf, sh, r.Title)
	if !roles {
		in.Role = nil
	}
	opt, err := a.viewOptions(&pf)
	if err != nil {
		return usageError(e, c, "%v", err)
	}
	var svg bytes.Buffer
	v, err := render.Select(in, opt)
	if err == nil {
		if v.Nodes() > render.SlowNodes {
			fmt.Fprintf(e.Stderr, "netsteer: drawing %d nodes: the layout may take minutes (see --max-nodes)\n", v.Nodes())
		}
		err = render.DrawView(context.Background(), in, v, pf.layout, render.FormatSVG, &svg)
	}
	if err != nil {
		r.PictureError = "The picture could not be drawn: " + userMessage(err.Error())
		fmt.Fprintln(e.Stderr, "netsteer: warning: the page has no picture: "+userMessage(err.Error()))
	} else {
		r.Picture = svg.Bytes()
		r.PictureNote = "View: " + v.Desc + ". Hover over a node for its full name and findings."
	}

	err = fileout.Write(*output, e.Stdout, func(w io.Writer) error { return htmlreport.Write(w, r) })
	if err != nil {
		return fail(e, err)
	}
	if *output != "-" {
		fmt.Fprintf(e.Stdout, "%s: review of %s.\n", *output, path)
		for _, ans := range r.Answers {
			fmt.Fprintf(e.Stdout, "%s: %s\n", ans.Topic, ans.Headline)
		}
	}
	return exitOK
}

// generated is the page's time stamp: now, or SOURCE_DATE_EPOCH when set
// (reproducible builds convention), in UTC.
func generated() string {
	t := time.Now()
	if s := os.Getenv("SOURCE_DATE_EPOCH"); s != "" {
		if sec, err := strconv.ParseInt(s, 10, 64); err == nil {
			t = time.Unix(sec, 0)
		}
	}
	return t.UTC().Format("2006-01-02 15:04 UTC")
}

// label is the name shown for a state: its node-table label with the name
// beside it, or the name.
func (a *analysis) label(v int32) string {
	if l := a.labels[v]; l != "" {
		return l + " (" + a.g.Name(v) + ")"
	}
	return a.g.Name(v)
}

func (a *analysis) names(ids []int32) string {
	parts := make([]string, len(ids))
	for i, v := range ids {
		parts[i] = a.label(v)
	}
	return strings.Join(parts, ", ")
}

func (a *analysis) role(v int32) string {
	if a.roles == nil {
		return ""
	}
	return a.roles[v].String()
}

func (a *analysis) sensorRole(v int32) string {
	if a.sensorRoles == nil {
		return ""
	}
	return a.sensorRoles[v].String()
}

// answers fills the question and the first-screen verdicts.
func (a *analysis) answers(r *htmlreport.Review, pf *pictureFlags) {
	g := a.g
	n := g.N()
	switch {
	case pf.inputs != "" && pf.outputs != "":
		r.Question = fmt.Sprintf("Is %s structurally controllable from the inputs in %s and observable from the outputs in %s?", a.path, pf.inputs, pf.outputs)
	case pf.inputs != "":
		r.Question = fmt.Sprintf("Is %s structurally controllable from the inputs in %s, and where would dedicated sensors go at least cost?", a.path, pf.inputs)
	case pf.outputs != "":
		r.Question = fmt.Sprintf("Is %s structurally observable from the outputs in %s, and where would dedicated actuators go at least cost?", a.path, pf.outputs)
	default:
		r.Question = fmt.Sprintf("Where must dedicated actuators and sensors go, at least cost, for %s to be structurally controllable and observable?", a.path)
	}
	if v := a.verdict; v != nil {
		ans := htmlreport.Answer{Topic: "Controllability"}
		if v.Controllable {
			ans.OK = htmlreport.Yes()
			ans.Headline = fmt.Sprintf("Structurally controllable from %d %s.", v.Inputs, plural(v.Inputs, "input", "inputs"))
		} else {
			ans.OK = htmlreport.No()
			ans.Headline = "Not structurally controllable: " + failureWhy(len(v.Unreached), v.Dilation != nil, v.Deficiency, "unreached", "input") + "."
		}
		ans.Facts = []htmlreport.Fact{
			fact("Inputs", strconv.Itoa(v.Inputs)),
			fact("States unreached", strconv.Itoa(len(v.Unreached))),
			fact("Inputs missing (at least)", strconv.Itoa(v.Deficiency)),
			fact("Controllable dimension", dimension(v.ControllableDimension, n)),
		}
		if p := a.completion; p != nil && p.Feasible {
			ans.Facts = append(ans.Facts, fact("Cheapest completion", fmt.Sprintf("add %d %s (cost %s)", len(p.Added), plural(len(p.Added), "actuator", "actuators"), a.cost(p.Cost))))
		}
		r.Answers = append(r.Answers, ans)
	} else if p := a.actuators; p != nil {
		r.Answers = append(r.Answers, a.placementAnswer("Actuators", "actuator", "controllable", p))
	}
	if v := a.obsVerdict; v != nil {
		ans := htmlreport.Answer{Topic: "Observability"}
		if v.Observable {
			ans.OK = htmlreport.Yes()
			ans.Headline = fmt.Sprintf("Structurally observable from %d %s.", v.Outputs, plural(v.Outputs, "output", "outputs"))
		} else {
			ans.OK = htmlreport.No()
			ans.Headline = "Not structurally observable: " + failureWhy(len(v.Unobserved), v.Dilation != nil, v.Deficiency, "unobserved", "output") + "."
		}
		ans.Facts = []htmlreport.Fact{
			fact("Outputs", strconv.Itoa(v.Outputs)),
			fact("States unobserved", strconv.Itoa(len(v.Unobserved))),
			fact("Outputs missing (at least)", strconv.Itoa(v.Deficiency)),
			fact("Observable dimension", dimension(v.ObservableDimension, n)),
		}
		if p := a.sensorCompletion; p != nil && p.Feasible {
			ans.Facts = append(ans.Facts, fact("Cheapest completion", fmt.Sprintf("add %d %s (cost %s)", len(p.Added), plural(len(p.Added), "sensor", "sensors"), a.cost(p.Cost))))
		}
		r.Answers = append(r.Answers, ans)
	} else if p := a.sensors; p != nil {
		r.Answers = append(r.Answers, a.placementAnswer("Sensors", "sensor", "observable", p))
	}
	nd := len(a.ds.Drivers)
	r.Answers = append(r.Answers, htmlreport.Answer{
		Topic:    "Network",
		Headline: fmt.Sprintf("%d %s, %d %s; %d independent control %s needed (N_D).", n, plural(n, "state", "states"), g.Edges(), plural(g.Edges(), "edge", "edges"), nd, plural(nd, "signal", "signals")),
		Facts: []htmlreport.Fact{
			fact("States", strconv.Itoa(n)),
			fact("Edges", fmt.Sprintf("%d (%d self-loops, %d repeats merged)", g.Edges(), g.SelfLoops(), g.DuplicatesMerged())),
			fact("Strongly connected components", fmt.Sprintf("%d (%d sources)", a.c.Count, countTrue(a.c.Sources(g.Out())))),
			fact("Driver nodes N_D", fmt.Sprintf("%d (fraction %.4f)", nd, float64(nd)/float64(n))),
		},
	})
}

func fact(label, value string) htmlreport.Fact { return htmlreport.Fact{Label: label, Value: value} }

func failureWhy(missed int, dilation bool, deficiency int, word, signal string) string {
	var why []string
	if missed > 0 {
		why = append(why, fmt.Sprintf("%d %s %s", missed, plural(missed, "state", "states"), word))
	}
	if dilation {
		why = append(why, fmt.Sprintf("a dilation (at least %d more %s)", deficiency, plural(deficiency, signal, signal+"s")))
	}
	return strings.Join(why, "; ")
}

func dimension(d, n int) string {
	if d < 0 {
		return "not computed (network too large)"
	}
	return fmt.Sprintf("%d of %d", d, n)
}

func countTrue(b []bool) int {
	k := 0
	for _, x := range b {
		if x {
			k++
		}
	}
	return k
}

func (a *analysis) placementAnswer(topic, kind, property string, p *structural.Placement) htmlreport.Answer {
	ans := htmlreport.Answer{Topic: topic}
	if p.Feasible {
		ans.OK = htmlreport.Yes()
		ans.Headline = fmt.Sprintf("%d dedicated %s it structurally %s.", len(p.Devices), plural(len(p.Devices), kind+" makes", kind+"s make"), property)
	} else {
		ans.OK = htmlreport.No()
		ans.Headline = fmt.Sprintf("No placement of dedicated %ss can make it structurally %s under the restrictions.", kind, property)
	}
	forced := 0
	if p.Feasible {
		for _, r := range p.Roles(0) {
			if r.Forced {
				forced++
			}
		}
	}
	ans.Facts = []htmlreport.Fact{
		fact(strings.ToUpper(kind[:1])+kind[1:]+"s", strconv.Itoa(len(p.Devices))),
		fact("New", strconv.Itoa(len(p.Added))),
		fact("Total cost of new", a.cost(p.Cost)),
		fact("Forced (in every cheapest set)", strconv.Itoa(forced)),
	}
	return ans
}

// tables fills the findings and the detail tables.
func (a *analysis) tables(r *htmlreport.Review) {
	if v := a.verdict; v != nil && !v.Controllable {
		if len(v.Unreached) > 0 {
			r.Findings = append(r.Findings, a.stateTable("Unreached states",
				"No input reaches these states, directly or downstream: each needs an input on it or upstream of it.", v.Unreached, a.role))
		}
		if d := v.Dilation; d != nil {
			r.Findings = append(r.Findings, htmlreport.Table{
				Title: "Dilation",
				Intro: fmt.Sprintf("These %d states are acted on by only %d %s together: one fewer than they need. One more input on one of them removes this deficit; at least %d more %s needed in all.",
					len(d.States), len(d.InNeighbours)+len(d.Inputs), plural(len(d.InNeighbours)+len(d.Inputs), "state or input", "states and inputs"),
					v.Deficiency, plural(v.Deficiency, "input is", "inputs are")),
				Columns: []string{"Set", "Members"},
				Rows: [][]string{
					{"States (S)", a.names(d.States)},
					{"States acting on S", orNone(a.names(d.InNeighbours))},
					{"Inputs acting on S", signalList("u", d.Inputs)},
				},
			})
		}
	}
	if v := a.obsVerdict; v != nil && !v.Observable {
		if len(v.Unobserved) > 0 {
			r.Findings = append(r.Findings, a.stateTable("Unobserved states",
				"No output sees these states: none of them acts, directly or through others, on a sensed state. Each needs a sensor on it or downstream of it.", v.Unobserved, a.sensorRole))
		}
		if d := v.Dilation; d != nil {
			r.Findings = append(r.Findings, htmlreport.Table{
				Title: "Observation dilation",
				Intro: fmt.Sprintf("These %d states act on only %d %s together: one fewer than they need. One more output on one of them removes this deficit; at least %d more %s needed in all.",
					len(d.States), len(d.OutNeighbours)+len(d.Outputs), plural(len(d.OutNeighbours)+len(d.Outputs), "state or output", "states and outputs"),
					v.Deficiency, plural(v.Deficiency, "output is", "outputs are")),
				Columns: []string{"Set", "Members"},
				Rows: [][]string{
					{"States (S)", a.names(d.States)},
					{"States S acts on", orNone(a.names(d.OutNeighbours))},
					{"Outputs sensing S", signalList("y", d.Outputs)},
				},
			})
		}
	}
	for _, c := range []struct {
		pl         *structural.Placement
		kind, what string
		d          structural.Devices
	}{{a.completion, "actuator", "controllable", a.actDev}, {a.sensorCompletion, "sensor", "observable", a.senDev}} {
		if c.pl == nil {
			continue
		}
		t := htmlreport.Table{Title: "Cheapest completion by dedicated " + c.kind + "s", Columns: []string{"Add " + article(c.kind) + " " + c.kind + " on", "Cost"}}
		if !c.pl.Feasible {
			t.Intro = fmt.Sprintf("No set of dedicated %ss makes the design structurally %s under the restrictions of the node table.", c.kind, c.what)
		} else {
			t.Intro = fmt.Sprintf("Adding these %d %s, at a total cost of %s, makes the design structurally %s (a cheapest such set; others of equal cost may exist).",
				len(c.pl.Added), plural(len(c.pl.Added), c.kind, c.kind+"s"), a.cost(c.pl.Cost), c.what)
			for i, v := range c.pl.Added {
				if i == maxTableRows {
					t.More = len(c.pl.Added) - maxTableRows
					break
				}
				cost := "1"
				if c.d.Cost != nil {
					cost = a.cost(c.d.Cost[v])
				}
				t.Rows = append(t.Rows, []string{a.label(v), cost})
			}
		}
		r.Findings = append(r.Findings, t)
	}
	for _, p := range []struct {
		pl   *structural.Placement
		kind string
	}{{a.actuators, "actuator"}, {a.sensors, "sensor"}} {
		if p.pl != nil && !p.pl.Feasible {
			t := htmlreport.Table{Title: "Why no " + p.kind + " placement succeeds", Columns: []string{"Problem", "States"}}
			for _, comp := range p.pl.Unreached {
				t.Rows = append(t.Rows, []string{"component no allowed state can reach", a.names(comp)})
			}
			if len(p.pl.Unmatchable) > 0 {
				t.Rows = append(t.Rows, []string{fmt.Sprintf("dilation only forbidden states could remove (%d short)", p.pl.Deficit), a.names(p.pl.Unmatchable)})
			}
			r.Findings = append(r.Findings, t)
		}
	}
	if a.inputs != nil {
		r.Tables = append(r.Tables, a.designTable("inputs", "Inputs", "u", "drives", a.inputs, a.role))
	}
	if a.actuators != nil {
		r.Tables = append(r.Tables, a.placementTable("actuators", "Actuators", "actuator", a.actuators, a.actDev, a.role))
	}
	if a.outputs != nil {
		r.Tables = append(r.Tables, a.designTable("outputs", "Outputs", "y", "senses", a.outputs, a.sensorRole))
	}
	if a.sensors != nil {
		r.Tables = append(r.Tables, a.placementTable("sensors", "Sensors", "sensor", a.sensors, a.senDev, a.sensorRole))
	}
	r.Tables = append(r.Tables, a.driverTable())
}

func signalList(prefix string, ids []int) string {
	parts := make([]string, len(ids))
	for i, s := range ids {
		parts[i] = prefix + strconv.Itoa(s+1)
	}
	if len(parts) == 0 {
		return "none"
	}
	return strings.Join(parts, ", ")
}

func (a *analysis) stateTable(title, intro string, ids []int32, role func(int32) string) htmlreport.Table {
	t := htmlreport.Table{Title: title, Intro: intro, Columns: []string{"State", "Role"}}
	for i, v := range ids {
		if i == maxTableRows {
			t.More = len(ids) - maxTableRows
			break
		}
		t.Rows = append(t.Rows, []string{a.label(v), role(v)})
	}
	return t
}

func (a *analysis) designTable(id, title, prefix, verb string, sigs []design.Signal, role func(int32) string) htmlreport.Table {
	t := htmlreport.Table{ID: id, Title: title, Columns: []string{"Signal", "File line", "States it " + verb, "Roles"}}
	for i, s := range sigs {
		if i == maxTableRows {
			t.More = len(sigs) - maxTableRows
			break
		}
		var roles []string
		for _, v := range s.States {
			roles = append(roles, role(v))
		}
		t.Rows = append(t.Rows, []string{prefix + strconv.Itoa(i+1), strconv.Itoa(s.Line), a.names(s.States), strings.Join(roles, ", ")})
	}
	return t
}

func (a *analysis) placementTable(id, title, kind string, p *structural.Placement, d structural.Devices, role func(int32) string) htmlreport.Table {
	t := htmlreport.Table{ID: id, Title: title,
		Intro:   fmt.Sprintf("The cheapest set of dedicated %ss, one state each. Forced: every cheapest set has it. Alternatives: states that could take its place alone at the same cost. Node role: across all minimum sets of independent %ss (critical: in every one; intermittent: in some; redundant: in none).", kind, kind),
		Columns: []string{"State", "Status", "Cost", "Forced", "Alternatives", "Node role"}}
	added := map[int32]structural.DeviceRole{}
	for _, r := range p.Roles(5) {
		added[r.State] = r
	}
	isNew := map[int32]bool{}
	for _, v := range p.Added {
		isNew[v] = true
	}
	for i, v := range p.Devices {
		if i == maxTableRows {
			t.More = len(p.Devices) - maxTableRows
			break
		}
		status, cost, forced, alts := "existing", "0", "", ""
		if isNew[v] {
			status, cost = "new", "1"
			if d.Cost != nil {
				cost = a.cost(d.Cost[v])
			}
			if r, ok := added[v]; ok {
				forced = "no"
				if r.Forced {
					forced = "yes"
				}
				alts = a.names(r.Alternatives)
				if r.More {
					alts += ", …"
				}
				if !r.Forced && len(r.Alternatives) == 0 {
					alts = "(moves only together with others)"
				}
			}
		}
		t.Rows = append(t.Rows, []string{a.label(v), status, cost, forced, alts, role(v)})
	}
	if len(p.Devices) == 0 {
		t.Note = "None needed."
	}
	return t
}

func (a *analysis) driverTable() htmlreport.Table {
	ds := a.ds
	t := htmlreport.Table{ID: "drivers", Title: "Driver nodes",
		Intro:   fmt.Sprintf("A minimum set of independent control signals, N_D = max(N - |M*|, 1) = %d (Liu, Slotine & Barabási 2011): each signal drives its driver node; states of source components that hold no driver are wired to an existing signal. Node roles are across all minimum driver sets (Jia et al. 2013).", len(ds.Drivers)),
		Columns: []string{"Signal", "Driver node", "Role", "Also wired to"}}
	for i, in := range ds.Inputs {
		if i == maxTableRows {
			t.More = len(ds.Inputs) - maxTableRows
			break
		}
		t.Rows = append(t.Rows, []string{"u" + strconv.Itoa(i+1), a.label(in[0]), a.role(in[0]), a.names(in[1:])})
	}
	return t
}

// numericCheck runs numeric.Verify on the design shown (the given one, or
// the cheapest devices) and adds its card and table.
func (a *analysis) numericCheck(r *htmlreport.Review, seed uint64) {
	var ins, outs [][]int32
	what := []string{}
	switch {
	case a.inputs != nil:
		ins = design.States(a.inputs)
		what = append(what, "the given inputs")
	case a.actuators != nil:
		ins = singletons(a.actuators.Devices)
		what = append(what, "the cheapest actuators")
	}
	switch {
	case a.outputs != nil:
		outs = design.States(a.outputs)
		what = append(what, "the given outputs")
	case a.sensors != nil:
		outs = singletons(a.sensors.Devices)
		what = append(what, "the cheapest sensors")
	}
	t := &htmlreport.Table{ID: "numeric", Title: "Numeric check"}
	r.Numeric = t
	ans := htmlreport.Answer{Topic: "Numeric check"}
	if len(ins) == 0 && len(outs) == 0 {
		t.Intro = "Nothing to check: no inputs or outputs."
		return
	}
	rep, err := numeric.Verify(a.g, ins, outs, numeric.Options{Seed: seed})
	if err != nil {
		var se *numeric.SizeError
		if errors.As(err, &se) {
			t.Intro = fmt.Sprintf("Not run: %d states exceed the limit of %d for the exact check, which would take about %s and %s of memory. Run netsteer verify with --max-states, --around or --sample.",
				se.N, se.Max, numeric.FormatDuration(se.Time), numeric.FormatBytes(se.Bytes))
		} else {
			t.Intro = "Not run: " + err.Error()
		}
		ans.Headline = "Not run."
		r.Answers = append(r.Answers, ans)
		return
	}
	t.Intro = fmt.Sprintf("Random nonzero values were drawn for every structural nonzero of A, B and C (seed %d, %d trials) for %s, and the dimensions of the controllable and observable subspaces of each sample computed exactly over GF(p), p = %d. A sample never exceeds the structural (generic) dimension and falls short of it with probability at most n²/(p-1) per trial (Schwartz–Zippel). The margin is the smallest singular value of [A - λI, B] over the eigenvalues λ of A relative to the norm of [A B] (floating point).",
		rep.Seed, trialsOf(rep), strings.Join(what, " and "), rep.Prime)
	t.Columns = []string{"Property", "Signals", "Structural dimension", "Sampled dimension", "Agrees", "Smallest margin"}
	ok := true
	var heads []string
	for _, p := range []struct {
		name string
		res  *numeric.Result
	}{{"controllability", rep.Controllability}, {"observability", rep.Observability}} {
		if p.res == nil {
			continue
		}
		res := p.res
		margin := "not computed"
		if !math.IsNaN(res.Margin) {
			margin = strconv.FormatFloat(res.Margin, 'g', 3, 64)
		} else if res.FloatSkipped != "" {
			margin = "skipped: " + res.FloatSkipped
		}
		agree := "yes"
		if !res.Agrees {
			agree = "no"
		}
		t.Rows = append(t.Rows, []string{p.name, strconv.Itoa(res.Signals), strconv.Itoa(res.Structural), strconv.Itoa(res.Sampled), agree, margin})
		ok = ok && res.Full
		heads = append(heads, fmt.Sprintf("%s %d of %d", p.name, res.Sampled, rep.N))
	}
	if ok {
		ans.OK = htmlreport.Yes()
	} else {
		ans.OK = htmlreport.No()
	}
	ans.Headline = "Sampled dimensions: " + strings.Join(heads, ", ") + "."
	ans.Facts = []htmlreport.Fact{fact("Seed", strconv.FormatUint(rep.Seed, 10)), fact("Trials", strconv.Itoa(trialsOf(rep)))}
	r.Answers = append(r.Answers, ans)
}

func trialsOf(rep *numeric.Report) int {
	for _, res := range []*numeric.Result{rep.Controllability, rep.Observability} {
		if res != nil {
			return len(res.Trials)
		}
	}
	return 0
}
