package stats

import (
	"math"
	"sort"
)

// WeightedMedian is the median of values when each counts with its
// weight: sort the values, add up their weights in that order, and take
// the first value at which the running total passes half of the whole;
// when the running total lands exactly on half, the mean of that value and
// the next. With integer weights this is the ordinary median of the sample
// in which each value is written out weight times (Python's
// statistics.median of the repeated values; with every weight 1 it is the
// plain median, R's quantile type 7 at 0.5). Pairs with a missing value or
// a missing, negative or zero weight are left out; n is the number of pairs
// used and ok is false when none is.
//
// Source: the definition of the weighted median as the 50 % weighted
// percentile with the tie at exactly half split evenly (Edgeworth 1888;
// as in Wikipedia's "Weighted median", from memory).
func WeightedMedian(values, weights []float64) (median float64, n int, ok bool) {
	type pair struct{ v, w float64 }
	ps := make([]pair, 0, len(values))
	total := 0.0
	for i, v := range values {
		if i >= len(weights) {
			break
		}
		w := weights[i]
		if math.IsNaN(v) || math.IsInf(v, 0) || math.IsNaN(w) || math.IsInf(w, 0) || w <= 0 {
			continue
		}
		ps = append(ps, pair{v, w})
		total += w
	}
	if len(ps) == 0 {
		return math.NaN(), 0, false
	}
	sort.SliceStable(ps, func(a, b int) bool { return ps[a].v < ps[b].v })
	half := total / 2
	run := 0.0
	for i, p := range ps {
		run += p.w
		switch {
		case run > half:
			return p.v, len(ps), true
		case run == half && i+1 < len(ps):
			return (p.v + ps[i+1].v) / 2, len(ps), true
		}
	}
	return ps[len(ps)-1].v, len(ps), true
}
