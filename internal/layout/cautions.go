package layout

import (
	"fmt"
	"strings"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
	"peerpack/internal/pdf"
)

// cautions closes every pack with what a careful reader needs before
// using the figures: coverage, the definitions behind the numbers, and
// the limits of comparisons like these. The wording is the pack's own
// fixed text (not commentary on the figures), kept here in one place.
//
// When the brief sets out its own cautions (findOwnCautions), the closing
// refers to that section and adds only the cautions it leaves out, so
// that each standard caution appears exactly once in the pack.
func (w *writer) cautions() {
	w.cols = 1
	w.sectionHeading("About these figures", 1)
	if w.own != nil {
		// The brief's own section carries the cautions: point to it and
		// add, right there, the ones it does not make.
		s := "The cautions that go with these figures are set out in “" + w.own.title + "” above."
		more := len(w.missingCautions()) > 0 || len(w.indicatorJudgements()) > 0
		if more {
			s += " Keep in mind as well:"
		} else if w.hasMethodologyAppendix() {
			s += " This section gives the sources of the data and how to build the pack again."
		} else {
			s += " This section gives the sources of the data, how to build the pack again, the coverage of the data and the definitions behind each figure."
		}
		w.plain(s)
		if more {
			w.cautionBullets()
			w.y += paraGap - listItemGap
		}
	}
	w.provenance()
	if w.hasMethodologyAppendix() {
		// The appendix already gives coverage by group and the
		// definitions; the closing says where rather than repeating them.
		w.plain("The methodology appendix gives the coverage of each group, the sources and definitions of every indicator and how each figure is computed.")
	} else {
		w.coverage()
		w.definitions()
	}
	w.limits()
}

// hasMethodologyAppendix reports whether the brief lays out a methodology
// appendix block.
func (w *writer) hasMethodologyAppendix() bool {
	for _, blk := range w.b.Blocks {
		if a, ok := blk.(*brief.AppendixBlock); ok && a.Type == "methodology" {
			return true
		}
	}
	return false
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
	w.bullet("Changes", fmt.Sprintf("compare the first and last year of %d–%d with a value, in the indicator's own unit; percentage-point changes are used for percentages. Where the number of members reporting changed by more than %s per cent, standing is compared by percentile rank and among the members reporting in both years, not by raw rank.", w.m.First, w.m.Last, format.Number(100*figures.SizeChangeLimit, 0)))
	if s := earlierYearsRule(w.m); s != "" {
		w.bullet("Earlier years", s)
	}
	w.bullet("Rounding", "happens once, when a figure is printed, to the decimals the dictionary declares for the indicator, so tables, charts and text agree.")
	w.y += paraGap - listItemGap
}

// standardCautions are the cautions every comparison of institutions
// needs, in the order the closing states them ("Use with care" last).
var standardCautions = []struct {
	c          caution
	lead, text string
}{
	{cautionMeasured, "Only what is measured.", "The indicators capture part of what a university does. Teaching quality, the student experience, contribution to the region and culture, and much research that is not published in indexed journals are not measured here."},
	{cautionJudgement, "Choices are judgements.", "Which indicators appear, how groups of peers are drawn and any weights in a composite score are value judgements. A different, equally reasonable choice can change positions."},
	{cautionUncertainty, "Uncertainty.", "Small differences between institutions lie within the noise of the data: neighbouring ranks can swap from one year to the next. Quarters and percentile ranks are more stable than exact ranks, and groups with few members give unstable quartiles."},
	{cautionCoverage, "Coverage.", "Institutions without data are left out of the distributions, which can flatter or penalise a group. Check the coverage table above."},
	{cautionDecisions, "Use with care.", "These figures are a starting point for questions, not a verdict. They should not be the sole basis for decisions about individuals, funding or staffing."},
}

// missingCautions are the standard cautions the brief's own section does
// not make (all of them when it has none).
func (w *writer) missingCautions() []int {
	var out []int
	for i, sc := range standardCautions {
		if !w.own.states(sc.c) {
			out = append(out, i)
		}
	}
	return out
}

// indicatorJudgements are the dictionary's judgement notes that the
// brief's own cautions do not already discuss (it names the indicator).
func (w *writer) indicatorJudgements() []dataset.Indicator {
	var out []dataset.Indicator
	for _, ind := range w.m.Data.Dictionary.Indicators {
		if ind.Judgement == "" || w.own.says(ind.Label) || ind.Short != ind.Label && w.own.says(ind.Short) {
			continue
		}
		out = append(out, ind)
	}
	return out
}

// limits closes a pack whose brief has no cautions section of its own
// with all the standard cautions.
func (w *writer) limits() {
	if w.own != nil {
		return
	}
	w.sectionHeading("What the figures do not show", 2)
	w.cautionBullets()
}

// cautionBullets sets the cautions the pack has not yet stated: all of
// them, or, after the brief's own cautions section, only those it leaves
// out; "Use with care" always last.
func (w *writer) cautionBullets() {
	last := -1
	for _, i := range w.missingCautions() {
		if standardCautions[i].c == cautionDecisions {
			last = i
			continue
		}
		w.bullet(standardCautions[i].lead, standardCautions[i].text)
	}
	for _, ind := range w.indicatorJudgements() {
		w.bullet(indicatorLabel(ind, false)+".", ind.Judgement)
	}
	if last >= 0 {
		w.bullet(standardCautions[last].lead, standardCautions[last].text)
	}
}
