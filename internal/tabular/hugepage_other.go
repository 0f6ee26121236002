//go:build !linux

package tabular

// adviseHugePages is a Linux advice; elsewhere there is nothing to ask.
func adviseHugePages([]byte) {}
