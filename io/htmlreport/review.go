package htmlreport

import (
	"fmt"
	"io"
	"runtime/debug"
	"slices"
	"strconv"
	"strings"

	"github.com/netsteer/netsteer/io/internal/words"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/analysis"
	"github.com/netsteer/netsteer/structural/numeric"
	"github.com/netsteer/netsteer/structural/placement"
	"github.com/netsteer/netsteer/structural/strong"
)

// maxTableRows bounds the rows of one table on the page.
const maxTableRows = 300

// Cautions close every review page.
var Cautions = []string{
	"Structural results hold for almost all values of the free parameters, not for every one: a design that is structurally controllable can still be uncontrollable, or nearly so, for the particular numbers of a real plant.",
	"Use them as a screening step. They do not replace dynamic studies, safety analysis, local codes and standards, or review by a licensed engineer.",
	"The network is only as good as the wiring it was given: a missing or wrong edge can change every answer on this page.",
}

// Context is what a page says beside the analysis: the question as asked,
// names, pictures and provenance.
type Context struct {
	// Title names what is reviewed; Network names the network file.
	Title, Network string
	// InputsFile and OutputsFile name the designs judged ("" for none);
	// Inputs and Outputs are those designs.
	InputsFile, OutputsFile string
	Inputs, Outputs         *structural.Design
	// Costed says the costs come from a node table (else every device
	// costs 1).
	Costed bool
	// Label gives a state's node-table label ("" for none); nil for none.
	Label func(v int32) string
	// Pictures are drawn in order; the first is the main one.
	Pictures []Picture
	// PictureError replaces the pictures when none could be drawn.
	PictureError string
	// Numeric is the numeric check, nil when not asked.
	Numeric *Numeric
	// Files, Build, Command and Generated are the provenance.
	Files     []File
	Build     Build
	Command   []string
	Generated string
}

// Numeric is the outcome of the numeric check for the page: the sampled
// dimensions beside the structural ones, or why it was not run.
type Numeric struct {
	// NotRun says why the check did not run ("" when it ran).
	NotRun string
	// What names the design checked, Seed and Trials the samples, Prime
	// the field.
	What          string
	Seed          uint64
	Trials        int
	Prime         uint64
	Rows          []NumericRow
	StatesChecked int
}

// NumericRow is one property's sampled dimension against the structural
// one.
type NumericRow struct {
	Property            string
	Signals             int
	Structural, Sampled int
	Margin              string
}

// Build names the program that wrote the page.
type Build struct {
	Module, Version, Revision, Time string
	Modified                        bool
}

// ReadBuild reads the running program's build information: module
// version, VCS revision and whether the tree was modified.
func ReadBuild() Build {
	b := Build{Version: "(unknown)"}
	bi, ok := debug.ReadBuildInfo()
	if !ok {
		return b
	}
	b.Module, b.Version = bi.Main.Path, bi.Main.Version
	for _, s := range bi.Settings {
		switch s.Key {
		case "vcs.revision":
			b.Revision = s.Value
		case "vcs.modified":
			b.Modified = s.Value == "true"
		case "vcs.time":
			b.Time = s.Value
		}
	}
	return b
}

// String words the build for the page.
func (b Build) String() string {
	s := strings.TrimSpace(b.Module + " " + b.Version)
	switch {
	case b.Revision == "":
		s += ", VCS revision not recorded in the build"
	case b.Modified:
		s += ", revision " + b.Revision + " with uncommitted changes (dirty)"
	default:
		s += ", revision " + b.Revision + " (clean)"
	}
	if b.Time != "" {
		s += ", committed " + b.Time
	}
	return s
}

// builder builds the tables and cards of a review.
type builder struct {
	rv *analysis.Review
	c  *Context
	g  *structural.Network
}

// label is how a state is named on the page: its label with the name
// beside it, or the name, with characters that could hide or reorder
// text escaped as the text reports escape them.
func (p *builder) label(v int32) string {
	n := words.Escape(p.g.Name(v))
	if p.c.Label != nil {
		if l := p.c.Label(v); l != "" {
			return words.Escape(l) + " (" + n + ")"
		}
	}
	return n
}

func (p *builder) names(s structural.States) string {
	ids := s.IDs()
	var parts []string
	for i, v := range ids {
		if i == 50 {
			parts = append(parts, fmt.Sprintf("and %s more", num(len(ids)-50)))
			break
		}
		parts = append(parts, p.label(v))
	}
	if len(parts) == 0 {
		return "none"
	}
	return strings.Join(parts, ", ")
}

func (p *builder) cost(c structural.Cost) string { return words.Thousands(c.String()) }

// FromReview builds the review page of rv. The first screen answers the
// questions asked, in their words: whether the given designs hold, or
// where the cheapest devices go when no design is given; the network's
// own figures follow as a reference card, and nothing is answered that
// was not asked.
func FromReview(rv *analysis.Review, c Context) *Review {
	p := &builder{rv: rv, c: &c, g: rv.Network()}
	r := &Review{Title: c.Title, Files: c.Files, Tool: c.Build.String(), Options: c.Command, Generated: c.Generated, Cautions: Cautions}
	net := words.Escape(c.Network)
	if cr := rv.Check; cr != nil {
		if pr := cr.Controllability; pr != nil {
			q := fmt.Sprintf("Is %s structurally controllable from the inputs in %s?", net, words.Escape(c.InputsFile))
			r.Answers = append(r.Answers, p.verdictCard(q, pr, c.Inputs))
		}
		if pr := cr.Observability; pr != nil {
			q := fmt.Sprintf("Is %s structurally observable from the outputs in %s?", net, words.Escape(c.OutputsFile))
			r.Answers = append(r.Answers, p.verdictCard(q, pr, c.Outputs))
		}
	}
	if cr := rv.Check; cr != nil {
		for _, pr := range cr.Properties() {
			if pr.Strong != nil {
				r.Answers = append(r.Answers, p.strongCard(net, pr))
				if !slices.Contains(r.Cautions, strong.Caution) {
					r.Cautions = append(slices.Clip(r.Cautions), strong.Caution)
				}
			}
		}
	}
	for _, x := range []struct {
		pl  *analysis.PlaceResult
		adj string
	}{{rv.Actuators, "controllable"}, {rv.Sensors, "observable"}} {
		if x.pl == nil {
			continue
		}
		q := fmt.Sprintf("Where must dedicated %ss go, at least cost, for %s to be structurally %s?", x.pl.Device, net, x.adj)
		r.Answers = append(r.Answers, p.placeCard(q, x.pl))
	}
	// Each card asks its own question, in the words of the command line.
	if n := c.Numeric; n != nil {
		r.Answers = append(r.Answers, p.numericCard(n))
		r.Numeric = p.numericTable(n)
	}
	d := rv.Drivers
	r.Answers = append(r.Answers, Answer{
		Topic:    "For reference: the network",
		Headline: fmt.Sprintf("%s, %s; at least %s independent control %s (N_D).", words.Count(rv.Nodes, "state", "states"), words.Count(rv.Edges, "edge", "edges"), num(d.DriverCount), words.Plural(d.DriverCount, "signal", "signals")),
		Facts: []Fact{
			{"States", num(rv.Nodes)},
			{"Edges", fmt.Sprintf("%s (%s, %s merged)", num(rv.Edges), words.Count(rv.SelfLoops, "self-loop", "self-loops"), words.Count(rv.DuplicatesMerged, "repeat", "repeats"))},
			{"Driver nodes N_D", fmt.Sprintf("%s (fraction %.4f)", num(d.DriverCount), d.DriverFraction)},
		},
	})
	for i, pic := range c.Pictures {
		if i == 0 {
			r.Picture, r.PictureNote = pic.SVG, pic.Note
			continue
		}
		r.More = append(r.More, pic)
	}
	r.PictureError = c.PictureError
	p.findings(r)
	p.tables(r)
	return r
}

// verdictCard answers "is it controllable (observable) from this design?".
func (p *builder) verdictCard(q string, pr *analysis.PropertyResult, d *structural.Design) Answer {
	v := pr.Verdict
	obs := v.Property == structural.Observability
	sig, missed, adj := "input", "unreached", "controllable"
	if obs {
		sig, missed, adj = "output", "unobserved", "observable"
	}
	a := Answer{Topic: q}
	if v.Holds {
		a.OK, a.Word = Yes(), "Yes"
		a.Headline = fmt.Sprintf("Structurally %s from %s.", adj, words.Count(v.Signals, sig, sig+"s"))
	} else {
		a.OK, a.Word = No(), "No"
		var why []string
		if k := v.Unreached.Len(); k > 0 {
			why = append(why, words.Count(k, "state", "states")+" "+missed)
		}
		if k := v.Deficiency(); k > 0 {
			why = append(why, fmt.Sprintf("a dilation: at least %s more %s needed", num(k), words.Plural(k, sig, sig+"s")))
		}
		a.Headline = "Not structurally " + adj + ": " + strings.Join(why, "; ") + "."
	}
	a.Facts = []Fact{
		{capital(sig) + "s", num(v.Signals)},
		{"States " + missed, num(v.Unreached.Len())},
		{capital(sig) + "s missing (at least)", num(v.Deficiency())},
		{capital(adj) + " dimension", fmt.Sprintf("%s of %s", num(v.Dimension), num(p.rv.Nodes))},
	}
	if cp := pr.Completion; cp != nil && cp.Feasible && !v.Holds {
		dev := "actuator"
		if obs {
			dev = "sensor"
		}
		a.Facts = append(a.Facts, Fact{"Cheapest completion", fmt.Sprintf("add %s (cost %s)", words.Count(cp.Added.Len(), dev, dev+"s"), p.cost(cp.Cost))})
	}
	return a
}

// placeCard answers "where must the cheapest dedicated devices go?".
func (p *builder) placeCard(q string, pl *analysis.PlaceResult) Answer {
	a := Answer{Topic: q}
	dev := pl.Device
	if !pl.Feasible {
		a.OK, a.Word = No(), "Nowhere allowed"
		a.Headline = fmt.Sprintf("No placement of dedicated %ss the node table allows can succeed; see why below.", dev)
		return a
	}
	a.Word = fmt.Sprintf("%s %s", num(pl.DeviceCount), words.Plural(pl.DeviceCount, dev, dev+"s"))
	a.Headline = fmt.Sprintf("%s in place, %s new at a total cost of %s: see the %ss table.",
		num(pl.Existing.Len()), num(pl.Added.Len()), p.cost(pl.Cost), dev)
	forced := 0
	for _, r := range pl.Roles {
		if r.Forced {
			forced++
		}
	}
	a.Facts = []Fact{
		{capital(dev) + "s", num(pl.DeviceCount)},
		{"New", num(pl.Added.Len())},
		{"Total cost of new", p.cost(pl.Cost)},
	}
	if pl.Roles != nil {
		a.Facts = append(a.Facts, Fact{"Forced (in every cheapest set)", num(forced)})
	}
	return a
}

// numericCard says whether the sampled numbers confirm the structural
// answer: a failing design whose sample falls short by as much is
// confirmed, not a "No".
func (p *builder) numericCard(n *Numeric) Answer {
	a := Answer{Topic: "Do sampled numbers confirm the structural answer?"}
	if n.NotRun != "" {
		a.Word, a.Headline = "Not run", n.NotRun
		return a
	}
	ok := true
	var parts []string
	for _, r := range n.Rows {
		ok = ok && r.Sampled == r.Structural
		parts = append(parts, fmt.Sprintf("%s %s of %s", r.Property, num(r.Sampled), num(n.StatesChecked)))
	}
	if ok {
		a.OK, a.Word = Yes(), "Confirmed"
		a.Headline = capital(strings.Join(parts, ", ")) + ", as the structure predicts."
	} else {
		a.OK, a.Word = No(), "Not confirmed"
		a.Headline = capital(strings.Join(parts, ", ")) + ": the sampled dimension falls short of the structural one; see the numeric check."
	}
	a.Facts = []Fact{{"Design checked", n.What}, {"Seed", strconv.FormatUint(n.Seed, 10)}, {"Trials", num(n.Trials)}}
	return a
}

func (p *builder) numericTable(n *Numeric) *Table {
	t := &Table{ID: "numeric", Title: "Numeric check"}
	if n.NotRun != "" {
		t.Intro = "Not run: " + n.NotRun
		return t
	}
	t.Intro = fmt.Sprintf("Random nonzero values were drawn for every structural nonzero of A, B and C (seed %d, %s) for %s, and the dimensions of the controllable and observable subspaces of each sample computed exactly over GF(p), p = %d. A sample never exceeds the structural (generic) dimension and falls short of it with probability at most n²/(p-1) per trial (Schwartz–Zippel). The margin is the smallest singular value of [A - λI, B] over the eigenvalues λ of A relative to the norm of [A B] (floating point).",
		n.Seed, words.Count(n.Trials, "trial", "trials"), n.What, n.Prime)
	t.Columns = []string{"Property", "Signals", "Structural dimension", "Sampled dimension", "Confirms", "Smallest margin"}
	for _, r := range n.Rows {
		conf := "yes"
		if r.Sampled != r.Structural {
			conf = "no"
		}
		t.Rows = append(t.Rows, []string{r.Property, num(r.Signals), num(r.Structural), num(r.Sampled), conf, r.Margin})
	}
	return t
}

// findings are the witnesses of failing designs and infeasible
// placements, and the completions.
func (p *builder) findings(r *Review) {
	if cr := p.rv.Check; cr != nil {
		for _, pr := range cr.Properties() {
			v := pr.Verdict
			if v.Holds {
				continue
			}
			obs := v.Property == structural.Observability
			if v.Unreached.Len() > 0 {
				title, intro := "Unreached states", "No input reaches these states, directly or downstream: each needs an input on it or upstream of it."
				if obs {
					title, intro = "Unobserved states", "No output sees these states: none of them acts, directly or through others, on a sensed state. Each needs a sensor on it or downstream of it."
				}
				r.Findings = append(r.Findings, p.stateTable(title, intro, v.Unreached))
			}
			if d := v.Dilation; d != nil {
				sig, nb, title := "input", "States acting on S", "Dilation"
				design := p.c.Inputs
				if obs {
					sig, nb, title, design = "output", "States S acts on", "Observation dilation", p.c.Outputs
				}
				k := d.Neighbours.Len() + len(d.Signals)
				r.Findings = append(r.Findings, Table{
					Title: title,
					Intro: fmt.Sprintf("These %s are %s by only %s together: one fewer than they need. One more %s on one of them removes this deficit; at least %s in all.",
						words.Count(d.States.Len(), "state", "states"), map[bool]string{false: "acted on", true: "read through"}[obs],
						words.Count(k, "state or "+sig, "states and "+sig+"s"), sig, words.Count(v.Deficiency(), "more "+sig+" is needed", "more "+sig+"s are needed")),
					Columns: []string{"Set", "Members"},
					Rows: [][]string{
						{"States (S)", p.names(d.States)},
						{nb, p.names(d.Neighbours)},
						{capital(sig) + "s acting on S", p.signalList(obs, d.Signals, design)},
					},
				})
			}
			if cp := pr.Completion; cp != nil {
				r.Findings = append(r.Findings, p.completionTable(cp, obs))
			}
		}
	}
	for _, pl := range []*analysis.PlaceResult{p.rv.Actuators, p.rv.Sensors} {
		if pl == nil || pl.Feasible {
			continue
		}
		t := Table{Title: "Why no " + pl.Device + " placement succeeds", Columns: []string{"Problem", "States"}}
		for _, comp := range pl.Unreached {
			t.Rows = append(t.Rows, []string{"component no allowed state can reach", p.names(comp)})
		}
		if pl.Unmatchable.Len() > 0 {
			t.Rows = append(t.Rows, []string{fmt.Sprintf("dilation only forbidden states could remove (%s short)", num(pl.Deficit)), p.names(pl.Unmatchable)})
		}
		r.Findings = append(r.Findings, t)
	}
}

// signalName names signal i of a design as the picture does.
func signalName(obs bool, d *structural.Design, i int) string {
	pre := "u"
	if obs {
		pre = "y"
	}
	if d == nil {
		return pre + strconv.Itoa(i+1)
	}
	return pre + strconv.Itoa(d.Number(i))
}

func (p *builder) signalList(obs bool, sigs []int, d *structural.Design) string {
	var parts []string
	for _, i := range sigs {
		parts = append(parts, signalName(obs, d, i))
	}
	if len(parts) == 0 {
		return "none"
	}
	return strings.Join(parts, ", ")
}

func (p *builder) stateTable(title, intro string, s structural.States) Table {
	t := Table{Title: title, Intro: intro, Columns: []string{"State"}}
	for i, v := range s.IDs() {
		if i == maxTableRows {
			t.More = s.Len() - maxTableRows
			break
		}
		t.Rows = append(t.Rows, []string{p.label(v)})
	}
	return t
}

func (p *builder) completionTable(cp *placement.Placement, obs bool) Table {
	dev, adj := "actuator", "controllable"
	if obs {
		dev, adj = "sensor", "observable"
	}
	t := Table{Title: "Cheapest completion by dedicated " + dev + "s", Columns: []string{"New " + dev + " on", "Cost"}}
	if !cp.Feasible {
		t.Intro = fmt.Sprintf("No set of dedicated %ss makes the design structurally %s under the restrictions of the node table.", dev, adj)
		return t
	}
	t.Intro = fmt.Sprintf("Adding these %s, at a total cost of %s, makes the design structurally %s (a cheapest such set; others of equal cost may exist). The picture draws them hollow and dashed.",
		words.Count(cp.Added.Len(), dev, dev+"s"), p.cost(cp.Cost), adj)
	for i, v := range cp.Added.IDs() {
		if i == maxTableRows {
			t.More = cp.Added.Len() - maxTableRows
			break
		}
		t.Rows = append(t.Rows, []string{p.label(v), p.cost(cp.CostOf(v))})
	}
	return t
}

// tables are the designs, placements and driver nodes.
func (p *builder) tables(r *Review) {
	if d := p.c.Inputs; d != nil {
		r.Tables = append(r.Tables, p.designTable("inputs", "Inputs", false, *d))
	}
	if d := p.c.Outputs; d != nil {
		r.Tables = append(r.Tables, p.designTable("outputs", "Outputs", true, *d))
	}
	for _, pl := range []*analysis.PlaceResult{p.rv.Actuators, p.rv.Sensors} {
		if pl != nil && pl.Feasible {
			r.Tables = append(r.Tables, p.placementTable(pl))
		}
	}
	r.Tables = append(r.Tables, p.driverTable())
}

func (p *builder) designTable(id, title string, obs bool, d structural.Design) Table {
	verb := "drives"
	if obs {
		verb = "senses"
	}
	t := Table{ID: id, Title: title, Intro: "Signals are numbered by their line in the design file, here and in the picture.",
		Columns: []string{"Signal", "States it " + verb}}
	for i := 0; i < d.Len(); i++ {
		if i == maxTableRows {
			t.More = d.Len() - maxTableRows
			break
		}
		t.Rows = append(t.Rows, []string{signalName(obs, &d, i), p.names(p.g.States(d.Signal(i)))})
	}
	return t
}

func (p *builder) placementTable(pl *analysis.PlaceResult) Table {
	dev := pl.Device
	t := Table{ID: dev + "s", Title: capital(dev) + "s",
		Intro:   fmt.Sprintf("The cheapest set of dedicated %ss, one state each, numbered as in the picture. Forced: every cheapest set has it. Alternatives: states that could take its place alone at the same cost.", dev),
		Columns: []string{"Signal", "State", "Status", "Cost"}}
	roles := map[int32]placement.DeviceRole{}
	if pl.Roles != nil {
		t.Columns = append(t.Columns, "Forced", "Alternatives")
		for _, r := range pl.Roles {
			roles[r.State] = r
		}
	}
	obs := pl.Property == structural.Observability
	for i, v := range pl.Devices.IDs() {
		if i == maxTableRows {
			t.More = pl.Devices.Len() - maxTableRows
			break
		}
		status, cost := "in place", "0"
		if pl.IsAdded(v) {
			status, cost = "new", p.cost(pl.CostOf(v))
		}
		row := []string{signalName(obs, nil, i), p.label(v), status, cost}
		if pl.Roles != nil {
			forced, alts := "", ""
			if r, ok := roles[v]; ok {
				forced = map[bool]string{true: "yes", false: "no"}[r.Forced]
				alts = p.names(r.Alternatives)
				if r.More {
					alts += ", …"
				}
				if !r.Forced && r.Alternatives.Len() == 0 {
					alts = "(moves only together with others)"
				}
			}
			row = append(row, forced, alts)
		}
		t.Rows = append(t.Rows, row)
	}
	if pl.Devices.Len() == 0 {
		t.Note = "None needed."
	}
	return t
}

func (p *builder) driverTable() Table {
	d := p.rv.Drivers
	t := Table{ID: "drivers", Title: "For reference: driver nodes",
		Intro:   fmt.Sprintf("A minimum set of independent control signals, N_D = max(N - |M*|, 1) = %s (Liu, Slotine & Barabási 2011): each drives its driver node; states of source components that hold no driver are wired to one of them.", num(d.DriverCount)),
		Columns: []string{"Driver", "Driver node", "Also wired to"}}
	roles := d.NodeRoles
	if roles != nil {
		t.Intro += " Role: across all minimum driver sets (Jia et al. 2013): critical in every one, intermittent in some."
		t.Columns = []string{"Driver", "Driver node", "Role", "Also wired to"}
	}
	for i := 0; i < d.Inputs.Len(); i++ {
		if i == maxTableRows {
			t.More = d.Inputs.Len() - maxTableRows
			break
		}
		sig := d.Inputs.Signal(i)
		// The picture draws the driver set when nothing else is drawn:
		// then its signals are u1, u2, ... there and here.
		id := "driver " + strconv.Itoa(i+1)
		if p.c.Inputs == nil && p.rv.Actuators == nil {
			id = "u" + strconv.Itoa(d.Inputs.Number(i))
		}
		row := []string{id, p.label(sig[0])}
		if roles != nil {
			row = append(row, roles.Of[sig[0]].String())
		}
		row = append(row, p.names(p.g.States(sig[1:])))
		t.Rows = append(t.Rows, row)
	}
	return t
}

func capital(s string) string {
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}

// num formats n with thousands separators.
func num(n int) string {
	if n < 0 {
		return "-" + num(-n)
	}
	s := strconv.Itoa(n)
	for i := len(s) - 3; i > 0; i -= 3 {
		s = s[:i] + "," + s[i:]
	}
	return s
}

// File describes an input: what it is for, its name, and the size and
// SHA-256 of the bytes the analysis read (taken while reading, so
// standard input and FIFOs are covered and a file changed afterwards is
// not certified with its new content).
type File struct {
	Role, Name, Size, SHA256 string
}

// WriteSummary writes what a terminal shows after the page is written:
// the file, then per card the question and, indented below it, the
// answer word and the headline, wrapped to width columns without breaking
// a name.
func WriteSummary(w io.Writer, file, network string, r *Review, width int) error {
	var b strings.Builder
	b.WriteString(words.Wrap(file+": review of "+words.Quote(network)+".", width, "", "  "))
	for _, a := range r.Answers {
		b.WriteString(words.Wrap(a.Topic, width, "", "  "))
		line := a.Headline
		if a.Word != "" {
			line = a.Word + ". " + line
		}
		b.WriteString(words.Wrap(line, width, "  ", "  "))
	}
	_, err := io.WriteString(w, b.String())
	return err
}

// FillNumeric fills the numeric card from a numeric check's result: the
// seed and field, and per property the sampled dimension against the
// structural one with the margin.
func FillNumeric(n *Numeric, res *numeric.Result) {
	n.Prime, n.StatesChecked = uint64(res.Prime), res.Nodes
	if res.Seed != nil {
		n.Seed = *res.Seed
	}
	if res.Part != nil {
		n.StatesChecked = res.Part.Nodes
	}
	for _, p := range res.Properties() {
		n.Trials = len(p.Trials)
		margin := "not computed"
		switch {
		case p.Margin != nil:
			margin = strconv.FormatFloat(*p.Margin, 'g', 3, 64)
		case p.FloatSkipped != "":
			margin = "skipped: " + p.FloatSkipped
		}
		n.Rows = append(n.Rows, NumericRow{Property: p.Property.String(), Signals: p.Signals, Structural: p.Dimension, Sampled: p.SampledDimension, Margin: margin})
	}
}

// strongCard answers "does the design work for every value of the
// couplings of the stated class?".
func (p *builder) strongCard(net string, pr *analysis.PropertyResult) Answer {
	s := pr.Strong
	adj := "controllable"
	if pr.Property == structural.Observability {
		adj = "observable"
	}
	class := fmt.Sprintf("%s self-dynamics, %s", s.Diagonal, words.Count(s.MayBeZero, "coupling may be zero", "couplings may be zero"))
	a := Answer{Topic: fmt.Sprintf("Is %s strongly structurally %s: for every value of the couplings (%s)?", net, adj, class)}
	if s.Holds {
		a.OK, a.Word = Yes(), "Yes"
		a.Headline = fmt.Sprintf("Strongly %s: no value of the couplings in this class breaks the design.", adj)
		return a
	}
	a.OK, a.Word = No(), "No"
	a.Headline = fmt.Sprintf("Not strongly %s: %s can host a mode the design never moves.", adj, words.Count(s.Unforced.Len(), "state", "states"))
	var names []string
	for i := 0; i < s.Unforced.Len() && i < 12; i++ {
		names = append(names, words.Escape(s.Unforced.Name(i)))
	}
	if s.Unforced.Len() > 12 {
		names = append(names, fmt.Sprintf("%d more", s.Unforced.Len()-12))
	}
	a.Facts = append(a.Facts, Fact{"States not forced", strings.Join(names, ", ")})
	for _, t := range []struct {
		name string
		w    *strong.Witness
	}{{"at eigenvalue 0", s.AtZero.Witness}, {"at other eigenvalues", s.AtNonzero.Witness}} {
		if t.w != nil && t.w.Confirmed {
			a.Facts = append(a.Facts, Fact{"Witness " + t.name, fmt.Sprintf("%s entries of A, eigenvalue %d, confirmed in exact integer arithmetic (netsteer check --strong prints them)", num(len(t.w.Entries)), t.w.Eigenvalue)})
		}
	}
	return a
}
