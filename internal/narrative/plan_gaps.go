package narrative

import (
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
)

// gap writes what it would take to reach the group's top-quarter
// threshold (the upper quartile, or the lower quartile when lower is
// better), when the focus has not reached it. Neutral indicators have no
// target.
func (c *composer) gap(g *figures.Group, ind dataset.Indicator, year int) []Sentence {
	f, cites, ok := c.gapFact(g, ind, year)
	if !ok {
		return nil
	}
	f.Seed, f.Turn = c.next("gap")
	return []Sentence{c.say(ind.Key, c.w.Gap(f), cites...).claim(c.gapClaims(g, ind, year)...)}
}

// gapClaims: a gap still to go means the value is short of the
// top-quarter threshold (vs_better_quartile below zero, gap above zero).
func (c *composer) gapClaims(g *figures.Group, ind dataset.Indicator, year int) []Claim {
	id := c.m.FocusID
	return []Claim{Claimed(Fig(posKey(g.Name, ind.Key, id, year, mVsBetter)), OpLess, Num(0)),
		Claimed(Fig(posKey(g.Name, ind.Key, id, year, mGapBetter)), OpGreater, Num(0))}
}

// gapFact gathers the gap to the top-quarter threshold; ok is false when
// there is none to state.
func (c *composer) gapFact(g *figures.Group, ind dataset.Indicator, year int) (GapFact, []figures.Key, bool) {
	if !judged(ind) {
		return GapFact{}, nil, false
	}
	p, okp := c.m.Position(g.Name, ind.Key, c.m.Focus, year)
	d, okd := c.m.Distribution(g.Name, ind.Key, year)
	if !okp || !okd || !p.HasValue || p.Rank == 0 || d.N < 2 {
		return GapFact{}, nil, false
	}
	t := targetValue(ind, d)
	if !ahead(ind, t, p.Value) {
		return GapFact{}, nil, false
	}
	id := c.m.FocusID
	f := GapFact{Seed: posKey(g.Name, ind.Key, id, year, mGapBetter).String(), Focus: c.focus, Indicator: c.w.Indicator(ind),
		Group: c.phrase(g), Better: ind.Better, Target: printValue(ind, t), Value: printValue(ind, p.Value)}
	// The value is cited whether or not a phrasing prints it.
	cites := []figures.Key{distKey(g.Name, ind.Key, year, targetMeasure(ind)), posKey(g.Name, ind.Key, id, year, mValue)}
	if p.GapQ3 > 0 && gapAgrees(ind, t, p.Value, p.GapQ3) {
		f.Amount = printAmount(ind, p.GapQ3)
		cites = append(cites, posKey(g.Name, ind.Key, id, year, mGapBetter))
	}
	return f, cites, true
}
