package layout

import (
	"math"
	"strconv"
	"strings"

	"github.com/yuin/goldmark/ast"
	east "github.com/yuin/goldmark/extension/ast"
	"gonum.org/v1/plot/vg"

	"peerpack/internal/brief"
	"peerpack/internal/pdf"
)

// Vertical rhythm in mm (common practice, no source): paragraphs are
// separated by about half a line, headings get more space above than
// below so that they group with what follows.
const (
	paraGap      = 2.4
	listItemGap  = 0.8
	keepWithNext = 18 // room a heading needs below it: about three lines
)

// beginInline resets the inline state for a new block of text.
func (w *writer) beginInline(size float64) {
	w.spans = w.spans[:0]
	w.inlineSize = size
	w.inlineColor = w.st.text
}

func (w *writer) takeMarker() *span {
	m := w.marker
	w.marker = nil
	return m
}

func (w *writer) paragraph(n ast.Node, entering bool) ast.WalkStatus {
	if entering {
		w.beginInline(w.st.size)
		return ast.WalkContinue
	}
	after := paraGap
	if w.tight {
		after = listItemGap
	}
	w.para(w.spans, w.indent, w.takeMarker(), w.st.size, after)
	w.spans = w.spans[:0]
	w.placeImages()
	return ast.WalkContinue
}

// textBlock is the paragraph of a tight list item.
func (w *writer) textBlock(n ast.Node, entering bool) ast.WalkStatus {
	if entering {
		w.beginInline(w.st.size)
		return ast.WalkContinue
	}
	w.para(w.spans, w.indent, w.takeMarker(), w.st.size, listItemGap)
	w.spans = w.spans[:0]
	w.placeImages()
	return ast.WalkContinue
}

func (w *writer) heading(n ast.Node, entering bool) ast.WalkStatus {
	h := n.(*ast.Heading)
	if entering {
		w.beginInline(headingSize(h.Level))
		w.bold++
		return ast.WalkContinue
	}
	w.bold--
	var title strings.Builder
	for _, s := range w.spans {
		if s.brk {
			title.WriteByte(' ')
			continue
		}
		title.WriteString(s.text)
	}
	spans := append([]span(nil), w.spans...)
	w.spans = w.spans[:0]
	w.keep = w.followingNeed(n.NextSibling())
	w.setHeading(strings.TrimSpace(title.String()), h.Level, spans)
	w.keep = 0
	return ast.WalkContinue
}

// followingNeed is the room a heading must keep below it for the start of
// what follows: a chart whole (with its caption), a table's caption,
// header and first rows, else about three lines of text.
func (w *writer) followingNeed(next ast.Node) float64 {
	switch blk := w.blockOf(next).(type) {
	case *brief.ChartBlock:
		ch, err := w.planChart(blk)
		if err != nil {
			return keepWithNext
		}
		width := w.width - w.indent
		if blk.Size == "half" {
			width = (width - chartGap) / 2
		}
		h := float64(ch.Height(vg.Length(width*pdf.PointsPerMM))) / pdf.PointsPerMM
		if h <= 0 || h != h {
			return keepWithNext
		}
		// The chart as setCharts will set it: scaled for its section,
		// perhaps a little shorter still when it nearly fits.
		t := w.chartTexts(blk, ch, 0, width)
		if elastic(blk) {
			h *= w.plan.chartScale(w.section) * minChartScale
		}
		h += t.titleH + t.capH
		return math.Min(h+chartSpacing, w.bottom()-w.frameTop()-30)
	case *brief.TableBlock:
		return 40
	}
	return keepWithNext
}

// sectionHeading sets a heading the pack adds itself (executive summary,
// notes, about these figures).
func (w *writer) sectionHeading(title string, level int) {
	sp := []span{{text: title, font: w.st.font(pdf.Bold, headingSize(level)), color: w.st.text}}
	w.setHeading(title, level, sp)
}

// setHeading places a heading: level 1 opens a page, levels 1 and 2 end a
// multi-column section, and every heading keeps room for the start of
// what follows so that none is left alone at a page foot. Each heading
// goes into the outline and, for levels 1 and 2, the contents.
func (w *writer) setHeading(title string, level int, spans []span) {
	w.flushColumns()
	if level <= 2 && w.cols > 1 {
		w.setColumns(1)
	}
	joined := false
	if level == 1 && !(w.atFrameTop() && w.cols <= 1) {
		if w.plan.joins(w.section+1) && w.cols <= 1 {
			joined = true
		} else {
			w.newPage()
		}
	}
	if level == 1 {
		w.section++
		w.headed[w.section] = true
	}
	size := headingSize(level)
	lh := w.st.lineHeight(size) * 0.9
	before := map[int]float64{1: 0, 2: 6, 3: 4.5}[min(level, 3)]
	if joined {
		before = joinedSectionGap
	}
	if level > 3 {
		before = 3.5
	}
	if w.atFrameTop() {
		before = 0
	}
	toks := w.tokenize(spans)
	lines := w.wrap(spans, toks, w.width-w.indent, w.width-w.indent)
	keep := w.keep
	if keep <= 0 {
		keep = keepWithNext
	}
	need := before + float64(len(lines))*lh + keep
	if w.y+need > w.bottom() {
		w.nextFrame()
		before = 0
	}
	w.y += before
	col := w.st.accent
	if level >= 3 {
		col = w.st.text
	}
	for i := range spans {
		spans[i].color = col
		spans[i].font.Size = size
		if spans[i].font.Family != pdf.Mono {
			spans[i].font.Family = w.st.body
			if spans[i].font.Style == pdf.Regular || spans[i].font.Style == "" {
				spans[i].font.Style = pdf.Bold
			}
		}
	}
	top := w.y
	for _, ln := range lines {
		w.drawLine(spans, ln, w.x+w.indent, w.y+pdf.PtToMM(size)*0.8)
		w.y += lh
	}
	idx := len(w.headings)
	rec := headingRec{title: title, level: level, page: w.doc.PageNo()}
	w.headings = append(w.headings, rec)
	// Outline levels may rise by one at a time only (a level-3 heading
	// straight under a level-1 one hangs one level below it).
	ol := min(level-1, w.outlineLevel+1)
	w.outlineLevel = ol
	w.doc.Bookmark(title, ol, top)
	if w.known != nil && idx < len(w.known.headings) && w.known.headings[idx].link > 0 {
		w.doc.SetLink(w.known.headings[idx].link, top, 0)
	}
	switch level {
	case 1:
		w.y += 1.2
		if !w.measuring {
			w.doc.Line(w.x, w.y, w.x+w.width, w.y, 0.5, w.st.accent)
		}
		w.y += 4.5
	case 2:
		w.y += 2.2
	default:
		w.y += 1.4
	}
}

// nest enters a list or quote, refusing nesting beyond MaxNesting; a
// refused node is remembered so that leaving it undoes nothing.
func (w *writer) nest(n ast.Node) bool {
	w.depth++
	if w.depth > MaxNesting {
		w.failAt(w.nodePos(n), "lists and quotes are nested %d deep here; at most %d levels print legibly, so flatten this part of the brief", w.depth, MaxNesting)
		w.depth--
		w.consumed[n] = true
		return false
	}
	return true
}

func (w *writer) list(n ast.Node, entering bool) ast.WalkStatus {
	l := n.(*ast.List)
	if entering {
		if !w.nest(n) {
			return ast.WalkSkipChildren
		}
		w.lists = append(w.lists, &listState{ordered: l.IsOrdered(), next: l.Start, marker: l.Marker})
		w.indent += 6
		w.tight = l.IsTight
		return ast.WalkContinue
	}
	if w.consumed[n] {
		return ast.WalkContinue
	}
	w.depth--
	w.lists = w.lists[:len(w.lists)-1]
	w.indent -= 6
	w.tight = false
	if len(w.lists) > 0 {
		w.tight = true
	} else {
		w.y += paraGap - listItemGap
	}
	return ast.WalkContinue
}

func (w *writer) listItem(n ast.Node, entering bool) ast.WalkStatus {
	if !entering || len(w.lists) == 0 {
		return ast.WalkContinue
	}
	ls := w.lists[len(w.lists)-1]
	m := span{font: w.st.font(pdf.Regular, w.st.size), color: w.st.accent}
	if ls.ordered {
		m.text = strconv.Itoa(ls.next) + "."
		ls.next++
	} else {
		m.text = []string{"•", "–", "◦"}[(len(w.lists)-1)%3]
		if m.text == "◦" {
			m.text = "·"
		}
	}
	w.marker = &m
	return ast.WalkContinue
}

func (w *writer) blockquote(n ast.Node, entering bool) ast.WalkStatus {
	if entering {
		if !w.nest(n) {
			return ast.WalkSkipChildren
		}
		w.quotes = append(w.quotes, w.indent+1)
		w.indent += 5
		return ast.WalkContinue
	}
	if w.consumed[n] {
		return ast.WalkContinue
	}
	w.depth--
	w.quotes = w.quotes[:len(w.quotes)-1]
	w.indent -= 5
	return ast.WalkContinue
}

func (w *writer) thematicBreak(n ast.Node, entering bool) ast.WalkStatus {
	if !entering {
		return ast.WalkContinue
	}
	w.flushColumns()
	w.ensure(6)
	w.y += 2.5
	if !w.measuring {
		w.doc.Line(w.x+w.width*0.3, w.y, w.x+w.width*0.7, w.y, 0.3, w.st.rule)
	}
	w.y += 4
	return ast.WalkContinue
}

// codeBlock sets an indented code block in the monospaced face.
func (w *writer) codeBlock(n ast.Node, entering bool) ast.WalkStatus {
	if entering {
		w.codeLines(n)
	}
	return ast.WalkSkipChildren
}

func (w *writer) codeLines(n ast.Node) {
	w.flushColumns()
	f := pdf.Font{Family: pdf.Mono, Size: 8.5}
	lh := pdf.PtToMM(8.5 * 1.3)
	lines := n.Lines()
	w.ensure(lh*2 + 3)
	w.y += 1
	for i := 0; i < lines.Len(); i++ {
		seg := lines.At(i)
		txt := strings.TrimRight(strings.ReplaceAll(string(seg.Value(w.src)), "\t", "    "), "\n")
		w.ensure(lh)
		if !w.measuring {
			w.doc.FillRect(w.x+w.indent, w.y, w.width-w.indent, lh, mix(w.st.rule, white, 0.75))
			w.doc.SetFont(f)
			w.doc.SetTextColor(w.st.text)
			w.doc.Text(w.x+w.indent+2, w.y+lh*0.75, w.doc.Fit(txt, w.width-w.indent-4))
		}
		w.drawBars(w.y, lh)
		w.y += lh
	}
	w.y += paraGap + 1
}

func (w *writer) footnoteLink(n ast.Node, entering bool) ast.WalkStatus {
	if entering {
		fl := n.(*east.FootnoteLink)
		size := w.inlineSize
		w.inlineSize = size * 0.7
		w.raise = pdf.PtToMM(size) * 0.33
		w.addText(strconv.Itoa(fl.Index))
		w.raise = 0
		w.inlineSize = size
	}
	return ast.WalkSkipChildren
}

func (w *writer) footnoteList(n ast.Node, entering bool) ast.WalkStatus {
	if entering {
		w.sectionHeading("Notes", 2)
	}
	return ast.WalkContinue
}

// footnote sets one note with its number hung in the margin, in a smaller
// size; its paragraphs are laid out by the paragraph function.
func (w *writer) footnote(n ast.Node, entering bool) ast.WalkStatus {
	fn := n.(*east.Footnote)
	if entering {
		w.indent += 6
		w.marker = &span{text: strconv.Itoa(fn.Index) + ".", font: w.st.font(pdf.Regular, w.st.size), color: w.st.muted}
		return ast.WalkContinue
	}
	w.indent -= 6
	return ast.WalkContinue
}
