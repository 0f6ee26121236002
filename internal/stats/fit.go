package stats

import "math"

// LineFit is an ordinary least-squares straight line y = Intercept +
// Slope x over N points with both values present.
type LineFit struct {
	Intercept, Slope float64
	// R2 is the coefficient of determination, 1 - SSres/SStot.
	R2 float64
	N  int
}

// FitLine fits y on x by ordinary least squares (Draper and Smith 1998,
// Applied Regression Analysis, 3rd ed., section 1.2): slope
// sum((x-mx)(y-my)) / sum((x-mx)^2), intercept my - slope mx. Pairs with
// a NaN are skipped. ok is false for fewer than two points or constant x.
func FitLine(x, y []float64) (f LineFit, ok bool) {
	n := min(len(x), len(y))
	var xs, ys []float64
	for i := 0; i < n; i++ {
		if math.IsNaN(x[i]) || math.IsNaN(y[i]) {
			continue
		}
		xs, ys = append(xs, x[i]), append(ys, y[i])
	}
	f.N = len(xs)
	f.Slope = Slope(xs, ys)
	if f.N < 2 || math.IsNaN(f.Slope) {
		return f, false
	}
	mx, my := Mean(xs), Mean(ys)
	f.Intercept = my - f.Slope*mx
	var ssRes, ssTot float64
	for i := range xs {
		r := ys[i] - (f.Intercept + f.Slope*xs[i])
		ssRes += r * r
		d := ys[i] - my
		ssTot += d * d
	}
	if ssTot > 0 {
		f.R2 = 1 - ssRes/ssTot
	} else {
		f.R2 = math.NaN()
	}
	return f, true
}

// At is the fitted value at x.
func (f LineFit) At(x float64) float64 { return f.Intercept + f.Slope*x }
