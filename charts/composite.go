package charts

import (
	"errors"
	"image/color"
	"math"

	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"peerpack/internal/format"
)

// The composite's charts: rank intervals of the focus and its neighbours,
// pillar contributions, the flow from indicators to pillars to the overall
// score with weights as widths, and the focus's headroom. They are drawn
// straight onto gonum/plot's draw.Canvas: each is a label column and a
// horizontal scale (or, for the flow, three columns of nodes), in the
// theme's type, with the focus in its reserved colour and diamond.

// IntervalRow is one institution of the rank-interval chart.
type IntervalRow struct {
	Name                    string
	Focus                   bool
	Rank, Low, Median, High int
}

// RankIntervalChart draws each row's 5th-95th percentile rank interval
// with its median tick and base rank mark; rank 1 is on the left.
type RankIntervalChart struct {
	Rows  []IntervalRow
	Theme Theme
}

// ContributionRow is one pillar's part of the focus's composite score.
type ContributionRow struct {
	Label string
	// Value is the pillar weight times the pillar score (arithmetic) or
	// the pillar score itself (geometric), as Title says.
	Value float64
}

// ContributionChart draws one horizontal bar per pillar from zero.
type ContributionChart struct {
	Rows     []ContributionRow
	Decimals int
	Axis     string
	Theme    Theme
}

// FlowIndicator and FlowPillar are the nodes of the flow diagram.
type FlowIndicator struct {
	Label  string
	Pillar int
	// Weight is the indicator's share of the overall score (pillar weight
	// times weight within the pillar).
	Weight float64
}

// FlowPillar is a pillar with its weight in the overall score.
type FlowPillar struct {
	Label  string
	Weight float64
}

// FlowChart draws indicators -> pillars -> overall, each band as wide as
// the weight it carries.
type FlowChart struct {
	Indicators []FlowIndicator
	Pillars    []FlowPillar
	Overall    string
	Theme      Theme
}

// HeadroomRow is one indicator's change needed to reach the target rank.
type HeadroomRow struct {
	Label string
	// Pct is the change needed as a percentage of the current value
	// (magnitude); Reachable false means no change within the observed
	// range does it alone.
	Pct       float64
	Reachable bool
}

// HeadroomChart draws the change each indicator alone would need.
type HeadroomChart struct {
	Rows  []HeadroomRow
	Axis  string
	Theme Theme
}

const (
	rowPitch   = vg.Length(15) // points between rows
	axisRoom   = vg.Length(32) // tick labels and axis title below the data
	labelShare = 0.34          // the label column's largest share of the width
)

var errTooSmall = errors.New("the area is too small for the chart")

// labelColumn is the width of the label column for the labels.
func labelColumn(sty text.Style, labels []string, width vg.Length) vg.Length {
	w := vg.Length(0)
	for _, l := range labels {
		w = max(w, sty.Width(l))
	}
	return min(w+vg.Points(6), width*labelShare)
}

// scaleAxis draws a horizontal axis at y from x0 to x1 for values lo..hi
// with nice ticks and a title under it, and returns the mapping.
func scaleAxis(c *draw.Canvas, th Theme, x0, x1, y vg.Length, lo, hi float64, title string, decimals int) func(float64) vg.Length {
	at := func(v float64) vg.Length {
		if hi == lo {
			return (x0 + x1) / 2
		}
		return x0 + vg.Length((v-lo)/(hi-lo))*(x1-x0)
	}
	axis := draw.LineStyle{Color: greyAxis, Width: vg.Points(0.5)}
	gridStyle := draw.LineStyle{Color: greyGrid, Width: vg.Points(0.4)}
	c.StrokeLine2(axis, x0, y, x1, y)
	tick := th.tickStyle()
	for _, t := range ticksFor(x1-x0).Ticks(lo, hi) {
		if t.Label == "" || t.Value < lo || t.Value > hi {
			continue
		}
		x := at(t.Value)
		c.StrokeLine2(axis, x, y, x, y-vg.Points(3))
		c.StrokeLine2(gridStyle, x, y, x, c.Max.Y)
		fillText(c, tick, x, y-vg.Points(3)-tick.FontExtents().Ascent, draw.XCenter, format.Number(t.Value, decimals))
	}
	ax := th.axisStyle()
	fillText(c, ax, (x0+x1)/2, c.Min.Y+ax.FontExtents().Descent, draw.XCenter, fitText(title, ax, x1-x0))
	return at
}

// Height implements Chart.
func (ch *RankIntervalChart) Height(width vg.Length) vg.Length {
	return vg.Length(len(ch.Rows))*rowPitch + axisRoom + vg.Points(6)
}

// Draw implements Chart.
func (ch *RankIntervalChart) Draw(c draw.Canvas) error {
	if len(ch.Rows) == 0 {
		return nil
	}
	th := ch.Theme
	names := make([]string, len(ch.Rows))
	lo, hi := math.Inf(1), math.Inf(-1)
	for i, r := range ch.Rows {
		names[i] = r.Name
		lo, hi = math.Min(lo, float64(r.Low)), math.Max(hi, float64(r.High))
	}
	lo, hi = math.Max(1, lo-1), hi+1
	lab := labelColumn(th.labelStyle(), names, c.Max.X-c.Min.X)
	x0, x1 := c.Min.X+lab, c.Max.X-vg.Points(8)
	if x1-x0 < vg.Points(60) {
		return errTooSmall
	}
	at := scaleAxis(&c, th, x0, x1, c.Min.Y+axisRoom, lo, hi, "Composite rank (1 = best): base rank, 5th–95th percentile of runs, | median", 0)
	top := c.Max.Y - vg.Points(4)
	for i, r := range ch.Rows {
		y := top - vg.Length(i)*rowPitch - rowPitch/2
		sty := th.labelStyle()
		line := draw.LineStyle{Color: greyMark, Width: vg.Points(1.6)}
		mk := NamedMarker()
		if r.Focus {
			sty = th.focusLabelStyle()
			line = draw.LineStyle{Color: FocusColour, Width: vg.Points(2.2)}
			mk = FocusMarker()
		}
		fillText(&c, sty, c.Min.X, y-textHeight(sty)/2+sty.FontExtents().Descent, draw.XLeft, fitText(r.Name, sty, lab-vg.Points(6)))
		c.StrokeLine2(line, at(float64(r.Low)), y, at(float64(r.High)), y)
		tick := draw.LineStyle{Color: PaletteBlack, Width: vg.Points(0.9)}
		c.StrokeLine2(tick, at(float64(r.Median)), y-vg.Points(4), at(float64(r.Median)), y+vg.Points(4))
		mk.Draw(&c, vg.Point{X: at(float64(r.Rank)), Y: y})
	}
	return nil
}

// Height implements Chart.
func (ch *ContributionChart) Height(width vg.Length) vg.Length {
	return vg.Length(len(ch.Rows))*rowPitch + axisRoom + vg.Points(6)
}

// Draw implements Chart.
func (ch *ContributionChart) Draw(c draw.Canvas) error {
	labels := make([]string, len(ch.Rows))
	lo, hi := 0.0, 0.0
	for i, r := range ch.Rows {
		labels[i] = r.Label
		lo, hi = math.Min(lo, r.Value), math.Max(hi, r.Value)
	}
	return barRows(c, ch.Theme, labels, lo, hi, ch.Axis, func(i int) (float64, bool, string) {
		return ch.Rows[i].Value, true, format.Number(ch.Rows[i].Value, ch.Decimals)
	})
}

// Height implements Chart.
func (ch *HeadroomChart) Height(width vg.Length) vg.Length {
	return vg.Length(len(ch.Rows))*rowPitch + axisRoom + vg.Points(6)
}

// Draw implements Chart.
func (ch *HeadroomChart) Draw(c draw.Canvas) error {
	labels := make([]string, len(ch.Rows))
	hi := 0.0
	for i, r := range ch.Rows {
		labels[i] = r.Label
		if r.Reachable {
			hi = math.Max(hi, r.Pct)
		}
	}
	if hi == 0 {
		hi = 1
	}
	return barRows(c, ch.Theme, labels, 0, hi, ch.Axis, func(i int) (float64, bool, string) {
		r := ch.Rows[i]
		if !r.Reachable {
			return 0, false, "not alone, even at the best value observed"
		}
		return r.Pct, true, format.Number(r.Pct, 1) + " %"
	})
}

// barRows draws labelled horizontal bars from zero with the value printed
// at the bar's end (or a note where there is no bar).
func barRows(c draw.Canvas, th Theme, labels []string, lo, hi float64, axis string, row func(int) (float64, bool, string)) error {
	if len(labels) == 0 {
		return nil
	}
	lab := labelColumn(th.labelStyle(), labels, c.Max.X-c.Min.X)
	x0, x1 := c.Min.X+lab, c.Max.X-vg.Points(40)
	if x1-x0 < vg.Points(60) {
		return errTooSmall
	}
	span := hi - lo
	if span == 0 {
		span = 1
	}
	at := scaleAxis(&c, th, x0, x1, c.Min.Y+axisRoom, lo-0.02*span, hi+0.02*span, axis, decimalsFor(span))
	top := c.Max.Y - vg.Points(4)
	sty := th.labelStyle()
	for i, l := range labels {
		y := top - vg.Length(i)*rowPitch - rowPitch/2
		base := y - textHeight(sty)/2 + sty.FontExtents().Descent
		fillText(&c, sty, c.Min.X, base, draw.XLeft, fitText(l, sty, lab-vg.Points(6)))
		v, ok, note := row(i)
		if !ok {
			fillText(&c, sty, at(0)+vg.Points(3), base, draw.XLeft, fitText(note, sty, c.Max.X-at(0)-vg.Points(3)))
			continue
		}
		a, b := at(math.Min(0, v)), at(math.Max(0, v))
		h := rowPitch * 0.55
		c.FillPolygon(GroupSeries(0).Colour, []vg.Point{{X: a, Y: y - h/2}, {X: b, Y: y - h/2}, {X: b, Y: y + h/2}, {X: a, Y: y + h/2}})
		if v < 0 {
			// right of the zero line, clear of the label column
			fillText(&c, sty, at(0)+vg.Points(3), base, draw.XLeft, note)
		} else {
			fillText(&c, sty, b+vg.Points(3), base, draw.XLeft, note)
		}
	}
	c.StrokeLine2(draw.LineStyle{Color: PaletteBlack, Width: vg.Points(0.6)}, at(0), c.Min.Y+axisRoom, at(0), c.Max.Y)
	return nil
}

// decimalsFor gives tick labels enough decimals for a span.
func decimalsFor(span float64) int {
	switch {
	case span >= 20:
		return 0
	case span >= 2:
		return 1
	}
	return 2
}

// Height implements Chart.
func (ch *FlowChart) Height(width vg.Length) vg.Length {
	n := max(len(ch.Indicators), 2*len(ch.Pillars))
	return vg.Length(n)*vg.Points(17) + vg.Points(22)
}

// Draw implements Chart.
func (ch *FlowChart) Draw(c draw.Canvas) error {
	th := ch.Theme
	sty := th.labelStyle()
	bold := th.focusLabelStyle()
	W := c.Max.X - c.Min.X
	H := c.Max.Y - c.Min.Y - vg.Points(22)
	if W < vg.Points(200) || H < vg.Points(40) || len(ch.Indicators) == 0 {
		return errTooSmall
	}
	labW := W * 0.36
	nodeW := vg.Points(7)
	xInd := c.Min.X + labW
	xPil := c.Min.X + W*0.55
	xAll := c.Max.X - min(bold.Width(ch.Overall)+vg.Points(8), W*0.2) - nodeW
	gap := vg.Points(5)
	// stacked node positions, heights proportional to weight
	stack := func(weights []float64, x vg.Length) []vg.Rectangle {
		total := 0.0
		for _, w := range weights {
			total += w
		}
		room := H - gap*vg.Length(len(weights)-1)
		out := make([]vg.Rectangle, len(weights))
		y := c.Max.Y - vg.Points(6)
		for i, w := range weights {
			h := room * vg.Length(w/total)
			out[i] = vg.Rectangle{Min: vg.Point{X: x, Y: y - h}, Max: vg.Point{X: x + nodeW, Y: y}}
			y -= h + gap
		}
		return out
	}
	// indicators in pillar order
	order := make([]int, 0, len(ch.Indicators))
	for q := range ch.Pillars {
		for j, ind := range ch.Indicators {
			if ind.Pillar == q {
				order = append(order, j)
			}
		}
	}
	iw := make([]float64, len(order))
	for k, j := range order {
		iw[k] = ch.Indicators[j].Weight
	}
	pw := make([]float64, len(ch.Pillars))
	for q, p := range ch.Pillars {
		pw[q] = p.Weight
	}
	indR := stack(iw, xInd)
	pilR := stack(pw, xPil)
	allR := stack([]float64{1}, xAll)[0]
	band := func(col color.Color, a, b vg.Rectangle) {
		// a band from the right edge of a to the left edge of b, with
		// cubic edges (control points half-way across)
		mid := (a.Max.X + b.Min.X) / 2
		var p vg.Path
		p.Move(vg.Point{X: a.Max.X, Y: a.Max.Y})
		p.CubeTo(vg.Point{X: mid, Y: a.Max.Y}, vg.Point{X: mid, Y: b.Max.Y}, vg.Point{X: b.Min.X, Y: b.Max.Y})
		p.Line(vg.Point{X: b.Min.X, Y: b.Min.Y})
		p.CubeTo(vg.Point{X: mid, Y: b.Min.Y}, vg.Point{X: mid, Y: a.Min.Y}, vg.Point{X: a.Max.X, Y: a.Min.Y})
		p.Close()
		c.SetColor(col)
		c.Fill(p)
	}
	fade := func(col color.Color) color.Color {
		r, g, b, _ := col.RGBA()
		// 35 % of the colour over white paper, opaque so print needs no
		// transparency
		mix := func(v uint32) uint8 { return uint8(0.35*float64(v>>8) + 0.65*255) }
		return color.RGBA{mix(r), mix(g), mix(b), 0xff}
	}
	// indicator -> pillar: each indicator takes its slice of the pillar node
	used := make([]vg.Length, len(ch.Pillars))
	for k, j := range order {
		ind := ch.Indicators[j]
		q := ind.Pillar
		pr := pilR[q]
		share := vg.Length(ind.Weight/pw[q]) * (pr.Max.Y - pr.Min.Y)
		slot := vg.Rectangle{Min: vg.Point{X: pr.Min.X, Y: pr.Max.Y - used[q] - share}, Max: vg.Point{X: pr.Max.X, Y: pr.Max.Y - used[q]}}
		used[q] += share
		band(fade(GroupSeries(q).Colour), indR[k], slot)
	}
	// pillar -> overall
	total := 0.0
	for _, w := range pw {
		total += w
	}
	usedAll := vg.Length(0)
	for q, pr := range pilR {
		share := vg.Length(pw[q]/total) * (allR.Max.Y - allR.Min.Y)
		slot := vg.Rectangle{Min: vg.Point{X: allR.Min.X, Y: allR.Max.Y - usedAll - share}, Max: vg.Point{X: allR.Max.X, Y: allR.Max.Y - usedAll}}
		usedAll += share
		band(fade(GroupSeries(q).Colour), pr, slot)
	}
	node := func(r vg.Rectangle, col color.Color) {
		c.FillPolygon(col, []vg.Point{r.Min, {X: r.Max.X, Y: r.Min.Y}, r.Max, {X: r.Min.X, Y: r.Max.Y}})
	}
	for k, j := range order {
		ind := ch.Indicators[j]
		node(indR[k], GroupSeries(ind.Pillar).Colour)
		mid := (indR[k].Min.Y + indR[k].Max.Y) / 2
		label := ind.Label + "  " + format.Number(100*ind.Weight, 0) + " %"
		fillText(&c, sty, xInd-vg.Points(4), mid-textHeight(sty)/2+sty.FontExtents().Descent, draw.XRight, fitText(label, sty, labW-vg.Points(6)))
	}
	for q, pr := range pilR {
		node(pr, GroupSeries(q).Colour)
		mid := (pr.Min.Y + pr.Max.Y) / 2
		label := ch.Pillars[q].Label + "  " + format.Number(100*pw[q]/total, 0) + " %"
		x := pr.Max.X + vg.Points(3)
		// on a white ground, over the bands leaving the pillar
		lw := min(bold.Width(label), xAll-x-vg.Points(4))
		label = fitText(label, bold, lw+vg.Points(1))
		bg := vg.Rectangle{Min: vg.Point{X: x - vg.Points(1), Y: mid - textHeight(bold)/2 - vg.Points(1)}, Max: vg.Point{X: x + bold.Width(label) + vg.Points(1), Y: mid + textHeight(bold)/2 + vg.Points(1)}}
		c.FillPolygon(whiteColor, []vg.Point{bg.Min, {X: bg.Max.X, Y: bg.Min.Y}, bg.Max, {X: bg.Min.X, Y: bg.Max.Y}})
		fillText(&c, bold, x, mid-textHeight(bold)/2+bold.FontExtents().Descent, draw.XLeft, label)
	}
	node(allR, PaletteBlack)
	mid := (allR.Min.Y + allR.Max.Y) / 2
	fillText(&c, bold, allR.Max.X+vg.Points(4), mid-textHeight(bold)/2+bold.FontExtents().Descent, draw.XLeft, fitText(ch.Overall, bold, c.Max.X-allR.Max.X-vg.Points(4)))
	// column heads
	head := th.tickStyle()
	pick := func(room vg.Length, long, short string) string {
		if head.Width(long) <= room {
			return long
		}
		return fitText(short, head, room)
	}
	fillText(&c, head, xInd-vg.Points(4), c.Min.Y+head.FontExtents().Descent, draw.XRight, pick(xInd-vg.Points(4)-c.Min.X, "Indicators, share of the score", "Indicators"))
	fillText(&c, head, xPil, c.Min.Y+head.FontExtents().Descent, draw.XLeft, pick(c.Max.X-xPil, "Pillars, weight", "Pillars"))
	return nil
}
