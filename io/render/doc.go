// Package render draws a network with its controllability answer on it:
// the states, the independent input and output signals, the matching edges
// that carry control (stems and cycles), unreached states, dilation
// witnesses and source components, with a title carrying the summary
// numbers and a legend.
//
// Conventions. An edge u -> v means u acts on v (A[v][u] != 0), as in
// package structural. A matching is a structural matching of the network
// (RowMate[u] = v means the edge u -> v is matched); its matched edges form
// vertex-disjoint paths and cycles. A path starts at a state whose
// in-copy is unmatched, which an input must drive: that path is a stem. The
// matched edges not on a stem lie on cycles (a matched self-loop is a cycle
// of length one). Stems and cycles are the edges that carry control (Lin
// 1974; Liu, Slotine & Barabási 2011) and are drawn heavier.
//
// A picture is built in three steps. Select chooses what to show: the whole
// network, or when it has more than Options.MaxNodes states its condensation
// (one node per strongly connected component), the neighbourhood of some
// states, or the driven states and their stems. DOT writes the chosen view as
// Graphviz DOT text with a deterministic order and every name escaped for
// DOT, SVG and HTML. Layout lays the DOT text out with Graphviz, compiled to
// WebAssembly (github.com/goccy/go-graphviz), into SVG or PNG.
//
// Graphviz runs in a program of its own, netsteer-layout (package
// gvlayout below this one; cmd/netsteer-layout), which Layout starts for
// each picture, DOT text on its standard input and the layout on its
// standard output. This package does not import go-graphviz: Go runs every
// linked package's initialisation in every command, and go-graphviz's
// starts a WebAssembly runtime (tens of megabytes, a tenth of a second, a
// compilation cache under the temporary directory), which the commands
// that do not draw must not pay. FindLayoutProgram says where the program
// is looked for. Layout renders one graph at a time (a package mutex);
// Select caps the size of what reaches it, and LayoutTimeout stops a
// layout that runs away.
//
// Visual language. Colours come from the Okabe–Ito palette (Okabe & Ito,
// "Color Universal Design", 2008), chosen to stay distinct under the common
// colour-vision deficiencies, and every colour is paired with a second cue
// (line width, dash, shape or periphery) so that a grey-scale print still
// reads:
//
//	input signal u1, u2, ...   orange circle, dashed orange arrow to each state it drives
//	output signal y1, y2, ...  bluish-green box, dotted green arrow from each state it senses
//	driven state               sky-blue fill
//	sensed state               double green outline
//	unreached state            yellow fill, dashed outline
//	dilation witness state     vermillion tint fill, bold outline
//	stem edge                  heavy blue
//	cycle edge                 heavy vermillion
//	other edge                 thin grey
//	source component           dashed reddish-purple frame (two or more states)
//	group (node table)         rounded grey frame with the group's name
//	role critical / intermittent / redundant   box / octagon / ellipse
package render
