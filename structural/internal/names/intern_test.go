package names

import (
	"math/rand/v2"
	"strconv"
	"sync"
	"testing"
)

// TestInternNewIntsMatchesInternInt checks that adding integer names in
// bulk gives the states, names and lookups that InternInt of each in turn
// gives, also for values beyond the dense table and for the names interned
// afterwards.
func TestInternNewIntsMatchesInternInt(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 2))
	for trial := 0; trial < 20; trial++ {
		spread := []uint32{50, 5000, 1 << 24, 1<<31 - 2}[trial%4]
		seen := map[uint32]bool{}
		var vs []uint32
		for len(vs) < 1+r.IntN(3000) {
			v := r.Uint32N(spread + 1)
			if !seen[v] {
				seen[v] = true
				vs = append(vs, v)
			}
		}
		pre := r.IntN(len(vs) + 1)
		a, b := NewInterner(), NewInterner()
		for _, v := range vs {
			if _, err := a.InternInt(v); err != nil {
				t.Fatal(err)
			}
		}
		for _, v := range vs[:pre] {
			b.InternInt(v)
		}
		if err := b.InternNewInts(vs[pre:]); err != nil {
			t.Fatal(err)
		}
		// Further names, new and old, integer and not.
		for k := 0; k < 2000; k++ {
			var name []byte
			switch k % 3 {
			case 0:
				name = strconv.AppendUint(nil, uint64(vs[r.IntN(len(vs))]), 10)
			case 1:
				name = strconv.AppendUint(nil, uint64(r.Uint32N(spread+1)), 10)
			default:
				name = []byte("0" + strconv.Itoa(r.IntN(100)))
			}
			x, err1 := a.Intern(name)
			y, err2 := b.Intern(name)
			if x != y || err1 != nil || err2 != nil {
				t.Fatalf("trial %d: %q is %d (%v) in order, %d (%v) in bulk", trial, name, x, err1, y, err2)
			}
		}
		ta, tb := a.Seal(), b.Seal()
		if ta.Len() != tb.Len() {
			t.Fatalf("trial %d: %d vs %d names", trial, ta.Len(), tb.Len())
		}
		for i := 0; i < ta.Len(); i++ {
			name := ta.Name(int32(i))
			if tb.Name(int32(i)) != name {
				t.Fatalf("trial %d: state %d named %q vs %q", trial, i, name, tb.Name(int32(i)))
			}
			if s, ok := tb.Lookup(name); !ok || s != int32(i) {
				t.Fatalf("trial %d: Lookup(%q) = %d, %v", trial, name, s, ok)
			}
		}
	}
}

// TestInternNewIntsRefusesRepeats checks that a value given twice, or
// already interned, is an error rather than a second state of one name.
func TestInternNewIntsRefusesRepeats(t *testing.T) {
	for _, c := range []struct {
		pre, vs []uint32
	}{{nil, []uint32{3, 5, 3}}, {[]uint32{7}, []uint32{1, 7}}, {nil, []uint32{1<<31 - 3, 1<<31 - 3}}, {nil, []uint32{1<<31 - 1}}} {
		b := NewInterner()
		for _, v := range c.pre {
			b.InternInt(v)
		}
		if err := b.InternNewInts(c.vs); err == nil {
			t.Errorf("%v after %v: no error", c.vs, c.pre)
		}
	}
}

// TestInternNewIntsWithLookups runs LookupInt on another goroutine while
// states are added in bulk, as parsing goroutines do (run with -race): a
// lookup finds nothing or the state InternInt gives.
func TestInternNewIntsWithLookups(t *testing.T) {
	b := NewInterner()
	for v := uint32(0); v < 1000; v += 2 {
		b.InternInt(v)
	}
	var vs []uint32
	for v := uint32(1); v < 1000; v += 2 {
		vs = append(vs, v)
	}
	done := make(chan struct{})
	bad := make(chan uint32, 1)
	go func() {
		defer close(done)
		for k := 0; k < 20000; k++ {
			v := uint32(k % 1000)
			if s, ok := b.LookupInt(v); ok && s != int32(v/2+v%2*500) {
				bad <- v
				return
			}
		}
	}()
	if err := b.InternNewInts(vs); err != nil {
		t.Fatal(err)
	}
	<-done
	select {
	case v := <-bad:
		t.Fatalf("LookupInt(%d) found a wrong state", v)
	default:
	}
	for v := uint32(0); v < 1000; v++ {
		if s, ok := b.LookupInt(v); !ok || s != int32(v/2+v%2*500) {
			t.Fatalf("after: LookupInt(%d) = %d, %v", v, s, ok)
		}
	}
}

// A sealed table whose names were added without its hash index indexes
// them on the first Lookup, once, even when several goroutines look names
// up at the same time (run with -race).
func TestSealedLookupConcurrent(t *testing.T) {
	b := NewInterner()
	vs := make([]uint32, 5000)
	for i := range vs {
		vs[i] = uint32(3*i + 1)
	}
	if err := b.InternNewInts(vs); err != nil {
		t.Fatal(err)
	}
	tab := b.Seal()
	var wg sync.WaitGroup
	for w := 0; w < 4; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := w; i < len(vs); i += 4 {
				if s, ok := tab.Lookup(strconv.Itoa(3*i + 1)); !ok || s != int32(i) {
					t.Errorf("Lookup(%d) = %d, %v; want %d", 3*i+1, s, ok, i)
					return
				}
			}
			if _, ok := tab.Lookup("2"); ok {
				t.Error("Lookup(2) found a state")
			}
		}()
	}
	wg.Wait()
}
