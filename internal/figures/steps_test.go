package figures

import (
	"math"
	"slices"
	"testing"

	"peerpack/internal/dataset"
)

// Largest single steps, worked by hand.
func TestLargestStep(t *testing.T) {
	years := []int{2020, 2021, 2022, 2023}
	for _, tc := range []struct {
		name  string
		vals  []float64
		step  float64
		year  int
		share float64
		ok    bool
	}{
		// 10 -> 12 -> 20 -> 21: whole change 11, the step 12 -> 20 is 8 of it.
		{"rise", []float64{10, 12, 20, 21}, 8, 2022, 8.0 / 11, true},
		// 50 -> 40 -> 41 -> 38: whole change -12, the step 50 -> 40 is 10 of it.
		{"fall", []float64{50, 40, 41, 38}, -10, 2021, 10.0 / 12, true},
		// 0 -> 10 -> 4 -> 5: whole change 5, one step of 10, more than all of it.
		{"overshoot", []float64{0, 10, 4, 5}, 10, 2021, 2, true},
		// Equal steps: the earlier one.
		{"even", []float64{1, 2, 3, 4}, 1, 2021, 1.0 / 3, true},
		{"no change", []float64{3, 5, 3, 3}, 0, 0, 0, false},
		{"missing", []float64{3, math.NaN(), 5, 6}, 0, 0, 0, false},
	} {
		step, year, share, ok := LargestStep(years[:len(tc.vals)], tc.vals)
		if ok != tc.ok || (ok && (step != tc.step || year != tc.year || math.Abs(share-tc.share) > 1e-12)) {
			t.Errorf("%s: got %v %v %v %v, want %v %v %v %v", tc.name, step, year, share, ok, tc.step, tc.year, tc.share, tc.ok)
		}
	}
	// Two points are one step: no "largest" of one.
	if _, _, _, ok := LargestStep([]int{2020, 2021}, []float64{1, 5}); ok {
		t.Error("two points gave a largest step")
	}
}

// The rank target's place: the last of the best quarter of places,
// rounded up (worked by hand).
func TestTargetRank(t *testing.T) {
	for of, want := range map[int]int{1: 1, 2: 1, 3: 1, 4: 1, 5: 2, 7: 2, 8: 2, 9: 3} {
		if got := TargetRank(of); got != want {
			t.Errorf("TargetRank(%d) = %d, want %d", of, got, want)
		}
	}
}

// On the fixture, every rank target row is in a group below the floor,
// names the value of the member at the target place (members sorted here
// afresh) and a positive amount still to gain; every trend's largest step
// lies within its span and is one of its year-to-year steps.
func TestRuleFiguresOnTheFixture(t *testing.T) {
	d, b := loadFixture(t)
	m, err := Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	targets, steps := 0, 0
	for r := range m.Rows() {
		switch {
		case r.Section == SectionPosition && r.Measure == MeasureTargetRankValue:
			targets++
			inst := m.Data.Register.Index(r.Institution)
			dist, _ := m.Distribution(r.Group, r.Indicator, r.Year)
			if !m.BelowFloor(dist) {
				t.Errorf("%s: a rank target in a group of %d", r.Key, dist.N)
			}
			ind, _ := m.Indicator(r.Indicator)
			p, _ := m.Position(r.Group, r.Indicator, inst, r.Year)
			want, _ := m.Lookup(Key{Section: SectionPosition, Group: r.Group, Indicator: r.Indicator, Institution: r.Institution, Year: r.Year, Measure: MeasureTargetRank})
			g, _ := m.Group(r.Group)
			var vals []float64
			for _, i := range g.Members {
				if v, has := m.Data.Value(m.Data.Dictionary.Index(r.Indicator), i, r.Year); i != inst && has {
					vals = append(vals, v)
				}
			}
			slices.Sort(vals)
			if ind.Better != dataset.LowerIsBetter {
				slices.Reverse(vals)
			}
			if got := vals[int(want.Value)-1]; got != r.Value {
				t.Errorf("%s = %v, the member at place %v has %v", r.Key, r.Value, want.Value, got)
			}
			if p.Rank <= int(want.Value) {
				t.Errorf("%s: rank %d already at the target %v", r.Key, p.Rank, want.Value)
			}
		case r.Section == SectionTrend && r.Measure == MeasureLargestStepYear:
			steps++
			tr, _ := m.Trend(r.Group, r.Indicator, m.Data.Register.Index(r.Institution))
			if y := int(r.Value); y <= tr.StartYear || y > tr.EndYear || tr.Points < 3 {
				t.Errorf("%s = %d outside %d-%d or over %d points", r.Key, y, tr.StartYear, tr.EndYear, tr.Points)
			}
		}
	}
	if targets == 0 || steps == 0 {
		t.Errorf("the fixture gives %d rank targets and %d steps; expected some of each", targets, steps)
	}
}

// A group median's movement against the last year's interquartile range,
// on the fixture: abs(median_end - median_start) / IQR of the end year's
// distribution, recomputed here from the model's own distributions
// (the definition the noise rule reads; common practice, no source).
func TestGroupMedianChangePerIQR(t *testing.T) {
	d, b := loadFixture(t)
	m, err := Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	seen := 0
	for _, g := range m.Groups {
		for _, ind := range d.Dictionary.Indicators {
			gt, ok := m.GroupTrend(g.Name, ind.Key)
			if !ok || !gt.Valid {
				continue
			}
			end, ok := m.Distribution(g.Name, ind.Key, gt.EndYear)
			if !ok || end.N < 2 || end.IQR <= 0 {
				if !math.IsNaN(gt.ChangePerIQR) {
					t.Errorf("%s %s: %v with no spread to divide by", g.Name, ind.Key, gt.ChangePerIQR)
				}
				continue
			}
			want := math.Abs(end.Median-gt.MedianStart) / end.IQR
			if math.Abs(gt.ChangePerIQR-want) > 1e-12 {
				t.Errorf("%s %s: median_change_per_iqr %v, want %v", g.Name, ind.Key, gt.ChangePerIQR, want)
			}
			r, ok := m.Lookup(Key{Section: SectionTrend, Group: g.Name, Indicator: ind.Key, Measure: "median_change_per_iqr"})
			if !ok || r.Value != gt.ChangePerIQR {
				t.Errorf("%s %s: the figures row is %v, %v", g.Name, ind.Key, r, ok)
			}
			seen++
		}
	}
	if seen == 0 {
		t.Fatal("no group trend with a spread on the fixture")
	}
}
