package charts

import (
	"fmt"
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
)

// TrendBand is one group's median and interquartile range per year, NaN
// where the group has no values that year.
type TrendBand struct {
	Label          string
	Median, Q1, Q3 []float64
}

// TrendLine is one institution's values per year, NaN where missing.
type TrendLine struct {
	Label  string
	Values []float64
}

// TrendPanel is one indicator of a trend chart over Years.
type TrendPanel struct {
	Indicator dataset.Indicator
	Years     []int
	Bands     []TrendBand
	Focus     TrendLine
	Marks     []TrendLine
}

// MaxBandGroups is the most groups whose interquartile bands a trend
// draws: more overlapping bands blur into one tinted mass, so above it
// only the median lines are drawn and the legend says so (common
// practice, no source).
const MaxBandGroups = 2

// TrendPlotter draws a TrendPanel: each group's interquartile band (up to
// MaxBandGroups groups) and median line, named institutions in grey, the
// focus on top, and the latest values in a column right of the last year.
type TrendPlotter struct {
	Panel TrendPanel
	Theme Theme
	// EndRoom is the room right of the last year for the end labels, and
	// DataWidth the data area's width it is part of; with EndRoom 0 the
	// data range simply leaves a fifth of the span.
	EndRoom, DataWidth vg.Length
	// Dropped counts labels left out for lack of room, after Plot.
	Dropped int
	// NameEnds puts each group's name before its latest value when the
	// panel draws medians only (TrendPanel.bandEndText).
	NameEnds bool
}

// showBands reports whether the panel's bands are drawn.
func (pn TrendPanel) showBands() bool { return len(pn.Bands) <= MaxBandGroups }

// bandEndText is the end label of a group's median line: its latest
// value, and, when the panel draws medians only (more than MaxBandGroups
// groups, whose colours and dashes a reader cannot match to the legend
// line by line), the group's name before it, so each line is named where
// it ends. named is false where the names would not fit the end column
// (TrendChart.panels decides it per width).
func (pn TrendPanel) bandEndText(b TrendBand, v float64, named bool) string {
	if !named || pn.showBands() || b.Label == "" {
		return axisValueText(pn.Indicator, v)
	}
	return b.Label + " " + axisValueText(pn.Indicator, v)
}

// End labels: a short leader from the line's end to a column of values,
// each value after its group's marker so it is tied to the line in print.
const (
	endLeader = 8 // line end to label column
	endMark   = 7 // room for the marker before the value
	endPad    = 1 // between stacked labels
)

// endLabelWidth is the room one end label takes right of the last year.
func endLabelWidth(sty text.Style, s string) vg.Length {
	return endLeader + endMark + sty.Width(s) + 2
}

// DataRange implements plot.DataRanger, leaving room right of the last
// year for end labels.
func (t *TrendPlotter) DataRange() (xmin, xmax, ymin, ymax float64) {
	lo, hi := math.Inf(1), math.Inf(-1)
	see := func(vs []float64) {
		for _, v := range vs {
			if !math.IsNaN(v) && !math.IsInf(v, 0) {
				lo, hi = math.Min(lo, v), math.Max(hi, v)
			}
		}
	}
	for _, b := range t.Panel.Bands {
		if t.Panel.showBands() {
			see(b.Q1)
			see(b.Q3)
		}
		see(b.Median)
	}
	see(t.Panel.Focus.Values)
	for _, m := range t.Panel.Marks {
		see(m.Values)
	}
	if math.IsInf(lo, 0) {
		lo, hi = 0, 1
	}
	pad := (hi - lo) * 0.06
	if pad == 0 {
		pad = math.Max(math.Abs(lo)*0.1, 1)
	}
	ys := t.Panel.Years
	if len(ys) == 0 {
		return 0, 1, lo - pad, hi + pad
	}
	first, last := float64(ys[0]), float64(ys[len(ys)-1])
	span := math.Max(last-first, 1)
	right := span * 0.22
	if t.EndRoom > 0 && t.DataWidth > 0 {
		// The room is asked in points; give the years the rest of the
		// data area, never less than three fifths of it.
		room := min(t.EndRoom, t.DataWidth*0.4)
		right = span * 1.03 * float64(room/(t.DataWidth-room))
	}
	return first - span*0.03, last + right, lo - pad, hi + pad
}

// segments splits a yearly series at missing values, so a gap in the data
// shows as a gap in the line rather than a straight bridge.
func segments(years []int, vals []float64, trX, trY func(float64) vg.Length) [][]vg.Point {
	var out [][]vg.Point
	var cur []vg.Point
	for i, y := range years {
		if i >= len(vals) || math.IsNaN(vals[i]) {
			if len(cur) > 0 {
				out = append(out, cur)
				cur = nil
			}
			continue
		}
		cur = append(cur, vg.Point{X: trX(float64(y)), Y: trY(vals[i])})
	}
	if len(cur) > 0 {
		out = append(out, cur)
	}
	return out
}

func lastValue(years []int, vals []float64) (int, float64, bool) {
	for i := min(len(years), len(vals)) - 1; i >= 0; i-- {
		if !math.IsNaN(vals[i]) {
			return years[i], vals[i], true
		}
	}
	return 0, math.NaN(), false
}

// tint is c at the given opacity, for bands that must not hide each other.
func tint(c color.Color, alpha uint8) color.Color {
	r, g, b, _ := c.RGBA()
	a := float64(alpha) / 255
	return color.NRGBA{R: uint8(r >> 8), G: uint8(g >> 8), B: uint8(b >> 8), A: uint8(a * 255)}
}

// endLabel is one value in the column of latest values.
type endLabel struct {
	anchor vg.Point
	text   string
	style  text.Style
	// mark is drawn before the value (nil for none); gap is the radius of
	// the line's own end marker, where the leader starts.
	mark *Marker
	gap  vg.Length
}

// Plot implements plot.Plotter.
func (t *TrendPlotter) Plot(c draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&c)
	pn := t.Panel
	var labels []labelRequest
	var obstacles []vg.Rectangle
	var lines [][]vg.Point
	var ends []endLabel
	// Bands first, so every line stays visible above them.
	if pn.showBands() {
		for gi, b := range pn.Bands {
			s := GroupSeries(gi)
			for _, seg := range bandSegments(pn.Years, b.Q1, b.Q3, trX, trY) {
				c.FillPolygon(tint(s.Colour, 46), seg)
			}
		}
	}
	for gi, b := range pn.Bands {
		s := GroupSeries(gi)
		ls := draw.LineStyle{Color: s.Colour, Width: vg.Points(1.3), Dashes: s.Dashes}
		mk := seriesMarker(s, vg.Points(2.4))
		for _, seg := range segments(pn.Years, b.Median, trX, trY) {
			c.StrokeLines(ls, seg)
			lines = append(lines, seg)
			for _, pt := range seg {
				mk.Draw(&c, pt)
				obstacles = append(obstacles, mk.Rect(pt))
			}
		}
		// Group medians' latest values, so the gap to the focus can be
		// read.
		if y, v, ok := lastValue(pn.Years, b.Median); ok {
			ends = append(ends, endLabel{anchor: vg.Point{X: trX(float64(y)), Y: trY(v)}, text: pn.bandEndText(b, v, t.NameEnds), style: t.Theme.labelStyle(), mark: &mk})
		}
	}
	named := NamedMarker()
	named.Radius = vg.Points(2.4)
	for _, m := range pn.Marks {
		ls := draw.LineStyle{Color: greyMark, Width: vg.Points(0.9)}
		for _, seg := range segments(pn.Years, m.Values, trX, trY) {
			c.StrokeLines(ls, seg)
			lines = append(lines, seg)
			for _, pt := range seg {
				named.Draw(&c, pt)
				obstacles = append(obstacles, named.Rect(pt))
			}
		}
		if y, v, ok := lastValue(pn.Years, m.Values); ok && m.Label != "" {
			labels = append(labels, labelRequest{Anchor: vg.Point{X: trX(float64(y)), Y: trY(v)}, Text: m.Label, Style: t.Theme.labelStyle(), Gap: named.Radius, Priority: 2, Prefer: []int{dirBelow, dirAbove, 6, 7}})
		}
	}
	focus := FocusMarker()
	focus.Radius = vg.Points(3.6)
	fl := draw.LineStyle{Color: FocusColour, Width: vg.Points(2)}
	for _, seg := range segments(pn.Years, pn.Focus.Values, trX, trY) {
		c.StrokeLines(fl, seg)
		lines = append(lines, seg)
		for _, pt := range seg {
			focus.Draw(&c, pt)
			obstacles = append(obstacles, focus.Rect(pt))
		}
	}
	if y, v, ok := lastValue(pn.Years, pn.Focus.Values); ok {
		// The bold value is the focus's key; a second diamond beside the
		// line's last one would read as one more year.
		ends = append(ends, endLabel{anchor: vg.Point{X: trX(float64(y)), Y: trY(v)}, text: axisValueText(pn.Indicator, v), style: t.Theme.focusLabelStyle(), gap: focus.Radius})
	}
	var lastX vg.Length
	if len(pn.Years) > 0 {
		lastX = trX(float64(pn.Years[len(pn.Years)-1]))
	}
	obstacles = append(obstacles, t.drawEnds(&c, ends, lastX)...)
	placed, dropped := placeLabels(labels, vg.Rectangle{Min: c.Min, Max: c.Max}, obstacles, lines...)
	t.Dropped += dropped
	drawLabels(&c, placed)
}

// drawEnds sets the latest values in one column right of the last year,
// spread so none overlaps (spreadLabels), each joined to its line's end by
// a short leader, and returns their boxes. Values that cannot fit in the
// panel's height are left out and counted in Dropped.
func (t *TrendPlotter) drawEnds(c *draw.Canvas, ends []endLabel, lastX vg.Length) []vg.Rectangle {
	if len(ends) == 0 {
		return nil
	}
	h := textHeight(t.Theme.labelStyle()) + endPad
	room := c.Max.Y - c.Min.Y
	if fit := max(int(room/h), 0); len(ends) > fit {
		t.Dropped += len(ends) - fit
		ends = ends[:fit]
	}
	want := make([]vg.Length, len(ends))
	for i, e := range ends {
		want[i] = e.anchor.Y
	}
	at := spreadLabels(want, h, c.Min.Y, c.Max.Y)
	x0 := lastX + endLeader
	leader := draw.LineStyle{Color: greyMark, Width: vg.Points(0.4)}
	var boxes []vg.Rectangle
	for i, e := range ends {
		y := at[i]
		gap := e.gap
		if e.mark != nil {
			gap = max(gap, e.mark.Radius)
			e.mark.Draw(c, vg.Point{X: x0 + endMark/2, Y: y})
		}
		if from := e.anchor.X + gap + 1; from < x0-1 {
			c.StrokeLine2(leader, from, e.anchor.Y, x0-1, y)
		}
		r := vg.Rectangle{Min: vg.Point{X: x0 + endMark, Y: y - h/2 + endPad/2}, Max: vg.Point{X: x0 + endMark + e.style.Width(e.text), Y: y + h/2 - endPad/2}}
		fillTextIn(c, e.style, r, e.text)
		boxes = append(boxes, vg.Rectangle{Min: vg.Point{X: x0, Y: r.Min.Y}, Max: r.Max})
	}
	return boxes
}

// bandSegments returns the polygons of an interquartile band, split where
// a year lacks a quartile.
func bandSegments(years []int, q1, q3 []float64, trX, trY func(float64) vg.Length) [][]vg.Point {
	var out [][]vg.Point
	var lo, hi []vg.Point
	flush := func() {
		if len(lo) > 1 {
			poly := append([]vg.Point(nil), lo...)
			for i := len(hi) - 1; i >= 0; i-- {
				poly = append(poly, hi[i])
			}
			out = append(out, poly)
		}
		lo, hi = nil, nil
	}
	for i, y := range years {
		if i >= len(q1) || i >= len(q3) || math.IsNaN(q1[i]) || math.IsNaN(q3[i]) {
			flush()
			continue
		}
		x := trX(float64(y))
		lo = append(lo, vg.Point{X: x, Y: trY(q1[i])})
		hi = append(hi, vg.Point{X: x, Y: trY(q3[i])})
	}
	flush()
	return out
}

// TrendChart is a trend chart from precomputed panels, one per indicator.
type TrendChart struct {
	Panels    []TrendPanel
	FocusName string
	Theme     Theme
	built     *panels
}

func (tc *TrendChart) panels() *panels {
	if tc.built != nil {
		return tc.built
	}
	th := tc.Theme
	ps := &panels{legend: &legend{th: th}, count: len(tc.Panels), minPanel: vg.Points(170), legendInGap: true}
	// The end-label column is as wide as the widest latest value (with
	// its group's name when named).
	endRoomOf := func(named bool) vg.Length {
		var endRoom vg.Length
		for _, pn := range tc.Panels {
			for _, b := range pn.Bands {
				if _, v, ok := lastValue(pn.Years, b.Median); ok {
					endRoom = max(endRoom, endLabelWidth(th.labelStyle(), pn.bandEndText(b, v, named)))
				}
			}
			if _, v, ok := lastValue(pn.Years, pn.Focus.Values); ok {
				endRoom = max(endRoom, endLabelWidth(th.focusLabelStyle(), axisValueText(pn.Indicator, v)))
			}
		}
		return endRoom
	}
	plainRoom, namedRoom := endRoomOf(false), endRoomOf(true)
	var drawn []*TrendPlotter
	ps.dropped = func() int { return sumDropped(drawn, func(t *TrendPlotter) int { return t.Dropped }) }
	ps.make = func(w vg.Length, cols int) []*plot.Plot {
		drawn = drawn[:0]
		ph := ps.panelHeight(ps.panelWidth(w))
		dw := ps.dataWidth(w, cols, vg.Points(40))
		// Names go before the latest values when the column they need
		// still leaves the years three fifths of the data area.
		named := namedRoom <= dw*0.4
		endRoom := plainRoom
		if named {
			endRoom = namedRoom
		}
		out := make([]*plot.Plot, len(tc.Panels))
		for k, pn := range tc.Panels {
			p := newPlot(th)
			tp := &TrendPlotter{Panel: pn, Theme: th, EndRoom: endRoom, DataWidth: dw, NameEnds: named}
			drawn = append(drawn, tp)
			p.Add(grid(false, true), tp)
			// Year labels share the data area with the end labels.
			p.X.Tick.Marker = yearTicks{years: pn.Years, room: dw - min(endRoom, dw*0.4)}
			p.Y.Label.Text = fitAxisTitle(pn.Indicator, th, ph-30)
			p.Y.Tick.Marker = ticksFor(ph - 30)
			out[k] = p
		}
		return out
	}
	ps.panelHeight = func(pw vg.Length) vg.Length { return max(min(pw*0.62, vg.Points(260)), vg.Points(150)) }
	l := ps.legend
	focus := FocusMarker()
	focus.Radius = vg.Points(3.6)
	l.add(legendEntry{Text: tc.FocusName, Bold: true, Width: 20, Thumb: lineThumb(draw.LineStyle{Color: FocusColour, Width: vg.Points(2)}, &focus)})
	if len(tc.Panels) > 0 {
		bands := tc.Panels[0].showBands()
		for gi, b := range tc.Panels[0].Bands {
			s := GroupSeries(gi)
			mk := seriesMarker(s, vg.Points(2.4))
			line := lineThumb(draw.LineStyle{Color: s.Colour, Width: vg.Points(1.3), Dashes: s.Dashes}, &mk)
			if !bands {
				l.add(legendEntry{Text: b.Label + " median", Width: 20, Thumb: line})
				continue
			}
			band := fillThumb(tint(s.Colour, 46), nil)
			l.add(legendEntry{Text: b.Label + ": median and middle half", Width: 20, Thumb: func(c *draw.Canvas, r vg.Rectangle) { band(c, r); line(c, r) }})
		}
		if len(tc.Panels[0].Marks) > 0 {
			nm := NamedMarker()
			nm.Radius = vg.Points(2.4)
			l.add(legendEntry{Text: "Named institution", Width: 20, Thumb: lineThumb(draw.LineStyle{Color: greyMark, Width: vg.Points(0.9)}, &nm)})
		}
		if !bands {
			l.note = fmt.Sprintf("Medians only: the middle half of each group is shaded for up to %d groups. Latest values right of each line.", MaxBandGroups)
		}
	}
	tc.built = ps
	return ps
}

// Height implements Chart.
func (tc *TrendChart) Height(w vg.Length) vg.Length { return tc.panels().Height(w) }

// Draw implements Chart.
func (tc *TrendChart) Draw(c draw.Canvas) error { return tc.panels().Draw(c) }

// newTrend plans a trend chart from the model over the brief's span.
func newTrend(m *figures.Model, spec *brief.ChartBlock, th Theme) (Chart, error) {
	inds, groups, marks, err := chartSubjects(m, spec)
	if err != nil {
		return nil, err
	}
	if len(m.Years) < 2 {
		return nil, specError(spec, "a trend needs at least two years of data in the span [%d, %d]; widen years in the front matter", m.First, m.Last)
	}
	tc := &TrendChart{FocusName: institution(m, m.Focus).Name, Theme: th}
	for _, ind := range inds {
		pn := TrendPanel{Indicator: ind, Years: m.Years}
		pn.Focus = trendLine(m, ind, m.Focus, groups[0].Name, "")
		for _, inst := range marks {
			pn.Marks = append(pn.Marks, trendLine(m, ind, inst, groups[0].Name, fitName(institution(m, inst), th.labelStyle(), markNameWidth)))
		}
		for _, g := range groups {
			b := TrendBand{Label: g.Name}
			for _, y := range m.Years {
				d, ok := m.Distribution(g.Name, ind.Key, y)
				if !ok || d.N == 0 {
					b.Median, b.Q1, b.Q3 = append(b.Median, math.NaN()), append(b.Q1, math.NaN()), append(b.Q3, math.NaN())
					continue
				}
				b.Median, b.Q1, b.Q3 = append(b.Median, d.Median), append(b.Q1, d.Q1), append(b.Q3, d.Q3)
			}
			pn.Bands = append(pn.Bands, b)
		}
		tc.Panels = append(tc.Panels, pn)
	}
	return tc, nil
}

// trendLine reads an institution's yearly values: its recorded position
// where the model has one, else the dataset's observation.
func trendLine(m *figures.Model, ind dataset.Indicator, inst int, group, label string) TrendLine {
	l := TrendLine{Label: label}
	for _, y := range m.Years {
		v := math.NaN()
		if p, ok := m.Position(group, ind.Key, inst, y); ok {
			if p.HasValue {
				v = p.Value
			}
		} else if x, ok := valueOf(m, ind, inst, y); ok {
			v = x
		}
		l.Values = append(l.Values, v)
	}
	return l
}
