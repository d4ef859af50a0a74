package main

import (
	"bufio"
	"encoding/csv"
	"fmt"
	"io"
	"strconv"
	"strings"
	"time"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/nodetable"
	"github.com/netsteer/netsteer/structural"
)

var actuatorsCmd = &command{
	name:    "actuators",
	summary: "cheapest dedicated actuators that make the network controllable",
	usage: `Usage: netsteer actuators [options] NET

Finds the cheapest set of dedicated actuators (each driving one state) that,
with the actuators already in place, makes the network structurally
controllable: every source component holds an actuator and the states
without one can be matched to distinct in-neighbours (Lin's theorem). The
answer is exact, not greedy.

Without a node table every actuator costs 1 and the answer is the minimum
number of actuators, m + beta - alpha (Pequito, Kar & Aguiar, IEEE TAC
2016): m states left unmatched by a maximum matching (no max(., 1): a
network with a perfect matching has m = 0), beta source components, and
alpha the most source components that can each hold an unmatched state of
one maximum matching (found by augmenting paths, Olshevsky 2015).

With --node-table FILE (CSV; columns node, actuator_cost, can_actuate,
has_actuator, ...) the answer is the least total cost of new actuators and,
among placements of equal cost, the fewest: cheap actuators may replace an
expensive one. Existing actuators are kept and cost nothing; states with
can_actuate=no get none. This is the minimum-weight matching formulation of
Pequito, Kar & Aguiar (Automatica 2016), solved as a minimum-cost flow: a
greedy pass over the matching matroid (states by decreasing cost, one
Hopcroft-Karp augmentation per cost class), then successive shortest paths
that give every source component its actuator. Time O(K E sqrt(N)) for K
distinct costs plus O(R (E + N) log N) for R source components needing a
path (R is usually small); memory O(N + E).

--roles tells, for each new actuator, whether every cheapest placement has
one there (forced) or which states could take its place at the same cost.

When no allowed placement exists (states that only forbidden ones could
match, or a source component with no allowed state), the command says which
and exits with status 1, still listing the cheapest placement for the rest.

NET is an edge list ("u v" means u acts on v), a Matrix Market file (.mtx)
or a DOT digraph (.dot, .gv); gzip is detected; - reads standard input.

Exit status: 0 when a placement exists, 1 when none does, 2 on error.

Example:
  netsteer actuators testdata/plant/heating.edges
  netsteer actuators --node-table plant-devices.csv --roles plant.edges
  netsteer actuators --format json -o actuators.json big.edges.gz
`,
	run: func(e *env, c *command, fs *pflag.FlagSet, args []string) int {
		return runPlacement(e, c, fs, args, actuatorWords)
	},
}

func init() { register(actuatorsCmd) }

// placeWords are the words and functions that differ between actuator and
// sensor placement.
type placeWords struct {
	device, devices string // "actuator", "actuators"
	property        string // "structurally controllable"
	component       string // "source component"
	reach           string // "reach"
	dilation        string // "dilation"
	neighbours      string // "in-neighbours"
	canColumn       string // "can_actuate"
	place           func(*structural.Network, structural.Devices) (*structural.Placement, error)
	count           func(*structural.Network, []bool) (*structural.DeviceCount, error)
	table           func(*nodetable.Table, *structural.Network) structural.Devices
}

var actuatorWords = &placeWords{
	device: "actuator", devices: "actuators", property: "structurally controllable",
	component: "source component", reach: "reach", dilation: "dilation",
	neighbours: "in-neighbours", canColumn: "can_actuate",
	place: structural.PlaceActuators, count: structural.CountActuators,
	table: (*nodetable.Table).Actuators,
}

// placeResult is everything a placement command reports.
type placeResult struct {
	file     string
	g        *structural.Network
	w        *placeWords
	pl       *structural.Placement
	count    *structural.DeviceCount // unit costs only, nil otherwise
	roles    []structural.DeviceRole // with --roles
	withRole bool
	scale    int64 // cost units per 1
	stages   []stage
}

func runPlacement(e *env, c *command, fs *pflag.FlagSet, args []string, w *placeWords) int {
	var nf netFlags
	var of outFlags
	nf.register(fs, e)
	of.register(fs)
	roles := fs.Bool("roles", false, "say which new "+w.devices+" are forced and where the others could go instead")
	maxAlt := fs.Int("alternatives", 10, "with --roles, list at most this many alternatives per "+w.device)
	timings := fs.Bool("timings", false, "print stage times on standard error")
	if ok, st := parse(e, c, fs, args); !ok {
		return st
	}
	if fs.NArg() != 1 {
		return usageError(e, c, "want one network file, got %d arguments", fs.NArg())
	}
	if err := of.check(); err != nil {
		return usageError(e, c, "%v", err)
	}
	if *maxAlt < 0 {
		return usageError(e, c, "--alternatives %d: want 0 or more", *maxAlt)
	}
	path := fs.Arg(0)
	if path == "-" && nf.nodeTable == "-" {
		return usageError(e, c, "only one of NET and --node-table can read standard input")
	}
	start := time.Now()
	g, readT, err := nf.load(path, nil)
	if err != nil {
		return fail(e, err)
	}
	res := &placeResult{file: path, g: g, w: w, withRole: *roles, scale: 1}
	var d structural.Devices
	if nf.table != nil {
		d = w.table(nf.table, g)
		res.scale = nodetable.CostScale
	}
	t0 := time.Now()
	res.pl, err = w.place(g, d)
	if err != nil {
		return fail(e, err)
	}
	placeT := time.Since(t0)
	if uniformCosts(d) {
		if res.count, err = w.count(g, d.Forbidden); err != nil {
			return fail(e, err)
		}
	}
	t0 = time.Now()
	if *roles {
		res.roles = res.pl.Roles(*maxAlt)
	}
	rolesT := time.Since(t0)
	res.stages = []stage{{"read_s", readT}, {"place_s", placeT}, {"roles_s", rolesT}}
	res.stages = append(res.stages, stage{"total_s", time.Since(start)})
	if err := of.write(e, res); err != nil {
		return fail(e, err)
	}
	if *timings {
		printTimings(e.Stderr, res.stages)
	}
	if !res.pl.Feasible {
		return exitNo
	}
	return exitOK
}

// uniformCosts reports whether every new device costs the same and none
// exists yet: the case of the count formula.
func uniformCosts(d structural.Devices) bool {
	for _, x := range d.Existing {
		if x {
			return false
		}
	}
	first := int64(-1)
	for v, c := range d.Cost {
		if d.Forbidden != nil && d.Forbidden[v] {
			continue
		}
		if first >= 0 && c != first {
			return false
		}
		first = c
	}
	return true
}

// cost formats a cost held in the result's units.
func (r *placeResult) cost(units int64) string {
	if r.scale == nodetable.CostScale {
		return nodetable.FormatCost(units)
	}
	return strconv.FormatInt(units, 10)
}

// existing returns the kept devices: in the set but not added.
func (r *placeResult) existing() []int32 {
	var out []int32
	k := 0
	for _, v := range r.pl.Devices {
		if k < len(r.pl.Added) && r.pl.Added[k] == v {
			k++
			continue
		}
		out = append(out, v)
	}
	return out
}

func (r *placeResult) writeText(out io.Writer) error {
	g, pl, w := r.g, r.pl, r.w
	bw := bufio.NewWriterSize(out, 1<<16)
	ex := r.existing()
	if pl.Feasible {
		nd := len(pl.Devices)
		head := fmt.Sprintf("%s: %d %s %s the network %s", r.file, nd, plural(nd, w.device, w.devices), plural(nd, "makes", "make"), w.property)
		switch {
		case len(pl.Added) == 0:
			fmt.Fprintf(bw, "%s: the existing %s enough; no new one is needed.\n", head, plural(nd, "one is", "ones are"))
		case len(ex) == 0:
			fmt.Fprintf(bw, "%s, at a total cost of %s.\n", head, r.cost(pl.Cost))
		default:
			fmt.Fprintf(bw, "%s: %d new (total cost %s) and %d existing.\n", head, len(pl.Added), r.cost(pl.Cost), len(ex))
		}
	} else {
		fmt.Fprintf(bw, "%s: no placement the node table allows makes the network %s.\n", r.file, w.property)
		if pl.Deficit > 0 {
			fmt.Fprintf(bw, "Cannot be matched: %d %s a %s (fewer %s than states) that needs %d more %s, but none of them may take one (%s=no): %s\n",
				len(pl.Unmatchable), plural(len(pl.Unmatchable), "state forms", "states form"), w.dilation, w.neighbours,
				pl.Deficit, plural(pl.Deficit, w.device, w.devices), w.canColumn, nameList(g, pl.Unmatchable, maxListed))
		}
		if len(pl.Unreached) > 0 {
			fmt.Fprintf(bw, "Cannot %s: %d %s %s no state that may take %s %s:\n", w.reach, len(pl.Unreached),
				plural(len(pl.Unreached), w.component, w.component+"s"), plural(len(pl.Unreached), "holds", "hold"), article(w.device), w.device)
			for i, comp := range pl.Unreached {
				if i == maxListed {
					fmt.Fprintf(bw, "  ... and %d more\n", len(pl.Unreached)-maxListed)
					break
				}
				fmt.Fprintf(bw, "  {%s}\n", nameList(g, comp, maxListed))
			}
		}
		fmt.Fprintf(bw, "Cheapest placement for the rest: %d new %s (cost %s).\n",
			len(pl.Added), plural(len(pl.Added), w.device, w.devices), r.cost(pl.Cost))
	}
	fmt.Fprintf(bw, "New %s (%d): %s\n", w.devices, len(pl.Added), orNone(nameList(g, pl.Added, maxListed)))
	if len(ex) > 0 {
		fmt.Fprintf(bw, "Existing %s kept (%d): %s\n", w.devices, len(ex), nameList(g, ex, maxListed))
	}
	fmt.Fprintf(bw, "\nNetwork: %d states, %d edges (%d self-loops).\n", g.N(), g.Edges(), g.SelfLoops)
	if c := r.count; c != nil && c.Feasible {
		fmt.Fprintf(bw, "Count: m + beta - alpha = %d + %d - %d = %d: %d %s unmatched by a maximum matching, %d %s, %d of which can hold one of them.\n",
			c.Unmatched, c.SourceComponents, c.Alpha, c.Count, c.Unmatched, plural(c.Unmatched, "state", "states"),
			c.SourceComponents, plural(c.SourceComponents, w.component, w.component+"s"), c.Alpha)
	}
	if r.scale != 1 {
		tie := "then the fewest " + w.devices
		if !pl.FewestDevices {
			tie = "ties in cost not broken (costs too large)"
		}
		fmt.Fprintf(bw, "Cheapest: least total cost of new %s, %s.\n", w.devices, tie)
	}
	if r.withRole && pl.Feasible {
		r.writeRolesText(bw)
	}
	if !r.withRole && (len(pl.Added) > maxListed || len(ex) > maxListed) {
		fmt.Fprintf(bw, "\nAll %s (%s new):\n", w.devices, strconv.Itoa(len(pl.Added)))
		k := 0
		for _, v := range pl.Devices {
			tag := "existing"
			if k < len(pl.Added) && pl.Added[k] == v {
				tag = "new"
				k++
			}
			fmt.Fprintf(bw, "  %-8s %s\n", tag, g.Name(v))
		}
	}
	fmt.Fprint(bw, "\n"+caution)
	return bw.Flush()
}

// writeRolesText answers "must a new device go on X, or where else?".
func (r *placeResult) writeRolesText(bw *bufio.Writer) {
	g, w := r.g, r.w
	if len(r.roles) == 0 {
		return
	}
	forced := 0
	for _, x := range r.roles {
		if x.Forced {
			forced++
		}
	}
	rest := "; each other one could move, on its own, to a state listed"
	if forced == len(r.roles) {
		rest = ""
	}
	fmt.Fprintf(bw, "\nMust each new %s go where it is? %d of %d %s forced (every cheapest placement has one there)%s.\n",
		w.device, forced, len(r.roles), plural(forced, "is", "are"), rest)
	width := 0
	for _, x := range r.roles {
		if l := len(g.Name(x.State)); l > width && l <= 40 {
			width = l
		}
	}
	for _, x := range r.roles {
		var say string
		switch {
		case x.Forced:
			say = "forced: it must go here"
		case len(x.Alternatives) > 0:
			more := ""
			if x.More {
				more = " and more"
			}
			say = "could go instead on " + nameList(g, x.Alternatives, len(x.Alternatives)) + more + " (same cost)"
		case x.More:
			say = "could go elsewhere at the same cost (raise --alternatives to list where)"
		default:
			say = "not forced, but it can only move together with other " + w.devices
		}
		fmt.Fprintf(bw, "  %-*s  %s\n", width, g.Name(x.State), say)
	}
}

func orNone(s string) string {
	if s == "" {
		return "none"
	}
	return s
}

func article(word string) string {
	if word != "" && strings.ContainsRune("aeiou", rune(word[0])) {
		return "an"
	}
	return "a"
}

func (r *placeResult) writeJSON(out io.Writer) error {
	g, pl, w := r.g, r.pl, r.w
	j := newJSON(bufio.NewWriterSize(out, 1<<16))
	j.val("file", r.file)
	j.int("nodes", g.N())
	j.int("edges", g.Edges())
	j.bool("feasible", pl.Feasible)
	j.names(w.devices, pl.Devices, g.Name)
	j.names("added", pl.Added, g.Name)
	j.names("existing", r.existing(), g.Name)
	j.int(w.device+"_count", len(pl.Devices))
	j.key("total_cost")
	j.w.WriteString(r.cost(pl.Cost))
	j.bool("fewest_devices", pl.FewestDevices)
	if c := r.count; c != nil && c.Feasible {
		j.int("unmatched", c.Unmatched)
		j.int(strings.ReplaceAll(w.component, " ", "_")+"s", c.SourceComponents)
		j.int("alpha", c.Alpha)
	}
	j.names("unmatchable", pl.Unmatchable, g.Name)
	j.int("unmatchable_deficit", pl.Deficit)
	j.nameLists("unreached_components", pl.Unreached, g.Name)
	if r.withRole {
		j.key(w.device + "_roles")
		j.w.WriteByte('[')
		var buf []byte
		for i, x := range r.roles {
			if i > 0 {
				j.w.WriteByte(',')
			}
			buf = appendJSONString(buf[:0], g.Name(x.State))
			fmt.Fprintf(j.w, "\n    {\"state\": %s, \"forced\": %v, \"alternatives\": ", buf, x.Forced)
			writeNameArray(j.w, x.Alternatives, g.Name)
			fmt.Fprintf(j.w, ", \"more_alternatives\": %v}", x.More)
		}
		if len(r.roles) > 0 {
			j.w.WriteString("\n  ")
		}
		j.w.WriteByte(']')
	}
	j.timings(r.stages)
	return j.end()
}

// writeCSV writes one row per state of the answer: the devices (new or
// existing, with cost and, with --roles, whether forced and the
// alternatives) and, when infeasible, the states that block.
func (r *placeResult) writeCSV(out io.Writer) error {
	g, pl := r.g, r.pl
	cw := csv.NewWriter(out)
	cw.Write([]string{"state", "device", "cost", "forced", "alternatives"})
	role := map[int32]structural.DeviceRole{}
	for _, x := range r.roles {
		role[x.State] = x
	}
	k := 0
	for _, v := range pl.Devices {
		kind, cost := "existing", "0"
		if k < len(pl.Added) && pl.Added[k] == v {
			kind = "new"
			k++
			cost = r.cost(r.unitCost(v))
		}
		forced, alts := "", ""
		if x, ok := role[v]; ok {
			forced = strconv.FormatBool(x.Forced)
			names := make([]string, len(x.Alternatives))
			for i, a := range x.Alternatives {
				names[i] = g.Name(a)
			}
			alts = strings.Join(names, ";")
		}
		cw.Write([]string{g.Name(v), kind, cost, forced, alts})
	}
	for _, v := range pl.Unmatchable {
		cw.Write([]string{g.Name(v), "unmatchable", "", "", ""})
	}
	for _, comp := range pl.Unreached {
		for _, v := range comp {
			cw.Write([]string{g.Name(v), "unreached", "", "", ""})
		}
	}
	cw.Flush()
	return cw.Error()
}

// unitCost is the cost of a new device on v, in the result's units.
func (r *placeResult) unitCost(v int32) int64 {
	if r.scale == 1 {
		return 1
	}
	return r.pl.CostOf(v)
}

// The check extension: when a design fails, the cheapest dedicated
// devices that complete it, with costs and allowed states from the node
// table (its has_actuator and has_sensor columns are not used here: the
// design file says what is in place).
func init() {
	checkExtensions = append(checkExtensions, &checkExtension{run: checkCompletion})
}

// completion is one completed property of a check.
type completion struct {
	w  *placeWords
	pl *structural.Placement
}

func checkCompletion(e *env, r *checkResult) (*checkSection, error) {
	var cs []completion
	scale := int64(1)
	if r.net != nil && r.net.table != nil {
		scale = nodetable.CostScale
	}
	devices := func(w *placeWords) structural.Devices {
		if scale == 1 {
			return structural.Devices{}
		}
		d := w.table(r.net.table, r.g)
		d.Existing = nil
		return d
	}
	if r.ctrl != nil && !r.ctrl.Controllable {
		pl, err := structural.CompleteActuators(r.g, r.inputs, devices(actuatorWords))
		if err != nil {
			return nil, err
		}
		cs = append(cs, completion{actuatorWords, pl})
	}
	if r.obs != nil && !r.obs.Observable {
		pl, err := structural.CompleteSensors(r.g, r.outputs, devices(sensorWords))
		if err != nil {
			return nil, err
		}
		cs = append(cs, completion{sensorWords, pl})
	}
	if len(cs) == 0 {
		return nil, nil
	}
	pr := &placeResult{g: r.g, scale: scale}
	g := r.g
	source := "every device costs 1"
	if scale != 1 {
		source = "costs and allowed states from the node table"
	}
	return &checkSection{
		text: func(out io.Writer) {
			for _, c := range cs {
				pl := c.pl
				if pl.Feasible {
					fmt.Fprintf(out, "Cheapest completion (%s): add %d dedicated %s, total cost %s: %s\n",
						source, len(pl.Added), plural(len(pl.Added), c.w.device, c.w.devices), pr.cost(pl.Cost), nameList(g, pl.Added, maxListed))
					continue
				}
				fmt.Fprintf(out, "No completion by dedicated %s exists (%s):", c.w.devices, source)
				if pl.Deficit > 0 {
					fmt.Fprintf(out, " %d %s may not take %s %s but need %d more (%s: %s);", len(pl.Unmatchable),
						plural(len(pl.Unmatchable), "state", "states"), article(c.w.device), c.w.device, pl.Deficit, c.w.dilation, nameList(g, pl.Unmatchable, maxListed))
				}
				for _, comp := range pl.Unreached {
					fmt.Fprintf(out, " nothing allowed can %s {%s};", c.w.reach, nameList(g, comp, maxListed))
				}
				fmt.Fprintf(out, " the rest needs %d: %s\n", len(pl.Added), orNone(nameList(g, pl.Added, maxListed)))
			}
		},
		json: func(j *jsonw) {
			for _, c := range cs {
				j.key(c.w.device + "_completion")
				fmt.Fprintf(j.w, "{\"feasible\": %v, \"added\": ", c.pl.Feasible)
				writeNameArray(j.w, c.pl.Added, g.Name)
				fmt.Fprintf(j.w, ", \"added_count\": %d, \"total_cost\": %s}", len(c.pl.Added), pr.cost(c.pl.Cost))
			}
		},
		csv: func(cw *csv.Writer) {
			for _, c := range cs {
				k := c.w.device + "_completion"
				cw.Write([]string{k + "_feasible", strconv.FormatBool(c.pl.Feasible)})
				for _, v := range c.pl.Added {
					cw.Write([]string{k + "_added", g.Name(v)})
				}
				cw.Write([]string{k + "_total_cost", pr.cost(c.pl.Cost)})
			}
		},
	}, nil
}
