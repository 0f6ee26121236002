package stats

import (
	"math/rand/v2"
	"slices"
	"testing"
)

// BenchmarkBoxOfUnsorted: box statistics of 20,000 values by selection,
// against sorting (BenchmarkBoxOfSorted).
func BenchmarkBoxOfUnsorted(b *testing.B) {
	x := benchValues(20000)
	buf := make([]float64, len(x))
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		copy(buf, x)
		BoxOfUnsorted(buf, 0, Type7)
	}
}

func BenchmarkBoxOfSorted(b *testing.B) {
	x := benchValues(20000)
	buf := make([]float64, len(x))
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		copy(buf, x)
		slices.Sort(buf)
		BoxOfSorted(buf, 0, Type7)
	}
}

func benchValues(n int) []float64 {
	rng := rand.New(rand.NewPCG(1, 1))
	x := make([]float64, n)
	for i := range x {
		x[i] = float64(int(rng.NormFloat64()*150+500)) / 10
	}
	return x
}
