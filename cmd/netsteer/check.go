package main

import (
	"bufio"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"strconv"
	"strings"
	"time"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/design"
	"github.com/netsteer/netsteer/structural"
)

var checkCmd = &command{
	name:    "check",
	summary: "judge a given actuator (and sensor) design: controllable or not, and what to fix",
	usage: `Usage: netsteer check [options] NET --inputs FILE [--outputs FILE]

Judges a given design by Lin's theorem (IEEE TAC 19(3), 1974): the network
with these inputs is structurally controllable exactly when every state is
reached from some input and there is no dilation, that is no set of states
whose in-neighbours, inputs included, number fewer than the states.

When the design fails, check names the states no input reaches, and one
dilation: a set of states with its in-neighbours, one fewer than the states,
so one more actuator is needed among them. It also reports the controllable
dimension, the generic dimension of the controllable subspace (Hosoe, IEEE
TAC 25(6), 1980): how many independent state directions the design does
steer. It is N for a controllable design, and it is not the term rank of
[A B], which check reports beside it.

FILE holds one independent input per line; the names on a line are the
states that input drives (one name is a dedicated actuator). Names are
separated by white space or commas and may be double-quoted; lines starting
with '#' or '%' are comments. --outputs FILE judges a sensor design the same
way for structural observability (the dual: the network with every edge
reversed); each line is one output and the states it senses.

NET is an edge list ("u v" means u acts on v), a Matrix Market file (.mtx)
or a DOT digraph (.dot, .gv); gzip is detected; - reads standard input.

Exit status: 0 when the design is controllable (and observable, with
--outputs), 1 when not, 2 on error.

Example:
  netsteer check testdata/plant/heating.edges --inputs testdata/plant/heating-actuators.txt
  netsteer check --format json --outputs sensors.txt plant.edges --inputs actuators.txt
`,
	run: runCheck,
}

func init() { register(checkCmd) }

// checkExtension adds to check's report: the place for, say, the cheapest
// devices that complete a failing design. An extension registers its flags,
// runs after the verdicts and returns a section (or nil) that is printed
// after the details in text, and written with its own keys in JSON and its
// own rows in CSV. It does not change the exit status. Extensions append
// themselves to checkExtensions from an init function in their own file.
type checkExtension struct {
	flags func(fs *pflag.FlagSet)
	run   func(e *env, r *checkResult) (*checkSection, error)
}

// checkSection is one extension's part of the report; nil fields are
// skipped.
type checkSection struct {
	text func(w io.Writer)    // a paragraph after the details
	json func(j *jsonw)       // extra top-level keys
	csv  func(cw *csv.Writer) // extra key,value rows
}

var checkExtensions []*checkExtension

// checkResult is everything check found, for the writers and extensions.
type checkResult struct {
	file                    string
	inputsFile, outputsFile string // "" when not given
	g                       *structural.Network
	inputs, outputs         [][]int32
	inputLines, outputLines []int                            // the file line of each input (output)
	ctrl                    *structural.Verdict              // nil without --inputs
	obs                     *structural.ObservabilityVerdict // nil without --outputs
	sections                []*checkSection
	stages                  []stage
	net                     *netFlags // the network options, node table included
}

// holds reports whether every property asked for holds.
func (r *checkResult) holds() bool {
	return (r.ctrl == nil || r.ctrl.Controllable) && (r.obs == nil || r.obs.Observable)
}

func runCheck(e *env, c *command, fs *pflag.FlagSet, args []string) int {
	var nf netFlags
	var of outFlags
	var inputsFile, outputsFile string
	nf.register(fs, e)
	fs.StringVar(&inputsFile, "inputs", "", "input design: one input per line, the states it drives")
	fs.StringVar(&outputsFile, "outputs", "", "output design: one output per line, the states it senses")
	of.register(fs)
	for _, x := range checkExtensions {
		if x.flags != nil {
			x.flags(fs)
		}
	}
	if ok, st := parse(e, c, fs, args); !ok {
		return st
	}
	if fs.NArg() != 1 {
		return usageError(e, c, "want one network file, got %d arguments", fs.NArg())
	}
	if err := of.check(); err != nil {
		return usageError(e, c, "%v", err)
	}
	path := fs.Arg(0)
	stdin := 0
	for _, p := range []string{path, inputsFile, outputsFile} {
		if p == "-" {
			stdin++
		}
	}
	switch {
	case inputsFile == "" && outputsFile == "":
		return usageError(e, c, "give --inputs FILE (and/or --outputs FILE)")
	case stdin > 1:
		return usageError(e, c, "only one of NET, --inputs and --outputs can read standard input")
	}
	if err := overwritesInput(of.output, path, inputsFile, outputsFile, nf.nodeTable); err != nil {
		return usageError(e, c, "%v", err)
	}
	start := time.Now()
	g, readT, err := nf.load(path, nil)
	if err != nil {
		return fail(e, err)
	}
	r := &checkResult{file: path, inputsFile: inputsFile, outputsFile: outputsFile, g: g, net: &nf}
	t0 := time.Now()
	if inputsFile != "" {
		if r.inputs, r.inputLines, err = readDesign(inputsFile, g, "inputs"); err != nil {
			return fail(e, err)
		}
	}
	if outputsFile != "" {
		if r.outputs, r.outputLines, err = readDesign(outputsFile, g, "outputs"); err != nil {
			return fail(e, err)
		}
	}
	designT := time.Since(t0)
	t0 = time.Now()
	if inputsFile != "" {
		r.ctrl = structural.Check(g, r.inputs)
	}
	if outputsFile != "" {
		r.obs = structural.CheckObservability(g, r.outputs)
	}
	r.stages = []stage{{"read_s", readT}, {"design_s", designT}, {"check_s", time.Since(t0)}}
	for _, x := range checkExtensions {
		s, err := x.run(e, r)
		if err != nil {
			return fail(e, err)
		}
		if s != nil {
			r.sections = append(r.sections, s)
		}
	}
	r.stages = append(r.stages, stage{"total_s", time.Since(start)})
	if err := of.write(e, r); err != nil {
		return fail(e, err)
	}
	if !r.holds() {
		return exitNo
	}
	return exitOK
}

// readDesign reads a design file: the states of each signal and the line
// it is on. An empty file is an error, as it is most likely the wrong one.
func readDesign(path string, g *structural.Network, what string) ([][]int32, []int, error) {
	sigs, err := designSignals(path, g, false)
	if err != nil {
		return nil, nil, err
	}
	if len(sigs) == 0 {
		return nil, nil, errors.New(displayFile(path) + ": no " + what + " in the file")
	}
	lines := make([]int, len(sigs))
	for i, s := range sigs {
		lines[i] = s.Line
	}
	return design.States(sigs), lines, nil
}

// The two properties differ only in words; dual holds them.
type dual struct {
	adj, signal, signals, device string
	unreached                    string // "unreached" or "unobserved"
	why                          string // why a state is in that list
	allReached                   string
	dilation                     string
	neighbours                   string // "in-neighbours" or "out-neighbours"
	matrix                       string // for the term rank
}

var (
	ctrlWords = dual{"controllable", "input", "inputs", "actuator", "unreached",
		"no input acts on them, directly or through other states",
		"every state is reached from an input", "dilation", "in-neighbours", "[A B]"}
	obsWords = dual{"observable", "output", "outputs", "sensor", "unobserved",
		"no output senses them, directly or through the states they act on",
		"every state reaches an output", "observation dilation", "out-neighbours", "[A; C]"}
)

// verdictView is one property's verdict in neutral terms.
type verdictView struct {
	words      dual
	holds      bool
	count      int // signals
	unreached  []int32
	dilation   []int32 // S, nil when none
	neighbours []int32 // its state neighbours
	signals    []int   // its signal neighbours, 0-based
	lines      []int   // the file line of every signal
	deficiency int
	dimension  int
}

func (r *checkResult) views() []verdictView {
	var vs []verdictView
	if v := r.ctrl; v != nil {
		x := verdictView{words: ctrlWords, holds: v.Controllable, count: v.Inputs, unreached: v.Unreached,
			deficiency: v.Deficiency, dimension: v.ControllableDimension, lines: r.inputLines}
		if d := v.Dilation; d != nil {
			x.dilation, x.neighbours, x.signals = d.States, d.InNeighbours, d.Inputs
		}
		vs = append(vs, x)
	}
	if v := r.obs; v != nil {
		x := verdictView{words: obsWords, holds: v.Observable, count: v.Outputs, unreached: v.Unobserved,
			deficiency: v.Deficiency, dimension: v.ObservableDimension, lines: r.outputLines}
		if d := v.Dilation; d != nil {
			x.dilation, x.neighbours, x.signals = d.States, d.OutNeighbours, d.Outputs
		}
		vs = append(vs, x)
	}
	return vs
}

// headline is the one-line verdict of one property.
func (v verdictView) headline(n int) string {
	sig := plural(v.count, v.words.signal, v.words.signals)
	if v.holds {
		return fmt.Sprintf("%s with %d %s", v.words.adj, v.count, sig)
	}
	return fmt.Sprintf("NOT %s with %d %s (dimension %d of %d)", v.words.adj, v.count, sig, v.dimension, n)
}

// fix says what to change for a failing property, in one line.
func (v verdictView) fix(g *structural.Network) string {
	var parts []string
	if k := len(v.unreached); k > 0 {
		parts = append(parts, fmt.Sprintf("%d %s %s: %s (%s)", k, plural(k, "state is", "states are"), v.words.unreached,
			strings.ReplaceAll(v.words.why, "them", plural(k, "it", "them")), nameList(g, v.unreached, maxListed)))
	}
	if s := v.dilation; s != nil {
		if len(s) == 1 {
			parts = append(parts, fmt.Sprintf("%s has no %s at all: it needs its own %s", textName(g.Name(s[0])), strings.TrimSuffix(v.words.neighbours, "s"), v.words.device))
		} else {
			m := len(v.neighbours) + len(v.signals)
			parts = append(parts, fmt.Sprintf("these %d states share only %d %s: one more %s needed among them (%s)",
				len(s), m, plural(m, strings.TrimSuffix(v.words.neighbours, "s"), v.words.neighbours), v.words.device, nameList(g, s, maxListed)))
		}
	}
	return strings.Join(parts, "; and ")
}

func (r *checkResult) writeText(w io.Writer) error {
	g := r.g
	bw := bufio.NewWriterSize(w, 1<<16)
	vs := r.views()
	heads := make([]string, len(vs))
	for i, v := range vs {
		heads[i] = v.headline(g.N())
	}
	fmt.Fprintf(bw, "%s: %s.\n", displayFile(r.file), strings.Join(heads, "; "))
	for _, v := range vs {
		if !v.holds {
			lead := "To fix"
			if len(vs) > 1 {
				lead += " " + strings.TrimSuffix(v.words.adj, "le") + "ility"
			}
			fmt.Fprintf(bw, "%s: %s.\n", lead, v.fix(g))
		}
	}
	fmt.Fprintf(bw, "\nNetwork: %d %s, %d %s (%d %s).\n", g.N(), plural(g.N(), "state", "states"),
		g.Edges(), plural(g.Edges(), "edge", "edges"), g.SelfLoops, plural(g.SelfLoops, "self-loop", "self-loops"))
	for _, v := range vs {
		file := r.inputsFile
		if v.words.signal == "output" {
			file = r.outputsFile
		}
		fmt.Fprintf(bw, "\n%d %s from %s:\n", v.count, plural(v.count, v.words.signal, v.words.signals), displayFile(file))
		fmt.Fprintf(bw, "  %s dimension: %d of %d (generic, Hosoe 1980)\n", v.words.adj, v.dimension, g.N())
		fmt.Fprintf(bw, "  term rank of %s: %d of %d", v.words.matrix, g.N()-v.deficiency, g.N())
		if v.deficiency > 0 {
			fmt.Fprintf(bw, " (at least %d more %s needed to remove every %s)", v.deficiency, plural(v.deficiency, v.words.signal, v.words.signals), v.words.dilation)
		}
		fmt.Fprintln(bw)
		if len(v.unreached) == 0 {
			fmt.Fprintf(bw, "  %s\n", v.words.allReached)
		} else {
			fmt.Fprintf(bw, "  %d %s %s:\n", len(v.unreached), v.words.unreached, plural(len(v.unreached), "state", "states"))
			writeWrapped(bw, g, v.unreached, "    ")
		}
		if v.dilation == nil {
			fmt.Fprintf(bw, "  no %s\n", v.words.dilation)
		} else {
			fmt.Fprintf(bw, "  %s of %d %s:\n", v.words.dilation, len(v.dilation), plural(len(v.dilation), "state", "states"))
			writeWrapped(bw, g, v.dilation, "    ")
			if m := len(v.neighbours) + len(v.signals); m == 0 {
				fmt.Fprintf(bw, "  their %s: none\n", v.words.neighbours)
			} else {
				fmt.Fprintf(bw, "  their %s (%d):\n", v.words.neighbours, m)
			}
			if len(v.neighbours) > 0 {
				writeWrapped(bw, g, v.neighbours, "    ")
			}
			if len(v.signals) > 0 {
				nums := make([]string, len(v.signals))
				for i, s := range v.signals {
					nums[i] = strconv.Itoa(signalLine(v.lines, s))
				}
				fmt.Fprintf(bw, "    the %s on %s %s of %s\n", plural(len(nums), v.words.signal, v.words.signals),
					plural(len(nums), "line", "lines"), strings.Join(nums, ", "), displayFile(file))
			}
		}
	}
	for _, s := range r.sections {
		if s.text != nil {
			fmt.Fprintln(bw)
			s.text(bw)
		}
	}
	fmt.Fprint(bw, "\n"+caution)
	return bw.Flush()
}

// maxDetailed bounds the names listed in the text details; JSON and CSV
// list them all.
const maxDetailed = 200

// writeWrapped prints up to maxDetailed names in lines of about 78 columns.
func writeWrapped(w *bufio.Writer, g *structural.Network, ids []int32, indent string) {
	more := 0
	if len(ids) > maxDetailed {
		ids, more = ids[:maxDetailed], len(ids)-maxDetailed
	}
	col := 0
	for i, v := range ids {
		name := textName(g.Name(v))
		if i > 0 {
			w.WriteString(",")
			col++
		}
		if col == 0 || col+1+len(name) > 78-len(indent) {
			if i > 0 {
				w.WriteString("\n")
			}
			w.WriteString(indent)
			col = 0
		} else {
			w.WriteString(" ")
			col++
		}
		w.WriteString(name)
		col += len(name)
	}
	w.WriteString("\n")
	if more > 0 {
		fmt.Fprintf(w, "%s... and %d more (--format json or csv lists them all)\n", indent, more)
	}
}

func (r *checkResult) writeJSON(w io.Writer) error {
	g := r.g
	j := newJSON(bufio.NewWriterSize(w, 1<<16))
	j.val("file", r.file)
	j.int("nodes", g.N())
	j.int("edges", g.Edges())
	if v := r.ctrl; v != nil {
		j.val("inputs_file", r.inputsFile)
		j.int("inputs_count", v.Inputs)
		j.bool("controllable", v.Controllable)
		j.names("unreached", v.Unreached, g.Name)
		j.key("dilation")
		if d := v.Dilation; d == nil {
			j.w.WriteString("null")
		} else {
			writeDilationJSON(j, g, d.States, "in_neighbours", d.InNeighbours, "input_lines", signalLines(r.inputLines, d.Inputs))
		}
		j.int("term_rank", g.N()-v.Deficiency)
		j.int("controllable_dimension", v.ControllableDimension)
	}
	if v := r.obs; v != nil {
		j.val("outputs_file", r.outputsFile)
		j.int("outputs_count", v.Outputs)
		j.bool("observable", v.Observable)
		j.names("unobserved", v.Unobserved, g.Name)
		j.key("observation_dilation")
		if d := v.Dilation; d == nil {
			j.w.WriteString("null")
		} else {
			writeDilationJSON(j, g, d.States, "out_neighbours", d.OutNeighbours, "output_lines", signalLines(r.outputLines, d.Outputs))
		}
		j.int("observation_term_rank", g.N()-v.Deficiency)
		j.int("observable_dimension", v.ObservableDimension)
	}
	for _, s := range r.sections {
		if s.json != nil {
			s.json(j)
		}
	}
	j.timings(r.stages)
	return j.end()
}

// signalLine returns the design-file line of signal s (0-based), or its
// 1-based number when the lines are unknown.
func signalLine(lines []int, s int) int {
	if s < len(lines) {
		return lines[s]
	}
	return s + 1
}

// signalLines maps signals (0-based) to their design-file lines.
func signalLines(lines []int, sigs []int) []int {
	out := make([]int, len(sigs))
	for i, s := range sigs {
		out[i] = signalLine(lines, s)
	}
	return out
}

// writeDilationJSON writes {"states": [...], nbKey: [...], lineKey: [file lines]}.
func writeDilationJSON(j *jsonw, g *structural.Network, states []int32, nbKey string, nb []int32, lineKey string, lines []int) {
	w := j.w
	w.WriteString("{\"states\": ")
	writeNameArray(w, states, g.Name)
	w.WriteString(", " + strconv.Quote(nbKey) + ": ")
	writeNameArray(w, nb, g.Name)
	w.WriteString(", " + strconv.Quote(lineKey) + ": [")
	for i, l := range lines {
		if i > 0 {
			w.WriteString(", ")
		}
		w.WriteString(strconv.Itoa(l))
	}
	w.WriteString("]}")
}

// writeCSV writes key,value rows: one per number and one per listed state,
// with the JSON names as keys (lists use the singular: unreached,
// dilation_state, dilation_in_neighbour, dilation_input_line, ...).
func (r *checkResult) writeCSV(w io.Writer) error {
	g := r.g
	cw := csv.NewWriter(w)
	row := func(k, v string) { cw.Write([]string{k, v}) }
	list := func(k string, ids []int32) {
		for _, v := range ids {
			row(k, g.Name(v))
		}
	}
	nums := func(k string, xs []int) {
		for _, x := range xs {
			row(k, strconv.Itoa(x))
		}
	}
	row("key", "value")
	row("file", r.file)
	row("nodes", strconv.Itoa(g.N()))
	row("edges", strconv.Itoa(g.Edges()))
	if v := r.ctrl; v != nil {
		row("inputs_file", r.inputsFile)
		row("inputs_count", strconv.Itoa(v.Inputs))
		row("controllable", strconv.FormatBool(v.Controllable))
		row("term_rank", strconv.Itoa(g.N()-v.Deficiency))
		row("controllable_dimension", strconv.Itoa(v.ControllableDimension))
		list("unreached", v.Unreached)
		if d := v.Dilation; d != nil {
			list("dilation_state", d.States)
			list("dilation_in_neighbour", d.InNeighbours)
			nums("dilation_input_line", signalLines(r.inputLines, d.Inputs))
		}
	}
	if v := r.obs; v != nil {
		row("outputs_file", r.outputsFile)
		row("outputs_count", strconv.Itoa(v.Outputs))
		row("observable", strconv.FormatBool(v.Observable))
		row("observation_term_rank", strconv.Itoa(g.N()-v.Deficiency))
		row("observable_dimension", strconv.Itoa(v.ObservableDimension))
		list("unobserved", v.Unobserved)
		if d := v.Dilation; d != nil {
			list("observation_dilation_state", d.States)
			list("observation_dilation_out_neighbour", d.OutNeighbours)
			nums("observation_dilation_output_line", signalLines(r.outputLines, d.Outputs))
		}
	}
	for _, s := range r.sections {
		if s.csv != nil {
			s.csv(cw)
		}
	}
	cw.Flush()
	return cw.Error()
}

// designSignals reads the signals of a design file.
func designSignals(path string, g *structural.Network, weights bool) ([]design.Signal, error) {
	f, err := design.ReadFile(path, g, design.Options{Weights: weights})
	if err != nil {
		return nil, err
	}
	return f.Signals, nil
}
