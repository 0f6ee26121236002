package charts

import (
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"peerpack/internal/stats"
)

// Mark is a labelled institution drawn on a chart.
type Mark struct {
	// Label is the institution's display name.
	Label string
	Value float64
}

// BoxRow is one group's box in a box chart, every number precomputed by
// the figures model: the chart draws Box as given.
type BoxRow struct {
	// Label names the row (the group); Members is the number of its members
	// with a value in this panel (its n).
	Label   string
	Members int
	// FocusOutside marks a group the focus does not belong to: its mark
	// shows where it would sit among the members.
	FocusOutside bool
	Box          stats.Box
	// Focus is the focus institution's value, NaN when it has none;
	// FocusText is that value as printed beside the axis (money without
	// the "PPP$" the axis title states once).
	Focus     float64
	FocusText string
	Marks     []Mark
	// Outliers are the values beyond the whiskers.
	Outliers []float64
}

// BoxPlotter draws box-and-whisker rows (Tukey 1977, Exploratory Data
// Analysis: box from the lower to the upper quartile, a bar at the
// median, whiskers to the most extreme values within 1.5 IQR, outliers
// beyond). Row i is drawn at position len(Rows)-1-i on the category axis,
// so the first group is on top in a horizontal chart and on the left in a
// vertical one.
type BoxPlotter struct {
	Rows     []BoxRow
	Vertical bool
	Theme    Theme
	// LabelMarks draws the names of Marks (only the first panel of a
	// multi-panel chart names them, to avoid repeating names).
	LabelMarks bool
	// Dropped counts labels left out for lack of room, after Plot.
	Dropped int
}

// boxHalf is half the box's thickness across the category axis.
func boxHalf(pitch vg.Length) vg.Length { return min(pitch*0.2, vg.Points(6.5)) }

// slot returns the category position of row i.
func (b *BoxPlotter) slot(i int) float64 {
	if b.Vertical {
		return float64(i)
	}
	return float64(len(b.Rows) - 1 - i)
}

// DataRange implements plot.DataRanger: the value range covers whiskers,
// outliers and every mark, with a little room for labels.
func (b *BoxPlotter) DataRange() (xmin, xmax, ymin, ymax float64) {
	lo, hi := math.Inf(1), math.Inf(-1)
	see := func(v float64) {
		if !math.IsNaN(v) && !math.IsInf(v, 0) {
			lo, hi = math.Min(lo, v), math.Max(hi, v)
		}
	}
	for _, r := range b.Rows {
		if r.Box.N > 0 {
			wl, wh := r.Box.DrawnWhiskers()
			see(wl)
			see(wh)
			see(r.Box.Min)
			see(r.Box.Max)
		}
		for _, o := range r.Outliers {
			see(o)
		}
		see(r.Focus)
		for _, m := range r.Marks {
			see(m.Value)
		}
	}
	if math.IsInf(lo, 0) {
		lo, hi = 0, 1
	}
	pad := (hi - lo) * 0.04
	if pad == 0 {
		pad = math.Max(math.Abs(lo)*0.1, 1)
	}
	cmin, cmax := -0.5, float64(len(b.Rows))-0.5
	if b.Vertical {
		return cmin, cmax, lo - pad, hi + pad
	}
	return lo - pad, hi + pad, cmin, cmax
}

// Plot implements plot.Plotter.
func (b *BoxPlotter) Plot(c draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&c)
	// at maps (value, category) to the canvas.
	at := func(v, cat float64) vg.Point {
		if b.Vertical {
			return vg.Point{X: trX(cat), Y: trY(v)}
		}
		return vg.Point{X: trX(v), Y: trY(cat)}
	}
	var pitch vg.Length
	if b.Vertical {
		pitch = trX(1) - trX(0)
	} else {
		pitch = trY(1) - trY(0)
	}
	half := boxHalf(pitch)
	// across offsets a point across the category axis.
	across := func(pt vg.Point, d vg.Length) vg.Point {
		if b.Vertical {
			return vg.Point{X: pt.X + d, Y: pt.Y}
		}
		return vg.Point{X: pt.X, Y: pt.Y + d}
	}
	whisker := draw.LineStyle{Color: greyAxis, Width: vg.Points(0.8)}
	edge := draw.LineStyle{Color: greyText, Width: vg.Points(0.7)}
	median := draw.LineStyle{Color: PaletteBlack, Width: vg.Points(2)}
	// Labels per row: a label must stay in its own row's band, or a
	// name could read as belonging to the next group.
	labels := make([][]labelRequest, len(b.Rows))
	var obstacles []vg.Rectangle
	var lines [][]vg.Point
	focus := FocusMarker()
	named := NamedMarker()
	for i, r := range b.Rows {
		cat := b.slot(i)
		bx := r.Box
		if bx.N > 0 && !math.IsNaN(bx.Q1) {
			// Whiskers end where the box statistics say to draw them: an
			// adjacent value inside the box (interpolated quartiles next to
			// an outlier) gives a whisker of zero length, never one drawn
			// back into the box.
			wl, wh := bx.DrawnWhiskers()
			lo, q1, md, q3, hi := at(wl, cat), at(bx.Q1, cat), at(bx.Median, cat), at(bx.Q3, cat), at(wh, cat)
			// Whiskers with end caps.
			c.StrokeLines(whisker, []vg.Point{lo, q1}, []vg.Point{q3, hi})
			c.StrokeLines(whisker, []vg.Point{across(lo, -half*0.6), across(lo, half*0.6)}, []vg.Point{across(hi, -half*0.6), across(hi, half*0.6)})
			// The box.
			box := vg.Rectangle{Min: across(q1, -half), Max: across(q3, half)}
			box = normRect(box)
			c.SetColor(greyFill)
			c.Fill(box.Path())
			c.SetLineStyle(edge)
			c.Stroke(box.Path())
			c.StrokeLines(median, []vg.Point{across(md, -half), across(md, half)})
			obstacles = append(obstacles, box)
			lines = append(lines, []vg.Point{lo, q1}, []vg.Point{q3, hi})
			for _, o := range r.Outliers {
				OutlierMarker().Draw(&c, at(o, cat))
			}
		}
		if bx.N == 0 {
			// Say so rather than leave a row blank.
			mid := at((p.X.Min+p.X.Max)/2, cat)
			if b.Vertical {
				mid = at((p.Y.Min+p.Y.Max)/2, cat)
			}
			sty := b.Theme.tickStyle()
			fillText(&c, sty, mid.X, mid.Y-textHeight(sty)/2+sty.FontExtents().Descent, draw.XCenter, "no values")
		}
		for _, mk := range r.Marks {
			if math.IsNaN(mk.Value) {
				continue
			}
			pt := at(mk.Value, cat)
			named.Draw(&c, pt)
			obstacles = append(obstacles, named.Rect(pt))
			if b.LabelMarks && mk.Label != "" {
				labels[i] = append(labels[i], labelRequest{Anchor: pt, Text: mk.Label, Style: b.Theme.labelStyle(), Gap: half, Priority: 1, Prefer: []int{dirBelow, dirAbove}})
			}
		}
		if !math.IsNaN(r.Focus) {
			pt := at(r.Focus, cat)
			focus.Draw(&c, pt)
			obstacles = append(obstacles, focus.Rect(pt))
			if r.FocusText != "" {
				labels[i] = append(labels[i], labelRequest{Anchor: pt, Text: r.FocusText, Style: b.Theme.focusLabelStyle(), Gap: max(half, focus.Radius*1.15), Priority: 0, Prefer: []int{dirAbove, dirBelow}})
			}
		}
	}
	b.Dropped = 0
	for i := range b.Rows {
		bounds := vg.Rectangle{Min: c.Min, Max: c.Max}
		cat := b.slot(i)
		// Stacked rows are where a name can stray into the next group; side
		// by side columns are wide and their names run along the value
		// axis, so they keep the whole area.
		if !b.Vertical {
			bounds.Min.Y, bounds.Max.Y = max(bounds.Min.Y, trY(cat-0.5)), min(bounds.Max.Y, trY(cat+0.5))
		}
		placed, dropped := placeLabels(labels[i], bounds, obstacles, lines...)
		b.Dropped += dropped
		for _, l := range placed {
			obstacles = append(obstacles, l.Rect)
		}
		drawLabels(&c, placed)
	}
}

// normRect orders a rectangle's corners.
func normRect(r vg.Rectangle) vg.Rectangle {
	if r.Min.X > r.Max.X {
		r.Min.X, r.Max.X = r.Max.X, r.Min.X
	}
	if r.Min.Y > r.Max.Y {
		r.Min.Y, r.Max.Y = r.Max.Y, r.Min.Y
	}
	return r
}
