package stats

import "math"

// Mean is the arithmetic mean of x (no missing values); NaN when x is
// empty. It sums in one pass and corrects with a second pass over the
// deviations (the "corrected two-pass" form of Chan, Golub and LeVeque
// 1983), so large, similar values do not lose digits.
func Mean(x []float64) float64 {
	n := len(x)
	if n == 0 {
		return math.NaN()
	}
	s := 0.0
	for _, v := range x {
		s += v
	}
	m := s / float64(n)
	c := 0.0
	for _, v := range x {
		c += v - m
	}
	return m + c/float64(n)
}

// MeanSD returns the mean and the sample standard deviation
// sqrt(sum((x-mean)^2) / (n-1)) of x (no missing values). The SD is NaN
// for fewer than two values. Corrected two-pass algorithm (Chan, Golub and
// LeVeque 1983, "Algorithms for computing the sample variance", The
// American Statistician 37(3)).
func MeanSD(x []float64) (mean, sd float64) {
	n := len(x)
	mean = Mean(x)
	if n < 2 {
		return mean, math.NaN()
	}
	ss, c := 0.0, 0.0
	for _, v := range x {
		d := v - mean
		ss += d * d
		c += d
	}
	variance := (ss - c*c/float64(n)) / float64(n-1)
	if variance < 0 {
		variance = 0
	}
	return mean, math.Sqrt(variance)
}

// SD is the sample standard deviation (divisor n-1); NaN for fewer than two
// values.
func SD(x []float64) float64 {
	_, sd := MeanSD(x)
	return sd
}

// Z is the z-score (v - mean) / sd of a value against a group, with the
// group's sample standard deviation. It keeps the sign of the raw scale
// (positive means above the mean whatever the indicator's polarity) and is
// NaN when the SD is zero or undefined.
func Z(v, mean, sd float64) float64 {
	if !(sd > 0) || math.IsNaN(v) || math.IsNaN(mean) {
		return math.NaN()
	}
	return (v - mean) / sd
}

// Skewness is the adjusted Fisher-Pearson sample skewness
// G1 = sqrt(n(n-1)) / (n-2) x m3 / m2^(3/2), with m2 and m3 the second and
// third central moments (divisor n), as SciPy's skew(bias=False) and
// Joanes and Gill (1998) type 2; NaN for fewer than three values or no
// spread. Packs caution on z-scores where its absolute value exceeds
// SkewCaution.
func Skewness(x []float64) float64 {
	n := len(x)
	if n < 3 {
		return math.NaN()
	}
	m := Mean(x)
	var m2, m3 float64
	for _, v := range x {
		d := v - m
		m2 += d * d
		m3 += d * d * d
	}
	m2 /= float64(n)
	m3 /= float64(n)
	if m2 == 0 {
		return math.NaN()
	}
	g1 := m3 / math.Pow(m2, 1.5)
	nf := float64(n)
	return math.Sqrt(nf*(nf-1)) / (nf - 2) * g1
}

// MeanSDSkewness is MeanSD and Skewness of the same values at once: one
// mean, and one pass for both sums of powers. Every operation is the one
// the two functions do, in the same order, so the results are the same
// bit for bit (TestMeanSDSkewnessSameBits).
func MeanSDSkewness(x []float64) (mean, sd, skew float64) {
	n := len(x)
	mean = Mean(x)
	if n < 2 {
		return mean, math.NaN(), math.NaN()
	}
	ss, c, m3 := 0.0, 0.0, 0.0
	for _, v := range x {
		d := v - mean
		dd := d * d
		ss += dd
		c += d
		m3 += dd * d
	}
	variance := (ss - c*c/float64(n)) / float64(n-1)
	if variance < 0 {
		variance = 0
	}
	sd = math.Sqrt(variance)
	if n < 3 {
		return mean, sd, math.NaN()
	}
	m2 := ss / float64(n)
	m3 /= float64(n)
	if m2 == 0 {
		return mean, sd, math.NaN()
	}
	g1 := m3 / math.Pow(m2, 1.5)
	nf := float64(n)
	return mean, sd, math.Sqrt(nf*(nf-1)) / (nf - 2) * g1
}

// SkewCaution: an absolute sample skewness above 2 makes z-scores and
// means poor summaries of an indicator (a threshold commonly used in
// composite-indicator audits, from memory).
const SkewCaution = 2.0
