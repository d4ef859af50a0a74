// Package gvlayout lays out Graphviz DOT text with Graphviz compiled to
// WebAssembly (github.com/goccy/go-graphviz): the only netsteer package
// that links Graphviz. It is the body of the netsteer-layout program, which
// package render runs as a child process, so that go-graphviz's package
// initialisation (a WebAssembly runtime started and its compiled code
// cached under the temporary directory) costs only the commands that draw.
//
// The exchange with package render (protocol 1): render runs
//
//	netsteer-layout -protocol 1 -engine ENGINE -output svg|json
//
// with the DOT text on standard input. On success the program writes the
// line "netsteer-layout protocol 1" and then Graphviz's output (SVG, or
// the JSON layout with xdot drawing operations that render's PNG drawer
// reads) on standard output and exits 0; on failure it writes one line on
// standard error and exits 2. A program that speaks another protocol
// refuses with a line saying so; without -protocol it writes the bare
// output, for use by hand.
package gvlayout
