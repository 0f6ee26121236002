package charts

import (
	"math"
	"sort"
	"strings"
	"testing"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/recorder"
)

// bandFills counts the filled polygons in a band's tint (alpha 46 of 255)
// in a recording.
func bandFills(acts []recorder.Action) int {
	n, tinted := 0, false
	for _, a := range acts {
		switch a := a.(type) {
		case *recorder.SetColor:
			_, _, _, al := a.Color.RGBA()
			tinted = al>>8 == 46
		case *recorder.Fill:
			if tinted {
				n++
			}
		}
	}
	return n
}

// Above MaxBandGroups groups the trend draws median lines only, and its
// legend says the bands are left out (layout review: six bands blur into
// one mass; common practice, no source).
func TestTrendDrawsNoBandsAboveTwoGroups(t *testing.T) {
	for _, n := range []int{1, 2, 3, 6} {
		tc := &TrendChart{FocusName: "Høgskolen i Vårdø", Panels: []TrendPanel{fxTrendGroups(fxIntl, 31, n)}}
		rec := record(t, tc, fullWidth)
		fills := bandFills(rec.Actions)
		switch {
		case n <= MaxBandGroups && fills < n:
			t.Errorf("%d groups: %d band polygons, want one a group", n, fills)
		case n > MaxBandGroups && fills != 0:
			t.Errorf("%d groups: %d band polygons, want none", n, fills)
		}
		note := textContains(rec.Actions, "Medians only")
		if note != (n > MaxBandGroups) {
			t.Errorf("%d groups: legend note about bands present = %v", n, note)
		}
		if n > MaxBandGroups && hasText(rec.Actions, "Kestria: median and middle half") {
			t.Errorf("%d groups: legend still promises a middle half", n)
		}
	}
}

// The latest values stand in one column right of the last year, in the
// order of the line ends they belong to, so their leaders never cross.
func TestTrendEndLabelsInOneOrderedColumn(t *testing.T) {
	pn := fxTrendGroups(fxFNCI, 37, 6)
	tc := &TrendChart{FocusName: "Høgskolen i Vårdø", Panels: []TrendPanel{pn}}
	for _, w := range []vg.Length{fullWidth, halfWidth} {
		rec := record(t, tc, w)
		want := map[string]float64{}
		for _, b := range pn.Bands {
			want[valueText(fxFNCI, b.Median[len(b.Median)-1])] = b.Median[len(b.Median)-1]
		}
		want[valueText(fxFNCI, pn.Focus.Values[len(pn.Focus.Values)-1])] = pn.Focus.Values[len(pn.Focus.Values)-1]
		type lab struct {
			y, v float64
			x    vg.Length
		}
		var labs []lab
		for _, a := range rec.Actions {
			if fs, ok := a.(*recorder.FillString); ok {
				// Medians-only panels name each group before its value
				// where the width allows.
				text := fs.String
				for _, b := range pn.Bands {
					text = strings.TrimPrefix(text, b.Label+" ")
				}
				if v, ok := want[text]; ok {
					labs = append(labs, lab{y: float64(fs.Point.Y), v: v, x: fs.Point.X})
				}
			}
		}
		if len(labs) != len(want) {
			t.Fatalf("at %.0f pt: found %d end labels, want %d", w, len(labs), len(want))
		}
		if w == fullWidth {
			// At full width every medians-only line is named where it ends.
			for _, b := range pn.Bands {
				name := b.Label + " " + valueText(fxFNCI, b.Median[len(b.Median)-1])
				found := false
				for _, a := range rec.Actions {
					if fs, ok := a.(*recorder.FillString); ok && fs.String == name {
						found = true
					}
				}
				if !found {
					t.Errorf("at full width no end label %q", name)
				}
			}
		}
		sort.Slice(labs, func(i, j int) bool { return labs[i].y < labs[j].y })
		for i := 1; i < len(labs); i++ {
			if labs[i].v < labs[i-1].v {
				t.Errorf("at %.0f pt: end labels out of the lines' order: %v above %v", w, labs[i-1].v, labs[i].v)
			}
			if math.Abs(float64(labs[i].x-labs[0].x)) > 0.01 {
				t.Errorf("at %.0f pt: end labels not in one column: x %.2f and %.2f", w, labs[i].x, labs[0].x)
			}
		}
	}
}

// Three panels in two columns leave no empty cell: the legend takes it.
func TestTrendThreePanelsLeaveNoEmptyCell(t *testing.T) {
	tc := &TrendChart{FocusName: "Høgskolen i Vårdø", Panels: []TrendPanel{fxTrendGroups(fxIntl, 31, 6), fxTrendGroups(fxFNCI, 37, 6), fxTrendGroups(fxInc, 41, 6)}}
	ps := tc.panels()
	if ps.cols(fullWidth) != 2 || !ps.legendGap(fullWidth) {
		t.Fatalf("three panels at full width: %d columns, legend in the empty cell = %v", ps.cols(fullWidth), ps.legendGap(fullWidth))
	}
	if got, want := tc.Height(fullWidth), panelsTop+ps.plotsHeight(fullWidth); got != want {
		t.Errorf("height %.1f, want the panels' %.1f with the legend inside the grid", got, want)
	}
	// The legend sits right of the first panel of the last row.
	rec := record(t, tc, fullWidth)
	for _, a := range rec.Actions {
		if fs, ok := a.(*recorder.FillString); ok && strings.HasPrefix(fs.String, "Kestria median") {
			if fs.Point.X < fullWidth/2 {
				t.Errorf("legend entry at x %.1f, want it in the right-hand cell", fs.Point.X)
			}
			return
		}
	}
	t.Error("no legend entry for Kestria")
}

// spreadLabels keeps labels apart, in order, inside the bounds, and moves
// labels with room to spare not at all.
func TestSpreadLabels(t *testing.T) {
	const h = 10
	cases := []struct {
		want   []vg.Length
		lo, hi vg.Length
		exact  bool
	}{
		{[]vg.Length{10, 50, 90}, 0, 100, true},
		{[]vg.Length{50, 52, 54, 20, 90}, 0, 100, false},
		{[]vg.Length{95, 96, 97, 98}, 0, 100, false},
		{[]vg.Length{1, 2, 3}, 0, 100, false},
	}
	for _, c := range cases {
		got := spreadLabels(c.want, h, c.lo, c.hi)
		if c.exact {
			for i := range got {
				if got[i] != c.want[i] {
					t.Errorf("%v: label %d moved to %.1f", c.want, i, got[i])
				}
			}
		}
		idx := make([]int, len(got))
		for i := range idx {
			idx[i] = i
		}
		sort.SliceStable(idx, func(a, b int) bool { return c.want[idx[a]] < c.want[idx[b]] })
		for k, i := range idx {
			if got[i]-h/2 < c.lo-1e-9 || got[i]+h/2 > c.hi+1e-9 {
				t.Errorf("%v: label %d at %.1f outside [%v, %v]", c.want, i, got[i], c.lo, c.hi)
			}
			if k > 0 && got[i]-got[idx[k-1]] < h-1e-9 {
				t.Errorf("%v: labels %d and %d only %.1f apart", c.want, idx[k-1], i, got[i]-got[idx[k-1]])
			}
		}
	}
	// A cluster is centred on its wanted mean: two labels wanted at 50
	// sit at 45 and 55.
	got := spreadLabels([]vg.Length{50, 50}, h, 0, 100)
	if got[0] != 45 || got[1] != 55 {
		t.Errorf("two labels at 50 spread to %v, want [45 55]", got)
	}
}

// textContains reports whether any drawn string contains s.
func textContains(acts []recorder.Action, s string) bool {
	for _, a := range acts {
		if fs, ok := a.(*recorder.FillString); ok && strings.Contains(fs.String, s) {
			return true
		}
	}
	return false
}
