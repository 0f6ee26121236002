package layout

import (
	"fmt"
	"strings"

	"peerpack/internal/dataset"
	"peerpack/internal/format"
	"peerpack/internal/pdf"
)

// cautions closes every pack with what a careful reader needs before
// using the figures: coverage, the definitions behind the numbers, and
// the limits of comparisons like these. The wording is the pack's own
// fixed text (not commentary on the figures), kept here in one place.
func (w *writer) cautions() {
	w.cols = 1
	w.sectionHeading("About these figures", 1)
	w.coverage()
	w.definitions()
	w.limits()
}

func (w *writer) plain(text string) {
	w.para([]span{{text: text, font: w.st.font(pdf.Regular, w.st.size), color: w.st.text}}, 0, nil, w.st.size, paraGap)
}

func (w *writer) bullet(lead, text string) {
	var sp []span
	if lead != "" {
		sp = append(sp, span{text: lead + " ", font: w.st.font(pdf.Bold, w.st.size), color: w.st.text})
	}
	sp = append(sp, span{text: text, font: w.st.font(pdf.Regular, w.st.size), color: w.st.text})
	w.para(sp, 6, &span{text: "•", font: w.st.font(pdf.Regular, w.st.size), color: w.st.accent}, w.st.size, listItemGap+0.6)
}

// coverage states how many institutions count and how complete each
// indicator is in the first comparison group.
func (w *writer) coverage() {
	w.sectionHeading("Coverage", 2)
	d := w.m.Data
	n := d.Register.Len()
	ranked := n
	if d.Population != nil {
		ranked = 0
		for _, ok := range d.Population.Included {
			if ok {
				ranked++
			}
		}
	}
	s := fmt.Sprintf("The register holds %s institutions, of which %s form the ranked population", format.Int(n), format.Int(ranked))
	if d.Population != nil && len(d.Population.Rules) > 0 {
		s += " under these rules: " + strings.Join(d.Population.Rules, "; ")
	}
	s += fmt.Sprintf(". Positions are for %d", w.m.Year)
	if w.m.First != w.m.Last {
		s += fmt.Sprintf(" and trends run from %d to %d", w.m.First, w.m.Last)
	}
	s += ". An institution without a value for an indicator is left out of that indicator's distribution and ranks, not counted as zero."
	w.plain(s)
	if len(w.m.Groups) == 0 {
		return
	}
	gr := w.m.Groups[0]
	g := grid{
		head:    []string{"Indicator", "Unit", "Better", "Source", fmt.Sprintf("With a value in %s", gr.Name), "Missing"},
		align:   []byte{'L', 'L', 'L', 'L', 'R', 'R'},
		caption: fmt.Sprintf("Indicators and their coverage in %s, %d", gr.Name, w.m.Year),
	}
	for _, ind := range d.Dictionary.Indicators {
		src := orDash(ind.Source)
		if ind.Derive != "" && strings.TrimSpace(ind.Source) == "" {
			src = "derived: " + ind.Derive
		}
		row := []cell{{text: indicatorLabel(ind, false)}, {text: string(ind.Unit)}, {text: betterWords(ind.Better)}, {text: src}}
		if dist, ok := w.m.Distribution(gr.Name, ind.Key, w.m.Year); ok {
			row = append(row, cell{text: format.Int(dist.N)}, cell{text: format.Int(dist.Missing)})
		} else {
			row = append(row, cell{text: "–"}, cell{text: "–"})
		}
		g.rows = append(g.rows, row)
	}
	if d.PPP != nil && len(d.PPP.Converted) > 0 {
		g.notes = append(g.notes, "Money amounts ("+strings.Join(d.PPP.Converted, ", ")+") are converted from local currency to international dollars at purchasing-power parity (PPP$) for each country and year.")
	}
	w.setTable(g)
}

func betterWords(p dataset.Polarity) string {
	switch p {
	case dataset.HigherIsBetter:
		return "higher"
	case dataset.LowerIsBetter:
		return "lower"
	}
	return "neutral"
}

func orDash(s string) string {
	if strings.TrimSpace(s) == "" {
		return "–"
	}
	return s
}

// definitions states how each kind of figure is computed, citing the
// method.
func (w *writer) definitions() {
	w.sectionHeading("How the figures are computed", 2)
	q := map[string]string{
		"type7":  "Quartiles and medians follow Hyndman and Fan (1996), definition 7, which interpolates between neighbouring values.",
		"type6":  "Quartiles and medians follow Hyndman and Fan (1996), definition 6.",
		"hinges": "Quartiles are Tukey's (1977) hinges, the medians of the lower and upper halves of the values.",
	}[w.m.Method.String()]
	w.bullet("Ranks", "run in each indicator's better direction, 1 being best; institutions with equal values share the better rank.")
	w.bullet("Percentile ranks", "are 100 × (institutions behind + half of those tied) / n: the share of the group an institution is ahead of.")
	w.bullet("Quarters", "divide a group by its quartiles: the top quarter holds the best 25 per cent of values in the better direction. "+q)
	w.bullet("Box plots", "show the median, the quartiles and whiskers reaching the furthest values within 1.5 times the interquartile range (Tukey 1977); values beyond are drawn as outliers.")
	w.bullet("Changes", fmt.Sprintf("compare the first and last year of %d–%d with a value, in the indicator's own unit; percentage-point changes are used for percentages.", w.m.First, w.m.Last))
	w.bullet("Rounding", "happens once, when a figure is printed, to the decimals the dictionary declares for the indicator, so tables, charts and text agree.")
	w.y += paraGap - listItemGap
}

// limits sets the cautions every comparison of institutions needs.
func (w *writer) limits() {
	w.sectionHeading("What the figures do not show", 2)
	w.bullet("Only what is measured.", "The indicators capture part of what a university does. Teaching quality, the student experience, contribution to the region and culture, and much research that is not published in indexed journals are not measured here.")
	w.bullet("Choices are judgements.", "Which indicators appear, how groups of peers are drawn and any weights in a composite score are value judgements. A different, equally reasonable choice can change positions.")
	w.bullet("Uncertainty.", "Small differences between institutions lie within the noise of the data: neighbouring ranks can swap from one year to the next. Quarters and percentile ranks are more stable than exact ranks, and groups with few members give unstable quartiles.")
	w.bullet("Coverage.", "Institutions without data are left out of the distributions, which can flatter or penalise a group. Check the coverage table above.")
	for _, ind := range w.m.Data.Dictionary.Indicators {
		if ind.Judgement != "" {
			w.bullet(indicatorLabel(ind, false)+".", ind.Judgement)
		}
	}
	w.bullet("Use with care.", "These figures are a starting point for questions, not a verdict. They should not be the sole basis for decisions about individuals, funding or staffing.")
}
