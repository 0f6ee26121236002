package narrative

import (
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
)

// competition writes, for one competitor system (a group expanded from
// "each"), where the focus would sit inside it and on which indicators
// the system's median is ahead of the focus. A median ahead by less than
// the data carries (withinNoise: a difference that rounds to zero, or under
// NoiseIQRShare of the system's interquartile range) is not called a lead.
// skipPlace leaves out where the focus sits when the overview has just
// said it for this same group (the focus's own system in a summary).
//
// sh holds the indicators on which every system's median leads (see
// sharedLeads): a sentence before the systems says so once, and each
// system's own sentence names only its other leads.
func (c *composer) competition(sc *scope, g *figures.Group, skipPlace bool, sh shared) []Sentence {
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
		if sh.keys[ind.Key] {
			continue // said once for every system
		}
		compared = true
		all = append(all, distKey(g.Name, ind.Key, sc.year, mMedian), posKey(g.Name, ind.Key, c.m.FocusID, sc.year, mValue))
		if c.leads(g, ind, sc.year) {
			f.Ahead = append(f.Ahead, AheadItem{Indicator: c.w.Indicator(ind), Median: printValue(ind, d.Median), Value: printValue(ind, p.Value)})
			cites = append(cites, distKey(g.Name, ind.Key, sc.year, mMedian), posKey(g.Name, ind.Key, c.m.FocusID, sc.year, mValue))
		}
	}
	switch {
	case len(f.Ahead) > 0:
		out = append(out, c.say("", c.w.CompetitionAhead(f), cites...))
	case compared && sh.noOther:
		// The shared sentence has said no median leads elsewhere.
	case compared:
		f.Others = len(sh.keys) > 0
		out = append(out, c.say("", c.w.CompetitionBehind(f), all...))
	}
	return out
}

// leads reports whether a system's median is ahead of the focus on an
// indicator by more than the data carries.
func (c *composer) leads(g *figures.Group, ind dataset.Indicator, year int) bool {
	p, okp := c.m.Position(g.Name, ind.Key, c.m.Focus, year)
	d, okd := c.m.Distribution(g.Name, ind.Key, year)
	if !okp || !okd || !p.HasValue || d.N == 0 || (p.InGroup && d.N < 2) {
		return false
	}
	return ahead(ind, d.Median, p.Value) && !withinNoise(ind, d.Median-p.Value, d.IQR)
}

// MinSharedSystems is how many competitor systems a scope needs before a
// lead they all share is said once for all of them (with two, each
// system's sentence reads as well; common practice, no source).
const MinSharedSystems = 3

// shared is what sharedLeads found: the indicators every system's median
// leads on, and whether no system leads on any other.
type shared struct {
	keys    map[string]bool
	noOther bool
}

// sharedLeads finds the judged indicators on which the median of every
// system leads the focus, and writes the one sentence that says so; the
// systems' own sentences then leave them out. Five paragraphs that each
// repeat "ahead on international students" bury what differs between
// the systems.
func (c *composer) sharedLeads(sc *scope) ([]Sentence, shared) {
	sh := shared{keys: map[string]bool{}}
	if len(sc.systems) < MinSharedSystems {
		return nil, sh
	}
	var names []string
	var cites []figures.Key
	other := false
	for _, ind := range sc.inds {
		if !judged(ind) {
			continue
		}
		n := 0
		for _, g := range sc.systems {
			if c.leads(g, ind, sc.year) {
				n++
			}
		}
		if n < len(sc.systems) {
			other = other || n > 0
			continue
		}
		sh.keys[ind.Key] = true
		names = append(names, c.w.Indicator(ind))
		for _, g := range sc.systems {
			cites = append(cites, distKey(g.Name, ind.Key, sc.year, mMedian), posKey(g.Name, ind.Key, c.m.FocusID, sc.year, mValue))
		}
	}
	if len(names) == 0 {
		return nil, sh
	}
	sh.noOther = !other
	f := CompetitionFact{Seed: "shared", Focus: c.focus, Systems: len(sc.systems), Shared: names, Others: sh.noOther}
	out := c.say("", c.w.CompetitionShared(f), cites...)
	out.Thresholds = listCounts(f.Systems)
	return []Sentence{out}, sh
}
