package narrative

import (
	"math"

	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
)

// allMissing reports whether no group of the scope has a value of the
// indicator in the year.
func (c *composer) allMissing(sc *scope, ind dataset.Indicator) bool {
	for _, gs := range [][]*figures.Group{sc.groups, sc.systems} {
		for _, g := range gs {
			if d, ok := c.m.Distribution(g.Name, ind.Key, sc.year); ok && d.N > 0 {
				return false
			}
		}
	}
	return true
}

// allMissingSentence says that nobody reports the indicator.
func (c *composer) allMissingSentence(sc *scope, ind dataset.Indicator) Sentence {
	var cites []figures.Key
	for _, g := range sc.groups {
		cites = append(cites, distKey(g.Name, ind.Key, sc.year, mN))
	}
	f := MissingFact{Seed: ind.Key, Focus: c.focus, Indicator: c.w.Indicator(ind), Year: printYear(sc.year)}
	return c.say(ind.Key, c.w.AllMissing(f), cites...)
}

// position writes where the focus stands in a group on an indicator: one
// sentence for the rank and quartile and one for the distance to the
// median and the top-quarter threshold, or one sentence saying why there
// is no position.
func (c *composer) position(g *figures.Group, ind dataset.Indicator, year int) []Sentence {
	p, okp := c.m.Position(g.Name, ind.Key, c.m.Focus, year)
	d, okd := c.m.Distribution(g.Name, ind.Key, year)
	if !okp || !okd {
		return nil
	}
	id := c.m.FocusID
	seed := posKey(g.Name, ind.Key, id, year, "").String()
	label := c.w.Indicator(ind)
	if !p.HasValue {
		f := MissingFact{Seed: seed, Focus: c.focus, Indicator: label, Group: c.phrase(g), Year: printYear(year)}
		cites := []figures.Key{posKey(g.Name, ind.Key, id, year, "has_value")}
		if d.N > 0 {
			f.Median = printValue(ind, d.Median)
			cites = append(cites, distKey(g.Name, ind.Key, year, mMedian))
		}
		return []Sentence{c.say(ind.Key, c.w.FocusMissing(f), cites...).claim(Claimed(Fig(cites[0]), OpEqual, Num(0)))}
	}
	if d.N == 0 || p.Rank == 0 {
		f := MissingFact{Seed: seed, Focus: c.focus, Indicator: label, Group: c.phrase(g), Year: printYear(year)}
		return []Sentence{c.say(ind.Key, c.w.GroupMissing(f), distKey(g.Name, ind.Key, year, mN))}
	}
	f := c.positionFact(g, ind, p, d)
	f.Seed = seed
	if c.small(d) {
		// Below the floor: the rank "of n" only, no quarter, and no
		// quartile as a target either (the gaps name a rank to reach).
		f.Quartile = 0
		f.Target, f.GapTarget, f.TargetDiff, f.Reached, f.TargetLevel = "", "", "", false, false
	} else {
		f.Edge = c.edge(p.Percentile)
	}
	intro := c.part + "\x00" + g.Name
	f.Introduced = c.introduced[intro]
	// The brief's year is said once a part, and the value once an
	// indicator: the next group's sentence places the same value.
	f.YearSaid = c.said[c.part+"\x00year"+f.Year]
	f.ValueSaid = c.said[c.part+"\x00value\x00"+ind.Key+"\x00"+f.Year]
	f.Seed, f.Turn = c.next("position")
	if c.said[c.part+"\x00rank\x00"+g.Name+"\x00"+ind.Key] {
		return c.valueAndDistance(g, ind, p, f)
	}
	if p.InGroup && d.N == 1 {
		return []Sentence{c.say(ind.Key, c.w.Alone(f), posKey(g.Name, ind.Key, id, year, mValue), distKey(g.Name, ind.Key, year, mN)).
			claim(Claimed(Fig(distKey(g.Name, ind.Key, year, mN)), OpEqual, Num(1)))}
	}
	cites := []figures.Key{posKey(g.Name, ind.Key, id, year, mValue), posKey(g.Name, ind.Key, id, year, mRank),
		posKey(g.Name, ind.Key, id, year, mOf), posKey(g.Name, ind.Key, id, year, mQuartile)}
	if f.Joint {
		cites = append(cites, posKey(g.Name, ind.Key, id, year, mTies))
	}
	if !p.InGroup && !f.Introduced {
		cites = append(cites, distKey(g.Name, ind.Key, year, mN))
		c.introduced[intro] = true
	}
	out := []Sentence{c.say(ind.Key, c.w.Position(f), cites...).claim(c.positionClaims(g, ind, p, f)...)}
	c.said[c.part+"\x00year"+f.Year] = true
	c.said[c.part+"\x00value\x00"+ind.Key+"\x00"+f.Year] = true
	dc := []figures.Key{distKey(g.Name, ind.Key, year, mMedian)}
	if f.MedianDiff != "" {
		dc = append(dc, posKey(g.Name, ind.Key, id, year, mVsMedian))
	}
	if f.Target != "" {
		dc = append(dc, distKey(g.Name, ind.Key, year, targetMeasure(ind)))
		if f.GapTarget != "" {
			dc = append(dc, posKey(g.Name, ind.Key, id, year, mGapBetter))
		}
		if f.TargetDiff != "" {
			dc = append(dc, posKey(g.Name, ind.Key, id, year, mVsBetter))
		}
	}
	f.Seed, f.Turn = c.next("distance")
	return append(out, c.say(ind.Key, c.w.Distance(f), dc...).claim(c.distanceClaims(g, ind, p, f)...))
}

// positionClaims are the comparisons a position sentence makes: the rank
// (or its band) and the number ranked, a shared rank with how many share
// it, a first or last place, the quarter when one is printed, and
// membership.
func (c *composer) positionClaims(g *figures.Group, ind dataset.Indicator, p *figures.Position, f PositionFact) []Claim {
	k := func(m string) figures.Key { return posKey(g.Name, ind.Key, c.m.FocusID, p.Year, m) }
	var out []Claim
	if lo, hi, banded := format.RankBand(p.Rank, c.b.RankBands); banded {
		out = append(out, Claimed(Fig(k(mRank)), OpGreaterEq, Num(float64(lo))), Claimed(Fig(k(mRank)), OpLessEq, Num(float64(hi))))
	} else {
		out = append(out, Claimed(Fig(k(mRank)), OpEqual, Num(float64(p.Rank))))
	}
	out = append(out, Claimed(Fig(k(mOf)), OpEqual, Num(float64(p.Of))))
	if f.Joint {
		out = append(out, Claimed(Fig(k(mTies)), OpEqual, Num(float64(p.Ties))))
	}
	switch {
	case f.First:
		out = append(out, Claimed(Fig(k(mRank)), OpEqual, Num(1)))
	case f.Last:
		out = append(out, Claimed(Fig(k(mRank)), OpEqual, Fig(k(mOf))))
	case f.Quartile == 0:
		out = append(out, Claimed(Fig(distKey(g.Name, ind.Key, p.Year, mN)), OpLess, Num(float64(c.floor()))))
	case f.Edge != 0:
		out = append(out, c.edgeClaims(k(mPercentile), f.Edge)...)
	default:
		out = append(out, Claimed(Fig(k(mQuartile)), OpEqual, Num(float64(f.Quartile))))
		out = append(out, c.quarterClaims(ind, Fig(k(mValue)), g.Name, ind.Key, p.Year, f.Quartile)...)
	}
	if !p.InGroup {
		out = append(out, Claimed(Fig(k("in_group")), OpEqual, Num(0)))
	}
	return out
}

// distanceClaims: the value against the median (above, below, or level:
// printing the same, so less than one unit of the last printed decimal
// apart) and against the top-quarter threshold (reached or short of it).
func (c *composer) distanceClaims(g *figures.Group, ind dataset.Indicator, p *figures.Position, f PositionFact) []Claim {
	value := Fig(posKey(g.Name, ind.Key, c.m.FocusID, p.Year, mValue))
	median := Fig(distKey(g.Name, ind.Key, p.Year, mMedian))
	out := relationClaims(ind, value, median, f.VsMedian, Fig(posKey(g.Name, ind.Key, c.m.FocusID, p.Year, mVsMedian)))
	if f.Target == "" || !judged(ind) {
		return out
	}
	target := Fig(distKey(g.Name, ind.Key, p.Year, targetMeasure(ind)))
	vs := Fig(posKey(g.Name, ind.Key, c.m.FocusID, p.Year, mVsBetter))
	switch {
	case f.Reached && f.TargetLevel:
		out = append(out, levelClaims(ind, vs)...)
	case f.Reached:
		out = append(out, Claimed(vs, OpGreater, Num(0)))
	default:
		out = append(out, Claimed(vs, OpLess, Num(0)), Claimed(Fig(posKey(g.Name, ind.Key, c.m.FocusID, p.Year, mGapBetter)), OpGreater, Num(0)))
	}
	_ = target
	return out
}

// relationClaims: a value above, below or level with a reference as
// printed (rel from printedCompare); diff is the signed difference figure
// used for "level".
func relationClaims(ind dataset.Indicator, value, ref Operand, rel int, diff Operand) []Claim {
	switch rel {
	case Above:
		return []Claim{Claimed(value, OpGreater, ref)}
	case Below:
		return []Claim{Claimed(value, OpLess, ref)}
	}
	return levelClaims(ind, diff)
}

// levelClaims: two values that print the same with the indicator's
// decimals differ by less than one unit of the last decimal, so their
// difference lies strictly between minus and plus that unit.
func levelClaims(ind dataset.Indicator, diff Operand) []Claim {
	u := unitOf(ind)
	return []Claim{Claimed(diff, OpGreater, Num(-u)), Claimed(diff, OpLess, Num(u))}
}

// unitOf is one unit of the last printed decimal of an indicator (values
// printed in percent are stored in percent).
func unitOf(ind dataset.Indicator) float64 { return math.Pow(10, -float64(ind.Decimals)) }

// targetMeasure is the top-quarter threshold's measure: the upper quartile
// when higher is better, the lower quartile when lower is better.
func targetMeasure(ind dataset.Indicator) string {
	if ind.Better == dataset.LowerIsBetter {
		return mQ1
	}
	return mQ3
}

func targetValue(ind dataset.Indicator, d *figures.Distribution) float64 {
	if ind.Better == dataset.LowerIsBetter {
		return d.Q1
	}
	return d.Q3
}

// positionFact gathers and prints the figures of a position.
func (c *composer) positionFact(g *figures.Group, ind dataset.Indicator, p *figures.Position, d *figures.Distribution) PositionFact {
	f := PositionFact{
		Focus: c.focus, Indicator: c.w.Indicator(ind), Group: c.phrase(g), Better: ind.Better,
		Year: printYear(p.Year), Value: printValue(ind, p.Value), Of: printCount(p.Of),
		Quartile: p.Quartile, InGroup: p.InGroup, Members: printCount(d.N),
		Median: printValue(ind, d.Median), VsMedian: printedCompare(ind, p.Value, d.Median),
	}
	f.Rank = format.Rank(p.Rank, c.b.RankBands)
	_, _, f.Banded = format.RankBand(p.Rank, c.b.RankBands)
	f.Joint = !f.Banded && p.Ties >= 2
	if f.Joint {
		f.Others = p.Ties - 1
	}
	f.Last = !f.Banded && !f.Joint && p.Of > 2 && p.Rank == p.Of
	f.First = !f.Banded && !f.Joint && p.Of > 2 && p.Rank == 1
	f.MedianDiff = printedDistance(ind, p.Value, d.Median, p.VsMedian)
	if !judged(ind) {
		return f
	}
	if d.N >= 2 {
		t := targetValue(ind, d)
		f.Target = printValue(ind, t)
		f.Reached = !ahead(ind, t, p.Value)
		if !f.Reached && p.GapQ3 > 0 && gapAgrees(ind, t, p.Value, p.GapQ3) {
			f.GapTarget = printAmount(ind, p.GapQ3)
		}
		if f.Reached {
			f.TargetDiff = printedDistance(ind, p.Value, t, p.VsBetterQuartile)
			f.TargetLevel = printedCompare(ind, p.Value, t) == Level
		}
	}
	return f
}

// printedDistance prints the size of a signed difference between a value
// and a reference, or "" when the two print level (the sentence then says
// "level with") or when the distance would contradict the printed values
// (see gapAgrees).
func printedDistance(ind dataset.Indicator, v, ref, diff float64) string {
	if math.IsNaN(diff) || printedCompare(ind, v, ref) == Level {
		return ""
	}
	hi, lo := v, ref
	if printedCompare(ind, v, ref) == Below {
		hi, lo = ref, v
	}
	if !gapAgrees(ind, hi, lo, math.Abs(diff)) {
		return ""
	}
	return printAmount(ind, math.Abs(diff))
}

// valueAndDistance is a position whose rank a shared-rank sentence of the
// part has given (sharedRanks): the value, unless the sentence before
// gave it, then the distance to the median with the group named.
func (c *composer) valueAndDistance(g *figures.Group, ind dataset.Indicator, p *figures.Position, f PositionFact) []Sentence {
	id := c.m.FocusID
	f.RankSaid = true
	var out []Sentence
	if !f.ValueSaid {
		out = append(out, c.say(ind.Key, c.w.Position(f), posKey(g.Name, ind.Key, id, p.Year, mValue)))
		c.said[c.part+"\x00year"+f.Year] = true
		c.said[c.part+"\x00value\x00"+ind.Key+"\x00"+f.Year] = true
	}
	dc := []figures.Key{distKey(g.Name, ind.Key, p.Year, mMedian)}
	if f.MedianDiff != "" {
		dc = append(dc, posKey(g.Name, ind.Key, id, p.Year, mVsMedian))
	}
	f.Target = "" // the shared places are first or last: the median is the reference
	return append(out, c.say(ind.Key, c.w.Distance(f), dc...).claim(c.distanceClaims(g, ind, p, f)...))
}
