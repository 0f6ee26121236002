package charts

import (
	"math"
	"testing"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/recorder"

	"peerpack/internal/dataset"
	"peerpack/internal/stats"
)

// With type-7 quartiles of 0, 0, 10, 10, 10, 10, 10, 10 the lower
// quartile interpolates to 7.5 (R: quantile(c(0,0,rep(10,6)), 0.25) is
// 7.5, worked by hand: h = 1 + 7/4 = 2.75, 0 + 0.75 x 10), Q3 = 10,
// IQR 2.5, the lower fence 3.75, so both zeros are outliers and the
// adjacent value (Tukey 1977) is 10, inside the box. The whisker must not
// be drawn back across the box: it ends at the box's edge.
func TestWhiskerNeverDrawnInsideTheBox(t *testing.T) {
	b := stats.BoxOf([]float64{0, 0, 10, 10, 10, 10, 10, 10}, stats.Type7)
	if b.Q1 != 7.5 || b.Q3 != 10 || b.WhiskerLow != 10 {
		t.Fatalf("box statistics %v %v %v, want Q1 7.5, Q3 10, adjacent low 10", b.Q1, b.Q3, b.WhiskerLow)
	}
	ind := dataset.Indicator{Key: "x", Label: "Index", Unit: "index", Better: dataset.HigherIsBetter}
	ch := &BoxChart{Panels: []BoxPanel{{Indicator: ind, Rows: []BoxRow{{Label: "Group", Members: 8, Box: b, Focus: math.NaN(), Outliers: b.OutlierValues}}}}}
	acts := record(t, ch, fullWidth).Actions
	var box vg.Rectangle
	found := false
	colour, width := "", vg.Length(0)
	var whiskers []vg.Rectangle
	for _, a := range acts {
		switch a := a.(type) {
		case *recorder.SetColor:
			colour = hexColour(a.Color)
		case *recorder.SetLineWidth:
			width = a.Width
		case *recorder.Fill:
			if colour == hexColour(greyFill) && !found {
				box, found = pathBounds(a.Path), true
			}
		case *recorder.Stroke:
			if colour == hexColour(greyAxis) && width == vg.Points(0.8) {
				whiskers = append(whiskers, pathBounds(a.Path))
			}
		}
	}
	if !found || len(whiskers) == 0 {
		t.Fatalf("box found %v, %d whisker strokes", found, len(whiskers))
	}
	const tol = 0.01
	for _, w := range whiskers {
		if w.Max.X-w.Min.X < tol {
			continue // an end cap, across the axis
		}
		if w.Min.X < box.Max.X-tol && w.Max.X > box.Min.X+tol {
			t.Errorf("whisker from %.2f to %.2f runs inside the box %.2f..%.2f", w.Min.X, w.Max.X, box.Min.X, box.Max.X)
		}
	}
}
