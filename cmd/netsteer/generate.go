package main

import (
	"bufio"
	"encoding/csv"
	"fmt"
	"io"
	"strconv"
	"strings"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/fileout"
	"github.com/netsteer/netsteer/io/netwrite"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/gen"
)

var generateCmd = &command{
	name:    "generate",
	summary: "generate a random or regular network (er, scale-free, small-world, regular, grid, tree)",
	usage: `Usage: netsteer generate MODEL [options] -o FILE

Generates a directed network and writes it as an edge list ("u v": u acts
on v) with a node table beside it (FILE less its extension, plus
.nodes.csv) that lists all N states, isolated ones included; read the two
back with --node-table. A .mtx FILE is written as Matrix Market instead,
whose size line keeps N. A .gz FILE is gzip-compressed. States are named
1..N. The same --seed gives the same network on every machine.

Models and their options (mean degree <k> = 2L/N counts in plus out):
  er           --nodes N --mean-degree K   G(N, L) with L = round(K N / 2)
  scale-free   --nodes N --mean-degree K --gamma-out G --gamma-in G
               static model (Goh, Kahng & Kim 2001), in- and out-degrees
               independent power laws; exponents > 2, inf for none
  small-world  --nodes N --degree D --rewire P [--two-way]
               ring of D successors each (two-way: D/2 either side), each
               target rewired at random with probability P
  regular      --nodes N --degree D --side both|out|in
               every state has D targets and/or D sources
  grid         --nodes N --width W --directions right,down
               2-D lattice laid out row by row; directions from right,
               left, down, up, all (right,down: a feed-forward process
               train; all: a meshed grid)
  tree         --nodes N --branching B [--two-way]
               leader-follower hierarchy, B followers per leader (0: each
               follower picks a random earlier leader); two-way adds
               reports from follower to leader

The summary gives N, L and the cavity prediction of the driver fraction
when the model's degree distributions are known in closed form.

Example:
  netsteer generate er --nodes 100000 --mean-degree 4 --seed 7 -o er.edges
  netsteer drivers --node-table er.nodes.csv er.edges
  netsteer generate scale-free --nodes 1000000 --mean-degree 6 --gamma-out 2.5 --gamma-in 3 -o sf.mtx
`,
	run: runGenerate,
}

func init() { register(generateCmd) }

// modelFlags are the model parameter options shared by generate and sweep.
type modelFlags struct {
	fs    *pflag.FlagSet
	vals  map[string]*string
	names []string
}

func (m *modelFlags) register(fs *pflag.FlagSet) {
	m.fs = fs
	m.vals = map[string]*string{}
	for _, s := range gen.AllParamSpecs() {
		flag := strings.ReplaceAll(s.Name, "_", "-")
		help := s.Help
		if s.Default != "" {
			help += " (default " + s.Default + ")"
		}
		m.vals[s.Name] = fs.String(flag, "", help)
		m.names = append(m.names, s.Name)
	}
	fs.Lookup("two-way").NoOptDefVal = "true"
}

// given returns the options set on the command line, by parameter name.
func (m *modelFlags) given() map[string]string {
	out := map[string]string{}
	for _, n := range m.names {
		if m.fs.Changed(strings.ReplaceAll(n, "_", "-")) {
			out[n] = *m.vals[n]
		}
	}
	return out
}

func runGenerate(e *env, c *command, fs *pflag.FlagSet, args []string) int {
	var mf modelFlags
	mf.register(fs)
	seed := fs.Uint64("seed", 1, "random seed")
	output := fs.StringP("output", "o", "", "network file to write (- for standard output)")
	outFormat := fs.String("output-format", "", "network file format: edges or mtx (default: from the file name)")
	nodeTable := fs.String("output-node-table", "", "where the node table goes (default: beside the edge list)")
	format := fs.String("format", "text", "summary format: text, json or csv")
	if ok, st := parse(e, c, fs, args); !ok {
		return st
	}
	if fs.NArg() != 1 {
		return usageError(e, c, "want one model (%s), got %d arguments", strings.Join(gen.Models, ", "), fs.NArg())
	}
	if *output == "" {
		return usageError(e, c, "-o FILE is required")
	}
	if err := (&outFlags{format: *format}).check(); err != nil {
		return usageError(e, c, "%v", err)
	}
	model := fs.Arg(0)
	p, err := gen.FromSettings(model, mf.given())
	if err != nil {
		return usageError(e, c, "%s", strings.TrimPrefix(err.Error(), "gen: "))
	}
	f := netwrite.FormatOf(*output)
	if *outFormat != "" {
		if f, err = netwrite.ParseFormat(*outFormat); err != nil {
			return usageError(e, c, "--output-format: %v", err)
		}
	}
	if f == netwrite.MatrixMarket && *nodeTable != "" {
		return usageError(e, c, "--output-node-table goes with an edge list; a Matrix Market file keeps N in its size line")
	}
	rng := gen.NewRand(*seed)
	var edges int64
	written := netwrite.Written{Network: *output, Format: f}
	if f == netwrite.MatrixMarket {
		g, err := p.Network(rng)
		if err != nil {
			return fail(e, err)
		}
		if written, err = netwrite.WriteFile(*output, g, netwrite.Options{Format: f, Stdout: e.Stdout}); err != nil {
			return fail(e, err)
		}
		edges = int64(g.Edges())
	} else {
		// Stream the edges straight into the file.
		err := fileout.Write(*output, e.Stdout, func(w io.Writer) error {
			return netwrite.Compressed(*output, w, func(w io.Writer) error {
				ew := netwrite.NewEdgeWriter(w, 1)
				if err := p.Generate(rng, ew); err != nil {
					return err
				}
				edges = ew.Edges()
				return ew.Flush()
			})
		})
		if err != nil {
			return fail(e, err)
		}
		nt := *nodeTable
		if nt == "" && *output != "-" {
			nt = netwrite.NodeTablePath(*output)
		}
		if nt != "" {
			if nt == *output {
				return usageError(e, c, "the node table would overwrite %s", *output)
			}
			err := fileout.Write(nt, e.Stdout, func(w io.Writer) error { return netwrite.WriteIntNodeTable(w, p.Nodes, 1) })
			if err != nil {
				return fail(e, err)
			}
			written.NodeTable = nt
		}
	}
	pred := -1.0
	if out, in, ok := p.Distributions(); ok {
		if v, err := structural.CavityDriverFraction(out, in); err == nil {
			pred = v
		}
	}
	sum := &genSummary{model: model, p: p, seed: *seed, edges: edges, written: written, predicted: pred}
	w := e.Stdout
	if *output == "-" {
		w = e.Stderr
	}
	switch *format {
	case "json":
		return genFinish(e, sum.writeJSON(w))
	case "csv":
		return genFinish(e, sum.writeCSV(w))
	}
	return genFinish(e, sum.writeText(w))
}

func genFinish(e *env, err error) int {
	if err != nil {
		return fail(e, err)
	}
	return exitOK
}

type genSummary struct {
	model     string
	p         gen.Params
	seed      uint64
	edges     int64
	written   netwrite.Written
	predicted float64
}

func (s *genSummary) params() [][2]string {
	out := [][2]string{}
	for _, st := range s.p.Settings() {
		out = append(out, [2]string{st.Name, st.Value})
	}
	return out
}

func (s *genSummary) meanDegree() float64 { return 2 * float64(s.edges) / float64(s.p.Nodes) }

func (s *genSummary) writeText(w io.Writer) error {
	bw := bufio.NewWriter(w)
	fmt.Fprintf(bw, "Wrote %s: %s, %s (model %s, mean degree <k> = 2L/N = %.4g).\n",
		s.written.Network, count(s.p.Nodes, "state", "states"), count(int(s.edges), "edge", "edges"), s.model, s.meanDegree())
	if s.written.NodeTable != "" {
		fmt.Fprintf(bw, "Node table with all %d states: %s (read back with --node-table %s).\n", s.p.Nodes, s.written.NodeTable, s.written.NodeTable)
	} else if s.written.Format == netwrite.EdgeList {
		fmt.Fprintf(bw, "No node table written: states without edges are missing from the edge list.\n")
	}
	if s.predicted >= 0 {
		fmt.Fprintf(bw, "Cavity prediction of the driver fraction for this model: n_D = %.4g (Liu, Slotine & Barabasi 2011).\n", s.predicted)
	}
	fmt.Fprintf(bw, "\nseed %d", s.seed)
	for _, kv := range s.params() {
		fmt.Fprintf(bw, ", %s %s", kv[0], kv[1])
	}
	fmt.Fprintf(bw, "\n\n%s", caution)
	return bw.Flush()
}

func (s *genSummary) writeJSON(w io.Writer) error {
	j := newJSON(bufio.NewWriter(w))
	j.val("model", s.model)
	j.int("nodes", s.p.Nodes)
	j.val("edges", s.edges)
	j.float("mean_degree", s.meanDegree())
	j.val("seed", s.seed)
	params := map[string]string{}
	for _, kv := range s.params() {
		params[kv[0]] = kv[1]
	}
	j.val("params", params)
	j.val("output", s.written.Network)
	j.val("node_table", s.written.NodeTable)
	if s.predicted >= 0 {
		j.float("predicted_fraction", s.predicted)
	} else {
		j.val("predicted_fraction", nil)
	}
	return j.end()
}

func (s *genSummary) writeCSV(w io.Writer) error {
	cw := csv.NewWriter(w)
	pred := ""
	if s.predicted >= 0 {
		pred = strconv.FormatFloat(s.predicted, 'g', 10, 64)
	}
	var ps []string
	for _, kv := range s.params() {
		ps = append(ps, kv[0]+"="+kv[1])
	}
	cw.Write([]string{"model", "nodes", "edges", "mean_degree", "seed", "params", "output", "node_table", "predicted_fraction"})
	cw.Write([]string{s.model, strconv.Itoa(s.p.Nodes), strconv.FormatInt(s.edges, 10),
		strconv.FormatFloat(s.meanDegree(), 'g', 12, 64), strconv.FormatUint(s.seed, 10),
		strings.Join(ps, ";"), s.written.Network, s.written.NodeTable, pred})
	cw.Flush()
	return cw.Error()
}
