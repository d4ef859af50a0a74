package structural

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"math/rand/v2"
	"testing"
)

// The role lists written block by block on all cores equal the lists
// built one role at a time (With) and written by encoding/json, on a
// network with many blocks of states and of edges and names that need
// escaping; and States and Design stream what they marshal.
func TestRolesWriteJSONMatchesEncodingJSON(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	const n = 40000
	b := NewBuilder()
	id := make([]int32, n)
	for v := range id {
		name := fmt.Sprintf("s%d", v)
		if v%7 == 0 {
			name = fmt.Sprintf("<q\"%d\\>", v)
		}
		id[v], _ = b.Intern([]byte(name))
	}
	for e := 0; e < 3*n; e++ {
		b.AddEdge(id[rng.IntN(n)], id[rng.IntN(n)])
	}
	g, err := b.Build(BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	nr, lr := StateRoles(g), EdgeRoles(g)

	type kv struct {
		Critical     []string `json:"critical"`
		Intermittent []string `json:"intermittent"`
		Redundant    []string `json:"redundant"`
	}
	names := func(s States) []string {
		if out := s.Names(); out != nil {
			return out
		}
		return []string{}
	}
	wantNodes, _ := json.Marshal(kv{names(nr.With(Critical)), names(nr.With(Intermittent)), names(nr.With(Redundant))})
	pairs := func(role Role) [][2]string {
		out := [][2]string{}
		for _, e := range lr.With(role) {
			out = append(out, [2]string{g.Name(e.From), g.Name(e.To)})
		}
		return out
	}
	type lkv struct {
		Critical  [][2]string `json:"critical"`
		Ordinary  [][2]string `json:"ordinary"`
		Redundant [][2]string `json:"redundant"`
	}
	wantLinks, _ := json.Marshal(lkv{pairs(Critical), pairs(Ordinary), pairs(Redundant)})
	for _, c := range []struct {
		v    JSONWriter
		want []byte
	}{{nr, wantNodes}, {lr, wantLinks}} {
		var got bytes.Buffer
		if err := c.v.WriteJSON(&got); err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(got.Bytes(), c.want) {
			t.Errorf("%T: %d bytes written, %d by encoding/json; first difference at %d", c.v, got.Len(), len(c.want), firstDiff(got.Bytes(), c.want))
		}
	}

	all := g.States(id)
	want, _ := json.Marshal(names(all))
	got, _ := all.MarshalJSON()
	if !bytes.Equal(got, want) {
		t.Errorf("States: differ at %d", firstDiff(got, want))
	}
	d, _ := NewDesign(g, [][]int32{id[:3], id[3:4], {}}, nil)
	want, _ = json.Marshal([][]string{names(g.States(id[:3])), names(g.States(id[3:4])), {}})
	if got, _ = d.MarshalJSON(); !bytes.Equal(got, want) {
		t.Errorf("Design: %s, want %s", got, want)
	}
}

func firstDiff(a, b []byte) int {
	for i := range min(len(a), len(b)) {
		if a[i] != b[i] {
			return i
		}
	}
	return min(len(a), len(b))
}

// orderedBlocks keeps block order with many blocks, and stops at the
// first write error without waiting for the rest or hanging.
func TestOrderedBlocks(t *testing.T) {
	const nb = 5000
	var got []byte
	err := orderedBlocks(nb, func(i int, b []byte) []byte {
		return fmt.Appendf(b, "%d,", i)
	}, func(b []byte) error { got = append(got, b...); return nil })
	if err != nil {
		t.Fatal(err)
	}
	var want []byte
	for i := 0; i < nb; i++ {
		want = fmt.Appendf(want, "%d,", i)
	}
	if !bytes.Equal(got, want) {
		t.Fatalf("blocks out of order at byte %d", firstDiff(got, want))
	}
	boom := errors.New("disk full")
	writes := 0
	err = orderedBlocks(nb, func(i int, b []byte) []byte { return append(b, 'x') }, func([]byte) error {
		writes++
		if writes == 10 {
			return boom
		}
		return nil
	})
	if !errors.Is(err, boom) || writes != 10 {
		t.Errorf("err %v after %d writes, want %v after 10", err, writes, boom)
	}
}

// AppendJSONString escapes as encoding/json does (HTML escaping on):
// every single byte, every pair of bytes from a set of awkward ones
// (quotes, backslash, controls, HTML characters, the bytes of U+2028,
// U+FFFD and of invalid UTF-8), and random strings built from them.
func TestAppendJSONStringMatchesEncodingJSON(t *testing.T) {
	check := func(s string) {
		t.Helper()
		want, err := json.Marshal(s)
		if err != nil {
			t.Fatal(err)
		}
		if got := AppendJSONString([]byte("x"), s); !bytes.Equal(got[1:], want) {
			t.Fatalf("%q: got %s, want %s", s, got[1:], want)
		}
		if got := AppendJSONString(nil, []byte(s)); !bytes.Equal(got, want) {
			t.Fatalf("%q as bytes: got %s, want %s", s, got, want)
		}
	}
	for c := 0; c < 256; c++ {
		check(string([]byte{byte(c)}))
		check("ab" + string([]byte{byte(c)}) + "cd")
	}
	parts := []string{"a", "\"", "\\", "\n", "\r", "\t", "\x00", "\x1f", "<", ">", "&", "\u2028", "\u2029",
		"\ufffd", "\xe2\x80", "\xff", "\xc3", "ü", "日本", " ", "\x7f"}
	for _, a := range parts {
		for _, b := range parts {
			check(a + b)
		}
	}
	rng := rand.New(rand.NewPCG(7, 8))
	for range 2000 {
		var s string
		for range rng.IntN(12) {
			s += parts[rng.IntN(len(parts))]
		}
		check(s)
	}
}
