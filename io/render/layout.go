package render

import (
	"fmt"
	"path/filepath"
	"sort"
	"strings"
)

// layoutEngine is a Graphviz engine with the graph attributes netsteer
// sets for it.
type layoutEngine struct {
	name   string // the name a user gives
	engine string // the Graphviz engine
	attrs  []string
	help   string
}

// The layouts, measured with go-graphviz v0.2.10 (Graphviz 12.1.2) on
// random digraphs of three edges per node (see BenchmarkLayout).
//
// "dot" is hierarchical with the network simplex and crossing
// minimisation cut short (nslimit, nslimit1, mclimit) and straight edges:
// spline routing and full crossing minimisation dominate the time and grow
// much faster than the graph. "dot-splines" keeps the short cuts but routes
// curved edges, slower and nicer below a hundred nodes or so. "sfdp" is
// force-directed and fast, with prism overlap removal (without it nodes
// pile up); "neato" is force-directed for small graphs.
var layouts = []*layoutEngine{
	{name: "dot", engine: "dot", attrs: []string{"rankdir=LR", "splines=line", "nslimit=1", "nslimit1=1", "mclimit=0.1", "ranksep=0.45", "nodesep=0.18"},
		help: "left to right in layers, straight edges, tuned for speed"},
	{name: "dot-splines", engine: "dot", attrs: []string{"rankdir=LR", "nslimit=1", "nslimit1=1", "mclimit=0.1", "ranksep=0.45", "nodesep=0.18"},
		help: "left to right in layers, curved edges; slow past about 100 nodes"},
	{name: "sfdp", engine: "sfdp", attrs: []string{"overlap=prism", "splines=line", "K=0.6"},
		help: "force-directed, for loosely layered networks"},
	{name: "neato", engine: "neato", attrs: []string{"overlap=false", "splines=line"},
		help: "force-directed (spring model), small networks"},
	{name: "circo", engine: "circo", attrs: []string{"splines=line"},
		help: "circular, for networks made of loops"},
}

// AutoLayout names the default: "dot" for shallow views, "sfdp" for the
// others (see autoLayout).
const AutoLayout = "auto"

// Layouts returns the layout names with a line of help each, "auto" first.
func Layouts() [][2]string {
	out := [][2]string{{AutoLayout, "dot when the view has few layers, sfdp otherwise (default)"}}
	for _, l := range layouts {
		out = append(out, [2]string{l.name, l.help})
	}
	return out
}

// ChooseLayout resolves a layout name for view v: "auto" (or "") picks
// one, and any other name is checked.
func ChooseLayout(name string, v *View) (string, error) {
	if name == "" || name == AutoLayout {
		return autoLayout(v), nil
	}
	if _, err := engine(name); err != nil {
		return "", err
	}
	return name, nil
}

func engine(name string) (*layoutEngine, error) {
	for _, l := range layouts {
		if l.name == name {
			return l, nil
		}
	}
	names := []string{AutoLayout}
	for _, l := range layouts {
		names = append(names, l.name)
	}
	sort.Strings(names)
	return nil, fmt.Errorf("render: unknown layout %q (want %s)", name, strings.Join(names, ", "))
}

// Format is an output format.
type Format string

// The output formats.
const (
	FormatSVG Format = "svg"
	FormatPNG Format = "png"
	FormatDOT Format = "dot"
)

// FormatOf returns the format implied by a file name's extension.
func FormatOf(path string) (Format, error) {
	switch strings.ToLower(filepath.Ext(path)) {
	case ".svg":
		return FormatSVG, nil
	case ".png":
		return FormatPNG, nil
	case ".dot", ".gv":
		return FormatDOT, nil
	}
	return "", fmt.Errorf("render: cannot tell the format of %q: want a name ending in .svg, .png or .dot", path)
}
