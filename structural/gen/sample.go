package gen

import (
	"math/bits"
)

// distinct draws codes from draw until it holds exactly l distinct values,
// and returns them sorted. Drawing in rounds of the deficit stops exactly
// when the l-th distinct value appears, so the result has the law of the
// sequential "draw, keep if new, until l" process; for uniform draws it is
// a uniform l-subset. maxCode bounds the codes (for the radix sort).
// It gives up when many rounds add nothing (l near the number of codes
// that draw can reach).
func distinct(l int, maxCode uint64, draw func() uint64) ([]uint64, error) {
	codes := make([]uint64, 0, l)
	buf := make([]uint64, 0, l)
	stale := 0
	for len(codes) < l {
		need := l - len(codes)
		fresh := make([]uint64, need)
		for i := range fresh {
			fresh[i] = draw()
		}
		buf = radixSort(fresh, buf[:0], maxCode)
		fresh = dedupSorted(fresh)
		before := len(codes)
		codes = mergeNew(codes, fresh, &buf)
		if len(codes) == before {
			stale++
			if stale > 1000 {
				return nil, errorf("cannot place that many distinct edges (network too dense)")
			}
		} else {
			stale = 0
		}
	}
	return codes, nil
}

// mergeNew merges the sorted, duplicate-free fresh into the sorted codes,
// skipping values codes already holds. *tmp is scratch space.
func mergeNew(codes, fresh []uint64, tmp *[]uint64) []uint64 {
	if len(codes) == 0 {
		return append(codes, fresh...)
	}
	out := (*tmp)[:0]
	i, j := 0, 0
	for i < len(codes) && j < len(fresh) {
		switch {
		case codes[i] < fresh[j]:
			out = append(out, codes[i])
			i++
		case codes[i] > fresh[j]:
			out = append(out, fresh[j])
			j++
		default:
			out = append(out, codes[i])
			i++
			j++
		}
	}
	out = append(out, codes[i:]...)
	out = append(out, fresh[j:]...)
	*tmp = codes[:0]
	return out
}

func dedupSorted(a []uint64) []uint64 {
	if len(a) == 0 {
		return a
	}
	k := 1
	for i := 1; i < len(a); i++ {
		if a[i] != a[k-1] {
			a[k] = a[i]
			k++
		}
	}
	return a[:k]
}

// radixSort sorts a in place by least-significant-digit radix sort on
// 16-bit digits, using only as many passes as maxCode needs. buf is
// scratch space (grown as needed) and is returned for reuse.
func radixSort(a, buf []uint64, maxCode uint64) []uint64 {
	if len(a) < 256 {
		insertionSort(a)
		return buf
	}
	if cap(buf) < len(a) {
		buf = make([]uint64, len(a))
	}
	buf = buf[:len(a)]
	passes := (bits.Len64(maxCode) + 15) / 16
	src, dst := a, buf
	var count [1 << 16]int
	for p := 0; p < passes; p++ {
		shift := uint(16 * p)
		clear(count[:])
		for _, x := range src {
			count[(x>>shift)&0xffff]++
		}
		sum := 0
		for i, c := range count {
			count[i] = sum
			sum += c
		}
		for _, x := range src {
			d := (x >> shift) & 0xffff
			dst[count[d]] = x
			count[d]++
		}
		src, dst = dst, src
	}
	if passes%2 == 1 {
		copy(a, src)
	}
	return buf
}

func insertionSort(a []uint64) {
	for i := 1; i < len(a); i++ {
		x := a[i]
		j := i
		for j > 0 && a[j-1] > x {
			a[j] = a[j-1]
			j--
		}
		a[j] = x
	}
}
