package render

import (
	"bufio"
	"fmt"
	"io"
	"math"
	"sort"
	"strconv"
	"strings"
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
	colEdge      = "#9A9A9A" // plain edges
	colFrame     = "#8A8A8A" // group frames
	fontName     = "Helvetica"
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
// (see Layouts; "auto" is resolved by ChooseLayout). The text names its
// layout engine in the graph's layout attribute, so Graphviz's own tools
// draw it the same way. Nodes, clusters and edges come in a fixed order
// (states ascending, edges in CSR order, groups by name), so the same input
// always gives the same text.
func DOT(w io.Writer, in *Input, v *View, layout string) error {
	layout, err := ChooseLayout(layout, v)
	if err != nil {
		return err
	}
	eng, err := engine(layout)
	if err != nil {
		return err
	}
	bw := bufio.NewWriter(w)
	d := &dotWriter{w: bw, in: in, v: v, eng: eng}
	if v.Kind == Condensation {
		d.condensation()
	} else {
		d.states()
	}
	return bw.Flush()
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
	d.printf("  node [fontname=%q, fontsize=10, shape=ellipse, style=filled, fillcolor=\"#FFFFFF\", color=%q, fontcolor=%q, penwidth=1, height=0.3, margin=\"0.06,0.03\"];\n", fontName, colInk, colInk)
	d.printf("  edge [color=%q, penwidth=0.8, arrowsize=0.6];\n", colEdge)
}

// states writes a view of individual states.
func (d *dotWriter) states() {
	in, v, g := d.in, d.v, d.in.Net
	d.has = map[string]bool{}
	d.header()
	pos := make(map[int32]int, len(v.States))
	for i, s := range v.States {
		pos[s] = i
	}
	// Signals that touch a drawn state.
	drivenBy := map[int32][]int{}
	sensedBy := map[int32][]int{}
	var inSig, outSig []int
	for i, sig := range in.Inputs {
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
	for i, sig := range in.Outputs {
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
	for _, s := range in.Unreached {
		unreached[s] = true
	}
	dilation := map[int32]bool{}
	for _, s := range in.Dilation {
		dilation[s] = true
	}
	unobserved := map[int32]bool{}
	for _, s := range in.Unobserved {
		unobserved[s] = true
	}
	obsDilation := map[int32]bool{}
	for _, s := range in.ObservationDilation {
		obsDilation[s] = true
	}

	// Nodes.
	for i, s := range v.States {
		name := g.Name(s)
		shown := name
		if in.Label != nil {
			if l := in.Label(s); l != "" {
				shown = l
			}
		}
		lines := []string{shown}
		var tip []string
		tip = append(tip, name)
		if shown != name {
			tip[0] = shown + " (" + name + ")"
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
			tip = append(tip, "driven by "+signalNames("u", sigs))
		}
		if sigs := sensedBy[s]; len(sigs) > 0 {
			attrs = append(attrs, "peripheries=2", fmt.Sprintf("color=%q", colGreen), "penwidth=1.6")
			tip = append(tip, "sensed by "+signalNames("y", sigs))
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
				tip = append(tip, "group: "+gr)
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
	// Signal nodes.
	for _, i := range inSig {
		d.printf("  u%d [label=\"u%d\", shape=circle, fixedsize=true, width=0.42, fillcolor=%q, color=%q, tooltip=%s];\n",
			i+1, i+1, colOrange, colInk, dotTooltip(d.signalTip(in.inputKind(), "drives", in.Inputs[i])))
		d.has["input"] = true
	}
	for _, i := range outSig {
		d.printf("  y%d [label=\"y%d\", shape=box, fixedsize=true, width=0.42, height=0.3, fillcolor=%q, color=%q, fontcolor=\"#FFFFFF\", tooltip=%s];\n",
			i+1, i+1, colGreen, colInk, dotTooltip(d.signalTip(in.outputKind(), "senses", in.Outputs[i])))
		d.has["output"] = true
	}
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
		for _, s := range in.Inputs[i] {
			if _, ok := pos[s]; ok {
				d.printf("  u%d -> s%d [color=%q, penwidth=1.6, style=dashed];\n", i+1, s, colOrange)
			}
		}
	}
	for _, i := range outSig {
		for _, s := range in.Outputs[i] {
			if _, ok := pos[s]; ok {
				d.printf("  s%d -> y%d [color=%q, penwidth=1.6, style=dotted];\n", s, i+1, colGreen)
			}
		}
	}
	d.title(len(v.Edges))
	d.printf("}\n")
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
		b.WriteString(d.in.Net.Name(s))
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
		d.printf("%s  label=\"source component\"; fontsize=9; fontcolor=%q; style=\"dashed,rounded\"; color=%q; penwidth=1.6;\n", indent, colPurple, colPurple)
		d.printf("%s ", indent)
		for _, s := range f.states {
			d.printf(" s%d;", s)
		}
		d.printf("\n%s}\n", indent)
		d.has["source"] = true
	}
	for gi, gr := range names {
		d.printf("  subgraph \"cluster_g%d\" {\n", gi)
		d.printf("    label=%s; fontsize=11; style=rounded; color=%q; penwidth=1.2;\n", dotPlain(gr), colFrame)
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

// condensation writes a condensation view.
func (d *dotWriter) condensation() {
	in, v, g := d.in, d.v, d.in.Net
	d.has = map[string]bool{"component": true}
	d.header()
	maxStates := 1
	for _, cn := range v.Comps {
		if cn.States > maxStates {
			maxStates = cn.States
		}
	}
	groups := map[string][]int{}
	for i, cn := range v.Comps {
		var lines []string
		var tip []string
		if cn.Component >= 0 {
			name := g.Name(cn.First)
			if in.Label != nil {
				if l := in.Label(cn.First); l != "" {
					name = l
				}
			}
			if cn.States == 1 {
				lines = append(lines, name)
				tip = append(tip, name)
			} else {
				lines = append(lines, name, fmt.Sprintf("and %s more: %s states", num(cn.States-1), num(cn.States)))
				tip = append(tip, fmt.Sprintf("strongly connected component of %s states, among them %s", num(cn.States), name))
			}
		} else {
			what := map[string]string{"source": "source", "sink": "sink", "other": "other"}[cn.Summary]
			lines = append(lines, fmt.Sprintf("%s %s %s", num(cn.Components), what, plural(cn.Components, "component", "components")),
				fmt.Sprintf("%s %s", num(cn.States), plural(cn.States, "state", "states")))
			tip = append(tip, fmt.Sprintf("%s %s %s not drawn one by one, %s %s in all", num(cn.Components), what,
				plural(cn.Components, "component", "components"), num(cn.States), plural(cn.States, "state", "states")))
			d.has["summary"] = true
		}
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
		if len(facts) > 0 && (cn.States > 1 || cn.Component < 0) {
			lines = append(lines, strings.Join(facts, ", "))
		}
		tip = append(tip, facts...)
		attrs := []string{}
		shape := "box"
		if cn.Component < 0 {
			shape = "folder"
		}
		attrs = append(attrs, "shape="+shape)
		style := "rounded,filled"
		if shape == "folder" {
			style = "filled"
		}
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
		d.printf("    label=%s; fontsize=11; style=rounded; color=%q; penwidth=1.2;\n   ", dotPlain(gr), colFrame)
		for _, i := range groups[gr] {
			d.printf(" c%d;", i)
		}
		d.printf("\n  }\n")
		d.has["group"] = true
	}
	for _, e := range v.CompEdges {
		w := 0.8 + 0.9*math.Log10(float64(e.Count))
		if w > 5 {
			w = 5
		}
		col := colEdge
		if e.Control {
			col = colBlue
			w += 1.2
			d.has["stem"] = true
		} else {
			d.has["edge"] = true
		}
		d.printf("  c%d -> c%d [color=%q, penwidth=%s, tooltip=\"%s %s\"];\n", e.From, e.To, col,
			strconv.FormatFloat(w, 'f', 2, 64), num(e.Count), plural(e.Count, "edge", "edges"))
	}
	d.title(len(v.CompEdges))
	d.printf("}\n")
}

// title writes the graph label: title, summary numbers, notes, the view,
// and the legend of what the picture holds.
func (d *dotWriter) title(drawn int) {
	in, v := d.in, d.v
	var b strings.Builder
	b.WriteString(`<<table border="0" cellborder="0" cellspacing="1" cellpadding="1">`)
	row := func(content string) {
		b.WriteString(`<tr><td align="left" balign="left">` + content + `</td></tr>`)
	}
	title := in.Title
	if title == "" {
		title = "network"
	}
	row(`<font point-size="16"><b>` + htmlText(title) + `</b></font>`)
	row(`<font point-size="12">` + htmlText(Summary(in)) + `</font>`)
	for _, note := range in.Notes {
		row(`<font point-size="12">` + htmlText(note) + `</font>`)
	}
	desc := v.Desc
	total := v.EdgesTotal
	if drawn < total {
		desc += fmt.Sprintf("; %s of %s edges drawn (limit), those carrying control first", num(drawn), num(total))
	}
	row(`<font point-size="10" color="#555555">view: ` + htmlText(desc) + `</font>`)
	b.WriteString(`<tr><td align="left">`)
	d.legend(&b)
	b.WriteString(`</td></tr></table>>`)
	d.printf("  label=%s;\n", b.String())
}

// Summary returns the numbers line of the title: states, edges, signals and
// unreached states.
func Summary(in *Input) string {
	g := in.Net
	parts := []string{num(g.N()) + " " + plural(g.N(), "state", "states"), num(g.Edges()) + " " + plural(g.Edges(), "edge", "edges")}
	if k := len(in.Inputs); k > 0 {
		parts = append(parts, num(k)+" "+pluralKind(k, in.inputKind()))
	}
	if k := len(in.Outputs); k > 0 {
		parts = append(parts, num(k)+" "+pluralKind(k, in.outputKind()))
	}
	if k := len(in.Unreached); k > 0 {
		parts = append(parts, num(k)+" unreached")
	}
	if k := len(in.Dilation); k > 0 {
		parts = append(parts, "dilation set of "+num(k))
	}
	if k := len(in.Unobserved); k > 0 {
		parts = append(parts, num(k)+" unobserved")
	}
	if k := len(in.ObservationDilation); k > 0 {
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

// legend writes the legend as nested table rows, four entries a row, with
// only the entries the picture uses.
func (d *dotWriter) legend(b *strings.Builder) {
	type entry struct{ swatch, text string }
	var es []entry
	box := func(fill, border, style string) string {
		s := fmt.Sprintf(`<td width="22" height="13" fixedsize="true" bgcolor="%s" color="%s" border="1"`, fill, border)
		if style != "" {
			s += ` style="` + style + `"`
		}
		return s + `></td>`
	}
	line := func(col string, h int) string {
		return fmt.Sprintf(`<td width="24" height="%d" fixedsize="true" bgcolor="%s"></td>`, h, col)
	}
	in := d.in
	if d.has["input"] {
		es = append(es, entry{box(colOrange, colInk, ""), in.inputKind() + " signal u1, u2, … (dashed arrows)"})
	}
	if d.has["driven"] {
		what := "state driven by " + article(in.inputKind())
		if d.v.Kind == Condensation {
			what = "holds states driven by " + in.inputKind() + "s"
		}
		es = append(es, entry{box(colSky, colInk, ""), what})
	}
	if d.has["output"] {
		es = append(es, entry{box(colGreen, colInk, ""), in.outputKind() + " signal y1, y2, … (dotted arrows)"})
	}
	if d.has["sensed"] {
		what := "sensed by " + article(in.outputKind()) + " (double green outline)"
		if d.v.Kind == Condensation {
			what = "holds sensed states (double outline)"
		}
		es = append(es, entry{box("#FFFFFF", colGreen, ""), what})
	}
	if d.has["unreached"] {
		what := "unreached: no input reaches it"
		if d.v.Kind == Condensation {
			what = "holds unreached states"
		}
		es = append(es, entry{box(colYellow, colInk, "dashed"), what})
	}
	if d.has["unobserved"] {
		what := "unobserved: no " + in.outputKind() + " sees it"
		if d.v.Kind == Condensation {
			what = "holds unobserved states"
		}
		es = append(es, entry{box(colGrey, colInk, "dotted"), what})
	}
	if d.has["dilation"] {
		es = append(es, entry{box(colTint, colVermilion, ""), "dilation set: too few in-neighbours"})
	}
	if d.has["stem"] {
		es = append(es, entry{line(colBlue, 4), "stem: matched edges from an input"})
	}
	if d.has["cycle"] {
		es = append(es, entry{line(colVermilion, 4), "cycle of matched edges"})
	}
	if d.has["edge"] {
		es = append(es, entry{line(colEdge, 1), "other edge (u acts on v)"})
	}
	if d.has["source"] {
		es = append(es, entry{box("#FFFFFF", colPurple, "dashed"), "source component: no edge enters it"})
	}
	if d.has["group"] {
		es = append(es, entry{box("#FFFFFF", colFrame, ""), "group (node table)"})
	}
	if d.has["component"] {
		es = append(es, entry{box("#FFFFFF", colInk, ""), "strongly connected component (size: states)"})
	}
	if d.has["summary"] {
		es = append(es, entry{box("#FFFFFF", colInk, ""), "folder: components summarised"})
	}
	for _, r := range []string{"critical", "intermittent", "redundant"} {
		if d.has["role-"+r] {
			es = append(es, entry{`<td>` + map[string]string{"critical": "box", "intermittent": "octagon", "redundant": "ellipse"}[r] + `</td>`,
				"role " + r})
		}
	}
	if d.has["hidden"] {
		es = append(es, entry{`<td>+k</td>`, "links to states not drawn"})
	}
	b.WriteString(`<table border="0" cellborder="0" cellspacing="3" cellpadding="1">`)
	for i := 0; i < len(es); i += 4 {
		b.WriteString(`<tr>`)
		for j := i; j < i+4 && j < len(es); j++ {
			b.WriteString(es[j].swatch)
			b.WriteString(`<td align="left"><font point-size="10">` + htmlText(es[j].text) + `</font></td><td width="10"></td>`)
		}
		b.WriteString(`</tr>`)
	}
	b.WriteString(`</table>`)
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

func signalNames(prefix string, sigs []int) string {
	parts := make([]string, len(sigs))
	for i, s := range sigs {
		parts[i] = prefix + strconv.Itoa(s+1)
	}
	return strings.Join(parts, ", ")
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
