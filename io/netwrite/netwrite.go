package netwrite

import (
	"bufio"
	"compress/gzip"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"path/filepath"
	"strconv"
	"strings"

	"github.com/netsteer/netsteer/io/fileout"
	"github.com/netsteer/netsteer/structural"
)

// Format names an output format.
type Format string

// The formats WriteFile understands.
const (
	EdgeList     Format = "edges"
	MatrixMarket Format = "mtx"
)

// FormatOf returns the format implied by a file name: .mtx (through .gz)
// is Matrix Market, anything else an edge list.
func FormatOf(path string) Format {
	name := strings.TrimSuffix(strings.ToLower(path), ".gz")
	if filepath.Ext(name) == ".mtx" {
		return MatrixMarket
	}
	return EdgeList
}

// ParseFormat checks a format name given by a user.
func ParseFormat(s string) (Format, error) {
	switch s {
	case "edges", "edgelist", "edge-list", "txt":
		return EdgeList, nil
	case "mtx", "matrix-market", "mm":
		return MatrixMarket, nil
	}
	return "", fmt.Errorf("netwrite: unknown format %q (want edges or mtx)", s)
}

// NodeTablePath returns the node table that goes with an edge-list file:
// the path less its .gz and extension, plus ".nodes.csv" (net.edges.gz ->
// net.nodes.csv).
func NodeTablePath(path string) string {
	base := path
	if strings.HasSuffix(strings.ToLower(base), ".gz") {
		base = base[:len(base)-3] // as Compressed, in any case
	}
	if ext := filepath.Ext(base); ext != "" && !strings.ContainsAny(ext, `/\`) {
		base = strings.TrimSuffix(base, ext)
	}
	return base + ".nodes.csv"
}

// nameNeedsQuotes reports whether an edge-list reader would split or
// misread the name unquoted.
func nameNeedsQuotes(s string) bool {
	if s == "" || s[0] == '#' || s[0] == '%' {
		return true
	}
	return strings.ContainsAny(s, " \t\v\f\r,\"")
}

// appendName appends a state name as an edge-list field.
func appendName(b []byte, s string) ([]byte, error) {
	if strings.ContainsRune(s, '\n') {
		return b, fmt.Errorf("netwrite: state name %q holds a line break, which an edge list cannot carry", s)
	}
	if !nameNeedsQuotes(s) {
		return append(b, s...), nil
	}
	b = append(b, '"')
	b = append(b, strings.ReplaceAll(s, `"`, `""`)...)
	return append(b, '"'), nil
}

// WriteEdges writes g as an edge list, one "u v" line per edge (with the
// weight as a third field when g has weights), sources in state order.
func WriteEdges(w io.Writer, g *structural.Network) error {
	bw := bufio.NewWriterSize(w, 1<<16)
	var line []byte
	var err error
	for u := int32(0); int(u) < g.N(); u++ {
		nu := g.Name(u)
		for k := g.Out().Ptr[u]; k < g.Out().Ptr[u+1]; k++ {
			line = line[:0]
			if line, err = appendName(line, nu); err != nil {
				return err
			}
			line = append(line, ' ')
			if line, err = appendName(line, g.Name(g.Out().Adj[k])); err != nil {
				return err
			}
			if g.Weights() != nil {
				line = append(line, ' ')
				line = strconv.AppendFloat(line, g.Weights()[k], 'g', -1, 64)
			}
			line = append(line, '\n')
			if _, err := bw.Write(line); err != nil {
				return err
			}
		}
	}
	return bw.Flush()
}

// WriteNodeTable writes a node table listing every state of g, each
// marked isolated=yes: it exists whether or not an edge names it, so that
// the table reads back with the network without errors.
func WriteNodeTable(w io.Writer, g *structural.Network) error {
	cw := csv.NewWriter(bufio.NewWriterSize(w, 1<<16))
	cw.Write([]string{"node", "isolated"})
	rec := []string{"", "yes"}
	for v := int32(0); int(v) < g.N(); v++ {
		rec[0] = g.Name(v)
		if err := cw.Write(rec); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}

// WriteIntNodeTable writes the node table of n states named base..base+n-1
// without building a network, marked isolated=yes like WriteNodeTable.
func WriteIntNodeTable(w io.Writer, n, base int) error {
	bw := bufio.NewWriterSize(w, 1<<16)
	bw.WriteString("node,isolated\n")
	var b []byte
	for i := 0; i < n; i++ {
		b = strconv.AppendInt(b[:0], int64(i+base), 10)
		b = append(b, ",yes\n"...)
		if _, err := bw.Write(b); err != nil {
			return err
		}
	}
	return bw.Flush()
}

// WriteMatrixMarket writes g as a Matrix Market coordinate matrix A with
// A[v][u] != 0 for every edge u -> v: "pattern" entries, or "real" ones
// holding the weights. States become their 1-based indices; when the
// names differ from those indices, comment lines "% state I NAME" (NAME
// written as in an edge list) record them after the line "% state names:
// state I is the I-th row and column", so that nothing is lost: netread
// reads them back as the state names.
func WriteMatrixMarket(w io.Writer, g *structural.Network) error {
	bw := bufio.NewWriterSize(w, 1<<16)
	field := "pattern"
	if g.Weights() != nil {
		field = "real"
	}
	fmt.Fprintf(bw, "%%%%MatrixMarket matrix coordinate %s general\n", field)
	fmt.Fprintf(bw, "%% entry (i, j): state j acts on state i (A[i][j] != 0)\n")
	var line []byte
	if !NamesAreIndices(g) {
		fmt.Fprintf(bw, "%% state names: state I is the I-th row and column\n")
		for v := int32(0); int(v) < g.N(); v++ {
			line = append(strconv.AppendInt(append(line[:0], "% state "...), int64(v)+1, 10), ' ')
			var err error
			if line, err = appendName(line, g.Name(v)); err != nil {
				return err
			}
			if _, err := bw.Write(append(line, '\n')); err != nil {
				return err
			}
		}
	}
	fmt.Fprintf(bw, "%d %d %d\n", g.N(), g.N(), g.Edges())
	for u := int32(0); int(u) < g.N(); u++ {
		for k := g.Out().Ptr[u]; k < g.Out().Ptr[u+1]; k++ {
			line = strconv.AppendInt(line[:0], int64(g.Out().Adj[k])+1, 10)
			line = append(line, ' ')
			line = strconv.AppendInt(line, int64(u)+1, 10)
			if g.Weights() != nil {
				line = append(line, ' ')
				line = strconv.AppendFloat(line, g.Weights()[k], 'g', -1, 64)
			}
			line = append(line, '\n')
			if _, err := bw.Write(line); err != nil {
				return err
			}
		}
	}
	return bw.Flush()
}

// NamesAreIndices reports whether state i of g is named i+1 for every i,
// as in a Matrix Market file or a generated network.
func NamesAreIndices(g *structural.Network) bool {
	var b []byte
	for v := int32(0); int(v) < g.N(); v++ {
		b = strconv.AppendInt(b[:0], int64(v)+1, 10)
		if g.Name(v) != string(b) {
			return false
		}
	}
	return true
}

// Written says which files WriteFile wrote.
type Written struct {
	Network   string // the network file
	NodeTable string // the node table, or "" when none was written
	Format    Format
}

// Options control WriteFile.
type Options struct {
	// Format forces a format; empty means by extension (FormatOf).
	Format Format
	// NodeTable is where an edge list's node table goes; empty means
	// NodeTablePath(path). Ignored for Matrix Market.
	NodeTable string
	// Stdout receives the network when path is "-" (then no node table is
	// written unless NodeTable names one).
	Stdout io.Writer
}

// WriteFile writes g to path in the chosen format, gzip-compressed when
// path ends in .gz, with a node table beside an edge list.
func WriteFile(path string, g *structural.Network, opt Options) (Written, error) {
	f := opt.Format
	if f == "" {
		f = FormatOf(path)
	}
	wr := Written{Network: path, Format: f}
	write := WriteEdges
	if f == MatrixMarket {
		write = WriteMatrixMarket
	}
	err := fileout.Write(path, opt.Stdout, func(w io.Writer) error {
		return Compressed(path, w, func(w io.Writer) error { return write(w, g) })
	})
	if err != nil {
		return wr, err
	}
	if f == MatrixMarket {
		return wr, nil
	}
	nt := opt.NodeTable
	if nt == "" {
		if path == "-" || path == "" {
			return wr, nil
		}
		nt = NodeTablePath(path)
	}
	if nt == path {
		return wr, errors.New("netwrite: the node table would overwrite the network file")
	}
	wr.NodeTable = nt
	return wr, fileout.Write(nt, opt.Stdout, func(w io.Writer) error { return WriteNodeTable(w, g) })
}

// Compressed runs fill on w, through a gzip writer when path ends in .gz.
func Compressed(path string, w io.Writer, fill func(io.Writer) error) error {
	if !strings.HasSuffix(strings.ToLower(path), ".gz") {
		return fill(w)
	}
	zw, err := gzip.NewWriterLevel(w, gzip.BestSpeed)
	if err != nil {
		return err
	}
	if err := fill(zw); err != nil {
		return err
	}
	return zw.Close()
}
