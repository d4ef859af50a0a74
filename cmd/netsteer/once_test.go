package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestRepeatedOptions checks that an option taking one value, given
// twice, is a usage error naming it (pflag alone keeps the last value
// silently), while repeatable list options stay repeatable.
func TestRepeatedOptions(t *testing.T) {
	dir := t.TempDir()
	t.Chdir(dir)
	for name, body := range map[string]string{
		"net.edges": "a b\nb c\n",
		"a.txt":     "a\n",
		"b.txt":     "b\n",
	} {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	for _, c := range []struct {
		args []string
		want int
		msg  string // in standard error
	}{
		{[]string{"check", "net.edges", "--inputs", "a.txt", "--inputs", "b.txt"}, exitError, `--inputs given twice ("a.txt", then "b.txt"): it takes one value`},
		{[]string{"check", "net.edges", "--inputs=a.txt", "--inputs=a.txt"}, exitError, `--inputs given twice`},
		{[]string{"drivers", "-o", "x.json", "--output", "y.json", "net.edges"}, exitError, `-o/--output given twice ("x.json", then "y.json")`},
		{[]string{"drivers", "-o", "x.json", "-o", "x.json", "net.edges"}, exitError, `-o/--output given twice`},
		{[]string{"drivers", "--format=json", "--format", "text", "net.edges"}, exitError, `--format given twice ("json", then "text")`},
		{[]string{"drivers", "--node-table", "a.csv", "--node-table", "b.csv", "net.edges"}, exitError, `--node-table given twice`},
		{[]string{"drivers", "--all", "--all", "net.edges"}, exitError, `--all given twice`},
		{[]string{"verify", "--seed", "1", "--seed", "2", "net.edges", "--inputs", "a.txt"}, exitError, `--seed given twice ("1", then "2")`},
		{[]string{"generate", "er", "--nodes", "5", "--nodes", "6", "--mean-degree", "1", "-o", "g.edges"}, exitError, `--nodes given twice ("5", then "6")`},
		// Once each: the command runs (a -> b -> c from a: controllable).
		{[]string{"check", "net.edges", "--inputs", "a.txt", "--format", "json", "-o", "c.json"}, exitOK, ""},
		// --transform is a list, applied in order.
		{[]string{"vary", "net.edges", "--transform", "loops=1", "--transform", "loops=1", "-o", "v.edges"}, exitOK, ""},
	} {
		var out, errb bytes.Buffer
		got := run(&env{Stdin: strings.NewReader(""), Stdout: &out, Stderr: &errb}, c.args)
		if got != c.want {
			t.Errorf("netsteer %s: exit %d, want %d; stderr %q", strings.Join(c.args, " "), got, c.want, errb.String())
			continue
		}
		if c.msg != "" && !strings.Contains(errb.String(), c.msg) {
			t.Errorf("netsteer %s: stderr %q, want it to say %q", strings.Join(c.args, " "), errb.String(), c.msg)
		}
		if c.want == exitError && strings.Count(errb.String(), "\n") != 1 {
			t.Errorf("netsteer %s: stderr %q, want one line", strings.Join(c.args, " "), errb.String())
		}
	}
}
