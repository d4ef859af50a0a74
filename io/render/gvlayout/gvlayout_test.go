package gvlayout

import (
	"bytes"
	"encoding/json"
	"encoding/xml"
	"io"
	"strings"
	"testing"
)

const chain = `digraph "t" { a -> b; b -> c; c -> a [label="back"] }`

func run(stdin string, args ...string) (code int, stdout, stderr string) {
	var o, e bytes.Buffer
	code = Main(strings.NewReader(stdin), &o, &e, args)
	return code, o.String(), e.String()
}

// TestMainOutputs lays out a three-state cycle as SVG and as JSON and
// checks that each parses and holds the nodes (SVG: Graphviz writes the
// node name as the title of its group, common practice of its SVG output).
func TestMainOutputs(t *testing.T) {
	for _, engine := range []string{"dot", "sfdp"} {
		code, out, errs := run(chain, "-protocol", "1", "-engine", engine, "-output", "svg")
		if code != 0 || errs != "" {
			t.Fatalf("%s svg: exit %d, stderr %q", engine, code, errs)
		}
		if !strings.HasPrefix(out, Header()) {
			t.Fatalf("%s svg: output starts %.40q, want the protocol line", engine, out)
		}
		dec := xml.NewDecoder(strings.NewReader(strings.TrimPrefix(out, Header())))
		dec.Strict = false
		var texts []string
		for {
			tok, err := dec.Token()
			if err == io.EOF {
				break
			}
			if err != nil {
				t.Fatalf("%s svg: not XML: %v", engine, err)
			}
			if cd, ok := tok.(xml.CharData); ok {
				if s := strings.TrimSpace(string(cd)); s != "" {
					texts = append(texts, s)
				}
			}
		}
		for _, want := range []string{"a", "b", "c", "back"} {
			found := false
			for _, s := range texts {
				found = found || s == want
			}
			if !found {
				t.Errorf("%s svg: text %q missing in %q", engine, want, texts)
			}
		}
	}
	code, out, errs := run(chain, "-output", "json")
	if code != 0 || errs != "" {
		t.Fatalf("json: exit %d, stderr %q", code, errs)
	}
	var g struct {
		BB      string `json:"bb"`
		Objects []struct {
			Name string `json:"name"`
			Pos  string `json:"pos"`
		} `json:"objects"`
		Edges []json.RawMessage `json:"edges"`
	}
	if err := json.Unmarshal([]byte(out), &g); err != nil {
		t.Fatalf("json without -protocol does not parse: %v", err)
	}
	if g.BB == "" || len(g.Objects) != 3 || len(g.Edges) != 3 {
		t.Errorf("json: bb %q, %d nodes, %d edges; want a box, 3 and 3", g.BB, len(g.Objects), len(g.Edges))
	}
	for _, o := range g.Objects {
		if o.Pos == "" {
			t.Errorf("node %s has no position", o.Name)
		}
	}
}

// TestMainErrors: one line on standard error and exit status 2, nothing
// on standard output.
func TestMainErrors(t *testing.T) {
	for _, tc := range []struct {
		name, stdin string
		args        []string
		want        string
	}{
		{"protocol", chain, []string{"-protocol", "2"}, "netsteer-layout: protocol 2 asked, this program speaks protocol 1: build netsteer and netsteer-layout from the same source"},
		{"engine", chain, []string{"-engine", "spring"}, `netsteer-layout: unknown engine "spring"`},
		{"output", chain, []string{"-output", "png"}, `netsteer-layout: unknown output "png"`},
		{"flag", chain, []string{"-size", "3"}, "netsteer-layout: flag provided but not defined: -size"},
		{"argument", chain, []string{"plant.dot"}, `netsteer-layout: unexpected argument "plant.dot"`},
		{"empty", " \n", nil, "netsteer-layout: no DOT text on standard input"},
		{"syntax", "digraph { a -> ", nil, "netsteer-layout: Graphviz rejected the DOT text: syntax error in line 1"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			code, out, errs := run(tc.stdin, tc.args...)
			if code != 2 || out != "" {
				t.Errorf("exit %d, stdout %q; want 2 and nothing", code, out)
			}
			if !strings.HasPrefix(errs, tc.want) || strings.Count(errs, "\n") != 1 {
				t.Errorf("stderr %q, want one line starting %q", errs, tc.want)
			}
		})
	}
}

func TestMainHelpVersion(t *testing.T) {
	code, out, _ := run("", "-help")
	if code != 0 || !strings.Contains(out, "Example:") || !strings.Contains(out, "sfdp") {
		t.Errorf("-help: exit %d, output %q", code, out)
	}
	code, out, _ = run("", "-version")
	if code != 0 || !strings.HasPrefix(out, "netsteer-layout protocol 1, go-graphviz ") {
		t.Errorf("-version: exit %d, output %q", code, out)
	}
}
