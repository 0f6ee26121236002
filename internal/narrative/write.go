package narrative

import "peerpack/internal/dataset"

// write lays out a scope's sentences in its style.
func (c *composer) write(sc *scope) []Paragraph {
	c.part = sc.part
	switch sc.style {
	case "summary":
		return c.writeSummary(sc)
	case "bullets":
		return c.writeBullets(sc)
	}
	return c.writeDetail(sc)
}

// writeSummary: the overall position, strengths and risks, the gaps that
// would close the risks, the headline movement, then the caveats that
// matter most. The executive summary keeps to the short caveats of its own
// figures; the standing cautions are the closing section's.
func (c *composer) writeSummary(sc *scope) []Paragraph {
	var main []Sentence
	var ov *OverviewFact
	if sc.has("position") {
		var s []Sentence
		s, ov = c.overview(sc)
		main = append(main, s...)
	}
	if sc.has("strengths") {
		main = append(main, c.strengthsAndRisks(sc, ov)...)
	}
	// The gaps follow the risks they close; the group is named by then
	// whenever a sentence came before.
	if sc.has("gaps") {
		main = append(main, c.riskGaps(sc, len(main) > 0)...)
	}
	if sc.has("change") {
		main = append(main, c.headline(sc, len(main) > 0)...)
	}
	if sc.has("position") {
		// Every other comparison group of the scope, after the
		// reference group's sentences so "the group" there stays clear.
		main = append(main, c.otherOverviews(sc)...)
	}
	var out []Paragraph
	if len(main) > 0 {
		// No run-in heading: the section it opens already names it.
		out = append(out, Paragraph{Sentences: main})
	}
	if sc.has("systems") {
		out = append(out, c.systemsParagraphs(sc)...)
	}
	// A summary asked for a profile or an association writes it too,
	// under its own heading, as the other styles do.
	for _, topic := range []string{"profile", "association"} {
		if !sc.has(topic) {
			continue
		}
		s := c.profile(sc)
		if topic == "association" {
			s = c.association(sc)
		}
		if len(s) > 0 {
			out = append(out, Paragraph{Heading: c.w.Heading(topic), Sentences: s})
		}
	}
	if sc.has("competition") {
		comp, sh := c.sharedLeads(sc)
		for _, g := range sc.systems {
			// The overview has just placed the focus in its own system.
			comp = append(comp, c.competition(sc, g, sc.has("position") && g == sc.ref, sh)...)
		}
		if len(comp) > 0 {
			out = append(out, Paragraph{Heading: c.w.Heading("competition"), Sentences: comp})
		}
	}
	if sc.has("caveats") {
		cav := c.condensedCaveats(sc)
		if sc.executive {
			// The standing cautions (coverage, value judgements,
			// uncertainty, what is not measured) are the closing
			// section's, set once; the summary keeps only what is
			// particular to its own figures, briefly.
			cav = c.briefCaveats(sc)
		}
		if len(cav) > 0 {
			out = append(out, Paragraph{Heading: c.w.Heading("caveats"), Sentences: cav})
		}
	}
	return out
}

// overviewAndStrengths: the quarters overview, then the strengths and
// risks it has not named.
func (c *composer) overviewAndStrengths(sc *scope) []Sentence {
	s, ov := c.overview(sc)
	return append(s, c.strengthsAndRisks(sc, ov)...)
}

// writeDetail: one paragraph per indicator (positions in every group, the
// change, the gap, the indicator's caveats), then the competitor systems
// and the group caveats.
func (c *composer) writeDetail(sc *scope) []Paragraph {
	var out []Paragraph
	if sc.has("strengths") {
		if s := c.overviewAndStrengths(sc); len(s) > 0 {
			out = append(out, Paragraph{Heading: c.w.Heading("strengths"), Sentences: s})
		}
	}
	// One first or last place shared by several indicators is said once,
	// before the indicators' paragraphs.
	if s := c.sharedRanks(sc); len(s) > 0 {
		out = append(out, Paragraph{Heading: c.w.Heading("ranks"), Sentences: s})
	}
	for _, ind := range sc.inds {
		if s := c.indicatorSentences(sc, ind); len(s) > 0 {
			out = append(out, Paragraph{Heading: headingOf(ind), Sentences: s})
		}
	}
	if sc.has("profile") {
		if s := c.profile(sc); len(s) > 0 {
			out = append(out, Paragraph{Heading: c.w.Heading("profile"), Sentences: s})
		}
	}
	if sc.has("association") {
		if s := c.association(sc); len(s) > 0 {
			out = append(out, Paragraph{Heading: c.w.Heading("association"), Sentences: s})
		}
	}
	if sc.has("systems") {
		out = append(out, c.systemsParagraphs(sc)...)
	}
	if sc.has("competition") && len(sc.systems) > 0 {
		comp, sh := c.sharedLeads(sc)
		for _, g := range sc.systems {
			comp = append(comp, c.competition(sc, g, false, sh)...)
		}
		if len(comp) > 0 {
			out = append(out, Paragraph{Heading: c.w.Heading("competition"), Sentences: comp})
		}
	}
	out = append(out, c.councilTopics(sc)...)
	if sc.has("caveats") {
		if cav := c.groupCaveats(sc); len(cav) > 0 {
			out = append(out, Paragraph{Heading: c.w.Heading("caveats"), Sentences: cav})
		}
	}
	return out
}

// indicatorSentences: everything the detail style says about one
// indicator.
func (c *composer) indicatorSentences(sc *scope, ind dataset.Indicator) []Sentence {
	var s []Sentence
	if c.allMissing(sc, ind) {
		if sc.has("position") {
			s = append(s, c.allMissingSentence(sc, ind))
		}
		return s
	}
	if sc.has("position") {
		for _, g := range sc.groups {
			s = append(s, c.position(g, ind, sc.year)...)
		}
	}
	if sc.has("change") && sc.ref != nil {
		s = append(s, c.change(sc, sc.ref, ind)...)
	}
	if sc.has("gaps") && sc.ref != nil {
		s = append(s, c.gap(sc.ref, ind, sc.year)...)
	}
	if sc.has("caveats") {
		s = append(s, c.indicatorCaveats(sc, ind)...)
	}
	return s
}

// writeBullets: one bullet per indicator with its position in the
// reference group, its movement and its gap; one per competitor system;
// one per caveat.
func (c *composer) writeBullets(sc *scope) []Paragraph {
	var out []Paragraph
	if sc.has("strengths") {
		for _, s := range c.overviewAndStrengths(sc) {
			out = append(out, Paragraph{Bullet: true, Sentences: []Sentence{s}})
		}
	}
	for _, ind := range sc.inds {
		var s []Sentence
		switch {
		case c.allMissing(sc, ind):
			if sc.has("position") {
				s = append(s, c.allMissingSentence(sc, ind))
			}
		case sc.ref != nil:
			if sc.has("position") {
				if p := c.position(sc.ref, ind, sc.year); len(p) > 0 {
					s = append(s, p[0])
				}
			}
			if sc.has("change") {
				if ch := c.change(sc, sc.ref, ind); len(ch) > 0 {
					s = append(s, ch[0])
				}
			}
			if sc.has("gaps") {
				s = append(s, c.gap(sc.ref, ind, sc.year)...)
			}
		}
		if len(s) > 0 {
			out = append(out, Paragraph{Bullet: true, Heading: headingOf(ind), Sentences: s})
		}
	}
	if sc.has("profile") {
		for _, s := range c.profile(sc) {
			out = append(out, Paragraph{Bullet: true, Sentences: []Sentence{s}})
		}
	}
	if sc.has("association") {
		for _, s := range c.association(sc) {
			out = append(out, Paragraph{Bullet: true, Sentences: []Sentence{s}})
		}
	}
	if sc.has("competition") {
		lead, sh := c.sharedLeads(sc)
		for _, s := range lead {
			out = append(out, Paragraph{Bullet: true, Sentences: []Sentence{s}})
		}
		for _, g := range sc.systems {
			if s := c.competition(sc, g, false, sh); len(s) > 0 {
				out = append(out, Paragraph{Bullet: true, Sentences: s})
			}
		}
	}
	out = append(out, c.councilTopics(sc)...)
	if sc.has("caveats") {
		for _, s := range c.condensedCaveats(sc) {
			out = append(out, Paragraph{Bullet: true, Sentences: []Sentence{s}})
		}
	}
	return out
}

// headingOf is an indicator's run-in heading: its label as written in the
// dictionary.
func headingOf(ind dataset.Indicator) string {
	if ind.Label != "" {
		return ind.Label
	}
	return ind.Key
}
