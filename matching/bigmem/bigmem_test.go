package bigmem

import "testing"

// TestMake checks that Make behaves as make: length, capacity, zeroed
// elements, and memory that can be written and read back, small and large.
func TestMake(t *testing.T) {
	for _, c := range []int{0, 1, 1000, 3 << 20, 5 << 20} {
		s := Make[int32](c/2, c)
		if len(s) != c/2 || cap(s) != c {
			t.Fatalf("Make(%d, %d): len %d cap %d", c/2, c, len(s), cap(s))
		}
		s = s[:c]
		for i := range s {
			if s[i] != 0 {
				t.Fatalf("element %d = %d, want 0", i, s[i])
			}
			s[i] = int32(i)
		}
		for i := range s {
			if s[i] != int32(i) {
				t.Fatalf("element %d = %d after write", i, s[i])
			}
		}
	}
}
