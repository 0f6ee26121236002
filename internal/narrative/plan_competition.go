package narrative

import "peerpack/internal/figures"

// competition writes, for one competitor system (a group expanded from
// "each"), where the focus would sit inside it and on which indicators
// the system's median is ahead of the focus.
func (c *composer) competition(sc *scope, g *figures.Group) []Sentence {
	ps := c.placements(sc, g)
	system := c.phrase(g)
	f := CompetitionFact{Seed: g.Name, Focus: c.focus, System: system, InSystem: g.FocusIn}
	var out []Sentence
	if len(ps) > 0 {
		var cites []figures.Key
		f.Top, f.Bottom, _, _, cites = c.quarters(g, ps)
		out = append(out, c.say("", c.w.CompetitionPlace(f), cites...))
	}
	var cites, all []figures.Key
	compared := false
	for _, ind := range sc.inds {
		if !judged(ind) {
			continue
		}
		p, okp := c.m.Position(g.Name, ind.Key, c.m.Focus, sc.year)
		d, okd := c.m.Distribution(g.Name, ind.Key, sc.year)
		if !okp || !okd || !p.HasValue || d.N == 0 || (p.InGroup && d.N < 2) {
			continue // nothing to compare with
		}
		compared = true
		all = append(all, distKey(g.Name, ind.Key, sc.year, mMedian), posKey(g.Name, ind.Key, c.m.FocusID, sc.year, mValue))
		if ahead(ind, d.Median, p.Value) {
			f.Ahead = append(f.Ahead, AheadItem{Indicator: c.w.Indicator(ind), Median: printValue(ind, d.Median), Value: printValue(ind, p.Value)})
			cites = append(cites, distKey(g.Name, ind.Key, sc.year, mMedian), posKey(g.Name, ind.Key, c.m.FocusID, sc.year, mValue))
		}
	}
	switch {
	case len(f.Ahead) > 0:
		out = append(out, c.say("", c.w.CompetitionAhead(f), cites...))
	case compared:
		out = append(out, c.say("", c.w.CompetitionBehind(f), all...))
	}
	return out
}
