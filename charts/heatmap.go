package charts

import (
	"fmt"
	"image/color"
	"math"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"peerpack/internal/brief"
	"peerpack/internal/figures"
	"peerpack/internal/format"
)

// HeatRow is one institution's row of percentile ranks (NaN: no value),
// with the quarter of each (Position.Quartile, 0: unshaded) and, for the
// columns of a group below the small-group floor, the rank.
type HeatRow struct {
	Label       string
	Focus       bool
	Named       bool
	Percentiles []float64
	Quarters    []int
	Ranks       []int
}

// HeatmapChart shows institutions x indicators: each cell the percentile
// rank in a group, printed as tables print it (format.PercentileRank),
// shaded by the quarter it falls in as the tables shade. A column whose
// indicator fewer members report than the small-group floor gives ranks,
// unshaded, as the tables do.
type HeatmapChart struct {
	Columns []string
	// RanksOnly marks the columns below the small-group floor.
	RanksOnly []bool
	// Floor is the small-group floor, for the note on such columns.
	Floor int
	Rows  []HeatRow
	// Group names the group the percentiles are taken in, for the legend.
	Group string
	Note  string
	Theme Theme
	built *panels
}

// QuartileShade is the fill of a figure in quarter q of its group (1 the
// best .. 4 the worst; 0 or other values: none, white): one hue, the
// palette's blue (Okabe and Ito 2008), in four lightness steps, darkest
// for the best quarter, so the order survives greyscale print. Tables use
// the same steps, so a heatmap cell and a table cell of the same quarter
// look alike.
func QuartileShade(q int) color.Color {
	mix := func(t float64) color.Color {
		f := func(x uint8) uint8 { return uint8(float64(x)*(1-t) + 255*t + 0.5) }
		return color.RGBA{f(PaletteBlue.R), f(PaletteBlue.G), f(PaletteBlue.B), 0xff}
	}
	switch q {
	case 1:
		return mix(0.45)
	case 2:
		return mix(0.65)
	case 3:
		return mix(0.82)
	case 4:
		return mix(0.95)
	}
	return whiteColor
}

// quarterWords name the quarters in the legend. Quarters are drawn by the
// group's quartile values (Position.Quartile), so no percentile bounds are
// given: a tie on a quartile goes to the better quarter.
var quarterWords = []string{"top quarter", "second", "third", "bottom"}

const (
	heatRowH    = 14
	heatHeaderH = 36
)

// HeatmapPlotter draws the grid in the whole data canvas.
type HeatmapPlotter struct{ Chart *HeatmapChart }

// Plot implements plot.Plotter.
func (h *HeatmapPlotter) Plot(c draw.Canvas, _ *plot.Plot) {
	hc := h.Chart
	th := hc.Theme
	w := c.Max.X - c.Min.X
	g := hc.geometry(w)
	nameW, cellW, headH := g.nameW, g.cellW, g.headH
	top := c.Max.Y
	head := g.head
	for j, col := range hc.Columns {
		x := c.Min.X + nameW + cellW*vg.Length(j) + cellW/2
		if g.rotated {
			// Read upwards from just above the cells, as in a printed
			// table with narrow columns.
			sty := head
			sty.Rotation = math.Pi / 2
			sty.XAlign, sty.YAlign = draw.XLeft, draw.YCenter
			c.FillText(sty, vg.Point{X: x, Y: top - headH + 3}, fitText(col, head, headH-5))
			continue
		}
		lines := wrapText(col, head, cellW-4, 3)
		for k, line := range lines {
			base := top - headH + 4 + (textHeight(head)+1)*vg.Length(len(lines)-1-k) + head.FontExtents().Descent
			fillText(&c, head, x, base, draw.XCenter, line)
		}
	}
	cellText := th.text(sizeTick, false, PaletteBlack)
	for i, r := range hc.Rows {
		y1 := top - headH - heatRowH*vg.Length(i)
		y0 := y1 - heatRowH
		sty := th.labelStyle()
		if r.Focus {
			sty = th.focusLabelStyle()
		}
		mk := Marker{}
		if r.Focus {
			mk = FocusMarker()
			mk.Radius = vg.Points(3.4)
		} else if r.Named {
			mk = NamedMarker()
			mk.Radius = vg.Points(2.6)
		}
		tx := c.Min.X + 10
		if mk.Radius > 0 {
			mk.Draw(&c, vg.Point{X: c.Min.X + 4.5, Y: (y0 + y1) / 2})
		}
		base := (y0+y1)/2 - textHeight(sty)/2 + sty.FontExtents().Descent
		fillText(&c, sty, tx, base, draw.XLeft, fitText(r.Label, sty, nameW-14))
		for j := range hc.Columns {
			x0 := c.Min.X + nameW + cellW*vg.Length(j)
			cell := vg.Rectangle{Min: vg.Point{X: x0 + 0.5, Y: y0 + 0.5}, Max: vg.Point{X: x0 + cellW - 0.5, Y: y1 - 0.5}}
			p := math.NaN()
			if j < len(r.Percentiles) {
				p = r.Percentiles[j]
			}
			if math.IsNaN(p) {
				c.SetLineStyle(draw.LineStyle{Color: greyGrid, Width: vg.Points(0.5)})
				c.Stroke(cell.Path())
				fillText(&c, cellText, (cell.Min.X+cell.Max.X)/2, (y0+y1)/2-textHeight(cellText)/2+cellText.FontExtents().Descent, draw.XCenter, "–")
				continue
			}
			txt, q := format.Int(format.PercentileRank(p)), 0
			if j < len(r.Quarters) {
				q = r.Quarters[j]
			}
			if j < len(hc.RanksOnly) && hc.RanksOnly[j] {
				// Below the small-group floor: the rank, unshaded.
				txt, q = "–", 0
				if j < len(r.Ranks) && r.Ranks[j] > 0 {
					txt = format.Int(r.Ranks[j])
				}
			}
			if q == 0 {
				c.SetLineStyle(draw.LineStyle{Color: greyGrid, Width: vg.Points(0.5)})
				c.Stroke(cell.Path())
			} else {
				c.SetColor(QuartileShade(q))
				c.Fill(cell.Path())
			}
			fillText(&c, cellText, (cell.Min.X+cell.Max.X)/2, (y0+y1)/2-textHeight(cellText)/2+cellText.FontExtents().Descent, draw.XCenter, txt)
		}
		if r.Focus {
			// A black frame round the focus row, in any print.
			row := vg.Rectangle{Min: vg.Point{X: c.Min.X + nameW, Y: y0}, Max: vg.Point{X: c.Max.X, Y: y1}}
			c.SetLineStyle(draw.LineStyle{Color: PaletteBlack, Width: vg.Points(1.2)})
			c.Stroke(row.Path())
		}
	}
}

// heatGeometry is the heatmap's layout at a width.
type heatGeometry struct {
	nameW, cellW, headH vg.Length
	head                text.Style
	// rotated headers read upwards when a column is too narrow for its
	// name on three lines.
	rotated bool
}

func (hc *HeatmapChart) geometry(w vg.Length) heatGeometry {
	th := hc.Theme
	// Names take a third of a full-width chart and more of a narrow one,
	// where the percentile cells need less room than the names.
	g := heatGeometry{nameW: min(w*0.34, vg.Points(170)), headH: heatHeaderH, head: th.text(sizeTick, false, PaletteBlack)}
	if w < vg.Points(300) {
		g.nameW = w * 0.42
	}
	g.cellW = (w - g.nameW) / vg.Length(max(len(hc.Columns), 1))
	if minCell := hc.minCellW(); g.cellW < minCell {
		// Many columns: the names give up room (down to minHeatNameW,
		// names shortened as fitText does) before a cell grows too narrow
		// for its percentile.
		g.nameW = max(min(g.nameW, w-minCell*vg.Length(len(hc.Columns))), min(g.nameW, minHeatNameW))
		g.cellW = (w - g.nameW) / vg.Length(max(len(hc.Columns), 1))
	}
	for _, col := range hc.Columns {
		for _, line := range wrapText(col, g.head, g.cellW-4, 3) {
			if strings.HasSuffix(line, "…") && !strings.HasSuffix(col, "…") {
				g.rotated = true
			}
		}
	}
	if g.rotated {
		longest := vg.Length(0)
		for _, col := range hc.Columns {
			longest = max(longest, g.head.Width(col))
		}
		g.headH = min(longest+8, vg.Points(110))
	}
	return g
}

func (hc *HeatmapChart) panels() *panels {
	if hc.built != nil {
		return hc.built
	}
	th := hc.Theme
	ps := &panels{legend: &legend{th: th}, count: 1}
	ps.panelHeight = func(w vg.Length) vg.Length {
		return hc.geometry(w).headH + vg.Points(heatRowH*float64(len(hc.Rows))+2)
	}
	ps.make = func(vg.Length, int) []*plot.Plot {
		p := newPlot(th)
		p.HideAxes()
		p.Add(&HeatmapPlotter{Chart: hc})
		return []*plot.Plot{p}
	}
	l := ps.legend
	for _, r := range hc.Rows {
		if r.Focus {
			mk := FocusMarker()
			mk.Radius = vg.Points(3.4)
			l.add(legendEntry{Text: r.Label + " (framed row)", Bold: true, Thumb: markerThumb(mk)})
			break
		}
	}
	for _, r := range hc.Rows {
		if r.Named {
			mk := NamedMarker()
			mk.Radius = vg.Points(2.6)
			l.add(legendEntry{Text: "Named institution", Thumb: markerThumb(mk)})
			break
		}
	}
	if hc.ranksOnly() < len(hc.Columns) {
		l.add(legendEntry{Text: "Percentile rank in " + hc.Group + "; shading by quarter:", Width: 0.01})
		for q, words := range quarterWords {
			l.add(legendEntry{Text: words, Thumb: fillThumb(QuartileShade(q+1), greyGrid)})
		}
	} else {
		l.add(legendEntry{Text: "Rank in " + hc.Group + ", 1 the best", Width: 0.01})
	}
	l.add(legendEntry{Text: "– no value", Width: 0.01})
	l.note = hc.Note
	hc.built = ps
	return ps
}

// ranksOnly counts the columns below the small-group floor.
func (hc *HeatmapChart) ranksOnly() int {
	n := 0
	for _, r := range hc.RanksOnly {
		if r {
			n++
		}
	}
	return n
}

// Height implements Chart.
func (hc *HeatmapChart) Height(w vg.Length) vg.Length { return hc.panels().Height(w) }

// Draw implements Chart. A heatmap whose cells would be too narrow for
// their percentiles at this width is refused with how many columns fit.
func (hc *HeatmapChart) Draw(c draw.Canvas) error {
	if err := hc.CheckWidth(c.Max.X - c.Min.X); err != nil {
		return err
	}
	return hc.panels().Draw(c)
}

// minHeatNameW is the narrowest the name column is set to make room for
// many columns.
const minHeatNameW = vg.Length(90)

// minCellW is the narrowest cell that prints a percentile ("100") with a
// little room either side.
func (hc *HeatmapChart) minCellW() vg.Length {
	return hc.Theme.text(sizeTick, false, PaletteBlack).Width("100") + 4
}

// CheckWidth reports, at a width, whether every cell is wide enough for its
// percentile; if not, the error says how many columns would fit and what
// to change.
func (hc *HeatmapChart) CheckWidth(w vg.Length) error {
	g := hc.geometry(w)
	min := hc.minCellW()
	if g.cellW >= min {
		return nil
	}
	fit := max(int((w-g.nameW)/min), 1)
	return fmt.Errorf("a heatmap of %d indicators is too wide to read: at this width at most %d columns keep their percentiles legible; list at most %d indicators in the block's indicators:, or split them over several heatmap blocks", len(hc.Columns), fit, fit)
}

// defaultHeatRows is the number of rows when a block sets no limit.
const defaultHeatRows = 20

// newHeatmap plans a heatmap of the first chart group's members over the
// block's indicators.
func newHeatmap(m *figures.Model, spec *brief.ChartBlock, th Theme) (Chart, error) {
	inds, groups, marks, err := chartSubjects(m, spec)
	if err != nil {
		return nil, err
	}
	g := groups[0]
	year := chartYear(m, spec)
	places := make([][]figures.MemberPlace, len(inds))
	for k, ind := range inds {
		places[k] = m.MemberPlaces(g.Name, ind.Key, year)
	}
	limit := spec.Limit
	if limit <= 0 {
		limit = defaultHeatRows
	}
	// Rows: the focus and named institutions first kept, then the best on
	// the first indicator, up to the limit, shown in first-indicator order.
	keep := map[int]bool{m.Focus: true}
	for _, i := range marks {
		keep[i] = true
	}
	var order []int
	for _, p := range places[0] {
		order = append(order, p.Institution)
	}
	// Members without a value on the first indicator go last.
	inOrder := map[int]bool{}
	for _, i := range order {
		inOrder[i] = true
	}
	for _, i := range g.MembersIn(year) {
		if !inOrder[i] {
			order = append(order, i)
		}
	}
	if !g.HasIn(m.Focus, year) {
		order = append(order, m.Focus)
	}
	chosen := map[int]bool{}
	n := 0
	for i := range keep {
		if g.HasIn(i, year) || i == m.Focus {
			chosen[i] = true
			n++
		}
	}
	for _, i := range order {
		if n >= limit {
			break
		}
		if !chosen[i] {
			chosen[i] = true
			n++
		}
	}
	hc := &HeatmapChart{Group: g.Name, Theme: th, Floor: m.Floor}
	var small []string
	for _, ind := range inds {
		hc.Columns = append(hc.Columns, shortName(ind))
		d, ok := m.Distribution(g.Name, ind.Key, year)
		below := ok && m.BelowFloor(d)
		hc.RanksOnly = append(hc.RanksOnly, below)
		if below {
			small = append(small, shortName(ind))
		}
	}
	for _, inst := range order {
		if !chosen[inst] {
			continue
		}
		r := HeatRow{Label: institution(m, inst).Name, Focus: inst == m.Focus, Named: keep[inst] && inst != m.Focus}
		if sn, ok := institution(m, inst).Attr(shortNameAttr); ok && sn != "" && len([]rune(r.Label)) > 34 {
			r.Label = sn
		}
		for k, ind := range inds {
			pl, ok := placeOf(places[k], inst)
			if inst == m.Focus && !g.HasIn(inst, year) {
				if pos, okp := m.Position(g.Name, ind.Key, inst, year); okp && pos.HasValue {
					pl, ok = figures.MemberPlace{Institution: inst, Value: pos.Value, Quartile: pos.Quartile}, true
					pl.Rank, pl.Of, pl.Percentile = pos.Rank, pos.Of, pos.Percentile
				}
			}
			if !ok {
				pl.Percentile = math.NaN()
			}
			r.Percentiles = append(r.Percentiles, pl.Percentile)
			r.Quarters = append(r.Quarters, pl.Quartile)
			r.Ranks = append(r.Ranks, pl.Rank)
		}
		hc.Rows = append(hc.Rows, r)
	}
	shown := len(hc.Rows)
	outside := ""
	if !g.HasIn(m.Focus, year) {
		shown--
		outside = fmt.Sprintf(" %s is not a member: its row places it among them.", institution(m, m.Focus).Name)
	}
	hc.Note = fmt.Sprintf("Rows ordered by %s; %d of the group's %d members shown.%s", shortName(inds[0]), shown, len(g.MembersIn(year)), outside)
	const direction = " run in each indicator's better direction (higher is better; for neutral indicators, higher values)"
	switch {
	case len(small) == 0:
		hc.Note += " Percentile ranks" + direction + "."
	case len(small) == len(inds):
		hc.Note += fmt.Sprintf(" Ranks%s, 1 the best: fewer than %d members report each indicator, too few for percentiles or quarters.", direction, hc.Floor)
	default:
		hc.Note += fmt.Sprintf(" Percentile ranks%s. Fewer than %d members report %s: %s ranks, 1 the best, unshaded.", direction, hc.Floor, joinAnd(small), map[bool]string{true: "its column gives", false: "their columns give"}[len(small) == 1])
	}
	return hc, nil
}
