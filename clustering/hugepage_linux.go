//go:build linux

package clustering

import (
	"syscall"
	"unsafe"
)

// adviseHugePages asks Linux to back d with transparent huge pages where
// the system allows them on request (as numpy does for large arrays). A
// 1.6 GB distance matrix is then first touched in about 800 page faults
// instead of 400,000, which saves seconds. The advice only affects speed,
// so a failure is ignored.
func adviseHugePages(d []float64) {
	const page = 4096
	const madvHugePage = 14 // MADV_HUGEPAGE, the same on every Linux architecture
	size := uintptr(len(d)) * 8
	if size < 8<<20 {
		return
	}
	p := uintptr(unsafe.Pointer(&d[0]))
	skip := (page - p%page) % page
	b := unsafe.Slice((*byte)(unsafe.Add(unsafe.Pointer(&d[0]), skip)), (size-skip)&^(page-1))
	_ = syscall.Madvise(b, madvHugePage)
}
