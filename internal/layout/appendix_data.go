package layout

import (
	"fmt"
	"math"
	"strings"

	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
	"peerpack/internal/pdf"
)

// dataAppendix tabulates every indicator in scope for the focus and the
// brief's named institutions in each year of the span, with the median of
// each group in scope, so that a reader can check any figure of the pack
// against the values behind it. Values are those the figures were
// computed from (after PPP conversion and derivation), printed with the
// indicator's decimals by package format.
func (w *writer) dataAppendix(sc appendixScope) {
	d := w.m.Data
	insts := []int{w.m.Focus}
	for _, id := range w.b.Named {
		if i := d.Register.Index(id); i >= 0 && i != w.m.Focus {
			insts = append(insts, i)
		}
	}
	years := w.m.Years
	if len(years) == 0 || len(sc.indicators) == 0 {
		w.noteBox("The data appendix has nothing to show: no indicator or year is in scope.")
		return
	}
	names := make([]string, len(insts))
	for i, in := range insts {
		names[i] = d.Register.Institutions[in].Name
	}
	intro := fmt.Sprintf("Values of %s for %s in each year from %d to %d", plural(len(sc.indicators), "indicator"), joinAnd(names), years[0], years[len(years)-1])
	if len(sc.groups) > 0 {
		intro += ", with the median of the members of each group reporting in that year"
	}
	intro += ". These are the values every figure of the pack is computed from, money already in international dollars where converted; – marks a missing value."
	w.plain(intro)

	// One small table per indicator, its name heading the first column
	// over the years: setTable keeps a table's head with its first rows,
	// so no indicator is parted from its values at a page break.
	var notes []string
	tables := make([]grid, len(sc.indicators))
	for i, ind := range sc.indicators {
		tables[i] = w.dataTable(ind, insts, sc.groups, &notes)
	}
	w.alignFigures(tables)
	for i, g := range tables {
		if i == len(tables)-1 {
			for k, n := range notes {
				g.notes = append(g.notes, strings.TrimSpace(noteMark(k+1))+" "+n)
			}
			if hasLower(sc.indicators) {
				g.notes = append(g.notes, "↓ marks indicators on which lower values are better.")
			}
		}
		w.setTable(g)
		if i < len(sc.indicators)-1 {
			// The tables of one appendix read as one: closer together
			// than tables standing alone.
			w.y -= paraGap
		}
	}
}

// dataTable is one indicator's values for the institutions and its group
// medians in every year of the span; notes collects the data file's notes
// on the values shown, numbered in order.
func (w *writer) dataTable(ind dataset.Indicator, insts []int, groups []*figures.Group, notes *[]string) grid {
	d := w.m.Data
	years := w.m.Years
	k := d.Dictionary.Index(ind.Key)
	g := grid{head: []string{unitLabel(ind, false)}, align: []byte{'L'}, noNumber: true}
	for _, y := range years {
		g.head = append(g.head, itoa(y))
		g.align = append(g.align, 'R')
	}
	for _, in := range insts {
		row := []cell{{text: d.Register.Institutions[in].Name}}
		for _, y := range years {
			c := cell{text: "–"}
			if v, ok := d.Value(k, in, y); ok {
				c.text = tableValue(ind, v)
			}
			// The data file's note on a value (or on why it is missing)
			// goes under the tables, numbered.
			if note, has := d.Notes[dataset.CellRef{Indicator: k, Year: y, Institution: in}]; has {
				*notes = append(*notes, fmt.Sprintf("%s, %s, %d: %s", d.Register.Institutions[in].Name, lowerFirst(ind.Label), y, sentence(note)))
				c.text += noteMark(len(*notes))
			}
			row = append(row, c)
		}
		g.rows = append(g.rows, row)
		g.focus = append(g.focus, in == w.m.Focus)
	}
	for _, gr := range groups {
		row := []cell{{text: "Median, " + gr.Name, muted: true}}
		for _, y := range years {
			c := cell{text: "–", muted: true}
			if dist, ok := w.m.Distribution(gr.Name, ind.Key, y); ok && dist.N > 0 {
				c.text = tableValue(ind, dist.Median)
			}
			row = append(row, c)
		}
		g.rows = append(g.rows, row)
		g.focus = append(g.focus, false)
	}
	g.keepLead = len(g.rows)
	return g
}

// alignFigures pads the figure cells of tables set one under another to a
// common width, with no-break spaces before the digits, so that each
// table's year columns come out as wide as every other's and the columns
// line up down the page. setTable sizes figure columns to their widest
// cell; widths scale with the type size, so measuring at any one size
// serves. Digits, commas and full stops are whole multiples of the
// space's width in the Liberation faces, so the columns agree to a
// fraction of a point.
func (w *writer) alignFigures(tables []grid) {
	f := w.st.font(pdf.Bold, tableSizes[0][0])
	pad := w.doc.WidthIn(f, "\u00a0")
	if pad <= 0 {
		return
	}
	widest := 0.0
	for _, g := range tables {
		for _, r := range g.rows {
			for c := 1; c < len(r); c++ {
				widest = math.Max(widest, w.doc.WidthIn(f, r[c].text))
			}
		}
	}
	for _, g := range tables {
		for _, r := range g.rows {
			for c := 1; c < len(r); c++ {
				if n := int(math.Ceil((widest - w.doc.WidthIn(f, r[c].text)) / pad)); n > 0 {
					r[c].text = strings.Repeat("\u00a0", n) + r[c].text
				}
			}
		}
	}
}

// noteMark is the reference to the n-th note of the data appendix.
func noteMark(n int) string { return " [" + itoa(n) + "]" }

// plural prints a count with its noun: "1 indicator", "12 indicators".
func plural(n int, noun string) string {
	return format.Int(n) + " " + format.Plural(n, noun, noun+"s")
}
