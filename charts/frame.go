package charts

import (
	"fmt"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// newPlot returns a gonum plot dressed in the theme: transparent
// background (the page is the paper), thin grey axes, 8 pt tick labels.
func newPlot(th Theme) *plot.Plot {
	p := plot.New()
	p.BackgroundColor = nil
	for _, a := range []*plot.Axis{&p.X, &p.Y} {
		a.LineStyle = draw.LineStyle{Color: greyAxis, Width: vg.Points(0.5)}
		a.Padding = vg.Points(3)
		a.Tick.LineStyle = draw.LineStyle{Color: greyAxis, Width: vg.Points(0.5)}
		a.Tick.Length = vg.Points(3)
		a.Label.TextStyle = alignedLike(a.Label.TextStyle, th.axisStyle())
		a.Label.Padding = vg.Points(3)
		a.Tick.Label = alignedLike(a.Tick.Label, th.tickStyle())
		a.Tick.Marker = valueTicks{}
	}
	return p
}

// alignedLike keeps gonum's alignment of an axis text and takes the
// theme's font and colour.
func alignedLike(orig, sty text.Style) text.Style {
	sty.XAlign, sty.YAlign, sty.Rotation = orig.XAlign, orig.YAlign, orig.Rotation
	return sty
}

// grid returns light grid lines behind the data, vertical or horizontal.
func grid(vertical, horizontal bool) *plotter.Grid {
	g := plotter.NewGrid()
	ls := draw.LineStyle{Color: greyGrid, Width: vg.Points(0.4)}
	g.Vertical, g.Horizontal = ls, ls
	g.Vertical.Dashes, g.Horizontal.Dashes = nil, nil
	if !vertical {
		g.Vertical.Color = nil
	}
	if !horizontal {
		g.Horizontal.Color = nil
	}
	return g
}

// panels draws plots in a grid above a legend, their data areas aligned
// and equally sized (gonum's plot.Align): side by side when the width
// allows every panel minPanel, else in as many columns as fit, row after
// row (a half-width chart stacks them).
type panels struct {
	count int
	// make builds the plots for a chart width laid out in cols columns;
	// a panel at the start of a row carries the category labels.
	make   func(width vg.Length, cols int) []*plot.Plot
	legend *legend
	// panelHeight is one panel's height at a panel width.
	panelHeight func(panelWidth vg.Length) vg.Length
	minPanel    vg.Length
	// legendInGap lets the legend take the empty cells a grid leaves at
	// the end of its last row (three panels in two columns), when it fits
	// there, so the grid has no hole and the chart is one legend shorter.
	legendInGap bool
	// dropped, when set, sums the labels the plots of the last make left
	// out for lack of room; the legend's note then says so (prepare).
	dropped   func() int
	droppedAt map[vg.Length]int
	baseNote  string
	noteKept  bool
}

const panelGap = 10

// panelsTop is room above the plots: the top tick label of a value axis
// is centred on the data area's edge and would otherwise overhang it.
const panelsTop = 5

// cols is the number of panel columns at a chart width.
func (ps *panels) cols(width vg.Length) int {
	if ps.count <= 1 || ps.minPanel <= 0 {
		return max(ps.count, 1)
	}
	n := int((width + panelGap) / (ps.minPanel + panelGap))
	return max(1, min(ps.count, n))
}

func (ps *panels) rows(width vg.Length) int {
	c := ps.cols(width)
	return (max(ps.count, 1) + c - 1) / c
}

// panelWidth is one grid cell's width.
func (ps *panels) panelWidth(width vg.Length) vg.Length {
	c := ps.cols(width)
	return (width - vg.Length(c-1)*panelGap) / vg.Length(c)
}

// dataWidth estimates one panel's data area at a chart width, with
// labels of labelW left of the first panel of each row; plot.Align makes
// the data areas of the panels equal.
func (ps *panels) dataWidth(width vg.Length, cols int, labelW vg.Length) vg.Length {
	const axisRoom = 14 // tick marks, padding and a tick label's overhang
	cols = max(cols, 1)
	return (width - labelW - vg.Length(cols-1)*panelGap - vg.Length(cols)*axisRoom) / vg.Length(cols)
}

// gapCells is the empty cells at the end of the last row, as a rectangle
// width in cells (0 when the grid is full).
func (ps *panels) gapCells(width vg.Length) int {
	c := ps.cols(width)
	return ps.rows(width)*c - max(ps.count, 1)
}

// legendGap reports whether the legend is drawn in the grid's empty cells
// at this width.
func (ps *panels) legendGap(width vg.Length) bool {
	g := ps.gapCells(width)
	if !ps.legendInGap || g == 0 || ps.legend == nil {
		return false
	}
	gw := vg.Length(g)*ps.panelWidth(width) + vg.Length(g-1)*panelGap - legendGapLeft
	return ps.legend.height(gw) <= ps.panelHeight(ps.panelWidth(width))
}

// legendGapLeft indents a legend set in an empty grid cell, so it does not
// touch the neighbouring panel's data.
const legendGapLeft = 14

func (ps *panels) plotsHeight(width vg.Length) vg.Length {
	r := ps.rows(width)
	return vg.Length(r)*ps.panelHeight(ps.panelWidth(width)) + vg.Length(r-1)*panelGap
}

// Height implements Chart.
func (ps *panels) Height(width vg.Length) vg.Length {
	ps.prepare(width)
	if ps.legendGap(width) {
		return panelsTop + ps.plotsHeight(width)
	}
	return panelsTop + ps.plotsHeight(width) + ps.legend.height(width)
}

// drawPlots draws the plots into area, one alone or a grid aligned with
// plot.Align, and returns the grid's cells (nil for a single plot).
func (ps *panels) drawPlots(area draw.Canvas, plots []*plot.Plot, cols int) [][]draw.Canvas {
	if len(plots) == 1 {
		plots[0].Draw(area)
		return nil
	}
	if len(plots) == 0 {
		return nil
	}
	rows := (len(plots) + cols - 1) / cols
	grid := make([][]*plot.Plot, rows)
	for r := range grid {
		grid[r] = make([]*plot.Plot, cols)
	}
	for i, p := range plots {
		grid[i/cols][i%cols] = p
	}
	tiles := draw.Tiles{Rows: rows, Cols: cols, PadX: panelGap, PadY: panelGap}
	cs := plot.Align(grid, tiles, area)
	for i, p := range plots {
		p.Draw(cs[i/cols][i%cols])
	}
	return cs
}

// minPanelShare is how far a panel may be squashed below the height it
// asks for and still be read (layout shortens charts to 80 % at most, and
// then by up to 14 % more, so 0.6 leaves a margin).
const minPanelShare = 0.6

// checkRoom refuses to draw panels squashed past reading: a trend of 26
// indicators on one page would get panels a few points high (or of
// negative height). The message says how many panels fit.
func (ps *panels) checkRoom(w, avail vg.Length, cols int) error {
	n := ps.count
	if n <= 1 {
		return nil
	}
	rows := ps.rows(w)
	ph := ps.panelHeight(ps.panelWidth(w))
	per := (avail - vg.Length(rows-1)*panelGap) / vg.Length(rows)
	if per >= ph*minPanelShare {
		return nil
	}
	fitRows := max(int((avail+panelGap)/(ph*minPanelShare+panelGap)), 1)
	return fmt.Errorf("%d panels do not fit on a page at this width (at most %d do); split the indicators over several charts", n, fitRows*cols)
}

// Draw implements Chart.
func (ps *panels) Draw(c draw.Canvas) (err error) {
	defer func() {
		// gonum/plot panics on impossible geometry (a canvas too small for
		// its axes); report it as an error rather than crash the build.
		if r := recover(); r != nil {
			err = fmt.Errorf("chart could not be drawn in a %.0f x %.0f pt area: %v", float64(c.Max.X-c.Min.X), float64(c.Max.Y-c.Min.Y), r)
		}
	}()
	w := c.Max.X - c.Min.X
	ps.prepare(w)
	inGap := ps.legendGap(w)
	lh := ps.legend.height(w)
	if inGap {
		lh = 0
	}
	area := draw.Crop(c, 0, 0, lh, -panelsTop)
	cols := ps.cols(w)
	if err := ps.checkRoom(w, area.Max.Y-area.Min.Y, cols); err != nil {
		return err
	}
	plots := ps.make(w, cols)
	cs := ps.drawPlots(area, plots, cols)
	if inGap && len(cs) > 0 {
		rows := len(cs)
		cell := cs[rows-1][len(plots)%cols]
		cell.Max.X = cs[rows-1][cols-1].Max.X
		cell.Min.X += legendGapLeft
		ps.legend.draw(cell)
	}
	if lh > 0 {
		lc := c
		lc.Max.Y = c.Min.Y + lh
		ps.legend.draw(lc)
	}
	return nil
}
