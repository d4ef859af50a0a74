package netread

import (
	"bytes"
	"crypto/sha256"
	"errors"
	"io/fs"
	"math/rand/v2"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// A missing file is an *Error wrapping the cause, so that errors.Is sees
// fs.ErrNotExist; the message names the file, not a flag.
func TestErrorUnwrap(t *testing.T) {
	_, err := ReadFile(filepath.Join(t.TempDir(), "none.edges"), Options{})
	if !errors.Is(err, fs.ErrNotExist) {
		t.Fatalf("got %v, want an error that is fs.ErrNotExist", err)
	}
	if e := asError(t, err); !strings.HasSuffix(e.Error(), "none.edges: no such file or directory") {
		t.Errorf("got %q", e.Error())
	}
}

// "-" reads Options.Stdin; the digest is the SHA-256 of the bytes read,
// before decompression, for files and streams alike.
func TestStdinAndDigest(t *testing.T) {
	plain := []byte("a b\nb c\n")
	packed := gzipBytes(plain)
	for _, data := range [][]byte{plain, packed} {
		in, err := ReadFile("-", Options{Stdin: bytes.NewReader(data)})
		if err != nil {
			t.Fatal(err)
		}
		if in.SHA256 != sha256.Sum256(data) || in.Size != int64(len(data)) || in.Network.N() != 3 {
			t.Errorf("stdin: got %x, %d bytes, %d states; want %x, %d, 3", in.SHA256, in.Size, in.Network.N(), sha256.Sum256(data), len(data))
		}
	}
	p := filepath.Join("testdata", "canal.edges.gz")
	raw, err := os.ReadFile(p)
	if err != nil {
		t.Fatal(err)
	}
	in, err := ReadFile(p, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if in.SHA256 != sha256.Sum256(raw) || in.Size != int64(len(raw)) {
		t.Errorf("%s: digest %x of %d bytes, want %x of %d", p, in.SHA256, in.Size, sha256.Sum256(raw), len(raw))
	}
}

// Matrix Market and DOT are recognised by content whatever the name and
// on standard input (issue 11: a banner read as a comment, entries
// reversed); Options.Format still overrides.
func TestFormatByContent(t *testing.T) {
	mtx := "%%MatrixMarket matrix coordinate pattern general\n3 3 2\n2 1\n3 2\n"
	dot := "// plant\nstrict digraph \"g 1\" {\n a -> b -> c\n}\n"
	for _, c := range []struct {
		name, in string
		want     Format
		edges    []string
	}{
		{"stdin", mtx, MatrixMarket, []string{"1>2", "2>3"}},
		{"net.edges", mtx, MatrixMarket, []string{"1>2", "2>3"}},
		{"stdin", dot, DOT, []string{"a>b", "b>c"}},
		{"x.txt", string(gzipBytes([]byte(dot))), DOT, []string{"a>b", "b>c"}},
		{"stdin", "a b\nb c\n", EdgeList, []string{"a>b", "b>c"}},
		{"g.mtx", "\xef\xbb\xbf" + mtx, MatrixMarket, []string{"1>2", "2>3"}},
	} {
		in, err := Read(strings.NewReader(c.in), c.name, Options{})
		if err != nil {
			t.Errorf("%s %.20q: %v", c.name, c.in, err)
			continue
		}
		if in.Format != c.want {
			t.Errorf("%s %.20q: read as %s, want %s", c.name, c.in, in.Format, c.want)
		}
		if d := diffEdges(edgeMap(in.Network), wantEdges(c.edges...)); d != "" {
			t.Errorf("%s %.20q: edges differ:%s", c.name, c.in, d)
		}
	}
	// Forced: the banner is then a comment and the size line an edge.
	in, err := Read(strings.NewReader(mtx), "stdin", Options{Format: EdgeList})
	if err != nil || in.Format != EdgeList || in.Network.Edges() != 3 {
		t.Errorf("forced edge list: %v, %+v", err, in)
	}
	for _, c := range []struct {
		head string
		want Format
	}{
		{"%%matrixmarket matrix", MatrixMarket},
		{"<?xml version='1.0'?><graphml>", GraphML},
		{"<graphml xmlns=", GraphML},
		{" {\"nodes\": []}", NodeLinkJSON},
		{"% made by hand\n*Vertices 3\n", Pajek},
		{"*arcs\n1 2\n", Pajek},
		{"Creator \"igraph\"\nVersion 1\ngraph\n[\n", GML},
		{"# c\ngraph [\n directed 1\n", GML},
		{"/* c */ digraph {", DOT},
		{"graph G { a -- b }", DOT},
		{"Digraph <b>x</b> {", DOT},
		{"graph x\ny z\n", ""},
		{"*vertex 1\n", ""},
		{"a b\n", ""},
		{"1 2\n", ""},
		{"", ""},
	} {
		if got := Sniff([]byte(c.head)); got != c.want {
			t.Errorf("Sniff(%q) = %q, want %q", c.head, got, c.want)
		}
	}
}

// A gzip stream that expands past the allowance by more than the ratio is
// stopped with a one-line error; a higher ratio, or none, reads it.
func TestGzipBomb(t *testing.T) {
	defer func(a int64) { inflateAllowance = a }(inflateAllowance)
	inflateAllowance = 1 << 20
	blank := bytes.Repeat([]byte("\n"), 8<<20)
	bombOf := func(head, tail string) []byte {
		return gzipBytes(append(append([]byte(head), blank...), tail...)) // about 8 KiB
	}
	bomb := bombOf("", "a b\n")
	for f, b := range map[Format][]byte{
		EdgeList:     bomb,
		MatrixMarket: bombOf("%%MatrixMarket matrix coordinate pattern general\n", "2 2 1\n1 2\n"),
		DOT:          bombOf("digraph {", "a -> b }"),
		"":           bomb,
	} {
		_, err := Read(bytes.NewReader(b), "bomb.gz", Options{Format: f})
		if err == nil {
			t.Fatalf("%s: no error", f)
		}
		if e := asError(t, err); !strings.Contains(e.Msg, "decompression bomb") || !strings.Contains(e.Msg, "--max-inflate") || e.File != "bomb.gz" {
			t.Errorf("%s: got %q", f, e.Error())
		}
	}
	for _, ratio := range []float64{2000, -1} {
		in, err := Read(bytes.NewReader(bomb), "bomb.gz", Options{MaxInflateRatio: ratio})
		if err != nil || in.Network.Edges() != 1 {
			t.Errorf("ratio %g: %v", ratio, err)
		}
	}
	// Ordinary compressed text stays far below the bound.
	var b strings.Builder
	r := rand.New(rand.NewPCG(1, 2))
	for i := 0; i < 200000; i++ {
		b.WriteString(strconv.Itoa(r.IntN(100000)) + " " + strconv.Itoa(r.IntN(100000)) + "\n")
	}
	if _, err := Read(bytes.NewReader(gzipBytes([]byte(b.String()))), "text.gz", Options{}); err != nil {
		t.Errorf("ordinary text: %v", err)
	}
}

// DOT label and group attributes of node statements are returned by
// state; an unterminated string is reported at its start, not echoed.
func TestDOTLabels(t *testing.T) {
	in, err := Read(strings.NewReader(`digraph { p [label="Feed pump", group=north]; p -> v; v [label=<<b>V</b>>]; w }`), "l.dot", Options{})
	if err != nil {
		t.Fatal(err)
	}
	g := in.Network
	got := map[string][2]string{}
	for i := 0; i < g.N(); i++ {
		got[g.Name(int32(i))] = [2]string{in.Labels[i], in.Groups[i]}
	}
	want := map[string][2]string{"p": {"Feed pump", "north"}, "v": {"<<b>V</b>>", ""}, "w": {"", ""}}
	for k, v := range want {
		if got[k] != v {
			t.Errorf("state %s: label, group %q, want %q", k, got[k], v)
		}
	}
	in, err = Read(strings.NewReader("digraph { a -> b }"), "n.dot", Options{})
	if err != nil || in.Labels != nil || in.Groups != nil {
		t.Errorf("no labels: got %v, %q, %q", err, in.Labels, in.Groups)
	}
	huge := "digraph {\n a -> \"" + strings.Repeat("y", 1<<20) + "\n}\n"
	_, err = Read(strings.NewReader(huge), "u.dot", Options{})
	if e := asError(t, err); e.Line != 2 || len(e.Error()) > 300 {
		t.Errorf("unterminated string: got line %d, %d bytes of message", e.Line, len(e.Error()))
	}
	// The weight attribute can be renamed.
	in, err = Read(strings.NewReader("digraph { a -> b [w=3, weight=x] }"), "w.dot", Options{Weights: true, WeightKey: "w"})
	if err != nil || edgeMap(in.Network)["a>b"] != 3 {
		t.Errorf("weight key: %v", err)
	}
}

// Delimited tables: columns by header name or position, separators set
// or detected, quoted fields, isolated states (issue 12). Expected
// networks written out by hand from the rows.
func TestTables(t *testing.T) {
	names := func(s ...string) *Columns { return &Columns{Names: s} }
	pos := func(p ...int) *Columns { return &Columns{Positions: p} }
	cases := []readCase{
		{name: "by name", in: "id,from,to,w\n1,a,b,2\n2,b,c,3\n", opt: Options{Columns: names("from", "to", "w"), Weights: true},
			edges: []string{"a>b=2", "b>c=3"}},
		{name: "by name any case, reordered", in: "# export\nTarget;Source;Kind\nb;a;pipe\nc;b;\"pipe; steel\"\n", opt: Options{Columns: names("source", "target")},
			edges: []string{"a>b", "b>c"}},
		{name: "tab with spaces in names", in: "source\ttarget\nfeed pump\tdrum level\n", opt: Options{Columns: names("source", "target")},
			edges: []string{"feed pump>drum level"}},
		{name: "pandas index column", in: ",source,target\n0,a,b\n1,b,a\n", opt: Options{Columns: names("source", "target")},
			edges: []string{"a>b", "b>a"}},
		{name: "quoted", in: "s,t\n\"pump, north\",\"6\"\" main\"\n", opt: Options{Columns: names("s", "t")},
			edges: []string{"pump, north>6\" main"}},
		{name: "single name isolated", in: "s,t\na,b\nlonely\n", opt: Options{Columns: names("s", "t")},
			edges: []string{"a>b"}, nodes: []string{"a", "b", "lonely"}},
		{name: "by position", in: "x a b 2\ny b c 3\n", opt: Options{Columns: pos(2, 3, 4), Weights: true},
			edges: []string{"a>b=2", "b>c=3"}},
		{name: "by position reversed", in: "b,a\nc,b\n", opt: Options{Columns: pos(2, 1)},
			edges: []string{"a>b", "b>c"}},
		{name: "separator set", in: "a b;c d\n", opt: Options{Separator: Semicolon},
			edges: []string{"a b>c d"}},
		{name: "semicolon detected", in: "a;b\nb;c;2\n", opt: Options{Weights: true},
			edges: []string{"a>b", "b>c=2"}},
		{name: "tab detected from names with blanks", in: "feed pump\tdrum level\n", edges: []string{"feed pump>drum level"}},
		{name: "comma detected from names with blanks", in: "feed pump,drum level,2\nx y,z,1\n", opt: Options{Weights: true},
			edges: []string{"feed pump>drum level=2", "x y>z=1"}},
		{name: "plain stays plain", in: "a, b\nc\td 2\n", edges: []string{"a>b", "c>d"}},

		{name: "missing column", in: "from,to\na,b\n", opt: Options{Columns: names("source", "target")}, line: 1,
			err: `the header row has no column "source" or "target" (its columns: "from", "to")`},
		{name: "column twice", in: "S,t,s2,S\n", opt: Options{Columns: names("s", "t")}, line: 1, err: `column "s" appears twice`},
		{name: "short row", in: "s,t,w\na,b\n", opt: Options{Columns: names("s", "t", "w")}, line: 2, err: "row of 2 fields; the columns chosen need 3"},
		{name: "bad weight", in: "s,t,w\na,b,\n", opt: Options{Columns: names("s", "t", "w")}, line: 2, err: `weight "" is not a finite number`},
		{name: "two ways", in: "a,b;c\n", opt: Options{Columns: pos(1, 2)}, line: 1, err: "can be split at comma and at semicolon"},
		{name: "header by position", in: "source,target\na,b\n", opt: Options{Columns: pos(1, 2)}, line: 1, err: "looks like a header row"},
		{name: "header semicolon", in: "source;target\na;b\n", line: 1, err: "looks like a header row"},
		{name: "wide plain", in: "a;b;c;d\n", line: 1, err: "separated by semicolon, found 4 fields (choose columns"},
		{name: "control character", in: "s,t\na,\"b\x01\"\n", opt: Options{Columns: names("s", "t")}, line: 2, err: "control character 0x01"},
		{name: "empty name", in: "s,t\na,\n", opt: Options{Columns: names("s", "t")}, line: 2, err: "empty node name"},
		{name: "no header", in: "# nothing\n", opt: Options{Columns: names("s", "t")}, line: 1, err: "no header row"},
		{name: "unterminated", in: "s,t\n\"a,b\n", opt: Options{Columns: names("s", "t")}, line: 2, err: "unterminated quoted field"},
		{name: "long line", in: "s,t\n" + strings.Repeat("x", maxTableLineBytes+1) + ",b\n", opt: Options{Columns: names("s", "t")}, line: 2, err: "line longer than"},
	}
	cases = append(cases,
		// One field holding another separator is not an isolated state.
		readCase{name: "tab under semicolon", in: "a\tb\nb\tc\n", opt: Options{Separator: Semicolon}, line: 1,
			err: `one field "a\tb" holding a tab unquoted, where the separator is semicolon: quote it`},
		readCase{name: "comma under tab", in: "x\ty\n\"p,q\"\nr,s\n", opt: Options{Separator: Tab}, line: 3,
			err: `one field "r,s" holding a comma unquoted, where the separator is tab`},
		readCase{name: "semicolon under whitespace", in: "x y\nr;s\n", opt: Options{Columns: pos(1, 2), Separator: Whitespace}, line: 2,
			err: `one field "r;s" holding a semicolon unquoted`},
		// No row reaching the columns is not an edgeless network.
		readCase{name: "no row reaches", in: "# states\na\n\nb\n", opt: Options{Columns: pos(1, 2)}, line: 2,
			err: "no row of the file has the 2 fields separated by whitespace an edge needs"},
		readCase{name: "header only names", in: "s,t\na\nb\n", opt: Options{Columns: names("s", "t")}, line: 2,
			err: "no row of the file has the 2 fields separated by comma an edge needs"},
	)
	runReadCases(t, EdgeList, cases)
	// A quoted field holding another separator, beside edge rows, is an
	// isolated state.
	in0, err := Read(strings.NewReader("a\tb\n\"p,q\"\n"), "x.tsv", Options{Separator: Tab})
	if err != nil || in0.Network.N() != 3 || in0.Network.Edges() != 1 {
		t.Errorf("quoted isolated state: %v", err)
	}
	// Columns imply a table; given with another format they are refused.
	in, err := Read(strings.NewReader("{s},t\n{a},b\n"), "x.json", Options{Columns: names("{s}", "t")})
	if err != nil || in.Format != EdgeList || in.Network.Edges() != 1 {
		t.Errorf("columns, JSON-like content: %v", err)
	}
	// Content that announces another format is not read as a table, by
	// columns or by a separator.
	for _, c := range []struct{ in, title string }{
		{"%%MatrixMarket matrix coordinate pattern general\n3 3 2\n2 1\n3 2\n", "Matrix Market"},
		{"*Vertices 2\n1 a\n2 b\n*Arcs\n1 2\n", "Pajek"},
		{"digraph { a -> b }\n", "DOT"},
		{"<?xml version=\"1.0\"?>\n<graphml/>\n", "GraphML"},
		{"graph [ directed 1 ]\n", "GML"},
		{"{\"nodes\": [], \"links\": []}\n", "node-link JSON"},
	} {
		for _, opt := range []Options{{Columns: pos(1, 2)}, {Separator: Tab}} {
			_, err := Read(strings.NewReader(c.in), "x.txt", opt)
			if err == nil || !strings.Contains(err.Error(), "x.txt: the content is "+c.title+", not an edge list or table; columns and separators apply only") {
				t.Errorf("%s with %+v: got %v", c.title, opt, err)
			}
		}
		in, err := Read(strings.NewReader(c.in), "x.txt", Options{Format: EdgeList, Columns: pos(1, 2)})
		if err == nil && in.Format != EdgeList {
			t.Errorf("%s forced to edges: read as %s", c.title, in.Format)
		}
	}
	_, err = Read(strings.NewReader("s,t\na,b\n"), "x.txt", Options{Format: DOT, Columns: names("s", "t")})
	if err == nil || !strings.Contains(err.Error(), "x.txt: columns and separators apply to edge lists and tables; this is read as dot") {
		t.Errorf("got %v", err)
	}
	for _, s := range []string{"1,2", "from,to,weight", " a , b "} {
		if _, err := ParseColumns(s); err != nil {
			t.Errorf("ParseColumns(%q): %v", s, err)
		}
	}
	for _, s := range []string{"1", "a,2", "1,1", "0,1", "a,b,c,d", "a,,b", "a,A"} {
		if _, err := ParseColumns(s); err == nil {
			t.Errorf("ParseColumns(%q): no error", s)
		}
	}
	c, _ := ParseColumns("3,1")
	if !slices.Equal(c.Positions, []int{3, 1}) || c.Names != nil {
		t.Errorf("ParseColumns(3,1) = %+v", c)
	}
	for _, s := range []string{"comma", "tab", "semicolon", "whitespace", "auto", ";"} {
		if _, err := ParseSeparator(s); err != nil {
			t.Errorf("ParseSeparator(%q): %v", s, err)
		}
	}
}

// Tables are read by the block parser too: across small blocks, in
// parallel, the same network as in one block.
func TestTablesInBlocks(t *testing.T) {
	var b strings.Builder
	b.WriteString("# exported\nkind;to;from;weight\n")
	for i := 0; i < 3000; i++ {
		b.WriteString("pipe;\"n" + strings.Repeat("x", i%5) + "\";m" + string(rune('a'+i%26)) + ";1.5\n")
		if i%100 == 0 {
			b.WriteString("lonely" + string(rune('a'+i%26)) + "\n")
		}
	}
	opt := Options{Columns: &Columns{Names: []string{"from", "to", "weight"}}, Weights: true}
	want, err := readWith([]byte(b.String()), 1<<20, 1, opt)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct{ block, workers int }{{1 << 20, 2}, {maxTableLineBytes + 2, 2}, {maxTableLineBytes + 2, 1}} {
		got, err := readWith([]byte(b.String()), c.block, c.workers, opt)
		if err != nil {
			t.Fatal(err)
		}
		if err := sameNetwork(got, want); err != nil {
			t.Errorf("block %d workers %d: %v", c.block, c.workers, err)
		}
	}
	// The states, counted from the rows another way.
	seen := map[string]bool{}
	for _, l := range strings.Split(b.String(), "\n")[2:] {
		for _, f := range strings.Split(l, ";")[min(1, len(strings.Split(l, ";"))-1):] {
			if f != "" && f != "1.5" {
				seen[strings.Trim(f, "\"")] = true
			}
		}
	}
	if want.N() != len(seen) {
		t.Errorf("got %d states, want %d", want.N(), len(seen))
	}
}
