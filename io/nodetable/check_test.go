package nodetable

import (
	"bytes"
	"crypto/sha256"
	"errors"
	"io/fs"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/io/netread"
	"github.com/netsteer/netsteer/structural"
)

func readNet(t *testing.T, edges string, states []string) *structural.Network {
	t.Helper()
	in, err := netread.Read(strings.NewReader(edges), "n.edges", netread.Options{States: states})
	if err != nil {
		t.Fatal(err)
	}
	return in.Network
}

// A row whose name is in no edge is an error naming the row and the
// nearest names, unless the row says isolated=yes or the caller accepts
// every row (issue 11: a typo added a state silently).
func TestCheckUnknownRows(t *testing.T) {
	const edges = "b1.fuel_flow b1.temp\nb2.fuel_flow b2.temp\nb1.temp b2.temp\n"
	tab, err := Read(strings.NewReader("node,isolated\nb1.fuel_flw,\nspare_tank,yes\nb2.temp,no\n"), "t.csv")
	if err != nil {
		t.Fatal(err)
	}
	if got := tab.States(false); !slices.Equal(got, []string{"spare_tank"}) {
		t.Errorf("States(false) = %q", got)
	}
	g := readNet(t, edges, tab.States(false))
	err = tab.Check(g)
	want := `t.csv:2: node "b1.fuel_flw" is in no edge of the network (nearest: "b1.fuel_flow", "b2.fuel_flow"); if the state is meant to have no edges, say isolated=yes in its row`
	if err == nil || err.Error() != want {
		t.Errorf("got %v, want %s", err, want)
	}
	var ne *netread.Error
	if !errors.As(err, &ne) || ne.Line != 2 {
		t.Errorf("got %T %v, want a netread.Error at line 2", err, err)
	}
	// Accepting every row adds them; the warning names the unmarked one.
	g = readNet(t, edges, tab.States(true))
	if err := tab.Check(g); err != nil || g.N() != 6 {
		t.Errorf("all rows: %v, %d states", err, g.N())
	}
	if w := tab.Isolated(g); len(w) != 1 || !strings.HasPrefix(w[0], `t.csv:2: node "b1.fuel_flw" is in no edge`) {
		t.Errorf("warnings %q", w)
	}
}

// Nearest against a brute-force ranking by the textbook Levenshtein
// recursion (common practice), on all names of a small network.
func TestNearest(t *testing.T) {
	g := readNet(t, "pump valve\nvalve tank\ntank pumps\npimp tank\nvalves x\n", nil)
	var lev func(a, b string) int
	lev = func(a, b string) int {
		switch {
		case a == "":
			return len(b)
		case b == "":
			return len(a)
		case a[0] == b[0]:
			return lev(a[1:], b[1:])
		}
		return 1 + min(lev(a[1:], b), lev(a, b[1:]), lev(a[1:], b[1:]))
	}
	for _, q := range []string{"pmup", "valv", "tnak", "zzzzzz", "pump"} {
		type hit struct {
			d    int
			name string
		}
		var hits []hit
		for v := 0; v < g.N(); v++ {
			n := g.Name(int32(v))
			if d := lev(q, n); d <= max(2, len(q)/3) {
				hits = append(hits, hit{d, n})
			}
		}
		slices.SortStableFunc(hits, func(a, b hit) int { return a.d - b.d })
		var want []string
		for _, h := range hits[:min(3, len(hits))] {
			want = append(want, h.name)
		}
		if got := Nearest(g, q, 3); !slices.Equal(got, want) && !(len(got) == 0 && len(want) == 0) {
			t.Errorf("Nearest(%q) = %q, want %q", q, got, want)
		}
	}
}

// zeros reads as /dev/zero does: NUL bytes without end.
type zeros struct{ n int64 }

func (z *zeros) Read(p []byte) (int, error) {
	clear(p)
	z.n += int64(len(p))
	return len(p), nil
}

// A file without line breaks fails after MaxLineBytes, having read little
// (issue 11: /dev/zero ran out of memory); echoed values are clipped.
func TestBounds(t *testing.T) {
	z := &zeros{}
	_, err := Read(z, "zero")
	if err == nil || !strings.Contains(err.Error(), "zero:1: line longer than 65536 bytes") {
		t.Errorf("got %v", err)
	}
	if z.n > 4*MaxLineBytes {
		t.Errorf("read %d bytes before failing", z.n)
	}
	big := "node,actuator_cost\na," + strings.Repeat("9", 60000) + "x\n"
	_, err = Read(strings.NewReader(big), "t.csv")
	if err == nil || len(err.Error()) > 200 || !strings.HasPrefix(err.Error(), "t.csv:2: actuator_cost \"9999") {
		t.Errorf("got %.300v", err)
	}
	for _, c := range []struct{ in, want string }{
		{"node\n\"a\x01b\"\n", "t.csv:2: control character 0x01 in a node name"},
		{"node\na\x7f\n", "t.csv:2: control character 0x7f in a node name"},
		{"node,label\na,\"x\x1by\"\n", "t.csv:2: label: control character 0x1b in a value"},
		{"node,isolated\na,maybe\n", `t.csv:2: isolated "maybe": want yes or no`},
	} {
		_, err := Read(strings.NewReader(c.in), "t.csv")
		if err == nil || err.Error() != c.want {
			t.Errorf("%q: got %v, want %s", c.in, err, c.want)
		}
	}
}

// The table's digest is the SHA-256 of its bytes; "-" reads Options.Stdin;
// a missing file wraps fs.ErrNotExist.
func TestDigestAndOpen(t *testing.T) {
	raw, err := os.ReadFile("testdata/plant.csv")
	if err != nil {
		t.Fatal(err)
	}
	for _, path := range []string{"testdata/plant.csv", "-"} {
		tab, err := ReadFile(path, Options{Stdin: bytes.NewReader(raw)})
		if err != nil {
			t.Fatal(err)
		}
		if tab.SHA256 != sha256.Sum256(raw) || tab.Size != int64(len(raw)) {
			t.Errorf("%s: digest %x, size %d", path, tab.SHA256, tab.Size)
		}
	}
	_, err = ReadFile(filepath.Join(t.TempDir(), "none.csv"), Options{})
	if !errors.Is(err, fs.ErrNotExist) {
		t.Errorf("got %v, want fs.ErrNotExist", err)
	}
}

func FuzzRead(f *testing.F) {
	for _, s := range []string{
		"node,actuator_cost,can_actuate,has_actuator,isolated\na,1.5,yes,,no\n\"b, c\",,no,,yes\n",
		"# c\nnode\n\n", "node,label\n\"a\n", "Node , Colour\nx,red\n", "",
	} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		tab, err := Read(bytes.NewReader(data), "fuzz")
		if err != nil {
			var ne *netread.Error
			if !errors.As(err, &ne) || strings.ContainsAny(err.Error(), "\r\n") || len(err.Error()) > 1000 {
				t.Fatalf("bad error %T %.200q", err, err.Error())
			}
			return
		}
		for _, r := range tab.Rows {
			if netread.NameProblem(r.Node) != "" {
				t.Fatalf("row %+v kept a bad name", r)
			}
		}
		if tab.Size != int64(len(data)) {
			t.Fatalf("digest covers %d of %d bytes", tab.Size, len(data))
		}
	})
}

// Labels and groups: the table's columns override what the network file
// gave; a nil table keeps the file's; file slices of the wrong length are
// ignored; nothing anywhere gives nil.
func TestLabels(t *testing.T) {
	g := readNet(t, "a b\nb c\n", nil) // states a, b, c in that order
	tab, err := Read(strings.NewReader("node,label,group\na,Inlet,\nc,,north\n"), "t.csv")
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		tab          *Table
		fileL, fileG []string
		wantL, wantG []string
	}{
		{tab, nil, nil, []string{"Inlet", "", ""}, []string{"", "", "north"}},
		{tab, []string{"x", "y", "z"}, []string{"p", "q"}, []string{"Inlet", "y", "z"}, []string{"", "", "north"}},
		{nil, []string{"x", "y", "z"}, nil, []string{"x", "y", "z"}, nil},
		{nil, nil, nil, nil, nil},
	} {
		l, gr := c.tab.Labels(g, c.fileL, c.fileG)
		if !slices.Equal(l, c.wantL) || !slices.Equal(gr, c.wantG) || (c.wantL == nil) != (l == nil) || (c.wantG == nil) != (gr == nil) {
			t.Errorf("Labels(%v, %v) = %q, %q; want %q, %q", c.fileL, c.fileG, l, gr, c.wantL, c.wantG)
		}
	}
}
