package main

import (
	"bufio"
	"io"
	"os"
	"strings"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/netwrite"
	"github.com/netsteer/netsteer/io/textout"
	"github.com/netsteer/netsteer/structural/analysis"
	"github.com/netsteer/netsteer/structural/gen"
)

var generateCmd = &command{
	name:    "generate",
	summary: "generate a random or regular network (er, scale-free, small-world, regular, grid, tree)",
	usage: `Usage: netsteer generate MODEL [options] -o FILE

Generates a directed network and writes it as an edge list ("u v": u acts
on v) with a node table beside it (FILE less its extension, plus
.nodes.csv) that lists all N states, isolated ones included; read the two
back with --node-table. An existing file there that netsteer did not write
is not overwritten unless --output-node-table names it. A .mtx FILE is written as Matrix Market instead,
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
	flags: generateFlags,
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

func generateFlags(e *env, fs *pflag.FlagSet) func([]string) error {
	var mf modelFlags
	mf.register(fs)
	seed := fs.Uint64("seed", 1, "random seed")
	var nw netOut
	nw.register(fs)
	sf := summaryFlags(fs)
	return func(args []string) error {
		if len(args) != 1 {
			return usagef("want one model (%s), got %d arguments", strings.Join(gen.Models, ", "), len(args))
		}
		if err := nw.check(); err != nil {
			return err
		}
		format, err := sf()
		if err != nil {
			return err
		}
		p, err := gen.FromSettings(args[0], mf.given())
		if err != nil {
			return usagef("%s", describe(err))
		}
		written, edges, err := netwrite.WriteGenerated(nw.output, p, *seed,
			netwrite.Options{Format: nw.format(), NodeTable: nw.nodeTablePath(), Stdout: e.Stdout})
		if err != nil {
			return err
		}
		r := analysis.Generated(p, *seed, edges)
		r.Output, r.NodeTable = written.Network, written.NodeTable
		return writeSummary(e, format, nw.output == "-", textout.Generate{R: r, EdgeList: written.Format == netwrite.EdgeList})
	}
}

// netOut is the network file a command writes (-o), its format and its
// node table.
type netOut struct {
	output, outFormat, nodeTable string
}

func (n *netOut) register(fs *pflag.FlagSet) {
	fs.StringVarP(&n.output, "output", "o", "", "network file to write (- for standard output)")
	fs.StringVar(&n.outFormat, "output-format", "", "network file format: edges or mtx (default: from the file name)")
	fs.StringVar(&n.nodeTable, "output-node-table", "", "where the node table goes (default: beside the edge list)")
}

// check refuses -o settings that cannot be written, or would be written
// over a file that is not the command's own (sideTableFree).
func (n *netOut) check() error {
	if n.output == "" {
		return usagef("-o FILE is required")
	}
	if n.outFormat != "" {
		if _, err := netwrite.ParseFormat(n.outFormat); err != nil {
			return usagef("--output-format: %s", describe(err))
		}
	}
	if n.format() == netwrite.MatrixMarket && n.nodeTable != "" {
		return usagef("--output-node-table goes with an edge list; a Matrix Market file keeps N in its size line")
	}
	if err := refuseGzip("--output-node-table", n.nodeTable, "the node table is plain CSV"); err != nil {
		return err
	}
	if nt := n.nodeTablePath(); nt != "" && nt == n.output {
		return usagef("the node table would overwrite %s", n.output)
	}
	return n.sideTableFree()
}

// writtenTableHeader is the header of the node tables netwrite writes
// (WriteNodeTable, WriteIntNodeTable): names and isolated marks only.
const writtenTableHeader = "node,isolated"

// sideTableFree refuses to write the node table beside the edge list
// over a file of that name that netsteer did not write: -o names the
// network file only, and a node table there is most likely the user's own
// (costs, allowed states). One that holds only the names and isolated
// marks netsteer writes (its header says so) is replaced, so that a
// command can be rerun; --output-node-table naming the file overwrites
// any.
func (n *netOut) sideTableFree() error {
	nt := n.nodeTablePath()
	if nt == "" || n.nodeTable != "" {
		return nil
	}
	f, err := os.Open(nt)
	if err != nil {
		if _, lerr := os.Lstat(nt); lerr != nil {
			return nil // nothing there
		}
	} else {
		line, _ := bufio.NewReaderSize(io.LimitReader(f, 256), 256).ReadString('\n')
		f.Close()
		if strings.TrimRight(line, "\r\n") == writtenTableHeader {
			return nil
		}
	}
	return usagef("%s exists and is not a node table netsteer wrote: choose another -o, or give --output-node-table %s to overwrite it", nt, nt)
}

func (n *netOut) format() netwrite.Format {
	if n.outFormat != "" {
		f, _ := netwrite.ParseFormat(n.outFormat)
		return f
	}
	return netwrite.FormatOf(n.output)
}

// nodeTablePath is where an edge list's node table goes ("" for none).
func (n *netOut) nodeTablePath() string {
	if n.format() == netwrite.MatrixMarket {
		return ""
	}
	if n.nodeTable == "" && n.output != "-" {
		return netwrite.NodeTablePath(n.output)
	}
	return n.nodeTable
}

// summaryFlags registers --format for a command whose -o is a network
// file; the summary goes to standard output (standard error when the
// network does).
func summaryFlags(fs *pflag.FlagSet) func() (string, error) {
	format := fs.String("format", "text", "summary format: text, json or csv")
	return func() (string, error) {
		f := strings.ToLower(*format)
		switch f {
		case "text", "json", "csv":
			return f, nil
		}
		return "", usagef("--format %q: want text, json or csv", *format)
	}
}

func writeSummary(e *env, format string, toStderr bool, r report) error {
	w := e.Stdout
	if toStderr {
		w = e.Stderr
	}
	of := outFlags{format: format, output: "-"}
	return of.write(&env{Stdout: w, Width: e.Width}, r)
}
