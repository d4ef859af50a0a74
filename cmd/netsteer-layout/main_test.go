package main

import (
	"bytes"
	"image/png"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
)

// graphvizPackages are the module paths that start Graphviz's WebAssembly
// runtime when linked (go-graphviz and the runtime it uses).
var graphvizPackages = []string{"github.com/goccy/go-graphviz", "github.com/tetratelabs/wazero"}

func goTool(t *testing.T) string {
	t.Helper()
	g, err := exec.LookPath("go")
	if err != nil {
		t.Skip("no go tool on $PATH")
	}
	return g
}

// deps returns the packages pkgs depend on, as the go tool lists them.
func deps(t *testing.T, pkgs ...string) []string {
	t.Helper()
	out, err := exec.Command(goTool(t), append([]string{"list", "-deps"}, pkgs...)...).Output()
	if err != nil {
		msg := ""
		if ee, ok := err.(*exec.ExitError); ok {
			msg = string(ee.Stderr)
		}
		t.Fatalf("go list -deps %v: %v\n%s", pkgs, err, msg)
	}
	return strings.Fields(string(out))
}

func graphvizIn(list []string) []string {
	var found []string
	for _, p := range list {
		for _, g := range graphvizPackages {
			if p == g || strings.HasPrefix(p, g+"/") {
				found = append(found, p)
			}
		}
	}
	return found
}

// TestNetsteerDoesNotLinkGraphviz: netsteer, and the packages behind its
// pictures and review pages, do not depend on go-graphviz, whose package
// initialisation would run in every netsteer command; this program does.
func TestNetsteerDoesNotLinkGraphviz(t *testing.T) {
	const mod = "github.com/netsteer/netsteer/"
	if found := graphvizIn(deps(t, mod+"cmd/netsteer", mod+"io/render", mod+"io/htmlreport")); len(found) > 0 {
		t.Errorf("netsteer links %v", found)
	}
	if found := graphvizIn(deps(t, mod+"cmd/netsteer-layout")); len(found) == 0 {
		t.Errorf("netsteer-layout does not link go-graphviz: the check above sees nothing")
	}
}

// run runs a built program with the given environment and returns its
// exit status, standard output and standard error.
func run(t *testing.T, env []string, prog string, args ...string) (int, string, string) {
	t.Helper()
	cmd := exec.Command(prog, args...)
	cmd.Env = env
	var o, e bytes.Buffer
	cmd.Stdout, cmd.Stderr = &o, &e
	err := cmd.Run()
	if ee, ok := err.(*exec.ExitError); ok {
		return ee.ExitCode(), o.String(), e.String()
	}
	if err != nil {
		t.Fatal(err)
	}
	return 0, o.String(), e.String()
}

// TestInstalledPair builds netsteer and netsteer-layout as a user does
// (go build -o DIR ./cmd/..., without cgo) and checks what the split is
// for: netsteer drivers does not start Graphviz (its WebAssembly cache
// under $TMPDIR stays absent), netsteer render finds the layout program
// beside itself with an empty $PATH and draws SVG and PNG, and without the
// layout program .dot still works while .svg fails with a one-line hint.
func TestInstalledPair(t *testing.T) {
	if testing.Short() {
		t.Skip("builds two programs")
	}
	gotool := goTool(t)
	bin := t.TempDir()
	build := exec.Command(gotool, "build", "-o", bin+string(filepath.Separator),
		"github.com/netsteer/netsteer/cmd/netsteer", "github.com/netsteer/netsteer/cmd/netsteer-layout")
	build.Env = append(os.Environ(), "CGO_ENABLED=0")
	if out, err := build.CombinedOutput(); err != nil {
		t.Fatalf("go build: %v\n%s", err, out)
	}
	netsteer := filepath.Join(bin, "netsteer")
	if out, err := exec.Command(gotool, "version", "-m", netsteer).Output(); err != nil {
		t.Fatalf("go version -m: %v", err)
	} else if found := graphvizIn(strings.Fields(string(out))); len(found) > 0 {
		t.Errorf("the netsteer binary holds %v", found)
	}

	plant, err := filepath.Abs("../../testdata/plant/heating.edges")
	if err != nil {
		t.Fatal(err)
	}
	work, tmp, empty := t.TempDir(), t.TempDir(), t.TempDir()
	var env []string
	for _, kv := range os.Environ() {
		k, _, _ := strings.Cut(kv, "=")
		if k != "NETSTEER_LAYOUT" && k != "TMPDIR" && k != "PATH" {
			env = append(env, kv)
		}
	}
	env = append(env, "TMPDIR="+tmp, "PATH="+empty)
	cache := filepath.Join(tmp, "go-graphviz")

	if code, out, errs := run(t, env, netsteer, "drivers", plant); code != 0 || !strings.Contains(out, "driver") {
		t.Fatalf("drivers: exit %d\n%s%s", code, out, errs)
	}
	if _, err := os.Stat(cache); err == nil {
		t.Errorf("netsteer drivers created %s: Graphviz started", cache)
	}

	svg := filepath.Join(work, "plant.svg")
	if code, out, errs := run(t, env, netsteer, "render", plant, "-o", svg); code != 0 {
		t.Fatalf("render svg: exit %d\n%s%s", code, out, errs)
	}
	b, err := os.ReadFile(svg)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.HasPrefix(b, []byte("<svg ")) || !bytes.Contains(b, []byte(">supply.header_temp</text>")) || bytes.Contains(b, []byte("DOCTYPE")) {
		t.Errorf("plant.svg is not netsteer's SVG of the plant: %.200q", b)
	}
	if _, err := os.Stat(cache); err != nil {
		t.Errorf("no %s after a render: did the layout program draw?", cache)
	}
	pic := filepath.Join(work, "plant.png")
	if code, out, errs := run(t, env, netsteer, "render", plant, "-o", pic); code != 0 {
		t.Fatalf("render png: exit %d\n%s%s", code, out, errs)
	}
	f, err := os.Open(pic)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	if _, err := png.Decode(f); err != nil {
		t.Errorf("plant.png: %v", err)
	}

	if err := os.Remove(filepath.Join(bin, "netsteer-layout")); err != nil {
		t.Fatal(err)
	}
	if code, out, errs := run(t, env, netsteer, "render", plant, "-o", filepath.Join(work, "plant.dot")); code != 0 {
		t.Errorf("render dot without the layout program: exit %d\n%s%s", code, out, errs)
	}
	code, _, errs := run(t, env, netsteer, "render", plant, "-o", filepath.Join(work, "again.svg"))
	want := "netsteer: the layout program netsteer-layout, which draws SVG and PNG, was not found in " + bin + " or on $PATH: install it with `go install ./cmd/...` in the netsteer source tree"
	if code != 2 || !strings.HasPrefix(errs, want) || strings.Count(errs, "\n") != 1 {
		t.Errorf("render svg without the layout program: exit %d, stderr %q; want 2 and one line starting %q", code, errs, want)
	}
}
