package layout

import (
	"strconv"
	"strings"

	"peerpack/internal/pdf"
)

// sources sets the appendix the brief's `sources: true` asks for: every
// sentence of commentary with the keys of the figures it cites, so a
// reader can trace each statement to the figures file.
func (w *writer) sources() {
	if !w.b.Sources || w.com == nil || len(w.com.Sentences) == 0 {
		return
	}
	w.cols = 1
	w.sectionHeading("Sources of the commentary", 1)
	w.plain("Each sentence of the commentary is listed with the keys of the figures it states, as section/group/indicator/institution/year/measure; the same keys are the first columns of the figures file.")
	for i, s := range w.com.Sentences {
		keys := make([]string, len(s.Cites))
		for k, c := range s.Cites {
			keys[k] = c.String()
		}
		sp := []span{
			{text: s.Text, font: w.st.font(pdf.Regular, w.st.size-1), color: w.st.text},
			{brk: true, font: w.st.font(pdf.Regular, w.st.size-1)},
			{text: strings.Join(keys, "  "), font: pdf.Font{Family: pdf.Mono, Size: 7}, color: w.st.muted},
		}
		w.para(sp, 8, &span{text: strconv.Itoa(i+1) + ".", font: w.st.font(pdf.Regular, w.st.size-1), color: w.st.muted}, w.st.size-1, paraGap-0.6)
	}
}
