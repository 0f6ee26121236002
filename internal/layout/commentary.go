package layout

import (
	"peerpack/internal/brief"
	"peerpack/internal/narrative"
	"peerpack/internal/pdf"
)

// paragraphs sets commentary paragraphs: run-in headings in bold, bullets
// hung in the margin, sentences joined into flowing text.
func (w *writer) paragraphs(ps []narrative.Paragraph) {
	for i, p := range ps {
		var spans []span
		if p.Heading != "" {
			spans = append(spans, span{text: p.Heading + ". ", font: w.st.font(pdf.Bold, w.st.size), color: w.st.text})
		}
		spans = append(spans, span{text: p.Text(), font: w.st.font(pdf.Regular, w.st.size), color: w.st.text})
		indent := w.indent
		var marker *span
		after := paraGap
		if p.Bullet {
			indent += 6
			marker = &span{text: "•", font: w.st.font(pdf.Regular, w.st.size), color: w.st.accent}
			after = listItemGap
			if i+1 == len(ps) || !ps[i+1].Bullet {
				after = paraGap
			}
		}
		w.para(spans, indent, marker, w.st.size, after)
	}
}

// summary sets the executive summary after the contents, when the
// commentary wrote one.
//
// A brief that places the summary itself, with a commentary block of style
// summary, gets no second one.
func (w *writer) summary() {
	if w.com == nil || len(w.com.Summary) == 0 {
		return
	}
	for _, blk := range w.b.Blocks {
		if cb, ok := blk.(*brief.CommentaryBlock); ok && cb.Style == "summary" {
			return
		}
	}
	w.newPage()
	w.sectionHeading("Executive summary", 1)
	w.paragraphs(w.com.Summary)
}
