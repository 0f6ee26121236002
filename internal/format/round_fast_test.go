package format

import (
	"math"
	"math/rand/v2"
	"strconv"
	"testing"
)

// slowRound is Round without its fast path: the shortest decimal form
// rounded half away from zero as digits.
func slowRound(v float64, decimals int) float64 {
	r, _ := strconv.ParseFloat(roundString(math.Abs(v), clampDecimals(decimals)), 64)
	if r == 0 {
		return 0
	}
	if v < 0 {
		return -r
	}
	return r
}

// TestRoundFastPathAgrees: the fast path for values already at their
// decimals gives bit for bit what the digit rounding gives, on values
// written with up to nine decimals, their floating-point neighbours,
// arbitrary doubles, negatives, zeros and magnitudes around 2^53.
func TestRoundFastPathAgrees(t *testing.T) {
	rng := rand.New(rand.NewPCG(18, 2026))
	var vs []float64
	for range 40000 {
		d := rng.IntN(10)
		whole := rng.Int64N(int64(1) << uint(1+rng.IntN(53)))
		v, _ := strconv.ParseFloat(strconv.FormatFloat(float64(whole)/pow10[d], 'f', d, 64), 64)
		if rng.IntN(2) == 0 {
			v = -v
		}
		vs = append(vs, v, math.Nextafter(v, math.Inf(1)), math.Nextafter(v, math.Inf(-1)),
			rng.NormFloat64()*math.Pow(10, float64(rng.IntN(12)-4)))
	}
	// half-way cases as written (…5 one place past the decimals) and
	// their neighbours, where the binary value lies either side of the half
	for range 40000 {
		d := 1 + rng.IntN(9)
		whole := rng.Int64N(int64(1) << uint(1+rng.IntN(50)))
		s := strconv.FormatInt(whole, 10) + "5"
		for len(s) <= d {
			s = "0" + s
		}
		v, _ := strconv.ParseFloat(s[:len(s)-d]+"."+s[len(s)-d:], 64)
		vs = append(vs, v, math.Nextafter(v, math.Inf(1)), math.Nextafter(v, math.Inf(-1)))
	}
	vs = append(vs, 0, math.Copysign(0, -1), 2.675, -1234.5, 1.005, 0.1+0.2, MaxExact-1, MaxExact, MaxExact+2, 1e300, 5e-324)
	for _, v := range vs {
		for d := 0; d <= 9; d++ {
			got, want := Round(v, d), slowRound(v, d)
			if math.Float64bits(got) != math.Float64bits(want) {
				t.Fatalf("Round(%v, %d) = %v, the digit rounding gives %v", v, d, got, want)
			}
		}
	}
}

// BenchmarkRoundAtPrecision: a value already at its decimals (the fast
// path) against one that needs rounding.
func BenchmarkRoundAtPrecision(b *testing.B) {
	for _, v := range []float64{1.92, 1.9234} {
		b.Run(strconv.FormatFloat(v, 'f', -1, 64), func(b *testing.B) {
			for range b.N {
				_ = Round(v, 2)
			}
		})
	}
}
