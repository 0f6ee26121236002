package stats

import (
	"math"
	"math/rand/v2"
	"testing"
)

// TestMeanSDSkewnessSameBits: the fused moments give MeanSD's and
// Skewness's results bit for bit, on random samples of every small size,
// skewed samples, constant ones and samples with large offsets.
func TestMeanSDSkewnessSameBits(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 9))
	for trial := 0; trial < 3000; trial++ {
		n := trial % 40
		x := make([]float64, n)
		for i := range x {
			switch trial % 4 {
			case 0:
				x[i] = rng.NormFloat64()
			case 1:
				x[i] = math.Exp(3 * rng.NormFloat64())
			case 2:
				x[i] = 7
			default:
				x[i] = 1e9 + rng.Float64()
			}
		}
		m, sd, sk := MeanSDSkewness(x)
		wm, wsd := MeanSD(x)
		wsk := Skewness(x)
		if math.Float64bits(m) != math.Float64bits(wm) || math.Float64bits(sd) != math.Float64bits(wsd) || math.Float64bits(sk) != math.Float64bits(wsk) {
			t.Fatalf("%v: fused %v %v %v, separate %v %v %v", x, m, sd, sk, wm, wsd, wsk)
		}
	}
}
