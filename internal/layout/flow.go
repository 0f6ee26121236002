package layout

import (
	"image/color"
	"math"
	"strings"
	"unicode/utf8"

	"peerpack/internal/pdf"
)

// span is a run of text in one face.
type span struct {
	text   string
	font   pdf.Font
	color  color.RGBA
	link   string // external address, "" for none
	strike bool
	raise  float64 // baseline shift up in mm (footnote references)
	brk    bool    // a hard line break, no text
}

// token is one word of a span, with the space that follows it.
type token struct {
	text  string
	sp    int // index of its span
	width float64
	space float64 // width of the following space, 0 when none
	brk   bool    // forces a new line
}

// line is one set line of a paragraph.
type line struct {
	toks  []token
	width float64
}

// tokenize splits spans into words, measuring each in its face.
func (w *writer) tokenize(spans []span) []token {
	var out []token
	for i, s := range spans {
		if s.brk {
			out = append(out, token{sp: i, brk: true})
			continue
		}
		w.doc.SetFont(s.font)
		spaceW := w.doc.StringWidth(" ")
		txt := s.text
		for len(txt) > 0 {
			if txt[0] == ' ' {
				if len(out) > 0 {
					out[len(out)-1].space = spaceW
				}
				txt = strings.TrimLeft(txt, " ")
				continue
			}
			k := strings.IndexByte(txt, ' ')
			word := txt
			if k >= 0 {
				word = txt[:k]
			}
			out = append(out, token{text: word, sp: i, width: w.doc.StringWidth(word)})
			txt = txt[len(word):]
		}
	}
	return out
}

// wrap sets tokens into lines no wider than width; the first line may be
// narrower (firstWidth) for run-in markers. A word longer than a line is
// broken between characters.
func (w *writer) wrap(spans []span, toks []token, width, firstWidth float64) []line {
	var lines []line
	cur := line{}
	limit := firstWidth
	for i := 0; i < len(toks); i++ {
		t := toks[i]
		if t.brk {
			lines = append(lines, cur)
			cur, limit = line{}, width
			continue
		}
		gap := 0.0
		if len(cur.toks) > 0 {
			gap = cur.toks[len(cur.toks)-1].space
		}
		if len(cur.toks) > 0 && cur.width+gap+t.width > limit {
			lines = append(lines, cur)
			cur, limit = line{}, width
			gap = 0
		}
		if len(cur.toks) == 0 && t.width > limit {
			// Break an over-long word (a URL, a long identifier).
			head, tail := w.splitWord(spans[t.sp].font, t.text, limit)
			if head == "" {
				head, tail = t.text, ""
			}
			w.doc.SetFont(spans[t.sp].font)
			ht := token{text: head, sp: t.sp, width: w.doc.StringWidth(head)}
			if tail == "" {
				ht.space = t.space
				cur.toks = append(cur.toks, ht)
				cur.width = ht.width
				continue
			}
			lines = append(lines, line{toks: []token{ht}, width: ht.width})
			limit = width
			rest := token{text: tail, sp: t.sp, width: w.doc.StringWidth(tail), space: t.space}
			toks = append(toks[:i+1], append([]token{rest}, toks[i+1:]...)...)
			continue
		}
		cur.toks = append(cur.toks, t)
		cur.width += gap + t.width
	}
	if len(cur.toks) > 0 {
		lines = append(lines, cur)
	}
	return lines
}

func (w *writer) splitWord(f pdf.Font, s string, width float64) (string, string) {
	w.doc.SetFont(f)
	cut := 0
	for i := range s {
		if i > 0 && w.doc.StringWidth(s[:i]) > width {
			break
		}
		cut = i
	}
	if cut == 0 {
		_, n := utf8.DecodeRuneInString(s)
		cut = n
	}
	return s[:cut], s[cut:]
}

// drawLine draws a set line with its baseline at y, starting at x.
func (w *writer) drawLine(spans []span, ln line, x, y float64) {
	if w.measuring {
		return
	}
	pos := x
	for i, t := range ln.toks {
		s := spans[t.sp]
		w.doc.SetFont(s.font)
		w.doc.SetTextColor(s.color)
		w.doc.Text(pos, y-s.raise, t.text)
		adv := t.width
		if i < len(ln.toks)-1 {
			adv += t.space
		}
		if s.link != "" {
			h := pdf.PtToMM(s.font.Size)
			w.doc.LinkURL(pos, y-h*0.8, adv, h, s.link)
			// Underline the space too when the link goes on.
			ul := t.width
			if i < len(ln.toks)-1 && spans[ln.toks[i+1].sp].link == s.link {
				ul = adv
			}
			w.doc.Line(pos, y+0.6, pos+ul, y+0.6, 0.15, s.color)
		}
		if s.strike {
			h := pdf.PtToMM(s.font.Size)
			w.doc.Line(pos, y-h*0.28, pos+t.width, y-h*0.28, 0.2, s.color)
		}
		pos += adv
	}
	w.doc.SetTextColor(w.st.text)
}

// para lays out spans as a paragraph in the current frame, indented by
// indent, with marker (a list bullet or number) hung to the left of the
// first line. Lines flow over frames and pages; the first two lines are
// kept together so that no single line is stranded at a page foot.
func (w *writer) para(spans []span, indent float64, marker *span, size float64, after float64) {
	if len(spans) == 0 && marker == nil {
		return
	}
	if w.cols > 1 && !w.flushing {
		// Text in columns is held until the band ends, then set balanced.
		w.colBuf = append(w.colBuf, colItem{spans: append([]span(nil), spans...), indent: indent, marker: marker, size: size, after: after, quotes: append([]float64(nil), w.quotes...)})
		return
	}
	lh := w.st.lineHeight(size)
	toks := w.tokenize(spans)
	width := w.width - indent
	lines := w.wrap(spans, toks, width, width)
	if len(lines) == 0 {
		lines = []line{{}}
	}
	// A paragraph of up to three lines is kept whole; a longer one keeps
	// its first two lines together (no orphan) and its last two (no
	// widow).
	if len(lines) <= 3 {
		w.ensure(float64(len(lines)) * lh)
	} else {
		w.ensure(2 * lh)
	}
	for i, ln := range lines {
		if i == len(lines)-2 && i >= 2 {
			w.ensure(2 * lh)
		} else {
			w.ensure(lh)
		}
		base := w.y + pdf.PtToMM(size)*0.8
		if i == 0 && marker != nil && !w.measuring {
			w.doc.SetFont(marker.font)
			w.doc.SetTextColor(marker.color)
			w.doc.TextRight(w.x+indent-1.6, base, marker.text)
		}
		w.drawLine(spans, ln, w.x+indent, base)
		w.drawBars(w.y, lh)
		w.y += lh
	}
	w.y += after
}

// colItem is a paragraph held for balanced columns.
type colItem struct {
	spans  []span
	indent float64
	marker *span
	size   float64
	after  float64
	quotes []float64
}

// flushColumns sets the held paragraphs of a multi-column band. When they
// fit in the columns left on the page, every column but the last stops at
// a balance line, the total height shared out evenly, so that the band
// ends level rather than leaving its last column empty.
func (w *writer) flushColumns() {
	if len(w.colBuf) == 0 || w.flushing {
		return
	}
	items := w.colBuf
	w.colBuf = nil
	w.flushing = true
	defer func() { w.flushing = false; w.colLimit = 0 }()
	width := w.width
	total := 0.0
	for _, it := range items {
		lines := w.wrap(it.spans, w.tokenize(it.spans), width-it.indent, width-it.indent)
		total += float64(len(lines))*w.st.lineHeight(it.size) + it.after
	}
	left := float64(w.cols-w.col)*(w.doc.ContentBottom()-w.colTop) - (w.y - w.colTop)
	if total <= left {
		per := (total + (w.y - w.colTop)) / float64(w.cols-w.col)
		lh := w.st.lineHeight(w.st.size)
		w.colLimit = w.colTop + math.Ceil(per/lh)*lh + lh*0.5
	}
	saved := w.quotes
	for _, it := range items {
		w.quotes = it.quotes
		w.para(it.spans, it.indent, it.marker, it.size, it.after)
	}
	w.quotes = saved
	w.colMax = math.Max(w.colMax, w.y)
}
