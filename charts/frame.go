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

// panels draws plots side by side above a legend, their data areas
// aligned and equally sized (gonum's plot.Align). When the width leaves a
// panel less than minPanel, the panels are stacked instead, each at the
// full width.
type panels struct {
	count int
	// make builds the plots for a width; stacked tells each panel it
	// stands alone (and so carries its own category labels).
	make   func(width vg.Length, stacked bool) []*plot.Plot
	legend *legend
	// panelHeight is one panel's height (without legend) at a width.
	panelHeight func(width vg.Length) vg.Length
	minPanel    vg.Length
}

const panelGap = 10

func (ps *panels) stacked(width vg.Length) bool {
	return ps.count > 1 && (width-vg.Length(ps.count-1)*panelGap)/vg.Length(ps.count) < ps.minPanel
}

func (ps *panels) plotsHeight(width vg.Length) vg.Length {
	if ps.stacked(width) {
		return vg.Length(ps.count)*ps.panelHeight(width) + vg.Length(ps.count-1)*panelGap
	}
	return ps.panelHeight(width)
}

// Height implements Chart.
func (ps *panels) Height(width vg.Length) vg.Length {
	return ps.plotsHeight(width) + ps.legend.height(width)
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
	lh := ps.legend.height(w)
	area := draw.Crop(c, 0, 0, lh, 0)
	stacked := ps.stacked(w)
	plots := ps.make(w, stacked)
	switch {
	case len(plots) == 1:
		plots[0].Draw(area)
	case stacked:
		tiles := draw.Tiles{Rows: len(plots), Cols: 1, PadY: panelGap}
		grid := make([][]*plot.Plot, len(plots))
		for i, p := range plots {
			grid[i] = []*plot.Plot{p}
		}
		cs := plot.Align(grid, tiles, area)
		for i, p := range plots {
			p.Draw(cs[i][0])
		}
	default:
		tiles := draw.Tiles{Rows: 1, Cols: len(plots), PadX: panelGap}
		cs := plot.Align([][]*plot.Plot{plots}, tiles, area)
		for i, p := range plots {
			p.Draw(cs[0][i])
		}
	}
	if lh > 0 {
		lc := c
		lc.Max.Y = c.Min.Y + lh
		ps.legend.draw(lc)
	}
	return nil
}
