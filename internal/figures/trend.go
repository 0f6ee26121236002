package figures

import (
	"math"

	"peerpack/internal/dataset"
	"peerpack/internal/stats"
)

// SizeChangeLimit is the relative change in a group's size (members with a
// value) between the two ends of a trend beyond which raw rank changes
// mislead and statements compare percentiles instead: ranking 40th of 200
// after 40th of 100 is a better showing, not the same one (common
// practice, no source).
const SizeChangeLimit = 0.10

// SizeChanged reports whether group sizes a and b differ by more than
// SizeChangeLimit of the smaller.
func SizeChanged(a, b int) bool {
	lo, hi := min(a, b), max(a, b)
	if lo == 0 {
		return hi > 0
	}
	return float64(hi-lo) > SizeChangeLimit*float64(lo)
}

// trendOf measures one institution's movement over the span: from the
// first year of the span in which it has a value to the last.
// Change = end - start; ChangePct = 100 x change / |start|; CAGR in percent
// a year over end year - start year; Slope is the least-squares slope over
// every year with a value; RankChange = start rank - end rank (positive
// = moved up); PercentileChange = end - start percentile.
func trendOf(g *Group, ind dataset.Indicator, inst int, series []*Position, dists []*Distribution) *Trend {
	t := &Trend{Group: g.Name, Indicator: ind.Key, Institution: inst}
	nan := math.NaN()
	t.StartValue, t.EndValue, t.Change, t.ChangePct, t.CAGR, t.Slope, t.PercentileChange, t.MedianChange = nan, nan, nan, nan, nan, nan, nan, nan
	t.PercentileMove, t.ChangePerIQR = nan, nan
	first, last, xs, ys := spanOf(len(series), func(i int) (int, float64, bool) {
		return series[i].Year, series[i].Value, series[i].HasValue
	})
	if first < 0 {
		return t
	}
	s, e := series[first], series[last]
	t.Points = len(xs)
	t.StartYear, t.StartValue = s.Year, s.Value
	t.EndYear, t.EndValue = e.Year, e.Value
	t.StartOf, t.EndOf = s.Of, e.Of
	if first == last {
		return t
	}
	t.Valid = true
	t.Change = stats.Change(s.Value, e.Value)
	t.ChangePct = stats.ChangePct(s.Value, e.Value)
	t.CAGR = stats.CAGR(s.Value, e.Value, e.Year-s.Year)
	t.Slope = stats.Slope(xs, ys)
	if s.Rank > 0 && e.Rank > 0 {
		t.RankChange = s.Rank - e.Rank
		t.PercentileChange = e.Percentile - s.Percentile
		t.PercentileMove = math.Abs(t.PercentileChange)
	}
	if iqr := dists[last].IQR; dists[last].N >= 2 && iqr > 0 {
		t.ChangePerIQR = math.Abs(t.Change) / iqr
	}
	t.MedianChange = dists[last].Median - dists[first].Median
	t.PreferPercentiles = SizeChanged(s.Of, e.Of)
	return t
}

// groupTrendOf measures the group median's movement from the first to the
// last year of the span in which the group has a value.
func groupTrendOf(g *Group, ind dataset.Indicator, dists []*Distribution) *GroupTrend {
	t := &GroupTrend{Group: g.Name, Indicator: ind.Key}
	nan := math.NaN()
	t.MedianStart, t.MedianEnd, t.Change, t.ChangePct, t.Slope = nan, nan, nan, nan, nan
	first, last, xs, ys := spanOf(len(dists), func(i int) (int, float64, bool) {
		return dists[i].Year, dists[i].Median, dists[i].N > 0
	})
	if first < 0 {
		return t
	}
	s, e := dists[first], dists[last]
	t.StartYear, t.EndYear = s.Year, e.Year
	t.MedianStart, t.MedianEnd = s.Median, e.Median
	t.StartN, t.EndN = s.N, e.N
	if first == last {
		return t
	}
	t.Valid = true
	t.Change = stats.Change(s.Median, e.Median)
	t.ChangePct = stats.ChangePct(s.Median, e.Median)
	t.Slope = stats.Slope(xs, ys)
	t.ChangePerIQR = nan
	if e.N >= 2 && e.IQR > 0 {
		// As an institution's change_per_iqr: the size of the movement
		// against the last year's spread, which the noise rule reads.
		t.ChangePerIQR = math.Abs(t.Change) / e.IQR
	}
	return t
}

// spanOf walks a yearly series (n points, at(i) giving the year, the
// value and whether there is one) and returns the first and last index
// with a value (-1 when none) and the years and values that have one, for
// the least-squares slope.
func spanOf(n int, at func(i int) (year int, v float64, ok bool)) (first, last int, xs, ys []float64) {
	first, last = -1, -1
	for i := range n {
		y, v, ok := at(i)
		if !ok {
			continue
		}
		if first < 0 {
			first = i
		}
		last = i
		xs = append(xs, float64(y))
		ys = append(ys, v)
	}
	return first, last, xs, ys
}
