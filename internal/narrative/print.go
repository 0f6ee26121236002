package narrative

import (
	"math"
	"strconv"

	"peerpack/internal/dataset"
	"peerpack/internal/format"
)

// Every number a sentence prints goes through these helpers, which only
// call package format: the digits match the tables'.

func printValue(ind dataset.Indicator, v float64) string { return format.Value(ind, v) }

func printAmount(ind dataset.Indicator, d float64) string { return format.Difference(ind, d) }

func printOrdinalPct(p float64) string { return format.Ordinal(format.PercentileRank(p)) }

func printCount(n int) string { return format.Int(n) }

// Years print without a thousands separator.
func printYear(y int) string { return strconv.Itoa(y) }

// printedCompare compares two values as printed with the indicator's
// decimals: Level when they print the same, so no sentence says "above"
// of a value that reads equal.
func printedCompare(ind dataset.Indicator, a, b float64) int {
	ra, rb := format.Round(a, ind.Decimals), format.Round(b, ind.Decimals)
	switch {
	case ra > rb:
		return Above
	case ra < rb:
		return Below
	}
	return Level
}

// gapAgrees reports whether a distance between two printed values prints
// the same as the difference of their printed forms. When it does not
// (45.24 vs 42.16 print 45.2 and 42.2, but the gap 3.08 prints 3.1), the
// sentence leaves the distance out rather than contradict the reader's
// own subtraction.
func gapAgrees(ind dataset.Indicator, a, b, gap float64) bool {
	d := format.Round(a, ind.Decimals) - format.Round(b, ind.Decimals)
	return printAmount(ind, d) == printAmount(ind, gap)
}

// withinNoise reports whether a change is smaller than the data carries:
// it rounds to zero at the indicator's declared decimals (below half a
// unit of the last decimal), or it is below NoiseIQRShare of the group's
// interquartile range.
func withinNoise(ind dataset.Indicator, change, iqr float64) bool {
	if format.Round(change, ind.Decimals) == 0 {
		return true
	}
	// Divided as the figures model's change_per_iqr is, so the claim
	// recorded compares the very number decided on.
	return !math.IsNaN(iqr) && iqr > 0 && math.Abs(change)/iqr < NoiseIQRShare
}

// direction of a change: Above (up), Below (down) or Level (noise).
func direction(ind dataset.Indicator, change, iqr float64) int {
	switch {
	case withinNoise(ind, change, iqr):
		return Level
	case change > 0:
		return Above
	}
	return Below
}

// judged reports whether an indicator has a better direction.
func judged(ind dataset.Indicator) bool { return ind.Better != dataset.Neutral && ind.Better != "" }

// ahead reports whether value a is better than b as printed.
func ahead(ind dataset.Indicator, a, b float64) bool {
	cmp := printedCompare(ind, a, b)
	if ind.Better == dataset.LowerIsBetter {
		return cmp == Below
	}
	return cmp == Above
}
