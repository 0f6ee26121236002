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
	chartGap       = 6   // between two half-width charts, mm
	captionSize    = 8.5 // pt
	captionGap     = 1.5 // between a chart and its caption, mm
	chartTitleSize = 9.5 // pt
	chartSpacing   = 4   // above and below a chart, mm
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
	if cb.Size == "half" && w.cols > 1 {
		w.failAt(cb.At, "size: half has no effect inside columns: a chart there takes its column's width; remove size: half, or end the columns before the chart (a columns block with count: 1)")
		return
	}
	ch, err := w.planChart(cb)
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

// chartPlans are the charts of one render, planned once and set by every
// pass: a chart's plan depends only on the model, its block and the
// theme, which no pass changes.
type chartPlans struct {
	byBlock map[*brief.ChartBlock]chartPlan
}

type chartPlan struct {
	ch  charts.Chart
	err error
}

// planChart plans a chart block, or returns the plan an earlier pass made.
func (w *writer) planChart(cb *brief.ChartBlock) (charts.Chart, error) {
	ps := w.in.plans
	if ps == nil {
		return charts.New(w.m, cb, w.chartTheme())
	}
	if p, ok := ps.byBlock[cb]; ok {
		// A worker may be drawing it (handed over by the first measuring
		// pass): let it finish before the chart is asked anything. A
		// measuring pass drops a drawing not yet started rather than make
		// it in line.
		if w.measuring {
			w.in.predraw.hold(cb)
		} else {
			w.in.predraw.settle(cb)
		}
		return p.ch, p.err
	}
	ch, err := charts.New(w.m, cb, w.chartTheme())
	ps.byBlock[cb] = chartPlan{ch, err}
	return ch, err
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
// row, each with its title above and caption below it, the row kept on one
// page.
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
	texts := make([]chartText, len(row))
	titleH := 0.0
	numbers := make([]int, len(row))
	for i, p := range row {
		w.figureNo++
		numbers[i] = w.figureNo
		texts[i] = w.chartTexts(p.spec, p.ch, w.figureNo, width)
		titleH = math.Max(titleH, texts[i].titleH)
	}
	for i, p := range row {
		h := float64(p.ch.Height(vg.Length(width*pdf.PointsPerMM))) / pdf.PointsPerMM
		if h <= 0 || math.IsNaN(h) || math.IsInf(h, 0) {
			h = width * 0.62
		}
		if elastic(p.spec) {
			h *= w.plan.chartScale(w.section)
		}
		h = math.Min(h, maxH-titleH-texts[i].capH)
		heights[i] = h
	}
	rowHeight := func() float64 {
		rh := 0.0
		for i := range row {
			rh = math.Max(rh, titleH+heights[i]+texts[i].capH)
		}
		return rh
	}
	rowH := rowHeight()
	tallest := 0.0
	for i, h := range heights {
		if elastic(row[i].spec) {
			tallest = math.Max(tallest, h)
		}
	}
	w.chartHeight[w.section] += tallest // what tightening can take from
	if !w.atFrameTop() {
		w.y += chartSpacing
	}
	if w.y+rowH > w.bottom() {
		// A chart that nearly fits is set a little shorter rather than
		// pushed to the next page, which would leave a gap here.
		if s := squeezeToFit(w.bottom()-w.y-titleH, row, heights, texts); s > 0 {
			for i := range heights {
				heights[i] *= s
			}
			rowH = rowHeight()
		} else {
			w.nextFrame()
		}
	}
	top := w.y
	for i, p := range row {
		x := w.x + w.indent + float64(i)*(width+chartGap)
		if len(row) == 1 && half {
			x = w.x + w.indent + (avail-width)/2
		}
		y := top
		for _, ln := range texts[i].title {
			w.drawLine(texts[i].titleSpans, ln, x, y+pdf.PtToMM(chartTitleSize)*0.8)
			y += w.st.lineHeight(chartTitleSize)
		}
		y = top + titleH
		if w.measuring {
			s := sizedChart{spec: p.spec, ch: p.ch, width: width, height: heights[i]}
			w.sized = append(w.sized, s)
			if w.in.feedPredraw {
				w.in.predraw.add(s)
			}
		} else {
			if err := w.drawChart(p, x, y, width, heights[i]); err != nil {
				w.chartProblem(p.spec, err)
			}
			w.figures = append(w.figures, Figure{Number: numbers[i], Title: figureTitle(p.spec), Chart: p.ch, Width: width, Height: heights[i]})
		}
		y += heights[i] + captionGap
		for _, ln := range texts[i].caption {
			w.drawLine(texts[i].capSpans, ln, x, y+pdf.PtToMM(captionSize)*0.8)
			y += w.st.lineHeight(captionSize)
		}
	}
	w.y = top + rowH + chartSpacing
}

// chartText is a chart's title (above it) and caption (below), set and
// measured.
type chartText struct {
	titleSpans, capSpans []span
	title, caption       []line
	// titleH and capH are the room each takes, gaps included.
	titleH, capH float64
}

// chartTexts sets a chart's title in the bold text face and its numbered
// caption ("Figure 3. Caption") at a width.
func (w *writer) chartTexts(spec *brief.ChartBlock, ch charts.Chart, no int, width float64) chartText {
	var t chartText
	if spec.Title != "" {
		t.titleSpans = []span{{text: spec.Title, font: w.st.font(pdf.Bold, chartTitleSize), color: w.st.text}}
		t.title = w.wrap(t.titleSpans, w.tokenize(t.titleSpans), width, width)
		t.titleH = float64(len(t.title))*w.st.lineHeight(chartTitleSize) + 1.2
	}
	caption := spec.Caption
	if c, ok := ch.(charts.Captioner); ok && caption == "" {
		// A kind that writes its caption from the figures it draws.
		caption = c.Caption()
	}
	t.capSpans = w.captionSpans("Figure", no, caption)
	t.caption = w.wrap(t.capSpans, w.tokenize(t.capSpans), width, width)
	t.capH = float64(len(t.caption))*w.st.lineHeight(captionSize) + captionGap
	return t
}

// drawChart draws a chart onto a canvas over its rectangle; a panic in a
// chart is turned into a positioned error rather than ending the build.
func (w *writer) drawChart(p placed, x, y, width, height float64) (err error) {
	if rec, ok, err := w.in.predraw.recording(p.spec, width, height); ok {
		if err == nil {
			// A draft is never written: the chart drawn is proof enough.
			if !w.in.Draft {
				w.doc.Replay(rec, x, y)
			}
			w.in.predraw.replayed.Add(1)
		}
		return err
	}
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

// minChartScale is the shortest a chart is set to fit the room left on a
// page, as a share of the height it asks for: below it the chart's rows
// and labels would crowd (common practice, no source).
const minChartScale = 0.86

// elastic reports whether a chart kind can be set shorter than it asks
// without crowding: a scatter, radar or trend fills whatever area it is
// given, while box, bars and heatmap rows have a fixed pitch and their
// labels would collide.
func elastic(spec *brief.ChartBlock) bool {
	switch spec.Type {
	case "scatter", "radar", "vote-profile", "trend":
		return true
	}
	return false
}

// squeezeToFit returns the factor (minChartScale..1) by which the charts
// of a row, each above its caption, must be shortened to fit in room, or
// 0 when even the shortest allowed would not fit.
func squeezeToFit(room float64, row []placed, heights []float64, texts []chartText) float64 {
	s := 1.0
	for i, h := range heights {
		if h <= 0 {
			continue
		}
		if !elastic(row[i].spec) {
			return 0
		}
		s = math.Min(s, (room-texts[i].capH)/h)
	}
	if s < minChartScale {
		return 0
	}
	return s
}

// Figure is a chart as set in the pack: its figure number, a title (the
// block's title, else its caption, else its kind), the chart and the
// size it was drawn at in millimetres. Render's callers draw it again on
// other canvases (SVG, PNG) with the same code.
type Figure struct {
	Number        int
	Title         string
	Chart         charts.Chart
	Width, Height float64
}

func figureTitle(spec *brief.ChartBlock) string {
	switch {
	case spec.Title != "":
		return spec.Title
	case spec.Caption != "":
		return spec.Caption
	}
	return spec.Type
}
