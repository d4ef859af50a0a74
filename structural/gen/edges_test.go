package gen

import (
	"bufio"
	"bytes"
	"fmt"
	"strings"
	"testing"
)

// The collector holds exactly what Generate emits, in order, and builds the
// network Params.Network builds; the edge-list text lists the same edges
// with names offset by base.
func TestEdgesCollector(t *testing.T) {
	for _, m := range Models {
		p := Defaults(m, 3000)
		p.MeanDegree = 6
		e, err := p.Edges(NewRand(5))
		if err != nil {
			t.Fatalf("%s: %v", m, err)
		}
		var want edgeList
		if err := p.Generate(NewRand(5), &want); err != nil {
			t.Fatal(err)
		}
		if e.N != p.Nodes || fmt.Sprint(e.Src, e.Dst) != fmt.Sprint(want.u, want.v) || e.Len() != len(want.u) {
			t.Errorf("%s: collector differs from Generate", m)
		}
		g, err := e.Network(1)
		if err != nil {
			t.Fatal(err)
		}
		h, err := p.Network(NewRand(5))
		if err != nil {
			t.Fatal(err)
		}
		if g.N() != h.N() || g.Edges() != h.Edges() || g.Name(0) != "1" {
			t.Errorf("%s: Edges.Network %d states %d edges, Params.Network %d, %d", m, g.N(), g.Edges(), h.N(), h.Edges())
		}
		for u := int32(0); int(u) < g.N(); u++ {
			if fmt.Sprint(g.Succ(u)) != fmt.Sprint(h.Succ(u)) {
				t.Fatalf("%s: state %d acts on %v, want %v", m, u, g.Succ(u), h.Succ(u))
			}
		}
		var buf bytes.Buffer
		if err := e.WriteEdgeList(&buf, 7); err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(buf.Bytes(), e.AppendEdgeList(nil, 7)) {
			t.Errorf("%s: WriteEdgeList and AppendEdgeList differ", m)
		}
		sc := bufio.NewScanner(&buf)
		i := 0
		for sc.Scan() {
			if want := fmt.Sprintf("%d %d", e.Src[i]+7, e.Dst[i]+7); sc.Text() != want {
				t.Fatalf("%s: line %d is %q, want %q", m, i+1, sc.Text(), want)
			}
			i++
		}
		if i != e.Len() {
			t.Errorf("%s: %d lines for %d edges", m, i, e.Len())
		}
	}
}

// The comparison workload is directed ER with N*K/2 distinct edges
// (definition of G(N, L); L = 5N for <k> = 10).
func TestWorkloads(t *testing.T) {
	for _, tc := range []struct {
		name  string
		edges int
	}{{"er", 50000}, {"sf", 50000}, {"sf2.1", 50000}, {"grid", 2 * (10000 - 100)}} {
		p, err := Workload(tc.name, 10000)
		if err != nil {
			t.Fatal(err)
		}
		e, err := p.Edges(NewRand(1))
		if err != nil {
			t.Fatal(err)
		}
		if e.Len() != tc.edges {
			t.Errorf("%s: %d edges, want %d", tc.name, e.Len(), tc.edges)
		}
		checkSimple(t, tc.name, e.N, &edgeList{e.Src, e.Dst})
	}
	if _, err := Workload("ring", 10); err == nil || !strings.Contains(err.Error(), "unknown workload") {
		t.Errorf("unknown workload: got %v", err)
	}
}
