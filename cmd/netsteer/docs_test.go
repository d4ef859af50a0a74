package main

import (
	"io"
	"os"
	"sort"
	"strings"
	"testing"

	"github.com/spf13/pflag"
)

// The README documents every command and every option the help lists:
// the help texts and the README are checked against the one registry of
// commands, so they cannot drift apart silently.
func TestREADMECoversEveryOption(t *testing.T) {
	b, err := os.ReadFile("../../README.md")
	if err != nil {
		t.Fatal(err)
	}
	readme := string(b)
	var missing []string
	for name, c := range commands {
		if !strings.Contains(readme, "netsteer "+name) {
			missing = append(missing, "command "+name)
		}
		fs := pflag.NewFlagSet(name, pflag.ContinueOnError)
		fs.SetOutput(io.Discard)
		c.flags(&env{Stdin: strings.NewReader(""), Stdout: io.Discard, Stderr: io.Discard}, fs)
		fs.VisitAll(func(f *pflag.Flag) {
			if !strings.Contains(readme, "--"+f.Name) {
				missing = append(missing, name+" --"+f.Name)
			}
		})
		if !strings.Contains(c.usage, "Example:") {
			missing = append(missing, name+": its help has no example")
		}
	}
	sort.Strings(missing)
	if len(missing) > 0 {
		t.Errorf("README.md does not document:\n  %s", strings.Join(missing, "\n  "))
	}
}
