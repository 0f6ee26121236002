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

// quarters lists the indicators in the best and the worst quarter.
func (c *composer) quarters(g *figures.Group, ps []placed) (top, bottom []string, cites []figures.Key) {
	for _, x := range ps {
		switch x.p.Quartile {
		case 1:
			top = append(top, c.w.Indicator(x.ind))
		case 4:
			bottom = append(bottom, c.w.Indicator(x.ind))
		default:
			continue
		}
		cites = append(cites, posKey(g.Name, x.ind.Key, c.m.FocusID, x.p.Year, mQuartile))
	}
	return top, bottom, cites
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
	top, bottom, cites := c.quarters(g, ps)
	f := OverviewFact{Seed: g.Name, Focus: c.focus, Group: g.Name, Top: top, Bottom: bottom}
	return []Sentence{c.say("", c.w.Overview(f), cites...)}
}

// strengthsAndRisks names the indicators furthest above and below the
// middle of the reference group, ranked by percentile gap (percentile
// minus 50: how far the focus is from the group's middle in the better
// direction). An indicator whose percentile prints as 50 is neither.
func (c *composer) strengthsAndRisks(sc *scope) []Sentence {
	g := sc.ref
	if g == nil {
		return nil
	}
	ps := c.placements(sc, g)
	var up, down []placed
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
	var out []Sentence
	if len(up) > 0 {
		f, cites := c.ranked(g, up)
		out = append(out, c.say("", c.w.Strengths(f), cites...))
	}
	if len(down) > 0 {
		f, cites := c.ranked(g, down)
		out = append(out, c.say("", c.w.Risks(f), cites...))
	}
	return out
}

func (c *composer) ranked(g *figures.Group, xs []placed) (RankedFact, []figures.Key) {
	if len(xs) > SummaryItems {
		xs = xs[:SummaryItems]
	}
	f := RankedFact{Focus: c.focus, Group: g.Name}
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
