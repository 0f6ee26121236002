// Package heaphint gives the kernel advice on the memory a build is about
// to use. It changes no result, only how fast memory is handed out.
package heaphint

import "sync"

// Least and Most bound what Reserve asks for: every build's heap reaches
// a few tens of megabytes (fonts, the document, the charts), and more
// than a gigabyte of advice would only spend address space.
const (
	Least = 64 << 20
	Most  = 1 << 30
)

var once sync.Once

// Reserve advises, once per process, that the next n bytes (within Least
// and Most) of Go heap be backed by huge pages where the system gives them
// on request (reserve, per system). Later calls do nothing: the advice
// stays with the memory the heap reuses, and a long-running process (a
// batch, --watch) should not pay for a collection on every build.
func Reserve(n int64) {
	once.Do(func() { reserve(min(max(n, Least), Most)) })
}
