package figures

import (
	"math"
	"slices"

	"peerpack/internal/dataset"
	"peerpack/internal/stats"
)

// Figures that the commentary's rules need beyond the positions and
// trends, added to the model as rows (Add) so the figures file, Lookup and
// the claims all read the same numbers:
//
//   - rank targets, for the focus in a distribution below the
//     small-group floor in the brief year, where no quartile is a fair
//     target: position measures target_rank (TargetRank(of), the last
//     place of the best quarter of places, rounded up, at least 1),
//     target_rank_value (the value that would reach it: the target_rank-th
//     best value among the other members) and target_rank_gap (the amount
//     still to gain, positive, by polarity). Written only for judged
//     indicators and only while the institution ranks below the target.
//   - largest single steps of the focus's trends over at least three years with a
//     value: trend measures largest_step (the year-to-year change, between
//     consecutive years with a value, that went furthest in the direction
//     of the whole change), largest_step_year (the later year of that
//     step) and largest_step_share (the step over the whole change, so
//     "most of it in one year" can be claimed figure against a number);
//     the same for the percentile as largest_percentile_step,
//     largest_percentile_step_year and largest_percentile_step_share.
//     None when the whole change is zero.
const (
	MeasureTargetRank      = "target_rank"
	MeasureTargetRankValue = "target_rank_value"
	MeasureTargetRankGap   = "target_rank_gap"

	MeasureLargestStep           = "largest_step"
	MeasureLargestStepYear       = "largest_step_year"
	MeasureLargestStepShare      = "largest_step_share"
	MeasureLargestPctStep        = "largest_percentile_step"
	MeasureLargestPctStepYear    = "largest_percentile_step_year"
	MeasureLargestPctStepShare   = "largest_percentile_step_share"
	minStepPoints                = 3
	targetRankQuarterDenominator = 4
)

// TargetRank is the place a small group's rank target aims at: the last
// place of the best quarter of places, rounded up (2nd of 8, 2nd of 5,
// 1st of 3), at least 1.
func TargetRank(of int) int {
	return max(1, (of+targetRankQuarterDenominator-1)/targetRankQuarterDenominator)
}

// addRuleFigures computes the rank targets and the largest steps of the
// focus (the institution the commentary speaks of; the other tracked
// institutions would only lengthen the figures file) and adds them to the
// model's rows.
func (m *Model) addRuleFigures() {
	if m.Focus < 0 || m.Focus >= m.Data.Register.Len() {
		return
	}
	var rows []Row
	for _, g := range m.Groups {
		for _, ind := range m.Data.Dictionary.Indicators {
			rows = m.rankTargetRows(rows, g, ind, m.Focus)
			if t, ok := m.trend[trendKey{g.Name, ind.Key, m.Focus}]; ok {
				rows = m.stepRows(rows, t)
			}
		}
	}
	m.Add(rows...)
}

// rankTargetRows appends an institution's rank target in a group below
// the floor, in the brief year.
func (m *Model) rankTargetRows(rows []Row, g *Group, ind dataset.Indicator, inst int) []Row {
	if ind.Better == dataset.Neutral {
		return rows
	}
	d, okd := m.dist[distKey{g.Name, ind.Key, m.Year}]
	p, okp := m.pos[posKey{g.Name, ind.Key, inst, m.Year}]
	if !okd || !okp || !m.BelowFloor(d) || !p.HasValue || p.Rank == 0 {
		return rows
	}
	target := TargetRank(p.Of)
	if p.Rank <= target {
		return rows
	}
	insts, values := m.Members(g.Name, ind.Key, m.Year)
	var others []float64
	for i, v := range values {
		if insts[i] != inst {
			others = append(others, v)
		}
	}
	if len(others) < target {
		return rows
	}
	slices.Sort(others)
	if RankDirection(ind.Better) == stats.HigherFirst {
		slices.Reverse(others)
	}
	v := others[target-1]
	gap := v - p.Value
	if ind.Better == dataset.LowerIsBetter {
		gap = p.Value - v
	}
	if !(gap > 0) {
		return rows
	}
	k := func(measure string) Key {
		return Key{Section: SectionPosition, Group: g.Name, Indicator: ind.Key, Institution: m.InstitutionID(inst), Year: m.Year, Measure: measure}
	}
	return append(rows, Row{Key: k(MeasureTargetRank), Value: float64(target)},
		Row{Key: k(MeasureTargetRankGap), Value: gap}, Row{Key: k(MeasureTargetRankValue), Value: v})
}

// stepRows appends the largest single steps of a trend, in value and in
// percentile.
func (m *Model) stepRows(rows []Row, t *Trend) []Row {
	if !t.Valid || t.Points < minStepPoints {
		return rows
	}
	var years []int
	var vals, pcts []float64
	for _, p := range m.PositionSeries(t.Group, t.Indicator, t.Institution) {
		if p.Year < t.StartYear || p.Year > t.EndYear || !p.HasValue {
			continue
		}
		years = append(years, p.Year)
		vals = append(vals, p.Value)
		pct := math.NaN()
		if p.Rank > 0 {
			pct = p.Percentile
		}
		pcts = append(pcts, pct)
	}
	k := func(measure string) Key {
		return Key{Section: SectionTrend, Group: t.Group, Indicator: t.Indicator, Institution: m.InstitutionID(t.Institution), Measure: measure}
	}
	if step, year, share, ok := LargestStep(years, vals); ok {
		rows = append(rows, Row{Key: k(MeasureLargestStep), Value: step}, Row{Key: k(MeasureLargestStepShare), Value: share},
			Row{Key: k(MeasureLargestStepYear), Value: float64(year)})
	}
	if step, year, share, ok := LargestStep(years, pcts); ok {
		rows = append(rows, Row{Key: k(MeasureLargestPctStep), Value: step}, Row{Key: k(MeasureLargestPctStepShare), Value: share},
			Row{Key: k(MeasureLargestPctStepYear), Value: float64(year)})
	}
	return rows
}

// LargestStep finds, in a series of at least three values (oldest first),
// the step between consecutive values that went furthest in the direction
// of the whole change (last - first): the step, the year it ends in and
// its share of the whole change (above 1 when later steps took some of it
// back). ok is false with fewer than three values, a missing value, or no
// whole change. Ties go to the earlier step.
func LargestStep(years []int, vals []float64) (step float64, year int, share float64, ok bool) {
	n := len(vals)
	if n < minStepPoints || len(years) != n {
		return 0, 0, 0, false
	}
	for _, v := range vals {
		if math.IsNaN(v) {
			return 0, 0, 0, false
		}
	}
	whole := vals[n-1] - vals[0]
	if whole == 0 || math.IsNaN(whole) || math.IsInf(whole, 0) {
		return 0, 0, 0, false
	}
	sign := 1.0
	if whole < 0 {
		sign = -1
	}
	best := math.Inf(-1)
	for i := 1; i < n; i++ {
		d := vals[i] - vals[i-1]
		if sign*d > best {
			best, step, year = sign*d, d, years[i]
		}
	}
	return step, year, step / whole, true
}
