package structural

import (
	"math/rand/v2"
	"strconv"
	"testing"
)

// TestInternIntMatchesNames interns a random mix of canonical decimal
// names (through Intern and InternInt), non-canonical ones ("007"), short
// and long words and names with zero bytes, and checks the numbering against a plain map (first
// appearance order) and Lookup after Build.
func TestInternIntMatchesNames(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 2))
	for trial := 0; trial < 30; trial++ {
		b := NewBuilder()
		want := map[string]int32{}
		var order []string
		spread := []int{50, 5000, 1 << 20, 1 << 30}[trial%4]
		for k := 0; k < 20000; k++ {
			var name string
			var got int32
			var err error
			v := r.IntN(spread)
			switch r.IntN(9) {
			case 6:
				name = "station-" + strconv.Itoa(v%700) + "-valve" // longer than 8 bytes
				got, err = b.Intern([]byte(name))
			case 7:
				name = "a\x00" + strconv.Itoa(v%5) // zero bytes: "a\x001" is not "a1"
				if v%2 == 0 {
					name = "a" + strconv.Itoa(v%5)
				}
				got, err = b.Intern([]byte(name))
			case 8:
				name = strconv.Itoa(v%3) + "abcdefg"[:v%8] // lengths 1..8
				got, err = b.Intern([]byte(name))
			case 0:
				name = "0" + strconv.Itoa(v)
				got, err = b.Intern([]byte(name))
			case 1:
				name = "n" + strconv.Itoa(v%300)
				got, err = b.Intern([]byte(name))
			case 2, 3:
				name = strconv.Itoa(v)
				got, err = b.Intern([]byte(name))
			default:
				name = strconv.Itoa(v)
				got, err = b.InternInt(uint32(v))
			}
			if err != nil {
				t.Fatal(err)
			}
			id, ok := want[name]
			if !ok {
				id = int32(len(order))
				want[name] = id
				order = append(order, name)
			}
			if got != id {
				t.Fatalf("trial %d step %d: %q got state %d, want %d", trial, k, name, got, id)
			}
			b.AddEdge(got, got)
		}
		g, err := b.Build(BuildOptions{})
		if err != nil {
			t.Fatal(err)
		}
		if g.N() != len(order) {
			t.Fatalf("got %d states, want %d", g.N(), len(order))
		}
		for i, name := range order {
			if g.Name(int32(i)) != name {
				t.Fatalf("Name(%d) = %q, want %q", i, g.Name(int32(i)), name)
			}
			if id, ok := g.Lookup(name); !ok || id != int32(i) {
				t.Fatalf("Lookup(%q) = %d, %v, want %d", name, id, ok, i)
			}
		}
		if _, ok := g.Lookup("missing"); ok {
			t.Fatal("Lookup found a missing name")
		}
	}
}

// TestInternIntGrowth interns 4*10^5 random integers below 10^6 so that
// the dense table grows many times while names hashed before it reached
// them move in; numbering must stay first-appearance order.
func TestInternIntGrowth(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 2))
	b := NewBuilder()
	want := map[uint32]int32{}
	for k := 0; k < 400000; k++ {
		v := uint32(r.IntN(1000000))
		got, err := b.InternInt(v)
		if err != nil {
			t.Fatal(err)
		}
		id, ok := want[v]
		if !ok {
			id = int32(len(want))
			want[v] = id
		}
		if got != id {
			t.Fatalf("step %d: %d got state %d, want %d", k, v, got, id)
		}
	}
}
