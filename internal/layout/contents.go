package layout

import (
	"strconv"

	"peerpack/internal/pdf"
)

// Contents geometry, mm: section entries stand apart, subsection entries
// are set closer and indented.
const (
	contentsTitleH = 16
	contentsL1     = 8.0
	contentsL2     = 6.0
)

// contentsEntries are the headings the contents lists: levels 1 and 2.
func contentsEntries(hs []headingRec) []int {
	var out []int
	for i, h := range hs {
		if h.level <= 2 {
			out = append(out, i)
		}
	}
	return out
}

// contentsPageCount is how many pages the contents needs for the entries;
// it depends only on their levels, so both passes agree on it.
func contentsPageCount(hs []headingRec, top, bottom float64) int {
	pages := 1
	y := top + contentsTitleH
	for _, i := range contentsEntries(hs) {
		h := contentsL2
		if hs[i].level == 1 {
			h = contentsL1
		}
		if y+h > bottom {
			pages++
			y = top
		}
		y += h
	}
	return pages
}

// contents sets the contents pages. In the first pass it only reserves
// one page; the second knows every heading's page and how many pages the
// contents itself takes, and links each entry to its heading.
func (w *writer) contents() {
	w.newPage()
	w.bookmarkOnly("Contents", 0)
	if w.known == nil {
		return
	}
	d := w.doc
	d.SetFont(w.st.font(pdf.Bold, headingSize(1)))
	d.SetTextColor(w.st.accent)
	d.Text(w.x, w.y+pdf.PtToMM(headingSize(1))*0.8, "Contents")
	w.y += pdf.PtToMM(headingSize(1)) + 1.2
	d.Line(w.x, w.y, w.x+w.width, w.y, 0.5, w.st.accent)
	w.y = d.ContentTop() + contentsTitleH
	shift := w.known.contentsPages - 1
	for _, i := range contentsEntries(w.known.headings) {
		h := &w.known.headings[i]
		rowH, indent, f := contentsL2, 6.0, w.st.font(pdf.Regular, 9.5)
		if h.level == 1 {
			rowH, indent, f = contentsL1, 0, w.st.font(pdf.Bold, 10.5)
		}
		if w.y+rowH > w.bottom() {
			w.newPage()
		}
		page := strconv.Itoa(h.page + shift)
		base := w.y + rowH - 2
		d.SetFont(f)
		d.SetTextColor(w.st.text)
		pw := d.StringWidth(page)
		right := w.x + w.width
		title := d.Fit(h.title, w.width-indent-pw-12)
		d.Text(w.x+indent, base, title)
		d.TextRight(right, base, page)
		// Dot leaders between title and page number.
		tw := d.StringWidth(title)
		d.SetFont(w.st.font(pdf.Regular, 8))
		d.SetTextColor(w.st.rule)
		dot := d.StringWidth(". ")
		for x := w.x + indent + tw + 2; x+dot < right-pw-1.5; x += dot {
			d.Text(x, base, ".")
		}
		h.link = d.NewLink()
		d.LinkArea(w.x+indent, w.y, w.width-indent, rowH, h.link)
		w.y += rowH
	}
	for d.PageNo() < 1+w.known.contentsPages {
		w.newPage()
	}
	d.SetTextColor(w.st.text)
}

// bookmarkOnly adds an outline entry without a contents entry.
func (w *writer) bookmarkOnly(title string, level int) {
	w.doc.Bookmark(title, level, w.y)
}
