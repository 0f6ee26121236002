package layout

import (
	"math"
	"sort"
	"strings"

	"peerpack/internal/pdf"
)

// cell is one table cell.
type cell struct {
	text string
	// shade is the quarter of the group the figure falls in (1 best .. 4
	// worst), 0 for an unshaded cell.
	shade int
	bold  bool
	muted bool
}

// grid is a table ready to set: header labels, column alignment ('L' or
// 'R'), rows, and what goes around it.
type grid struct {
	head    []string
	align   []byte
	rows    [][]cell
	focus   []bool // rows to highlight (the focus institution)
	caption string
	notes   []string
	legend  bool
	// keepLead is the number of leading rows kept with the header.
	keepLead int
	// natural keeps the table at its content's width instead of the
	// frame's (Markdown tables); noNumber leaves it without "Table n.".
	natural, noNumber bool
	// maxLines caps the lines of a wrapped text cell (0: 3), beyond
	// which it is shortened with an ellipsis.
	maxLines int
}

func (g grid) lineLimit() int {
	if g.maxLines > 0 {
		return g.maxLines
	}
	return 3
}

// tableSizes are the body and header sizes a table is tried at, in pt:
// the normal size first, then smaller steps for a wide table, so that its
// figures print whole rather than shortened (7 pt is the smallest size
// common practice reads comfortably in print, no source).
var tableSizes = [][2]float64{{8.5, 8}, {7.8, 7.4}, {7.2, 6.9}}

// Table geometry in mm.
const (
	cellPadX   = 1.8
	cellPadY   = 1.25
	minTextCol = 32.0
	// shortTextCol is the widest a text column (a group name, a country)
	// counts as short, which a table would rather not wrap.
	shortTextCol = 40.0
	// minBrokenCol is the narrowest a text column is set when its words
	// must break to leave the figures whole.
	minBrokenCol = 12.0
	legendSize   = 7.5
	glyphColumn  = 3.6 // room for a quartile glyph before a number
)

// setTable sets a grid in the frame: columns sized to their content and
// the frame's width, header repeated on every page the table runs onto,
// never wider than the frame.
func (w *writer) setTable(g grid) {
	if len(g.head) == 0 {
		return
	}
	if w.cols > 1 {
		w.spanColumns(func() { w.setTable(g) })
		return
	}
	if !g.noNumber {
		w.tableNo++
	}
	ncol := len(g.head)
	avail := w.width - w.indent
	var tableSize, tableHead float64
	var bodyF, boldF, headF pdf.Font
	var widths []float64
	w.tableCount[w.section]++
	for _, sz := range tableSizes[min(w.plan.tableStep(w.section), len(tableSizes)-1):] {
		tableSize, tableHead = sz[0], sz[1]
		bodyF = w.st.font(pdf.Regular, tableSize)
		boldF = w.st.font(pdf.Bold, tableSize)
		headF = w.st.font(pdf.Bold, tableHead)
		var fits bool
		widths, fits = w.columnWidths(g, avail, bodyF, boldF, headF)
		if fits {
			break
		}
	}
	tableW := 0.0
	for _, cw := range widths {
		tableW += cw
	}
	// Header lines per column.
	headLines := make([][]string, ncol)
	maxLines := 1
	for c := 0; c < ncol; c++ {
		sp := []span{{text: glueHeader(g.head[c]), font: headF}}
		for _, ln := range w.wrap(sp, w.tokenize(sp), widths[c]-2*cellPadX, widths[c]-2*cellPadX) {
			var parts []string
			for _, t := range ln.toks {
				parts = append(parts, t.text)
			}
			headLines[c] = append(headLines[c], strings.Join(parts, " "))
		}
		maxLines = max(maxLines, len(headLines[c]))
	}
	headLH := w.st.lineHeight(tableHead) * 0.92
	headH := float64(maxLines)*headLH + 2*cellPadY
	lineH := pdf.PtToMM(tableSize) * 1.25
	rowLines := make([][][]string, len(g.rows))
	for ri, r := range g.rows {
		rowLines[ri] = make([][]string, ncol)
		for c := 0; c < ncol && c < len(r); c++ {
			f := bodyF
			if r[c].bold || ri < len(g.focus) && g.focus[ri] {
				f = boldF
			}
			room := widths[c] - 2*cellPadX
			if r[c].shade > 0 {
				room -= glyphColumn
			}
			if g.align[c] == 'L' {
				rowLines[ri][c] = w.cellLines(r[c].text, f, room, g.lineLimit())
			} else {
				w.doc.SetFont(f)
				rowLines[ri][c] = []string{w.doc.Fit(r[c].text, room)}
			}
		}
	}
	rowHeight := func(ri int) float64 {
		n := 1
		for _, ls := range rowLines[ri] {
			n = max(n, len(ls))
		}
		return float64(n)*lineH + 2*cellPadY
	}
	capSp := w.captionSpans("Table", w.tableNo, g.caption)
	if g.noNumber {
		capSp = []span{{text: g.caption, font: w.st.font(pdf.Regular, captionSize), color: w.st.muted}}
	}
	capLines := w.wrap(capSp, w.tokenize(capSp), avail, avail)
	capH := float64(len(capLines))*w.st.lineHeight(captionSize) + 1.2

	lead := min(len(g.rows), max(3, g.keepLead))
	if !w.atFrameTop() {
		w.y += 1.5
	}
	leadH := 0.0
	for ri := 0; ri < lead; ri++ {
		leadH += rowHeight(ri)
	}
	if g.noNumber && g.caption == "" {
		capH = 0
	}
	w.ensure(capH + headH + leadH)

	x0 := w.x + w.indent
	avail = tableW
	drawCaption := func(cont bool) {
		if g.caption == "" && g.noNumber {
			return
		}
		sp := capSp
		lines := capLines
		if cont {
			sp = append(append([]span(nil), capSp...), span{text: " (continued)", font: w.st.font(pdf.Italic, captionSize), color: w.st.muted})
			lines = w.wrap(sp, w.tokenize(sp), avail, avail)
		}
		for _, ln := range lines {
			w.drawLine(sp, ln, x0, w.y+pdf.PtToMM(captionSize)*0.8)
			w.y += w.st.lineHeight(captionSize)
		}
		w.y += 1.2
	}
	drawHead := func() {
		if !w.measuring {
			w.doc.FillRect(x0, w.y, avail, headH, w.st.tint)
			w.doc.SetFont(headF)
			w.doc.SetTextColor(w.st.text)
			x := x0
			for c := 0; c < ncol; c++ {
				// Headers sit on the bottom of their cell, next to the
				// figures they name.
				n := len(headLines[c])
				for i, s := range headLines[c] {
					s = w.doc.Fit(s, widths[c]-2*cellPadX)
					by := w.y + headH - cellPadY - float64(n-1-i)*headLH - headLH*0.22
					if g.align[c] == 'R' {
						w.doc.TextRight(x+widths[c]-cellPadX, by, s)
					} else {
						w.doc.Text(x+cellPadX, by, s)
					}
				}
				x += widths[c]
			}
			w.doc.Line(x0, w.y+headH, x0+avail, w.y+headH, 0.4, w.st.accent)
		}
		w.y += headH
	}

	drawCaption(false)
	drawHead()
	for ri, r := range g.rows {
		rowH := rowHeight(ri)
		// Do not strand the last row alone on a continuation page.
		lastTwo := ri == len(g.rows)-2 && ri >= lead && w.y+rowH+rowHeight(ri+1) > w.bottom()
		if w.y+rowH > w.bottom() || lastTwo {
			w.nextFrame()
			drawCaption(true)
			drawHead()
		}
		if !w.measuring {
			focus := ri < len(g.focus) && g.focus[ri]
			if focus {
				w.doc.FillRect(x0, w.y, avail, rowH, mix(w.st.accent, white, 0.8))
			}
			x := x0
			for c := 0; c < ncol; c++ {
				var cl cell
				if c < len(r) {
					cl = r[c]
				}
				if cl.shade > 0 {
					w.doc.FillRect(x+0.25, w.y+0.25, widths[c]-0.5, rowH-0.5, w.st.shades[cl.shade])
				}
				f := bodyF
				if cl.bold || focus {
					f = boldF
				}
				w.doc.SetFont(f)
				col := w.st.text
				if cl.muted {
					col = w.st.muted
				}
				w.doc.SetTextColor(col)
				base := w.y + cellPadY + pdf.PtToMM(tableSize)*0.95
				// The lines were fitted to the cell less glyphColumn when
				// shaded; left-aligned text starts after the glyph so the two
				// never overlap (right-aligned text ends at the far edge).
				textX := x + cellPadX
				if cl.shade > 0 {
					w.doc.SetFont(w.st.font(pdf.Regular, tableSize-1.5))
					w.doc.Text(x+cellPadX, base-0.2, quartileGlyph(cl.shade))
					w.doc.SetFont(f)
					textX += glyphColumn
				}
				var lines []string
				if c < len(rowLines[ri]) {
					lines = rowLines[ri][c]
				}
				for li, s := range lines {
					if g.align[c] == 'R' {
						w.doc.TextRight(x+widths[c]-cellPadX, base+float64(li)*lineH, s)
					} else {
						w.doc.Text(textX, base+float64(li)*lineH, s)
					}
				}
				x += widths[c]
			}
			w.doc.Line(x0, w.y+rowH, x0+avail, w.y+rowH, 0.15, w.st.rule)
			w.doc.SetTextColor(w.st.text)
		}
		w.y += rowH
	}
	if !w.measuring {
		w.doc.Line(x0, w.y, x0+avail, w.y, 0.4, w.st.accent)
	}
	w.y += 1.5
	if g.legend {
		w.quartileLegend(x0)
	}
	for _, n := range g.notes {
		sp := []span{{text: n, font: w.st.font(pdf.Italic, legendSize), color: w.st.muted}}
		w.para(sp, w.indent, nil, legendSize, 0.4)
	}
	w.y += paraGap + 1
}

// quartileLegend explains the shading with swatch, glyph and words, so
// the key reads in greyscale print and for readers who do not see colour.
func (w *writer) quartileLegend(x float64) {
	h := pdf.PtToMM(legendSize) * 1.5
	w.ensure(2*h + 1)
	if w.measuring {
		w.y += 2*h + 1
		return
	}
	f := w.st.font(pdf.Regular, legendSize)
	w.doc.SetFont(f)
	w.doc.SetTextColor(w.st.muted)
	lead := "Shading and mark: quarter of the group the value falls in, in the better direction:"
	w.doc.Text(x, w.y+h*0.7, lead)
	w.y += h
	cx := x
	for q := 1; q <= 4; q++ {
		w.doc.FillRect(cx, w.y, 5.5, h-0.6, w.st.shades[q])
		w.doc.SetFont(w.st.font(pdf.Regular, legendSize-1))
		w.doc.SetTextColor(w.st.text)
		w.doc.TextCentre(cx+2.75, w.y+h*0.62, quartileGlyph(q))
		w.doc.SetFont(f)
		w.doc.SetTextColor(w.st.muted)
		label := quartileWords(q)
		w.doc.Text(cx+7, w.y+h*0.65, label)
		cx += 7 + w.doc.StringWidth(label) + 5
	}
	w.doc.SetTextColor(w.st.text)
	w.y += h + 1
}

// columnWidths sizes the columns: figures ('R') keep their natural width;
// text columns ('L') share what is left in proportion to their natural
// width, never below their longest word, and wrap. Only when even that
// does not fit is every column narrowed, and cells are shortened with an
// ellipsis.
//
// fits is false when the columns had to be narrowed below their content.
func (w *writer) columnWidths(g grid, avail float64, bodyF, boldF, headF pdf.Font) (widths []float64, fits bool) {
	ncol := len(g.head)
	nat := make([]float64, ncol)     // widest content
	word := make([]float64, ncol)    // widest single word (text columns)
	cellNat := make([]float64, ncol) // widest cell, header left out
	for c := 0; c < ncol; c++ {
		for _, wd := range strings.Split(glueHeader(g.head[c]), " ") {
			word[c] = math.Max(word[c], w.doc.WidthIn(headF, wd))
		}
		nat[c] = word[c]
	}
	for ri, r := range g.rows {
		for c := 0; c < ncol && c < len(r); c++ {
			f := bodyF
			if r[c].bold || ri < len(g.focus) && g.focus[ri] {
				f = boldF
			}
			extra := 0.0
			if r[c].shade > 0 {
				extra = glyphColumn
			}
			nat[c] = math.Max(nat[c], w.doc.WidthIn(f, r[c].text)+extra)
			cellNat[c] = math.Max(cellNat[c], w.doc.WidthIn(f, r[c].text)+extra)
			if g.align[c] == 'L' {
				for _, wd := range strings.Fields(r[c].text) {
					word[c] = math.Max(word[c], math.Min(w.doc.WidthIn(f, wd), 40)+extra)
				}
			} else {
				word[c] = nat[c]
			}
		}
	}
	widths = make([]float64, ncol)
	fixed, textNat, textMin := 0.0, 0.0, 0.0
	for c := 0; c < ncol; c++ {
		if g.align[c] == 'R' {
			widths[c] = nat[c] + 2*cellPadX
			fixed += widths[c]
		} else {
			textNat += nat[c] + 2*cellPadX
			textMin += word[c] + 2*cellPadX
		}
	}
	room := avail - fixed
	fits = true
	switch {
	case textNat <= room:
		// Everything fits on one line: text columns at natural width, the
		// spare width to the first text column unless the table keeps its
		// natural width.
		first := -1
		for c := 0; c < ncol; c++ {
			if g.align[c] == 'L' {
				widths[c] = nat[c] + 2*cellPadX
				if first < 0 {
					first = c
				}
			}
		}
		if !g.natural {
			if first < 0 {
				first = 0
			}
			widths[first] += room - textNat
		}
	case textMin <= room:
		// Text columns wrap. Short ones (group names, countries,
		// quarters) keep their natural width, shortest first, as long as
		// every other text column still gets its longest word (the first,
		// label column at least minTextCol); the rest share what is left
		// in proportion to how much more they would like.
		first := -1
		var short []int
		for c := 0; c < ncol; c++ {
			if g.align[c] != 'L' {
				continue
			}
			if first < 0 {
				first = c
				continue
			}
			short = append(short, c)
		}
		sort.SliceStable(short, func(a, b int) bool { return nat[short[a]] < nat[short[b]] })
		// Each text column's minimum: a hair over its longest word, so
		// that rounding in the measure never breaks the word itself, and
		// the label column at least minTextCol; both given up, in that
		// order, when the room is too tight for them.
		labelMin, hair := minTextCol, 0.4
		minOf := func(c int) float64 {
			m := word[c] + 2*cellPadX + hair
			if c == first {
				m = math.Max(m, math.Min(labelMin, nat[c]+2*cellPadX))
			}
			return m
		}
		need := 0.0
		for _, relax := range []func(){func() {}, func() { labelMin = 0 }, func() { hair = 0 }} {
			relax()
			need = 0
			for c := 0; c < ncol; c++ {
				if g.align[c] == 'L' {
					need += minOf(c)
				}
			}
			if need <= room {
				break
			}
		}
		kept := map[int]bool{}
		for _, c := range short {
			if nat[c]+2*cellPadX > shortTextCol {
				// Longer text (descriptions, lists of names) shares
				// the width with the other wrapping columns rather
				// than squeezing them to their longest word.
				break
			}
			extra := nat[c] + 2*cellPadX - minOf(c)
			if need+extra > room {
				if nat[c]+2*cellPadX <= shortTextCol {
					// A short label would wrap: a smaller size may
					// keep it on one line.
					fits = false
				}
				break
			}
			kept[c] = true
			need += extra
		}
		spare := math.Max(0, room-need)
		want := 0.0
		for c := 0; c < ncol; c++ {
			if g.align[c] == 'L' && !kept[c] {
				want += nat[c] + 2*cellPadX - minOf(c)
			}
		}
		for c := 0; c < ncol; c++ {
			if g.align[c] != 'L' {
				continue
			}
			if kept[c] {
				widths[c] = nat[c] + 2*cellPadX
				continue
			}
			widths[c] = minOf(c)
			if want > 0 {
				widths[c] += spare * ((nat[c] + 2*cellPadX - minOf(c)) / want)
			}
		}
		if first >= 0 && fits && w.labelsTall(g, first, widths[first], bodyF, boldF) {
			fits = false
		}
	default:
		// Too narrow even with text wrapped at its words. Figures keep
		// the width of their widest value (their headers break inside
		// words instead) and the text columns share the rest, down to
		// minBrokenCol each, breaking long words; only when even that
		// fails is every column narrowed and cells shortened.
		figures, nText, textWord := 0.0, 0, 0.0
		for c := 0; c < ncol; c++ {
			if g.align[c] == 'R' {
				figures += cellNat[c] + 2*cellPadX
			} else {
				nText++
				textWord += word[c] + 2*cellPadX
			}
		}
		if rest := avail - figures; rest >= float64(nText)*minBrokenCol && textWord > 0 {
			for c := 0; c < ncol; c++ {
				if g.align[c] == 'R' {
					widths[c] = cellNat[c] + 2*cellPadX
				} else {
					widths[c] = rest * (word[c] + 2*cellPadX) / textWord
				}
			}
			return widths, false
		}
		total := fixed
		for c := 0; c < ncol; c++ {
			if g.align[c] == 'L' {
				widths[c] = word[c] + 2*cellPadX
				total += widths[c]
			}
		}
		scale := avail / total
		for c := range widths {
			widths[c] *= scale
		}
		return widths, false
	}
	return widths, fits
}

// cellLines wraps a text cell into at most max lines, the last shortened
// with an ellipsis when the text does not fit.
func (w *writer) cellLines(text string, f pdf.Font, width float64, maxLines int) []string {
	sp := []span{{text: text, font: f}}
	lines := w.wrap(sp, w.tokenize(sp), width, width)
	out := make([]string, 0, len(lines))
	for i, ln := range lines {
		parts := make([]string, len(ln.toks))
		for k, t := range ln.toks {
			parts[k] = t.text
		}
		s := strings.Join(parts, " ")
		if i == maxLines-1 && len(lines) > maxLines {
			rest := []string{s}
			for _, l2 := range lines[i+1:] {
				for _, t := range l2.toks {
					rest = append(rest, t.text)
				}
			}
			w.doc.SetFont(f)
			out = append(out, w.doc.Fit(strings.Join(rest, " "), width))
			break
		}
		out = append(out, s)
	}
	if len(out) == 0 {
		out = []string{""}
	}
	return out
}

// labelsTall reports whether any cell of a text column would take three
// lines or more at a width: a table rather steps down a size than set its
// labels in narrow towers.
func (w *writer) labelsTall(g grid, c int, width float64, bodyF, boldF pdf.Font) bool {
	for ri, r := range g.rows {
		if c >= len(r) {
			continue
		}
		f := bodyF
		if r[c].bold || ri < len(g.focus) && g.focus[ri] {
			f = boldF
		}
		room := width - 2*cellPadX
		if r[c].shade > 0 {
			room -= glyphColumn
		}
		if len(w.cellLines(r[c].text, f, room, 3)) >= 3 {
			return true
		}
	}
	return false
}

// glueHeader keeps a header's joining marks with the words they join, so
// that a narrow column breaks it only between words: a slash stays at the
// end of the line before the break ("Students /" over "academic ↓") and
// the lower-is-better arrow with the word before it, never a line of its
// own. The glue is a no-break space, which the flow does not break at.
func glueHeader(s string) string {
	s = strings.ReplaceAll(s, " / ", "\u00a0/ ")
	s = strings.ReplaceAll(s, " ↓", "\u00a0↓")
	s = strings.ReplaceAll(s, " ↑", "\u00a0↑")
	return s
}
