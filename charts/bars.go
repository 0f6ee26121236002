package charts

import (
	"fmt"
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
)

// BarItem is one ranked bar.
type BarItem struct {
	Label string
	Rank  int
	Value float64
	Focus bool
	Named bool
	// GapBefore draws a break line above the bar: ranks were skipped.
	GapBefore bool
}

// BarsChart ranks institutions on one indicator, best first.
type BarsChart struct {
	Indicator dataset.Indicator
	Items     []BarItem
	// Median is the group's median (NaN: none), drawn as a reference line.
	Median float64
	Group  string
	Note   string
	Theme  Theme
	built  *panels
}

const barPitch = 15

// BarsPlotter draws the bars, their names and values, and the median.
type BarsPlotter struct{ Chart *BarsChart }

// scale returns the value range of the bars: from zero (bars start at
// zero, or their lengths would misstate ratios) to the largest value.
func (bc *BarsChart) scale() (lo, hi float64) {
	lo, hi = 0, 0
	for _, it := range bc.Items {
		lo, hi = math.Min(lo, it.Value), math.Max(hi, it.Value)
	}
	if !math.IsNaN(bc.Median) {
		hi = math.Max(hi, bc.Median)
	}
	if hi == lo {
		hi = lo + 1
	}
	return lo, hi
}

// Plot implements plot.Plotter.
func (b *BarsPlotter) Plot(c draw.Canvas, _ *plot.Plot) {
	bc := b.Chart
	th := bc.Theme
	w := c.Max.X - c.Min.X
	// The name column takes what the longest name needs, within limits.
	longest := vg.Length(0)
	for _, it := range bc.Items {
		sty := th.labelStyle()
		if it.Focus {
			sty = th.focusLabelStyle()
		}
		longest = max(longest, sty.Width(it.Label))
	}
	nameW := min(longest+vg.Points(30), w*0.5, vg.Points(200))
	valueW := vg.Points(52)
	x0 := c.Min.X + nameW
	x1 := c.Max.X - valueW
	lo, hi := bc.scale()
	tx := func(v float64) vg.Length { return x0 + (x1-x0)*vg.Length((v-lo)/(hi-lo)) }
	axisH := vg.Points(16)
	top := c.Max.Y
	bottom := top - barPitch*vg.Length(len(bc.Items))
	// Value axis: grid lines and labels at nice steps.
	tickSty := th.tickStyle()
	gridLS := draw.LineStyle{Color: greyGrid, Width: vg.Points(0.4)}
	for _, t := range (valueTicks{}).Ticks(lo, hi) {
		x := tx(t.Value)
		c.StrokeLine2(gridLS, x, bottom, x, top)
		fillText(&c, tickSty, x, bottom-axisH+4+tickSty.FontExtents().Descent, draw.XCenter, t.Label)
	}
	c.StrokeLine2(draw.LineStyle{Color: greyAxis, Width: vg.Points(0.6)}, tx(0), bottom, tx(0), top)
	// The median line goes behind the bars and their values.
	if !math.IsNaN(bc.Median) {
		x := tx(bc.Median)
		ls := draw.LineStyle{Color: PaletteBlack, Width: vg.Points(0.9), Dashes: []vg.Length{vg.Points(3), vg.Points(2)}}
		c.StrokeLine2(ls, x, bottom, x, top)
	}
	for i, it := range bc.Items {
		y1 := top - barPitch*vg.Length(i) - 2
		y0 := y1 - barPitch + 4
		if it.GapBefore {
			ls := draw.LineStyle{Color: greyMark, Width: vg.Points(0.5), Dashes: []vg.Length{vg.Points(1), vg.Points(2)}}
			c.StrokeLine2(ls, c.Min.X, y1+2, c.Max.X, y1+2)
		}
		bar := normRect(vg.Rectangle{Min: vg.Point{X: tx(0), Y: y0}, Max: vg.Point{X: tx(it.Value), Y: y1}})
		var fill, edge color.Color = greyFill, greyMark
		switch {
		case it.Focus:
			fill, edge = FocusColour, PaletteBlack
		case it.Named:
			fill, edge = whiteColor, PaletteBlack
		}
		c.SetColor(fill)
		c.Fill(bar.Path())
		c.SetLineStyle(draw.LineStyle{Color: edge, Width: vg.Points(0.6)})
		c.Stroke(bar.Path())
		sty := th.labelStyle()
		if it.Focus {
			sty = th.focusLabelStyle()
		}
		mid := (y0 + y1) / 2
		base := mid - textHeight(sty)/2 + sty.FontExtents().Descent
		rank := fmt.Sprintf("%d", it.Rank)
		fillText(&c, sty, c.Min.X+vg.Points(18), base, draw.XRight, rank)
		fillText(&c, sty, c.Min.X+vg.Points(23), base, draw.XLeft, fitText(it.Label, sty, nameW-vg.Points(28)))
		vt := axisValueText(bc.Indicator, it.Value)
		vx := max(bar.Max.X, tx(0)) + 3
		c.SetColor(whiteColor)
		c.Fill(vg.Rectangle{Min: vg.Point{X: vx - 1, Y: y0}, Max: vg.Point{X: vx + sty.Width(vt) + 1, Y: y1}}.Path())
		fillText(&c, sty, vx, base, draw.XLeft, vt)
	}
}

func (bc *BarsChart) panels() *panels {
	if bc.built != nil {
		return bc.built
	}
	th := bc.Theme
	ps := &panels{legend: &legend{th: th}, count: 1}
	ps.panelHeight = func(vg.Length) vg.Length { return vg.Points(barPitch*float64(len(bc.Items)) + 18) }
	ps.make = func(vg.Length, int) []*plot.Plot {
		p := newPlot(th)
		p.HideAxes()
		p.Add(&BarsPlotter{Chart: bc})
		return []*plot.Plot{p}
	}
	l := ps.legend
	l.add(legendEntry{Text: axisTitle(bc.Indicator), Width: 0.01})
	for _, it := range bc.Items {
		if it.Focus {
			l.add(legendEntry{Text: it.Label, Bold: true, Thumb: fillThumb(FocusColour, PaletteBlack)})
			break
		}
	}
	for _, it := range bc.Items {
		if it.Named {
			l.add(legendEntry{Text: "Named institution", Thumb: fillThumb(whiteColor, PaletteBlack)})
			break
		}
	}
	if !math.IsNaN(bc.Median) {
		l.add(legendEntry{Text: "Median of " + bc.Group + " (" + valueText(bc.Indicator, bc.Median) + ")", Width: 14, Thumb: func(c *draw.Canvas, r vg.Rectangle) {
			x := centre(r).X
			c.StrokeLine2(draw.LineStyle{Color: PaletteBlack, Width: vg.Points(0.9), Dashes: []vg.Length{vg.Points(3), vg.Points(2)}}, x, r.Min.Y, x, r.Max.Y)
		}})
	}
	l.note = bc.Note
	bc.built = ps
	return ps
}

// Height implements Chart.
func (bc *BarsChart) Height(w vg.Length) vg.Length { return bc.panels().Height(w) }

// Draw implements Chart.
func (bc *BarsChart) Draw(c draw.Canvas) error { return bc.panels().Draw(c) }

// defaultBars is the number of bars when a block sets no limit.
const defaultBars = 15

// newBars plans ranked bars of the first chart group's members on the
// block's first indicator, the focus always shown.
func newBars(m *figures.Model, spec *brief.ChartBlock, th Theme) (Chart, error) {
	inds, groups, marks, err := chartSubjects(m, spec)
	if err != nil {
		return nil, err
	}
	ind, g, year := inds[0], groups[0], chartYear(m, spec)
	limit := spec.Limit
	if limit <= 0 {
		limit = defaultBars
	}
	places := m.MemberPlaces(g.Name, ind.Key, year)
	named := map[int]bool{}
	for _, i := range marks {
		named[i] = true
	}
	bc := &BarsChart{Indicator: ind, Group: g.Name, Theme: th, Median: math.NaN()}
	if d, ok := m.Distribution(g.Name, ind.Key, year); ok && d.N > 0 {
		bc.Median = d.Median
	}
	item := func(p figures.MemberPlace) BarItem {
		in := institution(m, p.Institution)
		return BarItem{Label: fitName(in, th.labelStyle(), vg.Points(170)), Rank: p.Rank, Value: p.Value, Focus: p.Institution == m.Focus, Named: named[p.Institution]}
	}
	// The focus: a member's own placement, or its position among the
	// members when it is not one.
	focusAt := -1
	for i, p := range places {
		if p.Institution == m.Focus {
			focusAt = i
		}
	}
	var focusItem *BarItem
	if focusAt < 0 {
		if pos, ok := m.Position(g.Name, ind.Key, m.Focus, year); ok && pos.HasValue {
			it := BarItem{Label: institution(m, m.Focus).Name + " (not a member)", Rank: pos.Rank, Value: pos.Value, Focus: true}
			focusItem = &it
		}
	}
	shown := min(limit, len(places))
	if focusAt >= shown || focusItem != nil {
		shown = max(limit-1, 0)
	}
	for i := 0; i < min(shown, len(places)); i++ {
		bc.Items = append(bc.Items, item(places[i]))
	}
	switch {
	case focusAt >= shown:
		it := item(places[focusAt])
		it.GapBefore = focusAt > shown
		bc.Items = append(bc.Items, it)
	case focusItem != nil:
		focusItem.GapBefore = true
		bc.Items = append(bc.Items, *focusItem)
	}
	dirWords := "highest first"
	if ind.Better == dataset.LowerIsBetter {
		dirWords = "lowest first (lower is better)"
	}
	bc.Note = fmt.Sprintf("%s, %s, %d: %s of %s ranked %s; values equal as printed share the better rank.", g.Name, shortName(ind), year, format.Int(len(bc.Items)), format.Int(len(places)), dirWords)
	return bc, nil
}
