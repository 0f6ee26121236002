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
	"peerpack/internal/stats"
)

// ScatterGroup is one group's points; an institution in several groups is
// drawn once, in the first group listed.
type ScatterGroup struct {
	Label string
	X, Y  []float64
	// N is the group's own n: its members with both values, counted
	// whether or not an earlier group already drew them.
	N int
}

// ScatterMark is a named point.
type ScatterMark struct {
	Label string
	X, Y  float64
}

// ScatterChart plots two indicators against each other.
type ScatterChart struct {
	XInd, YInd dataset.Indicator
	Groups     []ScatterGroup
	Focus      ScatterMark
	HasFocus   bool
	Marks      []ScatterMark
	// Fit is the least-squares line over every plotted point, nil for
	// none.
	Fit *stats.LineFit
	// NoFit says why a line the block asked for is not drawn ("" when
	// drawn or not asked for).
	NoFit string
	// Arrows, when set, are drawn from the origin (the sector map's
	// loadings); they are scaled to the points' range by the plotter.
	Arrows []ScatterArrow
	// ArrowNote explains the arrows in the legend.
	ArrowNote string
	Theme     Theme
	built     *panels
}

// ScatterArrow is a direction from the origin with its label.
type ScatterArrow struct {
	Label  string
	DX, DY float64
}

// ScatterPlotter draws a ScatterChart's points, fit line and labels.
type ScatterPlotter struct {
	Chart   *ScatterChart
	Dropped int
}

// DataRange implements plot.DataRanger.
func (s *ScatterPlotter) DataRange() (xmin, xmax, ymin, ymax float64) {
	xlo, xhi, ylo, yhi := math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)
	see := func(x, y float64) {
		if math.IsNaN(x) || math.IsNaN(y) {
			return
		}
		xlo, xhi, ylo, yhi = math.Min(xlo, x), math.Max(xhi, x), math.Min(ylo, y), math.Max(yhi, y)
	}
	for _, g := range s.Chart.Groups {
		for i := range g.X {
			see(g.X[i], g.Y[i])
		}
	}
	if s.Chart.HasFocus {
		see(s.Chart.Focus.X, s.Chart.Focus.Y)
	}
	for _, m := range s.Chart.Marks {
		see(m.X, m.Y)
	}
	if math.IsInf(xlo, 0) {
		return 0, 1, 0, 1
	}
	px, py := padOf(xlo, xhi), padOf(ylo, yhi)
	return xlo - px, xhi + px, ylo - py, yhi + py
}

func padOf(lo, hi float64) float64 {
	if hi > lo {
		return (hi - lo) * 0.05
	}
	return math.Max(math.Abs(lo)*0.1, 1)
}

// Plot implements plot.Plotter.
func (s *ScatterPlotter) Plot(c draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&c)
	sc := s.Chart
	th := sc.Theme
	var obstacles []vg.Rectangle
	var lines [][]vg.Point
	if sc.Fit != nil {
		// Clip the line to the data range of the plot.
		x0, x1 := p.X.Min, p.X.Max
		a := vg.Point{X: trX(x0), Y: trY(sc.Fit.At(x0))}
		b := vg.Point{X: trX(x1), Y: trY(sc.Fit.At(x1))}
		ls := draw.LineStyle{Color: greyText, Width: vg.Points(1), Dashes: []vg.Length{vg.Points(4), vg.Points(2)}}
		for _, seg := range c.ClipLinesXY([]vg.Point{a, b}) {
			c.StrokeLines(ls, seg)
			lines = append(lines, seg)
		}
	}
	radius := vg.Points(2.3)
	var points []vg.Rectangle
	for gi, g := range sc.Groups {
		mk := seriesMarker(GroupSeries(gi), radius)
		mk.Fill = tint(mk.Fill, 170)
		for i := range g.X {
			if math.IsNaN(g.X[i]) || math.IsNaN(g.Y[i]) {
				continue
			}
			pt := vg.Point{X: trX(g.X[i]), Y: trY(g.Y[i])}
			if c.Contains(pt) {
				mk.Draw(&c, pt)
				points = append(points, mk.Rect(pt))
			}
		}
	}
	var labels []labelRequest
	if len(sc.Arrows) > 0 {
		lines = append(lines, s.drawArrows(&c, p, &labels)...)
	}
	named := NamedMarker()
	for _, m := range sc.Marks {
		pt := vg.Point{X: trX(m.X), Y: trY(m.Y)}
		named.Draw(&c, pt)
		obstacles = append(obstacles, named.Rect(pt))
		labels = append(labels, labelRequest{Anchor: pt, Text: m.Label, Style: th.labelStyle(), Gap: named.Radius, Priority: 1})
	}
	if sc.HasFocus {
		focus := FocusMarker()
		pt := vg.Point{X: trX(sc.Focus.X), Y: trY(sc.Focus.Y)}
		focus.Draw(&c, pt)
		obstacles = append(obstacles, focus.Rect(pt))
		labels = append(labels, labelRequest{Anchor: pt, Text: sc.Focus.Label, Style: th.focusLabelStyle(), Gap: focus.Radius, Priority: 0})
	}
	// Labels go to free space first (clear of every point, a leader line
	// back when moved out); only where the points leave none does a label
	// sit over them, on a white halo that keeps it legible.
	placed, dropped := placeLabelsAvoiding(labels, vg.Rectangle{Min: c.Min, Max: c.Max}, obstacles, points, lines...)
	s.Dropped = dropped
	for _, l := range placed {
		halo := l.Rect
		halo.Min.X, halo.Max.X = halo.Min.X-1, halo.Max.X+1
		c.SetColor(tint(whiteColor, 225))
		c.Fill(halo.Path())
	}
	drawLabels(&c, placed)
}

// drawArrows draws the arrows from the origin, the longest reaching 85 %
// of the way to the nearest edge of the plotted range, so their lengths
// compare with each other, not with the points' units.
func (s *ScatterPlotter) drawArrows(c *draw.Canvas, p *plot.Plot, labels *[]labelRequest) [][]vg.Point {
	trX, trY := p.Transforms(c)
	longest := 0.0
	for _, a := range s.Chart.Arrows {
		longest = math.Max(longest, math.Hypot(a.DX, a.DY))
	}
	reach := math.Min(math.Min(-p.X.Min, p.X.Max), math.Min(-p.Y.Min, p.Y.Max))
	if longest == 0 || reach <= 0 {
		return nil
	}
	scale := 0.85 * reach / longest
	ls := draw.LineStyle{Color: greyText, Width: vg.Points(0.8)}
	var out [][]vg.Point
	o := vg.Point{X: trX(0), Y: trY(0)}
	for _, a := range s.Chart.Arrows {
		tip := vg.Point{X: trX(a.DX * scale), Y: trY(a.DY * scale)}
		c.StrokeLines(ls, []vg.Point{o, tip})
		out = append(out, []vg.Point{o, tip})
		// a small open head, 4 pt long, at 25 degrees either side
		dx, dy := float64(tip.X-o.X), float64(tip.Y-o.Y)
		if l := math.Hypot(dx, dy); l > 0 {
			ux, uy := dx/l, dy/l
			for _, sgn := range []float64{1, -1} {
				ang := sgn * 25 * math.Pi / 180
				hx := ux*math.Cos(ang) - uy*math.Sin(ang)
				hy := ux*math.Sin(ang) + uy*math.Cos(ang)
				c.StrokeLines(ls, []vg.Point{tip, {X: tip.X - vg.Length(4*hx), Y: tip.Y - vg.Length(4*hy)}})
			}
		}
		*labels = append(*labels, labelRequest{Anchor: tip, Text: a.Label, Style: s.Chart.Theme.labelStyle(), Gap: 2, Priority: 2})
	}
	return out
}

func (sc *ScatterChart) panels() *panels {
	if sc.built != nil {
		return sc.built
	}
	th := sc.Theme
	ps := &panels{legend: &legend{th: th}, count: 1}
	ps.panelHeight = func(w vg.Length) vg.Length { return max(min(w*0.62, vg.Points(340)), vg.Points(170)) }
	var drawn *ScatterPlotter
	ps.dropped = func() int {
		if drawn == nil {
			return 0
		}
		return drawn.Dropped
	}
	ps.make = func(w vg.Length, _ int) []*plot.Plot {
		p := newPlot(th)
		drawn = &ScatterPlotter{Chart: sc}
		p.Add(grid(true, true), drawn)
		p.X.Label.Text = fitAxisTitle(sc.XInd, th, w-40)
		p.Y.Label.Text = fitAxisTitle(sc.YInd, th, ps.panelHeight(w)-40)
		return []*plot.Plot{p}
	}
	l := ps.legend
	if sc.HasFocus {
		l.add(legendEntry{Text: sc.Focus.Label, Bold: true, Thumb: markerThumb(FocusMarker())})
	}
	if len(sc.Marks) > 0 {
		l.add(legendEntry{Text: "Named institution", Thumb: markerThumb(NamedMarker())})
	}
	shared := false
	for gi, g := range sc.Groups {
		mk := seriesMarker(GroupSeries(gi), vg.Points(2.6))
		mk.Fill = tint(mk.Fill, 170)
		n := max(g.N, countPairs(g))
		shared = shared || n > countPairs(g)
		l.add(legendEntry{Text: fmt.Sprintf("%s (n = %d)", g.Label, n), Thumb: markerThumb(mk)})
	}
	if sc.Fit != nil {
		ls := draw.LineStyle{Color: greyText, Width: vg.Points(1), Dashes: []vg.Length{vg.Points(4), vg.Points(2)}}
		l.add(legendEntry{Text: fmt.Sprintf("Least-squares line over all points (R² = %s)", format.Number(sc.Fit.R2, 2)), Width: 20, Thumb: lineThumb(ls, nil)})
		l.note = "The line describes association in these groups, not cause; each point is one institution."
	}
	if sc.NoFit != "" {
		l.note = sc.NoFit
	}
	if shared {
		// Each group's n counts all its members; a point in two groups is
		// drawn once, so say in which colour.
		l.note = strings.TrimSpace(l.note + " An institution in more than one group is drawn once, in the colour of the first group listed.")
	}
	if len(sc.Arrows) > 0 {
		ls := draw.LineStyle{Color: greyText, Width: vg.Points(0.8)}
		l.add(legendEntry{Text: "Indicator loading (direction)", Width: 20, Thumb: lineThumb(ls, nil)})
		l.note = strings.TrimSpace(l.note + " " + sc.ArrowNote)
	}
	sc.built = ps
	return ps
}

func countPairs(g ScatterGroup) int {
	n := 0
	for i := range g.X {
		if !math.IsNaN(g.X[i]) && !math.IsNaN(g.Y[i]) {
			n++
		}
	}
	return n
}

// Height implements Chart.
func (sc *ScatterChart) Height(w vg.Length) vg.Length { return sc.panels().Height(w) }

// Draw implements Chart.
func (sc *ScatterChart) Draw(c draw.Canvas) error { return sc.panels().Draw(c) }

// newScatter plans a scatter of the block's two indicators over its
// groups' members in the chart year.
func newScatter(m *figures.Model, spec *brief.ChartBlock, th Theme) (Chart, error) {
	inds, groups, marks, err := chartSubjects(m, spec)
	if err != nil {
		return nil, err
	}
	if len(inds) != 2 {
		return nil, specError(spec, "a scatter takes exactly two indicators, x then y; found %d", len(inds))
	}
	year := chartYear(m, spec)
	sc := &ScatterChart{XInd: inds[0], YInd: inds[1], Theme: th}
	seen := map[int]bool{}
	var allX, allY []float64
	for _, g := range groups {
		sg := ScatterGroup{Label: g.Name}
		for _, pr := range m.MemberPairs(g.Name, sc.XInd.Key, sc.YInd.Key, year) {
			if !math.IsNaN(pr.X) && !math.IsNaN(pr.Y) {
				sg.N++
			}
			if seen[pr.Institution] {
				continue
			}
			seen[pr.Institution] = true
			sg.X, sg.Y = append(sg.X, pr.X), append(sg.Y, pr.Y)
		}
		allX, allY = append(allX, sg.X...), append(allY, sg.Y...)
		sc.Groups = append(sc.Groups, sg)
	}
	sc.markFocusAndNamed(m, marks, year)
	if spec.Fit {
		// A line over a handful of points claims an association the data
		// cannot carry: the same floor as any statement that two
		// indicators move together.
		if len(allX) < figures.MinCorrelationPairs {
			sc.NoFit = fmt.Sprintf("No line is drawn: %d institutions have both values, fewer than the %d needed before an association is read.", len(allX), figures.MinCorrelationPairs)
		} else if f, ok := stats.FitLine(allX, allY); ok {
			sc.Fit = &f
		}
	}
	return sc, nil
}

// markFocusAndNamed places the focus and the named institutions that have
// both values in the year, for every chart drawn as a scatter.
func (sc *ScatterChart) markFocusAndNamed(m *figures.Model, marks []int, year int) {
	th := sc.Theme
	fx, okx := valueOf(m, sc.XInd, m.Focus, year)
	fy, oky := valueOf(m, sc.YInd, m.Focus, year)
	if okx && oky {
		sc.HasFocus = true
		sc.Focus = ScatterMark{Label: fitName(institution(m, m.Focus), th.focusLabelStyle(), markNameWidth), X: fx, Y: fy}
	}
	for _, inst := range marks {
		x, okx := valueOf(m, sc.XInd, inst, year)
		y, oky := valueOf(m, sc.YInd, inst, year)
		if okx && oky {
			sc.Marks = append(sc.Marks, ScatterMark{Label: fitName(institution(m, inst), th.labelStyle(), markNameWidth), X: x, Y: y})
		}
	}
}
