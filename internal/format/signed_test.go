package format

import (
	"math"
	"testing"

	"peerpack/internal/dataset"
)

// Signs: plus for gains, the Unicode minus sign U+2212 for losses (the
// sign typographic practice prints, common practice, no source), nothing
// on a value that rounds to zero; rounding half away from zero as Number.
func TestSignedNumber(t *testing.T) {
	cases := []struct {
		v    float64
		d    int
		want string
	}{
		{1.254, 2, "+1.25"}, {-0.4, 2, "−0.40"}, {0, 2, "0.00"}, {-0.004, 2, "0.00"}, {0.005, 2, "+0.01"},
		{-1234.5, 0, "−1,235"}, {2.675, 2, "+2.68"}, {math.NaN(), 2, "–"}, {math.Inf(1), 1, "–"},
	}
	for _, c := range cases {
		if got := SignedNumber(c.v, c.d); got != c.want {
			t.Errorf("SignedNumber(%v, %d) = %q, want %q", c.v, c.d, got, c.want)
		}
	}
}

func TestSignedPercent(t *testing.T) {
	cases := []struct {
		v    float64
		want string
	}{
		{12.46, "+12.5%"}, {-3, "−3.0%"}, {0.04, "0.0%"}, {math.NaN(), "–"}, {math.Inf(-1), "–"},
	}
	for _, c := range cases {
		if got := SignedPercent(c.v); got != c.want {
			t.Errorf("SignedPercent(%v) = %q, want %q", c.v, got, c.want)
		}
	}
}

// A change quoted in prose carries its unit (common practice, no source:
// a figure in running text names what it counts).
func TestSignedValue(t *testing.T) {
	dollars := dataset.Indicator{Unit: dataset.UnitCurrency, Currency: true}
	pct := dataset.Indicator{Unit: dataset.UnitPercent, Decimals: 1}
	plain := dataset.Indicator{Decimals: 2}
	for _, c := range []struct {
		ind  dataset.Indicator
		d    float64
		want string
	}{
		{dollars, 21915.6, "+PPP$ 21,916"},
		{dollars, -1200, "−PPP$ 1,200"},
		{dollars, 0.2, "PPP$ 0"},
		{pct, 3.64, "+3.6 pp"},
		{plain, -0.104, "−0.10"},
	} {
		if got := SignedValue(c.ind, c.d); got != c.want {
			t.Errorf("SignedValue(%v) = %q, want %q", c.d, got, c.want)
		}
	}
}
