package render

import (
	"bufio"
	"fmt"
	"github.com/netsteer/netsteer/io/internal/words"
	"io"
	"math"
	"sort"
	"strconv"
	"strings"

	"github.com/netsteer/netsteer/structural/placement"
)

// Palette: Okabe & Ito (2008), plus greys.
const (
	colOrange    = "#E69F00" // input signals
	colSky       = "#56B4E9" // driven states
	colGreen     = "#009E73" // output signals, sensed states
	colYellow    = "#F0E442" // unreached states
	colBlue      = "#0072B2" // stems
	colVermilion = "#D55E00" // cycles, dilation outline
	colPurple    = "#CC79A7" // source components
	colTint      = "#F6C9AE" // dilation fill: vermillion tint
	colGrey      = "#D9D9D9" // unobserved fill
	colInk       = "#333333" // outlines and text
	colMuted     = "#555555" // secondary text
	colRule      = "#C8C8C8" // rules between parts
	colEdge      = "#9A9A9A" // plain edges
	colFrame     = "#8A8A8A" // group frames
	fontName     = "Helvetica"
	gvFontSize   = 12.0 // node labels in Graphviz views, in points
)

// shapeOf maps a role to a node shape.
func shapeOf(role string) string {
	switch role {
	case "critical":
		return "box"
	case "intermittent":
		return "octagon"
	}
	return "ellipse"
}

// DOT writes the view v of in as Graphviz DOT text for the given layout
// (see Layouts; "auto" is resolved by ChooseLayout), with the title as a
// plain graph label. The text names its layout engine in the graph's
// layout attribute, so Graphviz's own tools draw it the same way. Nodes,
// clusters and edges come in a fixed order (states ascending, edges in CSR
// order, groups by name), so the same input always gives the same text.
// Only the Graphviz views (View.Graph) have DOT text.
func DOT(w io.Writer, in *Input, v *View, layout string) error {
	_, err := writeDOT(w, in, v, layout, true)
	return err
}

// writeDOT writes the DOT text, with the title as a graph label when
// label is set, and returns the features drawn, for the legend.
func writeDOT(w io.Writer, in *Input, v *View, layout string, label bool) (map[string]bool, error) {
	if !v.Graph() {
		return nil, fmt.Errorf("render: the %s view is not a graph and has no DOT text", v.Kind)
	}
	in.prep()
	layout, err := ChooseLayout(layout, v)
	if err != nil {
		return nil, err
	}
	eng, err := engine(layout)
	if err != nil {
		return nil, err
	}
	bw := bufio.NewWriter(w)
	d := &dotWriter{w: bw, in: in, v: v, eng: eng, has: map[string]bool{}}
	if v.Kind == Components {
		d.condensation()
	} else {
		d.states()
	}
	if label {
		d.plainTitle()
	}
	d.printf("}\n")
	return d.has, bw.Flush()
}

type dotWriter struct {
	w   *bufio.Writer
	in  *Input
	v   *View
	eng *layoutEngine
	// features present, for the legend
	has map[string]bool
}

func (d *dotWriter) printf(format string, args ...any) { fmt.Fprintf(d.w, format, args...) }

func (d *dotWriter) header() {
	d.printf("digraph \"netsteer\" {\n")
	d.printf("  graph [layout=%s, fontname=%q, fontsize=10, labelloc=t, labeljust=l, outputorder=edgesfirst, bgcolor=\"#FFFFFF\", pad=0.2", d.eng.engine, fontName)
	for _, a := range d.eng.attrs {
		d.printf(", %s", a)
	}
	d.printf("];\n")
	d.printf("  node [fontname=%q, fontsize=%s, shape=ellipse, style=filled, fillcolor=\"#FFFFFF\", color=%q, fontcolor=%q, penwidth=1, height=0.3, margin=\"0.06,0.03\"];\n", fontName, ff(gvFontSize), colInk, colInk)
	d.printf("  edge [color=%q, penwidth=0.8, arrowsize=0.6];\n", colEdge)
}

// plainTitle writes the title, summary, notes and view as a plain label
// (the pictures draw them with the legend instead).
func (d *dotWriter) plainTitle() {
	lines := []string{d.in.Title, Summary(d.in)}
	lines = append(lines, d.in.Notes...)
	lines = append(lines, "view: "+d.v.Desc)
	var b strings.Builder
	for _, l := range lines {
		if l == "" {
			continue
		}
		q := dotPlain(l)
		b.WriteString(q[1 : len(q)-1])
		b.WriteString(`\l`)
	}
	d.printf("  label=\"%s\";\n", b.String())
}

// states writes a view of individual states.
func (d *dotWriter) states() {
	in, v, g := d.in, d.v, d.in.Net
	d.header()
	pos := make(map[int32]int, len(v.States))
	for i, s := range v.States {
		pos[s] = i
	}
	// Signals that touch a drawn state.
	drivenBy := map[int32][]int{}
	sensedBy := map[int32][]int{}
	var inSig, outSig []int
	for i, sig := range in.inputs {
		touch := false
		for _, s := range sig {
			if _, ok := pos[s]; ok {
				drivenBy[s] = append(drivenBy[s], i)
				touch = true
			}
		}
		if touch {
			inSig = append(inSig, i)
		}
	}
	for i, sig := range in.outputs {
		touch := false
		for _, s := range sig {
			if _, ok := pos[s]; ok {
				sensedBy[s] = append(sensedBy[s], i)
				touch = true
			}
		}
		if touch {
			outSig = append(outSig, i)
		}
	}
	unreached := map[int32]bool{}
	for _, s := range in.unreached {
		unreached[s] = true
	}
	dilation := map[int32]bool{}
	for _, s := range in.dilation {
		dilation[s] = true
	}
	unobserved := map[int32]bool{}
	for _, s := range in.unobserved {
		unobserved[s] = true
	}
	obsDilation := map[int32]bool{}
	for _, s := range in.obsDila {
		obsDilation[s] = true
	}

	// Nodes.
	for i, s := range v.States {
		nm := name(g.Name(s))
		shown := in.shownName(s)
		lines := []string{shown}
		var tip []string
		tip = append(tip, nm)
		if shown != nm {
			tip[0] = shown + " (" + nm + ")"
		}
		attrs := []string{}
		// Fill: the most pressing finding wins; the tooltip lists all.
		fill, style := "", ""
		switch {
		case unreached[s]:
			fill, style = colYellow, "dashed"
		case unobserved[s]:
			fill, style = colGrey, "dotted"
		case dilation[s] || obsDilation[s]:
			fill = colTint
			attrs = append(attrs, fmt.Sprintf("color=%q", colVermilion), "penwidth=2.2")
		case len(drivenBy[s]) > 0:
			fill = colSky
		}
		if unreached[s] {
			tip = append(tip, "unreached: no input reaches it")
			d.has["unreached"] = true
		}
		if unobserved[s] {
			tip = append(tip, "unobserved: no sensor sees it")
			d.has["unobserved"] = true
		}
		if dilation[s] {
			tip = append(tip, "in the dilation set")
			d.has["dilation"] = true
		}
		if obsDilation[s] {
			tip = append(tip, "in the observation dilation set")
			d.has["dilation"] = true
		}
		if len(drivenBy[s]) > 0 {
			d.has["driven"] = true
		}
		if fill != "" {
			attrs = append(attrs, fmt.Sprintf("fillcolor=%q", fill))
		}
		if style != "" {
			attrs = append(attrs, fmt.Sprintf("style=\"filled,%s\"", style), "penwidth=1.8")
		}
		if sigs := drivenBy[s]; len(sigs) > 0 {
			tip = append(tip, "driven by "+d.signalNames(false, sigs))
		}
		if sigs := sensedBy[s]; len(sigs) > 0 {
			attrs = append(attrs, "peripheries=2", fmt.Sprintf("color=%q", colGreen), "penwidth=1.6")
			tip = append(tip, "sensed by "+d.signalNames(true, sigs))
			d.has["sensed"] = true
		}
		if in.Role != nil {
			if r := in.Role(s); r == "critical" || r == "intermittent" || r == "redundant" {
				if sh := shapeOf(r); sh != "ellipse" {
					attrs = append(attrs, "shape="+sh)
				}
				tip = append(tip, "role: "+r)
				d.has["role-"+r] = true
			}
		}
		if in.Group != nil {
			if gr := in.Group(s); gr != "" {
				tip = append(tip, "group: "+name(gr))
			}
		}
		if v.Hidden != nil && v.Hidden[i] > 0 {
			h := int(v.Hidden[i])
			lines = append(lines, fmt.Sprintf("+%d %s not drawn", h, plural(h, "link", "links")))
			tip = append(tip, fmt.Sprintf("%d %s to states not drawn", h, plural(h, "link", "links")))
			d.has["hidden"] = true
		}
		d.printf("  s%d [label=%s, tooltip=%s%s];\n", s, labelLines(lines), dotTooltip(strings.Join(tip, "; ")), joinAttrs(attrs))
	}
	// Signal nodes, and the new devices of a completion.
	for _, i := range inSig {
		d.signalNode(false, i)
	}
	for _, i := range outSig {
		d.signalNode(true, i)
	}
	complete := d.completion(pos)
	d.clusters(pos)
	// Edges.
	for _, e := range v.Edges {
		switch {
		case e.Stem():
			d.printf("  s%d -> s%d [color=%q, penwidth=2.8, arrowsize=0.8];\n", e.From, e.To, colBlue)
			d.has["stem"] = true
		case e.Cycle():
			d.printf("  s%d -> s%d [color=%q, penwidth=2.8, arrowsize=0.8];\n", e.From, e.To, colVermilion)
			d.has["cycle"] = true
		default:
			d.printf("  s%d -> s%d;\n", e.From, e.To)
			d.has["edge"] = true
		}
	}
	for _, i := range inSig {
		for _, s := range in.inputs[i] {
			if _, ok := pos[s]; ok {
				d.printf("  u%d -> s%d [color=%q, penwidth=1.6, style=dashed];\n", i, s, colOrange)
				d.has["signal-edge"] = true
			}
		}
	}
	for _, i := range outSig {
		for _, s := range in.outputs[i] {
			if _, ok := pos[s]; ok {
				d.printf("  s%d -> y%d [color=%q, penwidth=1.6, style=dotted];\n", s, i, colGreen)
				d.has["sense-edge"] = true
			}
		}
	}
	for _, c := range complete {
		if c.out {
			d.printf("  s%d -> ny%d [color=%q, penwidth=1.6, style=dotted];\n", c.v, c.v, colGreen)
			d.has["sense-edge"] = true
		} else {
			d.printf("  nu%d -> s%d [color=%q, penwidth=1.6, style=dashed];\n", c.v, c.v, colOrange)
			d.has["signal-edge"] = true
		}
	}

}

// signalNode writes input (or output) signal i: a circle (a square for an
// output) with its number, hollow and dashed for a new device, with the
// device's cost when known.
func (d *dotWriter) signalNode(output bool, i int) {
	in := d.in
	st := in.In
	shape, fill, key, id := "circle", colOrange, "input", "u"
	if output {
		st = in.Out
		shape, fill, key, id = "box", colGreen, "output", "y"
	}
	label := in.signalName(output, i)
	stem := in.stemOfSignal(st, i)
	style := "filled"
	stroke := colInk
	font := colInk
	if output {
		font = "#FFFFFF"
	}
	what := st.Kind
	if stem != nil && stem.New {
		style, stroke, fill, font = "dashed,filled", fill, "#FFFFFF", colInk
		key += "-new"
		what = "new " + what
	}
	if stem != nil && stem.Cost != nil {
		label += `\n` + words.Thousands(stem.Cost.String())
		what += ", cost " + words.Thousands(stem.Cost.String())
	}
	verb := "drives"
	if output {
		verb = "senses"
	}
	tip := d.signalTip(in.signalName(output, i)+": "+what, verb, st.Design.Signal(i))
	d.printf("  %s%d [label=\"%s\", shape=%s, style=%q, width=0.42, height=0.36, margin=\"0.02,0.02\", fillcolor=%q, color=%q, fontcolor=%q, penwidth=1.6, tooltip=%s];\n",
		id, i, label, shape, style, fill, stroke, font, dotTooltip(tip))
	d.has[key] = true
}

type completed struct {
	v   int32
	out bool
}

// completion writes the new devices of the cheapest completions on the
// drawn states and returns them.
func (d *dotWriter) completion(pos map[int32]int) []completed {
	var out []completed
	for k, pl := range [2]*placement.Placement{d.in.CompleteIn, d.in.CompleteOut} {
		if pl == nil {
			continue
		}
		kind, id, shape, col := "actuator", "nu", "circle", colOrange
		if k == 1 {
			kind, id, shape, col = "sensor", "ny", "box", colGreen
		}
		for _, v := range pl.Added.IDs() {
			if _, ok := pos[v]; !ok {
				continue
			}
			c := words.Thousands(pl.CostOf(v).String())
			d.printf("  %s%d [label=\"new\\n%s\", shape=%s, style=\"dashed,filled\", width=0.42, height=0.36, margin=\"0.02,0.02\", fillcolor=\"#FFFFFF\", color=%q, penwidth=1.6, tooltip=%s];\n",
				id, v, c, shape, col, dotTooltip("new "+kind+" of the cheapest completion on "+name(d.in.Net.Name(v))+", cost "+c))
			d.has["complete"] = true
			if k == 0 {
				d.has["input-new"] = true
			} else {
				d.has["output-new"] = true
			}
			out = append(out, completed{v, k == 1})
		}
	}
	return out
}

// signalNames names signals for a tooltip.
func (d *dotWriter) signalNames(output bool, sigs []int) string {
	parts := make([]string, len(sigs))
	for i, s := range sigs {
		parts[i] = d.in.signalName(output, s)
	}
	return strings.Join(parts, ", ")
}

// signalTip describes a signal for its tooltip.
func (d *dotWriter) signalTip(kind, verb string, states []int32) string {
	var b strings.Builder
	b.WriteString(kind)
	b.WriteByte(' ')
	b.WriteString(verb)
	b.WriteByte(' ')
	for i, s := range states {
		if i == 8 {
			fmt.Fprintf(&b, " and %d more", len(states)-8)
			break
		}
		if i > 0 {
			b.WriteString(", ")
		}
		b.WriteString(name(d.in.Net.Name(s)))
	}
	return b.String()
}

// clusters writes the group frames and the source-component frames. A
// source component of two or more states is framed inside its group's
// frame when all its states share a group, or on its own when no state has
// a group; otherwise it stays unframed (clusters must nest).
func (d *dotWriter) clusters(pos map[int32]int) {
	in, v := d.in, d.v
	c := in.Components
	src := c.Source
	// Source components among the drawn states, and their members.
	members := map[int32][]int32{}
	for _, s := range v.States {
		k := c.Of[s]
		if src[k] {
			members[k] = append(members[k], s)
		}
	}
	groupOf := func(int32) string { return "" }
	if in.Group != nil {
		groupOf = in.Group
	}
	type frame struct {
		comp   int32
		states []int32
	}
	byGroup := map[string][]frame{} // "" = no group
	for k, ms := range members {
		if len(ms) < 2 {
			continue
		}
		gr := groupOf(ms[0])
		same := true
		for _, s := range ms[1:] {
			if groupOf(s) != gr {
				same = false
				break
			}
		}
		if same {
			byGroup[gr] = append(byGroup[gr], frame{k, ms})
		}
	}
	for gr := range byGroup {
		fs := byGroup[gr]
		sort.Slice(fs, func(a, b int) bool { return fs[a].states[0] < fs[b].states[0] })
	}
	// Groups.
	groups := map[string][]int32{}
	if in.Group != nil {
		for _, s := range v.States {
			if gr := in.Group(s); gr != "" {
				groups[gr] = append(groups[gr], s)
			}
		}
	}
	names := make([]string, 0, len(groups))
	for gr := range groups {
		names = append(names, gr)
	}
	sort.Strings(names)
	srcFrame := func(indent string, f frame) {
		d.printf("%ssubgraph \"cluster_src%d\" {\n", indent, f.comp)
		d.printf("%s  label=\"source component\"; fontsize=12; fontcolor=%q; style=\"dashed,rounded\"; color=%q; penwidth=1.6;\n", indent, colPurple, colPurple)
		d.printf("%s ", indent)
		for _, s := range f.states {
			d.printf(" s%d;", s)
		}
		d.printf("\n%s}\n", indent)
		d.has["source"] = true
	}
	for gi, gr := range names {
		d.printf("  subgraph \"cluster_g%d\" {\n", gi)
		d.printf("    label=%s; fontsize=12; style=rounded; color=%q; penwidth=1.2;\n", dotPlain(name(gr)), colFrame)
		d.printf("   ")
		for _, s := range groups[gr] {
			d.printf(" s%d;", s)
		}
		d.printf("\n")
		for _, f := range byGroup[gr] {
			srcFrame("    ", f)
		}
		d.printf("  }\n")
		d.has["group"] = true
	}
	for _, f := range byGroup[""] {
		srcFrame("  ", f)
	}
}

// condensation writes a condensation view. A component of two or more
// states is labelled by what it is ("largest strongly connected
// component", with its counts); a component of one state by the state's
// name; a summary node by the kind and number of components it holds.
func (d *dotWriter) condensation() {
	in, v, g := d.in, d.v, d.in.Net
	d.has["component"] = true
	d.header()
	maxStates := 1
	for _, cn := range v.Comps {
		if cn.States > maxStates {
			maxStates = cn.States
		}
	}
	groups := map[string][]int{}
	for i, cn := range v.Comps {
		var lines, tip []string
		var facts []string
		if cn.Driven > 0 {
			facts = append(facts, num(cn.Driven)+" driven")
		}
		if cn.Sensed > 0 {
			facts = append(facts, num(cn.Sensed)+" sensed")
		}
		if cn.Unreached > 0 {
			facts = append(facts, num(cn.Unreached)+" unreached")
		}
		if cn.Unobserved > 0 {
			facts = append(facts, num(cn.Unobserved)+" unobserved")
		}
		counts := num(cn.States) + " " + plural(cn.States, "state", "states")
		if len(facts) > 0 {
			counts += ", " + strings.Join(facts, ", ")
		}
		switch {
		case cn.Component >= 0 && cn.States == 1:
			lines = append(lines, in.shownName(cn.First))
			tip = append(tip, "the state "+name(g.Name(cn.First))+", a component of its own")
			tip = append(tip, facts...)
		case cn.Component >= 0:
			// Whole words on each line: the rank, what it is, the counts.
			lines = append(lines, strings.TrimSuffix(rankName(cn.Rank), " strongly connected component"), "strongly connected component", counts)
			tip = append(tip, rankName(cn.Rank)+": "+counts, "includes "+name(g.Name(cn.First)))
		default:
			what := map[string]string{"source": "source", "sink": "sink", "other": "other"}[cn.Summary]
			lines = append(lines, fmt.Sprintf("%s more %s %s", num(cn.Components), what, plural(cn.Components, "component", "components")), counts)
			tip = append(tip, fmt.Sprintf("%s %s %s not drawn one by one: %s", num(cn.Components), what,
				plural(cn.Components, "component", "components"), counts))
			d.has["summary"] = true
		}
		attrs := []string{}
		shape, style := "box", "rounded,filled"
		if cn.Component < 0 {
			shape, style = "folder", "filled"
		}
		attrs = append(attrs, "shape="+shape)
		switch {
		case cn.Unreached > 0:
			attrs = append(attrs, fmt.Sprintf("fillcolor=%q", colYellow))
			d.has["unreached"] = true
		case cn.Unobserved > 0:
			attrs = append(attrs, fmt.Sprintf("fillcolor=%q", colGrey))
			d.has["unobserved"] = true
		case cn.Driven > 0:
			attrs = append(attrs, fmt.Sprintf("fillcolor=%q", colSky))
			d.has["driven"] = true
		}
		if cn.Source {
			style += ",dashed"
			attrs = append(attrs, fmt.Sprintf("color=%q", colPurple), "penwidth=2")
			tip = append(tip, "source: no edge enters it")
			d.has["source"] = true
		}
		if cn.Sensed > 0 {
			attrs = append(attrs, "peripheries=2")
			if !cn.Source {
				attrs = append(attrs, fmt.Sprintf("color=%q", colGreen), "penwidth=1.6")
			}
			d.has["sensed"] = true
		}
		attrs = append(attrs, fmt.Sprintf("style=%q", style))
		h := 0.3 + 1.2*math.Sqrt(float64(cn.States)/float64(maxStates))
		attrs = append(attrs, "height="+strconv.FormatFloat(h, 'f', 2, 64), "width="+strconv.FormatFloat(1.5*h, 'f', 2, 64))
		d.printf("  c%d [label=%s, tooltip=%s%s];\n", i, labelLines(lines), dotTooltip(strings.Join(tip, "; ")), joinAttrs(attrs))
		if cn.Group != "" {
			groups[cn.Group] = append(groups[cn.Group], i)
		}
	}
	names := make([]string, 0, len(groups))
	for gr := range groups {
		names = append(names, gr)
	}
	sort.Strings(names)
	for gi, gr := range names {
		d.printf("  subgraph \"cluster_g%d\" {\n", gi)
		d.printf("    label=%s; fontsize=12; style=rounded; color=%q; penwidth=1.2;\n   ", dotPlain(name(gr)), colFrame)
		for _, i := range groups[gr] {
			d.printf(" c%d;", i)
		}
		d.printf("\n  }\n")
		d.has["group"] = true
	}
	// Bundles are grey, their width growing with the count: the heavy
	// control colours stay for single stem and cycle edges.
	for _, e := range v.CompEdges {
		w := 0.8 + 0.9*math.Log10(float64(e.Count))
		if w > 5 {
			w = 5
		}
		tip := num(e.Count) + " " + plural(e.Count, "edge", "edges")
		if e.Stems > 0 {
			tip += ", " + num(e.Stems) + " on stems"
		}
		d.printf("  c%d -> c%d [penwidth=%s, tooltip=%s];\n", e.From, e.To, strconv.FormatFloat(w, 'f', 2, 64), dotTooltip(tip))
		d.has["bundle"] = true
	}
}

// rankName words what a component of two or more states is.
func rankName(rank int) string {
	s := "strongly connected component"
	switch rank {
	case 1:
		return "largest " + s
	case 2:
		return "2nd largest " + s
	case 3:
		return "3rd largest " + s
	}
	return ordinal(rank) + " largest " + s
}

func ordinal(n int) string {
	suffix := "th"
	switch {
	case n%100 >= 11 && n%100 <= 13:
	case n%10 == 1:
		suffix = "st"
	case n%10 == 2:
		suffix = "nd"
	case n%10 == 3:
		suffix = "rd"
	}
	return strconv.Itoa(n) + suffix
}

// Summary returns the numbers line of the title: states, edges, signals and
// unreached states.
func Summary(in *Input) string {
	g := in.Net
	parts := []string{num(g.N()) + " " + plural(g.N(), "state", "states"), num(g.Edges()) + " " + plural(g.Edges(), "edge", "edges")}
	in.prep()
	if k := len(in.inputs); k > 0 {
		parts = append(parts, num(k)+" "+pluralKind(k, in.inputKind()))
	}
	if k := len(in.outputs); k > 0 {
		parts = append(parts, num(k)+" "+pluralKind(k, in.outputKind()))
	}
	if k := len(in.unreached); k > 0 {
		parts = append(parts, num(k)+" unreached")
	}
	if k := len(in.dilation); k > 0 {
		parts = append(parts, "dilation set of "+num(k))
	}
	if k := len(in.unobserved); k > 0 {
		parts = append(parts, num(k)+" unobserved")
	}
	if k := len(in.obsDila); k > 0 {
		parts = append(parts, "observation dilation set of "+num(k))
	}
	return strings.Join(parts, " · ")
}

func pluralKind(n int, kind string) string {
	if n == 1 {
		return kind
	}
	return kind + "s"
}

func article(kind string) string {
	switch kind[0] {
	case 'a', 'e', 'i', 'o', 'u':
		return "an " + kind
	}
	return "a " + kind
}

// labelLines joins escaped lines into one quoted DOT label.
func labelLines(lines []string) string {
	var b strings.Builder
	b.WriteByte('"')
	for i, l := range lines {
		if i > 0 {
			b.WriteString(`\n`)
		}
		q := dotLabel(l)
		b.WriteString(q[1 : len(q)-1])
	}
	b.WriteByte('"')
	return b.String()
}

func joinAttrs(attrs []string) string {
	if len(attrs) == 0 {
		return ""
	}
	return ", " + strings.Join(attrs, ", ")
}

// num formats n with thousands separators.
func num(n int) string {
	s := strconv.Itoa(n)
	if n < 0 {
		return "-" + num(-n)
	}
	for i := len(s) - 3; i > 0; i -= 3 {
		s = s[:i] + "," + s[i:]
	}
	return s
}
