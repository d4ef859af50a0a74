package netread

import (
	"strings"
	"testing"

	"github.com/netsteer/netsteer/structural"
)

// The expected networks below are written out by hand from the input
// lines; the format rules are the ones issue 2 sets (common practice for
// CSV-style quoting: RFC 4180 doubles a quote inside a quoted field).
func TestEdgeList(t *testing.T) {
	long := strings.Repeat("x", MaxNameBytes)
	tooLong := long + "y"
	cases := []readCase{
		{name: "plain", in: "a b\nb c\n", edges: []string{"a>b", "b>c"}, nodes: []string{"a", "b", "c"}},
		{name: "comments and blanks", in: "# header\n\n  % note\na b\n\t\n# end\n", edges: []string{"a>b"}},
		{name: "crlf", in: "a b\r\nb c\r\n", edges: []string{"a>b", "b>c"}, nodes: []string{"a", "b", "c"}},
		{name: "no final newline", in: "a b\nb c", edges: []string{"a>b", "b>c"}},
		{name: "no final newline crlf", in: "a b\r\nb c\r", edges: []string{"a>b", "b>c"}},
		{name: "tabs and commas mixed", in: "a\tb\nc , d\t2\ne,f,3\ng ,\th\n", edges: []string{"a>b", "c>d", "e>f", "g>h"}},
		{name: "quoted names", in: "\"pump 1\",\"valve, main\"\n\"say \"\"hi\"\"\" \"pump 1\"\n",
			edges: []string{"pump 1>valve, main", `say "hi">pump 1`}, nodes: []string{"pump 1", `say "hi"`, "valve, main"}},
		{name: "quoted empty-looking but spaced", in: "\" \" a\n", edges: []string{" >a"}},
		{name: "name at the limit", in: long + " b\n", edges: []string{long + ">b"}},
		{name: "duplicates merged", in: "a b\na b\na b\nb a\n", edges: []string{"a>b", "b>a"}, dups: 2},
		{name: "self-loops", in: "a a\nb b\nb b\na c\n", edges: []string{"a>a", "b>b", "a>c"}, dups: 1, loops: 2},
		{name: "weights ignored by default", in: "a b 2.5\na b 4\n", edges: []string{"a>b"}, dups: 1},
		{name: "weights kept and summed", in: "a b 2.5\na b -4\nb c\n", opt: Options{Weights: true},
			edges: []string{"a>b=-1.5", "b>c=1"}, dups: 1},
		{name: "weight syntax", in: "a b 1e-3\nb c -2\nc d +.5\n", opt: Options{Weights: true},
			edges: []string{"a>b=0.001", "b>c=-2", "c>d=0.5"}},
		{name: "extra states", in: "a b\n", opt: Options{States: []string{"c", "a"}}, edges: []string{"a>b"}, nodes: []string{"a", "b", "c"}},
		{name: "only extra states", in: "# nothing\n", opt: Options{States: []string{"lonely"}}, nodes: []string{"lonely"}},
		{name: "undirected", in: "a b\nb c\nc c\n", opt: Options{Build: structural.BuildOptions{Undirected: true}},
			edges: []string{"a>b", "b>a", "b>c", "c>b", "c>c"}, loops: 1},
		// Each line is a two-way coupling; the repeated line repeats both
		// directed couplings, so two are merged.
		{name: "undirected repeat", in: "a b\nb a\n", opt: Options{Build: structural.BuildOptions{Undirected: true}},
			edges: []string{"a>b", "b>a"}, dups: 2},
		{name: "self-dynamics", in: "a b\nb b\nb b\n", opt: Options{Build: structural.BuildOptions{SelfDynamics: true}},
			edges: []string{"a>b", "a>a", "b>b"}, loops: 2, dups: 1},
		{name: "self-dynamics undirected weighted", in: "a b 3\n", opt: Options{Weights: true, Build: structural.BuildOptions{SelfDynamics: true, Undirected: true}},
			edges: []string{"a>b=3", "b>a=3", "a>a=1", "b>b=1"}, loops: 2},

		// A leading byte-order mark (U+FEFF as UTF-8) is skipped, also
		// inside gzip; names in UTF-8 are kept.
		{name: "byte-order mark", in: "\xef\xbb\xbfa b\n", edges: []string{"a>b"}, nodes: []string{"a", "b"}},
		{name: "byte-order mark gzip", in: string(gzipBytes([]byte("\xef\xbb\xbfa b\n"))), edges: []string{"a>b"}, nodes: []string{"a", "b"}},
		{name: "byte-order mark then comment", in: "\xef\xbb\xbf# c\na b\n", edges: []string{"a>b"}},
		{name: "utf-8 names", in: "Füllstand Ventil_ä\n", edges: []string{"Füllstand>Ventil_ä"}},
		{name: "tab in quoted name", in: "\"a\tb\" c\n", edges: []string{"a\tb>c"}},
		// Header-like first lines that are edges: a numeric weight, a pair
		// not in the list, the pair reversed, or not the first line.
		{name: "header words with weight", in: "source target 2\n", edges: []string{"source>target"}},
		{name: "ordinary first edge", in: "u,v\nv,w\n", edges: []string{"u>v", "v>w"}},
		{name: "reversed pair", in: "to from\n", edges: []string{"to>from"}},
		{name: "header words later", in: "a b\nsource,target\n", edges: []string{"a>b", "source>target"}},
		{name: "commented header", in: "# source,target\na,b\n", edges: []string{"a>b"}},

		{name: "control characters", in: "a b\nc d\n\x00\x01 x\n", line: 3, err: "control character 0x00 in a node name"},
		{name: "control character second name", in: "a b\x1b\n", line: 1, err: "control character 0x1b in a node name"},
		{name: "DEL", in: "a\x7fb c\n", line: 1, err: "control character 0x7f in a node name"},
		{name: "control character quoted", in: "\"a\rb\" c\n", line: 1, err: "control character 0x0d in a node name"},
		{name: "control character one field", in: "x\x02\n", line: 1, err: "control character 0x02 in a node name"},
		{name: "header", in: "source,target\na,b\n", line: 1, err: `"source,target" looks like a header row; choose the columns by name to read it, or comment it out with #`},
		{name: "header with weight", in: "Source,Target,Weight\r\na,b,1\n", line: 1, err: `"Source,Target,Weight" looks like a header row`},
		{name: "header after comments", in: "# exported\n\nfrom to\n", line: 3, err: `"from to" looks like a header row`},
		{name: "header quoted", in: "\"src\",\"dst\"\n", line: 1, err: "looks like a header row"},
		{name: "header tail head value", in: "tail head value\n", line: 1, err: "looks like a header row"},
		{name: "header many columns", in: "source,target,type,id,label,weight\n", line: 1, err: "looks like a header row"},
		{name: "header other names", in: "u,v,weight\n1,2,3\n", line: 1, err: `"u,v,weight" looks like a header row`},
		{name: "header after mark", in: "\xef\xbb\xbfsrc,dst\n", line: 1, err: `"src,dst" looks like a header row`},
		{name: "header gzip", in: string(gzipBytes([]byte("\xef\xbb\xbffrom,to\n"))), line: 1, err: `"from,to" looks like a header row`},
		{name: "unterminated quote", in: "a b\n\"c d\n", line: 2, err: "unterminated quoted name"},
		{name: "quote inside name", in: "a\"b c\n", line: 1, err: "quote inside an unquoted name"},
		{name: "text after quote", in: "\"a\"b c\n", line: 1, err: "right after a closing quote"},
		// A single name declares an isolated state (issue 12).
		{name: "one field", in: "a b\nlonely\n", edges: []string{"a>b"}, nodes: []string{"a", "b", "lonely"}},
		{name: "one quoted field", in: "\"pump 1\"\na b\n", edges: []string{"a>b"}, nodes: []string{"a", "b", "pump 1"}},
		{name: "one field with semicolon", in: "a b\nx;y\n", line: 2, err: "holding a semicolon"},
		{name: "four fields", in: "a b 1 2\n", line: 1, err: "more than 3 fields"},
		{name: "trailing comma after weight", in: "a,b,1,\n", line: 1, err: "more than 3 fields"},
		{name: "empty name", in: "\"\" b\n", line: 1, err: "empty node name"},
		{name: "empty name by commas", in: "a,,b\n", line: 1, err: "empty node name"},
		{name: "bad weight", in: "a b heavy\n", line: 1, err: "not a finite number"},
		{name: "NaN weight", in: "a b 1\nb c NaN\n", line: 2, err: "not a finite number"},
		{name: "Inf weight", in: "a b -Inf\n", line: 1, err: "not a finite number"},
		{name: "overflowing weight", in: "a b 1e999\n", line: 1, err: "not a finite number"},
		{name: "weight 0", in: "a b 0\n", line: 1, err: "weight 0"},
		{name: "weight -0.0", in: "a b -0.0\n", opt: Options{Weights: true}, line: 1, err: "weight 0"},
		{name: "name over the limit", in: "a b\n" + tooLong + " b\n", line: 2, err: "node name of 4097 bytes"},
		{name: "quoted name over the limit", in: "a \"" + tooLong + "\"\n", line: 1, err: "node name of 4097 bytes"},
		{name: "line over the limit", in: "a b\n" + strings.Repeat("z", maxLineBytes+1) + " b\n", line: 2, err: "line longer than"},
		{name: "empty network", in: "# nothing\n\n% here\n", err: "empty network"},
		{name: "empty file", in: "", err: "empty network"},
	}
	runReadCases(t, EdgeList, cases)
}
