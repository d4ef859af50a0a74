package bigmem

import (
	"syscall"
	"unsafe"
)

const (
	hugePage     = 2 << 20
	madvHugePage = 14 // MADV_HUGEPAGE
)

// advise asks for huge pages over the 2 MiB-aligned part of [p, p+size).
// Errors (no transparent huge pages, say) are ignored: the advice is only
// a hint.
func advise(p unsafe.Pointer, size uintptr) {
	start := (uintptr(p) + hugePage - 1) &^ (hugePage - 1)
	end := (uintptr(p) + size) &^ (hugePage - 1)
	if end <= start {
		return
	}
	b := unsafe.Slice((*byte)(unsafe.Add(p, start-uintptr(p))), end-start)
	syscall.Madvise(b, madvHugePage)
}
