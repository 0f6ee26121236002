package figures

import (
	"math"
	"slices"

	"peerpack/internal/stats"
)

// Members returns the register positions of a group's members that have a
// value of the indicator in the year, in register order, with their
// values alongside, so charts can draw raw points (scatter, strip, bars)
// without computing anything. Unknown group, indicator or year: nil, nil.
func (m *Model) Members(group, indicator string, year int) (insts []int, values []float64) {
	g, ok := m.Group(group)
	k := m.Data.Dictionary.Index(indicator)
	col := m.Data.Column(k, year)
	if !ok || col == nil {
		return nil, nil
	}
	for _, i := range g.MembersIn(year) {
		if v := col[i]; !math.IsNaN(v) {
			insts = append(insts, i)
			values = append(values, v)
		}
	}
	return insts, values
}

// Pair is one member's values of two indicators.
type Pair struct {
	Institution int
	X, Y        float64
}

// MemberPairs returns the members of a group with values of both
// indicators in the year, in register order: the points of a scatter.
func (m *Model) MemberPairs(group, x, y string, year int) []Pair {
	g, ok := m.Group(group)
	cx := m.Data.Column(m.Data.Dictionary.Index(x), year)
	cy := m.Data.Column(m.Data.Dictionary.Index(y), year)
	if !ok || cx == nil || cy == nil {
		return nil
	}
	var out []Pair
	for _, i := range g.MembersIn(year) {
		if !math.IsNaN(cx[i]) && !math.IsNaN(cy[i]) {
			out = append(out, Pair{Institution: i, X: cx[i], Y: cy[i]})
		}
	}
	return out
}

// Series returns a group's distributions of an indicator for every year of
// the span present in the data, oldest first: the median line and IQR band
// of a trend chart.
func (m *Model) Series(group, indicator string) []*Distribution {
	var out []*Distribution
	for _, y := range m.Years {
		if d, ok := m.dist[distKey{group, indicator, y}]; ok {
			out = append(out, d)
		}
	}
	return out
}

// PositionSeries returns an institution's positions in a group for every
// year of the span, oldest first.
func (m *Model) PositionSeries(group, indicator string, inst int) []*Position {
	var out []*Position
	for _, y := range m.Years {
		if p, ok := m.pos[posKey{group, indicator, inst, y}]; ok {
			out = append(out, p)
		}
	}
	return out
}

// GroupTrend returns the movement of a group's median over the span.
func (m *Model) GroupTrend(group, indicator string) (*GroupTrend, bool) {
	t, ok := m.gtrend[gtrendKey{group, indicator}]
	return t, ok
}

// Correlation returns the correlation between two indicators over a group
// in the brief year, whichever order the two are named in.
func (m *Model) Correlation(group, x, y string) (Correlation, bool) {
	if i, ok := m.corr[corrKey{group, x, y}]; ok {
		return m.Correlations[i], true
	}
	if i, ok := m.corr[corrKey{group, y, x}]; ok {
		c := m.Correlations[i]
		c.IndicatorX, c.IndicatorY = c.IndicatorY, c.IndicatorX
		return c, true
	}
	return Correlation{}, false
}

// GroupsOf returns the groups a brief name stands for: the group itself,
// or every group expanded from an "each" definition of that name, in model
// order. Blocks may name either.
func (m *Model) GroupsOf(name string) []*Group {
	if g, ok := m.Group(name); ok {
		return []*Group{g}
	}
	var out []*Group
	for _, g := range m.Groups {
		if g.Spec == name {
			out = append(out, g)
		}
	}
	return out
}

// PlaceOf computes, on demand, the position of any institution (tracked
// or not) in a group in a year, with the same definitions as the stored
// positions: for a table of peers. It costs one pass over the members.
// Positions of the focus and named institutions are stored: use Position.
func (m *Model) PlaceOf(group, indicator string, inst, year int) (*Position, bool) {
	if p, ok := m.Position(group, indicator, inst, year); ok {
		return p, true
	}
	g, ok := m.Group(group)
	d, okd := m.Distribution(group, indicator, year)
	k := m.Data.Dictionary.Index(indicator)
	if !ok || !okd || inst < 0 || inst >= m.Data.Register.Len() {
		return nil, false
	}
	insts, _ := m.Members(group, indicator, year)
	ind := m.Data.Dictionary.Indicators[k]
	v := m.Data.Column(k, year)[inst]
	pcol := m.placedColumn(k, year)
	var pl stats.Placement
	if !math.IsNaN(v) {
		pl = stats.PlaceUnsorted(gather(pcol, insts), pcol[inst], RankDirection(ind.Better), g.HasIn(inst, year))
	}
	return position(g, ind, inst, year, v, len(insts), pl, d), true
}

// Tracked reports whether the model stores positions for an institution
// (the focus, named institutions and chart labels).
func (m *Model) Tracked(inst int) bool {
	for _, i := range m.Named {
		if i == inst {
			return true
		}
	}
	return false
}

// MemberPlace is one member's value and placement in its group.
type MemberPlace struct {
	Institution int
	Value       float64
	stats.Placement
	// Quartile is the quarter of the group the value falls in, 1 the
	// best, by the rule of the stored positions (Position.Quartile).
	Quartile int
}

// MemberPlaces places every member of a group that has a value of the
// indicator in the year, best first (ties, values equal at the declared
// decimals, in register order), with the same definitions as the stored
// positions: for charts and tables that show every member (bars,
// heatmaps, league tables). One sort, O(n log n).
func (m *Model) MemberPlaces(group, indicator string, year int) []MemberPlace {
	k := m.Data.Dictionary.Index(indicator)
	insts, values := m.Members(group, indicator, year)
	if len(insts) == 0 {
		return nil
	}
	dir := RankDirection(m.Data.Dictionary.Indicators[k].Better)
	// placed at the declared precision (placed.go); Value stays unrounded
	placed := gather(m.placedColumn(k, year), insts)
	sorted := slices.Clone(placed)
	slices.Sort(sorted)
	d, _ := m.Distribution(group, indicator, year)
	out := make([]MemberPlace, len(insts))
	for i, inst := range insts {
		out[i] = MemberPlace{Institution: inst, Value: values[i], Placement: stats.Place(sorted, placed[i], dir, true)}
		if d != nil {
			out[i].Quartile = quarterOf(m.Data.Dictionary.Indicators[k], values[i], d)
		}
	}
	slices.SortStableFunc(out, func(a, b MemberPlace) int { return a.Rank - b.Rank })
	return out
}

// gather picks col's values at the register positions insts.
func gather(col []float64, insts []int) []float64 {
	out := make([]float64, len(insts))
	for i, inst := range insts {
		out[i] = col[inst]
	}
	return out
}
