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
	// Short, when set, replaces Text when the legend would otherwise
	// take a second row (a long institution name gives way first).
	Short string
	Bold  bool
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
	return l.entryWidthOf(e, e.Text)
}

func (l *legend) entryWidthOf(e legendEntry, s string) vg.Length {
	return thumbWidth(e) + legendGapIn + l.entryStyle(e).Width(s)
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

// oneRow lays the entries in one row, each text as given, or reports
// that they do not fit.
func (l *legend) oneRow(entries []legendEntry, width vg.Length) (legendLayout, bool) {
	row := make([]vg.Length, len(entries))
	var x vg.Length
	for i, e := range entries {
		row[i] = x
		x += l.entryWidth(e) + legendGapOut
	}
	if x-legendGapOut > width {
		return legendLayout{}, false
	}
	return legendLayout{rows: [][]legendEntry{entries}, xs: [][]vg.Length{row}}, true
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
	if lay, ok := l.oneRow(l.entries, width); ok {
		return lay
	}
	short := make([]legendEntry, n)
	shortened := false
	for i, e := range l.entries {
		short[i] = e
		if e.Short != "" && e.Short != e.Text {
			short[i].Text, shortened = e.Short, true
		}
	}
	if shortened {
		if lay, ok := l.oneRow(short, width); ok {
			return lay
		}
	}
	// A wrapped key uses the short texts too: a long name would
	// otherwise widen its whole column.
	entries := short
	ws := make([]vg.Length, n)
	for i, e := range entries {
		ws[i] = l.entryWidth(e)
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
			out.rows = append(out.rows, entries[i:end])
			out.xs = append(out.xs, row)
		}
		// Two ragged rows read well enough; from three on, columns do,
		// unless they cost more rows than plain wrapping.
		if flow := l.flow(entries, width); len(flow.rows) < 3 || len(flow.rows) < len(out.rows) {
			return flow
		}
		return out
	}
	return legendLayout{}
}

// flow wraps the entries left to right at the width, without columns.
func (l *legend) flow(entries []legendEntry, width vg.Length) legendLayout {
	var out legendLayout
	var cur []legendEntry
	var xs []vg.Length
	var x vg.Length
	for i, e := range entries {
		w := l.entryWidth(e)
		if len(cur) > 0 && x+w > width {
			out.rows, out.xs = append(out.rows, entries[i-len(cur):i]), append(out.xs, xs)
			cur, xs, x = nil, nil, 0
		}
		cur = append(cur, e)
		xs = append(xs, x)
		x += w + legendGapOut
	}
	if len(cur) > 0 {
		out.rows, out.xs = append(out.rows, entries[len(entries)-len(cur):]), append(out.xs, xs)
	}
	return out
}

// rows is the number of legend rows at a width.
func (l *legend) rows(width vg.Length) int { return len(l.layout(width).rows) }

func (l *legend) entryStyle(e legendEntry) text.Style {
	if e.Bold {
		return l.th.text(sizeLegend, true, PaletteBlack)
	}
	return l.th.legendStyle()
}

func thumbWidth(e legendEntry) vg.Length {
	if e.Width == 0 {
		return legendThumb
	}
	return e.Width
}

// entryLines is an entry's text at left edge x of a legend of the width:
// one line, or wrapped over up to three when even a column to itself is
// too narrow, so no key runs past the chart's edge.
func (l *legend) entryLines(e legendEntry, x, width vg.Length) []string {
	room := width - x - thumbWidth(e) - legendGapIn
	sty := l.entryStyle(e)
	if sty.Width(e.Text) <= room || room <= 0 {
		return []string{e.Text}
	}
	return wrapText(e.Text, sty, room, 3)
}

// rowLines is the number of text lines a legend row takes.
func (l *legend) rowLines(lay legendLayout, ri int, width vg.Length) int {
	n := 1
	for ei, e := range lay.rows[ri] {
		n = max(n, len(l.entryLines(e, lay.xs[ri][ei], width)))
	}
	return n
}

// height is the legend's height at a width, 0 when it is empty.
func (l *legend) height(width vg.Length) vg.Length {
	if l == nil || (len(l.entries) == 0 && l.note == "") {
		return 0
	}
	lay := l.layout(width)
	n := len(lay.rows)
	h := legendTopGap + vg.Length(max(n-1, 0))*legendRowGap
	for ri := range lay.rows {
		h += vg.Length(l.rowLines(lay, ri, width)) * l.rowHeight()
	}
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
	width := c.Max.X - c.Min.X
	lay := l.layout(width)
	for ri, row := range lay.rows {
		for ei, e := range row {
			x := c.Min.X + lay.xs[ri][ei]
			tw := thumbWidth(e)
			r := vg.Rectangle{Min: vg.Point{X: x, Y: y - rh}, Max: vg.Point{X: x + tw, Y: y}}
			if e.Thumb != nil {
				e.Thumb(&c, r)
			}
			sty := l.entryStyle(e)
			for k, line := range l.entryLines(e, lay.xs[ri][ei], width) {
				base := y - vg.Length(k)*rh - rh/2 - textHeight(sty)/2 + sty.FontExtents().Descent
				fillText(&c, sty, x+tw+legendGapIn, base, draw.XLeft, line)
			}
		}
		y -= vg.Length(l.rowLines(lay, ri, width))*rh + legendRowGap
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
