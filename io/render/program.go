package render

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"strings"
	"sync"
	"time"
)

// Graphviz runs in a program of its own, netsteer-layout (package
// render/gvlayout), so that this package and the commands built on it do
// not link go-graphviz, whose package initialisation starts a WebAssembly
// runtime in every program that links it.

// LayoutProgram is the name of the layout program.
const LayoutProgram = "netsteer-layout"

// LayoutEnv names the environment variable that gives the layout
// program's path, overriding the search.
const LayoutEnv = "NETSTEER_LAYOUT"

// layoutProtocol is the exchange spoken with the layout program; it must
// equal gvlayout.Protocol (checked by a test: this package must not import
// gvlayout).
const layoutProtocol = 1

// LayoutTimeout bounds the time one layout may take; the layout program
// is stopped after it. The default view of a network lays out in seconds.
var LayoutTimeout = 10 * time.Minute

// maxLayoutOutput bounds the output read from the layout program, and
// maxLayoutErr its standard error kept for the message.
var (
	maxLayoutOutput = 512 << 20
	maxLayoutErr    = 64 << 10
)

// InstallHint says how to install the layout program.
const InstallHint = "install it with `go install ./cmd/...` in the netsteer source tree, or `go build -o DIR ./cmd/...` there to put it beside netsteer, or set " + LayoutEnv + " to its path; .dot output needs no layout program"

// FindLayoutProgram returns the path of the layout program: $NETSTEER_LAYOUT
// when set, else netsteer-layout in the directory of the running program,
// else netsteer-layout on $PATH. The error is one line saying how to
// install it.
func FindLayoutProgram() (string, error) {
	return findLayoutProgram(os.Getenv, os.Executable, exec.LookPath)
}

func findLayoutProgram(getenv func(string) string, executable func() (string, error), lookPath func(string) (string, error)) (string, error) {
	if p := getenv(LayoutEnv); p != "" {
		path, err := lookPath(p)
		if err != nil {
			return "", fmt.Errorf("render: %s=%s: no such program (%v)", LayoutEnv, p, unwrapExec(err))
		}
		return path, nil
	}
	name := LayoutProgram
	if runtime.GOOS == "windows" {
		name += ".exe"
	}
	where := "on $PATH"
	if exe, err := executable(); err == nil {
		dir := filepath.Dir(exe)
		if path, err := lookPath(filepath.Join(dir, name)); err == nil {
			return path, nil
		}
		where = "in " + dir + " or on $PATH"
	}
	if path, err := lookPath(LayoutProgram); err == nil {
		return path, nil
	}
	return "", fmt.Errorf("render: the layout program %s, which draws SVG and PNG, was not found %s: %s", LayoutProgram, where, InstallHint)
}

// unwrapExec drops the "exec: NAME:" prefix of a look-up error.
func unwrapExec(err error) error {
	var e *exec.Error
	if errors.As(err, &e) {
		return e.Err
	}
	return err
}

// gvMu lets one layout run at a time in a process: Graphviz's memory and
// time grow fast with the graph, and two at once would share two cores.
var gvMu sync.Mutex

// Layout lays the DOT text out with the named layout's engine and writes
// the picture in format f (SVG or PNG) to w. Graphviz runs in the layout
// program (see FindLayoutProgram), which is stopped when ctx is done or
// after LayoutTimeout. Only one layout runs at a time in a process. The
// SVG has no DOCTYPE (and so no reference to an external DTD).
func Layout(ctx context.Context, dot []byte, layout string, f Format, w io.Writer) error {
	kind := "svg"
	switch f {
	case FormatSVG:
	case FormatPNG:
		kind = "json"
		dot = pngDOT(dot) // Graphviz's JSON loses labels after a dashed cell
	default:
		return fmt.Errorf("render: Graphviz output format %q not supported (want svg or png)", f)
	}
	out, err := layoutRaw(ctx, dot, layout, kind)
	if err != nil {
		return err
	}
	if f == FormatPNG {
		return drawPNG(out, w)
	}
	_, err = w.Write(stripDoctype(out))
	return err
}

// layoutRaw runs the layout program for the named layout and returns its
// output of the given kind ("svg" or "json").
func layoutRaw(ctx context.Context, dot []byte, layout, kind string) ([]byte, error) {
	eng, err := engine(layout)
	if err != nil {
		return nil, err
	}
	prog, err := FindLayoutProgram()
	if err != nil {
		return nil, err
	}
	gvMu.Lock()
	defer gvMu.Unlock()
	return runLayout(ctx, prog, eng.engine, kind, dot)
}

var errLayoutTimeout = errors.New("render: layout timeout")

// runLayout runs the layout program on the DOT text and returns its
// output without the protocol line.
func runLayout(ctx context.Context, prog, engine, kind string, dot []byte) ([]byte, error) {
	ctx, cancel := context.WithTimeoutCause(ctx, LayoutTimeout, errLayoutTimeout)
	defer cancel()
	cmd := exec.CommandContext(ctx, prog, "-protocol", fmt.Sprint(layoutProtocol), "-engine", engine, "-output", kind)
	cmd.Stdin = bytes.NewReader(dot)
	stderr := &headBuffer{max: maxLayoutErr}
	cmd.Stderr = stderr
	cmd.WaitDelay = 5 * time.Second
	pipe, err := cmd.StdoutPipe()
	if err != nil {
		return nil, fmt.Errorf("render: layout program %s: %v", prog, err)
	}
	if err := cmd.Start(); err != nil {
		return nil, fmt.Errorf("render: layout program %s: %v", prog, unwrapExec(err))
	}
	out, readErr := io.ReadAll(io.LimitReader(pipe, int64(maxLayoutOutput)+1))
	tooBig := len(out) > maxLayoutOutput
	if tooBig || readErr != nil {
		cmd.Process.Kill()
	}
	waitErr := cmd.Wait()
	switch {
	case context.Cause(ctx) == errLayoutTimeout:
		return nil, fmt.Errorf("render: the layout was stopped after %v; draw a smaller view (fewer nodes)", LayoutTimeout)
	case ctx.Err() != nil:
		return nil, fmt.Errorf("render: layout stopped: %w", context.Cause(ctx))
	case tooBig:
		return nil, fmt.Errorf("render: layout program %s wrote more than %s; draw a smaller view", prog, sizeText(maxLayoutOutput))
	case waitErr != nil:
		if line := firstLine(stderr.Bytes()); line != "" {
			return nil, fmt.Errorf("render: %s", line)
		}
		return nil, fmt.Errorf("render: layout program %s: %v", prog, waitErr)
	case readErr != nil:
		return nil, fmt.Errorf("render: reading from layout program %s: %v", prog, readErr)
	}
	header := fmt.Sprintf("netsteer-layout protocol %d\n", layoutProtocol)
	if !bytes.HasPrefix(out, []byte(header)) {
		return nil, fmt.Errorf("render: %s does not speak the layout protocol %d of this netsteer: build netsteer and netsteer-layout from the same source (go build -o DIR ./cmd/...)", prog, layoutProtocol)
	}
	out = out[len(header):]
	if len(out) == 0 {
		return nil, errors.New("render: Graphviz produced no output")
	}
	return out, nil
}

// sizeText writes a byte count in MiB when it is a whole number of them.
func sizeText(n int) string {
	if n >= 1<<20 && n%(1<<20) == 0 {
		return fmt.Sprintf("%d MiB", n>>20)
	}
	return fmt.Sprintf("%d bytes", n)
}

// firstLine returns the first non-empty line of b, trimmed.
func firstLine(b []byte) string {
	for _, l := range strings.Split(string(b), "\n") {
		if l = strings.TrimSpace(l); l != "" {
			return l
		}
	}
	return ""
}

// headBuffer keeps the first max bytes written to it and discards the
// rest.
type headBuffer struct {
	bytes.Buffer
	max int
}

func (h *headBuffer) Write(p []byte) (int, error) {
	if room := h.max - h.Len(); room > 0 {
		if len(p) > room {
			h.Buffer.Write(p[:room])
		} else {
			h.Buffer.Write(p)
		}
	}
	return len(p), nil
}

// stripDoctype removes the <!DOCTYPE ...> declaration Graphviz writes,
// which names an external DTD; SVG needs none.
func stripDoctype(svg []byte) []byte {
	i := bytes.Index(svg, []byte("<!DOCTYPE"))
	if i < 0 {
		return svg
	}
	j := bytes.IndexByte(svg[i:], '>')
	if j < 0 {
		return svg
	}
	end := i + j + 1
	if end < len(svg) && svg[end] == '\n' {
		end++
	}
	return append(svg[:i:i], svg[end:]...)
}
