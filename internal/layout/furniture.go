package layout

import (
	"fmt"
	"path"
	"strings"

	"peerpack/internal/pdf"
)

// header draws the running header: the pack's title at the left, the
// focus institution at the right, a hairline rule below.
func (w *writer) header(d *pdf.Doc, page int) {
	if w.measuring {
		return
	}
	m := d.Margins()
	y := m.Top - 8
	right := d.Paper().Width - m.Right
	d.SetFont(w.st.font(pdf.Regular, 7.5))
	d.SetTextColor(w.st.muted)
	name := focusName(w.m)
	nameW := d.StringWidth(name)
	d.Text(m.Left, y, d.Fit(w.b.Title, d.ContentWidth()-nameW-8))
	d.TextRight(right, y, name)
	d.Line(m.Left, y+1.8, right, y+1.8, 0.25, w.st.accent)
	d.SetTextColor(w.st.text)
}

// footer draws the data-source line at the left and "Page n of N" at the
// right; N is known from the first pass.
func (w *writer) footer(d *pdf.Doc, page int) {
	if w.measuring {
		return
	}
	m := d.Margins()
	y := d.Paper().Height - m.Bottom + 10
	right := d.Paper().Width - m.Right
	d.Line(m.Left, y-4, right, y-4, 0.2, w.st.rule)
	d.SetFont(w.st.font(pdf.Regular, 7.5))
	d.SetTextColor(w.st.muted)
	total := 0
	if w.known != nil {
		total = w.known.pages + w.known.contentsPages - 1
	}
	pg := fmt.Sprintf("Page %d of %d", page, total)
	d.TextRight(right, y, pg)
	room := d.ContentWidth() - d.StringWidth(pg) - 8
	line := w.sourceLine()
	if d.StringWidth(line) > room {
		// Too many sources for one line: point to the coverage table,
		// which lists every indicator's source.
		line = w.shortSourceLine()
	}
	d.Text(m.Left, y, d.Fit(line, room))
	d.SetTextColor(w.st.text)
}

// sourceLine names the organisation and the data's sources: the sources
// the dictionary declares, else the data files.
func (w *writer) sourceLine() string {
	var parts []string
	if o := w.b.Theme.Organisation; o != "" {
		parts = append(parts, o)
	}
	seen := map[string]bool{}
	var srcs []string
	for _, ind := range w.m.Data.Dictionary.Indicators {
		if s := strings.TrimSpace(ind.Source); s != "" && !seen[s] {
			seen[s] = true
			srcs = append(srcs, s)
		}
	}
	if len(srcs) > 0 {
		parts = append(parts, "Sources: "+strings.Join(srcs, "; "))
	} else {
		files := []string{path.Base(w.b.Data.Register)}
		for _, v := range w.b.Data.Values {
			files = append(files, path.Base(v))
		}
		parts = append(parts, "Data: "+strings.Join(files, ", "))
	}
	parts = append(parts, fmt.Sprintf("figures for %d", w.m.Year))
	return strings.Join(parts, " · ")
}

// shortSourceLine names the organisation and where the sources are
// listed.
func (w *writer) shortSourceLine() string {
	var parts []string
	if o := w.b.Theme.Organisation; o != "" {
		parts = append(parts, o)
	}
	where := "Sources: see “About these figures”"
	if w.known != nil {
		for _, h := range w.known.headings {
			if h.title == "Coverage" && h.level == 2 {
				where = fmt.Sprintf("Sources: see the coverage table, page %d", h.page+w.known.contentsPages-1)
			}
		}
	}
	parts = append(parts, where, fmt.Sprintf("figures for %d", w.m.Year))
	return strings.Join(parts, " · ")
}
