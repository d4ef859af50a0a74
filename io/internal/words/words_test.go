package words

import (
	"strings"
	"testing"
)

func TestQuote(t *testing.T) {
	for _, tc := range []struct{ in, want string }{
		{"pump.speed", "pump.speed"},
		{"feed pump, north", `"feed pump, north"`},
		{`6" main`, `"6"" main"`},
		{"#1", `"#1"`},
		{"a\u202eb", `"a\u202eb"`}, // a bidirectional override is shown, not obeyed
		{"x\x01", `"x\x01"`},
		{"\xff", `"\xff"`},
		{"", `""`},
	} {
		if got := Quote(tc.in); got != tc.want {
			t.Errorf("Quote(%q) = %s, want %s", tc.in, got, tc.want)
		}
	}
	if got := Escape("a\u202eb"); got != `a\u202eb` {
		t.Errorf("Escape = %s", got)
	}
}

func TestWrapKeepsQuotedNames(t *testing.T) {
	got := Wrap(`drive "feed pump north" and "b c" then more words here`, 20, "", "  ")
	for _, line := range strings.Split(strings.TrimSuffix(got, "\n"), "\n") {
		if strings.Count(line, `"`)%2 != 0 {
			t.Fatalf("a quoted name was split: %q", got)
		}
	}
	if !strings.Contains(got, "\n  ") {
		t.Fatalf("no continuation line: %q", got)
	}
}

func TestListAndPlural(t *testing.T) {
	if got := List([]string{"a", "b", "c"}, 2, false, "--all lists them"); got != "a, b (1 more; --all lists them)" {
		t.Errorf("List = %q", got)
	}
	if got := List([]string{"a", "b", "c"}, 2, true, ""); got != "a, b, c" {
		t.Errorf("List all = %q", got)
	}
	if Count(1, "self-loop", "self-loops") != "1 self-loop" || Count(2, "edge", "edges") != "2 edges" {
		t.Error("Count")
	}
}
