package stats

import "math"

// Change is end - start.
func Change(start, end float64) float64 { return end - start }

// ChangePct is the percentage change 100 x (end - start) / start, defined
// only for a positive start and an end at or above zero: a percentage
// change from or across zero or below it (an operating deficit turning to
// a surplus, -2 to +3 "+250 %") reads as a size it does not have, so it is
// withheld (NaN) and the absolute change stands alone (common practice,
// no source).
func ChangePct(start, end float64) float64 {
	if !(start > 0) || !(end >= 0) {
		return math.NaN()
	}
	return 100 * (end - start) / start
}

// CAGR is the compound annual growth rate in percent a year,
// 100 x ((end / start)^(1 / years) - 1), over years > 0 years. It is only
// defined for positive start and end values; otherwise NaN.
func CAGR(start, end float64, years int) float64 {
	if years <= 0 || !(start > 0) || !(end > 0) {
		return math.NaN()
	}
	return 100 * (math.Pow(end/start, 1/float64(years)) - 1)
}

// Slope is the ordinary least-squares slope of y on x,
// sum((x-mx)(y-my)) / sum((x-mx)^2): for a yearly series, the average
// change per year that best fits every year with a value. NaN for fewer
// than two points or constant x.
func Slope(x, y []float64) float64 {
	n := len(x)
	if n != len(y) || n < 2 {
		return math.NaN()
	}
	mx, my := Mean(x), Mean(y)
	var sxy, sxx float64
	for i := range x {
		dx := x[i] - mx
		sxy += dx * (y[i] - my)
		sxx += dx * dx
	}
	if sxx == 0 {
		return math.NaN()
	}
	return sxy / sxx
}
