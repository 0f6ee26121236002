package charts

import (
	"math"
	"strconv"
	"strings"
	"testing"
)

// Each box panel states its own n, the members with a value in that panel:
// coverage differs between indicators, so one n for the whole chart would
// misstate all but one panel (a pack review found "n = 114" over panels of
// 111, 108 and 109).
func TestBoxPanelStatesItsOwnN(t *testing.T) {
	// Institution 7 lacks intl_staff in 2023 (buildModel).
	m, b := buildModel(t, 40, "# B\n\n```chart\nkind: box\nindicators: [fnci, intl_staff]\ngroups: [Kestria national]\nyear: 2023\n```\n")
	c, err := New(m, chartBlocks(b)[0], Theme{})
	if err != nil {
		t.Fatal(err)
	}
	bc := c.(*BoxChart)
	g, _ := m.Group("Kestria national")
	members := len(g.Members)
	if got := bc.Panels[0].Rows[0].Members; got != members {
		t.Errorf("fnci panel n = %d, want all %d members", got, members)
	}
	// KE007 is odd-numbered, so in Aldmere: Kestria keeps every value.
	// Use Aldmere to see a panel with one value fewer.
	m2, b2 := buildModel(t, 40, "# B\n\n```chart\nkind: box\nindicators: [fnci, intl_staff]\ngroups: [Aldmere national]\nyear: 2023\n```\n")
	c2, err := New(m2, chartBlocks(b2)[0], Theme{})
	if err != nil {
		t.Fatal(err)
	}
	p := c2.(*BoxChart).Panels
	if p[0].Rows[0].Members != p[1].Rows[0].Members+1 {
		t.Errorf("panel n = %d and %d; want the intl_staff panel one fewer (one missing value)", p[0].Rows[0].Members, p[1].Rows[0].Members)
	}
}

// A scatter's legend gives each group its own n even when an earlier group
// already drew some of its members (the review saw "(n = 0)"), and says
// that shared points are drawn once.
func TestScatterLegendCountsOverlappingGroups(t *testing.T) {
	m, b := buildModel(t, 40, "# S\n\n```chart\nkind: scatter\nindicators: [intl_staff, fnci]\ngroups: [Research mission, Kestria national]\n```\n")
	c, err := New(m, chartBlocks(b)[0], Theme{})
	if err != nil {
		t.Fatal(err)
	}
	sc := c.(*ScatterChart)
	kes, _ := m.Group("Kestria national")
	if sc.Groups[1].N != len(kes.Members) {
		t.Errorf("Kestria national n = %d, want its %d members", sc.Groups[1].N, len(kes.Members))
	}
	if countPairs(sc.Groups[1]) >= sc.Groups[1].N {
		t.Fatal("fixture has no overlap between the groups; the test no longer exercises it")
	}
	ps := sc.panels()
	var texts []string
	for _, e := range ps.legend.entries {
		texts = append(texts, e.Text)
	}
	joined := strings.Join(texts, " | ")
	want := "Kestria national (n = " + strconv.Itoa(len(kes.Members)) + ")"
	if !strings.Contains(joined, want) {
		t.Errorf("legend %q lacks %q", joined, want)
	}
	if !strings.Contains(ps.legend.note, "drawn once") {
		t.Errorf("legend note %q does not say shared points are drawn once", ps.legend.note)
	}
}

// Shares of one whole are drawn on one common scale from zero (a pack
// review saw a subject radar stretch each spoke over its own range, which
// made an ordinary profile look extreme); the scale is stated and units
// must agree.
func TestRadarCommonScale(t *testing.T) {
	m, b := buildModel(t, 40, "# R\n\n```chart\nkind: radar\nindicators: [fnci, intl_staff, ssr]\ngroups: [Kestria national]\nscale: common\n```\n")
	if _, err := New(m, chartBlocks(b)[0], Theme{}); err == nil || !strings.Contains(err.Error(), "need one unit") {
		t.Errorf("mixed units accepted on a common scale: %v", err)
	}
	m, b = buildModel(t, 40, "# R\n\n```chart\nkind: radar\nindicators: [intl_staff, field_a, field_b]\ngroups: [Kestria national]\nscale: common\n```\n")
	c, err := New(m, chartBlocks(b)[0], Theme{})
	if err != nil {
		t.Fatal(err)
	}
	rc := c.(*RadarChart)
	top := 0.0
	for _, s := range rc.Series {
		for _, v := range s.Values {
			top = max(top, v)
		}
	}
	for _, ax := range rc.Axes {
		if ax.Inner != 0 || ax.Outer != rc.Axes[0].Outer || ax.Outer < top {
			t.Errorf("spoke %s runs %g to %g; want 0 to one common rim at or above %g", ax.Label, ax.Inner, ax.Outer, top)
		}
		if !strings.HasPrefix(ax.InnerText, "median ") {
			t.Errorf("spoke %s does not print its median: %q", ax.Label, ax.InnerText)
		}
	}
	if !strings.Contains(rc.Note, "one scale, from 0 at the centre to") {
		t.Errorf("note does not state the scale: %q", rc.Note)
	}
}

// Round ring steps: 1, 2, 2.5 or 5 times a power of ten, never below the
// step asked for (common practice, no source).
func TestCeilStep(t *testing.T) {
	for _, c := range []struct{ in, want float64 }{{7.8, 10}, {10, 10}, {1.3, 2}, {2.2, 2.5}, {0.031, 0.05}, {42, 50}} {
		if got := ceilStep(c.in); math.Abs(got-c.want) > 1e-12 {
			t.Errorf("ceilStep(%g) = %g, want %g", c.in, got, c.want)
		}
	}
}
