package narrative

import (
	"math"

	"peerpack/internal/dataset"
	"peerpack/internal/figures"
)

// competition writes, for one competitor system (a group expanded from
// "each"), where the focus would sit inside it and on which indicators
// the system's median is ahead of the focus. A median ahead by less than
// the data carries (see medianAgainst) is called level, not a lead, and
// never "not ahead".
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
		q, _, cites, claims := c.quarters(g, ps)
		for _, it := range q.Top {
			f.Top = append(f.Top, it.Indicator)
		}
		for _, it := range q.Bottom {
			f.Bottom = append(f.Bottom, it.Indicator)
		}
		f.MoreTop, f.MoreBottom = q.MoreTop, q.MoreBottom
		for _, it := range q.EdgeTop {
			f.EdgeTop = append(f.EdgeTop, it.Indicator)
		}
		for _, it := range q.EdgeBottom {
			f.EdgeBottom = append(f.EdgeBottom, it.Indicator)
		}
		f.Small, f.First, f.Last, f.Floor = q.Small, q.First, q.Last, q.Floor
		s := c.say("", c.w.CompetitionPlace(f), cites...).claim(claims...)
		s.Thresholds = listCounts(f.MoreTop, f.MoreBottom)
		if q.Small {
			s.Thresholds = append(s.Thresholds, float64(c.floor()))
		}
		out = append(out, s)
	}
	var cites, all []figures.Key
	var claims, quiet []Claim
	compared := false
	for _, ind := range sc.inds {
		if !judged(ind) {
			continue
		}
		st, cl, ok := c.medianAgainst(g, ind, sc.year)
		if !ok {
			continue // nothing to compare with
		}
		if sh.keys[ind.Key] {
			continue // said once for every system
		}
		compared = true
		p, _ := c.m.Position(g.Name, ind.Key, c.m.Focus, sc.year)
		d, _ := c.m.Distribution(g.Name, ind.Key, sc.year)
		keys := []figures.Key{distKey(g.Name, ind.Key, sc.year, mMedian), posKey(g.Name, ind.Key, c.m.FocusID, sc.year, mValue)}
		all = append(all, keys...)
		item := AheadItem{Indicator: c.w.Indicator(ind), Median: printValue(ind, d.Median), Value: printValue(ind, p.Value)}
		switch st {
		case medianAhead:
			f.Ahead = append(f.Ahead, item)
			cites = append(cites, keys...)
			claims = append(claims, cl...)
		case medianLevel:
			f.Level = append(f.Level, item)
			cites = append(cites, keys...)
			claims = append(claims, cl...)
		default:
			quiet = append(quiet, cl...)
		}
	}
	switch {
	case len(f.Ahead) > 0:
		out = append(out, c.say("", c.w.CompetitionAhead(f), cites...).claim(claims...))
	case compared && sh.noOther:
		// The shared sentence has said no median leads elsewhere.
	case compared:
		f.Others = len(sh.keys) > 0
		out = append(out, c.say("", c.w.CompetitionBehind(f), appendNew(cites, all)...).claim(append(claims, quiet...)...))
	}
	return out
}

// appendNew appends the keys of b not already in a.
func appendNew(a, b []figures.Key) []figures.Key {
	seen := map[figures.Key]bool{}
	for _, k := range a {
		seen[k] = true
	}
	for _, k := range b {
		if !seen[k] {
			seen[k] = true
			a = append(a, k)
		}
	}
	return a
}

// How a system's median stands against the focus on one indicator.
const (
	medianNotAhead = iota
	medianLevel
	medianAhead
)

// medianAgainst compares a system's median with the focus's value and
// returns the claims that make the comparison true:
//
//   - not ahead: the focus's value is at or beyond the median
//     (vs_median >= 0);
//   - level: the median is ahead, but by less than the data carries: the
//     two print the same (vs_median above minus one unit of the last
//     decimal), or the focus sits within the noise rule of the group's
//     middle (percentile above 50 minus the noise, in percentile points);
//   - ahead: the median is ahead by more than that (vs_median < 0, the
//     percentile at most 50 minus the noise).
//
// ok is false when there is nothing to compare with.
func (c *composer) medianAgainst(g *figures.Group, ind dataset.Indicator, year int) (state int, claims []Claim, ok bool) {
	p, okp := c.m.Position(g.Name, ind.Key, c.m.Focus, year)
	d, okd := c.m.Distribution(g.Name, ind.Key, year)
	if !okp || !okd || !p.HasValue || d.N == 0 || (p.InGroup && d.N < 2) || math.IsNaN(p.VsMedian) {
		return 0, nil, false
	}
	vs := Fig(posKey(g.Name, ind.Key, c.m.FocusID, year, mVsMedian))
	pct := Fig(posKey(g.Name, ind.Key, c.m.FocusID, year, mPercentile))
	noise := c.noise()
	switch {
	case p.VsMedian >= 0:
		return medianNotAhead, []Claim{Claimed(vs, OpGreaterEq, Num(0))}, true
	case !ahead(ind, d.Median, p.Value):
		return medianLevel, []Claim{Claimed(vs, OpLess, Num(0)), Claimed(vs, OpGreater, Num(-unitOf(ind)))}, true
	case p.Rank > 0 && p.Percentile > 50-noise:
		return medianLevel, []Claim{Claimed(vs, OpLess, Num(0)), Claimed(pct, OpGreater, Num(50-noise))}, true
	}
	out := []Claim{Claimed(vs, OpLess, Num(0))}
	if p.Rank > 0 {
		out = append(out, Claimed(pct, OpLessEq, Num(50-noise)))
	}
	return medianAhead, out, true
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
	var claims, notAhead []Claim
	for _, ind := range sc.inds {
		if !judged(ind) {
			continue
		}
		n := 0
		var lead, rest []Claim
		for _, g := range sc.systems {
			st, cl, ok := c.medianAgainst(g, ind, sc.year)
			switch {
			case ok && st == medianAhead:
				n++
				lead = append(lead, cl...)
			case ok && st == medianLevel:
				// Level within noise is not "no lead": the shared
				// sentence cannot say none is ahead elsewhere.
				other = true
			case ok:
				rest = append(rest, cl...)
			}
		}
		if n < len(sc.systems) {
			other = other || n > 0
			notAhead = append(notAhead, rest...)
			continue
		}
		sh.keys[ind.Key] = true
		names = append(names, c.w.Indicator(ind))
		claims = append(claims, lead...)
		for _, g := range sc.systems {
			cites = append(cites, distKey(g.Name, ind.Key, sc.year, mMedian), posKey(g.Name, ind.Key, c.m.FocusID, sc.year, mValue))
		}
	}
	if len(names) == 0 {
		return nil, sh
	}
	sh.noOther = !other
	f := CompetitionFact{Seed: "shared", Focus: c.focus, Systems: len(sc.systems), Shared: names, Others: sh.noOther}
	if sh.noOther {
		claims = append(claims, notAhead...)
	}
	out := c.say("", c.w.CompetitionShared(f), cites...).claim(claims...)
	out.Thresholds = listCounts(f.Systems)
	return []Sentence{out}, sh
}
