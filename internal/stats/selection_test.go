package stats

import (
	"math/rand/v2"
	"slices"
	"testing"
)

// The selection path must give exactly what sorting gives (same order
// statistics, same arithmetic), on random data, heavy ties and sorted and
// reversed input.
func TestBoxOfUnsortedMatchesSorted(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	gens := map[string]func(n int) []float64{
		"normal": func(n int) []float64 {
			x := make([]float64, n)
			for i := range x {
				x[i] = rng.NormFloat64()*10 + 50
			}
			return x
		},
		"ties": func(n int) []float64 {
			x := make([]float64, n)
			for i := range x {
				x[i] = float64(rng.IntN(4))
			}
			return x
		},
		"constant": func(n int) []float64 {
			return make([]float64, n)
		},
		"sorted": func(n int) []float64 {
			x := make([]float64, n)
			for i := range x {
				x[i] = float64(i) * 0.5
			}
			return x
		},
		"reversed": func(n int) []float64 {
			x := make([]float64, n)
			for i := range x {
				x[i] = float64(n - i)
			}
			return x
		},
	}
	for name, gen := range gens {
		for _, n := range []int{1, 2, 3, 4, 5, 7, 16, 17, 33, 100, 1001, 5000} {
			for _, m := range []QuantileMethod{Type7, Type6, Hinges} {
				x := gen(n)
				s := slices.Clone(x)
				slices.Sort(s)
				want := BoxOfSorted(s, 3, m)
				got := BoxOfUnsorted(slices.Clone(x), 3, m)
				q1, med, q3 := QuartilesOfUnsorted(slices.Clone(x), m)
				if q1 != Quantile(s, 0.25, m) || med != Quantile(s, 0.5, m) || q3 != Quantile(s, 0.75, m) {
					t.Fatalf("%s n=%d %v: QuartilesOfUnsorted = %v %v %v, want %v %v %v", name, n, m, q1, med, q3,
						Quantile(s, 0.25, m), Quantile(s, 0.5, m), Quantile(s, 0.75, m))
				}
				if got.Q1 != want.Q1 || got.Median != want.Median || got.Q3 != want.Q3 ||
					got.Min != want.Min || got.Max != want.Max || got.WhiskerLow != want.WhiskerLow ||
					got.WhiskerHigh != want.WhiskerHigh || got.N != want.N || got.Missing != want.Missing ||
					!slices.Equal(got.OutlierValues, want.OutlierValues) {
					t.Fatalf("%s n=%d %v:\n got  %+v\n want %+v", name, n, m, got, want)
				}
			}
		}
	}
}

func TestSelectOrder(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 9))
	for trial := 0; trial < 200; trial++ {
		n := 1 + rng.IntN(300)
		x := make([]float64, n)
		for i := range x {
			x[i] = float64(rng.IntN(50))
		}
		s := slices.Clone(x)
		slices.Sort(s)
		ks := []int{0, n / 4, n / 2, (3 * n) / 4, n - 1}
		slices.Sort(ks)
		ks = slices.Compact(ks)
		SelectOrder(x, ks)
		for _, k := range ks {
			if x[k] != s[k] {
				t.Fatalf("n=%d k=%d: got %g want %g", n, k, x[k], s[k])
			}
		}
	}
}

func TestPlaceAllMatchesPlace(t *testing.T) {
	rng := rand.New(rand.NewPCG(4, 4))
	x := make([]float64, 500)
	for i := range x {
		x[i] = float64(rng.IntN(60))
	}
	s := slices.Clone(x)
	slices.Sort(s)
	targets := []float64{x[0], x[17], 100, -1, 30.5, x[499]}
	member := []bool{true, true, false, false, false, true}
	for _, dir := range []Direction{HigherFirst, LowerFirst} {
		out := make([]Placement, len(targets))
		PlaceAll(x, targets, member, dir, out)
		for j, v := range targets {
			if want := Place(s, v, dir, member[j]); out[j] != want {
				t.Fatalf("target %g: got %+v want %+v", v, out[j], want)
			}
		}
	}
}

// FuzzBoxOfUnsorted: selection and sorting agree on any input.
func FuzzBoxOfUnsorted(f *testing.F) {
	f.Add([]byte{1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 14, 15, 16, 17, 18, 19, 20})
	f.Add([]byte{5, 5, 5, 5, 5, 5, 5, 5, 5, 5, 5, 5, 5, 5, 5, 5, 5, 5, 1, 200})
	f.Fuzz(func(t *testing.T, raw []byte) {
		x := make([]float64, len(raw))
		for i, c := range raw {
			x[i] = float64(c % 37)
		}
		s := slices.Clone(x)
		slices.Sort(s)
		for _, m := range []QuantileMethod{Type7, Type6, Hinges} {
			want := BoxOfSorted(s, 0, m)
			got := BoxOfUnsorted(slices.Clone(x), 0, m)
			if len(x) == 0 {
				continue
			}
			if got.Q1 != want.Q1 || got.Median != want.Median || got.Q3 != want.Q3 || got.WhiskerLow != want.WhiskerLow || got.WhiskerHigh != want.WhiskerHigh {
				t.Fatalf("%v on %v: got %+v want %+v", m, x, got, want)
			}
		}
	})
}
