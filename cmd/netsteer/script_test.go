package main

import (
	"os"
	"testing"

	"github.com/rogpeppe/go-internal/testscript"

	"github.com/netsteer/netsteer/io/render/gvlayout"
)

// TestMain lets the script tests run this binary as the "netsteer" command,
// and as "netsteer-layout", the layout program render and report start
// (found beside "netsteer" in the script's $PATH).
func TestMain(m *testing.M) {
	testscript.Main(m, map[string]func(){
		"netsteer": func() {
			e := &env{Stdin: os.Stdin, Stdout: os.Stdout, Stderr: os.Stderr}
			os.Exit(run(e, os.Args[1:]))
		},
		"netsteer-layout": func() {
			os.Exit(gvlayout.Main(os.Stdin, os.Stdout, os.Stderr, os.Args[1:]))
		},
	})
}

// TestScripts runs the command-line scripts in testdata/script. Each script
// names the source of any figure it checks against the outside. The shared
// datasets folder is available as $SHARED (scripts skip without it).
func TestScripts(t *testing.T) {
	testscript.Run(t, testscript.Params{
		Dir: "testdata/script",
		Setup: func(env *testscript.Env) error {
			wd, _ := os.Getwd()
			env.Setenv("REPO", wd+"/../..")
			env.Setenv("SHARED", wd+"/../../../shared")
			return nil
		},
	})
}
