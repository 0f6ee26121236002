package stats

import (
	"math"
	"testing"
)

func TestFitLineAnscombe(t *testing.T) {
	// Anscombe (1973), "Graphs in statistical analysis", The American
	// Statistician 27(1), data set I; reference fit from R 4.2.2
	// lm(y1 ~ x1, data = anscombe): intercept 3.000090909090909, slope
	// 0.500090909090909, R-squared 0.666542459508775. Anscombe's paper
	// gives 3.0 and 0.5 to the digits it prints.
	x := []float64{10, 8, 13, 9, 11, 14, 6, 4, 12, 7, 5}
	y := []float64{8.04, 6.95, 7.58, 8.81, 8.33, 9.96, 7.24, 4.26, 10.84, 4.82, 5.68}
	f, ok := FitLine(x, y)
	if !ok {
		t.Fatal("FitLine: not ok")
	}
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"intercept", f.Intercept, 3.000090909090909},
		{"slope", f.Slope, 0.500090909090909},
		{"R2", f.R2, 0.666542459508775},
	} {
		if math.Abs(c.got-c.want) > 1e-12 {
			t.Errorf("%s = %.15g, want %.15g (R lm)", c.name, c.got, c.want)
		}
	}
	if f.N != 11 {
		t.Errorf("N = %d, want 11", f.N)
	}
}

func TestFitLineSkipsMissingAndDegenerate(t *testing.T) {
	nan := math.NaN()
	// y = 1 + 2x exactly on the present pairs (common practice, no source).
	f, ok := FitLine([]float64{0, 1, nan, 2, 3}, []float64{1, 3, 100, nan, 7})
	if !ok || math.Abs(f.Intercept-1) > 1e-12 || math.Abs(f.Slope-2) > 1e-12 || f.N != 3 || math.Abs(f.R2-1) > 1e-12 {
		t.Errorf("FitLine = %+v, %v; want intercept 1, slope 2, N 3, R2 1", f, ok)
	}
	if _, ok := FitLine([]float64{2, 2, 2}, []float64{1, 2, 3}); ok {
		t.Error("constant x: want not ok")
	}
	if _, ok := FitLine([]float64{1}, []float64{1}); ok {
		t.Error("one point: want not ok")
	}
}
