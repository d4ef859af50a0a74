package render

import (
	"bytes"
	"context"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/netsteer/netsteer/io/render/gvlayout"
)

// childEnv tells this test binary, started again as the layout program,
// how to behave: "layout" runs the real layout program (gvlayout.Main);
// the others play broken programs.
const childEnv = "NETSTEER_RENDER_TEST_CHILD"

// TestMain makes this test binary the layout program: the tests draw
// through the same child process as netsteer does, without building
// netsteer-layout first.
func TestMain(m *testing.M) {
	switch os.Getenv(childEnv) {
	case "":
	case "layout":
		os.Exit(gvlayout.Main(os.Stdin, os.Stdout, os.Stderr, os.Args[1:]))
	case "stranger": // some other program of that name
		fmt.Println("<svg/>")
		os.Exit(0)
	case "sleeper":
		time.Sleep(time.Minute)
		os.Exit(0)
	case "flood":
		os.Stdout.WriteString(gvlayout.Header())
		os.Stdout.Write(bytes.Repeat([]byte("<g/>\n"), 1<<16))
		os.Exit(0)
	case "crash":
		fmt.Fprintln(os.Stderr, "\n  first words\nsecond line")
		os.Exit(3)
	default:
		os.Exit(99)
	}
	exe, err := os.Executable()
	if err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
	os.Setenv(LayoutEnv, exe)
	os.Setenv(childEnv, "layout")
	os.Exit(m.Run())
}

// TestProtocolAgrees: this package speaks the protocol of gvlayout (it
// cannot import it without linking Graphviz).
func TestProtocolAgrees(t *testing.T) {
	if layoutProtocol != gvlayout.Protocol {
		t.Errorf("render speaks protocol %d, gvlayout %d", layoutProtocol, gvlayout.Protocol)
	}
	if got, want := fmt.Sprintf("netsteer-layout protocol %d\n", layoutProtocol), gvlayout.Header(); got != want {
		t.Errorf("header %q, gvlayout writes %q", got, want)
	}
	for _, l := range layouts {
		found := false
		for _, e := range gvlayout.Engines {
			found = found || e == l.engine
		}
		if !found {
			t.Errorf("layout %s uses engine %q, which gvlayout does not accept", l.name, l.engine)
		}
	}
}

// executableFile writes an executable file (its content is never run).
func executableFile(t *testing.T, path string, mode os.FileMode) {
	t.Helper()
	if err := os.WriteFile(path, []byte("#!/bin/sh\n"), mode); err != nil {
		t.Fatal(err)
	}
}

// TestFindLayoutProgram: $NETSTEER_LAYOUT first, then the running
// program's directory, then $PATH; else a one-line error saying how to
// install it.
func TestFindLayoutProgram(t *testing.T) {
	beside, onPath, empty := t.TempDir(), t.TempDir(), t.TempDir()
	executableFile(t, filepath.Join(beside, LayoutProgram), 0o755)
	executableFile(t, filepath.Join(onPath, LayoutProgram), 0o755)
	notExec := t.TempDir()
	executableFile(t, filepath.Join(notExec, LayoutProgram), 0o644)
	exeIn := func(dir string) func() (string, error) {
		return func() (string, error) { return filepath.Join(dir, "netsteer"), nil }
	}
	for _, tc := range []struct {
		name, env, exeDir, path string
		want                    string // the path found, or a part of the error
		fails                   bool
	}{
		{name: "env", env: filepath.Join(onPath, LayoutProgram), exeDir: beside, path: onPath, want: filepath.Join(onPath, LayoutProgram)},
		{name: "env missing", env: filepath.Join(empty, "nosuch"), exeDir: beside, path: onPath, fails: true, want: LayoutEnv + "=" + filepath.Join(empty, "nosuch") + ": no such program"},
		{name: "beside", exeDir: beside, path: onPath, want: filepath.Join(beside, LayoutProgram)},
		{name: "path", exeDir: empty, path: onPath, want: filepath.Join(onPath, LayoutProgram)},
		{name: "not executable", exeDir: notExec, path: onPath, want: filepath.Join(onPath, LayoutProgram)},
		{name: "nowhere", exeDir: empty, path: empty, fails: true, want: "not found in " + empty + " or on $PATH: install it with `go install ./cmd/...` in the netsteer source tree"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			t.Setenv("PATH", tc.path)
			getenv := func(k string) string {
				if k == LayoutEnv {
					return tc.env
				}
				return os.Getenv(k)
			}
			got, err := findLayoutProgram(getenv, exeIn(tc.exeDir), exec.LookPath)
			if tc.fails {
				if err == nil {
					t.Fatalf("found %s, want an error", got)
				}
				if msg := err.Error(); !strings.Contains(msg, tc.want) || strings.Contains(msg, "\n") {
					t.Errorf("error %q, want one line containing %q", msg, tc.want)
				}
				return
			}
			if err != nil || got != tc.want {
				t.Errorf("got %q, %v; want %q", got, err, tc.want)
			}
		})
	}
}

// TestLayoutProgramFailures: what a user sees when the layout program is
// missing, of another protocol, fails, hangs or floods.
func TestLayoutProgramFailures(t *testing.T) {
	dot := []byte("digraph { a -> b }")
	draw := func() error {
		return Layout(context.Background(), dot, "dot", FormatSVG, &bytes.Buffer{})
	}
	t.Run("missing", func(t *testing.T) {
		t.Setenv(LayoutEnv, filepath.Join(t.TempDir(), "nosuch"))
		if err := draw(); err == nil || !strings.Contains(err.Error(), LayoutEnv) {
			t.Errorf("error %v, want one naming %s", err, LayoutEnv)
		}
	})
	t.Run("stranger", func(t *testing.T) {
		t.Setenv(childEnv, "stranger")
		if err := draw(); err == nil || !strings.Contains(err.Error(), "does not speak the layout protocol 1") {
			t.Errorf("error %v, want a protocol mismatch", err)
		}
	})
	t.Run("crash", func(t *testing.T) {
		t.Setenv(childEnv, "crash")
		if err := draw(); err == nil || err.Error() != "render: first words" {
			t.Errorf("error %v, want the child's first line", err)
		}
	})
	t.Run("sleeper", func(t *testing.T) {
		t.Setenv(childEnv, "sleeper")
		defer func(d time.Duration) { LayoutTimeout = d }(LayoutTimeout)
		LayoutTimeout = 300 * time.Millisecond
		t0 := time.Now()
		err := draw()
		if err == nil || !strings.Contains(err.Error(), "stopped after 300ms") {
			t.Errorf("error %v, want a time-out", err)
		}
		if d := time.Since(t0); d > 30*time.Second {
			t.Errorf("the time-out took %v", d)
		}
	})
	t.Run("cancelled", func(t *testing.T) {
		t.Setenv(childEnv, "sleeper")
		ctx, cancel := context.WithCancel(context.Background())
		time.AfterFunc(200*time.Millisecond, cancel)
		err := Layout(ctx, dot, "dot", FormatSVG, &bytes.Buffer{})
		if err == nil || !strings.Contains(err.Error(), "context canceled") {
			t.Errorf("error %v, want cancelled", err)
		}
	})
	t.Run("flood", func(t *testing.T) {
		t.Setenv(childEnv, "flood")
		defer func(n int) { maxLayoutOutput = n }(maxLayoutOutput)
		maxLayoutOutput = 1 << 16
		if err := draw(); err == nil || !strings.Contains(err.Error(), "wrote more than") {
			t.Errorf("error %v, want the output limit", err)
		}
	})
	t.Run("bad DOT", func(t *testing.T) {
		err := Layout(context.Background(), []byte("digraph { a -> "), "dot", FormatSVG, &bytes.Buffer{})
		if err == nil || !strings.HasPrefix(err.Error(), "render: netsteer-layout: Graphviz rejected the DOT text") {
			t.Errorf("error %v, want Graphviz's complaint", err)
		}
	})
}
