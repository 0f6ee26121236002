package dataset

import (
	"math/rand/v2"
	"sort"
	"testing"

	"peerpack/internal/stats"
)

// TestMedianWithout checks the leave-one-out median against the stats
// package's type 7 median of the remaining values.
func TestMedianWithout(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for n := 3; n < 12; n++ {
		for trial := 0; trial < 50; trial++ {
			s := make([]float64, n)
			for i := range s {
				s[i] = float64(rng.IntN(6)) // ties on purpose
			}
			sort.Float64s(s)
			for k := range s {
				others := append(append([]float64(nil), s[:k]...), s[k+1:]...)
				want := stats.Quantile(others, 0.5, stats.Type7)
				if got := medianWithout(s, s[k]); got != want {
					t.Fatalf("%v without %v: %v, want %v", s, s[k], got, want)
				}
			}
		}
	}
}

func TestTopScored(t *testing.T) {
	var in []scored
	for i, sc := range []float64{3, 9, 1, 7, 7, 2, 8} {
		kind := "a"
		if i%2 == 1 {
			kind = "b"
		}
		in = append(in, scored{Suspicion: Suspicion{Kind: kind, Year: i}, score: sc})
	}
	got := topScored(in, 2)
	// a: scores 3,1,7,8 -> 8 (i=6), 7 (i=4); b: 9,7,2 -> 9 (i=1), 7 (i=3).
	want := []int{6, 4, 1, 3}
	for i, g := range got {
		if g.Year != want[i] {
			t.Fatalf("got %+v", got)
		}
	}
}
