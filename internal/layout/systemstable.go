package layout

import (
	"fmt"
	"math"
	"strings"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
)

// systemsTable lays out a `systems` table from the figures model's system
// section: without indicators, how many institutions each group's
// definition holds and how many pass the population rules; with them,
// each group's median beside its median weighted by size. Every number is
// a figure of the model (figures/systems.go), printed with package format.
func (w *writer) systemsTable(tb *brief.TableBlock, groups []*figures.Group, inds []dataset.Indicator, year int) {
	if len(tb.Groups) == 0 {
		groups = w.m.Groups
	}
	if len(tb.Indicators) == 0 {
		w.systemCountsTable(tb, groups)
		return
	}
	w.systemMediansTable(tb, groups, inds)
}

// systemCountsTable: one row per group, the register count, the ranked
// count and the share ranked.
func (w *writer) systemCountsTable(tb *brief.TableBlock, groups []*figures.Group) {
	g := grid{head: []string{"Group", "Institutions in the register", "Pass the population rules", "Share that pass"},
		align: []byte{'L', 'R', 'R', 'R'}, caption: tb.Caption}
	if g.caption == "" {
		g.caption = "Institutions of each group and the share that pass the population rules"
	}
	unknown := 0
	for _, gr := range groups {
		row := []cell{{text: gr.Name}}
		def, ok1 := w.m.SystemFigure(gr.Name, "", 0, figures.MeasureDefined)
		ranked, ok2 := w.m.SystemFigure(gr.Name, "", 0, figures.MeasureRanked)
		share, ok3 := w.m.SystemFigure(gr.Name, "", 0, figures.MeasureShareRanked)
		if !ok1 || !ok2 || !ok3 {
			unknown++
			row = append(row, cell{text: "–"}, cell{text: "–"}, cell{text: "–"})
		} else {
			row = append(row, cell{text: format.Int(int(def))}, cell{text: format.Int(int(ranked))}, cell{text: format.Number(share, 0) + "%"})
		}
		g.rows = append(g.rows, row)
	}
	d := w.m.Data
	g.notes = append(g.notes, "Institutions in the register: those the group's definition holds before the population rules; the share that pass is of them.")
	if d.Population != nil {
		for _, r := range d.Population.Rules {
			g.notes = append(g.notes, "Rule: "+format.Capitalise(r)+".")
		}
	} else {
		g.notes = append(g.notes, "The brief sets no population rules: every institution in the register is ranked.")
	}
	if unknown > 0 {
		g.notes = append(g.notes, "– : a group chosen by likeness to the focus (nearest or cluster) has no definition outside the ranked population.")
	}
	w.setTable(g)
}

// systemMediansTable: for each indicator, one row per group with its
// median, its median weighted by size, the difference, and how many
// members each is over.
func (w *writer) systemMediansTable(tb *brief.TableBlock, groups []*figures.Group, inds []dataset.Indicator) {
	year := w.m.Year
	size, weighted := w.m.SizeWeight()
	head := []string{"Indicator", "Group", fmt.Sprintf("Median %d", year)}
	align := []byte{'L', 'L', 'R'}
	if weighted {
		head = append(head, "Weighted by "+strings.ToLower(indicatorLabel(size, true)), "Difference")
		align = append(align, 'R', 'R')
	}
	head = append(head, "Members reporting")
	align = append(align, 'R')
	g := grid{head: head, align: align, caption: tb.Caption}
	if g.caption == "" {
		g.caption = fmt.Sprintf("Median of each group's members, %d", year)
		if weighted {
			g.caption = fmt.Sprintf("Median of each group's members and median weighted by %s, %d", strings.ToLower(indicatorLabel(size, false)), year)
		}
	}
	for _, ind := range inds {
		for gi, gr := range groups {
			row := []cell{{text: unitLabel(ind, false)}, {text: gr.Name}}
			if gi > 0 {
				row[0] = cell{text: ""}
			}
			dist, ok := w.m.Distribution(gr.Name, ind.Key, year)
			med := cell{text: "–"}
			n := cell{text: "–"}
			if ok && dist.N > 0 {
				med.text = tableValue(ind, dist.Median)
				n.text = format.Int(dist.N)
			}
			row = append(row, med)
			if weighted {
				wm, okw := w.m.SystemFigure(gr.Name, ind.Key, year, figures.MeasureWeightedMedian)
				gap, okg := w.m.SystemFigure(gr.Name, ind.Key, year, figures.MeasureWeightedGap)
				wc, dc := cell{text: "–"}, cell{text: "–"}
				if okw {
					wc.text = tableValue(ind, wm)
				}
				if okg && !math.IsNaN(gap) {
					dc.text = format.Signed(ind, gap)
					dc.muted = true
				}
				row = append(row, wc, dc)
			}
			row = append(row, n)
			g.rows = append(g.rows, row)
		}
	}
	if weighted {
		g.notes = append(g.notes, fmt.Sprintf("Weighted median: the members' values ordered, each counting with its %s in %d; the value at which half of the group's total %s is reached (midway between two values when half falls exactly between them). It describes the institution of the typical one of those counted (a student, a member of staff) rather than the typical institution. Difference: weighted less plain median; a weighted median above the plain one means the larger institutions stand higher.",
			strings.ToLower(indicatorLabel(size, false)), year, strings.ToLower(indicatorLabel(size, false))))
	} else {
		g.notes = append(g.notes, "The brief names no size_weight indicator, so no weighted medians are shown.")
	}
	g.notes = append(g.notes, "Each median is over the group's members reporting the indicator.")
	w.setTable(g)
}
