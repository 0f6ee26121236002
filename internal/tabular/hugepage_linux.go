package tabular

import (
	"syscall"
	"unsafe"
)

// hugePageBytes is the size from which a file's buffer is worth asking
// huge pages for.
const hugePageBytes = 16 << 20

// adviseHugePages asks Linux to back buf with transparent huge pages
// (madvise MADV_HUGEPAGE, for systems where THP is set to "madvise"): a
// world-sized values file of 180 MB is otherwise 45,000 page faults of
// 4 KiB while it is read, and as many TLB entries while it is checksummed
// and parsed. It is advice: whatever the kernel says, the buffer is the
// same.
func adviseHugePages(buf []byte) {
	if len(buf) < hugePageBytes {
		return
	}
	const page = 4096
	addr := uintptr(unsafe.Pointer(&buf[0]))
	from := int((addr+page-1)&^(page-1) - addr)          // first whole page
	to := int((addr+uintptr(len(buf)))&^(page-1) - addr) // end of the last
	if to <= from {
		return
	}
	_ = syscall.Madvise(buf[from:to], syscall.MADV_HUGEPAGE)
}
