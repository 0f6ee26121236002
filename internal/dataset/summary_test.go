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

// TestNoJumpBound: whenever noJump clears a series, no value in it is a
// jump by the definition itself (its ratio to the type 7 median of the
// other values, from stats.Quantile as in TestMedianWithout, within
// JumpFactor either way); and it clears the ordinary series it should.
func TestNoJumpBound(t *testing.T) {
	rng := rand.New(rand.NewPCG(10, 10))
	scales := []float64{1e-310, 1e-3, 1, 1e3, 1e300, 1.5e308}
	cleared := 0
	for trial := 0; trial < 200000; trial++ {
		n := 3 + rng.IntN(10)
		base := scales[rng.IntN(len(scales))]
		s := make([]float64, n)
		for i := range s {
			// Mostly within a factor of 3, sometimes a factor of 30.
			f := 1 + 2*rng.Float64()
			if rng.IntN(40) == 0 {
				f *= 10
			}
			s[i] = base * f
		}
		sort.Float64s(s)
		if !noJump(s) {
			continue
		}
		cleared++
		for k, v := range s {
			rest := append(append([]float64(nil), s[:k]...), s[k+1:]...)
			med := stats.Quantile(rest, 0.5, stats.Type7)
			ratio := v / med
			if ratio < 1 {
				ratio = 1 / ratio
			}
			if ratio > JumpFactor {
				t.Fatalf("noJump cleared %v, but %v is %v times the median %v of the others", s, v, ratio, med)
			}
		}
	}
	if cleared < 100000 {
		t.Errorf("noJump cleared only %d of 200000 series", cleared)
	}
}
