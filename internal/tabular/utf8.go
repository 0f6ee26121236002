package tabular

import (
	"runtime"
	"slices"
	"sync"
	"unicode/utf8"
)

// minValidateChunk is the smallest piece worth a goroutine of its own.
const minValidateChunk = 4 << 20

// validUTF8 reports utf8.Valid(data), checking pieces of a large file on
// every processor: a world-sized values file (180 MB) is otherwise read
// once, on one core, before any row is parsed.
func validUTF8(data []byte) bool {
	return validUTF8In(data, min(runtime.GOMAXPROCS(0), len(data)/minValidateChunk))
}

// validUTF8In checks data in up to n pieces at once. A piece ends just
// before a byte below 0x80: such a byte is never part of a multi-byte
// sequence, so no valid sequence is cut, and a sequence truncated at the
// cut is invalid in its piece as it is in the whole. The pieces are all
// valid exactly when data is.
func validUTF8In(data []byte, n int) bool {
	if n < 2 {
		return utf8.Valid(data)
	}
	cuts := []int{0}
	for i := 1; i < n; i++ {
		c := i * len(data) / n
		for c < len(data) && data[c] >= utf8.RuneSelf {
			c++
		}
		if c > cuts[len(cuts)-1] && c < len(data) {
			cuts = append(cuts, c)
		}
	}
	cuts = append(cuts, len(data))
	ok := make([]bool, len(cuts)-1)
	var wg sync.WaitGroup
	for i := range ok {
		wg.Add(1)
		go func() {
			defer wg.Done()
			ok[i] = utf8.Valid(data[cuts[i]:cuts[i+1]])
		}()
	}
	wg.Wait()
	return !slices.Contains(ok, false)
}
