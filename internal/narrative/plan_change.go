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
	// asked is the first year the block asked for when the change starts
	// later, at the first year with figures (f.Later).
	asked  int
	hasPct bool
	hasMed bool
}

func (c *composer) changeData(sc *scope, g *figures.Group, ind dataset.Indicator) (changeData, bool) {
	var cd changeData
	t, ok := c.m.Trend(g.Name, ind.Key, c.m.Focus)
	if !ok {
		return cd, false
	}
	y0, y1 := sc.first, sc.last
	later := false
	if y0 == 0 {
		if !t.Valid {
			return cd, false
		}
		y0, y1 = t.StartYear, t.EndYear
	} else {
		cd.asked = y0
		y0, later = c.seriesStart(g, ind, y0, y1)
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
		EndsEarly: y1 < c.m.Year,
		Later:     later,
		From:      printValue(ind, p0.Value),
		To:        printValue(ind, p1.Value),
		Direction: direction(ind, change, iqr),
	}
	if f.Direction == Level && format.Round(change, ind.Decimals) != 0 {
		f.NoiseIQR = printAmount(ind, iqr)
	}
	// Two values that print alike did not rise or fall as far as the
	// reader can see ("risen from 2.7% to 2.7%"): the change is less than
	// one unit of the last decimal, and the sentence says so.
	if f.Direction != Level && f.From == f.To {
		f.Direction = Level
	}
	if cd.useTrend && f.Direction != Level && gapAgrees(ind, p1.Value, p0.Value, t.Change) {
		f.Diff = printAmount(ind, t.Change)
	}
	if d0.N > 0 && d1.N > 0 {
		cd.hasMed = true
		f.MedianFrom, f.MedianTo = printValue(ind, d0.Median), printValue(ind, d1.Median)
		f.MedianDirection = direction(ind, d1.Median-d0.Median, iqr)
		if f.MedianFrom == f.MedianTo {
			f.MedianDirection = Level
		}
	}
	// Below the small-group floor at either end no percentile is printed.
	if p0.Rank > 0 && p1.Rank > 0 && !c.small(d0) && !c.small(d1) {
		cd.hasPct = true
		f.Percentiles = true
		f.PctFrom, f.PctTo = printOrdinalPct(p0.Percentile), printOrdinalPct(p1.Percentile)
		// The noise rule on the percentiles themselves, not their
		// rounded forms, so the claim recorded is the one decided on.
		switch move := p1.Percentile - p0.Percentile; {
		case move >= c.noise():
			f.PctDirection = Above
		case -move >= c.noise():
			f.PctDirection = Below
		}
	}
	if p0.Rank > 0 && p1.Rank > 0 {
		c.resized(&cd, &f)
	}
	cd.f = f
	return cd, true
}

// resized decides whether the group's size changed too much between the
// two years for ranks to compare (figures.SizeChanged; over the trend's
// own years the trend's prefer_percentiles), and then fills in the
// constant panel: the focus's ranks among the members reporting in both
// years, which the trend records over its own years. A size that prints
// the same at both ends is not called a change.
func (c *composer) resized(cd *changeData, f *ChangeFact) {
	d0, d1, t := cd.d0, cd.d1, cd.t
	f.Resized = figures.SizeChanged(cd.p0.Of, cd.p1.Of)
	if cd.useTrend {
		f.Resized = t.PreferPercentiles
	}
	if d0.N == d1.N {
		f.Resized = false
	}
	f.SizeFrom, f.SizeTo = printCount(d0.N), printCount(d1.N)
	f.Shrank = d1.N < d0.N
	if !f.Resized || !cd.useTrend || t.PanelOf == 0 {
		return
	}
	_, _, b0 := format.RankBand(t.PanelStartRank, c.b.RankBands)
	_, _, b1 := format.RankBand(t.PanelEndRank, c.b.RankBands)
	if b0 || b1 {
		return // banded ranks do not compare place by place
	}
	f.PanelOf = printCount(t.PanelOf)
	f.PanelFrom, f.PanelTo = format.Ordinal(t.PanelStartRank), format.Ordinal(t.PanelEndRank)
	f.PanelMember = cd.p0.InGroup && cd.p1.InGroup
	switch {
	case t.PanelRankChange > 0:
		f.PanelDirection = Above
	case t.PanelRankChange < 0:
		f.PanelDirection = Below
	}
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
	y0, _ = c.seriesStart(g, ind, y0, sc.year)
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

// seriesStart moves the start of a change forward to the first year, up
// to y1, in which any member of the group has a value: an indicator that
// starts later than the block's years (one computed over windows of
// several years, first available at the end of the first window, or one
// first collected later) has no series before then, which is not a value
// the focus failed to report. later tells whether the start moved.
func (c *composer) seriesStart(g *figures.Group, ind dataset.Indicator, y0, y1 int) (int, bool) {
	for y := y0; y < y1; y++ {
		if d, ok := c.m.Distribution(g.Name, ind.Key, y); ok && d.N > 0 {
			return y, y != y0
		}
	}
	return y0, false
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
	claims := c.valueChangeClaims(g, ind, cd)
	if f.Later {
		// "the first year with figures": no member has a value in any
		// year asked for before it.
		for y := cd.asked; y < cd.p0.Year; y++ {
			if _, ok := c.m.Distribution(g.Name, ind.Key, y); ok {
				claims = append(claims, Claimed(Fig(distKey(g.Name, ind.Key, y, mN)), OpEqual, Num(0)))
			}
		}
	}
	out := []Sentence{c.say(ind.Key, c.w.Change(f), cites...).claim(claims...)}
	if cd.useTrend && f.Direction != Level {
		out = append(out, c.oneYear(g, ind, false)...)
	}
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
	mcl := medianChangeClaims(ind, Fig(distKey(g.Name, ind.Key, cd.d0.Year, mMedian)), Fig(distKey(g.Name, ind.Key, cd.d1.Year, mMedian)), mf.MedianDirection)
	if mf.MedianDirection == Level && mf.MedianFrom != mf.MedianTo {
		// "broadly unchanged" over two medians that print apart: the
		// movement was under the noise share of the last year's spread,
		// claimed on the group trend's own figure when the sentence spans
		// the trend's years (withinNoise divides as that figure does).
		if gt, ok := c.m.GroupTrend(g.Name, ind.Key); ok && gt.Valid && gt.StartYear == cd.d0.Year && gt.EndYear == cd.d1.Year && !math.IsNaN(gt.ChangePerIQR) {
			k := trendKey(g.Name, ind.Key, "", "median_change_per_iqr")
			mc = append(mc, k)
			mcl = append(mcl, Claimed(Fig(k), OpLess, Num(NoiseIQRShare)))
		}
	}
	if mf.MedianFrom == mf.MedianTo {
		// "stayed at 3.6%": both medians lie within half a unit of the
		// last printed decimal of the one value printed (widened by a
		// hair, as 3.6 - 0.05 is not exactly 3.55 in binary).
		p := format.Round(cd.d1.Median, ind.Decimals)
		h := 0.5 * math.Pow(10, -float64(ind.Decimals)) * (1 + 1e-9)
		for _, m := range []Operand{Fig(distKey(g.Name, ind.Key, cd.d0.Year, mMedian)), Fig(distKey(g.Name, ind.Key, cd.d1.Year, mMedian))} {
			mcl = append(mcl, Claimed(m, OpGreaterEq, Num(p-h)), Claimed(m, OpLessEq, Num(p+h)))
		}
	}
	if cd.hasPct && !f.Resized {
		mcl = append(mcl, c.percentileChangeClaims(g, ind, cd)...)
	}
	out = append(out, c.say(ind.Key, c.w.ChangeMedian(mf), mc...).claim(mcl...))
	if s, ok := c.resizedSentence(g, ind, cd); ok {
		out = append(out, s)
	}
	return out
}

// resizedSentence: when the group's size changed a lot, the standing is
// compared by percentile and within the constant panel, never by raw
// rank. Claims: the size grew or fell (the two years' n), the trend's
// prefer_percentiles rule where its years are the sentence's, the
// percentile's movement by the noise rule, and the panel rank's
// direction.
func (c *composer) resizedSentence(g *figures.Group, ind dataset.Indicator, cd changeData) (Sentence, bool) {
	f, id := cd.f, c.m.FocusID
	if !f.Resized || !cd.hasPct && f.PanelOf == "" {
		return Sentence{}, false
	}
	n0, n1 := distKey(g.Name, ind.Key, cd.d0.Year, mN), distKey(g.Name, ind.Key, cd.d1.Year, mN)
	cites := []figures.Key{n0, n1}
	claims := []Claim{Claimed(Fig(n1), OpGreater, Fig(n0))}
	if f.Shrank {
		claims[0] = Claimed(Fig(n1), OpLess, Fig(n0))
	}
	tk := func(m string) figures.Key { return trendKey(g.Name, ind.Key, id, m) }
	if cd.useTrend {
		claims = append(claims, Claimed(Fig(tk("prefer_percentiles")), OpEqual, Num(1)))
	}
	if cd.hasPct {
		cites = append(cites, posKey(g.Name, ind.Key, id, cd.p0.Year, mPercentile), posKey(g.Name, ind.Key, id, cd.p1.Year, mPercentile))
		claims = append(claims, c.percentileChangeClaims(g, ind, cd)...)
	}
	if f.PanelOf != "" {
		from, to := Fig(tk("panel_start_rank")), Fig(tk("panel_end_rank"))
		cites = append(cites, tk("panel_of"), tk("panel_start_rank"), tk("panel_end_rank"))
		switch f.PanelDirection {
		case Above:
			claims = append(claims, Claimed(to, OpLess, from))
		case Below:
			claims = append(claims, Claimed(to, OpGreater, from))
		default:
			claims = append(claims, Claimed(to, OpEqual, from))
		}
	}
	f.Seed, f.Turn = c.next("change-resized")
	return c.say(ind.Key, c.w.ChangePercentile(f), cites...).claim(claims...), true
}

// valueChangeClaims: a rise or fall compares the two values; "broadly
// unchanged" says the change prints as zero (less than one unit of the
// last decimal either way) or is under NoiseIQRShare of the group's
// interquartile range (the trend's change_per_iqr), which can be checked
// only over the trend's own years.
func (c *composer) valueChangeClaims(g *figures.Group, ind dataset.Indicator, cd changeData) []Claim {
	id := c.m.FocusID
	v0 := Fig(posKey(g.Name, ind.Key, id, cd.p0.Year, mValue))
	v1 := Fig(posKey(g.Name, ind.Key, id, cd.p1.Year, mValue))
	switch cd.f.Direction {
	case Above:
		return []Claim{Claimed(v1, OpGreater, v0)}
	case Below:
		return []Claim{Claimed(v1, OpLess, v0)}
	}
	if !cd.useTrend {
		return nil
	}
	ch := Fig(trendKey(g.Name, ind.Key, id, mChange))
	if format.Round(cd.t.Change, ind.Decimals) == 0 || cd.f.From == cd.f.To {
		// Values that round alike differ by less than one unit of the
		// last decimal.
		return levelClaims(ind, ch)
	}
	return []Claim{Claimed(Fig(trendKey(g.Name, ind.Key, id, "change_per_iqr")), OpLess, Num(NoiseIQRShare))}
}

// medianChangeClaims: the median rose or fell, compared figure with
// figure; a level median is not claimed (its noise test needs the
// median's own change per IQR, which the model does not record).
func medianChangeClaims(ind dataset.Indicator, m0, m1 Operand, dir int) []Claim {
	switch dir {
	case Above:
		return []Claim{Claimed(m1, OpGreater, m0)}
	case Below:
		return []Claim{Claimed(m1, OpLess, m0)}
	}
	return nil
}

// percentileChangeClaims: gaining or losing ground means the percentile
// moved by at least the noise rule; "barely moved" that it moved by less.
// Over the trend's own years the trend's percentile_change is cited;
// over a block's years only the direction can be checked figure against
// figure.
func (c *composer) percentileChangeClaims(g *figures.Group, ind dataset.Indicator, cd changeData) []Claim {
	id := c.m.FocusID
	pc := Fig(trendKey(g.Name, ind.Key, id, mPercentileChange))
	p0 := Fig(posKey(g.Name, ind.Key, id, cd.p0.Year, mPercentile))
	p1 := Fig(posKey(g.Name, ind.Key, id, cd.p1.Year, mPercentile))
	n := c.noise()
	switch {
	case cd.useTrend && cd.f.PctDirection == Above:
		return []Claim{Claimed(pc, OpGreaterEq, Num(n))}
	case cd.useTrend && cd.f.PctDirection == Below:
		return []Claim{Claimed(pc, OpLessEq, Num(-n))}
	case cd.useTrend:
		return []Claim{Claimed(pc, OpGreater, Num(-n)), Claimed(pc, OpLess, Num(n))}
	case cd.f.PctDirection == Above:
		return []Claim{Claimed(p1, OpGreater, p0)}
	case cd.f.PctDirection == Below:
		return []Claim{Claimed(p1, OpLess, p0)}
	}
	return nil
}
