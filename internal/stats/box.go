// Package stats holds every statistic peerpack reports, one definition per
// statistic, each documented with its source where it is computed.
package stats

import (
	"math"
	"sort"
)

// QuantileMethod selects a sample quantile definition.
type QuantileMethod int

// Quantile definitions, after Hyndman and Fan (1996), "Sample quantiles in
// statistical packages", The American Statistician 50(4), 361-365.
const (
	// Type7 interpolates between order statistics at h = (n-1)p + 1; R's
	// default and the peerpack default.
	Type7 QuantileMethod = iota
	// Type6 uses h = (n+1)p; the NIST/SEMATECH e-Handbook's definition.
	Type6
	// Hinges are Tukey's (1977) lower and upper hinges, the medians of the
	// lower and upper halves including the median when n is odd (R's
	// fivenum()).
	Hinges
)

// ParseQuantileMethod maps a brief's quantiles value to a method.
func ParseQuantileMethod(s string) QuantileMethod {
	switch s {
	case "type6":
		return Type6
	case "hinges":
		return Hinges
	}
	return Type7
}

func (q QuantileMethod) String() string {
	switch q {
	case Type6:
		return "type6"
	case Hinges:
		return "hinges"
	}
	return "type7"
}

// Quantile returns the p-quantile (0 <= p <= 1) of sorted ascending data
// without missing values, by Hyndman and Fan type 7 or type 6. For Hinges,
// p of 0.25, 0.5 and 0.75 give the hinges and the median as fivenum()
// does, and other p fall back to type 7.
func Quantile(sorted []float64, p float64, m QuantileMethod) float64 {
	if len(sorted) == 0 {
		return math.NaN()
	}
	q := planQuantile(len(sorted), p, m)
	return q.value(sorted[q.lo], sorted[q.hi])
}

// quantilePlan says which two order statistics (0-based) a quantile
// interpolates between and how, so the sorted and the selection paths
// compute bit-identical values.
type quantilePlan struct {
	lo, hi int
	frac   float64
	// average marks Tukey's hinges, which R's fivenum() forms as
	// 0.5 * (a + b).
	average bool
}

func (q quantilePlan) value(a, b float64) float64 {
	if q.average {
		return 0.5 * (a + b)
	}
	if q.frac == 0 {
		return a
	}
	return a + q.frac*(b-a)
}

// planQuantile locates the p-quantile of n > 0 ordered values.
//
//	type 7: h = (n-1)p (0-based), between x[floor(h)] and the next;
//	type 6: h = (n+1)p (1-based), clamped to [1, n];
//	hinges: n4 = floor((n+3)/2)/2 (1-based), the lower hinge at n4 and the
//	upper at n+1-n4, averaging neighbours at half positions (fivenum()).
func planQuantile(n int, p float64, m QuantileMethod) quantilePlan {
	if n == 1 {
		return quantilePlan{}
	}
	switch m {
	case Type6:
		h := float64(n+1) * p // 1-based
		if h <= 1 {
			return quantilePlan{}
		}
		if h >= float64(n) {
			return quantilePlan{lo: n - 1, hi: n - 1}
		}
		lo := math.Floor(h)
		return quantilePlan{lo: int(lo) - 1, hi: int(lo), frac: h - lo}
	case Hinges:
		if p == 0.5 {
			pos := float64(n+1) / 2
			return quantilePlan{lo: int(math.Floor(pos)) - 1, hi: int(math.Ceil(pos)) - 1, average: true}
		}
		if p == 0.25 || p == 0.75 {
			n4 := math.Floor(float64(n+3)/2) / 2
			pos := n4
			if p == 0.75 {
				pos = float64(n+1) - n4
			}
			return quantilePlan{lo: int(math.Floor(pos)) - 1, hi: int(math.Ceil(pos)) - 1, average: true}
		}
	}
	h := float64(n-1) * p
	lo := math.Floor(h)
	i := int(lo)
	if i >= n-1 {
		return quantilePlan{lo: n - 1, hi: n - 1}
	}
	return quantilePlan{lo: i, hi: i + 1, frac: h - lo}
}

// Box is the five-number summary with Tukey's (1977) whiskers: the most
// extreme observations within 1.5 x IQR of the box (his "adjacent
// values"). With interpolated quartiles and a small group, the adjacent
// value can lie inside the box (Q3 interpolated towards an outlier); the
// whisker values stay the observed ones, for audit, and DrawnWhiskers
// gives the ends a chart draws.
type Box struct {
	N, Missing          int
	Min, Q1, Median, Q3 float64
	Max, IQR            float64
	WhiskerLow          float64
	WhiskerHigh         float64
	// OutlierValues are the observations beyond the whiskers, ascending.
	OutlierValues []float64
}

// DrawnWhiskers returns where whiskers end on a chart: the adjacent
// values, but never inside the box (a whisker of zero length there).
func (b Box) DrawnWhiskers() (low, high float64) {
	return math.Min(b.WhiskerLow, b.Q1), math.Max(b.WhiskerHigh, b.Q3)
}

// BoxOf computes box statistics of values (NaN = missing) with the given
// quantile method.
func BoxOf(values []float64, m QuantileMethod) Box {
	s := make([]float64, 0, len(values))
	missing := 0
	for _, v := range values {
		if math.IsNaN(v) {
			missing++
			continue
		}
		s = append(s, v)
	}
	sort.Float64s(s)
	return BoxOfSorted(s, missing, m)
}

// BoxOfSorted is BoxOf on data already sorted and without missing values.
func BoxOfSorted(s []float64, missing int, m QuantileMethod) Box {
	b := Box{N: len(s), Missing: missing}
	if len(s) == 0 {
		nan := math.NaN()
		b.Min, b.Q1, b.Median, b.Q3, b.Max, b.IQR, b.WhiskerLow, b.WhiskerHigh = nan, nan, nan, nan, nan, nan, nan, nan
		return b
	}
	b.Min, b.Max = s[0], s[len(s)-1]
	b.Q1 = Quantile(s, 0.25, m)
	b.Median = Quantile(s, 0.5, m)
	b.Q3 = Quantile(s, 0.75, m)
	b.setWhiskers(s)
	return b
}

// setWhiskers sets IQR, Tukey's (1977) whiskers (the most extreme values
// within 1.5 x IQR of the box) and the outliers beyond them, ascending,
// once the quartiles, Min and Max are known; values may be in any order.
func (b *Box) setWhiskers(values []float64) {
	b.IQR = b.Q3 - b.Q1
	lo, hi := b.Q1-1.5*b.IQR, b.Q3+1.5*b.IQR
	b.WhiskerLow, b.WhiskerHigh = b.Max, b.Min
	b.OutlierValues = nil
	for _, v := range values {
		if v >= lo && v < b.WhiskerLow {
			b.WhiskerLow = v
		}
		if v <= hi && v > b.WhiskerHigh {
			b.WhiskerHigh = v
		}
		if v < lo || v > hi {
			b.OutlierValues = append(b.OutlierValues, v)
		}
	}
	sort.Float64s(b.OutlierValues)
}
