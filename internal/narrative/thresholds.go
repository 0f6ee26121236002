package narrative

import "peerpack/internal/brief"

// The rules that decide when a caveat is written or a change is called
// "broadly unchanged". They are printed in the pack where they apply, so a
// reader can see the rule behind the words.
const (
	// SmallGroup: a group with fewer members reporting an indicator than
	// this gets a small-group caveat; quartiles of fewer than ten values
	// move a lot when one member changes (common practice, no source).
	// It is the default of the brief's small_group setting, the floor below
	// which quarters and percentiles are not printed.
	SmallGroup = brief.DefaultSmallGroup
	// MinCoverage: a group where fewer than this percentage of members
	// report an indicator gets a coverage caveat (common practice, no
	// source).
	MinCoverage = 70.0
	// NoiseIQRShare: a change whose size is below this share of the
	// group's interquartile range in the last year is "broadly
	// unchanged", as is any change that rounds to zero at the indicator's
	// declared decimals (below half a unit of the last decimal). Moves of a
	// twentieth of the spread between institutions are within what
	// revisions and reporting practice shift from year to year (common
	// practice, no source).
	NoiseIQRShare = 0.05
	// PercentileNoise: a percentile rank that moved by fewer than this
	// many points between the two ends of a span is not called gaining or
	// losing ground; in a group of a hundred that is four or five places,
	// which a revision or one institution entering can shift (common
	// practice, no source). Both percentiles are still printed.
	// It is the default of the brief's noise setting.
	PercentileNoise = brief.DefaultNoise
	// When the number of members reporting changed between the two ends
	// of a span, changes are stated in percentiles by the figures model's
	// own rule (figures.SizeChanged), so tables and sentences agree.
	// SummaryItems is how many strengths and risks the executive summary
	// names.
	SummaryItems = 3
	// OverviewItems caps the indicators an overview lists for each of the
	// top and bottom quarters; the most extreme come first.
	OverviewItems = 4
)
