package stats

import "math"

// Pearson is the product-moment correlation coefficient of paired values
// (no missing values), sum((x-mx)(y-my)) / sqrt(sum((x-mx)^2) sum((y-my)^2))
// computed from centred values. NaN for fewer than two pairs or when either
// variable is constant.
func Pearson(x, y []float64) float64 {
	n := len(x)
	if n != len(y) || n < 2 {
		return math.NaN()
	}
	mx, my := Mean(x), Mean(y)
	var sxy, sxx, syy float64
	for i := range x {
		dx, dy := x[i]-mx, y[i]-my
		sxy += dx * dy
		sxx += dx * dx
		syy += dy * dy
	}
	if sxx == 0 || syy == 0 {
		return math.NaN()
	}
	r := sxy / math.Sqrt(sxx*syy)
	return math.Max(-1, math.Min(1, r))
}

// Spearman is Spearman's rank correlation coefficient: Pearson's
// coefficient of the average ranks (ties sharing the mean rank), which is
// what R's cor(method = "spearman") computes. NaN as for Pearson.
func Spearman(x, y []float64) float64 {
	if len(x) != len(y) || len(x) < 2 {
		return math.NaN()
	}
	return Pearson(AverageRanks(x), AverageRanks(y))
}
