package structural_test

import (
	"fmt"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/structural"
)

// Names are kept verbatim, whatever bytes they hold, and found again by
// Lookup; a plain map is the reference.
func TestNamesRoundTrip(t *testing.T) {
	b := structural.NewBuilder()
	want := map[string]int32{}
	var order []string
	add := func(s string) {
		id, err := b.Intern([]byte(s))
		if err != nil {
			t.Fatal(err)
		}
		if old, ok := want[s]; ok {
			if id != old {
				t.Fatalf("Intern(%q) = %d, first time %d", s, id, old)
			}
			return
		}
		if int(id) != len(order) {
			t.Fatalf("Intern(%q) = %d, want the next index %d", s, id, len(order))
		}
		want[s] = id
		order = append(order, s)
	}
	odd := []string{"pump 1", "valve, main", `say "hi"`, "Überdruck", "tab\there", "0", "007", "-3", "1e3",
		strings.Repeat("long", 1024), "x", "X", " x", "x "}
	for _, s := range odd {
		add(s)
	}
	// Enough names to make the hash table grow several times.
	for i := 0; i < 5000; i++ {
		add(fmt.Sprintf("tank_%d_level", i%3000))
		add(fmt.Sprint(i * 7 % 4000))
	}
	for _, s := range odd {
		add(s)
	}
	for i := 1; i < len(order); i++ {
		u, _ := b.Intern([]byte(order[i-1]))
		v, _ := b.Intern([]byte(order[i]))
		b.AddEdge(u, v)
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if g.N() != len(order) {
		t.Fatalf("got N %d; want %d", g.N(), len(order))
	}
	for i, s := range order {
		if got := g.Name(int32(i)); got != s {
			t.Fatalf("Name(%d) = %q, want %q", i, clipName(got), clipName(s))
		}
		if id, ok := g.Lookup(s); !ok || id != int32(i) {
			t.Fatalf("Lookup(%q) = %d, %v; want %d", clipName(s), id, ok, i)
		}
	}
	for _, s := range []string{"", "pump", "pump 1 ", "tank_3000_level", "4000", "07"} {
		if id, ok := g.Lookup(s); ok {
			t.Errorf("Lookup(%q) = %d, want not found", s, id)
		}
	}
}

func clipName(s string) string {
	if len(s) > 30 {
		return s[:30] + "..."
	}
	return s
}

// Integer names are base..base+n-1 in canonical decimal form; other
// spellings of the same number are different names (not found).
func TestIntNames(t *testing.T) {
	for _, base := range []int{0, 1} {
		g, err := structural.NewIntBuilder(12, base).Build(structural.BuildOptions{})
		if err != nil {
			t.Fatal(err)
		}
		for i := 0; i < 12; i++ {
			name := fmt.Sprint(i + base)
			if g.Name(int32(i)) != name {
				t.Errorf("base %d: Name(%d) = %q, want %q", base, i, g.Name(int32(i)), name)
			}
			if id, ok := g.Lookup(name); !ok || id != int32(i) {
				t.Errorf("base %d: Lookup(%q) = %d, %v; want %d", base, name, id, ok, i)
			}
		}
		for _, s := range []string{fmt.Sprint(base - 1), fmt.Sprint(base + 12), "01", "+1", " 1", "1.0", "x", ""} {
			if id, ok := g.Lookup(s); ok {
				t.Errorf("base %d: Lookup(%q) = %d, want not found", base, s, id)
			}
		}
	}
}

// N and Edges count states and distinct edges, self-loops included.
func TestNetworkCounts(t *testing.T) {
	b := structural.NewIntBuilder(5, 1)
	for _, e := range [][2]int32{{0, 1}, {1, 2}, {1, 2}, {2, 2}, {3, 0}} {
		b.AddEdge(e[0], e[1])
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if g.N() != 5 || g.Edges() != 4 || g.SelfLoops() != 1 || g.DuplicatesMerged() != 1 {
		t.Errorf("got N %d, edges %d, loops %d, merged %d; want 5, 4, 1, 1", g.N(), g.Edges(), g.SelfLoops(), g.DuplicatesMerged())
	}
	if d := len(g.Succ(1)); d != 1 {
		t.Errorf("out-degree of state 2 = %d, want 1", d)
	}
	if r := g.Pred(2); len(r) != 2 || r[0] != 1 || r[1] != 2 {
		t.Errorf("in-row of state 3 = %v, want [1 2]", r)
	}
	if len(g.Succ(4)) != 0 || len(g.Pred(4)) != 0 {
		t.Errorf("state 5 should be isolated")
	}
}
