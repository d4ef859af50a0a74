package design

import (
	"bytes"
	"crypto/sha256"
	"path/filepath"
	"strings"
	"testing"

	"github.com/netsteer/netsteer/structural"
)

func testNetwork(t *testing.T) *structural.Network {
	t.Helper()
	b := structural.NewBuilder()
	for _, e := range [][2]string{{"feed_pump", "drum_level"}, {"drum_level", "steam_flow"}} {
		u, _ := b.Intern([]byte(e[0]))
		v, _ := b.Intern([]byte(e[1]))
		b.AddEdge(u, v)
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	return g
}

// A byte-order mark at the start of the file is not part of the first name.
func TestReadByteOrderMark(t *testing.T) {
	g := testNetwork(t)
	f, err := Read(strings.NewReader("\ufefffeed_pump\n"), "act.txt", g, Options{})
	if err != nil {
		t.Fatalf("got error %v, want the design read", err)
	}
	sigs := f.Signals
	want, _ := g.Lookup("feed_pump")
	if len(sigs) != 1 || len(sigs[0].States) != 1 || sigs[0].States[0] != want {
		t.Errorf("got %+v, want one input driving feed_pump (state %d)", sigs, want)
	}
}

// Errors are one line, FILE[:LINE]: message, and say what to do.
func TestReadErrors(t *testing.T) {
	g := testNetwork(t)
	dir := t.TempDir()
	for _, tc := range []struct {
		name, path, text string
		weights          bool
		want             string
	}{
		{"directory", dir, "", false, dir + ": is a directory, not a design file"},
		{"missing", filepath.Join(dir, "none.txt"), "", false, "none.txt: no such file or directory"},
		{"value without weights", "", "feed_pump:2\n", false,
			`act.txt:1: no state named "feed_pump:2" in the network ("feed_pump" is a state: values written name:value are read only when weights are read)`},
		{"unknown", "", "# c\nfeed_pmp\n", false, `act.txt:2: no state named "feed_pmp" in the network`},
		{"long line", "", "feed_pump " + strings.Repeat("x", 17<<20) + "\n", false, "act.txt:1: line longer than 16 MiB"},
		{"control character", "", "feed_pump\n\"drum\x00level\"\n", false, "act.txt:2: control character 0x00 in a node name"},
		{"DEL", "", "feed_pump drum\x7f\n", false, "act.txt:1: control character 0x7f in a node name"},
	} {
		var err error
		if tc.path != "" {
			_, err = ReadFile(tc.path, g, Options{Weights: tc.weights})
		} else {
			_, err = Read(strings.NewReader(tc.text), "act.txt", g, Options{Weights: tc.weights})
		}
		if err == nil {
			t.Errorf("%s: got no error, want %q", tc.name, tc.want)
			continue
		}
		if got := err.Error(); !strings.HasSuffix(got, tc.want) || strings.Contains(got, "\n") {
			t.Errorf("%s: got %q, want one line ending in %q", tc.name, got, tc.want)
		}
	}
}

// The digest is the SHA-256 of the bytes read; "-" reads Options.Stdin;
// a long name is clipped in the message.
func TestDigestAndClip(t *testing.T) {
	g := testNetwork(t)
	data := []byte("# retrofit\nfeed_pump drum_level\n")
	f, err := ReadFile("-", g, Options{Stdin: bytes.NewReader(data)})
	if err != nil {
		t.Fatal(err)
	}
	if f.SHA256 != sha256.Sum256(data) || f.Size != int64(len(data)) || len(f.Signals) != 1 || f.Signals[0].Line != 2 {
		t.Errorf("got %+v", f)
	}
	_, err = Read(strings.NewReader(strings.Repeat("q", 1<<20)+"\n"), "act.txt", g, Options{})
	if err == nil || len(err.Error()) > 200 {
		t.Errorf("got %.300v", err)
	}
}

func FuzzRead(f *testing.F) {
	for _, s := range []string{"feed_pump\n", "feed_pump:2 drum_level\n", "\"a\n", "# c\n\n", "feed_pump feed_pump\n"} {
		f.Add([]byte(s), false)
		f.Add([]byte(s), true)
	}
	f.Fuzz(func(t *testing.T, data []byte, weights bool) {
		g := testNetwork(t)
		d, err := Read(bytes.NewReader(data), "fuzz", g, Options{Weights: weights})
		if err != nil {
			if strings.ContainsAny(err.Error(), "\r\n") || len(err.Error()) > 1000 {
				t.Fatalf("bad error %.200q", err.Error())
			}
			return
		}
		for _, s := range d.Signals {
			if len(s.States) == 0 || weights && len(s.Weights) != len(s.States) {
				t.Fatalf("signal %+v", s)
			}
		}
	})
}
