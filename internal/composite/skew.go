package composite

import (
	"math"
	"slices"
)

// Skewness is the adjusted Fisher-Pearson coefficient of skewness G1 =
// g1 sqrt(n(n-1)) / (n-2), with g1 = m3 / m2^1.5 from the population
// moments: SciPy's scipy.stats.skew(x, bias=False) and R e1071's skewness
// type 2. NaN for fewer than three values or no spread.
func Skewness(x []float64) float64 {
	n := float64(len(x))
	if len(x) < 3 {
		return math.NaN()
	}
	m2, m3, _ := moments(x)
	if m2 == 0 {
		return math.NaN()
	}
	g1 := m3 / math.Pow(m2, 1.5)
	return g1 * math.Sqrt(n*(n-1)) / (n - 2)
}

// Kurtosis is the bias-corrected excess kurtosis G2 = ((n+1) g2 + 6)(n-1) /
// ((n-2)(n-3)), with g2 = m4 / m2^2 - 3: SciPy's scipy.stats.kurtosis(x,
// fisher=True, bias=False). NaN for fewer than four values or no spread.
func Kurtosis(x []float64) float64 {
	n := float64(len(x))
	if len(x) < 4 {
		return math.NaN()
	}
	m2, _, m4 := moments(x)
	if m2 == 0 {
		return math.NaN()
	}
	g2 := m4/(m2*m2) - 3
	return ((n+1)*g2 + 6) * (n - 1) / ((n - 2) * (n - 3))
}

// moments returns the second, third and fourth central moments (divisor n).
func moments(x []float64) (m2, m3, m4 float64) {
	mean := 0.0
	for _, v := range x {
		mean += v
	}
	mean /= float64(len(x))
	for _, v := range x {
		d := v - mean
		d2 := d * d
		m2 += d2
		m3 += d2 * d
		m4 += d2 * d2
	}
	n := float64(len(x))
	return m2 / n, m3 / n, m4 / n
}

// skewed applies the criterion |skewness| > SkewLimit and excess kurtosis >
// KurtosisLimit.
func skewed(sk, ku float64) bool {
	return math.Abs(sk) > SkewLimit && ku > KurtosisLimit
}

// treatSkew diagnoses one column and, when the criterion holds, treats it
// in place (values of unscored institutions are left as they are but do
// not count). Log: ln(x), or ln(x - min + 1) when some value is not
// positive, mirrored for a long left tail (-ln(max - x + 1)), so the order
// of values is kept. Winsorise: one value at a time, the most extreme of
// the long tail is set to the next one in, until the criterion no longer
// holds or N values are replaced (the JRC's practice of winsorising up to a
// handful of values, from memory).
//
// With frozen set, the diagnosis of frozen is kept and its treatment
// applied (a winsorised count is applied as is), whatever the new values.
func treatSkew(x []float64, scored []bool, s Skew, frozen *SkewInfo) SkewInfo {
	vals := make([]float64, 0, len(x))
	for i, v := range x {
		if scored[i] && !math.IsNaN(v) {
			vals = append(vals, v)
		}
	}
	var info SkewInfo
	if frozen != nil {
		info = *frozen
		if info.Treated == "winsorise" {
			s.N = info.Winsorised
		}
		info.Winsorised = 0
	} else {
		info = SkewInfo{Skewness: Skewness(vals), Kurtosis: Kurtosis(vals)}
		info.Skewed = skewed(info.Skewness, info.Kurtosis)
	}
	if !info.Skewed || len(vals) == 0 {
		return info
	}
	switch s.Treat {
	case "log":
		info.Treated = "log"
		lo, hi := slices.Min(vals), slices.Max(vals)
		for i, v := range x {
			if math.IsNaN(v) {
				continue
			}
			switch {
			case info.Skewness < 0:
				x[i] = -math.Log(hi - v + 1)
			case lo > 0:
				x[i] = math.Log(v)
			default:
				x[i] = math.Log(v - lo + 1)
			}
		}
	case "winsorise":
		info.Treated = "winsorise"
		right := info.Skewness > 0
		sorted := slices.Clone(vals)
		slices.Sort(sorted)
		n := len(sorted)
		for info.Winsorised < s.N && info.Winsorised < n-2 {
			k := info.Winsorised
			// the k+1 most extreme values of the long tail take the next value in
			if right {
				capAt := sorted[n-2-k]
				clampAbove(x, capAt)
				clampAbove(vals, capAt)
			} else {
				capAt := sorted[k+1]
				clampBelow(x, capAt)
				clampBelow(vals, capAt)
			}
			info.Winsorised++
			if frozen == nil && !skewed(Skewness(vals), Kurtosis(vals)) {
				break
			}
		}
	}
	return info
}

func clampAbove(x []float64, c float64) {
	for i, v := range x {
		if v > c {
			x[i] = c
		}
	}
}

func clampBelow(x []float64, c float64) {
	for i, v := range x {
		if v < c {
			x[i] = c
		}
	}
}
