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

// writeSummary: the overall position, strengths and risks, the headline
// movement, then the caveats that matter most. The executive summary adds
// the pack's standing cautions.
func (c *composer) writeSummary(sc *scope) []Paragraph {
	var main []Sentence
	if sc.has("position") {
		main = append(main, c.overview(sc)...)
	}
	if sc.has("strengths") {
		main = append(main, c.strengthsAndRisks(sc, sc.has("position"))...)
	}
	if sc.has("change") {
		main = append(main, c.headline(sc)...)
	}
	if sc.has("gaps") {
		main = append(main, c.riskGaps(sc)...)
	}
	var out []Paragraph
	if len(main) > 0 {
		// No run-in heading: the section it opens already names it.
		out = append(out, Paragraph{Sentences: main})
	}
	if sc.has("competition") {
		var comp []Sentence
		for _, g := range sc.systems {
			comp = append(comp, c.competition(sc, g)...)
		}
		if len(comp) > 0 {
			out = append(out, Paragraph{Heading: c.w.Heading("competition"), Sentences: comp})
		}
	}
	if sc.has("caveats") {
		cav := c.condensedCaveats(sc)
		if sc.executive {
			var lower []string
			for _, ind := range sc.inds {
				if ind.Better == dataset.LowerIsBetter {
					lower = append(lower, c.w.Indicator(ind))
				}
			}
			if len(lower) > 0 {
				cav = append(cav, c.say("", c.w.LowerPercentiles(lower)))
			}
			cav = append(cav, c.say("", c.w.Cautions()))
		}
		if len(cav) > 0 {
			out = append(out, Paragraph{Heading: c.w.Heading("caveats"), Sentences: cav})
		}
	}
	return out
}

// writeDetail: one paragraph per indicator (positions in every group, the
// change, the gap, the indicator's caveats), then the competitor systems
// and the group caveats.
func (c *composer) writeDetail(sc *scope) []Paragraph {
	var out []Paragraph
	if sc.has("strengths") {
		s := append(c.overview(sc), c.strengthsAndRisks(sc, true)...)
		if len(s) > 0 {
			out = append(out, Paragraph{Heading: c.w.Heading("strengths"), Sentences: s})
		}
	}
	for _, ind := range sc.inds {
		if s := c.indicatorSentences(sc, ind); len(s) > 0 {
			out = append(out, Paragraph{Heading: headingOf(ind), Sentences: s})
		}
	}
	if sc.has("association") {
		if s := c.association(sc); len(s) > 0 {
			out = append(out, Paragraph{Heading: c.w.Heading("association"), Sentences: s})
		}
	}
	if sc.has("competition") && len(sc.systems) > 0 {
		var comp []Sentence
		for _, g := range sc.systems {
			comp = append(comp, c.competition(sc, g)...)
		}
		if len(comp) > 0 {
			out = append(out, Paragraph{Heading: c.w.Heading("competition"), Sentences: comp})
		}
	}
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
		for _, s := range append(c.overview(sc), c.strengthsAndRisks(sc, true)...) {
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
	if sc.has("association") {
		for _, s := range c.association(sc) {
			out = append(out, Paragraph{Bullet: true, Sentences: []Sentence{s}})
		}
	}
	if sc.has("competition") {
		for _, g := range sc.systems {
			if s := c.competition(sc, g); len(s) > 0 {
				out = append(out, Paragraph{Bullet: true, Sentences: s})
			}
		}
	}
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
