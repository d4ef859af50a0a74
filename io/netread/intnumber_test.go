package netread

import (
	"bytes"
	"math/rand/v2"
	"strconv"
	"strings"
	"testing"
)

// intEdgeList writes an edge list of integer names: repeats, self-loops,
// weights on some lines, comments, blank lines and single-name lines. With
// odd set, one line somewhere holds a name that is not a canonical decimal
// (leading zero, sign, word, or an integer too large for the dense table).
func intEdgeList(r *rand.Rand, lines, spread int, odd string) []byte {
	var b []byte
	at := r.IntN(lines)
	name := func() string { return strconv.Itoa(r.IntN(spread)) }
	for i := 0; i < lines; i++ {
		if i == at && odd != "" {
			b = append(b, name()+" "+odd+"\n"...)
			continue
		}
		switch r.IntN(40) {
		case 0:
			b = append(b, "# 1 2\n"...)
			continue
		case 1:
			b = append(b, "\n"...)
			continue
		case 2:
			b = append(b, name()+"\n"...)
			continue
		case 3:
			x := name()
			b = append(b, x+" "+x+"\n"...)
			continue
		}
		b = append(b, name()+" "+name()...)
		if r.IntN(3) == 0 {
			b = append(b, ' ')
			b = strconv.AppendFloat(b, float64(1+r.IntN(9))/4, 'g', -1, 64)
		}
		if r.IntN(8) == 0 {
			b = append(b, '\r')
		}
		b = append(b, '\n')
	}
	return b
}

// TestIntNumberingMatchesInterning checks that numbering integer names in
// parallel builds the same network (state numbering, names, edges,
// weights, counters) as interning them in file order, and as the
// line-by-line reference reader, or fails with the same FILE:LINE error;
// also when an odd name or an error part-way ends the collection.
func TestIntNumberingMatchesInterning(t *testing.T) {
	defer func(on bool) { intNumbering = on }(intNumbering)
	r := rand.New(rand.NewPCG(17, 1))
	odds := []string{"", "", "007", "+7", "x", "00", "2147483647", "99999999999", "2000000000",
		"1 0", "1 nan", "1 2 3", "\"12\"", "\"q", "\x01"}
	numbered := 0
	for trial := 0; trial < 60; trial++ {
		spread := []int{5, 300, 5000, 1 << 20}[trial%4]
		odd := odds[trial%len(odds)]
		data := intEdgeList(r, 500+r.IntN(4000), spread, odd)
		if trial%5 == 4 {
			data = gzipBytes(data)
		}
		opt := Options{Weights: trial%3 != 0}
		ref, refErr := readWith(data, 0, 0, opt)
		for _, c := range []struct{ block, workers int }{{1 << 20, 2}, {300, 2}, {301, 3}, {4096, 2}, {2000, 1}} {
			intNumbering = false
			old, oldErr := readWith(data, c.block, c.workers, opt)
			intNumbering = true
			before := numberedRuns.Load()
			got, err := readWith(data, c.block, c.workers, opt)
			if numberedRuns.Load() > before {
				numbered++
			}
			where := "trial " + strconv.Itoa(trial) + " odd " + strconv.Quote(odd) + " block " + strconv.Itoa(c.block) + " workers " + strconv.Itoa(c.workers)
			for _, w := range []struct {
				what string
				err  error
			}{{"interning", oldErr}, {"reference", refErr}} {
				if (err == nil) != (w.err == nil) || err != nil && err.Error() != w.err.Error() {
					t.Fatalf("%s: error %v, %s gives %v", where, err, w.what, w.err)
				}
			}
			if err != nil {
				if !strings.HasPrefix(err.Error(), "in:") {
					t.Fatalf("%s: error %q without FILE:LINE", where, err)
				}
				continue
			}
			if e := sameNetwork(got, old); e != nil {
				t.Fatalf("%s: vs interning: %v", where, e)
			}
			if e := sameNetwork(got, ref); e != nil {
				t.Fatalf("%s: vs reference: %v", where, e)
			}
		}
	}
	if numbered == 0 {
		t.Fatal("no read took the parallel numbering")
	}
}

// TestIntNumberingSparseValues checks the fall-back for identifiers far
// above the number of names (no value-indexed array is allocated for
// them): the network is still the one interning in order builds.
func TestIntNumberingSparseValues(t *testing.T) {
	var b strings.Builder
	r := rand.New(rand.NewPCG(5, 6))
	for i := 0; i < 3000; i++ {
		b.WriteString(strconv.Itoa(2000000000+r.IntN(100000)) + " " + strconv.Itoa(r.IntN(50)) + "\n")
	}
	data := []byte(b.String())
	before := numberedRuns.Load()
	got, err := readWith(data, 512, 2, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if numberedRuns.Load() != before {
		t.Fatal("sparse values took the value-indexed numbering")
	}
	want, err := readWith(data, 0, 0, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if err := sameNetwork(got, want); err != nil {
		t.Fatal(err)
	}
}

// FuzzIntNumbering checks that numbering integer names in parallel and
// interning them in order give the same network or the same error, on the
// input repeated over several blocks.
//
//	go test -fuzz=FuzzIntNumbering ./io/netread
func FuzzIntNumbering(f *testing.F) {
	for _, s := range []string{"1 2\n2 3\n", "0 0 2.5\n7\n3 1\n", "1 2\n007 1\n", "5 6 0\n", "1 2\n2147483647 3\n", "# c\n4 4\n\n9 1,2\n"} {
		f.Add([]byte(s), uint8(0))
		f.Add([]byte(s), uint8(1))
	}
	f.Fuzz(func(t *testing.T, data []byte, flags uint8) {
		if len(data) == 0 || len(data) > 4096 {
			return
		}
		block := maxLineBytes + 2
		in := bytes.Repeat(data, 3*block/len(data)+1)
		opt := fuzzOptions(EdgeList, flags)
		defer func(on bool) { intNumbering = on }(intNumbering)
		intNumbering = false
		want, wantErr := readWith(in, block, 2, opt)
		intNumbering = true
		got, err := readWith(in, block, 2, opt)
		if (err == nil) != (wantErr == nil) || err != nil && err.Error() != wantErr.Error() {
			t.Fatalf("error %v, interning in order gives %v", err, wantErr)
		}
		if err == nil {
			if e := sameNetwork(got, want); e != nil {
				t.Fatal(e)
			}
		}
	})
}
