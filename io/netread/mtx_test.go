package netread

import (
	"bytes"
	"fmt"
	"runtime"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/structural"
)

// Matrix Market rules from the format's definition (Boisvert, Pozo &
// Remington, "The Matrix Market Exchange Formats: Initial Design", NIST
// IR 5935, 1996): a %%MatrixMarket banner, % comments, a size line "M N NZ",
// then NZ lines "i j [value]" with 1-based indices; symmetric and
// skew-symmetric files store one triangle. The network reading (entry
// (i, j) is the edge j -> i) is the convention of issue 2.
func TestMatrixMarket(t *testing.T) {
	const gen = "%%MatrixMarket matrix coordinate pattern general\n"
	const real = "%%MatrixMarket matrix coordinate real general\n"
	cases := []readCase{
		{name: "pattern", in: gen + "% a comment\n3 3 3\n2 1\n3 2\n1 3\n",
			edges: []string{"1>2", "2>3", "3>1"}, nodes: []string{"1", "2", "3"}},
		{name: "byte-order mark", in: "\ufeff" + gen + "2 2 1\n2 1\n", edges: []string{"1>2"}},
		{name: "isolated states", in: gen + "4 4 1\n2 1\n", edges: []string{"1>2"}, nodes: []string{"1", "2", "3", "4"}},
		{name: "comments and blanks among entries", in: gen + "%c\n\n2 2 2\n% mid\n1 2\n\n2 2\n", edges: []string{"2>1", "2>2"}, loops: 1},
		{name: "crlf", in: strings.ReplaceAll(gen+"2 2 1\n1 2\n", "\n", "\r\n"), edges: []string{"2>1"}},
		{name: "no final newline", in: gen + "2 2 1\n1 2", edges: []string{"2>1"}},
		{name: "tabs and leading blanks", in: gen + " 2\t2 1\n\t1\t2 \n", edges: []string{"2>1"}},
		{name: "case-insensitive banner", in: "%%MatrixMarket MATRIX Coordinate Pattern GENERAL\n2 2 1\n1 2\n", edges: []string{"2>1"}},
		{name: "real without weights", in: real + "2 2 2\n1 2 0.5\n2 1 -3\n", edges: []string{"2>1", "1>2"}},
		{name: "real with weights", in: real + "2 2 2\n1 2 0.5\n2 1 -3e2\n", opt: Options{Weights: true},
			edges: []string{"2>1=0.5", "1>2=-300"}},
		{name: "explicit zero is an entry", in: real + "2 2 1\n1 2 0\n", opt: Options{Weights: true}, edges: []string{"2>1=0"}},
		{name: "integer", in: "%%MatrixMarket matrix coordinate integer general\n2 2 1\n2 1 -7\n", opt: Options{Weights: true},
			edges: []string{"1>2=-7"}},
		{name: "duplicates summed", in: real + "2 2 3\n1 2 1.5\n1 2 2\n2 2 1\n", opt: Options{Weights: true},
			edges: []string{"2>1=3.5", "2>2=1"}, dups: 1, loops: 1},
		{name: "symmetric", in: "%%MatrixMarket matrix coordinate real symmetric\n3 3 3\n2 1 4\n3 3 5\n3 2 6\n", opt: Options{Weights: true},
			edges: []string{"1>2=4", "2>1=4", "3>3=5", "2>3=6", "3>2=6"}, loops: 1},
		{name: "symmetric pattern upper entry", in: "%%MatrixMarket matrix coordinate pattern symmetric\n3 3 1\n1 3\n",
			edges: []string{"3>1", "1>3"}},
		{name: "skew-symmetric", in: "%%MatrixMarket matrix coordinate real skew-symmetric\n3 3 2\n2 1 4\n3 1 -1\n", opt: Options{Weights: true},
			edges: []string{"1>2=4", "2>1=-4", "1>3=-1", "3>1=1"}},
		{name: "extra states as indices", in: gen + "3 3 1\n2 1\n", opt: Options{States: []string{"3", "1"}}, edges: []string{"1>2"}, nodes: []string{"1", "2", "3"}},
		{name: "self-dynamics", in: gen + "2 2 2\n1 1\n2 1\n", opt: Options{Build: structural.BuildOptions{SelfDynamics: true}},
			edges: []string{"1>1", "1>2", "2>2"}, loops: 2},
		{name: "undirected", in: gen + "2 2 1\n2 1\n", opt: Options{Build: structural.BuildOptions{Undirected: true}},
			edges: []string{"1>2", "2>1"}},

		{name: "empty file", in: "", line: 1, err: "empty file"},
		{name: "missing header", in: "3 3 1\n1 2\n", line: 1, err: "missing the %%MatrixMarket header"},
		{name: "short header", in: "%%MatrixMarket matrix coordinate real\n", line: 1, err: "4 words"},
		{name: "array", in: "%%MatrixMarket matrix array real general\n2 2\n1\n0\n0\n1\n", line: 1, err: "array format is not supported"},
		{name: "complex", in: "%%MatrixMarket matrix coordinate complex general\n1 1 1\n1 1 1 0\n", line: 1, err: "complex values are not supported"},
		{name: "hermitian", in: "%%MatrixMarket matrix coordinate real hermitian\n1 1 0\n", line: 1, err: "hermitian"},
		{name: "vector object", in: "%%MatrixMarket vector coordinate real general\n", line: 1, err: "object \"vector\""},
		{name: "odd field", in: "%%MatrixMarket matrix coordinate double general\n", line: 1, err: "field \"double\""},
		{name: "missing size line", in: gen + "% only comments\n", line: 3, err: "missing the size line"},
		{name: "size line fields", in: gen + "3 3\n", line: 2, err: "size line wants 3 integers"},
		{name: "size line text", in: gen + "3 x 1\n", line: 2, err: "columns \"x\""},
		{name: "size line negative", in: gen + "3 3 -1\n", line: 2, err: "entries \"-1\""},
		{name: "not square", in: gen + "%\n3 4 1\n1 1\n", line: 3, err: "3 x 4"},
		{name: "no rows", in: gen + "0 0 0\n", line: 2, err: "empty network"},
		{name: "rows beyond MaxStates", in: gen + "1099511627776 1099511627776 1\n1 1\n", line: 2, err: "more than the 2147483646"},
		{name: "states unjustified", in: gen + "2000000 2000000 1\n1 1\n", line: 2, err: "which the entries can justify"},
		{name: "too few entries", in: gen + "3 3 3\n1 2\n2 3\n", line: 2, err: "announces 3 entries, the file holds 2"},
		{name: "too many entries", in: gen + "3 3 1\n1 2\n2 3\n", line: 4, err: "entry beyond the 1"},
		{name: "row out of range", in: gen + "3 3 2\n1 2\n4 1\n", line: 4, err: "row index \"4\" is not an integer in 1..3"},
		{name: "zero index", in: gen + "3 3 1\n1 0\n", line: 3, err: "column index \"0\""},
		{name: "non-numeric index", in: gen + "3 3 1\na 1\n", line: 3, err: "row index \"a\""},
		{name: "negative index", in: gen + "3 3 1\n-1 1\n", line: 3, err: "row index \"-1\""},
		{name: "huge index", in: gen + "3 3 1\n99999999999999999999999 1\n", line: 3, err: "row index"},
		{name: "pattern with value", in: gen + "3 3 1\n1 2 5\n", line: 3, err: "found more than 2 fields"},
		{name: "real without value", in: real + "3 3 1\n1 2\n", line: 3, err: "want \"row column value\", found 2 fields"},
		{name: "real extra fields", in: real + "3 3 1\n1 2 1 0\n", line: 3, err: "more than 3 fields"},
		{name: "NaN value", in: real + "3 3 1\n1 2 NaN\n", line: 3, err: "not a finite number"},
		{name: "Inf value", in: real + "3 3 1\n1 2 inf\n", line: 3, err: "not a finite number"},
		{name: "bad value", in: real + "3 3 1\n1 2 one\n", line: 3, err: "not a finite number"},
		{name: "integer with fraction", in: "%%MatrixMarket matrix coordinate integer general\n3 3 1\n1 2 1.5\n", line: 3, err: "not an integer"},
		{name: "skew diagonal", in: "%%MatrixMarket matrix coordinate real skew-symmetric\n3 3 2\n2 1 1\n2 2 1\n", line: 4, err: "diagonal entry (2, 2)"},
		{name: "extra state not an index", in: gen + "3 3 1\n1 2\n", opt: Options{States: []string{"pump"}}, err: "extra state \"pump\" is not an index in 1..3"},
		{name: "extra state out of range", in: gen + "3 3 1\n1 2\n", opt: Options{States: []string{"4"}}, err: "not an index in 1..3"},
		{name: "extra state not canonical", in: gen + "3 3 1\n1 2\n", opt: Options{States: []string{"02"}}, err: "not an index"},
		// The state names netsteer's writer records come back.
		{name: "names", in: gen + "% entry (i, j): state j acts on state i\n% state names: state I is the I-th row and column\n% state 1 pump\n% state 2 \"drum level\"\n% state 3 7\n% other\n3 3 2\n2 1\n3 2\n",
			opt: Options{States: []string{"7"}}, edges: []string{"pump>drum level", "drum level>7"}, nodes: []string{"7", "drum level", "pump"}},
		{name: "names, then comments", in: gen + "% state names: state I is the I-th row and column\n% state 1 a\n% state 2 b\n% one\n% two\n2 2 1\n2 1\n",
			edges: []string{"a>b"}, nodes: []string{"a", "b"}},
		{name: "names too few", in: gen + "% state names: state I is the I-th row and column\n% state 1 a\n3 3 1\n1 2\n", line: 2, err: "1 state names for the 3 states of the size line (line 4)"},
		{name: "names out of order", in: gen + "% state names: state I is the I-th row and column\n% state 2 a\n2 2 1\n1 2\n", line: 3, err: "want state 1 (the names go in order)"},
		{name: "names twice", in: gen + "% state names: state I is the I-th row and column\n% state 1 a\n% state 2 a\n2 2 1\n1 2\n", line: 4, err: "state name \"a\" is given to states 1 and 2"},
		{name: "names two fields", in: gen + "% state names: state I is the I-th row and column\n% state 1 a b\n1 1 0\n", line: 3, err: "want one name"},
		{name: "names after the end", in: gen + "% state names: state I is the I-th row and column\n% state 1 a\n% x\n% state 2 b\n2 2 0\n", line: 5, err: "after the list of names ended"},
		{name: "names extra state", in: gen + "% state names: state I is the I-th row and column\n% state 1 a\n1 1 0\n", opt: Options{States: []string{"1"}}, err: "not one of the state names"},
	}
	runReadCases(t, MatrixMarket, cases)
}

// A size line's claim must not size an allocation: 10^12 entries and 10^6
// states claimed, one entry present, must fail fast with little memory.
func TestMatrixMarketHugeClaim(t *testing.T) {
	for _, in := range []string{
		"%%MatrixMarket matrix coordinate real general\n1000000 1000000 1000000000000\n1 2 1\n",
		"%%MatrixMarket matrix coordinate pattern symmetric\n2147483646 2147483646 1000000000000\n1 2\n",
		"%%MatrixMarket matrix coordinate pattern general\n1099511627776 1099511627776 1000000000000\n",
	} {
		var before, after runtime.MemStats
		runtime.GC()
		runtime.ReadMemStats(&before)
		_, err := Read(strings.NewReader(in), "big.mtx", Options{Format: MatrixMarket})
		runtime.ReadMemStats(&after)
		if err == nil {
			t.Fatalf("no error for %q", in)
		}
		asError(t, err)
		t.Logf("%v; allocated %d KB", err, (after.TotalAlloc-before.TotalAlloc)>>10)
		if d := after.TotalAlloc - before.TotalAlloc; d > 64<<20 {
			t.Errorf("%q: allocated %d MB, want under 64 MB", firstLines(in), d>>20)
		}
	}
}

func firstLines(s string) string {
	if i := strings.IndexByte(s, '\n'); i >= 0 {
		if j := strings.IndexByte(s[i+1:], '\n'); j >= 0 {
			return s[:i+1+j]
		}
	}
	return s
}

// A Matrix Market file and an edge list with the same edges (entry (i, j)
// read as the line "j i") give the same network: an independent route
// through the other reader.
func TestMatrixMarketMatchesEdgeList(t *testing.T) {
	var mtx, el bytes.Buffer
	const n = 200
	type e struct{ i, j int }
	var entries []e
	seed := uint64(12345)
	next := func() int {
		seed = seed*6364136223846793005 + 1442695040888963407
		return int(seed>>33) % n
	}
	for k := 0; k < 1500; k++ {
		entries = append(entries, e{next() + 1, next() + 1})
	}
	fmt.Fprintf(&mtx, "%%%%MatrixMarket matrix coordinate integer general\n%d %d %d\n", n, n, len(entries))
	for k, en := range entries {
		fmt.Fprintf(&mtx, "%d %d %d\n", en.i, en.j, k%5+1)
		fmt.Fprintf(&el, "%d %d %d\n", en.j, en.i, k%5+1)
	}
	// The edge list cannot name isolated states; give it all of them.
	all := make([]string, n)
	for i := range all {
		all[i] = fmt.Sprint(i + 1)
	}
	gm, err := readNet(&mtx, "m.mtx", Options{Format: MatrixMarket, Weights: true})
	if err != nil {
		t.Fatal(err)
	}
	ge, err := readNet(&el, "e.edges", Options{Weights: true, States: all})
	if err != nil {
		t.Fatal(err)
	}
	if err := checkNetwork(gm); err != nil {
		t.Fatal(err)
	}
	if gm.N() != ge.N() || gm.DuplicatesMerged() != ge.DuplicatesMerged() || gm.SelfLoops() != ge.SelfLoops() {
		t.Errorf("got N %d, dups %d, loops %d; want %d, %d, %d", gm.N(), gm.DuplicatesMerged(), gm.SelfLoops(), ge.N(), ge.DuplicatesMerged(), ge.SelfLoops())
	}
	if d := diffEdges(edgeMap(gm), edgeMap(ge)); d != "" {
		t.Errorf("edges differ:%s", d)
	}
}

// mtxInput writes a fixed-seed random Matrix Market file with n states and
// 5n entries (mean total degree 10).
func mtxInput(n int, field string) []byte {
	var b bytes.Buffer
	m := 5 * n
	fmt.Fprintf(&b, "%%%%MatrixMarket matrix coordinate %s general\n%d %d %d\n", field, n, n, m)
	seed := uint64(2024)
	next := func() int {
		seed = seed*6364136223846793005 + 1442695040888963407
		return int(seed>>33)%n + 1
	}
	for k := 0; k < m; k++ {
		if field == "pattern" {
			fmt.Fprintf(&b, "%d %d\n", next(), next())
		} else {
			fmt.Fprintf(&b, "%d %d %d.%d\n", next(), next(), k%9+1, k%7)
		}
	}
	return b.Bytes()
}

func BenchmarkMatrixMarket(b *testing.B) {
	for _, n := range []int{1e4, 1e5, 1e6} {
		for _, field := range []string{"pattern", "real"} {
			in := mtxInput(n, field)
			b.Run(fmt.Sprintf("%s/n=%d", field, n), func(b *testing.B) {
				b.SetBytes(int64(len(in)))
				for b.Loop() {
					if _, err := Read(bytes.NewReader(in), "b.mtx", Options{Format: MatrixMarket, Weights: true}); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}
