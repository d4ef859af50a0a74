package netwrite

import (
	"io"
	"strconv"
	"strings"

	"github.com/netsteer/netsteer/io/fileout"
	"github.com/netsteer/netsteer/structural/gen"
)

// WriteGenerated writes the network that p generates with the given seed
// (gen.NewRand(seed)) to path, in opt's format. An edge list is streamed
// edge by edge (no network held in memory) after a comment line that
// remakes it (GeneratedHeader), with a node table of all p.Nodes states,
// isolated ones included, at opt.NodeTable or beside it; a Matrix Market
// file is built in memory, its size line keeping N. It returns what was
// written and the number of edges.
func WriteGenerated(path string, p gen.Params, seed uint64, opt Options) (Written, int64, error) {
	rng := gen.NewRand(seed)
	wr := Written{Network: path, Format: opt.Format}
	if wr.Format == "" {
		wr.Format = FormatOf(path)
	}
	if wr.Format == MatrixMarket {
		g, err := p.Network(rng)
		if err != nil {
			return wr, 0, err
		}
		wr, err = WriteFile(path, g, Options{Format: wr.Format, Stdout: opt.Stdout})
		return wr, int64(g.Edges()), err
	}
	var edges int64
	err := fileout.Write(path, opt.Stdout, func(w io.Writer) error {
		return Compressed(path, w, func(w io.Writer) error {
			if _, err := io.WriteString(w, GeneratedHeader(p, seed)); err != nil {
				return err
			}
			ew := NewEdgeWriter(w, 1)
			if err := p.Generate(rng, ew); err != nil {
				return err
			}
			edges = ew.Edges()
			return ew.Flush()
		})
	})
	if err != nil {
		return wr, edges, err
	}
	nt := opt.NodeTable
	if nt == "" && path != "-" {
		nt = NodeTablePath(path)
	}
	if nt != "" {
		if err := fileout.Write(nt, opt.Stdout, func(w io.Writer) error { return WriteIntNodeTable(w, p.Nodes, 1) }); err != nil {
			return wr, edges, err
		}
		wr.NodeTable = nt
	}
	return wr, edges, nil
}

// GeneratedHeader is the first line of a generated edge list: the
// command, the model's parameters and the seed that make the file again.
func GeneratedHeader(p gen.Params, seed uint64) string {
	s := "# netsteer generate " + p.Model + " --nodes=" + strconv.Itoa(p.Nodes)
	if p.Model == "er" || p.Model == "scale-free" {
		s += " --mean-degree=" + gen.FormatFloat(p.MeanDegree)
	}
	for _, kv := range p.Settings() {
		s += " --" + strings.ReplaceAll(kv.Name, "_", "-") + "=" + kv.Value
	}
	return s + " --seed=" + strconv.FormatUint(seed, 10) + "\n"
}
