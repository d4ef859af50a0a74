package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// Progress goes to standard error only when it is a terminal, and the last
// status line is cleared, so nothing is left behind the answer.
func TestStatusOnlyOnTerminal(t *testing.T) {
	dir := t.TempDir()
	net := filepath.Join(dir, "n.edges")
	if err := os.WriteFile(net, []byte("a b\nb c\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, tty := range []bool{false, true} {
		var out, errb bytes.Buffer
		e := &env{Stdin: strings.NewReader(""), Stdout: &out, Stderr: &errb, StderrIsTTY: tty}
		if st := run(e, []string{"drivers", net}); st != exitOK {
			t.Fatalf("tty=%v: exit %d, stderr %q", tty, st, errb.String())
		}
		got := errb.String()
		if !tty && got != "" {
			t.Errorf("not a terminal: stderr = %q, want nothing", got)
		}
		if tty {
			for _, want := range []string{"netsteer: reading ", "netsteer: matching and components (3 states, 2 edges)..."} {
				if !strings.Contains(got, want) {
					t.Errorf("terminal: stderr %q lacks %q", got, want)
				}
			}
			if !strings.HasSuffix(got, "\r\033[K") {
				t.Errorf("terminal: stderr %q does not end by clearing the status line", got)
			}
		}
		if !strings.Contains(out.String(), "needs 1 independent control signal") {
			t.Errorf("tty=%v: stdout %q", tty, out.String())
		}
	}
}
