package figures

import (
	"math"
	"slices"
	"sync"

	"peerpack/internal/dataset"
	"peerpack/internal/format"
	"peerpack/internal/stats"
)

// Ranks at the declared precision.
//
// Ranks, percentile ranks, quarters and every order among members (bars,
// member lists, constant-panel ranks) compare values as they are printed:
// rounded to the indicator's declared decimals by format.Round, the one
// place numbers are rounded. A quarter compares the printed value with
// the printed quartiles. Two institutions printed at 1.92 are a tie
// and share the better rank, even when the data hold 1.9234 and 1.9189:
// what is printed is what is compared (common practice, no source).
// Distributions (mean, SD, quartiles, box statistics, outliers), gaps,
// z-scores, trends' values, correlations, composite scores and peer
// clusters keep the unrounded values.

// placedValue is a value as it is placed among others: rounded to the
// indicator's declared decimals exactly as it prints.
func placedValue(ind dataset.Indicator, v float64) float64 {
	return format.Round(v, ind.Decimals)
}

// placedBox is a distribution's quartiles as printed, for placing a
// value in a quarter (stats.QuartileByValue reads N, Q1, Median and Q3);
// the distribution itself keeps its unrounded quartiles.
func placedBox(ind dataset.Indicator, b stats.Box) stats.Box {
	return stats.Box{N: b.N, Q1: placedValue(ind, b.Q1), Median: placedValue(ind, b.Median), Q3: placedValue(ind, b.Q3)}
}

// placedColumns caches, per indicator and year, the data column rounded
// to the indicator's declared decimals, so each value is rounded once
// however many groups place it. A column whose values are all already
// at the declared precision is the data column itself.
type placedColumns struct {
	mu   sync.Mutex
	cols map[placedKey]*placedColumn
}

type placedKey struct{ ind, year int }

type placedColumn struct {
	once sync.Once
	col  []float64
}

// placedColumn returns the data column of indicator k in the year with
// every value rounded to the indicator's declared decimals (NaN stays
// NaN); nil when the data have no such column. Safe for concurrent use.
func (m *Model) placedColumn(k, year int) []float64 {
	col := m.Data.Column(k, year)
	if col == nil {
		return nil
	}
	ind := m.Data.Dictionary.Indicators[k]
	if m.placed == nil {
		return roundColumn(ind, col)
	}
	m.placed.mu.Lock()
	if m.placed.cols == nil {
		m.placed.cols = map[placedKey]*placedColumn{}
	}
	pc := m.placed.cols[placedKey{k, year}]
	if pc == nil {
		pc = &placedColumn{}
		m.placed.cols[placedKey{k, year}] = pc
	}
	m.placed.mu.Unlock()
	pc.once.Do(func() { pc.col = roundColumn(ind, col) })
	return pc.col
}

// roundColumn rounds a column to the indicator's declared decimals; it
// returns col itself when no value changes.
func roundColumn(ind dataset.Indicator, col []float64) []float64 {
	var out []float64
	dec := ind.Decimals
	for i, v := range col {
		if math.IsNaN(v) {
			continue
		}
		r := format.Round(v, dec) // placedValue, without copying ind per value
		if r == v && out == nil {
			continue
		}
		if out == nil {
			out = slices.Clone(col)
		}
		out[i] = r
	}
	if out == nil {
		return col
	}
	return out
}
