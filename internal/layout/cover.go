package layout

import (
	"fmt"
	"math"
	"strings"

	"peerpack/internal/pdf"
)

// cover sets the title page: a band in the house colour with the
// organisation, title and subtitle; below it the focus institution, the
// audience, the years and the date; the logo at the band's right; and a
// short caution at the foot pointing to the notes on the figures.
func (w *writer) cover() {
	d := w.doc
	d.AddPlainPage()
	if w.measuring {
		return
	}
	pw := d.Paper().Width
	m := d.Margins()
	left := m.Left
	textW := pw - m.Left - m.Right

	// Title and subtitle, measured first so the band fits them. A long
	// title steps down in size until it takes at most coverTitleLines
	// lines (the subtitle likewise), so the focus, the years and the date
	// keep their place on the page; one still longer at the smallest size
	// is refused with what to change.
	titleSize, tl := 0.0, []line(nil)
	var tsp []span
	for _, sz := range coverTitleSizes {
		titleSize = sz
		tsp = []span{{text: w.b.Title, font: w.st.font(pdf.Bold, sz), color: white}}
		if tl = w.wrap(tsp, w.tokenize(tsp), textW, textW); len(tl) <= coverTitleLines {
			break
		}
	}
	subSize, sl := 0.0, []line(nil)
	var ssp []span
	for _, sz := range coverSubtitleSizes {
		subSize = sz
		ssp = []span{{text: w.b.Subtitle, font: w.st.font(pdf.Regular, sz), color: mix(w.st.accent, white, 0.8)}}
		if w.b.Subtitle == "" {
			break
		}
		if sl = w.wrap(ssp, w.tokenize(ssp), textW, textW); len(sl) <= coverSubtitleLines {
			break
		}
	}
	if len(tl) > coverTitleLines {
		w.failAt(w.b.PosOf("title"), "the title takes %d lines on the cover even at %g pt, more than the %d that leave room for the focus, years and date; shorten it (about %d words fit) and move the rest into the subtitle", len(tl), titleSize, coverTitleLines, wordsThatFit(w.b.Title, len(tl), coverTitleLines))
		tl = tl[:coverTitleLines]
	}
	if len(sl) > coverSubtitleLines {
		w.failAt(w.b.PosOf("subtitle"), "the subtitle takes %d lines on the cover even at %g pt, more than the %d it has room for; shorten it (about %d words fit) and say the rest in the pack's opening section", len(sl), subSize, coverSubtitleLines, wordsThatFit(w.b.Subtitle, len(sl), coverSubtitleLines))
		sl = sl[:coverSubtitleLines]
	}
	titleLH := pdf.PtToMM(titleSize * 1.15)
	subLH := pdf.PtToMM(subSize * 1.3)
	bandTop := 0.0
	titleTop := 62.0
	bandH := titleTop + float64(len(tl))*titleLH + float64(len(sl))*subLH + 14
	d.FillRect(0, bandTop, pw, bandH, w.st.accent)

	// The logo first: the organisation's name wraps short of it rather
	// than running underneath.
	orgRight := left + textW
	if w.b.Theme.Logo != "" {
		if lx := w.coverLogo(pw-m.Right, 14); lx > 0 {
			orgRight = lx - 6
		}
	}
	if o := w.b.Theme.Organisation; o != "" {
		osp := []span{{text: strings.ToUpper(o), font: w.st.font(pdf.Bold, 10), color: white}}
		lines := w.wrap(osp, w.tokenize(osp), orgRight-left, orgRight-left)
		if len(lines) > 3 {
			lines = lines[:3]
		}
		oy := 26.0
		for _, ln := range lines {
			w.drawLine(osp, ln, left, oy)
			oy += pdf.PtToMM(10 * 1.3)
		}
	}
	y := titleTop
	for _, ln := range tl {
		w.drawLine(tsp, ln, left, y+pdf.PtToMM(titleSize)*0.8)
		y += titleLH
	}
	y += 2
	for _, ln := range sl {
		w.drawLine(ssp, ln, left, y+pdf.PtToMM(subSize)*0.8)
		y += subLH
	}

	// Facts below the band.
	y = bandH + 20
	fact := func(label, value string, size float64) {
		if value == "" {
			return
		}
		d.SetFont(w.st.font(pdf.Regular, 8.5))
		d.SetTextColor(w.st.muted)
		d.Text(left, y, strings.ToUpper(label))
		y += 6.2
		vsp := []span{{text: value, font: w.st.font(pdf.Bold, size), color: w.st.text}}
		for _, ln := range w.wrap(vsp, w.tokenize(vsp), textW, textW) {
			w.drawLine(vsp, ln, left, y)
			y += pdf.PtToMM(size * 1.3)
		}
		y += 6
	}
	fact("Focus institution", focusName(w.m), 16)
	fact("Prepared for", w.b.Audience, 12)
	years := fmt.Sprintf("Positions in %d", w.m.Year)
	if w.m.First != 0 && w.m.Last != 0 && w.m.First != w.m.Last {
		years += fmt.Sprintf("; trends %d–%d", w.m.First, w.m.Last)
	}
	fact("Figures", years, 12)
	fact("Prepared by", w.b.Author, 12)
	fact("Date", w.dateLine(), 12)

	// The caution at the foot.
	notes := "the notes in “About these figures” at the end of this pack"
	if w.own != nil && w.own.title != "About these figures" {
		notes = "“" + w.own.title + "” and the notes in “About these figures” at the end of this pack"
	}
	msg := "Rankings and comparisons simplify. The figures cover only what the indicators measure, the choice of indicators and groups is a judgement, and small differences lie within the uncertainty of the data. Read them with " + notes + " before using them in decisions about people or money."
	csp := []span{{text: msg, font: w.st.font(pdf.Italic, 8.5), color: w.st.muted}}
	lines := w.wrap(csp, w.tokenize(csp), textW-8, textW-8)
	lh := w.st.lineHeight(8.5)
	h := float64(len(lines))*lh + 5
	top := d.Paper().Height - m.Bottom - h
	d.FillRect(left, top, textW, h, w.st.tint)
	d.Line(left, top, left, top+h, 0.8, w.st.accent)
	yy := top + 2.5
	for _, ln := range lines {
		w.drawLine(csp, ln, left+4, yy+pdf.PtToMM(8.5)*0.8)
		yy += lh
	}
	d.SetTextColor(w.st.text)
}

// The cover's title and subtitle sizes, largest first, and the most lines
// each may take (common practice, no source: a title page reads at a
// glance, and the facts below the band need the lower half of the page).
var (
	coverTitleSizes    = []float64{26, 22, 19, 16}
	coverSubtitleSizes = []float64{14, 12.5, 11}
)

const (
	coverTitleLines    = 4
	coverSubtitleLines = 3
)

// wordsThatFit estimates how many of s's words fit in want lines when
// they took got: a hint for the message, not a measure.
func wordsThatFit(s string, got, want int) int {
	n := len(strings.Fields(s))
	if got <= 0 {
		return n
	}
	return max(1, n*want/got)
}

// dateLine is the brief's date, else the build date written out in full
// ("2 March 2025"; "March 2, 2025" in en-US).
func (w *writer) dateLine() string {
	if w.b.Date != "" {
		return w.b.Date
	}
	t := w.in.Created
	if t.IsZero() {
		return ""
	}
	t = t.UTC()
	if w.b.Language == "en-US" {
		return t.Format("January 2, 2006")
	}
	return t.Format("2 January 2006")
}

// coverLogo places the logo in a white panel at the band's top right,
// right edge at right, and returns the panel's left edge (0 when the logo
// could not be read).
func (w *writer) coverLogo(right, top float64) float64 {
	info, err := w.loadImage(w.b.Theme.Logo)
	if err != nil {
		p := w.b.PosOf("theme.logo")
		w.failAt(p, "logo: %v", err)
		return 0
	}
	natW, natH := naturalSize(info)
	iw, ih := fitBox(float64(info.Width), float64(info.Height), math.Min(44, natW), math.Min(20, natH))
	pad := 3.0
	x := right - iw - 2*pad
	w.doc.FillRect(x, top, iw+2*pad, ih+2*pad, white)
	w.doc.DrawImage(info, x+pad, top+pad, iw, ih)
	return x
}
