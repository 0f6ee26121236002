package narrative

import "peerpack/internal/figures"

// Measure names of the figures this package cites, as the figures model
// writes them (figures/rows.go). Keeping them here means a rename in the
// figures model is a change in one place.
const (
	mValue      = "value"
	mRank       = "rank"
	mOf         = "of"
	mPercentile = "percentile"
	mQuartile   = "quartile"
	mGapMedian  = "gap_median"
	mGapBetter  = "gap_better_quartile"
	mVsMedian   = "vs_median"
	mVsBetter   = "vs_better_quartile"
	mTies       = "ties"

	mN       = "n"
	mMissing = "missing"
	mMedian  = "median"
	mQ1      = "q1"
	mQ3      = "q3"
	mIQR     = "iqr"

	mChange           = "change"
	mPercentileChange = "percentile_change"
	mMedianChange     = "median_change"

	mMembers = "n_members"

	mSpearman = "spearman"
	mPearson  = "pearson"
)

// posKey names a position figure of an institution in a group.
func posKey(group, ind, inst string, year int, measure string) figures.Key {
	return figures.Key{Section: figures.SectionPosition, Group: group, Indicator: ind, Institution: inst, Year: year, Measure: measure}
}

// distKey names a distribution figure of a group.
func distKey(group, ind string, year int, measure string) figures.Key {
	return figures.Key{Section: figures.SectionDistribution, Group: group, Indicator: ind, Year: year, Measure: measure}
}

// trendKey names a trend figure of an institution (trends carry no year:
// the span's ends are figures of their own).
func trendKey(group, ind, inst, measure string) figures.Key {
	return figures.Key{Section: figures.SectionTrend, Group: group, Indicator: ind, Institution: inst, Measure: measure}
}

// groupKey names a figure of a group's definition.
func groupKey(group, measure string) figures.Key {
	return figures.Key{Section: figures.SectionGroup, Group: group, Measure: measure}
}
