package numeric

import (
	"reflect"
	"slices"
	"testing"
)

// Subnetworks of a small fictional water-treatment train with a recycle
// loop (intake -> screen -> clarifier -> filter -> tank -> clarifier, and
// dosing -> clarifier); expected sets worked out by hand.
func TestSubnetworks(t *testing.T) {
	g := weighted(t, []wedge{
		{"intake", "screen", 1}, {"screen", "clarifier", 2}, {"clarifier", "filter", 3},
		{"filter", "tank", 4}, {"tank", "clarifier", 5}, {"dosing", "clarifier", 6},
	})
	name := func(ids []int32) []string {
		var s []string
		for _, v := range ids {
			s = append(s, g.Name(v))
		}
		slices.Sort(s)
		return s
	}
	// Within one step of the clarifier, either direction.
	got := name(Around(g, lookup(t, g, "clarifier"), 1, 0))
	want := []string{"clarifier", "dosing", "filter", "screen", "tank"}
	if !slices.Equal(got, want) {
		t.Errorf("Around: %v, want %v", got, want)
	}
	// The first three states met from the intake: screen, then clarifier.
	got = name(Around(g, lookup(t, g, "intake"), -1, 3))
	want = []string{"clarifier", "intake", "screen"}
	if !slices.Equal(got, want) {
		t.Errorf("Around with a limit: %v, want %v", got, want)
	}
	// Two steps from the tank, either way: filter and clarifier, then
	// screen and dosing (the intake is three steps away).
	got = name(Around(g, lookup(t, g, "tank"), 2, 0))
	want = []string{"clarifier", "dosing", "filter", "screen", "tank"}
	if !slices.Equal(got, want) {
		t.Errorf("Around two steps: %v, want %v", got, want)
	}
	// The induced subnetwork keeps names, edges among kept states and
	// their weights.
	keep := Around(g, lookup(t, g, "clarifier"), 1, 0)
	sub, newOf, err := Induced(g, keep)
	if err != nil {
		t.Fatal(err)
	}
	if sub.N() != 5 || sub.Edges() != 5 {
		t.Fatalf("subnetwork has %d states and %d edges, want 5 and 5", sub.N(), sub.Edges())
	}
	tank, _ := sub.Lookup("tank")
	cl, _ := sub.Lookup("clarifier")
	found := false
	for k := sub.Out().Ptr[tank]; k < sub.Out().Ptr[tank+1]; k++ {
		if sub.Out().Adj[k] == cl {
			found = sub.Weights()[k] == 5
		}
	}
	if !found {
		t.Errorf("edge tank -> clarifier with weight 5 missing from the subnetwork")
	}
	// Signals lose the states left out; an empty signal is dropped.
	// The signal kept keeps its number (2) for witnesses on the part.
	sig := [][]int32{lookup(t, g, "intake"), lookup(t, g, "dosing", "intake")}
	w := [][]float64{{1}, {2, 3}}
	rd, rw, dropped, err := RestrictDesign(mustDesign(g, sig), w, sub, newOf)
	if err != nil {
		t.Fatal(err)
	}
	if dropped != 1 || rd.Len() != 1 || len(rd.Signal(0)) != 1 || sub.Name(rd.Signal(0)[0]) != "dosing" || rw[0][0] != 2 || rd.Number(0) != 2 {
		t.Errorf("RestrictDesign: %v %v dropped %d number %d", rd.Signals(), rw, dropped, rd.Number(0))
	}
}

// TestNewPart checks the radius NewPart gives each combination of named
// centres, a radius and a number of states (the rules stated in its doc
// comment: no radius asked means no bound on the distance, except around
// named centres without a bound on the number of states).
func TestNewPart(t *testing.T) {
	one, zero := 1, 0
	for _, c := range []struct {
		name    string
		centres []int32
		hops    *int
		limit   int
		want    Part
	}{
		{"around", []int32{3}, nil, 0, Part{Centres: []int32{3}, Hops: DefaultHops}},
		{"around with hops", []int32{3}, &one, 0, Part{Centres: []int32{3}, Hops: 1}},
		{"around with hops 0", []int32{3}, &zero, 0, Part{Centres: []int32{3}, Hops: 0}},
		{"around with a sample", []int32{3}, nil, 5, Part{Centres: []int32{3}, Hops: NoLimit, Limit: 5}},
		{"around with both", []int32{3}, &one, 5, Part{Centres: []int32{3}, Hops: 1, Limit: 5}},
		{"sample", nil, nil, 5, Part{Hops: NoLimit, Limit: 5}},
		{"sample with hops", nil, &one, 5, Part{Hops: 1, Limit: 5}},
		{"first signal, whole piece", nil, nil, 0, Part{Hops: NoLimit}},
	} {
		got := NewPart(c.centres, c.hops, c.limit)
		if !reflect.DeepEqual(*got, c.want) {
			t.Errorf("%s: NewPart = %+v, want %+v", c.name, *got, c.want)
		}
	}
}
