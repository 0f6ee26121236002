package narrative

import (
	"math"
	"sort"

	"peerpack/internal/dataset"
	"peerpack/internal/figures"
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

// quarters lists the indicators in the best and the worst quarter, the
// most extreme first, at most OverviewItems of each; more reports a list
// that was cut.
func (c *composer) quarters(g *figures.Group, ps []placed) (top, bottom []string, moreTop, moreBottom bool, cites []figures.Key) {
	var hi, lo []placed
	for _, x := range ps {
		switch x.p.Quartile {
		case 1:
			hi = append(hi, x)
		case 4:
			lo = append(lo, x)
		}
	}
	sort.SliceStable(hi, func(i, j int) bool { return hi[i].p.Percentile > hi[j].p.Percentile })
	sort.SliceStable(lo, func(i, j int) bool { return lo[i].p.Percentile < lo[j].p.Percentile })
	if len(hi) > OverviewItems {
		hi, moreTop = hi[:OverviewItems], true
	}
	if len(lo) > OverviewItems {
		lo, moreBottom = lo[:OverviewItems], true
	}
	for _, x := range hi {
		top = append(top, c.w.Indicator(x.ind))
		cites = append(cites, posKey(g.Name, x.ind.Key, c.m.FocusID, x.p.Year, mQuartile))
	}
	for _, x := range lo {
		bottom = append(bottom, c.w.Indicator(x.ind))
		cites = append(cites, posKey(g.Name, x.ind.Key, c.m.FocusID, x.p.Year, mQuartile))
	}
	return top, bottom, moreTop, moreBottom, cites
}

// overview says, within the reference group, which indicators are in the
// top and bottom quarters.
func (c *composer) overview(sc *scope) []Sentence {
	g := sc.ref
	if g == nil {
		return nil
	}
	ps := c.placements(sc, g)
	if len(ps) == 0 {
		return nil
	}
	top, bottom, moreTop, moreBottom, cites := c.quarters(g, ps)
	f := OverviewFact{Seed: g.Name, Focus: c.focus, Group: c.phrase(g), Top: top, Bottom: bottom, MoreTop: moreTop, MoreBottom: moreBottom}
	return []Sentence{c.say("", c.w.Overview(f), cites...)}
}

// strengthsAndRisks names the indicators furthest above and below the
// middle of the reference group, ranked by percentile gap (percentile
// minus 50: how far the focus is from the group's middle in the better
// direction). An indicator whose percentile prints as 50 is neither.
//
// afterOverview says the overview sentence, which names the group, comes
// just before: the strengths then do not name it again.
func (c *composer) strengthsAndRisks(sc *scope, afterOverview bool) []Sentence {
	g := sc.ref
	if g == nil {
		return nil
	}
	up, down := c.rankedLists(sc, g)
	var out []Sentence
	if len(up) > 0 {
		f, cites := c.ranked(g, up)
		f.GroupNamed = afterOverview
		out = append(out, c.say("", c.w.Strengths(f), cites...))
	}
	if len(down) > 0 {
		f, cites := c.ranked(g, down)
		out = append(out, c.say("", c.w.Risks(f), cites...))
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
func (c *composer) riskGaps(sc *scope) []Sentence {
	if sc.ref == nil {
		return nil
	}
	_, down := c.rankedLists(sc, sc.ref)
	if len(down) > SummaryItems {
		down = down[:SummaryItems]
	}
	var facts []GapFact
	var about []string
	var cites []figures.Key
	for _, x := range down {
		if f, k, ok := c.gapFact(sc.ref, x.ind, sc.year); ok {
			facts = append(facts, f)
			about = append(about, x.ind.Key)
			cites = append(cites, k...)
		}
	}
	switch len(facts) {
	case 0:
		return nil
	case 1:
		return []Sentence{c.say(about[0], c.w.Gap(facts[0]), cites...)}
	}
	return []Sentence{c.say("", c.w.GapList(facts), cites...)}
}

func (c *composer) ranked(g *figures.Group, xs []placed) (RankedFact, []figures.Key) {
	if len(xs) > SummaryItems {
		xs = xs[:SummaryItems]
	}
	f := RankedFact{Focus: c.focus, Group: c.phrase(g)}
	var cites []figures.Key
	for _, x := range xs {
		f.Seed += x.ind.Key
		f.Items = append(f.Items, RankedItem{Indicator: c.w.Indicator(x.ind), Percentile: printOrdinalPct(x.p.Percentile), Value: printValue(x.ind, x.p.Value)})
		cites = append(cites, posKey(g.Name, x.ind.Key, c.m.FocusID, x.p.Year, mPercentile))
	}
	return f, cites
}

// headline names the judged indicator whose percentile in the reference
// group moved most over the span.
func (c *composer) headline(sc *scope) []Sentence {
	g := sc.ref
	if g == nil {
		return nil
	}
	best, bestMove := changeData{}, 0.0
	var bestInd dataset.Indicator
	for _, ind := range sc.inds {
		if !judged(ind) {
			continue
		}
		cd, ok := c.changeData(sc, g, ind)
		if !ok || !cd.hasPct || cd.f.PctDirection == Level {
			continue
		}
		move := math.Abs(math.Round(cd.p1.Percentile) - math.Round(cd.p0.Percentile))
		if move > bestMove {
			best, bestMove, bestInd = cd, move, ind
		}
	}
	if bestMove == 0 {
		return nil
	}
	id := c.m.FocusID
	return []Sentence{c.say(bestInd.Key, c.w.Headline(best.f),
		posKey(g.Name, bestInd.Key, id, best.p0.Year, mPercentile), posKey(g.Name, bestInd.Key, id, best.p1.Year, mPercentile))}
}
