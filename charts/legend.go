package charts

import (
	"image/color"

	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// legendEntry is one key of a legend: a thumbnail and its words.
type legendEntry struct {
	Text string
	Bold bool
	// Width of the thumbnail; 0 means the standard 14 pt.
	Width vg.Length
	Thumb func(c *draw.Canvas, r vg.Rectangle)
}

// legend is a strip under a chart that explains every mark, flowing its
// entries left to right and wrapping at the chart's width. It sits outside
// the data area so it can never hide data.
type legend struct {
	th      Theme
	entries []legendEntry
	// note is a closing line in small type (e.g. how many labels were
	// left out for space), empty for none.
	note string
}

const (
	legendThumb  = 14
	legendGapIn  = 3  // thumbnail to text
	legendGapOut = 11 // entry to entry
	legendRowGap = 3
	legendTopGap = 6 // chart to legend
)

func (l *legend) add(e legendEntry) { l.entries = append(l.entries, e) }

func (l *legend) entryWidth(e legendEntry) vg.Length {
	sty := l.th.legendStyle()
	if e.Bold {
		sty = l.th.text(sizeLegend, true, PaletteBlack)
	}
	tw := e.Width
	if tw == 0 {
		tw = legendThumb
	}
	return tw + legendGapIn + sty.Width(e.Text)
}

func (l *legend) rowHeight() vg.Length {
	return max(textHeight(l.th.legendStyle()), vg.Points(9))
}

// legendLayout is where each entry of a legend goes: rows of entries and,
// for each entry, its left edge from the legend's left.
type legendLayout struct {
	rows [][]legendEntry
	xs   [][]vg.Length
}

// layout places the entries. When they fit on one line they flow left to
// right; otherwise they go into the most columns that fit, each column as
// wide as its widest entry, filled row by row so the reading order stays
// the entries' order and every thumbnail of a column lines up.
func (l *legend) layout(width vg.Length) legendLayout {
	n := len(l.entries)
	if n == 0 {
		return legendLayout{}
	}
	ws := make([]vg.Length, n)
	var total vg.Length
	for i, e := range l.entries {
		ws[i] = l.entryWidth(e)
		total += ws[i]
	}
	total += vg.Length(n-1) * legendGapOut
	if total <= width {
		row := make([]vg.Length, n)
		var x vg.Length
		for i := range ws {
			row[i] = x
			x += ws[i] + legendGapOut
		}
		return legendLayout{rows: [][]legendEntry{l.entries}, xs: [][]vg.Length{row}}
	}
	for cols := n - 1; cols >= 1; cols-- {
		colW := make([]vg.Length, cols)
		for i, w := range ws {
			colW[i%cols] = max(colW[i%cols], w)
		}
		var sum vg.Length
		for _, w := range colW {
			sum += w
		}
		sum += vg.Length(cols-1) * legendGapOut
		if sum > width && cols > 1 {
			continue
		}
		var out legendLayout
		for i := 0; i < n; i += cols {
			end := min(i+cols, n)
			row := make([]vg.Length, end-i)
			var x vg.Length
			for j := range row {
				row[j] = x
				x += colW[j] + legendGapOut
			}
			out.rows = append(out.rows, l.entries[i:end])
			out.xs = append(out.xs, row)
		}
		return out
	}
	return legendLayout{}
}

// rows is the number of legend rows at a width.
func (l *legend) rows(width vg.Length) int { return len(l.layout(width).rows) }

// height is the legend's height at a width, 0 when it is empty.
func (l *legend) height(width vg.Length) vg.Length {
	if l == nil || (len(l.entries) == 0 && l.note == "") {
		return 0
	}
	n := l.rows(width)
	h := legendTopGap + vg.Length(n)*l.rowHeight() + vg.Length(max(n-1, 0))*legendRowGap
	if l.note != "" {
		sty := l.noteStyle()
		h += vg.Length(len(wrapText(l.note, sty, width, 4))) * (textHeight(sty) + 1)
		h += legendRowGap
	}
	return h
}

// draw draws the legend at the top of c.
func (l *legend) draw(c draw.Canvas) {
	if l == nil {
		return
	}
	rh := l.rowHeight()
	y := c.Max.Y - legendTopGap
	lay := l.layout(c.Max.X - c.Min.X)
	for ri, row := range lay.rows {
		for ei, e := range row {
			x := c.Min.X + lay.xs[ri][ei]
			tw := e.Width
			if tw == 0 {
				tw = legendThumb
			}
			r := vg.Rectangle{Min: vg.Point{X: x, Y: y - rh}, Max: vg.Point{X: x + tw, Y: y}}
			if e.Thumb != nil {
				e.Thumb(&c, r)
			}
			sty := l.th.legendStyle()
			if e.Bold {
				sty = l.th.text(sizeLegend, true, PaletteBlack)
			}
			base := y - rh/2 - textHeight(sty)/2 + sty.FontExtents().Descent
			fillText(&c, sty, x+tw+legendGapIn, base, draw.XLeft, e.Text)
		}
		y -= rh + legendRowGap
	}
	if l.note != "" {
		sty := l.noteStyle()
		y += legendRowGap
		for _, line := range wrapText(l.note, sty, c.Max.X-c.Min.X, 4) {
			y -= textHeight(sty) + 1
			fillText(&c, sty, c.Min.X, y+sty.FontExtents().Descent, draw.XLeft, line)
		}
	}
}

func (l *legend) noteStyle() text.Style { return l.th.text(sizeLegend-0.5, false, greyText) }

func centre(r vg.Rectangle) vg.Point {
	return vg.Point{X: (r.Min.X + r.Max.X) / 2, Y: (r.Min.Y + r.Max.Y) / 2}
}

// markerThumb shows a marker.
func markerThumb(mk Marker) func(*draw.Canvas, vg.Rectangle) {
	return func(c *draw.Canvas, r vg.Rectangle) { mk.Draw(c, centre(r)) }
}

// lineThumb shows a line, with a marker on it when mk is not nil.
func lineThumb(ls draw.LineStyle, mk *Marker) func(*draw.Canvas, vg.Rectangle) {
	return func(c *draw.Canvas, r vg.Rectangle) {
		y := centre(r).Y
		c.StrokeLine2(ls, r.Min.X, y, r.Max.X, y)
		if mk != nil {
			mk.Draw(c, centre(r))
		}
	}
}

// fillThumb shows a filled swatch with an outline.
func fillThumb(fill, edge color.Color) func(*draw.Canvas, vg.Rectangle) {
	return func(c *draw.Canvas, r vg.Rectangle) {
		in := vg.Rectangle{Min: vg.Point{X: r.Min.X, Y: r.Min.Y + 1.5}, Max: vg.Point{X: r.Max.X, Y: r.Max.Y - 1.5}}
		c.SetColor(fill)
		c.Fill(in.Path())
		if edge != nil {
			c.SetLineStyle(draw.LineStyle{Color: edge, Width: vg.Points(0.5)})
			c.Stroke(in.Path())
		}
	}
}

// boxThumb shows a small box with its median bar.
func boxThumb(c *draw.Canvas, r vg.Rectangle) {
	y := centre(r).Y
	box := vg.Rectangle{Min: vg.Point{X: r.Min.X + 3, Y: y - 3.5}, Max: vg.Point{X: r.Max.X - 3, Y: y + 3.5}}
	c.SetColor(greyFill)
	c.Fill(box.Path())
	c.SetLineStyle(draw.LineStyle{Color: greyText, Width: vg.Points(0.7)})
	c.Stroke(box.Path())
	mx := centre(r).X + 1
	c.StrokeLine2(draw.LineStyle{Color: PaletteBlack, Width: vg.Points(2)}, mx, y-3.5, mx, y+3.5)
}

// whiskerThumb shows a whisker with its cap.
func whiskerThumb(c *draw.Canvas, r vg.Rectangle) {
	y := centre(r).Y
	ls := draw.LineStyle{Color: greyAxis, Width: vg.Points(0.8)}
	c.StrokeLine2(ls, r.Min.X+2, y, r.Max.X-2, y)
	c.StrokeLine2(ls, r.Min.X+2, y-2.5, r.Min.X+2, y+2.5)
	c.StrokeLine2(ls, r.Max.X-2, y-2.5, r.Max.X-2, y+2.5)
}
