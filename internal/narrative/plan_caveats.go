package narrative

import (
	"math"
	"strings"

	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
	"peerpack/internal/stats"
)

// Caveats are written where they apply and nowhere else.

// groupCaveats: groups too small for stable quartiles, and chosen peer
// sets that turn out to lie in one country.
func (c *composer) groupCaveats(sc *scope) []Sentence {
	var out []Sentence
	for _, g := range sc.distinctGroups() {
		// The caveat keeps common practice's ten (SmallGroup) even when
		// the brief lowers the floor for printing quarters: a pack that
		// prints quarters of five values should still say they are
		// unstable.
		if n := len(g.Members); n > 0 && n < SmallGroup {
			f := CaveatFact{Seed: g.Name, Group: c.phrase(g), N: printCount(n), Threshold: printCount(SmallGroup), RanksOnly: n < c.floor()}
			s := c.say("", c.w.SmallGroup(f), groupKey(g.Name, mMembers)).claim(Claimed(Fig(groupKey(g.Name, mMembers)), OpLess, Num(SmallGroup)))
			s.Thresholds = []float64{SmallGroup}
			out = append(out, s)
		}
		if country, ok := c.oneCountry(g); ok {
			f := CaveatFact{Seed: g.Name, Focus: c.focus, Group: c.phrase(g), Country: country}
			out = append(out, c.say("", c.w.OneCountry(f), groupKey(g.Name, mMembers)))
		}
	}
	return out
}

// oneCountry reports the country of a chosen or nearest-profile peer group
// whose members all lie in one country: readers take such groups for an
// international comparison unless told. Groups defined by a place or by
// "each" are one-country by definition and say so in their name.
func (c *composer) oneCountry(g *figures.Group) (string, bool) {
	if (g.Kind != "members" && g.Kind != "nearest") || len(g.Members) < 2 {
		return "", false
	}
	reg := c.m.Data.Register
	country := reg.Institutions[g.Members[0]].Country
	for _, i := range g.Members[1:] {
		if reg.Institutions[i].Country != country {
			return "", false
		}
	}
	return country, country != ""
}

// indicatorCaveats: currency converted with PPP, a direction that is a
// value judgement, an estimated focus value, and groups where too few
// members report.
func (c *composer) indicatorCaveats(sc *scope, ind dataset.Indicator) []Sentence {
	var out []Sentence
	label := c.w.Indicator(ind)
	if f, ok := c.pppFact(ind.Key, []dataset.Indicator{ind}); ok {
		out = append(out, c.say(ind.Key, c.w.PPP(f)))
	}
	if judged(ind) && strings.TrimSpace(ind.Judgement) != "" {
		out = append(out, c.say(ind.Key, c.w.Judgement(CaveatFact{Seed: ind.Key, Indicator: label, Better: ind.Better, Judgement: ind.Judgement})))
	}
	if note, ok := c.imputed(ind, sc.year); ok {
		f := CaveatFact{Seed: ind.Key, Focus: c.focus, Indicator: label, Year: printYear(sc.year), Note: note}
		out = append(out, c.say(ind.Key, c.w.Imputed(f), posKey(c.anyGroup(sc), ind.Key, c.m.FocusID, sc.year, mValue)))
	}
	for _, g := range sc.distinctGroups() {
		d, ok := c.m.Distribution(g.Name, ind.Key, sc.year)
		if !ok || d.N == 0 {
			continue // no comparison is written, so no caveat on it
		}
		if 100*float64(d.N) < MinCoverage*float64(d.N+d.Missing) {
			out = append(out, c.coverage(g, ind, sc.year))
		}
	}
	if s, ok := c.skewed(sc.ref, ind, sc.year); ok {
		out = append(out, s)
	}
	for _, g := range sc.distinctGroups() {
		if c.choseBy(g, ind.Key) {
			f := CaveatFact{Seed: g.Name, Focus: c.focus, Indicator: label, Group: c.phrase(g)}
			out = append(out, c.say(ind.Key, c.w.ByConstruction(f), groupKey(g.Name, mMembers)))
		}
	}
	return out
}

// choseBy reports whether a nearest-peers group was chosen on the
// indicator: the focus's closeness to it there is then by construction.
func (c *composer) choseBy(g *figures.Group, key string) bool {
	if g.Kind != "nearest" {
		return false
	}
	for _, spec := range c.b.Groups {
		if spec.Name == g.Spec && spec.Nearest != nil {
			for _, k := range spec.Nearest.Indicators {
				if k == key {
					return true
				}
			}
		}
	}
	return false
}

// skewed cautions on z-scores and means where the reference group's
// values are strongly skewed: absolute adjusted sample skewness above
// stats.SkewCaution (2).
func (c *composer) skewed(g *figures.Group, ind dataset.Indicator, year int) (Sentence, bool) {
	if g == nil {
		return Sentence{}, false
	}
	d, ok := c.m.Distribution(g.Name, ind.Key, year)
	if !ok || math.IsNaN(d.Skewness) || math.Abs(d.Skewness) <= stats.SkewCaution {
		return Sentence{}, false
	}
	k := distKey(g.Name, ind.Key, year, "skewness")
	cl := Claimed(Fig(k), OpGreater, Num(stats.SkewCaution))
	if d.Skewness < 0 {
		cl = Claimed(Fig(k), OpLess, Num(-stats.SkewCaution))
	}
	f := CaveatFact{Seed: ind.Key, Indicator: c.w.Indicator(ind), Group: c.phrase(g), N: format.Number(d.Skewness, 1)}
	s := c.say(ind.Key, c.w.Skewed(f), k).claim(cl)
	s.Thresholds = []float64{stats.SkewCaution}
	return s, true
}

func (c *composer) anyGroup(sc *scope) string {
	if sc.ref != nil {
		return sc.ref.Name
	}
	if len(sc.groups) > 0 {
		return sc.groups[0].Name
	}
	return ""
}

// pppConverted reports whether an indicator's amounts are international
// dollars: a currency indicator converted with purchasing-power parities,
// or a currency indicator derived from converted amounts (research income
// per academic from research income). Both carry the same caveat: what
// they compare is what the money buys (format.InDollars prints them as
// PPP$ for the same reason).
func (c *composer) pppConverted(ind dataset.Indicator) bool {
	if ind.Unit == dataset.UnitCurrency && ind.InternationalDollars {
		return true
	}
	ppp := c.m.Data.PPP
	if !ind.Currency || ppp == nil {
		return false
	}
	if len(ppp.Converted) == 0 {
		return true
	}
	for _, k := range ppp.Converted {
		if k == ind.Key {
			return true
		}
	}
	return false
}

// pppDerived reports whether an indicator in international dollars was
// computed from converted amounts rather than converted itself (the loader
// never converts a derived indicator again), so the caveat can say which
// amounts were converted.
func (c *composer) pppDerived(ind dataset.Indicator) bool {
	return c.pppConverted(ind) && ind.Derive != ""
}

// pppFact sorts the scope's money indicators into those converted and
// those derived from converted amounts.
func (c *composer) pppFact(seed string, inds []dataset.Indicator) (CaveatFact, bool) {
	f := CaveatFact{Seed: seed}
	for _, ind := range inds {
		switch {
		case c.pppDerived(ind):
			f.Derived = append(f.Derived, c.w.Indicator(ind))
		case c.pppConverted(ind):
			f.Indicators = append(f.Indicators, c.w.Indicator(ind))
		}
	}
	return f, len(f.Indicators)+len(f.Derived) > 0
}

// imputedWords mark a values-file note as saying the value was estimated
// rather than reported.
var imputedWords = []string{"imput", "estimat"}

// imputed returns the note on the focus's value when it says the value
// was imputed or estimated.
func (c *composer) imputed(ind dataset.Indicator, year int) (string, bool) {
	k := c.m.Data.Dictionary.Index(ind.Key)
	note, ok := c.m.Data.Notes[dataset.CellRef{Indicator: k, Year: year, Institution: c.m.Focus}]
	if !ok {
		return "", false
	}
	low := strings.ToLower(note)
	for _, w := range imputedWords {
		if strings.Contains(low, w) {
			return strings.TrimSpace(note), true
		}
	}
	return "", false
}

// condensedCaveats are the caveats of a whole scope in few sentences, for
// the summary and bullets styles: the group caveats, one sentence for
// every indicator converted with PPP, the value judgements and estimates
// one by one (each has its own reason), and per group either the coverage
// caveat of its one indicator under the floor or one sentence listing them
// all.
func (c *composer) condensedCaveats(sc *scope) []Sentence {
	out := c.groupCaveats(sc)
	if f, ok := c.pppFact("ppp", sc.inds); ok {
		out = append(out, c.say("", c.w.PPP(f)))
	}
	for _, ind := range sc.inds {
		if judged(ind) && strings.TrimSpace(ind.Judgement) != "" {
			out = append(out, c.say(ind.Key, c.w.Judgement(CaveatFact{Seed: ind.Key, Indicator: c.w.Indicator(ind), Better: ind.Better, Judgement: ind.Judgement})))
		}
		if note, ok := c.imputed(ind, sc.year); ok {
			f := CaveatFact{Seed: ind.Key, Focus: c.focus, Indicator: c.w.Indicator(ind), Year: printYear(sc.year), Note: note}
			out = append(out, c.say(ind.Key, c.w.Imputed(f), posKey(c.anyGroup(sc), ind.Key, c.m.FocusID, sc.year, mValue)))
		}
	}
	for _, g := range sc.distinctGroups() {
		var low []dataset.Indicator
		for _, ind := range sc.inds {
			if d, ok := c.m.Distribution(g.Name, ind.Key, sc.year); ok && d.N > 0 && 100*float64(d.N) < MinCoverage*float64(d.N+d.Missing) {
				low = append(low, ind)
			}
		}
		switch len(low) {
		case 0:
			continue
		case 1:
			out = append(out, c.coverage(g, low[0], sc.year))
		default:
			f := CaveatFact{Seed: g.Name, Group: c.phrase(g), Year: printYear(sc.year), Threshold: printCount(int(MinCoverage))}
			var cites []figures.Key
			for _, ind := range low {
				f.Indicators = append(f.Indicators, c.w.Indicator(ind))
				cites = append(cites, distKey(g.Name, ind.Key, sc.year, mN), distKey(g.Name, ind.Key, sc.year, mMissing))
			}
			s := c.say("", c.w.LowCoverageList(f), cites...)
			s.Thresholds = []float64{MinCoverage}
			out = append(out, s)
		}
	}
	return out
}

// briefCaveats are the executive summary's caveats: only those particular
// to its own figures, each in a short sentence: the groups too small for
// stable quartiles or lying in one country, the money indicators in
// international dollars, the indicators where lower counts as better (and
// whether that direction is a value judgement), estimated values and
// coverage under the floor. The reasons behind each value judgement and
// the standing cautions are the closing section's, stated there once.
func (c *composer) briefCaveats(sc *scope) []Sentence {
	var out []Sentence
	for _, g := range sc.distinctGroups() {
		// The caveat keeps common practice's ten (SmallGroup) even when
		// the brief lowers the floor for printing quarters: a pack that
		// prints quarters of five values should still say they are
		// unstable.
		if n := len(g.Members); n > 0 && n < SmallGroup {
			f := CaveatFact{Seed: g.Name, Group: c.phrase(g), N: printCount(n), Threshold: printCount(SmallGroup), RanksOnly: n < c.floor()}
			s := c.say("", c.w.SmallGroupBrief(f), groupKey(g.Name, mMembers)).claim(Claimed(Fig(groupKey(g.Name, mMembers)), OpLess, Num(SmallGroup)))
			s.Thresholds = []float64{SmallGroup}
			out = append(out, s)
		}
		if country, ok := c.oneCountry(g); ok {
			f := CaveatFact{Seed: g.Name, Focus: c.focus, Group: c.phrase(g), Country: country}
			out = append(out, c.say("", c.w.OneCountry(f), groupKey(g.Name, mMembers)))
		}
	}
	if f, ok := c.pppFact("ppp", sc.inds); ok {
		f.Indicators = append(f.Indicators, f.Derived...)
		f.Derived = nil
		out = append(out, c.say("", c.w.PPPBrief(f)))
	}
	var dir DirectionFact
	for _, ind := range sc.inds {
		hasReason := judged(ind) && strings.TrimSpace(ind.Judgement) != ""
		switch {
		case ind.Better == dataset.LowerIsBetter:
			dir.Lower = append(dir.Lower, c.w.Indicator(ind))
			if hasReason {
				dir.LowerJudged = append(dir.LowerJudged, c.w.Indicator(ind))
			}
		case hasReason:
			dir.HigherJudged = append(dir.HigherJudged, c.w.Indicator(ind))
		}
	}
	if len(dir.Lower)+len(dir.HigherJudged) > 0 {
		out = append(out, c.say("", c.w.Direction(dir)))
	}
	for _, ind := range sc.inds {
		if note, ok := c.imputed(ind, sc.year); ok {
			f := CaveatFact{Seed: ind.Key, Focus: c.focus, Indicator: c.w.Indicator(ind), Year: printYear(sc.year), Note: note}
			out = append(out, c.say(ind.Key, c.w.Imputed(f), posKey(c.anyGroup(sc), ind.Key, c.m.FocusID, sc.year, mValue)))
		}
	}
	for _, g := range sc.distinctGroups() {
		f := CaveatFact{Seed: g.Name, Group: c.phrase(g), Year: printYear(sc.year), Threshold: printCount(int(MinCoverage))}
		var cites []figures.Key
		for _, ind := range sc.inds {
			if d, ok := c.m.Distribution(g.Name, ind.Key, sc.year); ok && d.N > 0 && 100*float64(d.N) < MinCoverage*float64(d.N+d.Missing) {
				f.Indicators = append(f.Indicators, c.w.Indicator(ind))
				cites = append(cites, distKey(g.Name, ind.Key, sc.year, mN), distKey(g.Name, ind.Key, sc.year, mMissing))
			}
		}
		if len(f.Indicators) > 0 {
			s := c.say("", c.w.LowCoverageList(f), cites...)
			s.Thresholds = []float64{MinCoverage}
			out = append(out, s)
		}
	}
	return out
}

// coverage is the caveat of one indicator reported by too few members.
func (c *composer) coverage(g *figures.Group, ind dataset.Indicator, year int) Sentence {
	d, _ := c.m.Distribution(g.Name, ind.Key, year)
	f := CaveatFact{Seed: g.Name + ind.Key, Group: c.phrase(g), Indicator: c.w.Indicator(ind), Year: printYear(year),
		N: printCount(d.N), Missing: printCount(d.Missing), Threshold: printCount(int(MinCoverage))}
	s := c.say(ind.Key, c.w.LowCoverage(f), distKey(g.Name, ind.Key, year, mN), distKey(g.Name, ind.Key, year, mMissing))
	s.Thresholds = []float64{MinCoverage}
	return s
}

// distinctGroups lists the scope's groups and competitor systems, each
// once, in order: caveats are said once per group.
func (sc *scope) distinctGroups() []*figures.Group {
	var out []*figures.Group
	seen := map[string]bool{}
	for _, gs := range [][]*figures.Group{sc.groups, sc.systems} {
		for _, g := range gs {
			if !seen[g.Name] {
				seen[g.Name] = true
				out = append(out, g)
			}
		}
	}
	return out
}
