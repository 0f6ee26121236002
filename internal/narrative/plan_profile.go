package narrative

import (
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
)

// profile writes, for each group of the scope, the focus's profile
// against the group's median across the block's indicators, as a radar
// chart of the same group and indicators draws it: on which spokes the
// focus's value is higher than the median, lower, or level with it (by
// the printed digits, as everywhere), by how much, and which indicators
// it leaves out for want of a value. The words are about values ("higher
// share of papers in ..."), never judgements, so the sentence reads the
// same whether the radar's scale is percentiles, ranges or one common
// scale; lower-is-better indicators say so. Each item records its claim
// (value against median, or level: less than one unit of the last
// printed decimal apart).
func (c *composer) profile(sc *scope) []Sentence {
	var out []Sentence
	for _, g := range sc.groups {
		f := ProfileFact{Seed: g.Name, Focus: c.focus, Group: c.phrase(g), Year: printYear(sc.year)}
		var cites []figures.Key
		var claims []Claim
		id := c.m.FocusID
		for _, ind := range sc.inds {
			p, okp := c.m.Position(g.Name, ind.Key, c.m.Focus, sc.year)
			d, okd := c.m.Distribution(g.Name, ind.Key, sc.year)
			if !okp || !okd || !p.HasValue || d.N == 0 {
				f.Missing = append(f.Missing, c.w.Indicator(ind))
				cites = append(cites, posKey(g.Name, ind.Key, id, sc.year, "has_value"))
				continue
			}
			k := func(m string) figures.Key { return posKey(g.Name, ind.Key, id, sc.year, m) }
			rel := printedCompare(ind, p.Value, d.Median)
			diff := printedDistance(ind, p.Value, d.Median, p.VsMedian)
			item := ProfileItem{Indicator: c.w.Indicator(ind), Value: printValue(ind, p.Value), Median: printValue(ind, d.Median),
				Diff: diff, LowerBetter: ind.Better == dataset.LowerIsBetter}
			cites = append(cites, k(mValue), distKey(g.Name, ind.Key, sc.year, mMedian))
			if diff != "" {
				cites = append(cites, k(mVsMedian))
			}
			value, median := Fig(k(mValue)), Fig(distKey(g.Name, ind.Key, sc.year, mMedian))
			claims = append(claims, relationClaims(ind, value, median, rel, Fig(k(mVsMedian)))...)
			switch rel {
			case Above:
				f.Higher = append(f.Higher, item)
			case Below:
				f.Lower = append(f.Lower, item)
			default:
				f.Level = append(f.Level, item)
			}
		}
		if len(f.Higher)+len(f.Lower)+len(f.Level)+len(f.Missing) == 0 {
			continue
		}
		out = append(out, c.say("", c.w.Profile(f), cites...).claim(claims...))
	}
	return out
}

// ProfileItem is one spoke of a profile: the focus's value and the
// median, printed, and the printed distance ("" when level or when it
// would contradict the printed values).
type ProfileItem struct {
	Indicator, Value, Median, Diff string
	LowerBetter                    bool
}

// ProfileFact is the focus's profile against a group's median.
type ProfileFact struct {
	Seed, Focus, Group, Year string
	Higher, Lower, Level     []ProfileItem
	// Missing names the indicators left out for want of a value.
	Missing []string
}
