// Package render draws the controllability answer for a design review, at
// any size: the control structure itself (each signal's stem, the cycles
// hung from it), counts by plant area, degree and stem-length
// distributions, the condensation labelled by what each component is, or
// the network with the answer on it (signals, stems and cycles, unreached
// states, dilation witnesses, source components), each with a title
// carrying the summary numbers and a legend.
//
// Conventions. An edge u -> v means u acts on v (A[v][u] != 0), as in
// package structural. The matched edges of a maximum matching of [A B]
// form vertex-disjoint paths and cycles; a path starts at a state fed by
// an input: that path is a stem. The matched edges not on a stem lie on
// cycles (a matched self-loop is a cycle of length one). Stems and cycles
// are the edges that carry control (Lin 1974; Liu, Slotine & Barabási
// 2011) and are drawn heavier. This package draws them; it computes none
// of them (structural/analysis does).
//
// A picture is built from an analysis.Review by FromReview: the control
// structure of the design judged, placed or, failing both, of the driver
// set (analysis.Review.Structure, read from the matching behind the
// verdict), its unreached states and dilation, the outputs and their
// verdict, and the new devices of a cheapest completion. Select chooses
// the view (Kind): Control, Groups and Degrees draw the answer itself and
// are laid out here in time linear in the network, whatever its size;
// Whole, Around and Components are graphs laid out by Graphviz, whose time
// grows with the cube of what they draw, so Select refuses one estimated
// past Options.Budget with a *BudgetError before any layout starts. Auto
// draws the whole network up to Options.MaxNodes states and the control
// structure above, and says which in the view's description. DrawView
// writes SVG or PNG (and DOT text for the Graphviz views); a title and a
// legend drawn here frame every picture, the legend drawing the marks it
// explains. SVG pictures have a viewBox and a width of 100 %, so they scale
// to their container, and a min-width that keeps their smallest text at
// 10 pixels or more (MinWidth): a wide picture scrolls rather than shrink
// its text.
//
// Graphviz runs in a program of its own, netsteer-layout (package
// gvlayout below this one; cmd/netsteer-layout), which the Graphviz views
// start for each picture, DOT text on its standard input and the layout on
// its standard output. This package does not import go-graphviz: Go runs
// every linked package's initialisation in every command, and
// go-graphviz's starts a WebAssembly runtime (tens of megabytes, a tenth
// of a second, a compilation cache under the temporary directory), which
// the commands that do not draw must not pay. FindLayoutProgram says where
// the program is looked for. Layout renders one graph at a time (a package
// mutex), and LayoutTimeout stops a layout that runs away.
//
// Visual language. Colours come from the Okabe–Ito palette (Okabe & Ito,
// "Color Universal Design", 2008), chosen to stay distinct under the common
// colour-vision deficiencies, and every colour is paired with a second cue
// (line width, dash, shape or periphery) so that a grey-scale print still
// reads:
//
//	input signal u1, u2, ...   orange circle (a pill in the control view), dashed orange arrow
//	                           to each state it drives; numbered by structural.Design.Number
//	new device                 the same shape hollow, with a dashed outline and its cost
//	output signal y1, y2, ...  bluish-green box, dotted green arrow from each state it senses
//	driven state               sky-blue fill
//	sensed state               double green outline
//	unreached state            yellow fill, dashed outline
//	dilation witness state     vermillion tint fill, bold outline
//	stem edge                  heavy blue
//	cycle edge                 heavy vermillion (a vermilion ring where cycles hang, in the
//	                           control view)
//	other edge                 thin grey; edges between components grey, wider for more
//	source component           dashed reddish-purple frame (two or more states)
//	group (node table)         rounded grey frame with the group's name
//	role critical / intermittent / redundant   box / octagon / ellipse
package render
