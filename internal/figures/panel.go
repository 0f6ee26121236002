package figures

import (
	"math"
	"slices"

	"peerpack/internal/stats"
)

// The constant panel of a trend: the members of the group in both its
// first and its last year with a value in both. When a group's size
// changes between the two years (members joining or leaving the ranked
// population, or reporting in one year only), a raw rank change mixes the
// institution's own movement with the change of company; ranks within the
// panel compare like with like (common practice, no source). The trend's
// percentile change is the other fair comparison; the figures hold both.

// panelKey names one panel: a group's indicator between two years.
type panelKey struct {
	group, ind string
	y0, y1     int
}

// panel is the two years' values of a panel, each sorted ascending, and
// its members (ascending register positions).
type panel struct {
	members  []int
	at0, at1 []float64
}

// computePanels places every tracked institution's valid trend within its
// constant panel (Trend.PanelOf, PanelStartRank, PanelEndRank,
// PanelRankChange). Panels are shared by the trends of one group,
// indicator and pair of years.
func (m *Model) computePanels() {
	cache := map[panelKey]*panel{}
	for _, t := range m.trend {
		if !t.Valid || t.StartOf == 0 || t.EndOf == 0 {
			continue
		}
		g, ok := m.Group(t.Group)
		k := m.Data.Dictionary.Index(t.Indicator)
		if !ok || k < 0 {
			continue
		}
		key := panelKey{t.Group, t.Indicator, t.StartYear, t.EndYear}
		p, ok := cache[key]
		if !ok {
			p = m.panelOf(g, k, t.StartYear, t.EndYear)
			cache[key] = p
		}
		dir := RankDirection(m.Data.Dictionary.Indicators[k].Better)
		_, in := slices.BinarySearch(p.members, t.Institution)
		s := stats.Place(p.at0, t.StartValue, dir, in)
		e := stats.Place(p.at1, t.EndValue, dir, in)
		t.PanelOf = s.Of
		t.PanelStartRank, t.PanelEndRank = s.Rank, e.Rank
		t.PanelRankChange = s.Rank - e.Rank
	}
}

// panelOf gathers a group's constant panel on indicator k between two
// years.
func (m *Model) panelOf(g *Group, k, y0, y1 int) *panel {
	c0, c1 := m.Data.Column(k, y0), m.Data.Column(k, y1)
	p := &panel{}
	if c0 == nil || c1 == nil {
		return p
	}
	for _, i := range g.MembersIn(y0) {
		if !g.HasIn(i, y1) || math.IsNaN(c0[i]) || math.IsNaN(c1[i]) {
			continue
		}
		p.members = append(p.members, i)
		p.at0 = append(p.at0, c0[i])
		p.at1 = append(p.at1, c1[i])
	}
	slices.Sort(p.at0)
	slices.Sort(p.at1)
	return p
}
