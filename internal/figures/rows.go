package figures

import (
	"cmp"
	"math"
	"slices"
	"strings"
)

// Rows returns every figure of the model, one a row, sorted by section,
// group, indicator, institution id, year and measure (strings in byte
// order, the year as a number), so the figures file is stable from build
// to build. A measure that is undefined (no values, the SD of a single
// value, a gap on a neutral indicator) has no row.
func (m *Model) Rows() []Row {
	var rows []Row
	num := func(k Key, v float64) {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return
		}
		if v == 0 {
			v = 0 // no negative zero in the file
		}
		rows = append(rows, Row{Key: k, Value: v})
	}
	text := func(k Key, s string) {
		rows = append(rows, Row{Key: k, Text: s, IsText: true})
	}
	flag := func(b bool) float64 {
		if b {
			return 1
		}
		return 0
	}

	// population: who the rules left out of the ranked population.
	reg := m.Data.Register
	pk := func(inst, measure string) Key {
		return Key{Section: SectionPopulation, Institution: inst, Measure: measure}
	}
	nRanked := 0
	for i := 0; i < reg.Len(); i++ {
		if m.Data.InPopulation(i) {
			nRanked++
		}
	}
	num(pk("", "n_register"), float64(reg.Len()))
	num(pk("", "n_ranked"), float64(nRanked))
	num(pk("", "n_excluded"), float64(reg.Len()-nRanked))
	if pop := m.Data.Population; pop != nil {
		for i, rule := range pop.Rules {
			text(pk("", "rule_"+itoa(i+1)), rule)
		}
		for i := 0; i < reg.Len(); i++ {
			if !m.Data.InPopulation(i) {
				text(pk(reg.Institutions[i].ID, "excluded"), strings.Join(pop.Excluded[i], "; "))
			}
		}
	}

	// group: how each group was resolved.
	for _, g := range m.Groups {
		gk := func(inst, measure string) Key {
			return Key{Section: SectionGroup, Group: g.Name, Institution: inst, Measure: measure}
		}
		num(gk("", "n_members"), float64(len(g.Members)))
		num(gk("", "focus_in"), flag(g.FocusIn))
		text(gk("", "kind"), g.Kind)
		text(gk("", "defined"), g.Defined)
		text(gk("", "over"), g.Over)
		if g.Phrase != "" {
			text(gk("", "phrase"), g.Phrase)
		}
		if g.Spec != g.Name {
			text(gk("", "spec"), g.Spec)
		}
		if g.Kind == "each" {
			text(gk("", "each_field"), g.EachField)
			text(gk("", "each_value"), g.EachValue)
		}
		if g.Kind == "members" {
			for _, i := range g.Members {
				num(gk(m.InstitutionID(i), "member"), 1)
			}
		}
		for _, nb := range g.Nearest {
			num(gk(m.InstitutionID(nb.Institution), "distance"), nb.Distance)
		}
		for _, dr := range g.Dropped {
			text(gk(m.InstitutionID(dr.Institution), "dropped"), dr.Reason)
		}
	}

	// distribution
	text(Key{Section: SectionDistribution, Measure: "quantile_method"}, m.Method.String())
	for _, d := range m.dist {
		dk := func(measure string) Key {
			return Key{Section: SectionDistribution, Group: d.Group, Indicator: d.Indicator, Year: d.Year, Measure: measure}
		}
		num(dk("n"), float64(d.N))
		num(dk("missing"), float64(d.Missing))
		num(dk("min"), d.Min)
		num(dk("q1"), d.Q1)
		num(dk("median"), d.Median)
		num(dk("q3"), d.Q3)
		num(dk("max"), d.Max)
		num(dk("iqr"), d.IQR)
		num(dk("whisker_low"), d.WhiskerLow)
		num(dk("whisker_high"), d.WhiskerHigh)
		num(dk("mean"), d.Mean)
		num(dk("sd"), d.SD)
		num(dk("n_outliers"), float64(len(d.Outliers)))
		col := m.Data.Column(m.Data.Dictionary.Index(d.Indicator), d.Year)
		for _, i := range d.Outliers {
			k := dk("outlier")
			k.Institution = m.InstitutionID(i)
			num(k, col[i])
		}
	}

	// position
	for _, p := range m.pos {
		pk := func(measure string) Key {
			return Key{Section: SectionPosition, Group: p.Group, Indicator: p.Indicator, Institution: m.InstitutionID(p.Institution), Year: p.Year, Measure: measure}
		}
		num(pk("in_group"), flag(p.InGroup))
		if !p.HasValue {
			num(pk("has_value"), 0)
			continue
		}
		num(pk("value"), p.Value)
		if p.Rank > 0 {
			num(pk("rank"), float64(p.Rank))
			num(pk("of"), float64(p.Of))
			num(pk("percentile"), p.Percentile)
			num(pk("quartile"), float64(p.Quartile))
		}
		num(pk("z"), p.Z)
		num(pk("gap_median"), p.GapMedian)
		num(pk("gap_better_quartile"), p.GapQ3)
		num(pk("vs_median"), p.VsMedian)
		num(pk("vs_better_quartile"), p.VsBetterQuartile)
		if p.Ties > 0 {
			num(pk("ties"), float64(p.Ties))
		}
	}

	// trend
	for _, t := range m.trend {
		tk := func(measure string) Key {
			return Key{Section: SectionTrend, Group: t.Group, Indicator: t.Indicator, Institution: m.InstitutionID(t.Institution), Measure: measure}
		}
		if t.StartYear == 0 {
			num(tk("valid"), 0)
			continue
		}
		num(tk("valid"), flag(t.Valid))
		num(tk("start_year"), float64(t.StartYear))
		num(tk("start_value"), t.StartValue)
		num(tk("end_year"), float64(t.EndYear))
		num(tk("end_value"), t.EndValue)
		num(tk("start_of"), float64(t.StartOf))
		num(tk("end_of"), float64(t.EndOf))
		if !t.Valid {
			continue
		}
		num(tk("change"), t.Change)
		num(tk("change_pct"), t.ChangePct)
		num(tk("cagr"), t.CAGR)
		num(tk("slope"), t.Slope)
		if !math.IsNaN(t.PercentileChange) {
			num(tk("rank_change"), float64(t.RankChange))
			num(tk("percentile_change"), t.PercentileChange)
		}
		num(tk("median_change"), t.MedianChange)
		num(tk("prefer_percentiles"), flag(t.PreferPercentiles))
	}
	for _, t := range m.gtrend {
		tk := func(measure string) Key {
			return Key{Section: SectionTrend, Group: t.Group, Indicator: t.Indicator, Measure: measure}
		}
		if t.StartYear == 0 {
			continue
		}
		num(tk("median_start_year"), float64(t.StartYear))
		num(tk("median_end_year"), float64(t.EndYear))
		num(tk("median_start"), t.MedianStart)
		num(tk("median_end"), t.MedianEnd)
		num(tk("start_n"), float64(t.StartN))
		num(tk("end_n"), float64(t.EndN))
		if t.Valid {
			num(tk("median_change"), t.Change)
			num(tk("median_change_pct"), t.ChangePct)
			num(tk("median_slope"), t.Slope)
		}
	}

	// correlation
	for _, c := range m.Correlations {
		ck := func(measure string) Key {
			return Key{Section: SectionCorrelation, Group: c.Group, Indicator: PairKey(c.IndicatorX, c.IndicatorY), Year: c.Year, Measure: measure}
		}
		num(ck("n"), float64(c.N))
		num(ck("pearson"), c.Pearson)
		num(ck("spearman"), c.Spearman)
	}

	rows = m.peersRows(rows)
	rows = append(rows, m.extra...)
	// Sort an index rather than the rows (large structs), with the input
	// position as the last tie-break, so equal keys keep their order.
	idx := make([]int32, len(rows))
	for i := range idx {
		idx[i] = int32(i)
	}
	slices.SortFunc(idx, func(a, b int32) int {
		return cmp.Or(compareKeys(rows[a].Key, rows[b].Key), cmp.Compare(a, b))
	})
	out := make([]Row, len(rows))
	for i, j := range idx {
		out[i] = rows[j]
	}
	return out
}

// PairKey is the indicator column of a correlation row: the two keys in
// dictionary order joined by "~".
func PairKey(x, y string) string { return x + "~" + y }

func compareKeys(a, b Key) int {
	return cmp.Or(
		strings.Compare(a.Section, b.Section),
		strings.Compare(a.Group, b.Group),
		strings.Compare(a.Indicator, b.Indicator),
		strings.Compare(a.Institution, b.Institution),
		cmp.Compare(a.Year, b.Year),
		strings.Compare(a.Measure, b.Measure),
	)
}

// Lookup returns the row with the key, for commentary traceability checks
// ("every cited key exists"). The index is built on first use and kept up
// to date by Add.
func (m *Model) Lookup(k Key) (Row, bool) {
	if m.index == nil {
		rows := m.Rows()
		m.index = make(map[Key]Row, len(rows))
		for _, r := range rows {
			m.index[r.Key] = r
		}
	}
	r, ok := m.index[k]
	return r, ok
}
