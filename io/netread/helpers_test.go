package netread

import (
	"bytes"
	"compress/gzip"
	"errors"
	"fmt"
	"io"
	"slices"
	"sort"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural"
)

// checkNetwork verifies the invariants every reader must deliver: valid
// CSRs, rows sorted and free of duplicates, In the transpose of Out, at
// least one state, self-loop count right, weights aligned, and every name
// found again by Lookup.
func checkNetwork(g *structural.Network) error {
	n := g.N()
	if n < 1 {
		return fmt.Errorf("N = %d, want >= 1", n)
	}
	for _, c := range []*matching.CSR{g.Out(), g.In()} {
		if c.Rows != n || c.Cols != n {
			return fmt.Errorf("CSR is %d x %d, want %d x %d", c.Rows, c.Cols, n, n)
		}
		if err := c.Validate(); err != nil {
			return err
		}
		for r := int32(0); int(r) < n; r++ {
			row := c.Row(r)
			for k := 1; k < len(row); k++ {
				if row[k] <= row[k-1] {
					return fmt.Errorf("row %d not strictly increasing: %v", r, row)
				}
			}
		}
	}
	t := matching.Transpose(g.Out())
	if !slices.Equal(t.Ptr, g.In().Ptr) || !slices.Equal(t.Adj, g.In().Adj) {
		return errors.New("In is not the transpose of Out")
	}
	if g.Weights() != nil && len(g.Weights()) != len(g.Out().Adj) {
		return fmt.Errorf("%d weights for %d edges", len(g.Weights()), len(g.Out().Adj))
	}
	loops := 0
	for u := int32(0); int(u) < n; u++ {
		if _, ok := slices.BinarySearch(g.Succ(u), u); ok {
			loops++
		}
	}
	if loops != g.SelfLoops() {
		return fmt.Errorf("SelfLoops = %d, counted %d", g.SelfLoops(), loops)
	}
	if g.DuplicatesMerged() < 0 {
		return fmt.Errorf("DuplicatesMerged = %d", g.DuplicatesMerged())
	}
	for i := int32(0); int(i) < n; i++ {
		name := g.Name(i)
		if j, ok := g.Lookup(name); !ok || j != i {
			return fmt.Errorf("Lookup(Name(%d) = %q) = %d, %v", i, name, j, ok)
		}
	}
	return nil
}

// edgeMap returns g's edges as "u>v" keyed by names, with their weights
// (1 when g has none).
func edgeMap(g *structural.Network) map[string]float64 {
	m := map[string]float64{}
	for u := int32(0); int(u) < g.N(); u++ {
		for k := g.Out().Ptr[u]; k < g.Out().Ptr[u+1]; k++ {
			w := 1.0
			if g.Weights() != nil {
				w = g.Weights()[k]
			}
			m[g.Name(u)+">"+g.Name(g.Out().Adj[k])] = w
		}
	}
	return m
}

// wantEdges turns "a>b" or "a>b=2.5" strings into an expected edge map.
func wantEdges(specs ...string) map[string]float64 {
	m := map[string]float64{}
	for _, s := range specs {
		w := 1.0
		if k := strings.LastIndexByte(s, '='); k > 0 {
			fmt.Sscan(s[k+1:], &w)
			s = s[:k]
		}
		m[s] = w
	}
	return m
}

// sortedNames returns g's state names, sorted.
func sortedNames(g *structural.Network) []string {
	out := make([]string, g.N())
	for i := range out {
		out[i] = g.Name(int32(i))
	}
	sort.Strings(out)
	return out
}

// diffEdges describes how got differs from want, or returns "".
func diffEdges(got, want map[string]float64) string {
	var b strings.Builder
	keys := make([]string, 0, len(got)+len(want))
	for k := range got {
		keys = append(keys, k)
	}
	for k := range want {
		if _, ok := got[k]; !ok {
			keys = append(keys, k)
		}
	}
	sort.Strings(keys)
	for _, k := range keys {
		gw, gok := got[k]
		ww, wok := want[k]
		switch {
		case !wok:
			fmt.Fprintf(&b, " unexpected %q;", k)
		case !gok:
			fmt.Fprintf(&b, " missing %q;", k)
		case gw != ww:
			fmt.Fprintf(&b, " %q weight %g, want %g;", k, gw, ww)
		}
	}
	return b.String()
}

// asError checks that err is a one-line *Error and returns it.
func asError(t *testing.T, err error) *Error {
	t.Helper()
	e, ok := err.(*Error)
	if !ok {
		t.Fatalf("error %v is a %T, want *netread.Error", err, err)
	}
	if strings.ContainsAny(e.Error(), "\r\n") {
		t.Errorf("error text has a line break: %q", e.Error())
	}
	return e
}

// gzipBytes compresses b.
func gzipBytes(b []byte) []byte {
	var buf bytes.Buffer
	w := gzip.NewWriter(&buf)
	w.Write(b)
	w.Close()
	return buf.Bytes()
}

// readCase is one table entry: input, options, and either the expected
// network or the expected error.
type readCase struct {
	name  string
	in    string
	opt   Options
	edges []string // "a>b" or "a>b=w"; nil with err set
	nodes []string // expected names, sorted; nil to skip
	dups  int      // expected DuplicatesMerged
	loops int      // expected SelfLoops
	line  int      // expected error line (0: none)
	err   string   // substring of the expected error message
}

func runReadCases(t *testing.T, format Format, cases []readCase) {
	t.Helper()
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			opt := c.opt
			opt.Format = format
			g, err := readNet(strings.NewReader(c.in), "net", opt)
			if c.err != "" {
				if err == nil {
					t.Fatalf("got no error, want %q at line %d", c.err, c.line)
				}
				e := asError(t, err)
				if e.File != "net" || e.Line != c.line || !strings.Contains(e.Msg, c.err) {
					t.Errorf("got error %q (line %d), want line %d containing %q", e.Error(), e.Line, c.line, c.err)
				}
				return
			}
			if err != nil {
				t.Fatalf("got error %v, want none", err)
			}
			if err := checkNetwork(g); err != nil {
				t.Fatalf("invalid network: %v", err)
			}
			if d := diffEdges(edgeMap(g), wantEdges(c.edges...)); d != "" {
				t.Errorf("edges differ:%s", d)
			}
			if c.nodes != nil {
				if got := sortedNames(g); !slices.Equal(got, c.nodes) {
					t.Errorf("got states %q, want %q", got, c.nodes)
				}
			}
			if g.DuplicatesMerged() != c.dups {
				t.Errorf("got DuplicatesMerged %d, want %d", g.DuplicatesMerged(), c.dups)
			}
			if g.SelfLoops() != c.loops {
				t.Errorf("got SelfLoops %d, want %d", g.SelfLoops(), c.loops)
			}
		})
	}
}

// readNet is Read for tests that look at the network only.
func readNet(r io.Reader, file string, opt Options) (*structural.Network, error) {
	in, err := Read(r, file, opt)
	if err != nil {
		return nil, err
	}
	return in.Network, nil
}

// readFileNet is ReadFile for tests that look at the network only.
func readFileNet(path string, opt Options) (*structural.Network, error) {
	in, err := ReadFile(path, opt)
	if err != nil {
		return nil, err
	}
	return in.Network, nil
}
