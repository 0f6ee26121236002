package heaphint

import "testing"

// TestReserveIsHarmless: the advice, at any size and however often,
// changes nothing a caller can see (it is only advice to the kernel).
func TestReserveIsHarmless(t *testing.T) {
	for _, n := range []int64{-1, 0, 1, Least, 3 * Least} {
		Reserve(n)
	}
	b := make([]byte, 1<<20)
	for i := range b {
		b[i] = byte(i)
	}
	for i := range b {
		if b[i] != byte(i) {
			t.Fatal("memory changed after the advice")
		}
	}
}
