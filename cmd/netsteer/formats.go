package main

import (
	"fmt"
	"strings"

	"github.com/netsteer/netsteer/io/netread"
)

// inputFormat describes one format netread reads, for "netsteer help
// formats": its --input-format name, the extensions that choose it (those
// netread.FormatOf maps to it; a test checks both against netread) and
// what a file holds.
type inputFormat struct {
	format netread.Format
	exts   []string
	what   string
}

var inputFormats = []inputFormat{
	{netread.EdgeList, []string{".edges", ".txt", ".tsv", ".csv"}, `one edge per line, "source target [weight]", separated by white space or a comma; # and % start comments; a line with one name declares an isolated state; quote names holding spaces, commas or quotes CSV-style ("feed pump, north"). Also delimited tables (spreadsheet exports): --columns SOURCE,TARGET[,WEIGHT] by header name or 1-based position, --separator comma, tab, semicolon or whitespace (default: detected). Also any extension not listed below.`},
	{netread.MatrixMarket, []string{".mtx"}, "Matrix Market coordinate (pattern, real or integer; general, symmetric or skew-symmetric): entry (i, j) is the edge j -> i; states are named 1..N, or by the \"% state I NAME\" comment lines netsteer writes."},
	{netread.DOT, []string{".dot", ".gv"}, "a DOT digraph: u -> v, chains, subgraphs, node statements, a weight attribute; an undirected graph's a -- b is a two-way coupling; label and group attributes are kept."},
	{netread.GraphML, []string{".graphml", ".xml"}, "one <graph>: <node id> names a state, <edge source target> follows edgedefault unless its own directed says otherwise (a graph without edgedefault is refused unless every edge says); data keys named label and group give labels and groups."},
	{netread.GML, []string{".gml"}, "graph [ directed 1 node [ id 0 label \"pump\" ] edge [ source 0 target 1 ] ], as networkx and igraph write it; without directed 1 the graph is undirected."},
	{netread.Pajek, []string{".net", ".paj"}, "*Vertices, then *Arcs (*Edges are two-way; *Arcslist and *Edgeslist give several targets a line); states are named by their labels when distinct."},
	{netread.NodeLinkJSON, []string{".json"}, `node-link JSON as networkx's node_link_data writes it: {"directed": true, "nodes": [{"id": "pump"}], "links": [{"source": "pump", "target": "drum"}]}; without directed the graph is undirected.`},
}

const formatsIntro = `Network files

An edge "u v" means u acts on v: the entry A[v][u] of the state matrix is a
free nonzero parameter. The format is recognised by the file's content (a
Matrix Market banner, digraph {, <?xml or <graphml, graph [, *Vertices, a
JSON object), then by its extension, else the file is an edge list;
--input-format NAME forces it (any case); - reads standard input.
gzip-compressed files are recognised by their content (--max-inflate bounds
their expansion).

`

const formatsOutro = `
In GraphML, GML and JSON every node an edge names must be declared. In DOT,
GraphML, GML and JSON edge weights come from the attribute --weight-key
names (default weight). A self-loop "v v" is a state's own dynamics;
repeated edges are merged and counted, and their weights add up.
--self-dynamics gives every state a self-loop; --undirected reads every edge
as a two-way coupling. --node-table FILE adds device costs, allowed and
existing devices, groups and labels (see the README).

Bad input stops with one line "FILE:LINE: what is wrong" and exit status 2.
`

// formatsHelp is "netsteer help formats": one entry per format netread
// reads, in the order of netread.Formats.
var formatsHelp = func() string {
	var b strings.Builder
	b.WriteString(formatsIntro)
	for _, f := range inputFormats {
		head := string(f.format)
		if len(f.exts) > 0 {
			head += " (" + strings.Join(f.exts, ", ") + ")"
		}
		b.WriteString(wrapText(fmt.Sprintf("%s: %s", head, f.what), 76, "  ", "      "))
	}
	b.WriteString(formatsOutro)
	return b.String()
}()

// wrapText fills words into lines of at most width columns (a longer word
// gets a line of its own), the first line starting with first and the
// others with rest.
func wrapText(s string, width int, first, rest string) string {
	var b strings.Builder
	line := first
	for i, w := range strings.Fields(s) {
		switch {
		case i == 0:
			line += w
		case len(line)+1+len(w) > width:
			b.WriteString(line + "\n")
			line = rest + w
		default:
			line += " " + w
		}
	}
	b.WriteString(line + "\n")
	return b.String()
}
