package narrative

import "peerpack/internal/figures"

// competition writes, for one competitor system (a group expanded from
// "each"), where the focus would sit inside it and on which indicators
// the system's median is ahead of the focus. A median ahead by less than
// the data carries (withinNoise: a difference that rounds to zero, or under
// NoiseIQRShare of the system's interquartile range) is not called a lead.
// skipPlace leaves out where the focus sits when the overview has just
// said it for this same group (the focus's own system in a summary).
func (c *composer) competition(sc *scope, g *figures.Group, skipPlace bool) []Sentence {
	ps := c.placements(sc, g)
	system := c.phrase(g)
	f := CompetitionFact{Seed: g.Name, Focus: c.focus, System: system, InSystem: g.FocusIn}
	var out []Sentence
	if len(ps) > 0 && !skipPlace {
		q, _, cites := c.quarters(g, ps)
		for _, it := range q.Top {
			f.Top = append(f.Top, it.Indicator)
		}
		for _, it := range q.Bottom {
			f.Bottom = append(f.Bottom, it.Indicator)
		}
		f.MoreTop, f.MoreBottom = q.MoreTop, q.MoreBottom
		s := c.say("", c.w.CompetitionPlace(f), cites...)
		s.Thresholds = listCounts(f.MoreTop, f.MoreBottom)
		out = append(out, s)
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
		if ahead(ind, d.Median, p.Value) && !withinNoise(ind, d.Median-p.Value, d.IQR) {
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
