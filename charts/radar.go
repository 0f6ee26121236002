package charts

import (
	"fmt"
	"math"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
)

// RadarAxis is one spoke of a radar chart. Values on it run from Inner
// (centre) to Outer (rim); for a lower-is-better indicator on a value
// scale Inner is the larger number, so outward is always better.
type RadarAxis struct {
	Label                string
	Inner, Outer         float64
	InnerText, OuterText string
}

// RadarSeries is one polygon: a value per axis (NaN: missing), drawn in
// the focus style when Focus is set, else in group style Index.
type RadarSeries struct {
	Label  string
	Values []float64
	Focus  bool
	// Index selects the group series style (colour, dash, shape); for a
	// focus series it selects only the dash.
	Index int
}

// RadarChart is a profile over several indicators.
type RadarChart struct {
	Axes   []RadarAxis
	Series []RadarSeries
	// Percentile marks the 0-100 percentile scale: the chart then shows
	// the group median (50) ring and the middle-half (25-75) band.
	Percentile bool
	// Common marks one scale shared by every spoke (shares of one whole,
	// such as a subject profile): rings are labelled in the unit and the
	// focus's value is printed at each vertex.
	Common     bool
	CommonStep float64
	Unit       dataset.Indicator // prints ring values on the common scale
	Note       string
	Theme      Theme
	built      *panels
}

// RadarPlotter draws a RadarChart in the whole data canvas.
type RadarPlotter struct{ Chart *RadarChart }

// geometry places the radar in the canvas, keeping room around the rim
// for spoke labels of labelWidth (two lines above and below).
func (r *RadarPlotter) geometry(c draw.Canvas) (centre vg.Point, radius, labelWidth vg.Length) {
	w, h := c.Max.X-c.Min.X, c.Max.Y-c.Min.Y
	labelWidth = max(min(w*0.2, vg.Points(88)), vg.Points(50))
	centre = vg.Point{X: c.Min.X + w/2, Y: c.Min.Y + h/2}
	radius = min(w/2-labelWidth-8, h/2-vg.Points(32))
	return centre, max(radius, vg.Points(30)), labelWidth
}

// spoke returns the point at fraction f (0 centre, 1 rim) of axis i; the
// first axis points straight up and the rest follow clockwise.
func spoke(centre vg.Point, radius vg.Length, i, n int, f float64) vg.Point {
	a := math.Pi/2 - 2*math.Pi*float64(i)/float64(n)
	return vg.Point{X: centre.X + radius*vg.Length(f*math.Cos(a)), Y: centre.Y + radius*vg.Length(f*math.Sin(a))}
}

// fraction maps a value to its place along an axis, clamped to the rim.
func (ax RadarAxis) fraction(v float64) float64 {
	if ax.Outer == ax.Inner {
		return 0.5
	}
	return math.Max(0, math.Min(1, (v-ax.Inner)/(ax.Outer-ax.Inner)))
}

// Plot implements plot.Plotter.
func (r *RadarPlotter) Plot(c draw.Canvas, _ *plot.Plot) {
	rc := r.Chart
	th := rc.Theme
	n := len(rc.Axes)
	if n < 3 {
		return
	}
	ctr, rad, labelWidth := r.geometry(c)
	ring := func(f float64) []vg.Point {
		pts := make([]vg.Point, n+1)
		for i := 0; i <= n; i++ {
			pts[i] = spoke(ctr, rad, i%n, n, f)
		}
		return pts
	}
	if rc.Percentile {
		band := append(ring(0.75), reverse(ring(0.25))...)
		c.FillPolygon(greyBand, band)
		c.SetColor(whiteColor)
	}
	gridLS := draw.LineStyle{Color: greyGrid, Width: vg.Points(0.5)}
	for _, f := range []float64{0.25, 0.5, 0.75, 1} {
		ls := gridLS
		if rc.Percentile && f == 0.5 {
			ls = draw.LineStyle{Color: greyText, Width: vg.Points(0.9), Dashes: []vg.Length{vg.Points(3), vg.Points(2)}}
		}
		c.StrokeLines(ls, ring(f))
	}
	for i := 0; i < n; i++ {
		c.StrokeLine2(gridLS, ctr.X, ctr.Y, spoke(ctr, rad, i, n, 1).X, spoke(ctr, rad, i, n, 1).Y)
	}
	// Groups first, the focus last so it is never hidden.
	order := make([]RadarSeries, 0, len(rc.Series))
	for _, s := range rc.Series {
		if !s.Focus {
			order = append(order, s)
		}
	}
	for _, s := range rc.Series {
		if s.Focus {
			order = append(order, s)
		}
	}
	for _, s := range order {
		ls, mk := radarStyle(s)
		var pts []vg.Point
		for i := 0; i < n; i++ {
			if i >= len(s.Values) || math.IsNaN(s.Values[i]) {
				// A missing value breaks the outline rather than
				// pretending to be zero.
				if len(pts) > 1 {
					c.StrokeLines(ls, pts)
				}
				pts = nil
				continue
			}
			pts = append(pts, spoke(ctr, rad, i, n, rc.Axes[i].fraction(s.Values[i])))
		}
		if len(pts) == n {
			pts = append(pts, pts[0])
		}
		if len(pts) > 1 {
			c.StrokeLines(ls, pts)
		}
		for i := 0; i < n; i++ {
			if i < len(s.Values) && !math.IsNaN(s.Values[i]) {
				mk.Draw(&c, spoke(ctr, rad, i, n, rc.Axes[i].fraction(s.Values[i])))
			}
		}
	}
	// Spoke labels outside the rim, aligned away from the centre, with
	// the axis range underneath on a value scale.
	lab := th.labelStyle()
	lab.Color = PaletteBlack
	small := th.text(sizeTick-0.5, false, greyText)
	for i, ax := range rc.Axes {
		pt := spoke(ctr, rad, i, n, 1)
		a := math.Pi/2 - 2*math.Pi*float64(i)/float64(n)
		dx, dy := math.Cos(a), math.Sin(a)
		align := draw.XCenter
		switch {
		case dx > 0.2:
			align = draw.XLeft
		case dx < -0.2:
			align = draw.XRight
		}
		x := pt.X + vg.Length(dx)*6
		lw := labelWidth
		if align == draw.XCenter {
			// Labels above and below the rim may spread sideways.
			lw = min((c.Max.X-c.Min.X)*0.45, vg.Points(170))
		}
		lines := wrapText(ax.Label, lab, lw, 3)
		nameLines := len(lines)
		if rc.Common && ax.InnerText != "" {
			lines = append(lines, wrapText(ax.InnerText, small, lw, 2)...)
		} else if !rc.Percentile && !rc.Common {
			lines = append(lines, wrapText(ax.InnerText+" → "+ax.OuterText, small, lw, 2)...)
		}
		lh := textHeight(lab) + 1
		total := lh * vg.Length(len(lines))
		// Top of the block: above the rim for upper spokes, below for
		// lower ones, centred for side spokes.
		top := pt.Y + vg.Length(dy)*6 + total/2 + vg.Length(dy)*total/2
		for k, line := range lines {
			sty := lab
			if k >= nameLines {
				sty = small
			}
			base := top - lh*vg.Length(k+1) + sty.FontExtents().Descent
			fillText(&c, sty, x, base, align, line)
		}
	}
	if rc.Common {
		// Ring values along the first spoke, in the unit, and the focus's
		// value beside each of its vertices, just outside the polygon.
		// Ring values sit on the edge between the first two spokes, clear
		// of the spoke names and of the focus's values on the spokes.
		// With few spokes (or a small radar) the edge midpoints crowd
		// together; a ring value that would touch the one before it is left
		// out (the rim's value is always printed, and the note states the
		// scale).
		var ringAt []vg.Point
		for _, f := range []float64{0.25, 0.5, 0.75, 1} {
			a, b := spoke(ctr, rad, 0, n, f), spoke(ctr, rad, 1, n, f)
			ringAt = append(ringAt, vg.Point{X: (a.X+b.X)/2 + 2, Y: (a.Y+b.Y)/2 + 1.5})
		}
		keep := make([]bool, len(ringAt))
		keep[len(keep)-1] = true
		last := ringAt[len(ringAt)-1]
		for k := len(ringAt) - 2; k >= 0; k-- {
			p := ringAt[k]
			w := small.Width(ringText(rc.Unit, float64(k+1)*rc.CommonStep, rc.CommonStep))
			if last.Y-p.Y >= textHeight(small)+1 || last.X-p.X >= w+3 {
				keep[k], last = true, p
			}
		}
		for k, p := range ringAt {
			if keep[k] {
				fillText(&c, small, p.X, p.Y, draw.XLeft, ringText(rc.Unit, float64(k+1)/4*rc.Axes[0].Outer, rc.CommonStep))
			}
		}
		val := th.focusLabelStyle()
		for _, s := range rc.Series {
			if !s.Focus {
				continue
			}
			for i := 0; i < n && i < len(s.Values); i++ {
				if math.IsNaN(s.Values[i]) {
					continue
				}
				a := math.Pi/2 - 2*math.Pi*float64(i)/float64(n)
				f := rc.Axes[i].fraction(s.Values[i])
				pt := spoke(ctr, rad, i, n, f)
				align := draw.XLeft
				if math.Cos(a) < -0.2 {
					align = draw.XRight
				}
				off := vg.Length(7)
				if f > 0.8 {
					// Near the rim the value goes inside the vertex, clear
					// of the spoke's name outside the rim.
					off = -off
					switch {
					case math.Cos(a) < -0.2:
						align = draw.XLeft
					case math.Cos(a) > 0.2:
						align = draw.XRight
					}
				}
				fillText(&c, val, pt.X+off*vg.Length(math.Cos(a))+2*vg.Length(math.Cos(a)), pt.Y+off*vg.Length(math.Sin(a))-textHeight(val)/3, align, valueText(rc.Unit, s.Values[i]))
			}
		}
	}
	if rc.Percentile {
		// Ring values along the first spoke.
		for _, f := range []float64{0.25, 0.5, 0.75} {
			pt := spoke(ctr, rad, 0, n, f)
			fillText(&c, small, pt.X+2, pt.Y+1.5, draw.XLeft, fmt.Sprintf("%d", int(f*100)))
		}
	}
}

func reverse(pts []vg.Point) []vg.Point {
	out := make([]vg.Point, len(pts))
	for i, p := range pts {
		out[len(pts)-1-i] = p
	}
	return out
}

// radarStyle is the line and vertex mark of a series.
func radarStyle(s RadarSeries) (draw.LineStyle, Marker) {
	g := GroupSeries(s.Index)
	if s.Focus {
		mk := FocusMarker()
		mk.Radius = vg.Points(3.4)
		dash := []vg.Length(nil)
		if s.Index > 0 {
			dash = g.Dashes
		}
		return draw.LineStyle{Color: FocusColour, Width: vg.Points(1.8), Dashes: dash}, mk
	}
	return draw.LineStyle{Color: g.Colour, Width: vg.Points(1.2), Dashes: g.Dashes}, seriesMarker(g, vg.Points(2.4))
}

func (rc *RadarChart) panels() *panels {
	if rc.built != nil {
		return rc.built
	}
	th := rc.Theme
	ps := &panels{legend: &legend{th: th}, count: 1}
	ps.panelHeight = func(w vg.Length) vg.Length {
		// As tall as the widest radar the width allows, plus label room.
		lw := max(min(w*0.2, vg.Points(88)), vg.Points(50))
		return max(min(2*(w/2-lw-8)+vg.Points(70), vg.Points(330)), vg.Points(160))
	}
	ps.make = func(vg.Length, int) []*plot.Plot {
		p := newPlot(th)
		p.HideAxes()
		p.Add(&RadarPlotter{Chart: rc})
		return []*plot.Plot{p}
	}
	l := ps.legend
	for _, s := range rc.Series {
		ls, mk := radarStyle(s)
		l.add(legendEntry{Text: s.Label, Bold: s.Focus, Width: 20, Thumb: lineThumb(ls, &mk)})
	}
	if rc.Percentile {
		l.add(legendEntry{Text: "Group median (50th percentile)", Width: 20, Thumb: lineThumb(draw.LineStyle{Color: greyText, Width: vg.Points(0.9), Dashes: []vg.Length{vg.Points(3), vg.Points(2)}}, nil)})
		l.add(legendEntry{Text: "Middle half of the group (25th–75th)", Thumb: fillThumb(greyBand, greyGrid)})
	}
	l.note = rc.Note
	rc.built = ps
	return ps
}

// Height implements Chart.
func (rc *RadarChart) Height(w vg.Length) vg.Length { return rc.panels().Height(w) }

// Draw implements Chart.
func (rc *RadarChart) Draw(c draw.Canvas) error { return rc.panels().Draw(c) }

// newRadar plans a radar chart. On the percentile scale (the default)
// each group contributes the focus's percentile rank in it, against the
// median ring at 50; on the range scale each axis runs over the values of
// the chart's groups and the polygons are the focus's values and the
// groups' medians.
func newRadar(m *figures.Model, spec *brief.ChartBlock, th Theme) (Chart, error) {
	inds, err := chartIndicators(m, spec)
	if err != nil {
		return nil, err
	}
	if len(inds) < 3 {
		return nil, specError(spec, "a radar needs at least three indicators; found %d (use a box chart for fewer)", len(inds))
	}
	groups, err := chartGroups(m, spec)
	if err != nil {
		return nil, err
	}
	year := chartYear(m, spec)
	focusName := institution(m, m.Focus).Name
	rc := &RadarChart{Theme: th}
	switch spec.Scale {
	case "", "percentile":
		rc.Percentile = true
		for _, ind := range inds {
			rc.Axes = append(rc.Axes, RadarAxis{Label: shortName(ind), Inner: 0, Outer: 100})
		}
		for gi, g := range groups {
			s := RadarSeries{Label: fmt.Sprintf("%s: percentile in %s", focusName, g.Name), Focus: true, Index: gi}
			for _, ind := range inds {
				v := math.NaN()
				if p, ok := m.Position(g.Name, ind.Key, m.Focus, year); ok && p.HasValue {
					v = p.Percentile
				}
				s.Values = append(s.Values, v)
			}
			rc.Series = append(rc.Series, s)
		}
		rc.Note = radarNote(inds, true)
	case "common":
		return commonRadar(m, spec, rc, inds, groups, year, focusName)
	case "range":
		for _, ind := range inds {
			lo, hi := math.Inf(1), math.Inf(-1)
			for _, g := range groups {
				if d, ok := m.Distribution(g.Name, ind.Key, year); ok && d.N > 0 {
					lo, hi = math.Min(lo, d.Min), math.Max(hi, d.Max)
				}
			}
			if math.IsInf(lo, 0) {
				return nil, specError(spec, "no group has values of %s in %d", ind.Key, year)
			}
			// The unit goes in the spoke's name so the range stays short.
			ax := RadarAxis{Label: shortName(ind) + " (" + unitWords(ind) + ")", Inner: lo, Outer: hi}
			if ind.Better == dataset.LowerIsBetter {
				ax.Inner, ax.Outer = hi, lo
			}
			ax.InnerText, ax.OuterText = format.Number(ax.Inner, ind.Decimals), format.Number(ax.Outer, ind.Decimals)
			rc.Axes = append(rc.Axes, ax)
		}
		for gi, g := range groups {
			s := RadarSeries{Label: g.Name + ": median", Index: gi}
			for _, ind := range inds {
				v := math.NaN()
				if d, ok := m.Distribution(g.Name, ind.Key, year); ok && d.N > 0 {
					v = d.Median
				}
				s.Values = append(s.Values, v)
			}
			rc.Series = append(rc.Series, s)
		}
		f := RadarSeries{Label: focusName, Focus: true}
		for _, ind := range inds {
			v, _ := valueOf(m, ind, m.Focus, year)
			f.Values = append(f.Values, v)
		}
		rc.Series = append(rc.Series, f)
		rc.Note = radarNote(inds, false)
	default:
		return nil, specError(spec, "scale %q: use percentile, range or common", spec.Scale)
	}
	return rc, nil
}

// radarNote says how to read the spokes; it speaks of better and worse
// only for indicators with a declared better direction.
func radarNote(inds []dataset.Indicator, percentile bool) string {
	judged, neutral := 0, 0
	for _, ind := range inds {
		if ind.Better == dataset.Neutral {
			neutral++
		} else {
			judged++
		}
	}
	var s string
	switch {
	case percentile && neutral == 0:
		s = "Percentile ranks run in each indicator's better direction: outward is better on every spoke."
	case percentile && judged == 0:
		s = "Percentile ranks: outward means a higher value than more of the group; no direction is better."
	case percentile:
		s = "Percentile ranks: outward is better on spokes with a better direction and simply higher on neutral ones."
	case neutral == 0:
		s = "Each spoke runs from the worst value in the groups shown (centre) to the best (rim)."
	case judged == 0:
		s = "Each spoke runs from the lowest value in the groups shown (centre) to the highest (rim); no direction is better."
	default:
		s = "Each spoke runs from the worst value in the groups shown to the best, or from lowest to highest on neutral spokes."
	}
	if !percentile {
		s += " Spokes have different scales and are not comparable with each other."
	}
	return s
}

// commonRadar plans a radar whose spokes share one scale, from zero at the
// centre to a round value at the rim: the form for shares of one whole
// (a subject profile), where per-spoke ranges would make every profile
// look extreme. The polygons are the focus's values and the groups'
// medians; each spoke names its medians, the focus's values are printed at
// its vertices, and the note states the scale.
func commonRadar(m *figures.Model, spec *brief.ChartBlock, rc *RadarChart, inds []dataset.Indicator, groups []*figures.Group, year int, focusName string) (Chart, error) {
	for _, ind := range inds[1:] {
		if ind.Unit != inds[0].Unit {
			return nil, specError(spec, "scale common puts every spoke on one scale, so the indicators need one unit: %s is %s and %s is %s; use scale: range or percentile", inds[0].Key, unitWords(inds[0]), ind.Key, unitWords(ind))
		}
	}
	top := 0.0
	medians := make([][]float64, len(groups))
	for gi, g := range groups {
		s := RadarSeries{Label: g.Name + ": median", Index: gi}
		for _, ind := range inds {
			v := math.NaN()
			if d, ok := m.Distribution(g.Name, ind.Key, year); ok && d.N > 0 {
				v = d.Median
				top = math.Max(top, v)
			}
			s.Values = append(s.Values, v)
		}
		medians[gi] = s.Values
		rc.Series = append(rc.Series, s)
	}
	f := RadarSeries{Label: focusName, Focus: true}
	for _, ind := range inds {
		v, ok := valueOf(m, ind, m.Focus, year)
		if ok {
			top = math.Max(top, v)
		} else {
			v = math.NaN()
		}
		f.Values = append(f.Values, v)
	}
	rc.Series = append(rc.Series, f)
	if top <= 0 {
		return nil, specError(spec, "no positive value to scale the radar by in %d", year)
	}
	step := ceilStep(top / 4)
	outer := step * 4
	rc.Common, rc.CommonStep, rc.Unit = true, step, inds[0]
	for i, ind := range inds {
		ax := RadarAxis{Label: shortName(ind), Inner: 0, Outer: outer}
		var parts []string
		for gi := range groups {
			if v := medians[gi][i]; !math.IsNaN(v) {
				parts = append(parts, valueText(ind, v))
			}
		}
		switch {
		case len(parts) == 1:
			ax.InnerText = "median " + parts[0]
		case len(parts) > 1:
			ax.InnerText = "medians " + strings.Join(parts, ", ")
		}
		rc.Axes = append(rc.Axes, ax)
	}
	rc.Note = "Every spoke shares one scale, from 0 at the centre to " + ringText(inds[0], outer, step) + " at the rim (rings every " + ringText(inds[0], step, step) + "); values beside the points are " + focusName + "'s."
	return rc, nil
}

// ceilStep rounds a positive step up to 1, 2, 2.5 or 5 times a power of
// ten, so ring values read as round numbers (common practice, no source).
func ceilStep(x float64) float64 {
	if x <= 0 || math.IsNaN(x) || math.IsInf(x, 0) {
		return 1
	}
	p := math.Pow(10, math.Floor(math.Log10(x)))
	for _, k := range []float64{1, 2, 2.5, 5, 10} {
		if k*p >= x*(1-1e-12) {
			return k * p
		}
	}
	return 10 * p
}

// ringText prints a ring value of a common-scale radar with the decimals
// its step needs ("10%", not "10.0%"), in the indicator's unit.
func ringText(ind dataset.Indicator, v, step float64) string {
	d := 0
	if step > 0 {
		d = max(0, -int(math.Floor(math.Log10(step)+1e-9)))
	}
	ind.Decimals = d
	return valueText(ind, v)
}
