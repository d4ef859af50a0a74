package main

import (
	"compress/gzip"
	"fmt"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"strings"
	"testing"

	"github.com/rogpeppe/go-internal/testscript"
)

// binDir holds the real netsteer and netsteer-layout programs, built once
// for all script tests (a script then runs what a user runs, and the test
// binary does not link the picture engine into every command).
var binDir string

func TestMain(m *testing.M) {
	dir, err := os.MkdirTemp("", "netsteer-scripts")
	if err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(2)
	}
	binDir = dir
	for _, pkg := range []string{".", "../netsteer-layout"} {
		cmd := exec.Command("go", "build", "-o", dir+string(os.PathSeparator), pkg)
		cmd.Stderr = os.Stderr
		if err := cmd.Run(); err != nil {
			fmt.Fprintln(os.Stderr, "building", pkg, "for the script tests:", err)
			os.RemoveAll(dir)
			os.Exit(2)
		}
	}
	code := m.Run()
	os.RemoveAll(dir)
	os.Exit(code)
}

// TestScripts runs the command-line scripts in testdata/script against the
// programs built by TestMain. Each script names the source of any figure
// it checks against the outside. The shared datasets folder is available
// as $SHARED (scripts skip without it). "jsonkeys CMD FILE" checks that
// every key of a JSON output is listed for CMD in README.md.
func TestScripts(t *testing.T) {
	wd, _ := os.Getwd()
	keys, err := readmeKeys(filepath.Join(wd, "..", "..", "README.md"))
	if err != nil {
		t.Fatal(err)
	}
	testscript.Run(t, testscript.Params{
		Dir: "testdata/script",
		Setup: func(env *testscript.Env) error {
			env.Setenv("PATH", binDir+string(os.PathListSeparator)+env.Getenv("PATH"))
			env.Setenv("REPO", filepath.Join(wd, "..", ".."))
			env.Setenv("SHARED", filepath.Join(wd, "..", "..", "..", "shared"))
			env.Setenv("GOOS", runtime.GOOS)
			return nil
		},
		Cmds: map[string]func(ts *testscript.TestScript, neg bool, args []string){
			// gunzip FILE.gz decompresses into FILE (compress/gzip, not a
			// system tool); it fails on a file that is not gzip.
			"gunzip": func(ts *testscript.TestScript, neg bool, args []string) {
				if len(args) != 1 || !strings.HasSuffix(args[0], ".gz") {
					ts.Fatalf("usage: gunzip FILE.gz")
				}
				zr, err := gzip.NewReader(strings.NewReader(ts.ReadFile(args[0])))
				var data []byte
				if err == nil {
					data, err = io.ReadAll(zr)
				}
				if (err != nil) != neg {
					ts.Fatalf("gunzip %s: %v", args[0], err)
				}
				if err == nil {
					ts.Check(os.WriteFile(ts.MkAbs(strings.TrimSuffix(args[0], ".gz")), data, 0o644))
				}
			},
			"jsonkeys": func(ts *testscript.TestScript, neg bool, args []string) {
				if len(args) != 2 {
					ts.Fatalf("usage: jsonkeys CMD FILE")
				}
				missing, err := checkKeys(keys, args[0], []byte(ts.ReadFile(args[1])))
				if err != nil {
					ts.Fatalf("%v", err)
				}
				if len(missing) > 0 != neg {
					ts.Fatalf("keys of %s output not listed in README.md: %v", args[0], missing)
				}
			},
		},
	})
}
