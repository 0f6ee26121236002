//go:build !linux

package heaphint

// reserve does nothing here: the advice it gives is Linux's.
func reserve(n int64) {}
