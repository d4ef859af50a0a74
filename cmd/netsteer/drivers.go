package main

import (
	"bufio"
	"encoding/csv"
	"fmt"
	"io"
	"strconv"
	"strings"
	"time"
	"unicode"
	"unicode/utf8"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural"
)

var driversCmd = &command{
	name:    "drivers",
	summary: "fewest independent signals that control the network, and where they go",
	usage: `Usage: netsteer drivers [options] NET

Finds the minimum number of independent control signals N_D = max(N - |M*|, 1)
(Liu, Slotine & Barabasi 2011), where |M*| is the size of a maximum matching,
and one set of driver nodes that achieves it. Source components that hold no
driver are wired to an existing signal, so the listed inputs form a complete
structurally controllable design (Lin's theorem) with exactly N_D signals.

--roles classifies every state across all minimum driver sets (Jia et al.,
Nat. Commun. 2013): critical (in every one: exactly the states no edge
enters), intermittent (in some) or redundant (in none); and every edge across
all maximum matchings (Liu et al. 2011): critical (in every one: removing it
raises N_D), ordinary or redundant (in none). Linear time after the one
matching (alternating paths and the Dulmage-Mendelsohn decomposition).

NET is an edge list ("u v" means u acts on v), a Matrix Market file (.mtx)
or a DOT digraph (.dot, .gv); gzip is detected; - reads standard input.

Example:
  netsteer drivers testdata/plant/heating.edges
  netsteer drivers --roles testdata/plant/heating.edges
  netsteer drivers --format json -o drivers.json big.edges.gz
`,
	run: runDrivers,
}

func init() { register(driversCmd) }

func runDrivers(e *env, c *command, fs *pflag.FlagSet, args []string) int {
	var nf netFlags
	var of outFlags
	nf.register(fs, e)
	of.register(fs)
	timings := fs.Bool("timings", false, "print stage times on standard error")
	roles := fs.Bool("roles", false, "classify states (critical, intermittent, redundant) and edges (critical, ordinary, redundant)")
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
	if err := overwritesInput(of.output, path, nf.nodeTable); err != nil {
		return usageError(e, c, "%v", err)
	}
	start := time.Now()
	g, readT, err := nf.load(path, nil)
	if err != nil {
		return fail(e, err)
	}
	t0 := time.Now()
	e.status("matching (%d states, %d edges)", g.N(), g.Edges())
	m := matching.Maximum(&g.Out, &g.In)
	matchT := time.Since(t0)
	t0 = time.Now()
	e.status("strongly connected components")
	comps := structural.SCC(&g.Out)
	sccT := time.Since(t0)
	e.status("")
	ds := structural.DriversFrom(g, m, comps)
	res := &driversResult{file: path, g: g, ds: ds}
	if *roles {
		res.roles = computeDriverRoles(g, m)
	}
	res.stages = []stage{{"read_s", readT}, {"match_s", matchT}, {"components_s", sccT}}
	res.stages = append(res.stages, stage{"total_s", time.Since(start)})
	if err := of.write(e, res); err != nil {
		return fail(e, err)
	}
	if *timings && of.format == "text" {
		res.stages[3].d = time.Since(start)
		printTimings(e.Stderr, res.stages)
	}
	return exitOK
}

type stage struct {
	name string
	d    time.Duration
}

func printTimings(w io.Writer, stages []stage) {
	var parts []string
	for _, s := range stages {
		parts = append(parts, fmt.Sprintf("%s %.3f", strings.TrimSuffix(s.name, "_s"), s.d.Seconds()))
	}
	fmt.Fprintf(w, "timings (s): %s\n", strings.Join(parts, ", "))
}

type driversResult struct {
	file   string
	g      *structural.Network
	ds     *structural.DriverSet
	stages []stage
	roles  *driverRoles // with --roles
}

func (r *driversResult) fraction() float64 {
	return float64(len(r.ds.Drivers)) / float64(r.g.N())
}

func (r *driversResult) writeJSON(w io.Writer) error {
	g := r.g
	j := newJSON(bufio.NewWriterSize(w, 1<<16))
	j.val("file", r.file)
	j.int("nodes", g.N())
	j.int("edges", g.Edges())
	j.int("self_loops", g.SelfLoops)
	j.int("duplicates_merged", g.DuplicatesMerged)
	j.int("matching_size", r.ds.Matching.Size)
	j.int("driver_count", len(r.ds.Drivers))
	j.float("driver_fraction", r.fraction())
	j.names("drivers", r.ds.Drivers, g.Name)
	j.nameLists("inputs", r.ds.Inputs, g.Name)
	if r.roles != nil {
		r.roles.writeJSON(j, g)
	}
	j.timings(r.stages)
	return j.end()
}

func (r *driversResult) writeCSV(w io.Writer) error {
	if r.roles != nil {
		return r.roles.writeCSV(w, r.g)
	}
	cw := csv.NewWriter(w)
	cw.Write([]string{"signal", "state", "role"})
	for i, in := range r.ds.Inputs {
		for k, v := range in {
			role := "driver"
			if k > 0 {
				role = "source-component"
			}
			cw.Write([]string{strconv.Itoa(i + 1), r.g.Name(v), role})
		}
	}
	cw.Flush()
	return cw.Error()
}

// maxListed bounds the names printed in a text summary line.
const maxListed = 12

func (r *driversResult) writeText(w io.Writer) error {
	g, ds := r.g, r.ds
	bw := bufio.NewWriterSize(w, 1<<16)
	nd := len(ds.Drivers)
	fmt.Fprintf(bw, "%s needs %d independent control %s for %s (driver fraction %.4f).\n",
		displayFile(r.file), nd, plural(nd, "signal", "signals"), count(g.N(), "state", "states"), r.fraction())
	fmt.Fprintf(bw, "Drive: %s\n", nameList(g, ds.Drivers, maxListed))
	attached := 0
	for _, in := range ds.Inputs {
		attached += len(in) - 1
	}
	if attached > 0 {
		fmt.Fprintf(bw, "Also wired to existing signals: %d %s in source components that hold no driver.\n",
			attached, plural(attached, "state", "states"))
	}
	fmt.Fprintf(bw, "\nNetwork: %d %s, %d %s (%d %s, %d repeated %s merged); maximum matching %d.\n",
		g.N(), plural(g.N(), "state", "states"), g.Edges(), plural(g.Edges(), "edge", "edges"),
		g.SelfLoops, plural(g.SelfLoops, "self-loop", "self-loops"),
		g.DuplicatesMerged, plural(g.DuplicatesMerged, "edge", "edges"), ds.Matching.Size)
	fmt.Fprintf(bw, "\nsignal  driven states (the first is the driver node)\n")
	for i, in := range ds.Inputs {
		names := make([]string, len(in))
		for k, v := range in {
			names[k] = textName(g.Name(v))
		}
		fmt.Fprintf(bw, "%6d  %s\n", i+1, strings.Join(names, ", "))
	}
	if r.roles != nil {
		r.roles.writeText(bw, g, ds.Matching.Size == g.N())
	}
	fmt.Fprint(bw, "\n"+caution)
	return bw.Flush()
}

// caution is printed under every text report.
const caution = `Structural result: it holds for almost all parameter values, not for every
one. Use it as a screening step; it does not replace dynamic studies, safety
analysis, local codes or licensed engineering review.
`

// count returns "n things", singular when n is 1.
func count(n int, one, many string) string {
	return strconv.Itoa(n) + " " + plural(n, one, many)
}

func plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}

// nameList joins up to max names, noting how many more there are.
func nameList(g *structural.Network, ids []int32, max int) string {
	var b strings.Builder
	for i, v := range ids {
		if i == max {
			fmt.Fprintf(&b, " ... and %d more", len(ids)-max)
			break
		}
		if i > 0 {
			b.WriteString(", ")
		}
		b.WriteString(textName(g.Name(v)))
	}
	return b.String()
}

// textName returns a state name as the text reports print it: verbatim
// when it reads unambiguously in a comma-separated list, otherwise
// double-quoted CSV-style (inner quotes doubled), as design files accept
// it. Characters a terminal would not show (control and format
// characters, invalid UTF-8) are written as Go escapes inside the quotes,
// so a name never corrupts the report or hides its difference from
// another.
func textName(s string) string {
	if plainName(s) {
		return s
	}
	var b strings.Builder
	b.WriteByte('"')
	for i := 0; i < len(s); {
		r, size := utf8.DecodeRuneInString(s[i:])
		switch {
		case r == utf8.RuneError && size == 1:
			fmt.Fprintf(&b, `\x%02x`, s[i])
		case r == '"':
			b.WriteString(`""`)
		case r == ' ' || unicode.IsPrint(r):
			b.WriteString(s[i : i+size])
		default:
			q := strconv.QuoteRune(r)
			b.WriteString(q[1 : len(q)-1])
		}
		i += size
	}
	b.WriteByte('"')
	return b.String()
}

// plainName reports whether s prints unquoted: not empty, no comment mark
// at its start, and only printable characters other than white space,
// commas and quotes.
func plainName(s string) bool {
	if s == "" || s[0] == '#' || s[0] == '%' {
		return false
	}
	for _, r := range s {
		if r == utf8.RuneError || r == ',' || r == '"' || unicode.IsSpace(r) || !unicode.IsPrint(r) {
			return false
		}
	}
	return true
}

// displayFile names an input file in a text report ("-" is standard input).
func displayFile(path string) string {
	if path == "-" {
		return "standard input"
	}
	return path
}
