package charts

import (
	"testing"

	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/font/liberation"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/recorder"
)

// No chart text is clipped: every upright string lies inside the area the
// chart asked for with Height, at full and half width (layout review: "no
// clipped text"; common practice, no source).
func TestNoTextOutsideTheChart(t *testing.T) {
	m, b := buildModel(t, 60, goldenBody)
	cache := font.NewCache(liberation.Collection())
	all := fixtureCharts()
	for _, spec := range chartBlocks(b) {
		ch, err := New(m, spec, Theme{})
		if err != nil {
			t.Fatal(err)
		}
		all = append(all, fixtureChart{"model " + blockName(spec), ch})
	}
	for _, fx := range all {
		for _, w := range []vg.Length{fullWidth, halfWidth} {
			h := fx.chart.Height(w)
			depth, rotated := 0, map[int]bool{}
			for _, a := range record(t, fx.chart, w).Actions {
				switch a := a.(type) {
				case *recorder.Push:
					depth++
				case *recorder.Pop:
					delete(rotated, depth)
					depth--
				case *recorder.Rotate:
					rotated[depth] = true
				case *recorder.FillString:
					if len(rotated) > 0 {
						continue
					}
					face := cache.Lookup(a.Font, a.Size)
					e := face.Extents()
					x0, x1 := a.Point.X, a.Point.X+face.Width(a.String)
					y0, y1 := a.Point.Y-e.Descent, a.Point.Y+e.Ascent
					// Half a point of slack for glyph side bearings.
					if x0 < -0.5 || x1 > w+0.5 || y0 < -0.5 || y1 > h+0.5 {
						t.Errorf("%s at %.0f pt: %q at [%.1f, %.1f] x [%.1f, %.1f] leaves the %.1f x %.1f chart", fx.name, float64(w), a.String, x0, x1, y0, y1, w, h)
					}
				}
			}
		}
	}
}
