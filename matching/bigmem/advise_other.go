//go:build !linux

package bigmem

import "unsafe"

func advise(p unsafe.Pointer, size uintptr) {}
