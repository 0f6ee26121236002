package layout

import (
	"errors"
	"fmt"
	"math"

	"github.com/yuin/goldmark/ast"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"peerpack/charts"
	"peerpack/internal/brief"
	"peerpack/internal/diag"
	"peerpack/internal/pdf"
)

// placed is a planned chart waiting to be set.
type placed struct {
	spec *brief.ChartBlock
	ch   charts.Chart
}

// halfChart is a half-width chart held back to pair with the next one.
type halfChart = placed

const (
	chartGap     = 6   // between two half-width charts, mm
	captionSize  = 8.5 // pt
	chartSpacing = 4   // above and below a chart, mm
)

func isHalfChart(w *writer, n ast.Node) bool {
	cb, ok := w.blockOf(n).(*brief.ChartBlock)
	return ok && cb.Size == "half" && w.cols <= 1
}

func (w *writer) chartTheme() charts.Theme {
	return charts.Theme{Serif: w.st.body == pdf.Serif, Accent: w.st.accent}
}

// chart plans a chart block and sets it, pairing consecutive half-width
// charts side by side.
func (w *writer) chart(cb *brief.ChartBlock) {
	ch, err := charts.New(w.m, cb, w.chartTheme())
	if err != nil {
		w.chartProblem(cb, err)
		return
	}
	p := placed{spec: cb, ch: ch}
	if cb.Size == "half" && w.cols <= 1 {
		if w.pendingHalf != nil {
			first := *w.pendingHalf
			w.pendingHalf = nil
			w.setCharts([]placed{first, p}, true)
			return
		}
		w.pendingHalf = &p
		return
	}
	w.setCharts([]placed{p}, false)
}

func (w *writer) chartProblem(cb *brief.ChartBlock, err error) {
	var pr *diag.Problem
	var l *diag.List
	if errors.As(err, &pr) {
		cp := *pr
		if cp.File == "" {
			cp.File = w.b.File
		}
		if cp.Line == 0 {
			cp.Line, cp.Column = cb.At.Line, cb.At.Column
		}
		w.problems.Add(&cp)
		return
	}
	if errors.As(err, &l) {
		w.problems.Add(err)
		return
	}
	w.failAt(cb.At, "chart %q: %v", cb.Type, err)
}

// flushHalf sets a half-width chart that found no partner.
func (w *writer) flushHalf() {
	if w.pendingHalf == nil {
		return
	}
	p := *w.pendingHalf
	w.pendingHalf = nil
	w.setCharts([]placed{p}, true)
}

// setCharts sets one full-width chart or one or two half-width charts in a
// row, each with its caption below it, the row kept on one page.
func (w *writer) setCharts(row []placed, half bool) {
	if w.cols > 1 {
		w.spanColumns(func() { w.setCharts(row, half) })
		return
	}
	avail := w.width - w.indent
	width := avail
	if half {
		width = (avail - chartGap) / 2
	}
	maxH := w.bottom() - w.frameTop() - 2*chartSpacing
	heights := make([]float64, len(row))
	caps := make([][]line, len(row))
	capSpans := make([][]span, len(row))
	rowH := 0.0
	for i, p := range row {
		w.figureNo++
		capSpans[i] = w.captionSpans("Figure", w.figureNo, p.spec.Caption)
		caps[i] = w.wrap(capSpans[i], w.tokenize(capSpans[i]), width, width)
		capH := float64(len(caps[i])) * w.st.lineHeight(captionSize)
		h := float64(p.ch.Height(vg.Length(width*pdf.PointsPerMM))) / pdf.PointsPerMM
		if h <= 0 || math.IsNaN(h) || math.IsInf(h, 0) {
			h = width * 0.62
		}
		if h > maxH-capH {
			h = maxH - capH
		}
		heights[i] = h
		rowH = math.Max(rowH, h+capH+1.5)
	}
	if !w.atFrameTop() {
		w.y += chartSpacing
	}
	if w.y+rowH > w.bottom() {
		w.nextFrame()
	}
	top := w.y
	for i, p := range row {
		x := w.x + w.indent + float64(i)*(width+chartGap)
		if len(row) == 1 && half {
			x = w.x + w.indent + (avail-width)/2
		}
		if !w.measuring {
			if err := w.drawChart(p, x, top, width, heights[i]); err != nil {
				w.chartProblem(p.spec, err)
			}
		}
		y := top + heights[i] + 1.5
		for _, ln := range caps[i] {
			w.drawLine(capSpans[i], ln, x, y+pdf.PtToMM(captionSize)*0.8)
			y += w.st.lineHeight(captionSize)
		}
	}
	w.y = top + rowH + chartSpacing
}

// drawChart draws a chart onto a canvas over its rectangle; a panic in a
// chart is turned into a positioned error rather than ending the build.
func (w *writer) drawChart(p placed, x, y, width, height float64) (err error) {
	c := w.doc.Canvas(x, y, width, height)
	defer func() {
		c.Close()
		if r := recover(); r != nil {
			err = fmt.Errorf("could not be drawn (internal error, please report it with the brief): %v", r)
		}
	}()
	return p.ch.Draw(draw.New(c))
}

// captionSpans builds "Figure 3. Caption" in the caption style.
func (w *writer) captionSpans(kind string, no int, caption string) []span {
	lead := fmt.Sprintf("%s %d.", kind, no)
	sp := []span{{text: lead, font: w.st.font(pdf.Bold, captionSize), color: w.st.muted}}
	if caption != "" {
		sp = append(sp, span{text: " " + caption, font: w.st.font(pdf.Regular, captionSize), color: w.st.muted})
	}
	return sp
}
