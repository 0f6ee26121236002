package narrative

import (
	"math"

	"peerpack/internal/dataset"
	"peerpack/internal/figures"
)

// Topics for a governing body's pages (brief topics "standouts" and
// "moves"):
//
//   - standouts: the three indicators furthest above the middle of the
//     reference group and the three furthest below it, each followed by
//     its evidence: the focus's position in every group of the block;
//   - moves: the indicators whose percentile in the reference group moved
//     by at least the noise rule over the span, each with its change, then
//     one sentence naming those that stayed within the noise and one
//     naming those with nothing to compare.
//
// Both reuse the position and change planners, so every sentence carries
// the claims those record; the lead sentences record their own.

// standouts writes the strengths and the risks with their evidence.
func (c *composer) standouts(sc *scope) []Paragraph {
	g := sc.ref
	if g == nil {
		return nil
	}
	up, down := c.rankedLists(sc, g)
	var out []Paragraph
	side := func(xs []placed, strong bool) {
		if len(xs) == 0 {
			return
		}
		f, cites := c.ranked(g, xs)
		n := len(f.Items)
		lead := c.say("", c.council().StandoutLead(f, strong), cites...).claim(c.rankedClaims(g, xs[:n], strong)...)
		kind := "risks"
		if strong {
			kind = "strengths"
		}
		out = append(out, Paragraph{Heading: c.council().TopicHeading(kind), Sentences: []Sentence{lead}})
		for _, x := range xs[:n] {
			var s []Sentence
			for _, gr := range sc.groups {
				s = append(s, c.position(gr, x.ind, sc.year)...)
			}
			if len(s) > 0 {
				out = append(out, Paragraph{Bullet: true, Heading: headingOf(x.ind), Sentences: s})
			}
		}
	}
	side(up, true)
	side(down, false)
	return out
}

// moves writes what changed beyond the noise rule in the reference group.
func (c *composer) moves(sc *scope) []Paragraph {
	g := sc.ref
	if g == nil {
		return nil
	}
	var out []Paragraph
	var steady, unread, small []dataset.Indicator
	var smallClaims []Claim
	for _, ind := range sc.inds {
		if !judged(ind) {
			continue
		}
		cd, ok := c.changeData(sc, g, ind)
		switch {
		case ok && (c.small(cd.d0) || c.small(cd.d1)):
			small = append(small, ind)
			d := cd.d1
			if c.small(cd.d0) {
				d = cd.d0
			}
			smallClaims = append(smallClaims, Claimed(Fig(distKey(g.Name, ind.Key, d.Year, mN)), OpLess, Num(float64(c.floor()))))
			continue
		case !ok || !cd.hasPct || !cd.useTrend || math.IsNaN(cd.t.PercentileMove):
			unread = append(unread, ind)
			continue
		}
		if cd.f.PctDirection == Level {
			steady = append(steady, ind)
			continue
		}
		if s := c.change(sc, g, ind); len(s) > 0 {
			out = append(out, Paragraph{Bullet: true, Heading: headingOf(ind), Sentences: s})
		}
	}
	var rest []Sentence
	if len(steady) > 0 {
		f := SteadyFact{Seed: g.Name + "/steady", Focus: c.focus, Group: c.phrase(g)}
		// The rule is printed when it is a whole number of points (a
		// threshold reads as format.Number(n, 0)); otherwise the sentence
		// names the rule without its figure.
		whole := c.noise() == math.Trunc(c.noise())
		if whole {
			f.Noise = printCount(int(c.noise()))
		}
		var claims []Claim
		var cites []figures.Key
		for _, ind := range steady {
			f.Indicators = append(f.Indicators, c.w.Indicator(ind))
			k := trendKey(g.Name, ind.Key, c.m.FocusID, "percentile_move")
			cites = append(cites, k)
			claims = append(claims, Claimed(Fig(k), OpLess, Num(c.noise())))
		}
		s := c.say("", c.council().Steady(f), cites...).claim(claims...)
		if whole {
			s.Thresholds = []float64{c.noise()}
		}
		rest = append(rest, s)
	}
	for i, list := range [][]dataset.Indicator{unread, small} {
		if len(list) == 0 {
			continue
		}
		f := SteadyFact{Seed: g.Name + "/unread", Focus: c.focus, Group: c.phrase(g), Small: i == 1}
		for _, ind := range list {
			f.Indicators = append(f.Indicators, c.w.Indicator(ind))
		}
		s := c.say("", c.council().Unread(f))
		if f.Small {
			s.Thresholds = []float64{float64(c.floor())}
			f.Floor = printCount(c.floor())
			s.Text = c.council().Unread(f)
			s = s.claim(smallClaims...)
		}
		rest = append(rest, s)
	}
	if len(rest) > 0 {
		out = append(out, Paragraph{Heading: c.council().TopicHeading("steady"), Sentences: rest})
	}
	return out
}

// councilTopics writes the topics of this file, plan_questions.go and
// plan_peerchoice.go that the scope asks for, in that order (detail and
// bullets styles alike: each is a run of bullets and short paragraphs).
func (c *composer) councilTopics(sc *scope) []Paragraph {
	var out []Paragraph
	if sc.has("standouts") {
		out = append(out, c.standouts(sc)...)
	}
	if sc.has("moves") {
		out = append(out, c.moves(sc)...)
	}
	if sc.has("peerchoice") {
		out = append(out, c.peerChoice(sc)...)
	}
	if sc.has("questions") {
		out = append(out, c.questions(sc)...)
	}
	return out
}
