package composite

import (
	"cmp"
	"math"
	"slices"
)

// FirstOrder estimates the first-order sensitivity index S = V[E(Y|X)] /
// V(Y) of one input from a given sample (x, y) by binning: the runs are
// sorted by x and cut into bins of equal count, and the variance of the
// bins' means of y (weighted by bin size) is divided by the variance of y.
// This is the "given data" estimator of Saltelli et al. (2008), Global
// Sensitivity Analysis: The Primer, section 1.2.5 (and Plischke 2010); it
// reuses the Monte Carlo runs, needing no second design. Its bias is about
// bins/n of the unexplained share. NaN when y does not vary.
func FirstOrder(x, y []float64, bins int) float64 {
	n := len(y)
	if n == 0 || bins < 1 {
		return math.NaN()
	}
	idx := make([]int, n)
	for i := range idx {
		idx[i] = i
	}
	slices.SortStableFunc(idx, func(a, b int) int { return cmp.Compare(x[a], x[b]) })
	vy := variance(y)
	if !(vy > 0) {
		return math.NaN()
	}
	mean := 0.0
	for _, v := range y {
		mean += v
	}
	mean /= float64(n)
	s := 0.0
	for b := 0; b < bins; b++ {
		lo, hi := b*n/bins, (b+1)*n/bins
		if hi <= lo {
			continue
		}
		bm := 0.0
		for _, i := range idx[lo:hi] {
			bm += y[i]
		}
		bm /= float64(hi - lo)
		s += float64(hi-lo) * (bm - mean) * (bm - mean)
	}
	return s / float64(n) / vy
}

// FirstOrderDiscrete is FirstOrder for an input taking a few levels (a
// choice of method): the bins are the levels.
func FirstOrderDiscrete(level, y []float64) float64 {
	vy := variance(y)
	if !(vy > 0) {
		return math.NaN()
	}
	sum := map[float64]float64{}
	cnt := map[float64]int{}
	mean := 0.0
	for i, v := range y {
		sum[level[i]] += v
		cnt[level[i]]++
		mean += v
	}
	mean /= float64(len(y))
	levels := make([]float64, 0, len(cnt))
	for l := range cnt {
		levels = append(levels, l)
	}
	slices.Sort(levels) // a fixed order of summation, so the digits repeat
	s := 0.0
	for _, l := range levels {
		c := cnt[l]
		bm := sum[l] / float64(c)
		s += float64(c) * (bm - mean) * (bm - mean)
	}
	return s / float64(len(y)) / vy
}
