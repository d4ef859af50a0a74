package textout

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math/rand/v2"
	"testing"

	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/analysis"
	"github.com/netsteer/netsteer/structural/numeric"
	"github.com/netsteer/netsteer/structural/strong"
)

// marshalRoute is the reference layout: encoding/json's whole output, laid
// out by IndentJSON.
func marshalRoute(t *testing.T, v any) []byte {
	t.Helper()
	b, err := json.Marshal(v)
	if err != nil {
		t.Fatal(err)
	}
	return append(IndentJSON(b), '\n')
}

// The streaming JSON route writes the bytes encoding/json and IndentJSON
// write, on the results of every question (drivers with roles and
// targets, check of both properties with completion, strong and targets,
// placement with roles, failures, verify, the review analysis) for random
// networks whose names need escaping (quotes, backslashes, HTML
// characters, U+2028, invalid UTF-8, spaces), and on values with empty,
// nil and embedded parts.
func TestJSONStreamMatchesMarshal(t *testing.T) {
	hostile := []string{`a"q`, `b\s`, "<c>&", "d\u2028e", "f\xffg", "h i", "ü", "j,k"}
	rng := rand.New(rand.NewPCG(5, 6))
	for it := 0; it < 30; it++ {
		n := 3 + rng.IntN(14)
		b := structural.NewBuilder()
		id := make([]int32, n)
		for v := range id {
			name := fmt.Sprintf("s%d", v)
			if v < len(hostile) && it%2 == 0 {
				name = hostile[v]
			}
			id[v], _ = b.Intern([]byte(name))
		}
		for e := 0; e < 2*n; e++ {
			b.AddEdge(id[rng.IntN(n)], id[rng.IntN(n)])
		}
		g, err := b.Build(structural.BuildOptions{})
		if err != nil {
			t.Fatal(err)
		}
		half := func(ids []int32) *structural.Design {
			var keep []int32
			for i, v := range ids {
				if i%2 == 0 {
					keep = append(keep, v)
				}
			}
			d, err := structural.Dedicated(g, keep)
			if err != nil {
				t.Fatal(err)
			}
			return &d
		}
		targets := []int32{0, int32(n - 1)}
		var values []any
		dr, err := analysis.Drivers(g, analysis.DriversRequest{Roles: true, Targets: targets, Seed: 1})
		if err != nil {
			t.Fatal(err)
		}
		values = append(values, dr)
		in, out := half(dr.Drivers.IDs()), half([]int32{0, 1, 2})
		cr, err := analysis.Check(g, analysis.CheckRequest{Inputs: in, Outputs: out, Strong: &strong.Class{}, Targets: targets, Seed: 1})
		if err != nil {
			t.Fatal(err)
		}
		values = append(values, cr)
		pr, err := analysis.Place(g, analysis.PlaceRequest{Property: structural.Observability, Roles: true, Alternatives: 3})
		if err != nil {
			t.Fatal(err)
		}
		values = append(values, pr)
		fr, err := analysis.Failures(g, analysis.FailuresRequest{Inputs: &dr.Inputs, Outputs: out, States: true})
		if err != nil {
			t.Fatal(err)
		}
		values = append(values, fr)
		vr, err := analysis.Verify(g, analysis.VerifyRequest{Request: numeric.Request{Inputs: in, Outputs: out, Trials: 2, Seed: 3}, Targets: targets})
		if err != nil {
			t.Fatal(err)
		}
		values = append(values, vr)
		rv, err := analysis.Analyse(g, analysis.ReviewRequest{Inputs: in, PlaceSensors: true, Roles: true, Complete: true})
		if err != nil {
			t.Fatal(err)
		}
		values = append(values, rv)
		for k, v := range values {
			var got bytes.Buffer
			if err := JSON(&got, v); err != nil {
				t.Fatal(err)
			}
			if want := marshalRoute(t, v); !bytes.Equal(got.Bytes(), want) {
				t.Fatalf("network %d, value %d (%T): streamed\n%s\nencoding/json\n%s", it, k, v, got.Bytes(), want)
			}
		}
	}

	// Empty, nil and embedded parts, and a tie encoding/json drops.
	type inner struct {
		A int    `json:"a"`
		B string `json:"b,omitempty"`
	}
	type tie struct{ X int }
	type tie2 struct{ X int }
	type outer struct {
		inner
		*tie
		tie2
		C []int          `json:"c"`
		D map[string]int `json:"d,omitempty"`
		E *inner         `json:"e"`
		F any            `json:"f"`
		G [][]string     `json:"g"`
		H struct{}       `json:"h"`
		I []inner        `json:"i"`
		j int
	}
	for _, v := range []any{
		outer{}, &outer{C: []int{}, G: [][]string{{}, {"x"}}, I: []inner{{}}},
		outer{inner: inner{A: 1, B: "<"}, tie: &tie{2}, D: map[string]int{"z": 1, "a": 2}, E: &inner{}, F: []any{1, "a"}},
		[]int{}, map[string]any{"k": []int{1}}, nil, 3.5, "s",
	} {
		var got bytes.Buffer
		if err := JSON(&got, v); err != nil {
			t.Fatal(err)
		}
		if want := marshalRoute(t, v); !bytes.Equal(got.Bytes(), want) {
			t.Errorf("%#v: streamed\n%s\nencoding/json\n%s", v, got.Bytes(), want)
		}
	}
}

// Values that lay themselves out (structural.JSONWriter) write the bytes
// IndentJSON gives their compact JSON, at several depths and with many
// blocks of states and edges formatted on all cores: role lists, states
// and designs of a network of 40,000 states, a seventh of them with names
// that need escaping, and empty ones.
func TestJSONWritersLayOutAsIndentJSON(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 10))
	const n = 40000
	b := structural.NewBuilder()
	id := make([]int32, n)
	for v := range id {
		name := fmt.Sprintf("s%d", v)
		if v%7 == 0 {
			name = fmt.Sprintf("<q\"%d\\\b\u2028>", v)
		}
		id[v], _ = b.Intern([]byte(name))
	}
	for e := 0; e < 3*n; e++ {
		b.AddEdge(id[rng.IntN(n)], id[rng.IntN(n)])
	}
	g, err := b.Build(structural.BuildOptions{})
	if err != nil {
		t.Fatal(err)
	}
	d, err := structural.NewDesign(g, [][]int32{id[:3], id[3:4], {}, id[5:9000]}, nil)
	if err != nil {
		t.Fatal(err)
	}
	empty, err := structural.NewDesign(g, nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	type deep struct {
		Links *structural.LinkRoles `json:"links"`
		Inner struct {
			Nodes  *structural.NodeRoles `json:"nodes"`
			States structural.States     `json:"states"`
			None   structural.States     `json:"none"`
		} `json:"inner"`
	}
	var v deep
	v.Links, v.Inner.Nodes = structural.EdgeRoles(g), structural.StateRoles(g)
	v.Inner.States, v.Inner.None = g.States(id[:20000]), g.States(nil)
	for k, x := range []any{v.Links, v.Inner.Nodes, v.Inner.States, d, empty, v,
		struct {
			D structural.Design `json:"d"`
		}{d}} {
		var got bytes.Buffer
		if err := JSON(&got, x); err != nil {
			t.Fatal(err)
		}
		if want := marshalRoute(t, x); !bytes.Equal(got.Bytes(), want) {
			i := 0
			for i < min(got.Len(), len(want)) && got.Bytes()[i] == want[i] {
				i++
			}
			t.Errorf("value %d (%T): %d bytes streamed, %d by IndentJSON; first difference at %d: %q", k, x, got.Len(), len(want), i,
				got.Bytes()[max(i-40, 0):min(i+40, got.Len())])
		}
	}
}
