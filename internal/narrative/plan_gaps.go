package narrative

import (
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
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
// top-quarter threshold (vs_better_quartile below zero, gap above zero);
// below the small-group floor, short of the rank target (the rank below
// target_rank, target_rank_gap above zero).
func (c *composer) gapClaims(g *figures.Group, ind dataset.Indicator, year int) []Claim {
	id := c.m.FocusID
	if d, ok := c.m.Distribution(g.Name, ind.Key, year); ok && c.small(d) {
		return []Claim{Claimed(Fig(posKey(g.Name, ind.Key, id, year, mRank)), OpGreater, Fig(posKey(g.Name, ind.Key, id, year, figures.MeasureTargetRank))),
			Claimed(Fig(posKey(g.Name, ind.Key, id, year, figures.MeasureTargetRankGap)), OpGreater, Num(0))}
	}
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
	if c.small(d) {
		return c.rankGapFact(g, ind, p)
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

// rankGapFact is the gap below the small-group floor, where the pack gives
// no quarters: what it would take to reach the rank target (the last place
// of the best quarter of places, figures.TargetRank), "reaching 2nd of 8
// would take". The model writes the target only while the focus is below it.
func (c *composer) rankGapFact(g *figures.Group, ind dataset.Indicator, p *figures.Position) (GapFact, []figures.Key, bool) {
	id := c.m.FocusID
	k := func(m string) figures.Key { return posKey(g.Name, ind.Key, id, p.Year, m) }
	rank, okr := c.m.Lookup(k(figures.MeasureTargetRank))
	value, okv := c.m.Lookup(k(figures.MeasureTargetRankValue))
	gap, okg := c.m.Lookup(k(figures.MeasureTargetRankGap))
	if !okr || !okv || !okg || !ahead(ind, value.Value, p.Value) {
		return GapFact{}, nil, false
	}
	f := GapFact{Seed: k(figures.MeasureTargetRankGap).String(), Focus: c.focus, Indicator: c.w.Indicator(ind),
		Group: c.phrase(g), Better: ind.Better, Target: printValue(ind, value.Value), Value: printValue(ind, p.Value),
		Rank: format.Ordinal(int(rank.Value)) + " of " + printCount(p.Of)}
	cites := []figures.Key{k(figures.MeasureTargetRankValue), k(figures.MeasureTargetRank), k(mOf), k(mValue)}
	if gapAgrees(ind, value.Value, p.Value, gap.Value) || gapAgrees(ind, p.Value, value.Value, gap.Value) {
		f.Amount = printAmount(ind, gap.Value)
		cites = append(cites, k(figures.MeasureTargetRankGap))
	}
	return f, cites, true
}
