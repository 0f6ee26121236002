package narrative

import (
	"math"

	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
)

// changeFacts gathers the focus's movement in a group between the two
// years of the scope (or, without block years, over the trend's own span:
// from the first to the last year of the brief's span with a value). ok
// is false when either end has no value.
type changeData struct {
	f      ChangeFact
	p0, p1 *figures.Position
	d0, d1 *figures.Distribution
	t      *figures.Trend
	// useTrend: the years are the trend's, so its change can be cited.
	useTrend bool
	hasPct   bool
	hasMed   bool
}

func (c *composer) changeData(sc *scope, g *figures.Group, ind dataset.Indicator) (changeData, bool) {
	var cd changeData
	t, ok := c.m.Trend(g.Name, ind.Key, c.m.Focus)
	if !ok {
		return cd, false
	}
	y0, y1 := sc.first, sc.last
	if y0 == 0 {
		if !t.Valid {
			return cd, false
		}
		y0, y1 = t.StartYear, t.EndYear
	}
	if y0 == y1 {
		return cd, false
	}
	p0, ok0 := c.m.Position(g.Name, ind.Key, c.m.Focus, y0)
	p1, ok1 := c.m.Position(g.Name, ind.Key, c.m.Focus, y1)
	d0, okd0 := c.m.Distribution(g.Name, ind.Key, y0)
	d1, okd1 := c.m.Distribution(g.Name, ind.Key, y1)
	if !ok0 || !ok1 || !okd0 || !okd1 || !p0.HasValue || !p1.HasValue {
		return cd, false
	}
	cd.p0, cd.p1, cd.d0, cd.d1, cd.t = p0, p1, d0, d1, t
	cd.useTrend = t.Valid && t.StartYear == y0 && t.EndYear == y1
	iqr := math.NaN()
	if d1.N >= 2 {
		iqr = d1.IQR
	}
	change := p1.Value - p0.Value
	f := ChangeFact{
		Seed:      trendKey(g.Name, ind.Key, c.m.FocusID, "").String() + printYear(y0),
		Focus:     c.focus,
		Indicator: c.w.Indicator(ind),
		Group:     c.phrase(g),
		Better:    ind.Better,
		FromYear:  printYear(y0),
		ToYear:    printYear(y1),
		From:      printValue(ind, p0.Value),
		To:        printValue(ind, p1.Value),
		Direction: direction(ind, change, iqr),
	}
	if f.Direction == Level && format.Round(change, ind.Decimals) != 0 {
		f.NoiseIQR = printAmount(ind, iqr)
	}
	if cd.useTrend && f.Direction != Level && gapAgrees(ind, p1.Value, p0.Value, t.Change) {
		f.Diff = printAmount(ind, t.Change)
	}
	if d0.N > 0 && d1.N > 0 {
		cd.hasMed = true
		f.MedianFrom, f.MedianTo = printValue(ind, d0.Median), printValue(ind, d1.Median)
		f.MedianDirection = direction(ind, d1.Median-d0.Median, iqr)
	}
	if p0.Rank > 0 && p1.Rank > 0 {
		cd.hasPct = true
		f.PctFrom, f.PctTo = printOrdinalPct(p0.Percentile), printOrdinalPct(p1.Percentile)
		a, b := math.Round(p0.Percentile), math.Round(p1.Percentile)
		switch {
		case b-a >= PercentileNoise:
			f.PctDirection = Above
		case a-b >= PercentileNoise:
			f.PctDirection = Below
		}
		f.Resized = figures.SizeChanged(p0.Of, p1.Of)
		if cd.useTrend {
			f.Resized = t.PreferPercentiles
		}
		f.SizeFrom, f.SizeTo = printCount(d0.N), printCount(d1.N)
		f.Shrank = d1.N < d0.N
	}
	cd.f = f
	return cd, true
}

// noChange says why no change is written when the focus has a value in
// the reporting year but not at the start of the block's years, or in no
// earlier year of the span.
func (c *composer) noChange(sc *scope, g *figures.Group, ind dataset.Indicator) []Sentence {
	p1, ok := c.m.Position(g.Name, ind.Key, c.m.Focus, sc.year)
	if !ok || !p1.HasValue || c.m.First == c.m.Last {
		return nil
	}
	y0 := sc.first
	if y0 == 0 {
		y0 = c.m.First
	}
	if y0 >= sc.year {
		return nil
	}
	p0, ok := c.m.Position(g.Name, ind.Key, c.m.Focus, y0)
	if !ok || p0.HasValue {
		return nil
	}
	f := MissingFact{Seed: ind.Key, Focus: c.focus, Indicator: c.w.Indicator(ind), Group: c.phrase(g), Year: printYear(y0)}
	return []Sentence{c.say(ind.Key, c.w.ChangeMissing(f), posKey(g.Name, ind.Key, c.m.FocusID, y0, "has_value"))}
}

// change writes the focus's movement, the group median's movement and,
// when the group's size changed a lot, the comparison by percentile.
func (c *composer) change(sc *scope, g *figures.Group, ind dataset.Indicator) []Sentence {
	cd, ok := c.changeData(sc, g, ind)
	if !ok {
		return c.noChange(sc, g, ind)
	}
	f, id := cd.f, c.m.FocusID
	p0k := func(m string) figures.Key { return posKey(g.Name, ind.Key, id, cd.p0.Year, m) }
	p1k := func(m string) figures.Key { return posKey(g.Name, ind.Key, id, cd.p1.Year, m) }
	cites := []figures.Key{p0k(mValue), p1k(mValue)}
	if f.Diff != "" {
		cites = append(cites, trendKey(g.Name, ind.Key, id, mChange))
	}
	if f.NoiseIQR != "" {
		cites = append(cites, distKey(g.Name, ind.Key, cd.d1.Year, mIQR))
	}
	f.Seed, f.Turn = c.next("change")
	out := []Sentence{c.say(ind.Key, c.w.Change(f), cites...)}
	if !cd.hasMed || cd.d1.N < 2 {
		return out
	}
	mf := f
	mf.Seed, mf.Turn = c.next("change-median")
	if !cd.hasPct {
		mf.PctFrom, mf.PctTo = "", ""
	}
	mc := []figures.Key{distKey(g.Name, ind.Key, cd.d0.Year, mMedian), distKey(g.Name, ind.Key, cd.d1.Year, mMedian)}
	if cd.hasPct && !f.Resized {
		mc = append(mc, p0k(mPercentile), p1k(mPercentile))
	}
	out = append(out, c.say(ind.Key, c.w.ChangeMedian(mf), mc...))
	if cd.hasPct && f.Resized {
		out = append(out, c.say(ind.Key, c.w.ChangePercentile(f),
			distKey(g.Name, ind.Key, cd.d0.Year, mN), distKey(g.Name, ind.Key, cd.d1.Year, mN),
			p0k(mPercentile), p1k(mPercentile)))
	}
	return out
}
