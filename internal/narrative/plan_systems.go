package narrative

import (
	"math"
	"sort"

	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
)

// The systems topic: sentences about the groups themselves rather than
// about the focus: how many of each group's institutions pass the
// population rules, which group's median is highest and lowest, how the
// medians moved over the span, and how weighting by size (the brief's
// size_weight) moves them. Every figure is read from the model (the
// system section of figures/systems.go, distributions and group trends),
// and every comparison is recorded as claims.

// SystemShare is one group's register and ranked counts, printed.
type SystemShare struct {
	System, Defined, Ranked, Share string
}

// SystemsCountFact: the groups' shares passing the population rules.
type SystemsCountFact struct {
	Seed string
	// Groups is how many groups the sentence compares ("six systems").
	Groups int
	// Kind names the groups in the plural ("systems", "groups").
	Kind string
	// High and Low are the groups with the largest and smallest share;
	// Rest the others, in scope order. Same is true when every share
	// prints alike.
	High, Low SystemShare
	Rest      []SystemShare
	Same      bool
	// HighLevel and LowLevel are the other groups whose share prints as
	// the largest's or the smallest's.
	HighLevel, LowLevel []SystemShare
}

// SystemMedian is one group's median (or other figure) on an indicator,
// printed.
type SystemMedian struct {
	System, Value, From string
}

// SystemsStandingFact: which group's median is highest and lowest.
type SystemsStandingFact struct {
	Seed         string
	Groups       int
	Kind         string
	High, Low    SystemMedian
	Same         bool
	NeutralWords bool
}

// SystemsMoveFact: how the groups' medians moved over the span.
type SystemsMoveFact struct {
	Seed        string
	First, Last string
	Groups      int
	Kind        string
	// Rose and Fell are the groups whose median moved beyond the noise
	// rule, the largest move first; Flat those within it; Short those
	// without a median at both ends of the span.
	Rose, Fell []SystemMedian
	Flat       []string
	Short      []string
}

// SystemsWeightFact: how weighting by size moves the groups' medians.
type SystemsWeightFact struct {
	Seed   string
	Weight string // the size indicator as it reads in a sentence
	Groups int
	Kind   string
	// Lift and Drop are the groups whose weighted median is furthest
	// above and below the plain one (Value weighted, From plain); nil when
	// none prints apart.
	Lift, Drop *SystemMedian
	// Explain adds what a weighted median describes (once a part).
	Explain bool
}

// SystemsWording is the wording of the systems topic.
type SystemsWording interface {
	SystemsHeading(which string) string
	SystemsCounts(f SystemsCountFact) string
	SystemsStanding(f SystemsStandingFact) string
	SystemsMove(f SystemsMoveFact) string
	SystemsWeight(f SystemsWeightFact) string
}

// systemsGroups are the groups the topic speaks about: the scope's
// systems (groups expanded from each), else its groups.
func systemsGroups(sc *scope) []*figures.Group {
	if len(sc.systems) > 0 {
		return sc.systems
	}
	return sc.groups
}

// groupsKind names the groups in the plural: "systems" when they come
// from each, else "groups".
func groupsKind(sc *scope) string {
	if len(sc.systems) > 0 {
		return "systems"
	}
	return "groups"
}

// systemsParagraphs writes the systems topic of a scope.
func (c *composer) systemsParagraphs(sc *scope) []Paragraph {
	gs := systemsGroups(sc)
	if len(gs) == 0 {
		return nil
	}
	var out []Paragraph
	if s, ok := c.systemsCounts(sc, gs); ok {
		out = append(out, Paragraph{Heading: c.sw().SystemsHeading("counted"), Sentences: []Sentence{s}})
	}
	for _, ind := range sc.inds {
		var ss []Sentence
		if s, ok := c.systemsStanding(sc, gs, ind); ok {
			ss = append(ss, s)
		}
		if s, ok := c.systemsMove(sc, gs, ind); ok {
			ss = append(ss, s)
		}
		if s, ok := c.systemsWeight(sc, gs, ind); ok {
			ss = append(ss, s)
		}
		if len(ss) > 0 {
			out = append(out, Paragraph{Heading: headingOf(ind), Sentences: ss})
		}
	}
	return out
}

// sw is the composer's wording of the systems topic.
func (c *composer) sw() SystemsWording { return c.w }

func sysKey(group, ind string, year int, measure string) figures.Key {
	return figures.SystemKey(group, ind, year, measure)
}

// systemsCounts: the largest and smallest share of a group's institutions
// passing the population rules, then the others. Claims: the largest
// share is at least every other, the smallest at most every other.
func (c *composer) systemsCounts(sc *scope, gs []*figures.Group) (Sentence, bool) {
	type row struct {
		g     *figures.Group
		share float64
		p     SystemShare
	}
	var rows []row
	for _, g := range gs {
		def, ok1 := c.m.SystemFigure(g.Name, "", 0, figures.MeasureDefined)
		rk, ok2 := c.m.SystemFigure(g.Name, "", 0, figures.MeasureRanked)
		sh, ok3 := c.m.SystemFigure(g.Name, "", 0, figures.MeasureShareRanked)
		if !ok1 || !ok2 || !ok3 {
			continue
		}
		rows = append(rows, row{g, sh, SystemShare{System: c.phrase(g), Defined: printCount(int(def)), Ranked: printCount(int(rk)), Share: format.Number(sh, 0) + "%"}})
	}
	if len(rows) == 0 {
		return Sentence{}, false
	}
	hi, lo := 0, 0
	for i, r := range rows {
		if r.share > rows[hi].share {
			hi = i
		}
		if r.share < rows[lo].share {
			lo = i
		}
	}
	f := SystemsCountFact{Seed: c.part + "/counts", Groups: len(rows), Kind: groupsKind(sc), High: rows[hi].p, Low: rows[lo].p}
	f.Same = rows[hi].p.Share == rows[lo].p.Share
	var cites []figures.Key
	var claims []Claim
	var counts []float64
	for i, r := range rows {
		cites = append(cites, sysKey(r.g.Name, "", 0, figures.MeasureDefined), sysKey(r.g.Name, "", 0, figures.MeasureRanked), sysKey(r.g.Name, "", 0, figures.MeasureShareRanked))
		if i != hi {
			claims = append(claims, Claimed(Fig(sysKey(rows[hi].g.Name, "", 0, figures.MeasureShareRanked)), OpGreaterEq, Fig(sysKey(r.g.Name, "", 0, figures.MeasureShareRanked))))
		}
		if i != lo {
			claims = append(claims, Claimed(Fig(sysKey(rows[lo].g.Name, "", 0, figures.MeasureShareRanked)), OpLessEq, Fig(sysKey(r.g.Name, "", 0, figures.MeasureShareRanked))))
		}
		switch {
		case i == hi || (i == lo && !f.Same):
		case f.Same:
			f.Rest = append(f.Rest, r.p)
		case r.p.Share == rows[hi].p.Share:
			f.HighLevel = append(f.HighLevel, r.p)
		case r.p.Share == rows[lo].p.Share:
			f.LowLevel = append(f.LowLevel, r.p)
		default:
			f.Rest = append(f.Rest, r.p)
		}
	}
	counts = listCounts(len(rows))
	s := c.say("", c.sw().SystemsCounts(f), cites...).claim(claims...)
	s.Thresholds = counts
	return s, true
}

// systemsStanding: the group with the highest and the lowest median.
// Claims: the highest median is at least every other, the lowest at most.
func (c *composer) systemsStanding(sc *scope, gs []*figures.Group, ind dataset.Indicator) (Sentence, bool) {
	type row struct {
		g   *figures.Group
		med float64
	}
	var rows []row
	for _, g := range gs {
		if d, ok := c.m.Distribution(g.Name, ind.Key, sc.year); ok && d.N > 0 && !math.IsNaN(d.Median) {
			rows = append(rows, row{g, d.Median})
		}
	}
	if len(rows) < 2 {
		return Sentence{}, false
	}
	hi, lo := 0, 0
	for i, r := range rows {
		if r.med > rows[hi].med {
			hi = i
		}
		if r.med < rows[lo].med {
			lo = i
		}
	}
	key := func(i int) figures.Key { return distKey(rows[i].g.Name, ind.Key, sc.year, mMedian) }
	var claims []Claim
	for i := range rows {
		if i != hi {
			claims = append(claims, Claimed(Fig(key(hi)), OpGreaterEq, Fig(key(i))))
		}
		if i != lo {
			claims = append(claims, Claimed(Fig(key(lo)), OpLessEq, Fig(key(i))))
		}
	}
	f := SystemsStandingFact{Seed: c.part + "/" + ind.Key + "/standing", Groups: len(rows), Kind: groupsKind(sc),
		High: SystemMedian{System: c.phrase(rows[hi].g), Value: printValue(ind, rows[hi].med)},
		Low:  SystemMedian{System: c.phrase(rows[lo].g), Value: printValue(ind, rows[lo].med)},
		Same: printedCompare(ind, rows[hi].med, rows[lo].med) == Level, NeutralWords: !judged(ind)}
	s := c.say(ind.Key, c.sw().SystemsStanding(f), key(hi), key(lo)).claim(claims...)
	s.Thresholds = listCounts(len(rows))
	return s, true
}

// systemsMove: the groups whose median rose or fell over the span beyond
// the noise rule (a change that prints as zero at the indicator's
// decimals, or smaller than NoiseIQRShare of the group's interquartile
// range in the last year, is "broadly unchanged"), the largest first.
// Claims: each rise and fall (the change against half a unit of the last
// decimal and the share of the IQR against the rule), each unchanged
// group, and the order of the largest.
func (c *composer) systemsMove(sc *scope, gs []*figures.Group, ind dataset.Indicator) (Sentence, bool) {
	// The span is the one most groups' medians share (a measure computed
	// from windows of records starts later than the brief's span); groups
	// with other ends are named as left out.
	spans := map[[2]int]int{}
	var best [2]int
	for _, g := range gs {
		if gt, ok := c.m.GroupTrend(g.Name, ind.Key); ok && gt.Valid {
			k := [2]int{gt.StartYear, gt.EndYear}
			spans[k]++
			if spans[k] > spans[best] || (spans[k] == spans[best] && k[1]-k[0] > best[1]-best[0]) {
				best = k
			}
		}
	}
	first, last := best[0], best[1]
	if first == last {
		return Sentence{}, false
	}
	type mv struct {
		g      *figures.Group
		change float64
		p      SystemMedian
	}
	var rose, fell []mv
	f := SystemsMoveFact{Seed: c.part + "/" + ind.Key + "/move", First: printYear(first), Last: printYear(last), Kind: groupsKind(sc)}
	var cites []figures.Key
	var claims []Claim
	half := unitOf(ind) / 2
	for _, g := range gs {
		gt, ok := c.m.GroupTrend(g.Name, ind.Key)
		if !ok || !gt.Valid || gt.StartYear != first || gt.EndYear != last {
			f.Short = append(f.Short, c.phrase(g))
			continue
		}
		f.Groups++
		tk := func(m string) figures.Key { return trendKey(g.Name, ind.Key, "", m) }
		if f.Groups == 1 {
			cites = append(cites, tk("median_start_year"), tk("median_end_year"))
		}
		ch := Fig(tk(mMedianChange))
		perIQR, hasIQR := c.m.SystemFigure(g.Name, ind.Key, 0, figures.MeasureMedianPerIQR)
		cites = append(cites, tk("median_start"), tk("median_end"), tk(mMedianChange))
		p := SystemMedian{System: c.phrase(g), Value: printValue(ind, gt.MedianEnd), From: printValue(ind, gt.MedianStart)}
		switch {
		case format.Round(gt.Change, ind.Decimals) == 0:
			f.Flat = append(f.Flat, p.System)
			claims = append(claims, Claimed(ch, OpLess, Num(half)), Claimed(ch, OpGreater, Num(-half)))
			continue
		case hasIQR && perIQR < NoiseIQRShare:
			f.Flat = append(f.Flat, p.System)
			cites = append(cites, sysKey(g.Name, ind.Key, 0, figures.MeasureMedianPerIQR))
			claims = append(claims, Claimed(Fig(sysKey(g.Name, ind.Key, 0, figures.MeasureMedianPerIQR)), OpLess, Num(NoiseIQRShare)))
			continue
		}
		if hasIQR {
			cites = append(cites, sysKey(g.Name, ind.Key, 0, figures.MeasureMedianPerIQR))
			claims = append(claims, Claimed(Fig(sysKey(g.Name, ind.Key, 0, figures.MeasureMedianPerIQR)), OpGreaterEq, Num(NoiseIQRShare)))
		}
		if gt.Change > 0 {
			claims = append(claims, Claimed(ch, OpGreaterEq, Num(half)))
			rose = append(rose, mv{g, gt.Change, p})
		} else {
			claims = append(claims, Claimed(ch, OpLessEq, Num(-half)))
			fell = append(fell, mv{g, gt.Change, p})
		}
	}
	if f.Groups == 0 {
		return Sentence{}, false
	}
	// The largest move first: claims that it is at least (at most) every
	// other of its direction.
	// Largest move first, each at least (at most) the next.
	order := func(ms []mv, up bool) {
		sort.SliceStable(ms, func(a, b int) bool {
			if up {
				return ms[a].change > ms[b].change
			}
			return ms[a].change < ms[b].change
		})
		op := OpGreaterEq
		if !up {
			op = OpLessEq
		}
		for i := 1; i < len(ms); i++ {
			claims = append(claims, Claimed(Fig(trendKey(ms[i-1].g.Name, ind.Key, "", mMedianChange)), op, Fig(trendKey(ms[i].g.Name, ind.Key, "", mMedianChange))))
		}
	}
	order(rose, true)
	order(fell, false)
	for _, m := range rose {
		f.Rose = append(f.Rose, m.p)
	}
	for _, m := range fell {
		f.Fell = append(f.Fell, m.p)
	}
	s := c.say(ind.Key, c.sw().SystemsMove(f), cites...).claim(claims...)
	s.Thresholds = listCounts(f.Groups, len(f.Rose), len(f.Fell), len(f.Flat))
	return s, true
}

// systemsWeight: the groups whose median weighted by size lies furthest
// above and below the plain median, when any prints apart from it.
// Claims: the sign of each named difference, and that it is the largest
// (smallest) of every group's; with none apart, that every difference is
// within half a unit of the last decimal.
func (c *composer) systemsWeight(sc *scope, gs []*figures.Group, ind dataset.Indicator) (Sentence, bool) {
	size, ok := c.m.SizeWeight()
	if !ok {
		return Sentence{}, false
	}
	type row struct {
		g       *figures.Group
		wm, med float64
		gap     float64
	}
	var rows []row
	for _, g := range gs {
		wm, ok1 := c.m.SystemFigure(g.Name, ind.Key, sc.year, figures.MeasureWeightedMedian)
		gap, ok2 := c.m.SystemFigure(g.Name, ind.Key, sc.year, figures.MeasureWeightedGap)
		d, ok3 := c.m.Distribution(g.Name, ind.Key, sc.year)
		if ok1 && ok2 && ok3 && d.N > 0 {
			rows = append(rows, row{g, wm, d.Median, gap})
		}
	}
	if len(rows) == 0 {
		return Sentence{}, false
	}
	hi, lo := 0, 0
	for i, r := range rows {
		if r.gap > rows[hi].gap {
			hi = i
		}
		if r.gap < rows[lo].gap {
			lo = i
		}
	}
	gapKey := func(i int) figures.Key { return sysKey(rows[i].g.Name, ind.Key, sc.year, figures.MeasureWeightedGap) }
	label := size.Short
	if label == "" {
		label = c.w.Indicator(size)
	}
	f := SystemsWeightFact{Seed: c.part + "/" + ind.Key + "/weight", Weight: lowerFirst(label), Groups: len(rows), Kind: groupsKind(sc)}
	if k := c.part + "/weight-explained"; !c.said[k] {
		c.said[k] = true
		f.Explain = true
	}
	var cites []figures.Key
	var claims []Claim
	named := func(i int) *SystemMedian {
		r := rows[i]
		cites = append(cites, sysKey(r.g.Name, ind.Key, sc.year, figures.MeasureWeightedMedian), distKey(r.g.Name, ind.Key, sc.year, mMedian))
		return &SystemMedian{System: c.phrase(r.g), Value: printValue(ind, r.wm), From: printValue(ind, r.med)}
	}
	if rows[hi].gap > 0 && printedCompare(ind, rows[hi].wm, rows[hi].med) == Above {
		f.Lift = named(hi)
		claims = append(claims, Claimed(Fig(gapKey(hi)), OpGreater, Num(0)))
		for i := range rows {
			if i != hi {
				claims = append(claims, Claimed(Fig(gapKey(hi)), OpGreaterEq, Fig(gapKey(i))))
			}
		}
	}
	if rows[lo].gap < 0 && printedCompare(ind, rows[lo].wm, rows[lo].med) == Below {
		f.Drop = named(lo)
		claims = append(claims, Claimed(Fig(gapKey(lo)), OpLess, Num(0)))
		for i := range rows {
			if i != lo {
				claims = append(claims, Claimed(Fig(gapKey(lo)), OpLessEq, Fig(gapKey(i))))
			}
		}
	}
	if f.Lift == nil && f.Drop == nil {
		// Every weighted median prints as its plain one.
		for i := range rows {
			cites = append(cites, gapKey(i))
			claims = append(claims, Claimed(Fig(gapKey(i)), OpLess, Num(unitOf(ind))), Claimed(Fig(gapKey(i)), OpGreater, Num(-unitOf(ind))))
		}
	}
	s := c.say(ind.Key, c.sw().SystemsWeight(f), cites...).claim(claims...)
	s.Thresholds = listCounts(len(rows))
	return s, true
}

// systemRenderings are the ways a sentence may print a system-section
// figure (figures/systems.go).
func systemRenderings(m *figures.Model, r figures.Row) []string {
	v := r.Value
	switch r.Measure {
	case figures.MeasureDefined, figures.MeasureRanked, figures.MeasureWeightN:
		return []string{format.Int(int(math.Round(v)))}
	case figures.MeasureShareRanked:
		return []string{format.Number(v, 0)}
	case figures.MeasureWeightedMedian:
		if ind, ok := m.Indicator(r.Indicator); ok {
			return []string{format.Value(ind, v), format.Number(v, ind.Decimals)}
		}
	case figures.MeasureWeightedGap:
		if ind, ok := m.Indicator(r.Indicator); ok {
			return []string{format.Difference(ind, v), format.Number(math.Abs(v), ind.Decimals), format.Value(ind, math.Abs(v))}
		}
	}
	return nil
}
