package netread

import (
	"bufio"
	"bytes"
	"compress/gzip"
	"fmt"
	"io"
	"math"
	"math/rand/v2"
	"slices"
	"strconv"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/io/internal/source"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/gen"
)

// readLines is the reference edge-list reader: one line at a time through
// lineReader and the general tokenizer, every name through Intern. It is
// the straightforward reading of the format rules, kept to check the block
// parser against.
func readLines(r *bufio.Reader, file string, b *structural.Builder, weights bool) error {
	lr := &lineReader{r: r, file: file, max: maxLineBytes}
	var tok tokenizer
	first := true // no non-comment line yet
	for {
		line, err := lr.next()
		if err == io.EOF {
			return nil
		}
		if err != nil {
			return err
		}
		if lr.line == 1 {
			line = bytes.TrimPrefix(line, []byte("\xef\xbb\xbf"))
		}
		if first {
			ht := tokenizer{unlimited: true}
			if f, _ := ht.split(line); len(f) > 0 {
				first = false
				if refHeader(f) {
					return errorf(file, lr.line, "%q looks like a header row; choose the columns by name to read it, or comment it out with #", clip(bytes.TrimSpace(line)))
				}
			}
		}
		fields, msg := tok.split(line)
		if msg != "" {
			return errorf(file, lr.line, "%s", msg)
		}
		for k := 0; k < len(fields) && k < 2; k++ {
			for _, c := range fields[k] {
				if c < 0x20 && c != '\t' || c == 0x7f {
					return errorf(file, lr.line, "control character 0x%02x in a node name", c)
				}
			}
		}
		switch len(fields) {
		case 0:
			continue
		case 1:
			// One name: an isolated state, unless it holds a semicolon.
			if strings.Contains(string(line), ";") && !strings.HasPrefix(strings.TrimSpace(string(line)), "\"") {
				return errorf(file, lr.line, "one name %q holding a semicolon: quote it to declare an isolated state, or set the separator to semicolon", clip(fields[0]))
			}
			if len(fields[0]) == 0 {
				return errorf(file, lr.line, "empty node name")
			}
			if len(fields[0]) > MaxNameBytes {
				return errorf(file, lr.line, "node name of %d bytes; the limit is %d", len(fields[0]), MaxNameBytes)
			}
			if _, err := b.Intern(fields[0]); err != nil {
				return errorf(file, lr.line, "%v", err)
			}
			continue
		case 2, 3:
		default:
			return errorf(file, lr.line, "want \"source target [weight]\", found %d fields", len(fields))
		}
		for _, f := range fields[:2] {
			if len(f) == 0 {
				return errorf(file, lr.line, "empty node name")
			}
			if len(f) > MaxNameBytes {
				return errorf(file, lr.line, "node name of %d bytes; the limit is %d", len(f), MaxNameBytes)
			}
		}
		u, err := b.Intern(fields[0])
		if err != nil {
			return errorf(file, lr.line, "%v", err)
		}
		v, err := b.Intern(fields[1])
		if err != nil {
			return errorf(file, lr.line, "%v", err)
		}
		if len(fields) == 3 {
			w, err := strconv.ParseFloat(string(fields[2]), 64)
			if err != nil || math.IsNaN(w) || math.IsInf(w, 0) {
				return errorf(file, lr.line, "weight %q is not a finite number", clip(fields[2]))
			}
			if w == 0 {
				return errorf(file, lr.line, "weight 0 is no coupling; leave the edge out")
			}
			if weights {
				b.AddWeightedEdge(u, v, w)
				continue
			}
		}
		b.AddEdge(u, v)
	}
}

// refHeader is the header rule of doc.go written out for the reference
// reader: the first two fields a known pair, unless the line is an edge with
// a numeric weight; or three fields, the third a weight column's name.
func refHeader(f [][]byte) bool {
	if len(f) < 2 {
		return false
	}
	pair := strings.ToLower(string(f[0]) + "," + string(f[1]))
	known := pair == "source,target" || pair == "from,to" || pair == "src,dst" || pair == "tail,head"
	if len(f) != 3 {
		return known
	}
	switch strings.ToLower(string(f[2])) {
	case "weight", "value", "w":
		return true
	}
	_, err := strconv.ParseFloat(string(f[2]), 64)
	return known && err != nil
}

// readWith reads data with the given block size and worker count (0: the
// reference line reader).
func readWith(data []byte, block, workers int, opt Options) (*structural.Network, error) {
	defer func(b, w int) { blockBytes, parseWorkers = b, w }(blockBytes, parseWorkers)
	blockBytes, parseWorkers = block, workers
	if workers == 0 {
		br, err := maybeGunzip(source.NewDigest(bytes.NewReader(data)), "in", opt)
		if err != nil {
			return nil, err
		}
		b := structural.NewBuilder()
		if err := readLines(br, "in", b, opt.Weights); err != nil {
			return nil, err
		}
		return finish(b, "in", opt)
	}
	return readNet(bytes.NewReader(data), "in", opt)
}

// sameNetwork reports the first difference between two networks: state
// names in order, both CSRs, weights and counters.
func sameNetwork(a, b *structural.Network) error {
	if a.N() != b.N() {
		return fmt.Errorf("%d states vs %d", a.N(), b.N())
	}
	for i := 0; i < a.N(); i++ {
		if a.Name(int32(i)) != b.Name(int32(i)) {
			return fmt.Errorf("state %d named %q vs %q", i, a.Name(int32(i)), b.Name(int32(i)))
		}
	}
	if !slices.Equal(a.Out().Ptr, b.Out().Ptr) || !slices.Equal(a.Out().Adj, b.Out().Adj) {
		return fmt.Errorf("out-rows differ")
	}
	if !slices.Equal(a.In().Ptr, b.In().Ptr) || !slices.Equal(a.In().Adj, b.In().Adj) {
		return fmt.Errorf("in-rows differ")
	}
	if !slices.Equal(a.Weights(), b.Weights()) {
		return fmt.Errorf("weights differ")
	}
	if a.SelfLoops() != b.SelfLoops() || a.DuplicatesMerged() != b.DuplicatesMerged() {
		return fmt.Errorf("counters differ: %d/%d vs %d/%d", a.SelfLoops(), a.DuplicatesMerged(), b.SelfLoops(), b.DuplicatesMerged())
	}
	return nil
}

// messyEdgeList writes lines in every shape the format allows: integer
// names (canonical or not: "7", "007", "+7"), words, quoted names with
// spaces, commas and doubled quotes, commas and tabs as separators, CRLF,
// comments, blank lines and optional weights.
func messyEdgeList(r *rand.Rand, lines int, spread int) []byte {
	var b []byte
	name := func() string {
		v := r.IntN(spread)
		switch r.IntN(10) {
		case 0:
			return "0" + strconv.Itoa(v)
		case 1:
			return "+" + strconv.Itoa(v)
		case 2:
			return "s" + strconv.Itoa(v%97)
		case 3:
			return `"` + strconv.Itoa(v%50) + ` x, ""q"""`
		case 4:
			return `"` + strconv.Itoa(v) + `"` // quoted canonical: the same state as unquoted
		default:
			return strconv.Itoa(v)
		}
	}
	seps := []string{" ", "\t", ",", " , ", "  "}
	for i := 0; i < lines; i++ {
		switch r.IntN(20) {
		case 0:
			b = append(b, "# comment 1 2\n"...)
			continue
		case 1:
			b = append(b, "   \n"...)
			continue
		case 2:
			b = append(b, "% note\r\n"...)
			continue
		}
		if r.IntN(4) == 0 {
			b = append(b, ' ')
		}
		b = append(b, name()...)
		b = append(b, seps[r.IntN(len(seps))]...)
		b = append(b, name()...)
		if r.IntN(3) == 0 {
			b = append(b, seps[r.IntN(len(seps))]...)
			b = strconv.AppendFloat(b, float64(1+r.IntN(9))/4, 'g', -1, 64)
		}
		if r.IntN(5) == 0 {
			b = append(b, " \t"...)
		}
		if r.IntN(6) == 0 {
			b = append(b, '\r')
		}
		if i < lines-1 || r.IntN(2) == 0 {
			b = append(b, '\n')
		}
	}
	return b
}

// TestBlockParserMatchesLineReader checks that the block parser, sequential
// and parallel, with blocks small enough that lines straddle them, builds
// the same network as the line-by-line reference, names and numbering
// included.
func TestBlockParserMatchesLineReader(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 4))
	for trial := 0; trial < 24; trial++ {
		data := messyEdgeList(r, 200+r.IntN(3000), []int{20, 1000, 1 << 20}[trial%3])
		switch trial % 4 {
		case 1:
			data = append([]byte(utf8BOM), data...)
		case 3:
			data = gzipBytes(append([]byte(utf8BOM), data...))
		}
		opt := Options{Weights: trial%2 == 0}
		want, err := readWith(data, 0, 0, opt)
		if err != nil {
			t.Fatalf("trial %d: reference: %v", trial, err)
		}
		for _, c := range []struct{ block, workers int }{{1 << 20, 1}, {1 << 20, 2}, {300, 1}, {300, 2}, {301, 3}, {4096, 2}} {
			got, err := readWith(data, c.block, c.workers, opt)
			if err != nil {
				t.Fatalf("trial %d block %d workers %d: %v", trial, c.block, c.workers, err)
			}
			if err := sameNetwork(got, want); err != nil {
				t.Fatalf("trial %d block %d workers %d: %v", trial, c.block, c.workers, err)
			}
		}
	}
}

// TestParallelReadLarge reads a generated network of 2*10^5 edges
// sequentially and in parallel, plain and gzip-compressed.
func TestParallelReadLarge(t *testing.T) {
	e, err := gen.Params{Model: "scale-free", Nodes: 40000, MeanDegree: 10, GammaOut: 2.5, GammaIn: 2.5}.Edges(gen.NewRand(9))
	if err != nil {
		t.Fatal(err)
	}
	data := e.AppendEdgeList(nil, 1)
	var z bytes.Buffer
	zw := gzip.NewWriter(&z)
	zw.Write(data)
	zw.Close()
	want, err := readWith(data, 0, 0, Options{})
	if err != nil {
		t.Fatal(err)
	}
	for _, in := range [][]byte{data, z.Bytes()} {
		for _, c := range []struct{ block, workers int }{{1 << 20, 1}, {1 << 16, 2}, {1 << 16, 1}, {1 << 14, 4}} {
			got, err := readWith(in, c.block, c.workers, Options{})
			if err != nil {
				t.Fatal(err)
			}
			if err := sameNetwork(got, want); err != nil {
				t.Fatalf("block %d workers %d: %v", c.block, c.workers, err)
			}
		}
	}
}

// TestBlockParserErrors checks that errors carry the same message and line
// as the reference reader, also when the bad line sits in a later block.
func TestBlockParserErrors(t *testing.T) {
	good := strings.Repeat("1 2\n# c\n", 300)
	// More than one block of comments: the first non-comment line sits in
	// a later block.
	comments := strings.Repeat("# only a comment\n", 2000)
	long := strings.Repeat("y", maxLineBytes+1)
	for _, bad := range []string{
		"\"\"\n", "a b c d\n", "a,,b\n", "\"x y\n", "a\"b c\n", "\"a\"b c\n",
		"a b 0\n", "a b nan\n", "a b 1e999\n", "a b,\n", "a,b,1,\n",
		strings.Repeat("n", MaxNameBytes+1) + " b\n", long + "\n", long,
		// Control characters, bare and quoted, in either name.
		"\x00\x01 x\n", "a\x7f b\n", "a b\x1b\n", "\"a\rb\" c\n", "a,\"b\x00\"\n", "x\x00\n", "a b \x02\n", "a\x00 b c d\n",
		// Header lines: refused first, edges (or weight errors) later.
		"source,target\n", "Source,Target,Weight\r\n", "\"from\",\"to\"\n", "src dst value\n", "u,v,weight\n",
		"tail,head,type,id\n", "source target x\n", "a b W\n", "source target \x00\n",
	} {
		for _, in := range []string{bad, good + bad + good, comments + bad + good, "\xef\xbb\xbf" + bad + good} {
			wantG, want := readWith([]byte(in), 0, 0, Options{})
			if want == nil && in == bad {
				t.Fatalf("%.20q: reference reader accepted it", bad)
			}
			for _, c := range []struct{ block, workers int }{{1 << 20, 1}, {1 << 20, 2}, {maxLineBytes + 2, 2}, {maxLineBytes + 2, 1}} {
				g, got := readWith([]byte(in), c.block, c.workers, Options{})
				switch {
				case want == nil && got == nil:
					// A header-like line after the first edge is an edge.
					if err := sameNetwork(g, wantG); err != nil {
						t.Errorf("%.20q block %d workers %d: %v", in, c.block, c.workers, err)
					}
				case want == nil || got == nil || got.Error() != want.Error():
					t.Errorf("%.20q block %d workers %d: got error %v, want %v", in, c.block, c.workers, got, want)
				}
			}
		}
	}
}
