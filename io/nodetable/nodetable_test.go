package nodetable

import (
	"errors"
	"fmt"
	"os"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/io/netread"
	"github.com/netsteer/netsteer/structural"
)

func TestReadPlant(t *testing.T) {
	tab, err := ReadFile("testdata/plant.csv", Options{})
	if err != nil {
		t.Fatal(err)
	}
	if len(tab.Warnings) != 0 {
		t.Errorf("warnings %q, want none", tab.Warnings)
	}
	want := []Row{
		{Node: "b1.fuel_flow", Line: 3, ActuatorCost: 2500, CanActuate: true, SensorCost: 800, CanSense: true, Group: "boiler house", Label: "Boiler 1 fuel"},
		{Node: "b2.fuel_flow", Line: 4, ActuatorCost: 2500, CanActuate: true, HasActuator: true, SensorCost: 800, CanSense: true, Group: "boiler house", Label: "Boiler 2 fuel"},
		{Node: "supply.header_temp", Line: 5, ActuatorCost: 1000, SensorCost: 300, CanSense: true, HasSensor: true, Group: "supply main", Label: "Supply header, temperature"},
		{Node: "school.room_temp", Line: 6, ActuatorCost: 40000, CanActuate: true, SensorCost: 250, CanSense: true, Group: "school", Label: "School rooms"},
	}
	if len(tab.Rows) != len(want) {
		t.Fatalf("got %d rows, want %d", len(tab.Rows), len(want))
	}
	for i := range want {
		if tab.Rows[i] != want[i] {
			t.Errorf("row %d: got %+v, want %+v", i, tab.Rows[i], want[i])
		}
	}
	if !tab.Has("label") || tab.Has("colour") {
		t.Errorf("Has: label %v, colour %v", tab.Has("label"), tab.Has("colour"))
	}
}

// Each malformed table fails with FILE:LINE and the reason.
func TestReadErrors(t *testing.T) {
	for _, tc := range []struct {
		name, text, want string
	}{
		{"empty", "", "t.csv:1: empty node table"},
		{"no node column", "state,actuator_cost\na,1\n", `t.csv:1: no "node" column`},
		{"column twice", "node,group,Group\n", `t.csv:1: column "group" appears twice`},
		{"unnamed column", "node,,label\n", "t.csv:1: column 2 of the header has no name"},
		{"bad cost", "node,actuator_cost\na,1\nb,cheap\n", `t.csv:3: actuator_cost "cheap": want a number`},
		{"negative cost", "node,sensor_cost\na,-1\n", `t.csv:2: sensor_cost "-1"`},
		{"too many decimals", "node,actuator_cost\na,0.0001\n", `t.csv:2: actuator_cost "0.0001"`},
		{"exponent", "node,actuator_cost\na,1e3\n", `t.csv:2: actuator_cost "1e3"`},
		{"too large", "node,actuator_cost\na,1000000001\n", `t.csv:2: actuator_cost "1000000001"`},
		{"bad bool", "node,can_actuate\na,maybe\n", `t.csv:2: can_actuate "maybe": want yes or no`},
		{"contradiction", "node,can_actuate,has_actuator\na,no,yes\n", `t.csv:2: node "a": has_actuator is yes but can_actuate is no`},
		{"sensor contradiction", "node,can_sense,has_sensor\na,no,yes\n", `t.csv:2: node "a": has_sensor is yes but can_sense is no`},
		{"duplicate", "node\na\nb\n# comment\na\n", `t.csv:5: node "a" is already listed on line 2`},
		{"empty name", "node,label\n,x\n", "t.csv:2: empty node name"},
		{"too many fields", "node,label\na,x,y\n", "t.csv:2: 3 fields, but the header names 2 columns"},
		{"bad quote", "node\n\"a\n", "t.csv:"},
	} {
		_, err := Read(strings.NewReader(tc.text), "t.csv")
		var ne *netread.Error
		if err == nil || !errors.As(err, &ne) {
			t.Errorf("%s: got %v, want a netread.Error", tc.name, err)
			continue
		}
		if !strings.HasPrefix(err.Error(), tc.want) {
			t.Errorf("%s: got %q, want prefix %q", tc.name, err, tc.want)
		}
	}
}

// Unknown columns warn; short rows take defaults; a BOM, quotes, spaces
// and blank rows are accepted.
func TestReadLenient(t *testing.T) {
	text := "\ufeffNode, Colour ,can_actuate,actuator_cost\n" +
		"\"pump, north\",red\n" +
		",,,\n" +
		"  valve , blue , N , .5\n"
	tab, err := Read(strings.NewReader(text), "t.csv")
	if err != nil {
		t.Fatal(err)
	}
	if len(tab.Warnings) != 1 || !strings.HasPrefix(tab.Warnings[0], `t.csv:1: unknown column " Colour " ignored`) {
		t.Errorf("warnings %q", tab.Warnings)
	}
	if len(tab.Rows) != 2 {
		t.Fatalf("rows %+v", tab.Rows)
	}
	if r := tab.Rows[0]; r.Node != "pump, north" || !r.CanActuate || r.ActuatorCost != CostScale || r.Line != 2 {
		t.Errorf("row 1: %+v", r)
	}
	if r := tab.Rows[1]; r.Node != "valve" || r.CanActuate || r.ActuatorCost != 500 || r.Line != 4 {
		t.Errorf("row 2: %+v", r)
	}
}

func TestFormatCost(t *testing.T) {
	for units, want := range map[int64]string{0: "0", 1000: "1", 2500: "2.5", 1: "0.001", 123456: "123.456", 40000: "40"} {
		if got := FormatCost(units); got != want {
			t.Errorf("FormatCost(%d) = %q, want %q", units, got, want)
		}
	}
	for _, s := range []string{"0", "7", "7.", ".25", "1000000000", "3.141"} {
		v, ok := parseCost(s)
		if !ok {
			t.Errorf("parseCost(%q) failed", s)
			continue
		}
		back, _ := parseCost(FormatCost(v))
		if back != v {
			t.Errorf("%q -> %d -> %q -> %d", s, v, FormatCost(v), back)
		}
	}
}

// A listed state in no edge becomes an isolated state, named in a
// warning; the device facts land on the right states.
func TestNetworkBinding(t *testing.T) {
	tab, err := Read(strings.NewReader("node,actuator_cost,can_actuate,has_actuator,sensor_cost,can_sense\nb,3,,yes,,no\nlonely,,no,,2\nc\n"), "t.csv")
	if err != nil {
		t.Fatal(err)
	}
	in, err := netread.Read(strings.NewReader("a b\nb c\nc c\n"), "n.edges", netread.Options{States: tab.Names(), Build: structural.BuildOptions{SelfDynamics: true}})
	if err != nil {
		t.Fatal(err)
	}
	g := in.Network
	if g.N() != 4 {
		t.Fatalf("got %d states, want 4 (a, b, c and lonely)", g.N())
	}
	w := tab.Isolated(g)
	if len(w) != 1 || !strings.HasPrefix(w[0], `t.csv:3: node "lonely" is in no edge of the network`) {
		t.Errorf("isolated warnings %q", w)
	}
	id := func(s string) int32 { v, _ := g.Lookup(s); return v }
	act := tab.Actuators(g)
	if act.Cost[id("a")] != CostScale || act.Cost[id("b")] != 3000 || !act.Existing[id("b")] || act.Existing[id("a")] || !act.Forbidden[id("lonely")] || act.Forbidden[id("b")] {
		t.Errorf("actuators: %+v", act)
	}
	sen := tab.Sensors(g)
	if sen.Cost[id("lonely")] != 2000 || !sen.Forbidden[id("b")] || sen.Existing != nil {
		t.Errorf("sensors: %+v", sen)
	}
}

// A table listing many isolated states (a generated network's table, say)
// names the first ones and summarises the rest in one line.
func TestIsolatedSummarised(t *testing.T) {
	var b strings.Builder
	b.WriteString("node\n")
	for i := 0; i < 25; i++ {
		fmt.Fprintf(&b, "z%d\n", i)
	}
	tab, err := Read(strings.NewReader(b.String()), "many.csv")
	if err != nil {
		t.Fatal(err)
	}
	in, err := netread.Read(strings.NewReader("a b\n"), "n.edges", netread.Options{States: tab.Names()})
	if err != nil {
		t.Fatal(err)
	}
	g := in.Network
	w := tab.Isolated(g)
	if len(w) != maxIsolatedNamed+1 {
		t.Fatalf("got %d warnings, want %d", len(w), maxIsolatedNamed+1)
	}
	if want := "many.csv: 15 more nodes of the table are in no edge of the network (isolated states, 25 in all)"; w[len(w)-1] != want {
		t.Errorf("last warning %q, want %q", w[len(w)-1], want)
	}
}

// Every row of a long table is found by name (through index growth), and
// a duplicate far from its first row is caught with both lines.
func TestLookupManyRows(t *testing.T) {
	var b strings.Builder
	b.WriteString("node,actuator_cost\n")
	const n = 5000
	for i := 0; i < n; i++ {
		fmt.Fprintf(&b, "s%d,%d\n", i, i%7)
	}
	tab, err := Read(strings.NewReader(b.String()), "t.csv")
	if err != nil {
		t.Fatal(err)
	}
	for i := 0; i < n; i++ {
		r, ok := tab.Lookup(fmt.Sprintf("s%d", i))
		if !ok || r.Line != i+2 || r.ActuatorCost != int64(i%7)*CostScale {
			t.Fatalf("s%d: %+v, %v", i, r, ok)
		}
	}
	if _, ok := tab.Lookup("s5000"); ok {
		t.Error("s5000 found")
	}
	b.WriteString("s17,1\n")
	_, err = Read(strings.NewReader(b.String()), "t.csv")
	if err == nil || err.Error() != `t.csv:5002: node "s17" is already listed on line 19` {
		t.Errorf("duplicate: %v", err)
	}
}

// A table of many rows is bound to a network on several goroutines: each
// row's costs land on its own state (run with -race).
func TestDevicesManyRows(t *testing.T) {
	const n = 40000
	b := structural.NewBuilder()
	var tb strings.Builder
	tb.WriteString("node,actuator_cost,can_actuate\n")
	prev := int32(-1)
	for i := 0; i < n; i++ {
		v, _ := b.Intern([]byte(fmt.Sprintf("s%d", i)))
		if prev >= 0 {
			b.AddEdge(prev, v)
		}
		prev = v
		// Rows in reverse order, so that row and state numbers differ.
		j := n - 1 - i
		fmt.Fprintf(&tb, "s%d,%d,%s\n", j, j%7, map[bool]string{true: "no", false: "yes"}[j%5 == 0])
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	tab, err := Read(strings.NewReader(tb.String()), "t.csv")
	if err != nil {
		t.Fatal(err)
	}
	if err := tab.Check(g); err != nil {
		t.Fatal(err)
	}
	d := tab.Actuators(g)
	for i := 0; i < n; i++ {
		v, _ := g.Lookup(fmt.Sprintf("s%d", i))
		if d.Cost[v] != structural.Cost(i%7*CostScale) || d.Allowed(v) != (i%5 != 0) {
			t.Fatalf("s%d: cost %v allowed %v", i, d.Cost[v], d.Allowed(v))
		}
	}
}

// A file of known size read past the first 1,024 rows (where the rows
// are sized from the density so far) keeps every row, in order, and a
// capacity within a row per 4 bytes of the file; a comment-heavy tail
// does not change the rows.
func TestReadFileManyRows(t *testing.T) {
	for _, tail := range []string{"", strings.Repeat("# a long comment line that holds no row at all\n", 3000)} {
		var b strings.Builder
		b.WriteString("node,actuator_cost\n")
		const n = 5000
		for i := range n {
			fmt.Fprintf(&b, "s%d,%d\n", i, i%1000)
			if i == 1500 {
				b.WriteString(tail)
			}
		}
		path := t.TempDir() + "/t.csv"
		if err := os.WriteFile(path, []byte(b.String()), 0o644); err != nil {
			t.Fatal(err)
		}
		tab, err := ReadFile(path, Options{})
		if err != nil {
			t.Fatal(err)
		}
		if len(tab.Rows) != n {
			t.Fatalf("%d rows, want %d", len(tab.Rows), n)
		}
		for i, r := range tab.Rows {
			if r.Node != fmt.Sprintf("s%d", i) || r.ActuatorCost != int64(i%1000)*CostScale {
				t.Fatalf("row %d: %+v", i, r)
			}
		}
		if c, limit := cap(tab.Rows), b.Len()/4+1+n; c > limit {
			t.Errorf("capacity %d for %d rows of a %d-byte file", c, n, b.Len())
		}
	}
}
