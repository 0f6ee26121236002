package charts

import (
	"image/color"
	"math"
	"slices"
	"testing"

	"gonum.org/v1/plot/vg/recorder"

	"peerpack/internal/format"
)

const heatmapBody = "# Heat\n\n```chart\nkind: heatmap\nindicators: [fnci, intl_staff, ssr, income]\ngroups: [Kestria national]\nlimit: 12\n```\n"

// heatmapOf plans the body's heatmap over n institutions (half of them in
// Kestria) and records its drawing at full width.
func heatmapOf(t *testing.T, n int) (*HeatmapChart, []recorder.Action) {
	t.Helper()
	m, b := buildModel(t, n, heatmapBody)
	ch, err := New(m, chartBlocks(b)[0], Theme{})
	if err != nil {
		t.Fatal(err)
	}
	hc := ch.(*HeatmapChart)
	return hc, record(t, hc, fullWidth).Actions
}

func drawnTexts(acts []recorder.Action) []string {
	var out []string
	for _, a := range acts {
		if s, ok := a.(*recorder.FillString); ok {
			out = append(out, s.String)
		}
	}
	return out
}

func usesColour(acts []recorder.Action, c color.Color) bool {
	for _, a := range acts {
		if s, ok := a.(*recorder.SetColor); ok && hexColour(s.Color) == hexColour(c) {
			return true
		}
	}
	return false
}

// In a group of 150 the best of distinct values has the mid-rank
// percentile 100 × (149 + 1/2) / 150 = 99.67 (scipy.stats.percentileofscore
// with kind='mean', from memory) and the worst 0.33: printed, as tables
// print them, 99 and 1, never "100" or "0" (the pack's rule: 0th and 100th
// are never printed). Each cell's shade is the model's quarter of that
// member, the quarter the tables shade.
func TestHeatmapPrintsPercentilesAsTables(t *testing.T) {
	hc, acts := heatmapOf(t, 300)
	texts := drawnTexts(acts)
	for _, bad := range []string{"100", "0"} {
		if slices.Contains(texts, bad) {
			t.Errorf("a cell prints %q", bad)
		}
	}
	if !slices.Contains(texts, "99") {
		t.Errorf("the best member's percentile (99.67) is not printed as 99: %q", texts)
	}
	top := hc.Rows[0]
	if top.Percentiles[0] < 99.5 {
		t.Fatalf("first row's percentile %.2f; the fixture should put the best of 150 first", top.Percentiles[0])
	}
	for _, r := range hc.Rows {
		for j, p := range r.Percentiles {
			if hc.RanksOnly[j] {
				t.Fatalf("column %d of a 150-member group marked ranks only", j)
			}
			if !math.IsNaN(p) && (r.Quarters[j] < 1 || r.Quarters[j] > 4) {
				t.Errorf("%s column %d: quarter %d", r.Label, j, r.Quarters[j])
			}
		}
	}
	if top.Quarters[0] != 1 {
		t.Errorf("the best member is in quarter %d, want the top", top.Quarters[0])
	}
}

// A group below the small-group floor (8 members, floor 10) gets ranks
// "1".."8" in its cells, no quarter shading and no percentile legend, as
// the tables give ranks only there.
func TestHeatmapSmallGroupRanksOnly(t *testing.T) {
	hc, acts := heatmapOf(t, 16)
	for j, ro := range hc.RanksOnly {
		if !ro {
			t.Errorf("column %d of an 8-member group is not marked ranks only", j)
		}
	}
	texts := drawnTexts(acts)
	for q := 1; q <= 4; q++ {
		if usesColour(acts, QuartileShade(q)) {
			t.Errorf("quarter %d's shade is drawn in a group below the floor", q)
		}
	}
	for _, s := range texts {
		if s == "Percentile rank in Kestria national; shading by quarter:" {
			t.Errorf("percentile legend drawn: %q", s)
		}
	}
	if !slices.Contains(texts, "Rank in Kestria national, 1 the best") {
		t.Errorf("no rank legend: %q", texts)
	}
	// Every row's cells are its ranks 1..8 as the model places it.
	seen := map[string]bool{}
	for _, r := range hc.Rows {
		for j := range hc.Columns {
			if r.Ranks[j] < 1 || r.Ranks[j] > 8 {
				t.Errorf("%s column %d: rank %d of 8", r.Label, j, r.Ranks[j])
			}
			seen[format.Int(r.Ranks[j])] = true
		}
	}
	for s := range seen {
		if !slices.Contains(texts, s) {
			t.Errorf("rank %s not printed", s)
		}
	}
}

// A heatmap whose second column is below the floor prints that column's
// ranks unshaded and keeps the others' percentiles and shades.
func TestHeatmapMixedColumns(t *testing.T) {
	hc := fxHeatmap()
	hc.RanksOnly = []bool{false, true, false, false, false}
	for i := range hc.Rows {
		hc.Rows[i].Ranks = []int{0, 140 + i, 0, 0, 0}
		hc.Rows[i].Percentiles[1] = 50 // would be shaded in the second quarter
		hc.Rows[i].Quarters[1] = 2
	}
	texts := drawnTexts(record(t, hc, fullWidth).Actions)
	for i := range hc.Rows {
		if !slices.Contains(texts, format.Int(140+i)) {
			t.Errorf("rank %d not printed", 140+i)
		}
	}
	if slices.Contains(texts, "50") {
		t.Errorf("a percentile is printed in a ranks-only column")
	}
	if !slices.Contains(texts, "Percentile rank in Kestria national; shading by quarter:") {
		t.Errorf("the other columns lost their legend: %q", texts)
	}
}
