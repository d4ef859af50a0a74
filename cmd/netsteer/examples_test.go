package main

import (
	"bytes"
	"os"
	"os/exec"
	"path/filepath"
	"slices"
	"sort"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/io/htmlreport"
)

// helpExamples returns, by command, the example command lines of its help
// (the lines "  netsteer ..." after "Example:").
func helpExamples() map[string][][]string {
	out := map[string][][]string{}
	for name, c := range commands {
		_, ex, ok := strings.Cut(c.usage, "\nExample:\n")
		if !ok {
			continue
		}
		for _, line := range strings.Split(ex, "\n") {
			if f := strings.Fields(line); len(f) > 1 && f[0] == "netsteer" {
				out[name] = append(out[name], f[1:])
			}
		}
	}
	return out
}

// outputFlags take the name of a file the command writes.
var outputFlags = map[string]bool{"-o": true, "--output": true, "--pdf": true}

// fileArgs returns the arguments of an example that name files it reads:
// those with a path separator or a file extension, other than the value
// of an output flag.
func fileArgs(args []string) []string {
	var files []string
	for i, a := range args {
		if strings.HasPrefix(a, "-") || i > 0 && outputFlags[args[i-1]] {
			continue
		}
		if strings.Contains(a, "/") || strings.Contains(filepath.Ext(a), ".") && strings.Trim(filepath.Ext(a), ".0123456789") != "" {
			files = append(files, a)
		}
	}
	return files
}

// TestHelpExamplesRun runs every help example that reads the repository's
// testdata (all its files must be there then), as a user would from the top of the repository,
// with the programs TestMain built: each must give an answer (exit status
// 0 or 1), never a usage error or a failure (2).
func TestHelpExamplesRun(t *testing.T) {
	if testing.Short() {
		t.Skip("runs the real program")
	}
	repo, err := filepath.Abs("../..")
	if err != nil {
		t.Fatal(err)
	}
	ex := helpExamples()
	names := make([]string, 0, len(ex))
	for n := range ex {
		names = append(names, n)
	}
	sort.Strings(names)
	ran := 0
	for _, name := range names {
	examples:
		for _, args := range ex[name] {
			files := fileArgs(args)
			if len(files) == 0 {
				continue
			}
			inRepo := false
			for _, f := range files {
				inRepo = inRepo || strings.HasPrefix(f, "testdata/")
			}
			if !inRepo {
				continue // a placeholder for the user's own files
			}
			for _, f := range files {
				if _, err := os.Stat(filepath.Join(repo, f)); err != nil {
					t.Errorf("netsteer %s: the example %q names %s, which is not in the repository", name, strings.Join(args, " "), f)
					continue examples
				}
			}
			if slices.Contains(args, "--pdf") {
				if _, err := htmlreport.FindBrowser(); err != nil {
					// A fresh machine has no browser to print with; the
					// page is still checked by the other examples.
					t.Logf("netsteer %s: not run (%v)", strings.Join(args, " "), err)
					continue
				}
			}
			dir := t.TempDir()
			if err := os.Symlink(filepath.Join(repo, "testdata"), filepath.Join(dir, "testdata")); err != nil {
				t.Fatal(err)
			}
			cmd := exec.Command(filepath.Join(binDir, "netsteer"), args...)
			cmd.Dir = dir
			var stderr bytes.Buffer
			cmd.Stdout, cmd.Stderr = nil, &stderr
			err := cmd.Run()
			ran++
			if ee, ok := err.(*exec.ExitError); ok && ee.ExitCode() == exitNo {
				continue
			}
			if err != nil {
				t.Errorf("netsteer %s: %v\n%s", strings.Join(args, " "), err, stderr.String())
			}
		}
	}
	if ran == 0 {
		t.Error("no help example runs on the repository's testdata")
	}
	t.Logf("%d help examples run", ran)
}
