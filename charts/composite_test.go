package charts

import (
	"testing"

	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/font/liberation"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/recorder"
)

func compositeFixtures() []fixtureChart {
	return []fixtureChart{
		{"rank intervals", &RankIntervalChart{Rows: []IntervalRow{
			{Name: "Hollowmere Institute of Technology", Rank: 31, Low: 25, Median: 30, High: 40},
			{Name: "University of Wendholm", Focus: true, Rank: 34, Low: 28, Median: 34, High: 41},
			{Name: "Brackenford College", Rank: 35, Low: 35, Median: 35, High: 35},
			{Name: "Università di Valmora Alta, Scuola Superiore di Studi Applicati", Rank: 36, Low: 22, Median: 37, High: 60},
		}}},
		{"contributions", &ContributionChart{Decimals: 2, Axis: "Pillar weight × pillar score", Rows: []ContributionRow{
			{Label: "Research", Value: 0.42}, {Label: "Reach", Value: -0.31}, {Label: "Teaching and learning environment", Value: 0.05},
		}}},
		{"flow", &FlowChart{Overall: "Composite score",
			Pillars: []FlowPillar{{Label: "Research", Weight: 0.5}, {Label: "Reach", Weight: 0.25}, {Label: "Teaching", Weight: 0.25}},
			Indicators: []FlowIndicator{
				{Label: "Citation impact", Pillar: 0, Weight: 0.25}, {Label: "Papers / academic", Pillar: 0, Weight: 0.25},
				{Label: "Intl co-authorship", Pillar: 1, Weight: 0.125}, {Label: "Intl staff", Pillar: 1, Weight: 0.125},
				{Label: "Students / academic", Pillar: 2, Weight: 0.25},
			}}},
		{"headroom", &HeadroomChart{Axis: "Change needed, % of the present value", Rows: []HeadroomRow{
			{Label: "Citation impact", Pct: 2.6, Reachable: true}, {Label: "Intl students", Pct: 33.2, Reachable: true}, {Label: "Spin-outs", Reachable: false},
		}}},
	}
}

// The composite charts keep every text inside the area they ask for and
// no two texts overlap, at full and half width (as TestNoTextOutsideTheChart
// and TestNoOverlappingText for the chart kinds; common practice, no
// source).
func TestCompositeChartsText(t *testing.T) {
	cache := font.NewCache(liberation.Collection())
	for _, fx := range compositeFixtures() {
		for _, w := range []vg.Length{fullWidth, halfWidth} {
			h := fx.chart.Height(w)
			var boxes []vg.Rectangle
			var texts []string
			for _, a := range record(t, fx.chart, w).Actions {
				s, ok := a.(*recorder.FillString)
				if !ok {
					continue
				}
				face := cache.Lookup(s.Font, s.Size)
				e := face.Extents()
				r := vg.Rectangle{Min: vg.Point{X: s.Point.X, Y: s.Point.Y - e.Descent}, Max: vg.Point{X: s.Point.X + face.Width(s.String), Y: s.Point.Y + e.Ascent}}
				if r.Min.X < -0.5 || r.Max.X > w+0.5 || r.Min.Y < -0.5 || r.Max.Y > h+0.5 {
					t.Errorf("%s at %.0f pt: %q leaves the chart", fx.name, float64(w), s.String)
				}
				r.Min.X, r.Min.Y, r.Max.X, r.Max.Y = r.Min.X+0.5, r.Min.Y+0.5, r.Max.X-0.5, r.Max.Y-0.5
				for i, b := range boxes {
					if overlaps(b, r) {
						t.Errorf("%s at %.0f pt: %q and %q overlap", fx.name, float64(w), texts[i], s.String)
					}
				}
				boxes = append(boxes, r)
				texts = append(texts, s.String)
			}
		}
	}
}
