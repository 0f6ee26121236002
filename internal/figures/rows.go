package figures

import (
	"cmp"
	"iter"
	"math"
	"slices"
	"strings"
)

// The figures file is the model written out one row per figure, sorted by
// section, group, indicator, institution id, year (as a number) and
// measure (strings in byte order). This file holds the one definition of
// which rows an entity of the model (a distribution, a position, a trend,
// ...) has, used twice: Rows streams them in key order to the writers, and
// Lookup finds one row by its key from the typed maps, in constant time,
// without producing any other.
//
// Each emitter below yields its entity's rows with the measures already in
// byte order (the order is written out by hand and checked by
// TestRowsInKeyOrder), so ordering the file only needs the entities sorted,
// and those sort on small integers: the rank of the group name, of the
// indicator key and of the institution id, each ranked once.

// rowSink receives rows; returning false stops the producer.
type rowSink func(Row) bool

// emitNum yields a numeric row, or nothing when the value is undefined (NaN or
// infinite); a negative zero is written as zero.
func emitNum(f rowSink, k Key, v float64) bool {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return true
	}
	if v == 0 {
		v = 0 // no negative zero in the file
	}
	return f(Row{Key: k, Value: v})
}

func emitText(f rowSink, k Key, s string) bool {
	return f(Row{Key: k, Text: s, IsText: true})
}

func oneIf(b bool) float64 {
	if b {
		return 1
	}
	return 0
}

// populationRows yields the population section's rows without an
// institution: counts and the rules' texts.
func (m *Model) populationRows(f rowSink) bool {
	reg := m.Data.Register
	pk := func(measure string) Key { return Key{Section: SectionPopulation, Measure: measure} }
	nRanked := 0
	for i := 0; i < reg.Len(); i++ {
		if m.Data.InPopulation(i) {
			nRanked++
		}
	}
	pop := m.Data.Population
	if pop != nil {
		// Who is ranked in the span's earlier years: the rules as of each
		// year (rolling) or the reporting year's population (fixed).
		mode := "rolling"
		if pop.Fixed {
			mode = "fixed"
		}
		if !emitText(f, pk("earlier_years"), mode) {
			return false
		}
	}
	ok := emitNum(f, pk("n_excluded"), float64(reg.Len()-nRanked)) &&
		emitNum(f, pk("n_ranked"), float64(nRanked)) &&
		emitNum(f, pk("n_register"), float64(reg.Len()))
	if !ok {
		return false
	}
	if pop != nil {
		// rule_1, rule_10, rule_11, rule_2, ...: byte order.
		names := make([]string, len(pop.Rules))
		for i := range pop.Rules {
			names[i] = "rule_" + itoa(i+1)
		}
		idx := make([]int, len(names))
		for i := range idx {
			idx[i] = i
		}
		slices.SortFunc(idx, func(a, b int) int { return strings.Compare(names[a], names[b]) })
		for _, i := range idx {
			if !emitText(f, pk(names[i]), pop.Rules[i]) {
				return false
			}
		}
	}
	return m.populationYearRows(f)
}

// excludedRow yields why institution inst is outside the ranked
// population; nothing when it is inside.
func (m *Model) excludedRow(f rowSink, inst int) bool {
	pop := m.Data.Population
	if pop == nil || m.Data.InPopulation(inst) {
		return true
	}
	k := Key{Section: SectionPopulation, Institution: m.InstitutionID(inst), Measure: "excluded"}
	return emitText(f, k, strings.Join(pop.Excluded[inst], "; "))
}

// groupRows yields how a group was resolved (rows without an institution).
func (m *Model) groupRows(f rowSink, g *Group) bool {
	gk := func(measure string) Key { return Key{Section: SectionGroup, Group: g.Name, Measure: measure} }
	if !emitText(f, gk("defined"), g.Defined) {
		return false
	}
	if g.Kind == "each" {
		if !emitText(f, gk("each_field"), g.EachField) || !emitText(f, gk("each_value"), g.EachValue) {
			return false
		}
	}
	if !emitNum(f, gk("focus_in"), oneIf(g.FocusIn)) || !emitText(f, gk("kind"), g.Kind) ||
		!emitNum(f, gk("n_members"), float64(len(g.Members))) || !emitText(f, gk("over"), g.Over) {
		return false
	}
	if g.Phrase != "" && !emitText(f, gk("phrase"), g.Phrase) {
		return false
	}
	if g.Spec != g.Name && !emitText(f, gk("spec"), g.Spec) {
		return false
	}
	return m.groupYearRows(f, g)
}

// groupMember is one per-institution row of a group: a listed member, a
// nearest peer's distance or a dropped listing. Measures in byte order:
// distance < dropped < member.
type groupMember struct {
	rank    int32 // institution id rank
	measure int8  // 0 distance, 1 dropped, 2 member
	inst    int
	value   float64
	text    string
}

var groupMemberMeasures = [...]string{"distance", "dropped", "member"}

func (m *Model) groupMemberRow(f rowSink, g *Group, e groupMember) bool {
	k := Key{Section: SectionGroup, Group: g.Name, Institution: m.InstitutionID(e.inst), Measure: groupMemberMeasures[e.measure]}
	if e.measure == 1 {
		return emitText(f, k, e.text)
	}
	return emitNum(f, k, e.value)
}

// groupMembers lists a group's per-institution rows in the order the
// model holds them (listed members, then nearest peers, then dropped).
func (g *Group) groupMembers(buf []groupMember) []groupMember {
	if g.Kind == "members" {
		for _, i := range g.Members {
			buf = append(buf, groupMember{measure: 2, inst: i, value: 1})
		}
	}
	for _, nb := range g.Nearest {
		buf = append(buf, groupMember{measure: 0, inst: nb.Institution, value: nb.Distance})
	}
	for _, dr := range g.Dropped {
		buf = append(buf, groupMember{measure: 1, inst: dr.Institution, text: dr.Reason})
	}
	return buf
}

func quantileMethodKey() Key {
	return Key{Section: SectionDistribution, Measure: "quantile_method"}
}

// distributionRows yields a distribution's rows without an institution;
// below_floor (1 when fewer values than the small-group floor) is written
// for distributions with at least one value.
func distributionRows(f rowSink, d *Distribution, floor int) bool {
	dk := func(measure string) Key {
		return Key{Section: SectionDistribution, Group: d.Group, Indicator: d.Indicator, Year: d.Year, Measure: measure}
	}
	if d.N > 0 && !emitNum(f, dk("below_floor"), oneIf(d.N < floor)) {
		return false
	}
	return emitNum(f, dk("iqr"), d.IQR) &&
		emitNum(f, dk("max"), d.Max) &&
		emitNum(f, dk("mean"), d.Mean) &&
		emitNum(f, dk("median"), d.Median) &&
		emitNum(f, dk("min"), d.Min) &&
		emitNum(f, dk("missing"), float64(d.Missing)) &&
		emitNum(f, dk("n"), float64(d.N)) &&
		emitNum(f, dk("n_outliers"), float64(len(d.Outliers))) &&
		emitNum(f, dk("q1"), d.Q1) &&
		emitNum(f, dk("q3"), d.Q3) &&
		emitNum(f, dk("sd"), d.SD) &&
		emitNum(f, dk("skewness"), d.Skewness) &&
		emitNum(f, dk("whisker_high"), d.WhiskerHigh) &&
		emitNum(f, dk("whisker_low"), d.WhiskerLow)
}

// outlierRow yields one outlier of a distribution: its value.
func (m *Model) outlierRow(f rowSink, d *Distribution, inst int) bool {
	col := m.Data.Column(m.Data.Dictionary.Index(d.Indicator), d.Year)
	return m.outlierValueRow(f, d, inst, col[inst])
}

// outlierValueRow is outlierRow with the value already read.
func (m *Model) outlierValueRow(f rowSink, d *Distribution, inst int, v float64) bool {
	k := Key{Section: SectionDistribution, Group: d.Group, Indicator: d.Indicator, Institution: m.InstitutionID(inst), Year: d.Year, Measure: "outlier"}
	return emitNum(f, k, v)
}

// positionRows yields a position's rows.
func (m *Model) positionRows(f rowSink, p *Position) bool {
	id := m.InstitutionID(p.Institution)
	pk := func(measure string) Key {
		return Key{Section: SectionPosition, Group: p.Group, Indicator: p.Indicator, Institution: id, Year: p.Year, Measure: measure}
	}
	if !p.HasValue {
		return emitNum(f, pk("has_value"), 0) && emitNum(f, pk("in_group"), oneIf(p.InGroup))
	}
	if !emitNum(f, pk("gap_better_quartile"), p.GapQ3) || !emitNum(f, pk("gap_median"), p.GapMedian) ||
		!emitNum(f, pk("in_group"), oneIf(p.InGroup)) {
		return false
	}
	if p.Rank > 0 {
		if !emitNum(f, pk("of"), float64(p.Of)) || !emitNum(f, pk("percentile"), p.Percentile) ||
			!emitNum(f, pk("quartile"), float64(p.Quartile)) || !emitNum(f, pk("rank"), float64(p.Rank)) {
			return false
		}
	}
	if p.Ties > 0 && !emitNum(f, pk("ties"), float64(p.Ties)) {
		return false
	}
	return emitNum(f, pk("value"), p.Value) &&
		emitNum(f, pk("vs_better_quartile"), p.VsBetterQuartile) &&
		emitNum(f, pk("vs_median"), p.VsMedian) &&
		emitNum(f, pk("z"), p.Z)
}

// trendRows yields an institution's trend rows.
func (m *Model) trendRows(f rowSink, t *Trend) bool {
	id := m.InstitutionID(t.Institution)
	tk := func(measure string) Key {
		return Key{Section: SectionTrend, Group: t.Group, Indicator: t.Indicator, Institution: id, Measure: measure}
	}
	if t.StartYear == 0 {
		return emitNum(f, tk("valid"), 0)
	}
	if t.Valid {
		if !emitNum(f, tk("cagr"), t.CAGR) || !emitNum(f, tk("change"), t.Change) || !emitNum(f, tk("change_pct"), t.ChangePct) ||
			!emitNum(f, tk("change_per_iqr"), t.ChangePerIQR) {
			return false
		}
	}
	if !emitNum(f, tk("end_of"), float64(t.EndOf)) || !emitNum(f, tk("end_value"), t.EndValue) ||
		!emitNum(f, tk("end_year"), float64(t.EndYear)) {
		return false
	}
	ranks := !math.IsNaN(t.PercentileChange)
	if t.Valid {
		if !emitNum(f, tk("median_change"), t.MedianChange) {
			return false
		}
		if t.PanelOf > 0 && (!emitNum(f, tk("panel_end_rank"), float64(t.PanelEndRank)) || !emitNum(f, tk("panel_of"), float64(t.PanelOf)) ||
			!emitNum(f, tk("panel_rank_change"), float64(t.PanelRankChange)) || !emitNum(f, tk("panel_start_rank"), float64(t.PanelStartRank))) {
			return false
		}
		if ranks && (!emitNum(f, tk("percentile_change"), t.PercentileChange) || !emitNum(f, tk("percentile_move"), t.PercentileMove)) {
			return false
		}
		if !emitNum(f, tk("points"), float64(t.Points)) {
			return false
		}
		if !emitNum(f, tk("prefer_percentiles"), oneIf(t.PreferPercentiles)) {
			return false
		}
		if ranks && !emitNum(f, tk("rank_change"), float64(t.RankChange)) {
			return false
		}
		if !emitNum(f, tk("slope"), t.Slope) {
			return false
		}
	}
	return emitNum(f, tk("start_of"), float64(t.StartOf)) &&
		emitNum(f, tk("start_value"), t.StartValue) &&
		emitNum(f, tk("start_year"), float64(t.StartYear)) &&
		emitNum(f, tk("valid"), oneIf(t.Valid))
}

// groupTrendRows yields the movement of a group's median.
func groupTrendRows(f rowSink, t *GroupTrend) bool {
	tk := func(measure string) Key {
		return Key{Section: SectionTrend, Group: t.Group, Indicator: t.Indicator, Measure: measure}
	}
	if t.StartYear == 0 {
		return true
	}
	if !emitNum(f, tk("end_n"), float64(t.EndN)) {
		return false
	}
	if t.Valid {
		if !emitNum(f, tk("median_change"), t.Change) || !emitNum(f, tk("median_change_pct"), t.ChangePct) {
			return false
		}
		if !math.IsNaN(t.ChangePerIQR) && !emitNum(f, tk("median_change_per_iqr"), t.ChangePerIQR) {
			return false
		}
	}
	if !emitNum(f, tk("median_end"), t.MedianEnd) || !emitNum(f, tk("median_end_year"), float64(t.EndYear)) {
		return false
	}
	if t.Valid && !emitNum(f, tk("median_slope"), t.Slope) {
		return false
	}
	return emitNum(f, tk("median_start"), t.MedianStart) &&
		emitNum(f, tk("median_start_year"), float64(t.StartYear)) &&
		emitNum(f, tk("start_n"), float64(t.StartN))
}

// correlationRows yields one pair's correlation over a group.
func correlationRows(f rowSink, c *Correlation) bool {
	ck := func(measure string) Key {
		return Key{Section: SectionCorrelation, Group: c.Group, Indicator: PairKey(c.IndicatorX, c.IndicatorY), Year: c.Year, Measure: measure}
	}
	return emitNum(f, ck("n"), float64(c.N)) && emitNum(f, ck("pearson"), c.Pearson) && emitNum(f, ck("spearman"), c.Spearman)
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

// ranks maps names to their place in byte order, so entities sort on
// integers: group names, indicator keys and institution ids (by register
// position; 0 stands for "no institution", which sorts first).
type ranks struct {
	group map[string]int32
	ind   map[string]int32
	inst  []int32 // register position -> 1 + rank of its id
	byID  []int32 // register positions in id order
}

func (m *Model) ranks() *ranks {
	r := &ranks{group: make(map[string]int32, len(m.Groups))}
	names := make([]string, len(m.Groups))
	for i, g := range m.Groups {
		names[i] = g.Name
	}
	slices.Sort(names)
	for i, s := range names {
		r.group[s] = int32(i)
	}
	keys := m.Data.Dictionary.Keys()
	slices.Sort(keys)
	r.ind = make(map[string]int32, len(keys))
	for i, s := range keys {
		r.ind[s] = int32(i)
	}
	insts := m.Data.Register.Institutions
	r.byID = make([]int32, len(insts))
	for i := range r.byID {
		r.byID[i] = int32(i)
	}
	slices.SortFunc(r.byID, func(a, b int32) int { return strings.Compare(insts[a].ID, insts[b].ID) })
	r.inst = make([]int32, len(insts))
	for rank, i := range r.byID {
		r.inst[i] = int32(rank + 1)
	}
	return r
}

// Rows yields every figure of the model, one a row, in key order: section,
// group, indicator, institution id, year (as a number), measure (strings
// in byte order), so the figures file is stable from build to build. A
// measure that is undefined (no values, the SD of a single value, a gap on
// a neutral indicator) has no row. Rows are produced as they are written:
// the writers (figures file, workbook) never hold the whole set. Readers
// look figures up with Lookup or the typed accessors instead.
//
// Rows added with Add are merged in at their place; a row with the same
// key as a computed one comes after it.
func (m *Model) Rows() iter.Seq[Row] {
	return func(yield func(Row) bool) {
		extra := m.sortedExtra()
		e := 0
		emit := func(r Row) bool {
			for e < len(extra) && compareKeys(extra[e].Key, r.Key) < 0 {
				if !yield(extra[e]) {
					return false
				}
				e++
			}
			return yield(r)
		}
		if !m.streamComputed(emit) {
			return
		}
		for ; e < len(extra); e++ {
			if !yield(extra[e]) {
				return
			}
		}
	}
}

// sortedExtra returns the rows added through Add in key order, equal keys
// in the order they were added.
func (m *Model) sortedExtra() []Row {
	out := slices.Clone(m.extra)
	slices.SortStableFunc(out, func(a, b Row) int { return compareKeys(a.Key, b.Key) })
	return out
}

// streamComputed yields the computed sections in key order: correlation,
// distribution, group, population, position, trend.
func (m *Model) streamComputed(f rowSink) bool {
	r := m.ranks()
	return m.streamCorrelations(f, r) &&
		m.streamDistributions(f, r) &&
		m.streamGroups(f, r) &&
		m.streamPopulation(f, r) &&
		m.streamPositions(f, r) &&
		m.streamTrends(f, r)
}

func (m *Model) streamCorrelations(f rowSink, r *ranks) bool {
	type entry struct {
		group int32
		pair  string
		year  int
		c     *Correlation
	}
	es := make([]entry, len(m.Correlations))
	for i := range m.Correlations {
		c := &m.Correlations[i]
		es[i] = entry{r.group[c.Group], PairKey(c.IndicatorX, c.IndicatorY), c.Year, c}
	}
	slices.SortStableFunc(es, func(a, b entry) int {
		return cmp.Or(cmp.Compare(a.group, b.group), strings.Compare(a.pair, b.pair), cmp.Compare(a.year, b.year))
	})
	for _, e := range es {
		if !correlationRows(f, e.c) {
			return false
		}
	}
	return true
}

func (m *Model) streamDistributions(f rowSink, r *ranks) bool {
	if !emitText(f, quantileMethodKey(), m.Method.String()) {
		return false
	}
	type entry struct {
		group, ind int32
		year       int
		d          *Distribution
	}
	es := make([]entry, 0, len(m.dist))
	for _, d := range m.dist {
		es = append(es, entry{r.group[d.Group], r.ind[d.Indicator], d.Year, d})
	}
	slices.SortFunc(es, func(a, b entry) int {
		return cmp.Or(cmp.Compare(a.group, b.group), cmp.Compare(a.ind, b.ind), cmp.Compare(a.year, b.year))
	})
	type outlier struct {
		rank int32
		year int
		inst int
		v    float64
		d    *Distribution
	}
	var outs []outlier
	for lo := 0; lo < len(es); {
		hi := lo
		outs = outs[:0]
		// One (group, indicator): every year without an institution first,
		// then the outliers by institution id and year.
		for ; hi < len(es) && es[hi].group == es[lo].group && es[hi].ind == es[lo].ind; hi++ {
			d := es[hi].d
			if !distributionRows(f, d, m.Floor) {
				return false
			}
			if len(d.Outliers) > 0 {
				col := m.Data.Column(m.Data.Dictionary.Index(d.Indicator), d.Year)
				for _, i := range d.Outliers {
					outs = append(outs, outlier{r.inst[i], d.Year, i, col[i], d})
				}
			}
		}
		// (rank, year) is unique within one (group, indicator): an
		// institution is an outlier of a year's distribution once. So an
		// unstable sort gives the one order.
		slices.SortFunc(outs, func(a, b outlier) int {
			return cmp.Or(cmp.Compare(a.rank, b.rank), cmp.Compare(a.year, b.year))
		})
		for _, o := range outs {
			if !m.outlierValueRow(f, o.d, o.inst, o.v) {
				return false
			}
		}
		lo = hi
	}
	return true
}

func (m *Model) streamGroups(f rowSink, r *ranks) bool {
	gs := slices.Clone(m.Groups)
	slices.SortStableFunc(gs, func(a, b *Group) int { return cmp.Compare(r.group[a.Name], r.group[b.Name]) })
	var buf []groupMember
	for _, g := range gs {
		if !m.groupRows(f, g) {
			return false
		}
		buf = g.groupMembers(buf[:0])
		for i := range buf {
			buf[i].rank = r.inst[buf[i].inst]
		}
		slices.SortStableFunc(buf, func(a, b groupMember) int {
			return cmp.Or(cmp.Compare(a.rank, b.rank), cmp.Compare(a.measure, b.measure))
		})
		for _, e := range buf {
			if !m.groupMemberRow(f, g, e) {
				return false
			}
		}
	}
	return true
}

func (m *Model) streamPopulation(f rowSink, r *ranks) bool {
	if !m.populationRows(f) {
		return false
	}
	for _, i := range r.byID {
		if !m.excludedRow(f, int(i)) {
			return false
		}
	}
	return true
}

func (m *Model) streamPositions(f rowSink, r *ranks) bool {
	type entry struct {
		group, ind, inst int32
		year             int
		p                *Position
	}
	es := make([]entry, 0, len(m.pos))
	for _, p := range m.pos {
		es = append(es, entry{r.group[p.Group], r.ind[p.Indicator], r.inst[p.Institution], p.Year, p})
	}
	slices.SortFunc(es, func(a, b entry) int {
		return cmp.Or(cmp.Compare(a.group, b.group), cmp.Compare(a.ind, b.ind), cmp.Compare(a.inst, b.inst), cmp.Compare(a.year, b.year))
	})
	for _, e := range es {
		if !m.positionRows(f, e.p) {
			return false
		}
	}
	return true
}

func (m *Model) streamTrends(f rowSink, r *ranks) bool {
	type entry struct {
		group, ind, inst int32 // inst 0: the group's median
		t                *Trend
		g                *GroupTrend
	}
	es := make([]entry, 0, len(m.trend)+len(m.gtrend))
	for _, t := range m.trend {
		es = append(es, entry{r.group[t.Group], r.ind[t.Indicator], r.inst[t.Institution], t, nil})
	}
	for _, t := range m.gtrend {
		es = append(es, entry{r.group[t.Group], r.ind[t.Indicator], 0, nil, t})
	}
	slices.SortFunc(es, func(a, b entry) int {
		return cmp.Or(cmp.Compare(a.group, b.group), cmp.Compare(a.ind, b.ind), cmp.Compare(a.inst, b.inst))
	})
	for _, e := range es {
		var ok bool
		if e.g != nil {
			ok = groupTrendRows(f, e.g)
		} else {
			ok = m.trendRows(f, e.t)
		}
		if !ok {
			return false
		}
	}
	return true
}

// Lookup returns the row with the key: for the commentary's traceability
// checks ("every cited key exists") and anyone who reads a figure by its
// key. It goes straight to the entity the key names (a map access and at
// most a few dozen candidate rows), so it costs the same whatever the size
// of the model, and, as it changes nothing, it is safe to call from many
// goroutines as long as none calls Add.
func (m *Model) Lookup(k Key) (Row, bool) {
	if i, ok := m.extraIndex[k]; ok {
		return m.extra[i], true
	}
	var found Row
	ok := false
	f := func(r Row) bool {
		if r.Key == k {
			found, ok = r, true
			return false
		}
		return true
	}
	reg := m.Data.Register
	inst := -1
	if k.Institution != "" {
		if inst = reg.Index(k.Institution); inst < 0 {
			return Row{}, false
		}
	}
	switch k.Section {
	case SectionPopulation:
		if inst < 0 {
			m.populationRows(f)
		} else {
			m.excludedRow(f, inst)
		}
	case SectionGroup:
		g, has := m.Group(k.Group)
		if !has {
			break
		}
		if inst < 0 {
			m.groupRows(f, g)
			break
		}
		switch k.Measure {
		case "member":
			if g.Kind == "members" && g.Has(inst) {
				m.groupMemberRow(f, g, groupMember{measure: 2, inst: inst, value: 1})
			}
		case "distance":
			for _, nb := range g.Nearest {
				if nb.Institution == inst && !ok {
					m.groupMemberRow(f, g, groupMember{measure: 0, inst: inst, value: nb.Distance})
				}
			}
		case "dropped":
			for _, dr := range g.Dropped {
				if dr.Institution == inst && !ok {
					m.groupMemberRow(f, g, groupMember{measure: 1, inst: inst, text: dr.Reason})
				}
			}
		}
	case SectionDistribution:
		if k.Group == "" {
			f(Row{Key: quantileMethodKey(), Text: m.Method.String(), IsText: true})
			break
		}
		d, has := m.dist[distKey{k.Group, k.Indicator, k.Year}]
		if !has {
			break
		}
		if inst < 0 {
			distributionRows(f, d, m.Floor)
			break
		}
		if slices.Contains(d.Outliers, inst) {
			m.outlierRow(f, d, inst)
		}
	case SectionPosition:
		if p, has := m.pos[posKey{k.Group, k.Indicator, inst, k.Year}]; has {
			m.positionRows(f, p)
		}
	case SectionTrend:
		if inst < 0 {
			if t, has := m.gtrend[gtrendKey{k.Group, k.Indicator}]; has {
				groupTrendRows(f, t)
			}
		} else if t, has := m.trend[trendKey{k.Group, k.Indicator, inst}]; has {
			m.trendRows(f, t)
		}
	case SectionCorrelation:
		x, y, _ := strings.Cut(k.Indicator, "~")
		if i, has := m.corr[corrKey{k.Group, x, y}]; has {
			correlationRows(f, &m.Correlations[i])
		}
	}
	return found, ok
}
