package format

import (
	"math"
	"testing"

	"peerpack/internal/dataset"
)

// English ordinal suffixes: "st" after 1, "nd" after 2, "rd" after 3, "th"
// otherwise and for 11-13 (Oxford style guide rule, from memory).
func TestOrdinal(t *testing.T) {
	cases := map[int]string{1: "1st", 2: "2nd", 3: "3rd", 4: "4th", 11: "11th", 12: "12th", 13: "13th",
		21: "21st", 22: "22nd", 23: "23rd", 101: "101st", 111: "111th", 112: "112th", 1001: "1,001st"}
	for n, want := range cases {
		if got := Ordinal(n); got != want {
			t.Errorf("Ordinal(%d) = %q, want %q", n, got, want)
		}
	}
}

// Thousands separated by commas in groups of three, decimals rounded to
// nearest with halves away from zero, as written in the data (common
// practice, no source). 2.675 is stored as 2.67499999999999982236... in
// IEEE 754 binary64 (from memory, the classic example); we round its
// shortest decimal form, so it prints 2.68 as a reader expects.
func TestNumber(t *testing.T) {
	cases := []struct {
		v    float64
		d    int
		want string
	}{
		{0, 0, "0"}, {999, 0, "999"}, {1000, 0, "1,000"}, {12345.678, 1, "12,345.7"},
		{1234567.891, 2, "1,234,567.89"}, {-1234.5, 0, "−1,235"}, {-0.04, 1, "0.0"},
		{2.675, 2, "2.68"}, {0.125, 2, "0.13"}, {9.995, 2, "10.00"}, {99999.5, 0, "100,000"}, {1e-7, 2, "0.00"}, {math.NaN(), 1, "–"},
	}
	for _, c := range cases {
		if got := Number(c.v, c.d); got != c.want {
			t.Errorf("Number(%v, %d) = %q, want %q", c.v, c.d, got, c.want)
		}
	}
}

func TestValueAndDifference(t *testing.T) {
	pct := dataset.Indicator{Unit: dataset.UnitPercent, Decimals: 1}
	cur := dataset.Indicator{Unit: dataset.UnitCurrency, Decimals: 0, Currency: true}
	if got := Value(pct, 23.44); got != "23.4%" {
		t.Errorf("percent value %q", got)
	}
	if got := Value(cur, 182300.4); got != "PPP$ 182,300" {
		t.Errorf("currency value %q", got)
	}
	derived := dataset.Indicator{Unit: dataset.UnitCurrency, Decimals: 0, InternationalDollars: true}
	if got := Value(derived, 103157); got != "PPP$ 103,157" {
		t.Errorf("derived currency value %q", got)
	}
	if got := Difference(pct, -3.61); got != "3.6 percentage points" {
		t.Errorf("difference %q", got)
	}
	if got := Signed(pct, 0.04); got != "0.0 pp" {
		t.Errorf("signed small %q", got)
	}
	if got := Signed(pct, 1.26); got != "+1.3 pp" {
		t.Errorf("signed %q", got)
	}
}

func TestRankBand(t *testing.T) {
	cases := []struct {
		rank, thr int
		want      string
	}{
		{6, 100, "6th"}, {100, 100, "100th"}, {101, 100, "101–150"}, {187, 100, "151–200"},
		{201, 100, "201–300"}, {350, 100, "301–400"}, {350, 0, "350th"},
	}
	for _, c := range cases {
		if got := Rank(c.rank, c.thr); got != c.want {
			t.Errorf("Rank(%d, %d) = %q, want %q", c.rank, c.thr, got, c.want)
		}
	}
}

// A mid-rank percentile lies strictly between 0 and 100 (best of 400:
// 100 x 399.5 / 400 = 99.875; worst: 0.125), so the printed rank stays
// within 1st to 99th; half rounds away from zero as everywhere in the
// package (common practice, no source).
func TestPercentileRankNeverZeroOrHundred(t *testing.T) {
	cases := []struct {
		p    float64
		want string
	}{
		{99.875, "99th percentile"}, {99.5, "99th percentile"}, {0.125, "1st percentile"},
		{0.5, "1st percentile"}, {50, "50th percentile"}, {72.5, "73rd percentile"}, {1.4, "1st percentile"},
	}
	for _, c := range cases {
		if got := Percentile(c.p); got != c.want {
			t.Errorf("Percentile(%v) = %q, want %q", c.p, got, c.want)
		}
	}
}

// Large magnitudes: whole numbers print exactly up to 2^53 =
// 9,007,199,254,740,992 (IEEE 754-2008 binary64, 53-bit significand; the
// value from memory, and 1<<53 in Go), beyond it in scientific form with
// four significant digits, the digits Python's format(v, ".3e") gives
// (Python 3.11: format(123456789012345678, ".3e") == "1.235e+17").
func TestNumberLargeMagnitudes(t *testing.T) {
	cases := []struct {
		v    float64
		d    int
		want string
	}{
		{9007199254740991, 0, "9,007,199,254,740,991"},
		{9007199254740992, 0, "9.007\u00a0×\u00a010^15"},
		{123456789012345678, 2, "1.235\u00a0×\u00a010^17"},
		{-123456789012345678, 0, "−1.235\u00a0×\u00a010^17"},
		{1e308, 2, "1.000\u00a0×\u00a010^308"},
		{math.MaxFloat64, 0, "1.798\u00a0×\u00a010^308"},
		{math.Inf(1), 0, "–"},
	}
	for _, c := range cases {
		if got := Number(c.v, c.d); got != c.want {
			t.Errorf("Number(%v, %d) = %q, want %q", c.v, c.d, got, c.want)
		}
	}
	if got := Percentile(math.Inf(-1)); got != "–" {
		t.Errorf("Percentile(-Inf) = %q, want an en dash", got)
	}
}
