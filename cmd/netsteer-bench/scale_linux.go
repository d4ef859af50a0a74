//go:build linux

package main

import (
	"bufio"
	"bytes"
	"encoding/json"
	"flag"
	"fmt"
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"runtime/pprof"
	"slices"
	"strconv"
	"strings"
	"syscall"
	"time"

	"github.com/netsteer/netsteer/io/design"
	"github.com/netsteer/netsteer/io/netread"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/gen"
	"github.com/netsteer/netsteer/structural/placement"
)

// A stage is one question a command asks the library, timed after the
// network (and the design, for checks) has been read. It returns its
// answer as a short string, which the timed runs must agree on, and may
// check the answer by an independent route after the clock has stopped
// (verify; an error there is a wrong answer).
type stage struct {
	name, help string
	design     string // "", "full" or "half": the design file it reads
	run        func(g *structural.Network, d structural.Design) (answer string, parts []part, verify func() error)
}

// part is a timed piece of a stage.
type part struct {
	Name string  `json:"name"`
	Wall float64 `json:"wall_s"`
}

// timed runs f and returns its wall time as a part.
func timed(name string, f func()) part {
	t := time.Now()
	f()
	return part{name, time.Since(t).Seconds()}
}

// costOf is the device cost of the place-costs stage for the state named
// by integer i: a whole number from 1..1000, a hash of i (SplitMix64 with
// seed 3), so that the node table written for the command line gives the
// same costs whatever order the states are read in.
func costOf(i int64) int64 {
	s := uint64(i) ^ 3
	return 1 + int64(gen.SplitMix64(&s)%1000)
}

// randomCosts is the device table of the place-costs stage.
func randomCosts(g *structural.Network) structural.Devices {
	c := make([]structural.Cost, g.N())
	var name []byte
	for v := range c {
		name = g.AppendName(name[:0], int32(v))
		i, _ := strconv.ParseInt(string(name), 10, 64)
		c[v] = structural.Cost(costOf(i)) * structural.Unit
	}
	return structural.Devices{Cost: c}
}

var stages = []stage{
	{name: "drivers", help: "matching, components and a minimum driver set (netsteer drivers)",
		run: func(g *structural.Network, _ structural.Design) (string, []part, func() error) {
			var ds *structural.DriverSet
			p := timed("drivers", func() { ds = structural.Drivers(g) })
			return fmt.Sprintf("n_d=%d matching=%d", ds.Count(), ds.MatchingSize), []part{p}, nil
		}},
	{name: "roles", help: "drivers, then state and link roles (netsteer drivers --roles)",
		run: func(g *structural.Network, _ structural.Design) (string, []part, func() error) {
			var ds *structural.DriverSet
			var nr *structural.NodeRoles
			var lr *structural.LinkRoles
			p1 := timed("drivers", func() { ds = structural.Drivers(g) })
			p2 := timed("roles", func() { nr, lr = structural.StateRoles(g), structural.EdgeRoles(g) })
			count := func(of []structural.Role, r structural.Role) int {
				k := 0
				for _, x := range of {
					if x == r {
						k++
					}
				}
				return k
			}
			ans := fmt.Sprintf("n_d=%d matching=%d critical=%d intermittent=%d links critical=%d redundant=%d", ds.Count(), ds.MatchingSize,
				count(nr.Of, structural.Critical), count(nr.Of, structural.Intermittent),
				count(lr.Of, structural.Critical), count(lr.Of, structural.Redundant))
			return ans, []part{p1, p2}, func() error {
				// Critical states are exactly those without in-edges
				// (Jia et al. 2013).
				for v := int32(0); int(v) < g.N(); v++ {
					if (len(g.Pred(v)) == 0) != (nr.Of[v] == structural.Critical) {
						return fmt.Errorf("state %d: role %v with %d in-edges", v, nr.Of[v], len(g.Pred(v)))
					}
				}
				return nil
			}
		}},
	{name: "check-pass", help: "Lin's test of a minimum design (netsteer check, passing)", design: "full",
		run: func(g *structural.Network, d structural.Design) (string, []part, func() error) {
			var v *structural.Verdict
			var err error
			p := timed("check", func() { v, err = structural.Check(g, structural.Controllability, d) })
			if err != nil {
				return "error: " + err.Error(), nil, nil
			}
			return fmt.Sprintf("holds=%v dimension=%d", v.Holds, v.Dimension), []part{p}, func() error {
				if !v.Holds || v.Dimension != g.N() {
					return fmt.Errorf("the design from Drivers fails: %+v", v)
				}
				return nil
			}
		}},
	{name: "check-fail", help: "Lin's test, dimension and cheapest completion of half a minimum design (netsteer check, failing)", design: "half",
		run: func(g *structural.Network, d structural.Design) (string, []part, func() error) {
			var v *structural.Verdict
			var pl *placement.Placement
			var err, err2 error
			p1 := timed("check", func() { v, err = structural.Check(g, structural.Controllability, d) })
			p2 := timed("complete", func() { pl, err2 = placement.Complete(g, structural.Controllability, d, structural.Devices{}) })
			if err != nil || err2 != nil {
				return fmt.Sprintf("error: %v %v", err, err2), nil, nil
			}
			ans := fmt.Sprintf("holds=%v dimension=%d term_rank=%d unreached=%d added=%d", v.Holds, v.Dimension, v.TermRank, v.Unreached.Len(), pl.Added.Len())
			return ans, []part{p1, p2}, func() error {
				// The completed design passes, and it adds at least the
				// deficiency (each signal raises the term rank by one at
				// most); the dimension lies between the term-rank bound
				// and N.
				if pl.Added.Len() < v.Deficiency() {
					return fmt.Errorf("completion adds %d devices, fewer than the deficiency %d", pl.Added.Len(), v.Deficiency())
				}
				c, err := structural.Check(g, structural.Controllability, d.With(pl.Added.IDs()))
				if err != nil || !c.Holds {
					return fmt.Errorf("the completed design fails: %v %+v", err, c)
				}
				if v.Holds || v.Dimension > v.TermRank || v.Dimension < 0 {
					return fmt.Errorf("verdict %+v", v)
				}
				return nil
			}
		}},
	{name: "dimension", help: "the controllable dimension of half a minimum design alone", design: "half",
		run: func(g *structural.Network, d structural.Design) (string, []part, func() error) {
			var dim int
			var err error
			p := timed("dimension", func() { dim, err = structural.Dimension(g, structural.Controllability, d) })
			if err != nil {
				return "error: " + err.Error(), nil, nil
			}
			return fmt.Sprintf("dimension=%d", dim), []part{p}, nil
		}},
	{name: "place-unit", help: "fewest dedicated actuators, unit costs (netsteer actuators)",
		run: func(g *structural.Network, _ structural.Design) (string, []part, func() error) {
			return placeStage(g, structural.Controllability, structural.Devices{})
		}},
	{name: "place-costs", help: "cheapest dedicated actuators, random costs 1..1000 (netsteer actuators --node-table)",
		run: func(g *structural.Network, _ structural.Design) (string, []part, func() error) {
			return placeStage(g, structural.Controllability, randomCosts(g))
		}},
	{name: "sensors", help: "fewest dedicated sensors, unit costs (netsteer sensors)",
		run: func(g *structural.Network, _ structural.Design) (string, []part, func() error) {
			return placeStage(g, structural.Observability, structural.Devices{})
		}},
}

func placeStage(g *structural.Network, p structural.Property, dev structural.Devices) (string, []part, func() error) {
	var pl *placement.Placement
	var err error
	pt := timed("place", func() { pl, err = placement.Place(g, p, dev) })
	if err != nil {
		return "error: " + err.Error(), nil, nil
	}
	ans := fmt.Sprintf("feasible=%v devices=%d cost=%s", pl.Feasible, pl.Added.Len(), pl.Cost)
	return ans, []part{pt}, func() error {
		// Unit costs: the count formula m + beta - alpha (Pequito, Kar
		// & Aguiar 2016; another algorithm) gives the same number. Any
		// costs: the devices pass Lin's test.
		if dev.Cost == nil {
			c, err := placement.Count(g, p, nil)
			if err != nil || c.Count != pl.Added.Len() {
				return fmt.Errorf("count formula %v (%v), placement %d", c, err, pl.Added.Len())
			}
		}
		d, err := structural.Dedicated(g, pl.Added.IDs())
		if err != nil {
			return err
		}
		v, err := structural.Check(g, p, d)
		if err != nil || !v.Holds {
			return fmt.Errorf("the placed devices fail Lin's test: %v %+v", err, v)
		}
		return nil
	}
}

func stageByName(name string) *stage {
	for i := range stages {
		if stages[i].name == name {
			return &stages[i]
		}
	}
	return nil
}

// processCPU returns the user plus system time of the whole process.
func processCPU() float64 {
	var ru syscall.Rusage
	syscall.Getrusage(syscall.RUSAGE_SELF, &ru)
	return float64(ru.Utime.Nano()+ru.Stime.Nano()) / 1e9
}

// peakRSS returns the process's peak resident set (VmHWM) in bytes.
func peakRSS() int64 {
	b, err := os.ReadFile("/proc/self/status")
	if err != nil {
		return -1
	}
	for _, line := range strings.Split(string(b), "\n") {
		if rest, ok := strings.CutPrefix(line, "VmHWM:"); ok {
			kb, _ := strconv.ParseInt(strings.TrimSpace(strings.TrimSuffix(strings.TrimSpace(rest), "kB")), 10, 64)
			return kb << 10
		}
	}
	return -1
}

// stageResult is what one stage process reports.
type stageResult struct {
	Stage    string  `json:"stage"`
	Nodes    int     `json:"nodes"`
	Edges    int     `json:"edges"`
	ReadWall float64 `json:"read_s"`
	ReadCPU  float64 `json:"read_cpu_s"`
	Wall     float64 `json:"stage_s"`
	CPU      float64 `json:"stage_cpu_s"`
	Peak     int64   `json:"peak_bytes"`
	Parts    []part  `json:"parts"`
	Answer   string  `json:"answer"`
	Verified string  `json:"verified"` // "ok", "-" (no check) or the error
}

// runStageMain is the child process of scale: it reads the network (and
// the design), runs one stage and prints a stageResult as JSON.
func runStageMain(args []string) {
	fs := flag.NewFlagSet("run-stage", flag.ExitOnError)
	name := fs.String("stage", "drivers", "stage to run")
	designFile := fs.String("design", "", "design file")
	verify := fs.Bool("verify", true, "check the answer by an independent route after timing")
	profile := fs.String("cpuprofile", "", "write a CPU profile of the stage to this file")
	fs.Parse(args)
	st := stageByName(*name)
	if st == nil || fs.NArg() != 1 {
		fmt.Fprintln(os.Stderr, "usage: netsteer-bench run-stage -stage NAME [-design FILE] NETWORK")
		os.Exit(2)
	}
	res := stageResult{Stage: st.name}
	c0, w0 := processCPU(), time.Now()
	in, err := netread.ReadFile(fs.Arg(0), netread.Options{})
	if err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(2)
	}
	g := in.Network
	var d structural.Design
	if st.design != "" {
		sig, err := design.ReadFile(*designFile, g, design.Options{})
		if err != nil {
			fmt.Fprintln(os.Stderr, err)
			os.Exit(2)
		}
		if d, err = structural.NewDesign(g, design.States(sig.Signals), nil); err != nil {
			fmt.Fprintln(os.Stderr, err)
			os.Exit(2)
		}
	}
	res.ReadWall, res.ReadCPU = time.Since(w0).Seconds(), processCPU()-c0
	res.Nodes, res.Edges = g.N(), g.Edges()
	if *profile != "" {
		f, err := os.Create(*profile)
		if err != nil {
			fmt.Fprintln(os.Stderr, err)
			os.Exit(2)
		}
		pprof.StartCPUProfile(f)
	}
	c0, w0 = processCPU(), time.Now()
	answer, parts, check := st.run(g, d)
	res.Wall, res.CPU = time.Since(w0).Seconds(), processCPU()-c0
	if *profile != "" {
		pprof.StopCPUProfile()
	}
	res.Peak = peakRSS()
	res.Answer, res.Parts, res.Verified = answer, parts, "-"
	if check != nil && *verify {
		res.Verified = "ok"
		if err := check(); err != nil {
			res.Verified = err.Error()
		}
	}
	json.NewEncoder(os.Stdout).Encode(res)
}

// scaleMain generates the comparison workload at several sizes, runs every
// stage on each in its own process and prints one table: per stage and
// size the wall and CPU seconds (reading included and not), the peak
// resident memory, bytes per edge and the ratio to drivers; per stage the
// exponent of a least-squares fit of log time against log edges.
func scaleMain(args []string) {
	fs := flag.NewFlagSet("scale", flag.ExitOnError)
	sizes := fs.String("sizes", "250000,500000,1000000,2000000,4000000", "numbers of states, comma-separated")
	k := fs.Float64("k", 10, "mean total degree of the ER workload")
	seed := fs.Uint64("seed", 1, "generator seed")
	only := fs.String("stages", "", "stages to run, comma-separated (default all: "+stageNames()+")")
	runs := fs.Int("runs", 1, "processes per stage and size (the fastest is reported; answers must agree)")
	dir := fs.String("dir", filepath.Join(os.TempDir(), "netsteer-bench"), "directory for the generated files")
	jsonOut := fs.String("json", "", "also write every result to this JSON file")
	verify := fs.Bool("verify", true, "check each answer by an independent route (untimed)")
	bin := fs.Bool("bin", false, "also write each network as int32 pairs (FILE.i32) for the Python peers")
	fs.Parse(args)
	var ns []int
	for _, s := range strings.Split(*sizes, ",") {
		n, err := strconv.Atoi(strings.TrimSpace(s))
		if err != nil || n < 2 {
			fmt.Fprintf(os.Stderr, "scale: bad size %q\n", s)
			os.Exit(2)
		}
		ns = append(ns, n)
	}
	var sel []*stage
	if *only == "" {
		for i := range stages {
			sel = append(sel, &stages[i])
		}
	} else {
		for _, s := range strings.Split(*only, ",") {
			st := stageByName(strings.TrimSpace(s))
			if st == nil {
				fmt.Fprintf(os.Stderr, "scale: unknown stage %q (want %s)\n", s, stageNames())
				os.Exit(2)
			}
			sel = append(sel, st)
		}
	}
	if !slices.ContainsFunc(sel, func(s *stage) bool { return s.name == "drivers" }) {
		sel = append([]*stage{stageByName("drivers")}, sel...) // the ratios need it
	}
	if err := os.MkdirAll(*dir, 0o755); err != nil {
		fmt.Fprintln(os.Stderr, "scale:", err)
		os.Exit(1)
	}
	self, err := os.Executable()
	if err != nil {
		fmt.Fprintln(os.Stderr, "scale:", err)
		os.Exit(1)
	}
	load, _ := os.ReadFile("/proc/loadavg")
	fmt.Printf("workload: directed ER G(N, N*%g/2) of structural/gen (gen.Workload(\"er\", N)), seed %d, text edge lists\n", *k, *seed)
	fmt.Printf("machine: %d cores, GOMAXPROCS %d, %s; load average at start %s\n", runtime.NumCPU(), runtime.GOMAXPROCS(0), runtime.Version(), strings.Join(strings.Fields(string(load))[:3], " "))
	results := map[string][]stageResult{} // stage -> one per size
	for _, n := range ns {
		file, full, half, err := prepare(*dir, n, *k, *seed, *bin)
		if err != nil {
			fmt.Fprintln(os.Stderr, "scale:", err)
			os.Exit(1)
		}
		for _, st := range sel {
			var best *stageResult
			for r := 0; r < *runs; r++ {
				args := []string{"run-stage", "-stage", st.name, "-verify=" + strconv.FormatBool(*verify && r == 0)}
				switch st.design {
				case "full":
					args = append(args, "-design", full)
				case "half":
					args = append(args, "-design", half)
				}
				cmd := exec.Command(self, append(args, file)...)
				cmd.Stderr = os.Stderr
				out, err := cmd.Output()
				if err != nil {
					fmt.Fprintf(os.Stderr, "scale: %s at N=%d: %v\n", st.name, n, err)
					os.Exit(1)
				}
				var res stageResult
				if err := json.Unmarshal(out, &res); err != nil {
					fmt.Fprintf(os.Stderr, "scale: %s at N=%d: %v\n", st.name, n, err)
					os.Exit(1)
				}
				if best != nil && best.Answer != res.Answer {
					fmt.Printf("MISMATCH %s N=%d: runs answer %q and %q\n", st.name, n, best.Answer, res.Answer)
				}
				if best != nil && best.Verified != "-" {
					res.Verified = best.Verified
				}
				if best == nil || res.ReadWall+res.Wall < best.ReadWall+best.Wall {
					best = &res
				}
			}
			results[st.name] = append(results[st.name], *best)
			fmt.Fprintf(os.Stderr, "scale: N=%d %-11s read %.2fs stage %.2fs peak %d MB %s [%s]\n", n, st.name, best.ReadWall, best.Wall, best.Peak>>20, best.Answer, best.Verified)
		}
	}
	printTable(sel, ns, results)
	if *jsonOut != "" {
		b, _ := json.MarshalIndent(results, "", "  ")
		os.WriteFile(*jsonOut, b, 0o644)
	}
}

func stageNames() string {
	var s []string
	for _, st := range stages {
		s = append(s, st.name)
	}
	return strings.Join(s, ",")
}

// prepare writes the ER workload of n states as an edge list (names 0..N-1)
// and the designs: a minimum one from Drivers (one signal per line) and
// its every other signal (half of it, the failing design of the check
// benchmarks).
func prepare(dir string, n int, k float64, seed uint64, bin bool) (file, full, half string, err error) {
	base := filepath.Join(dir, fmt.Sprintf("er-%d-%g-%d", n, k, seed))
	file, full, half = base+".edges", base+".full.design", base+".half.design"
	_, err1 := os.Stat(half)
	_, err2 := os.Stat(base + ".i32")
	if err1 == nil && (!bin || err2 == nil) {
		return file, full, half, nil
	}
	p, err := workload("er", n, k, 0)
	if err != nil {
		return
	}
	e, err := p.Edges(gen.NewRand(seed))
	if err != nil {
		return
	}
	if err = writeText(file, e); err != nil {
		return
	}
	if bin {
		if err = writeBin(base+".i32", e); err != nil {
			return
		}
	}
	e = nil
	in, err := netread.ReadFile(file, netread.Options{})
	if err != nil {
		return
	}
	g := in.Network
	// The costs of place-costs as a node table, for the command line
	// (states absent from the edge list are not in the network).
	var tb bytes.Buffer
	tb.WriteString("node,actuator_cost\n")
	for v := 0; v < g.N(); v++ {
		name := g.Name(int32(v))
		i, _ := strconv.ParseInt(name, 10, 64)
		fmt.Fprintf(&tb, "%s,%d\n", name, costOf(i))
	}
	if err = os.WriteFile(base+".costs.csv", tb.Bytes(), 0o644); err != nil {
		return
	}
	ds := structural.Drivers(g)
	var fb, hb bytes.Buffer
	for i, s := range ds.Inputs.Signals() {
		var line []byte
		for j, v := range s {
			if j > 0 {
				line = append(line, ' ')
			}
			line = g.AppendName(line, v)
		}
		line = append(line, '\n')
		fb.Write(line)
		if i%2 == 0 {
			hb.Write(line)
		}
	}
	if err = os.WriteFile(full, fb.Bytes(), 0o644); err != nil {
		return
	}
	err = os.WriteFile(half, hb.Bytes(), 0o644)
	return
}

// fit returns the least-squares slope of log y against log x.
func fit(x, y []float64) float64 {
	var sx, sy, sxx, sxy float64
	m := float64(len(x))
	for i := range x {
		lx, ly := math.Log(x[i]), math.Log(y[i])
		sx, sy, sxx, sxy = sx+lx, sy+ly, sxx+lx*lx, sxy+lx*ly
	}
	return (m*sxy - sx*sy) / (m*sxx - sx*sx)
}

// printTable prints one row per stage and size, then the fitted exponents.
// Ratios are to drivers on the same network: of the whole process (read
// and stage) in wall and in CPU time, and of the stage alone in wall time.
func printTable(sel []*stage, ns []int, results map[string][]stageResult) {
	w := bufio.NewWriter(os.Stdout)
	defer w.Flush()
	drv := results["drivers"]
	fmt.Fprintf(w, "%-11s %8s %9s %6s %7s %7s %7s %7s %7s %6s %6s %6s %6s  %s\n",
		"stage", "states", "edges", "read", "stage", "stage", "whole", "whole", "peak", "bytes", "ratio", "ratio", "ratio", "answer [independent check]")
	fmt.Fprintf(w, "%-11s %8s %9s %6s %7s %7s %7s %7s %7s %6s %6s %6s %6s\n",
		"", "", "", "wall s", "wall s", "CPU s", "wall s", "CPU s", "MB", "/edge", "wall", "CPU", "stage")
	for _, st := range sel {
		for i, r := range results[st.name] {
			d := drv[i]
			whole, dWhole := r.ReadWall+r.Wall, d.ReadWall+d.Wall
			cpu, dCPU := r.ReadCPU+r.CPU, d.ReadCPU+d.CPU
			fmt.Fprintf(w, "%-11s %8d %9d %6.2f %7.2f %7.2f %7.2f %7.2f %7d %6.0f %6.2f %6.2f %6.2f  %s [%s]\n",
				st.name, r.Nodes, r.Edges, r.ReadWall, r.Wall, r.CPU, whole, cpu, r.Peak>>20,
				float64(r.Peak)/float64(r.Edges), whole/dWhole, cpu/dCPU, r.Wall/d.Wall, r.Answer, r.Verified)
			if r.Nodes != d.Nodes || r.Edges != d.Edges {
				fmt.Fprintf(w, "MISMATCH %s N=%d: read %d states %d edges, drivers %d, %d\n", st.name, ns[i], r.Nodes, r.Edges, d.Nodes, d.Edges)
			}
			if strings.HasPrefix(r.Answer, "n_d=") && !strings.HasPrefix(r.Answer, d.Answer) {
				fmt.Fprintf(w, "MISMATCH %s N=%d: %q, drivers %q\n", st.name, ns[i], r.Answer, d.Answer)
			}
			if r.Verified != "ok" && r.Verified != "-" {
				fmt.Fprintf(w, "WRONG %s N=%d: %s\n", st.name, ns[i], r.Verified)
			}
		}
	}
	if len(ns) < 2 {
		return
	}
	fmt.Fprintf(w, "fitted exponent of time against edges over %d sizes (least squares on logs):\n", len(ns))
	fmt.Fprintf(w, "  %-11s %10s %10s %10s %10s\n", "stage", "stage wall", "stage CPU", "whole wall", "whole CPU")
	for _, st := range sel {
		rs := results[st.name]
		var e, sw, sc, ww, wc []float64
		for _, r := range rs {
			e = append(e, float64(r.Edges))
			sw = append(sw, math.Max(r.Wall, 1e-6))
			sc = append(sc, math.Max(r.CPU, 1e-6))
			ww = append(ww, r.ReadWall+r.Wall)
			wc = append(wc, r.ReadCPU+r.CPU)
		}
		fmt.Fprintf(w, "  %-11s %10.2f %10.2f %10.2f %10.2f\n", st.name, fit(e, sw), fit(e, sc), fit(e, ww), fit(e, wc))
	}
}
