// Package netread reads networks into structural.Network values: edge
// lists and delimited tables, Matrix Market coordinate files, DOT, GraphML,
// GML, Pajek and node-link JSON. Read and ReadFile return an Input: the
// network, the format read, the labels and groups the file gave its
// states, and the SHA-256 and size of the bytes read (before
// decompression), so that a report certifies exactly what was analysed,
// standard input included.
//
// Conventions. In an edge list a line "u v" is the edge u -> v: u acts on v.
// In a Matrix Market file the entry (i, j) is A[i][j] != 0, the edge j -> i,
// and states are named by their 1-based indices. In DOT, "u -> v" is the
// edge u -> v; in GraphML, GML, Pajek and JSON an edge from source to
// target is source -> target, and an undirected edge is the two couplings.
//
// Which format. Options.Format forces one; Options.Columns or
// Options.Separator mean an edge list or table. Otherwise the content decides
// when its start announces a format (see Sniff: a Matrix Market banner, a
// DOT graph, GraphML, GML, Pajek, node-link JSON), whatever the file is
// called and on standard input too; otherwise the extension (FormatOf);
// otherwise an edge list. Gzip-compressed input is recognised by its magic
// bytes; past the first InflateAllowance bytes (256 MiB) of decompressed
// data, decompression stops with an error once the data so far are more
// than Options.MaxInflateRatio (default 100) times the compressed bytes
// read so far, a likely decompression bomb.
//
// Edge lists. Each line is "source target [weight]", the fields separated
// by white space or a comma; names holding a space, comma or quote are
// double-quoted, "" standing for a quote inside. A line with a single name
// declares an isolated state (one holding an unquoted semicolon is refused:
// the file is most likely separated by semicolons). Lines whose first
// non-blank character is '#' or '%' are comments. A leading UTF-8
// byte-order mark is skipped (also inside gzip input). A name may not hold
// a control character (a byte below 0x20 other than tab, or 0x7f), quoted
// or not. The first non-comment line is refused as a CSV header, with a
// message saying that columns can be chosen by name, when its first two
// fields are source,target, from,to, src,dst or tail,head (any case, quoted
// or not) and it is not exactly three fields ending in a number; or when
// it has exactly three fields and the third is weight, value or w (any
// case). No other line is ever taken for a header. When the first line
// would be an error this way but one separator alone reads it (a semicolon
// in a single field; more than three fields that a tab, comma or
// semicolon alone splits into two or three), the file is read with that
// separator.
//
// Tables. Options.Columns picks the source, target and weight columns by
// header name or 1-based position, Options.Separator sets the separator or
// leaves it to be detected (see Columns); other columns are ignored.
// Tables go through the same parallel block parser as edge lists; a line
// may hold up to 64 KiB. A row with one field declares an isolated state,
// unless the field holds another separator (comma, tab, semicolon)
// unquoted; a file in which no row reaches the columns is refused. Content
// that announces another format (Sniff) is refused with Columns or
// Separator set, not read as a table.
//
// Matrix Market. Coordinate files with pattern, real or integer values and
// general, symmetric or skew-symmetric symmetry are read; symmetric files
// are expanded (an off-diagonal (i, j) also gives (j, i)), skew-symmetric
// ones too with the value negated, and a diagonal entry in a skew-symmetric
// file is an error. The matrix must be square. A stored entry is an edge
// whatever its value: an explicit zero counts as a pattern entry (with
// Options.Weights its weight is 0). Complex, hermitian and dense array
// files are refused. The size line must announce exactly the entries that
// follow, and at most 16 states per entry plus 2^20. States are named by
// their indices, or by the names netsteer's writer records in comment
// lines ("% state names: ..." then "% state I NAME", I = 1..N in order).
//
// DOT. The file holds one graph, parsed with gonum's DOT parser. Edge
// statements may chain (a -> b -> c) and take subgraphs as operands
// ({a b} -> c stands for a -> c and b -> c); node statements declare
// states, isolated ones included, and their label and group attributes
// are returned. An undirected graph's "a -- b" is the two couplings a -> b
// and b -> a. The weight attribute (Options.WeightKey), on an edge
// statement or as an "edge [weight=...]" default for the rest of its
// (sub)graph, must be a finite nonzero number. A name is the ID's text: a
// quoted ID loses its quotes and \" becomes ", other IDs (HTML ones <...>
// included) are kept as written; names may not hold line breaks or other
// control characters (tab excepted). Ports are ignored. Syntax errors carry
// the line gonum's parser reports (its message clipped); an unterminated
// string or comment is reported where it starts; errors found later carry
// the line of the ID or edge operator at fault. Inputs over MaxDOTBytes,
// braces nested over 1000 deep, edge chains over 100000 steps and subgraph
// operands that expand to far more edges than the file has bytes are
// refused.
//
// GraphML. One <graph>; <node id> elements name the states, <edge source
// target> elements are directed as the graph's edgedefault says unless
// their own directed attribute says otherwise (a graph without
// edgedefault, which GraphML requires, is refused unless every edge says
// its direction); parallel edges are merged
// and counted. Data whose key (attr.name) is label or group give labels
// and groups, the key named Options.WeightKey ("weight") the weights; key
// defaults apply. Nested graphs and hyperedges are refused. An XML token
// may hold 1 MiB, elements nest 256 deep.
//
// GML. As networkx and igraph write it: "graph [ directed 1 node [ id 0
// label "a" ] edge [ source 0 target 1 ] ]"; without directed the graph is
// undirected, as those libraries read it. States are named by label when
// every node has a distinct one (networkx), else by the name attribute
// likewise (igraph), else by id; labels not used as names and group
// attributes are returned. Strings decode HTML entities (&#252;, &amp;).
//
// Pajek. "*Vertices N" with lines "k label [x y ...]", then sections
// *Arcs, *Edges (two-way), *Arcslist and *Edgeslist; a third number on an
// arc is its weight. States are named by their labels when these (with the
// numbers of vertices without a line) are distinct, else by number with
// the labels returned. N is checked against what the file holds (16 per
// arc or label line plus 2^20) before any state is made for it.
//
// Node-link JSON. As networkx's node_link_data writes it: "directed"
// (false when absent, as networkx reads it), "nodes" with "id" (a string or
// a number, the name), "label" and "group", and "links" or "edges" with
// "source", "target" and the weight key. A JSON token may hold 1 MiB,
// values nest 1000 deep.
//
// In GraphML, GML and JSON every node an edge names must be declared, and
// declared once. Every error is an *Error that prints as "FILE:LINE:
// message" and wraps its cause (errors.Is(err, fs.ErrNotExist) for a
// missing file); values echoed in messages are clipped. Limits are checked
// before memory is reserved: a header's claims never size an allocation on
// their own, and a name longer than MaxNameBytes is an error. "-" reads
// Options.Stdin (os.Stdin when nil).
package netread
