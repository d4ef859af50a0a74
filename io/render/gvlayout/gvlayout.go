package gvlayout

import (
	"bytes"
	"context"
	"errors"
	"flag"
	"fmt"
	"io"
	"runtime/debug"
	"strings"
	"sync"

	"github.com/goccy/go-graphviz"
)

// Protocol is the version of the exchange described in the package
// documentation. Package render holds the same number; a test checks that
// the two agree.
const Protocol = 1

// Header returns the first line of the output when -protocol is given.
func Header() string { return fmt.Sprintf("netsteer-layout protocol %d\n", Protocol) }

// MaxInput bounds the DOT text read from standard input, in bytes.
const MaxInput = 256 << 20

// Engines are the Graphviz layout engines accepted.
var Engines = []string{"circo", "dot", "fdp", "neato", "osage", "patchwork", "sfdp", "twopi"}

// Outputs are the output kinds: "svg" is Graphviz's SVG as it writes it
// (with its DOCTYPE line), "json" its JSON output with xdot drawing
// operations.
var Outputs = []string{"json", "svg"}

// mu serialises every use of Graphviz: go-graphviz keeps one global
// WebAssembly instance that is not safe for concurrent use.
var mu sync.Mutex

// Layout lays out the DOT text with the Graphviz engine and writes the
// output kind ("svg" or "json") to w. One layout runs at a time in a
// process.
func Layout(ctx context.Context, dot []byte, engine, output string, w io.Writer) error {
	if !contains(Engines, engine) {
		return fmt.Errorf("gvlayout: unknown engine %q (want %s)", engine, strings.Join(Engines, ", "))
	}
	if !contains(Outputs, output) {
		return fmt.Errorf("gvlayout: unknown output %q (want %s)", output, strings.Join(Outputs, ", "))
	}
	mu.Lock()
	defer mu.Unlock()
	gv, err := graphviz.New(ctx)
	if err != nil {
		return fmt.Errorf("gvlayout: starting Graphviz: %v", err)
	}
	defer gv.Close()
	graph, err := graphviz.ParseBytes(dot)
	if err != nil {
		return fmt.Errorf("gvlayout: Graphviz rejected the DOT text: %v", err)
	}
	defer graph.Close()
	gv.SetLayout(graphviz.Layout(engine))
	var buf bytes.Buffer
	if err := gv.Render(ctx, graph, graphviz.Format(output), &buf); err != nil {
		return fmt.Errorf("gvlayout: Graphviz layout: %v", err)
	}
	if buf.Len() == 0 {
		return errors.New("gvlayout: Graphviz produced no output")
	}
	_, err = w.Write(buf.Bytes())
	return err
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}

const usage = `Usage: netsteer-layout [-engine ENGINE] [-output svg|json] < FILE.dot

Lays out Graphviz DOT text read on standard input with Graphviz (compiled
to WebAssembly, github.com/goccy/go-graphviz) and writes the picture on
standard output. "netsteer render" and "netsteer report" run it to draw;
netsteer finds it through $NETSTEER_LAYOUT, else next to the netsteer
program, else on $PATH. Install both from the source tree with
  go install ./cmd/...

Options:
  -engine ENGINE   Graphviz layout engine: %s (default dot)
  -output KIND     svg, or json (Graphviz's JSON with xdot drawing operations)
  -protocol N      the exchange version the caller speaks (netsteer passes it);
                   the output then starts with the line "netsteer-layout protocol N"
  -version         print the protocol and the go-graphviz version

Exit status: 0 when the picture was written, 2 on error (one line on
standard error).

Example:
  netsteer render plant.edges -o plant.dot
  netsteer-layout -engine dot -output svg < plant.dot > plant.svg
`

// Main is the netsteer-layout program: it parses args (without the
// program's name), reads the DOT text from stdin and writes the result to
// stdout. It returns the exit status: 0 on success, 2 on error, with one
// line on stderr.
func Main(stdin io.Reader, stdout, stderr io.Writer, args []string) int {
	fail := func(format string, a ...any) int {
		msg := fmt.Sprintf(format, a...)
		msg = strings.TrimPrefix(msg, "gvlayout: ")
		fmt.Fprintln(stderr, "netsteer-layout: "+oneLine(msg))
		return 2
	}
	fs := flag.NewFlagSet("netsteer-layout", flag.ContinueOnError)
	fs.SetOutput(io.Discard)
	engine := fs.String("engine", "dot", "")
	output := fs.String("output", "svg", "")
	protocol := fs.Int("protocol", 0, "")
	showVersion := fs.Bool("version", false, "")
	if err := fs.Parse(args); err != nil {
		if errors.Is(err, flag.ErrHelp) {
			fmt.Fprintf(stdout, usage, strings.Join(Engines, ", "))
			return 0
		}
		return fail("%v (see netsteer-layout -help)", err)
	}
	if fs.NArg() > 0 {
		return fail("unexpected argument %q: the DOT text comes on standard input (see netsteer-layout -help)", fs.Arg(0))
	}
	if *showVersion {
		fmt.Fprintf(stdout, "netsteer-layout protocol %d, go-graphviz %s\n", Protocol, graphvizVersion())
		return 0
	}
	if *protocol != 0 && *protocol != Protocol {
		return fail("protocol %d asked, this program speaks protocol %d: build netsteer and netsteer-layout from the same source (go build -o DIR ./cmd/...)", *protocol, Protocol)
	}
	if !contains(Engines, *engine) {
		return fail("unknown engine %q (want %s)", *engine, strings.Join(Engines, ", "))
	}
	if !contains(Outputs, *output) {
		return fail("unknown output %q (want svg or json)", *output)
	}
	dot, err := io.ReadAll(io.LimitReader(stdin, MaxInput+1))
	if err != nil {
		return fail("reading standard input: %v", err)
	}
	if len(dot) > MaxInput {
		return fail("the DOT text on standard input is larger than %d MiB", MaxInput>>20)
	}
	if len(bytes.TrimSpace(dot)) == 0 {
		return fail("no DOT text on standard input")
	}
	var out bytes.Buffer
	if *protocol != 0 {
		out.WriteString(Header())
	}
	if err := Layout(context.Background(), dot, *engine, *output, &out); err != nil {
		return fail("%v", err)
	}
	if _, err := stdout.Write(out.Bytes()); err != nil {
		return fail("writing the output: %v", err)
	}
	return 0
}

// oneLine joins the lines of a message with "; ".
func oneLine(s string) string {
	var parts []string
	for _, l := range strings.Split(s, "\n") {
		if l = strings.TrimSpace(l); l != "" {
			parts = append(parts, l)
		}
	}
	return strings.Join(parts, "; ")
}

// graphvizVersion returns the go-graphviz module version linked in.
func graphvizVersion() string {
	if bi, ok := debug.ReadBuildInfo(); ok {
		for _, d := range bi.Deps {
			if d.Path == "github.com/goccy/go-graphviz" {
				return d.Version
			}
		}
	}
	return "(unknown version)"
}
