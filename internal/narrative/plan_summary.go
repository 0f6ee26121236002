package narrative

import (
	"math"
	"sort"

	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
)

// placed is the focus's position on one indicator in the reference group.
type placed struct {
	ind dataset.Indicator
	p   *figures.Position
	d   *figures.Distribution
}

// placements lists the judged indicators of the scope on which the focus
// has a rank among at least one other value in the group.
func (c *composer) placements(sc *scope, g *figures.Group) []placed {
	var out []placed
	for _, ind := range sc.inds {
		if !judged(ind) {
			continue
		}
		p, okp := c.m.Position(g.Name, ind.Key, c.m.Focus, sc.year)
		d, okd := c.m.Distribution(g.Name, ind.Key, sc.year)
		if !okp || !okd || !p.HasValue || p.Rank == 0 || p.Of < 2 {
			continue
		}
		out = append(out, placed{ind, p, d})
	}
	return out
}

// quarters lists the indicators in the best and the worst quarter with
// their percentiles, the most extreme first, at most OverviewItems of
// each; MoreTop and MoreBottom count those left out of the lists. A
// position within the noise rule of the top or bottom quarter's boundary
// goes to EdgeTop or EdgeBottom instead ("at the edge of the top
// quarter"). When every indicator's group is below the small-group floor
// the fact is Small: the first and last places "of n" instead of quarters.
// named records every indicator the fact names or counts, so the
// strengths and risks that follow do not repeat them.
//
// claims holds the claims that make the sentence true: each listed or
// counted top (bottom) item is in quartile 1 (4), its value at or beyond
// the quartile that bounds it; each edge item's percentile within the
// noise of its boundary; each other item in neither quarter (what "with no
// indicator in the bottom quarter" and "in the middle half" say); first
// and last places rank 1 and rank = of.
func (c *composer) quarters(g *figures.Group, ps []placed) (f OverviewFact, named map[string]bool, cites []figures.Key, claims []Claim) {
	named = map[string]bool{}
	k := func(x placed, m string) figures.Key { return posKey(g.Name, x.ind.Key, c.m.FocusID, x.p.Year, m) }
	small := len(ps) > 0
	for _, x := range ps {
		small = small && c.small(x.d)
	}
	if small {
		f.Small, f.Floor = true, printCount(c.floor())
		for _, x := range ps {
			named[x.ind.Key] = true
			it := RankedItem{Indicator: c.w.Indicator(x.ind), Rank: format.Ordinal(x.p.Rank) + " of " + printCount(x.p.Of)}
			switch {
			case x.p.Rank == 1:
				f.First = append(f.First, it)
				claims = append(claims, Claimed(Fig(k(x, mRank)), OpEqual, Num(1)))
			case x.p.Rank == x.p.Of:
				f.Last = append(f.Last, it)
				claims = append(claims, Claimed(Fig(k(x, mRank)), OpEqual, Fig(k(x, mOf))))
			default:
				claims = append(claims, Claimed(Fig(k(x, mRank)), OpGreater, Num(1)), Claimed(Fig(k(x, mRank)), OpLess, Fig(k(x, mOf))))
				continue
			}
			cites = append(cites, k(x, mRank), k(x, mOf))
			claims = append(claims, Claimed(Fig(distKey(g.Name, x.ind.Key, x.p.Year, mN)), OpLess, Num(float64(c.floor()))))
		}
		return f, named, cites, claims
	}
	var hi, lo, eh, el []placed
	for _, x := range ps {
		if c.small(x.d) {
			continue // too few values for a quarter; its position sentence gives the rank
		}
		switch e := c.edge(x.p.Percentile); {
		case e == 1:
			eh = append(eh, x)
			claims = append(claims, c.edgeClaims(k(x, mPercentile), 1)...)
		case e == 4:
			el = append(el, x)
			claims = append(claims, c.edgeClaims(k(x, mPercentile), 4)...)
		case x.p.Quartile == 1:
			hi = append(hi, x)
			claims = append(claims, Claimed(Fig(k(x, mQuartile)), OpEqual, Num(1)))
			claims = append(claims, c.quarterClaims(x.ind, Fig(k(x, mValue)), g.Name, x.ind.Key, x.p.Year, 1)...)
		case x.p.Quartile == 4:
			lo = append(lo, x)
			claims = append(claims, Claimed(Fig(k(x, mQuartile)), OpEqual, Num(4)))
			claims = append(claims, c.quarterClaims(x.ind, Fig(k(x, mValue)), g.Name, x.ind.Key, x.p.Year, 4)...)
		default:
			f.Middle++
			claims = append(claims, Claimed(Fig(k(x, mQuartile)), OpNotEqual, Num(1)), Claimed(Fig(k(x, mQuartile)), OpNotEqual, Num(4)))
		}
	}
	sort.SliceStable(hi, func(i, j int) bool { return hi[i].p.Percentile > hi[j].p.Percentile })
	sort.SliceStable(lo, func(i, j int) bool { return lo[i].p.Percentile < lo[j].p.Percentile })
	for _, x := range append(append(append(append([]placed(nil), hi...), lo...), eh...), el...) {
		// Counted in "and two other indicators" too: never named again.
		named[x.ind.Key] = true
	}
	// A list one longer than the cap is given whole: "and one other
	// indicator" would take as many words as naming it.
	if len(hi) > OverviewItems+1 {
		f.MoreTop = len(hi) - OverviewItems
		hi = hi[:OverviewItems]
	}
	// The bottom quarter is never cut: every position there is named and
	// cited, so no bad news is left to a count.
	item := func(x placed) RankedItem {
		cites = append(cites, k(x, mQuartile), k(x, mPercentile))
		return RankedItem{Indicator: c.w.Indicator(x.ind), Percentile: printOrdinalPct(x.p.Percentile), Value: printValue(x.ind, x.p.Value)}
	}
	for _, x := range hi {
		f.Top = append(f.Top, item(x))
	}
	for _, x := range lo {
		f.Bottom = append(f.Bottom, item(x))
	}
	for _, x := range eh {
		f.EdgeTop = append(f.EdgeTop, item(x))
	}
	for _, x := range el {
		f.EdgeBottom = append(f.EdgeBottom, item(x))
	}
	return f, named, cites, claims
}

// overview says, within the reference group, which indicators are in the
// top and bottom quarters, with their percentiles. The fact comes back too
// (nil without a sentence), so the strengths and risks that follow know
// what it named.
func (c *composer) overview(sc *scope) ([]Sentence, *OverviewFact) {
	return c.overviewOf(sc, sc.ref)
}

// otherOverviews places the focus in every other group of the scope, one
// sentence each, so a summary covers each comparison group it is given
// (competitor systems too, unless the scope's competition topic does).
func (c *composer) otherOverviews(sc *scope) []Sentence {
	var out []Sentence
	gs := sc.groups
	if !sc.has("competition") && !sameSet(sc.groups, sc.systems) {
		gs = append(append([]*figures.Group(nil), sc.groups...), sc.systems...)
	}
	for _, g := range gs {
		if g == sc.ref {
			continue
		}
		s, _ := c.overviewOf(sc, g)
		out = append(out, s...)
	}
	return out
}

func (c *composer) overviewOf(sc *scope, g *figures.Group) ([]Sentence, *OverviewFact) {
	if g == nil {
		return nil, nil
	}
	ps := c.placements(sc, g)
	if len(ps) == 0 {
		return nil, nil
	}
	f, named, cites, claims := c.quarters(g, ps)
	f.Seed, f.Focus, f.Group, f.named = g.Name, c.focus, c.phrase(g), named
	s := c.say("", c.w.Overview(f), cites...).claim(claims...)
	s.Thresholds = listCounts(f.MoreTop, f.MoreBottom)
	if f.Small {
		s.Thresholds = append(s.Thresholds, float64(c.floor()))
	}
	out := []Sentence{s}
	if g == sc.ref {
		out = append(out, c.leftOut(sc, g)...)
	}
	return out, &f
}

// leftOut says which judged indicators of the scope the overview could
// not place because the focus reports no value for the year, so a
// summary never passes over them in silence (claim: has_value = 0 each).
func (c *composer) leftOut(sc *scope, g *figures.Group) []Sentence {
	var names []string
	var cites []figures.Key
	var claims []Claim
	for _, ind := range sc.inds {
		if !judged(ind) {
			continue
		}
		p, ok := c.m.Position(g.Name, ind.Key, c.m.Focus, sc.year)
		if !ok || p.HasValue {
			continue
		}
		k := posKey(g.Name, ind.Key, c.m.FocusID, sc.year, "has_value")
		names = append(names, c.w.Indicator(ind))
		cites = append(cites, k)
		claims = append(claims, Claimed(Fig(k), OpEqual, Num(0)))
	}
	if len(names) == 0 {
		return nil
	}
	f := MissingFact{Seed: g.Name, Focus: c.focus, Indicator: c.w.List(names), Year: printYear(sc.year)}
	return []Sentence{c.say("", c.w.LeftOut(f), cites...).claim(claims...)}
}

// strengthsAndRisks names the indicators furthest above and below the
// middle of the reference group, ranked by percentile gap (percentile
// minus 50: how far the focus is from the group's middle in the better
// direction). An indicator whose percentile prints as 50 is neither.
//
// ov is the overview sentence just before (nil when there is none): the
// indicators it named are not named again, and the rest above and below
// the middle go into one sentence that adds to it (Wording.AboveBelow).
func (c *composer) strengthsAndRisks(sc *scope, ov *OverviewFact) []Sentence {
	g := sc.ref
	if g == nil {
		return nil
	}
	up, down := c.rankedLists(sc, g)
	if ov != nil {
		up, down = without(up, ov.named), without(down, ov.named)
		if len(up)+len(down) == 0 {
			return nil
		}
		// These lists read as complete, so what SummaryItems leaves out
		// is counted ("and two other indicators").
		var fu, fd RankedFact
		var cites []figures.Key
		if len(up) > 0 {
			var k []figures.Key
			fu, k = c.ranked(g, up)
			fu.Also, fu.More = len(ov.Top) > 0, len(up)-len(fu.Items)
			cites = append(cites, k...)
		}
		if len(down) > 0 {
			var k []figures.Key
			fd, k = c.ranked(g, down)
			fd.Also, fd.More = len(ov.Bottom) > 0, len(down)-len(fd.Items)
			cites = append(cites, k...)
		}
		s := c.say("", c.w.AboveBelow(fu, fd), cites...).claim(append(c.rankedClaims(g, up, true), c.rankedClaims(g, down, false)...)...)
		s.Thresholds = listCounts(fu.More, fd.More)
		return []Sentence{s}
	}
	var out []Sentence
	if len(up) > 0 {
		f, cites := c.ranked(g, up)
		out = append(out, c.say("", c.w.Strengths(f), cites...).claim(c.rankedClaims(g, up[:len(f.Items)], true)...))
	}
	if len(down) > 0 {
		f, cites := c.ranked(g, down)
		out = append(out, c.say("", c.w.Risks(f), cites...).claim(c.rankedClaims(g, down[:len(f.Items)], false)...))
	}
	return out
}

// listCounts declares the counts of indicators a cut list leaves out
// ("and 12 other indicators") for Verify: they count the sentence's own
// list, not a figure of the model. Counts under ten are written in words.
func listCounts(ns ...int) []float64 {
	var out []float64
	for _, n := range ns {
		if n >= 10 {
			out = append(out, float64(n))
		}
	}
	return out
}

func without(xs []placed, named map[string]bool) []placed {
	var out []placed
	for _, x := range xs {
		if !named[x.ind.Key] {
			out = append(out, x)
		}
	}
	return out
}

// rankedLists orders the judged indicators above the middle of the group
// (best first) and below it (worst first).
func (c *composer) rankedLists(sc *scope, g *figures.Group) (up, down []placed) {
	ps := c.placements(sc, g)
	for _, x := range ps {
		switch r := math.Round(x.p.Percentile); {
		case r > 50:
			up = append(up, x)
		case r < 50:
			down = append(down, x)
		}
	}
	// Stable sorts keep dictionary order among equal gaps.
	sort.SliceStable(up, func(i, j int) bool { return up[i].p.Percentile > up[j].p.Percentile })
	sort.SliceStable(down, func(i, j int) bool { return down[i].p.Percentile < down[j].p.Percentile })
	return up, down
}

// riskGaps says what it would take to reach the top quarter on the
// summary's risks.
//
// groupNamed says an earlier sentence of the paragraph has named the
// group, so the gaps need not.
func (c *composer) riskGaps(sc *scope, groupNamed bool) []Sentence {
	if sc.ref == nil {
		return nil
	}
	_, down := c.rankedLists(sc, sc.ref)
	if len(down) > SummaryItems {
		down = down[:SummaryItems]
	}
	var facts []GapFact
	var cites []figures.Key
	var claims []Claim
	about := ""
	for _, x := range down {
		if f, k, ok := c.gapFact(sc.ref, x.ind, sc.year); ok {
			facts = append(facts, f)
			about = x.ind.Key
			cites = append(cites, k...)
			claims = append(claims, c.gapClaims(sc.ref, x.ind, sc.year)...)
		}
	}
	if len(facts) == 0 {
		return nil
	}
	if len(facts) > 1 {
		about = ""
	}
	// Even one gap goes through GapList: in a summary there is no run-in
	// heading to name the indicator, so the sentence must.
	facts[0].GroupNamed = groupNamed
	return []Sentence{c.say(about, c.w.GapList(facts), cites...).claim(claims...)}
}

// rankedClaims: every indicator of an above-the-middle list (up) has a
// percentile over 50, every one of a below list under 50, whether named
// or counted ("and two other indicators").
func (c *composer) rankedClaims(g *figures.Group, xs []placed, up bool) []Claim {
	op := OpLess
	if up {
		op = OpGreater
	}
	var out []Claim
	for _, x := range xs {
		out = append(out, Claimed(Fig(posKey(g.Name, x.ind.Key, c.m.FocusID, x.p.Year, mPercentile)), op, Num(50)))
	}
	return out
}

func (c *composer) ranked(g *figures.Group, xs []placed) (RankedFact, []figures.Key) {
	if len(xs) > SummaryItems {
		xs = xs[:SummaryItems]
	}
	f := RankedFact{Focus: c.focus, Group: c.phrase(g)}
	var cites []figures.Key
	for _, x := range xs {
		f.Seed += x.ind.Key
		if c.small(x.d) {
			// Below the floor: the rank "of n", never a percentile.
			f.Items = append(f.Items, RankedItem{Indicator: c.w.Indicator(x.ind), Rank: format.Ordinal(x.p.Rank) + " of " + printCount(x.p.Of), Value: printValue(x.ind, x.p.Value)})
			cites = append(cites, posKey(g.Name, x.ind.Key, c.m.FocusID, x.p.Year, mRank), posKey(g.Name, x.ind.Key, c.m.FocusID, x.p.Year, mOf))
			continue
		}
		f.Items = append(f.Items, RankedItem{Indicator: c.w.Indicator(x.ind), Percentile: printOrdinalPct(x.p.Percentile), Value: printValue(x.ind, x.p.Value)})
		cites = append(cites, posKey(g.Name, x.ind.Key, c.m.FocusID, x.p.Year, mPercentile))
	}
	return f, cites
}

// headline names the judged indicator whose percentile in the reference
// group moved most over the span, when that movement is at least the
// noise rule. It records one claim per other indicator compared (its
// percentile_move at most the headline's), so "the largest movement"
// holds over every indicator it was weighed against; only trends over
// their own years, which have a percentile_move figure, are weighed.
//
// groupNamed says an earlier sentence of the paragraph has named the group.
func (c *composer) headline(sc *scope, groupNamed bool) []Sentence {
	g := sc.ref
	if g == nil {
		return nil
	}
	best, bestMove := changeData{}, -1.0
	var bestInd dataset.Indicator
	var weighed []dataset.Indicator
	for _, ind := range sc.inds {
		if !judged(ind) {
			continue
		}
		cd, ok := c.changeData(sc, g, ind)
		if !ok || !cd.hasPct || !cd.useTrend || math.IsNaN(cd.t.PercentileMove) || c.small(cd.d0) || c.small(cd.d1) {
			continue
		}
		weighed = append(weighed, ind)
		if cd.t.PercentileMove > bestMove {
			best, bestMove, bestInd = cd, cd.t.PercentileMove, ind
		}
	}
	if bestMove < c.noise() || best.f.PctDirection == Level {
		return nil
	}
	id := c.m.FocusID
	best.f.GroupNamed = groupNamed
	mk := func(ind dataset.Indicator) Operand { return Fig(trendKey(g.Name, ind.Key, id, "percentile_move")) }
	claims := []Claim{Claimed(mk(bestInd), OpGreaterEq, Num(c.noise()))}
	for _, ind := range weighed {
		if ind.Key != bestInd.Key {
			claims = append(claims, Claimed(mk(bestInd), OpGreaterEq, mk(ind)))
		}
	}
	claims = append(claims, c.percentileChangeClaims(g, bestInd, best)...)
	return append([]Sentence{c.say(bestInd.Key, c.w.Headline(best.f),
		posKey(g.Name, bestInd.Key, id, best.p0.Year, mPercentile), posKey(g.Name, bestInd.Key, id, best.p1.Year, mPercentile)).claim(claims...)},
		c.oneYear(g, bestInd, true)...)
}
