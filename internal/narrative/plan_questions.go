package narrative

import (
	"fmt"
	"sort"

	"peerpack/internal/dataset"
	"peerpack/internal/figures"
)

// Questions for a governing body (brief topic "questions"): the figures
// turned into the questions a council should put to the executive. Each
// question is one bullet under its indicator's heading, cites the figures
// it rests on and records the claims that make its premise true. The
// situations, in the order they are asked (common practice, no source:
// a council hears first what is weak and getting weaker):
//
//  1. falling: in the bottom quarter of a group and the percentile fell by
//     at least the noise rule over the span;
//  2. last: last of a group below the small-group floor (no quarters there);
//  3. slipping: in the top quarter but the percentile fell by at least the
//     noise rule;
//  4. bottom: in the bottom quarter, or at the edge of it within the noise
//     rule.
//
// One question per indicator (the most pressing), at most MaxQuestions in
// all; when none arises one sentence says so, with a claim per indicator
// and group that it is neither in the bottom quarter nor last.

// MaxQuestions is how many questions a block asks at most (common
// practice, no source: a council agenda item takes a handful).
const MaxQuestions = 6

type question struct {
	kind   int
	order  int // indicator's place in the block, for a stable order
	ind    dataset.Indicator
	fact   QuestionFact
	cites  []figures.Key
	claims []Claim
}

func (c *composer) questions(sc *scope) []Paragraph {
	var qs []question
	for i, ind := range sc.inds {
		if !judged(ind) {
			continue
		}
		var best *question
		for _, g := range sc.groups {
			q, ok := c.questionOn(sc, g, ind)
			if ok && (best == nil || q.kind < best.kind) {
				q.order = i
				best = &q
			}
		}
		if best != nil {
			qs = append(qs, *best)
		}
	}
	sort.SliceStable(qs, func(i, j int) bool { return qs[i].kind < qs[j].kind })
	if len(qs) > MaxQuestions {
		qs = qs[:MaxQuestions]
	}
	var out []Paragraph
	for _, q := range qs {
		// Phrasings of a kind rotate through the block (the text was
		// written with turn 0 while the indicators were weighed).
		f := q.fact
		f.Seed, f.Turn = c.next(fmt.Sprintf("question-%d", q.kind))
		s := c.say(q.ind.Key, c.council().Question(f), q.cites...).claim(q.claims...)
		out = append(out, Paragraph{Bullet: true, Heading: headingOf(q.ind), Sentences: []Sentence{s}})
	}
	if len(out) == 0 {
		if s, ok := c.noQuestion(sc); ok {
			out = append(out, Paragraph{Heading: c.council().TopicHeading("questions"), Sentences: []Sentence{s}})
		}
	}
	return out
}

// questionOn finds the most pressing question one group raises on one
// indicator, if any.
func (c *composer) questionOn(sc *scope, g *figures.Group, ind dataset.Indicator) (question, bool) {
	y := sc.year
	p, okp := c.m.Position(g.Name, ind.Key, c.m.Focus, y)
	d, okd := c.m.Distribution(g.Name, ind.Key, y)
	if !okp || !okd || !p.HasValue || p.Rank == 0 || p.Of < 2 || d.N < 2 {
		return question{}, false
	}
	id := c.m.FocusID
	pk := func(yr int, m string) figures.Key { return posKey(g.Name, ind.Key, id, yr, m) }
	f := QuestionFact{Seed: pk(y, mPercentile).String(), Focus: c.focus, Indicator: c.w.Indicator(ind), Group: c.phrase(g),
		Better: ind.Better, Year: printYear(y)}
	if c.small(d) {
		if p.Rank != p.Of {
			return question{}, false
		}
		f.Kind, f.Of = QuestionLast, printCount(p.Of)
		return question{kind: QuestionLast, ind: ind, fact: f,
			cites:  []figures.Key{pk(y, mRank), pk(y, mOf)},
			claims: []Claim{Claimed(Fig(pk(y, mRank)), OpEqual, Fig(pk(y, mOf)))}}, true
	}
	f.Pct = printOrdinalPct(p.Percentile)
	cites := []figures.Key{pk(y, mPercentile), pk(y, mValue)}
	value := Fig(pk(y, mValue))
	// A fall beyond the noise rule over the trend's own years ending in
	// the block's year.
	fell := false
	var cd changeData
	if x, ok := c.changeData(sc, g, ind); ok && x.useTrend && x.hasPct && x.p1.Year == y && x.f.PctDirection == Below {
		fell, cd = true, x
	}
	edge := c.edge(p.Percentile)
	// Beyond the noise rule of the quarter's boundary, on its side: what
	// notEdgeClaims records (the quarter by value and the percentile can
	// disagree where values tie).
	n := c.noise()
	farBottom, farTop := p.Percentile < 25-n, p.Percentile > 75+n
	switch {
	case fell && p.Quartile == 4 && farBottom:
		f.Kind, f.PctFrom, f.FromYear = QuestionFalling, printOrdinalPct(cd.p0.Percentile), printYear(cd.p0.Year)
		cl := append(c.quarterClaims(ind, value, g.Name, ind.Key, y, 4), c.percentileChangeClaims(g, ind, cd)...)
		cl = append(cl, c.notEdgeClaims(pk(y, mPercentile), 4)...)
		return question{kind: QuestionFalling, ind: ind, fact: f,
			cites:  append(cites, pk(cd.p0.Year, mPercentile), trendKey(g.Name, ind.Key, id, mPercentileChange)),
			claims: cl}, true
	case fell && p.Quartile == 1 && farTop:
		f.Kind, f.PctFrom, f.FromYear = QuestionSlipping, printOrdinalPct(cd.p0.Percentile), printYear(cd.p0.Year)
		cl := append(c.quarterClaims(ind, value, g.Name, ind.Key, y, 1), c.percentileChangeClaims(g, ind, cd)...)
		cl = append(cl, c.notEdgeClaims(pk(y, mPercentile), 1)...)
		return question{kind: QuestionSlipping, ind: ind, fact: f,
			cites:  append(cites, pk(cd.p0.Year, mPercentile), trendKey(g.Name, ind.Key, id, mPercentileChange)),
			claims: cl}, true
	case edge == 4:
		f.Kind, f.Edge = QuestionBottom, true
		return question{kind: QuestionBottom, ind: ind, fact: f, cites: cites,
			claims: c.edgeClaims(pk(y, mPercentile), 4)}, true
	case p.Quartile == 4:
		f.Kind = QuestionBottom
		return question{kind: QuestionBottom, ind: ind, fact: f, cites: cites,
			claims: c.quarterClaims(ind, value, g.Name, ind.Key, y, 4)}, true
	}
	return question{}, false
}

// notEdgeClaims: the percentile lies beyond the noise rule of the boundary
// edge names, on the side of that quarter, so "in the quarter" is said
// without "at the edge".
func (c *composer) notEdgeClaims(pct figures.Key, edge int) []Claim {
	n := c.noise()
	if edge == 4 {
		return []Claim{Claimed(Fig(pct), OpLess, Num(25-n))}
	}
	return []Claim{Claimed(Fig(pct), OpGreater, Num(75+n))}
}

// noQuestion says that none of the situations arose: for every judged
// indicator and group with a place, the focus is not in the bottom quarter
// (quartile below 4) and, in a small group, not last (rank below of).
func (c *composer) noQuestion(sc *scope) (Sentence, bool) {
	var claims []Claim
	var names []string
	seen := map[string]bool{}
	for _, g := range sc.groups {
		for _, ind := range sc.inds {
			if !judged(ind) {
				continue
			}
			p, okp := c.m.Position(g.Name, ind.Key, c.m.Focus, sc.year)
			d, okd := c.m.Distribution(g.Name, ind.Key, sc.year)
			if !okp || !okd || !p.HasValue || p.Rank == 0 || p.Of < 2 || d.N < 2 {
				continue
			}
			pk := func(m string) figures.Key { return posKey(g.Name, ind.Key, c.m.FocusID, sc.year, m) }
			if c.small(d) {
				claims = append(claims, Claimed(Fig(pk(mRank)), OpLess, Fig(pk(mOf))))
			} else {
				claims = append(claims, Claimed(Fig(pk(mQuartile)), OpLess, Num(4)))
			}
			if !seen[g.Name] {
				seen[g.Name] = true
				names = append(names, c.phrase(g))
			}
		}
	}
	if len(claims) == 0 {
		return Sentence{}, false
	}
	f := QuestionFact{Focus: c.focus, Groups: names}
	return c.say("", c.council().NoQuestion(f)).claim(claims...), true
}
