package charts

import (
	"fmt"
	"math"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
)

// Room a box chart gives each group row, across the category axis:
// the box plus one line of labels above and one below.
const boxPitch = 40

// legendShortName caps the focus name in a key that must stay on one
// row.
const legendShortName = 76

// markNameWidth caps a labelled institution's name in a chart.
const markNameWidth = 120

// BoxPanel is one indicator's rows of a box chart.
type BoxPanel struct {
	Indicator dataset.Indicator
	Rows      []BoxRow
}

// BoxChart is a box chart from precomputed rows: one panel per indicator,
// the rows (groups) in the same order in every panel.
type BoxChart struct {
	Panels   []BoxPanel
	Vertical bool
	// FocusName is the focus institution's name for the legend;
	// FocusShort the same fitted to legendShortName, used when the full
	// name would push the key onto a second row.
	FocusName  string
	FocusShort string
	Theme      Theme
	built      *panels
}

// newBox plans a box chart from the model.
func newBox(m *figures.Model, spec *brief.ChartBlock, th Theme) (Chart, error) {
	inds, groups, marks, err := chartSubjects(m, spec)
	if err != nil {
		return nil, err
	}
	year := chartYear(m, spec)
	focus := institution(m, m.Focus)
	bc := &BoxChart{Vertical: spec.Orientation == "vertical", FocusName: focus.Name, FocusShort: fitName(focus, th.text(sizeLegend, true, PaletteBlack), legendShortName), Theme: th}
	for _, ind := range inds {
		rows, err := boxRows(m, spec, ind, groups, year, marks, th)
		if err != nil {
			return nil, err
		}
		bc.Panels = append(bc.Panels, BoxPanel{Indicator: ind, Rows: rows})
	}
	return bc, nil
}

func (bc *BoxChart) panels() *panels {
	if bc.built != nil {
		return bc.built
	}
	th := bc.Theme
	ps := &panels{legend: &legend{th: th}, count: len(bc.Panels), minPanel: vg.Points(150)}
	var missing []string
	named, outliers := false, false
	n := 0
	for _, pn := range bc.Panels {
		n = max(n, len(pn.Rows))
		for _, r := range pn.Rows {
			if r.Box.Missing > 0 && len(bc.Panels) == 1 {
				missing = append(missing, fmt.Sprintf("%s %d", r.Label, r.Box.Missing))
			}
			named = named || len(r.Marks) > 0
			outliers = outliers || len(r.Outliers) > 0
		}
	}
	var drawn []*BoxPlotter
	ps.dropped = func() int { return sumDropped(drawn, func(b *BoxPlotter) int { return b.Dropped }) }
	ps.make = func(w vg.Length, cols int) []*plot.Plot {
		out := make([]*plot.Plot, len(bc.Panels))
		drawn = drawn[:0]
		labelW := boxLabelWidth(w)
		if bc.Vertical {
			labelW = 0
		}
		for k, pn := range bc.Panels {
			var bp *BoxPlotter
			out[k], bp = boxPanel(pn, bc.Vertical, k%cols == 0, w, ps.dataWidth(w, cols, labelW), th)
			drawn = append(drawn, bp)
		}
		return out
	}
	if bc.Vertical {
		ps.panelHeight = func(pw vg.Length) vg.Length { return max(min(pw, vg.Points(320)), vg.Points(190)) }
	} else {
		ps.panelHeight = func(vg.Length) vg.Length { return vg.Points(boxPitch*float64(n) + 34) }
	}
	boxLegend(ps.legend, bc.FocusName, bc.FocusShort, named, outliers)
	if len(missing) > 0 {
		ps.legend.note = "Institutions without a value: " + strings.Join(missing, ", ") + "."
	}
	bc.built = ps
	return ps
}

// Height implements Chart.
func (bc *BoxChart) Height(w vg.Length) vg.Length { return bc.panels().Height(w) }

// Draw implements Chart.
func (bc *BoxChart) Draw(c draw.Canvas) error { return bc.panels().Draw(c) }

// boxRows reads one indicator's rows from the model.
func boxRows(m *figures.Model, spec *brief.ChartBlock, ind dataset.Indicator, groups []*figures.Group, year int, marks []int, th Theme) ([]BoxRow, error) {
	rows := make([]BoxRow, 0, len(groups))
	for _, g := range groups {
		d, ok := m.Distribution(g.Name, ind.Key, year)
		if !ok {
			return nil, specError(spec, "the figures hold no distribution of %s for group %q in %d; is %d among the data's years?", ind.Key, g.Name, year, year)
		}
		// n is the panel's own: the members with a value for this
		// indicator and year, which differs between panels where
		// coverage does.
		r := BoxRow{Label: g.Name, Members: d.Box.N, Box: d.Box, Focus: math.NaN(), Outliers: d.Box.OutlierValues, FocusOutside: !g.HasIn(m.Focus, year)}
		if p, ok := m.Position(g.Name, ind.Key, m.Focus, year); ok && p.HasValue {
			r.Focus, r.FocusText = p.Value, axisValueText(ind, p.Value)
		}
		for _, inst := range marks {
			p, ok := m.Position(g.Name, ind.Key, inst, year)
			// Name an institution only in the groups it belongs to: a
			// label in a group it is not part of would misread as
			// membership.
			if !ok || !p.HasValue || !p.InGroup {
				continue
			}
			name := fitName(institution(m, inst), th.labelStyle(), markNameWidth)
			r.Marks = append(r.Marks, Mark{Label: name, Value: p.Value})
		}
		rows = append(rows, r)
	}
	return rows, nil
}

// boxPanel dresses one indicator's BoxPlotter in a plot.
// boxLabelWidth caps the group names left of a horizontal box chart.
func boxLabelWidth(w vg.Length) vg.Length { return min(vg.Points(160), w*0.34) }

// boxPanel builds one panel; width is the chart's, dataW the panel's data
// area (for axis titles and tick density).
func boxPanel(pn BoxPanel, vertical, first bool, width, dataW vg.Length, th Theme) (*plot.Plot, *BoxPlotter) {
	p := newPlot(th)
	bp := &BoxPlotter{Rows: pn.Rows, Vertical: vertical, Theme: th, LabelMarks: first}
	p.Add(grid(!vertical, vertical), bp)
	ticks := make(plot.ConstantTicks, len(pn.Rows))
	for i, r := range pn.Rows {
		size := fmt.Sprintf("n = %d", r.Members)
		if r.FocusOutside {
			size += ", focus outside"
		}
		label := ""
		switch {
		case vertical:
			slot := dataW/vg.Length(max(len(pn.Rows), 1)) - 6
			label = fitText(r.Label, th.tickStyle(), slot) + "\n" + size
		case first:
			label = fitText(r.Label, th.tickStyle(), boxLabelWidth(width)) + "\n" + size
		default:
			// Panels after the first give their own n; the group's
			// name is read from the first panel of the row.
			label = size
		}
		ticks[i] = plot.Tick{Value: bp.slot(i), Label: label}
	}
	value, cat := &p.X, &p.Y
	if vertical {
		value, cat = &p.Y, &p.X
	}
	value.Label.Text = axisTitle(pn.Indicator)
	if vertical {
		value.Label.Text = fitAxisTitle(pn.Indicator, th, max(min(dataW, vg.Points(320)), vg.Points(190))-40)
	} else {
		value.Label.Text = fitAxisTitle(pn.Indicator, th, dataW+8)
		value.Tick.Marker = ticksFor(dataW)
	}
	cat.Tick.Marker = ticks
	cat.Tick.Length = 0
	cat.LineStyle.Width = 0
	return p, bp
}

// boxLegend explains every mark of a box chart.
func boxLegend(l *legend, focusName, focusShort string, withNamed, withOutliers bool) {
	l.add(legendEntry{Text: focusName, Short: focusShort, Bold: true, Thumb: markerThumb(FocusMarker())})
	if withNamed {
		l.add(legendEntry{Text: "Named institution", Thumb: markerThumb(NamedMarker())})
	}
	// Short wording so the whole key sits on one row at full width: the
	// same key repeats under every box chart of a page.
	l.add(legendEntry{Text: "Median, quartiles", Width: 18, Thumb: boxThumb})
	l.add(legendEntry{Text: "Whiskers: 1.5 × IQR", Width: 16, Thumb: whiskerThumb})
	if withOutliers {
		l.add(legendEntry{Text: "Beyond the whiskers", Thumb: markerThumb(OutlierMarker())})
	}
}
