package layout

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
)

// Table kinds for a governing body's pages and a client's peer choice:
//
//   - standing: the focus's place in each of the block's groups, one row
//     per indicator, one column per group (rank "of n", with the
//     percentile when the group is at or above the small-group floor),
//     shaded by the quarter it falls in;
//   - scale: the absolute size of the focus and a group's members (staff,
//     students, income, papers: whatever indicators the block names), with
//     the group's median, for context rather than judgement;
//   - definitions: every group the block names (default: every group of
//     the brief) with its definition in words, its size and whether the
//     focus is a member, after the ranked population it is drawn from.
//
// Every number is read from the figures model (Position, Distribution,
// the dataset's values) and printed with package format, as the other
// tables do.

// standingTable sets the focus's place in each group side by side.
func (w *writer) standingTable(tb *brief.TableBlock, groups []*figures.Group, inds []dataset.Indicator, year int) {
	name := focusName(w.m)
	head := []string{"Indicator"}
	align := []byte{'L'}
	for _, gr := range groups {
		// No-break spaces keep "(n = 8)" whole in the header.
		head = append(head, fmt.Sprintf("%s (n\u00a0=\u00a0%s)", gr.Name, format.Int(len(gr.Members))))
		align = append(align, 'R')
	}
	g := grid{head: head, align: align, legend: true, caption: tb.Caption}
	if g.caption == "" {
		g.caption = fmt.Sprintf("Where %s stands in each group, %d", name, year)
	}
	small, outside := false, false
	for _, ind := range inds {
		row := []cell{{text: unitLabel(ind, false)}}
		for _, gr := range groups {
			cl := cell{text: "–"}
			p, okp := w.m.Position(gr.Name, ind.Key, w.m.Focus, year)
			d, okd := w.m.Distribution(gr.Name, ind.Key, year)
			if okp && okd && p.HasValue && p.Rank > 0 {
				text := format.Rank(p.Rank, w.b.RankBands) + " of " + format.Int(p.Of)
				switch {
				case w.m.BelowFloor(d):
					small = true
				case ind.Better == dataset.Neutral:
				default:
					text += " (" + format.Ordinal(format.PercentileRank(p.Percentile)) + ")"
					cl.shade = p.Quartile
				}
				cl.text = text
				if !gr.FocusIn {
					outside = true
				}
			}
			row = append(row, cl)
		}
		g.rows = append(g.rows, row)
	}
	g.notes = append(g.notes, "Each cell is "+name+"'s rank of the members reporting the indicator, rank 1 the best, with its percentile in brackets; the shading is the quarter of that group it falls in. n is the group's size.")
	if small {
		g.notes = append(g.notes, fmt.Sprintf("Where fewer than %d members report an indicator only the rank is given: quarters and percentiles of so few values mean little.", w.m.Floor))
	}
	if outside {
		g.notes = append(g.notes, name+" is not a member of every group; there it is placed among the members by its value, one more than those reporting.")
	}
	g.notes = append(g.notes, w.methodNote())
	w.setTable(g)
}

// scaleTable sets the absolute size of the focus and a group's members.
func (w *writer) scaleTable(tb *brief.TableBlock, gr *figures.Group, inds []dataset.Indicator, year int) {
	limit := tb.Limit
	if limit <= 0 {
		limit = 25
	}
	data := w.m.Data
	cols := make([][]float64, len(inds))
	for k, ind := range inds {
		cols[k] = data.Column(data.Dictionary.Index(ind.Key), year)
	}
	val := func(k, i int) float64 {
		if cols[k] == nil {
			return math.NaN()
		}
		return cols[k][i]
	}
	rows := append([]int(nil), gr.Members...)
	if !gr.FocusIn {
		rows = append(rows, w.m.Focus)
	}
	// Largest first on the first indicator; those without a value last.
	sort.SliceStable(rows, func(a, b int) bool {
		va, vb := val(0, rows[a]), val(0, rows[b])
		switch {
		case math.IsNaN(va) != math.IsNaN(vb):
			return !math.IsNaN(va)
		case math.IsNaN(va):
			return false
		}
		return va > vb
	})
	all := len(rows)
	cut := ""
	if len(rows) > limit {
		kept := rows[:limit]
		focusKept := false
		for _, i := range kept {
			focusKept = focusKept || i == w.m.Focus
		}
		cut = fmt.Sprintf("Showing the %d largest of the %d institutions on %s", limit, all, indicatorLabel(inds[0], false))
		if !focusKept {
			kept = append(append([]int(nil), rows[:limit-1]...), w.m.Focus)
			cut = fmt.Sprintf("Showing the %d largest of the %d institutions on %s, and %s", limit-1, all, indicatorLabel(inds[0], false), focusName(w.m))
		}
		rows = kept
	}
	head := []string{"Institution", "Country"}
	align := []byte{'L', 'L'}
	for _, ind := range inds {
		head = append(head, unitLabel(ind, true))
		align = append(align, 'R')
	}
	g := grid{head: head, align: align, caption: tb.Caption}
	if g.caption == "" {
		g.caption = fmt.Sprintf("Size of %s and %s, %d", focusName(w.m), gr.Name, year)
	}
	reg := data.Register
	for _, i := range rows {
		in := reg.Institutions[i]
		row := []cell{{text: in.Name}, {text: in.Country}}
		for k, ind := range inds {
			cl := cell{text: "–"}
			if v := val(k, i); !math.IsNaN(v) {
				cl.text = tableValue(ind, v)
			}
			row = append(row, cl)
		}
		g.rows = append(g.rows, row)
		g.focus = append(g.focus, i == w.m.Focus)
	}
	med := []cell{{text: "Median, " + gr.Name, bold: true}, {text: ""}}
	for _, ind := range inds {
		cl := cell{text: "–", bold: true}
		if d, ok := w.m.Distribution(gr.Name, ind.Key, year); ok && d.N > 0 {
			cl.text = tableValue(ind, d.Median)
		}
		med = append(med, cl)
	}
	g.rows = append(g.rows, med)
	g.focus = append(g.focus, false)
	note := "Size is context, not performance: larger is neither better nor worse. The median is over the group's members reporting each figure"
	if !gr.FocusIn {
		note += "; " + focusName(w.m) + " is not a member and is not counted in it"
	}
	g.notes = append(g.notes, note+".")
	if cut != "" {
		g.notes = append(g.notes, cut+"; the median is over all the group's members.")
	}
	w.setTable(g)
}

// definitionsTable defines every group the block names.
func (w *writer) definitionsTable(tb *brief.TableBlock, groups []*figures.Group) {
	if len(tb.Groups) == 0 {
		groups = w.m.Groups
	}
	d := w.m.Data
	ranked := d.Register.Len()
	if d.Population != nil {
		ranked = 0
		for _, ok := range d.Population.Included {
			if ok {
				ranked++
			}
		}
	}
	g := grid{head: []string{"Group", "Who is in it", "Members", "Includes " + focusShortName(w.m)}, align: []byte{'L', 'L', 'R', 'L'}, caption: tb.Caption, maxLines: 9}
	if g.caption == "" {
		g.caption = "The groups this pack compares with"
	}
	rule := "every institution in the data"
	if d.Population != nil && len(d.Population.Rules) > 0 {
		rule = "institutions meeting the population rule"
		if len(d.Population.Rules) > 1 {
			rule += "s"
		}
	}
	g.rows = append(g.rows, []cell{{text: "Ranked population", bold: true}, {text: rule}, {text: format.Int(ranked)}, {text: ""}})
	for _, gr := range groups {
		member := "no"
		if gr.FocusIn {
			member = "yes"
		}
		def := gr.Defined
		if gr.Over == "all" {
			def += " (from all institutions, not only the ranked population)"
		}
		g.rows = append(g.rows, []cell{{text: gr.Name}, {text: def}, {text: format.Int(len(gr.Members))}, {text: member}})
	}
	if d.Population != nil {
		for _, r := range d.Population.Rules {
			g.notes = append(g.notes, "Population rule: "+format.Capitalise(r)+".")
		}
	}
	w.setTable(g)
}

// focusShortName is the register's short_name of the focus when it has
// one, else its name, for a column header.
func focusShortName(m *figures.Model) string {
	name := focusName(m)
	if name == "" {
		return name
	}
	if s, ok := m.Data.Register.Institutions[m.Focus].Attr("short_name"); ok && strings.TrimSpace(s) != "" {
		return strings.TrimSpace(s)
	}
	return name
}
