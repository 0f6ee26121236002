package charts

import (
	"strings"

	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// textHeight is the ink height of one line: ascent plus descent.
func textHeight(sty text.Style) vg.Length {
	e := sty.FontExtents()
	return e.Ascent + e.Descent
}

// fillText draws one line with its baseline at y and its left, centre or
// right (xalign) at x. Plain text handlers place YBottom text at
// y + size - ascent; drawing from the baseline keeps label boxes exact.
func fillText(c *draw.Canvas, sty text.Style, x, baseline vg.Length, xalign draw.XAlignment, s string) {
	if s == "" {
		return
	}
	sty.XAlign, sty.YAlign, sty.Rotation = xalign, draw.YBottom, 0
	e := sty.FontExtents()
	c.FillText(sty, vg.Point{X: x, Y: baseline + e.Ascent - sty.Font.Size}, s)
}

// fillTextIn draws one line inside a box of height textHeight, the box's
// lower edge at the bottom of the descenders.
func fillTextIn(c *draw.Canvas, sty text.Style, r vg.Rectangle, s string) {
	fillText(c, sty, r.Min.X, r.Min.Y+sty.FontExtents().Descent, draw.XLeft, s)
}

// wrapText breaks s at spaces into lines that fit width, at most maxLines
// of them, the last shortened with an ellipsis when words remain.
func wrapText(s string, sty text.Style, width vg.Length, maxLines int) []string {
	return wrapWords(strings.Fields(s), sty, width, maxLines)
}

// wrapWords is wrapText over given words; a "word" may hold spaces when
// it must never be broken (a unit in parentheses).
func wrapWords(words []string, sty text.Style, width vg.Length, maxLines int) []string {
	var lines []string
	cur := ""
	for i, w := range words {
		cand := w
		if cur != "" {
			cand = cur + " " + w
		}
		if sty.Width(cand) <= width || cur == "" {
			cur = cand
			continue
		}
		if len(lines) == maxLines-1 {
			return append(lines, fitText(strings.Join(append([]string{cur}, words[i:]...), " "), sty, width))
		}
		lines = append(lines, fitText(cur, sty, width))
		cur = w
	}
	if cur != "" {
		lines = append(lines, fitText(cur, sty, width))
	}
	return lines
}
