package narrative

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"

	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
)

// IntervalShare is the share of Monte Carlo runs a rank interval holds
// (5th to 95th percentile), printed in the composite's sentences.
const IntervalShare = 90

// composite writes the composite section's text for the focus in the
// brief year: its rank always with its interval (Saisana et al. 2005), how
// many institutions it cannot be told apart from, the pillars, the choice
// that moves its rank most, the headroom on single indicators and the
// movement over the span. Nothing without a figure behind it.
func (c *composer) composite() []Paragraph {
	m := c.m
	cy, ok := m.Composite(m.Year)
	if !ok {
		return nil
	}
	c.part = "composite"
	focus := m.Focus
	fid := m.FocusID
	y := m.Year
	key := func(ind, inst string, year int, measure string) figures.Key {
		return figures.Key{Section: figures.SectionComposite, Indicator: ind, Institution: inst, Year: year, Measure: measure}
	}
	val := func(k figures.Key) (float64, bool) {
		r, ok := m.Lookup(k)
		return r.Value, ok && !r.IsText
	}
	sent := func(text string, thresholds []float64, cites ...figures.Key) Sentence {
		return Sentence{Text: text, Cites: cites, Thresholds: thresholds, About: figures.CompositeOverall, Part: "composite"}
	}
	rank := func(r float64) string { return format.Rank(int(r), c.b.RankBands) }
	var ps []Paragraph
	nKey := key(figures.CompositeOverall, "", y, "n_scored")
	n, _ := val(nKey)
	if !cy.Scored(focus) {
		exKey := key(figures.CompositeOverall, "", y, "n_excluded")
		ex, _ := val(exKey)
		ps = append(ps, Paragraph{Sentences: []Sentence{sent(fmt.Sprintf("%s has too few of the composite's indicators in %d to be scored; %s of the institutions are scored and %s are not.",
			c.focus, y, format.Int(int(n)), format.Int(int(ex))), nil, nKey, exKey).claim(Claimed(Fig(exKey), OpGreaterEq, Num(1)))}})
		return ps
	}
	rk := key(figures.CompositeOverall, fid, y, "rank")
	r0, _ := val(rk)
	var first []Sentence
	lowK, highK, medK := key(figures.CompositeOverall, fid, y, "rank_low"), key(figures.CompositeOverall, fid, y, "rank_high"), key(figures.CompositeOverall, fid, y, "rank_median")
	lo, hasMC := val(lowK)
	hi, _ := val(highK)
	if hasMC {
		runsK, spreadK := key(figures.CompositeOverall, "", y, "runs"), key(figures.CompositeOverall, "", y, "weight_spread")
		runs, _ := val(runsK)
		spread, _ := val(spreadK)
		varied := "the same weights"
		if spread > 0 {
			varied = fmt.Sprintf("weights varied by up to %s %%", format.Number(100*spread, 0))
		}
		if extra := c.variedChoices(); extra != "" {
			varied += " and " + extra
		}
		if lo == hi {
			first = append(first, sent(fmt.Sprintf("On the composite score %s ranks %s of %s in %d, and it kept that rank in every one of %s runs with %s.",
				c.focus, rank(r0), format.Int(int(n)), y, format.Int(int(runs)), varied), nil, rk, nKey, lowK, highK, runsK, spreadK).
				claim(Claimed(Fig(rk), OpLessEq, Fig(nKey)), Claimed(Fig(lowK), OpEqual, Fig(rk)), Claimed(Fig(highK), OpEqual, Fig(rk))))
		} else {
			med, _ := val(medK)
			first = append(first, sent(fmt.Sprintf("On the composite score %s ranks %s of %s in %d; across %s runs with %s, its rank lay between %s and %s in %d %% of them (median %s).",
				c.focus, rank(r0), format.Int(int(n)), y, format.Int(int(runs)), varied, rank(lo), rank(hi), IntervalShare, rank(med)), []float64{IntervalShare}, rk, nKey, lowK, highK, medK, runsK, spreadK).
				claim(Claimed(Fig(rk), OpLessEq, Fig(nKey)), Claimed(Fig(lowK), OpLess, Fig(highK)), Claimed(Fig(lowK), OpLessEq, Fig(medK)), Claimed(Fig(medK), OpLessEq, Fig(highK))))
		}
		ovK := key(figures.CompositeOverall, fid, y, "n_overlapping")
		if ov, ok := val(ovK); ok && ov > 0 {
			first = append(first, sent(fmt.Sprintf("Its interval overlaps those of %s other %s, which this composite cannot tell apart from it.",
				format.Int(int(ov)), format.Plural(int(ov), "institution", "institutions")), nil, ovK).claim(Claimed(Fig(ovK), OpGreater, Num(0))))
		}
	} else {
		first = append(first, sent(fmt.Sprintf("On the composite score %s ranks %s of %s in %d; no uncertainty analysis was run, so this rank comes without an interval and should not be read on its own.",
			c.focus, rank(r0), format.Int(int(n)), y), nil, rk, nKey).claim(Claimed(Fig(rk), OpLessEq, Fig(nKey))))
	}
	ps = append(ps, Paragraph{Sentences: first})

	// pillars
	if spec := m.CompositeSpec; spec != nil && len(spec.Pillars) > 1 {
		var parts []string
		var cites []figures.Key
		for _, p := range spec.Pillars {
			k := key(p.Key, fid, y, "rank")
			if v, ok := val(k); ok {
				parts = append(parts, fmt.Sprintf("%s on %s", rank(v), p.Label))
				cites = append(cites, k)
			}
		}
		if len(parts) > 0 {
			ps = append(ps, Paragraph{Heading: "Pillars", Sentences: []Sentence{sent(fmt.Sprintf("By pillar it ranks %s; pillar ranks carry no interval of their own and move with the same choices.", joinList(parts)), nil, cites...)}})
		}
	}

	// sensitivity
	if s := c.compositeSensitivity(key, val, sent); s != nil {
		ps = append(ps, Paragraph{Heading: "What moves the rank", Sentences: s})
	}
	// headroom
	if s := c.compositeHeadroom(cy, key, val, sent, rank); s != nil {
		ps = append(ps, Paragraph{Heading: "Headroom", Sentences: s})
	}
	// movement
	if mv, ok := m.CompositeMovement(); ok {
		sk, ek := key(figures.CompositeOverall, fid, mv.StartYear, "rank"), key(figures.CompositeOverall, fid, mv.EndYear, "rank")
		slK, shK := key(figures.CompositeOverall, fid, mv.StartYear, "rank_low"), key(figures.CompositeOverall, fid, mv.StartYear, "rank_high")
		elK, ehK := key(figures.CompositeOverall, fid, mv.EndYear, "rank_low"), key(figures.CompositeOverall, fid, mv.EndYear, "rank_high")
		dk := key(figures.CompositeOverall, fid, 0, "movement_distinguishable")
		sl, _ := val(slK)
		sh, _ := val(shK)
		el, _ := val(elK)
		eh, _ := val(ehK)
		// The verdict claims the distinguishability figure and, for
		// overlap, the comparison of the two intervals' ends; an unchanged
		// rank claims the two ranks equal.
		verdict := "the two intervals overlap, so the movement is not distinguishable from the uncertainty of the composite"
		mvClaims := []Claim{Claimed(Fig(dk), OpEqual, Num(0)), Claimed(Fig(slK), OpLessEq, Fig(ehK)), Claimed(Fig(elK), OpLessEq, Fig(shK))}
		if mv.Distinguishable {
			verdict = "the two intervals do not overlap, so the movement stands out from the uncertainty of the composite"
			mvClaims = []Claim{Claimed(Fig(dk), OpEqual, Num(1))}
		}
		if mv.StartRank == mv.EndRank {
			verdict = "the intervals show how far it could have moved unseen"
			mvClaims = []Claim{Claimed(Fig(sk), OpEqual, Fig(ek))}
		}
		if m.CompositeSpec.WeightSpread == 0 && c.variedChoices() == "" {
			verdict = "no choice of method was varied, so these figures cannot say how much of the movement the method alone could produce"
			mvClaims = nil
		}
		span := func(lo, hi float64) string {
			if lo == hi {
				return "held in every run"
			}
			return "interval " + rank(lo) + " to " + rank(hi)
		}
		ps = append(ps, Paragraph{Heading: "Over time", Sentences: []Sentence{sent(fmt.Sprintf("Between %d and %d its composite rank went from %s (%s) to %s (%s); %s.",
			mv.StartYear, mv.EndYear, rank(float64(mv.StartRank)), span(sl, sh), rank(float64(mv.EndRank)), span(el, eh), verdict), nil, sk, ek, slK, shK, elK, ehK, dk).claim(mvClaims...)}})
		if s, ok := c.compositeCompany(mv); ok {
			ps[len(ps)-1].Sentences = append(ps[len(ps)-1].Sentences, s)
		}
	}
	// coverage
	exK, impK := key(figures.CompositeOverall, "", y, "n_excluded"), key(figures.CompositeOverall, "", y, "n_imputed")
	ex, _ := val(exK)
	imp, _ := val(impK)
	if ex > 0 || imp > 0 {
		text := fmt.Sprintf("In %d, %s %s too few of the indicators to be scored", y, format.Int(int(ex)), format.Plural(int(ex), "institution had", "institutions had"))
		if imp > 0 {
			text += fmt.Sprintf(", and %s missing %s were imputed among those scored", format.Int(int(imp)), format.Plural(int(imp), "value", "values"))
		}
		ps = append(ps, Paragraph{Heading: "Coverage", Sentences: []Sentence{sent(text+".", nil, exK, impK)}})
	}
	return ps
}

// variedChoices names the method choices the runs drew from, besides the
// weights.
func (c *composer) variedChoices() string {
	spec := c.m.CompositeSpec
	var out []string
	if ms := uniqStrings(append([]string{spec.Normalise}, spec.Normalisations...)); len(ms) > 1 {
		out = append(out, "the scaling drawn from "+joinList(mapWords(ms, ScalingWords)))
	}
	if is := uniqStrings(append([]string{spec.Impute}, spec.Imputations...)); len(is) > 1 {
		out = append(out, "missing values treated by "+joinList(mapWords(is, ImputationWords)))
	}
	return strings.Join(out, " and ")
}

// ScalingWords and ImputationWords say the composite's options in words.
var (
	ScalingWords = map[string]string{
		"zscore":     "z-scores",
		"minmax":     "min-max scaling",
		"percentile": "percentile ranks",
		"distance":   "distance to a group median",
		"zscore-cdf": "z-scores through the normal distribution",
	}
	ImputationWords = map[string]string{
		"none":         "leaving gaps out",
		"group-median": "the median",
		"pillar-mean":  "the mean of the pillar's other indicators",
	}
)

func mapWords(xs []string, words map[string]string) []string {
	out := make([]string, len(xs))
	for i, x := range xs {
		out[i] = words[x]
		if out[i] == "" {
			out[i] = x
		}
	}
	return out
}

func uniqStrings(xs []string) []string {
	var out []string
	seen := map[string]bool{}
	for _, x := range xs {
		if !seen[x] {
			seen[x] = true
			out = append(out, x)
		}
	}
	return out
}

func joinList(xs []string) string {
	switch len(xs) {
	case 0:
		return ""
	case 1:
		return xs[0]
	}
	return strings.Join(xs[:len(xs)-1], ", ") + " and " + xs[len(xs)-1]
}

type keyFunc func(ind, inst string, year int, measure string) figures.Key
type valFunc func(figures.Key) (float64, bool)
type sentFunc func(text string, thresholds []float64, cites ...figures.Key) Sentence

// compositeSensitivity names the choice with the largest first-order share
// of the variance of the focus's rank.
func (c *composer) compositeSensitivity(key keyFunc, val valFunc, sent sentFunc) []Sentence {
	m, fid, y := c.m, c.m.FocusID, c.m.Year
	spec := m.CompositeSpec
	type cand struct {
		k    figures.Key
		what string
	}
	var cands []cand
	for _, p := range spec.Pillars {
		cands = append(cands, cand{key(p.Key, fid, y, "first_order_weight"), "the weight of the " + p.Label + " pillar"})
		for _, wi := range p.Indicators {
			ind, _ := m.Indicator(wi.Key)
			cands = append(cands, cand{key(wi.Key, fid, y, "first_order_weight"), "the weight of " + c.w.Indicator(ind) + " within its pillar"})
		}
	}
	cands = append(cands, cand{key(figures.CompositeOverall, fid, y, "first_order_normalisation"), "the choice of scaling"},
		cand{key(figures.CompositeOverall, fid, y, "first_order_imputation"), "the treatment of missing values"})
	best, bestV := -1, -1.0
	for i, cd := range cands {
		if v, ok := val(cd.k); ok && v > bestV {
			best, bestV = i, v
		}
	}
	varK := key(figures.CompositeOverall, fid, y, "rank_variance")
	if v, ok := val(varK); ok && v == 0 {
		return []Sentence{sent("Its rank did not move in any run, so no choice varied here matters for it.", nil, varK).claim(Claimed(Fig(varK), OpEqual, Num(0)))}
	}
	if best < 0 {
		return nil
	}
	// "matters most" is one claim per other choice weighed (common
	// practice, no source).
	var most []Claim
	for i, cd := range cands {
		if _, ok := val(cd.k); ok && i != best {
			most = append(most, Claimed(Fig(cands[best].k), OpGreaterEq, Fig(cd.k)))
		}
	}
	share := format.Number(100*bestV, 0)
	if share == "0" {
		// Prints as 0 %: under half a percentage point.
		return []Sentence{sent("No single choice varied here accounts on its own for a visible share of the movement of its rank; the choices matter together.", nil, cands[best].k).
			claim(append(most, Claimed(Fig(cands[best].k), OpLess, Num(0.005)))...)}
	}
	return []Sentence{sent(fmt.Sprintf("Of the choices varied, %s matters most for its rank: on its own it accounts for about %s %% of the variation of the rank across runs (a first-order index; the rest comes from the other choices and from how they combine).",
		cands[best].what, share), nil, cands[best].k).claim(most...)}
}

// compositeHeadroom reports, for up to two indicators needing the smallest
// relative change, the change that alone would bring the focus to the
// target rank, and says which indicators cannot do it alone.
func (c *composer) compositeHeadroom(cy *figures.CompositeYear, key keyFunc, val valFunc, sent sentFunc, rank func(float64) string) []Sentence {
	fid, y := c.m.FocusID, c.m.Year
	tk := key(figures.CompositeOverall, fid, y, "headroom_target")
	if _, ok := val(tk); !ok {
		return nil
	}
	type room struct {
		j   int
		pct float64
	}
	var rooms []room
	unreachable := 0
	var unreachClaims []Claim // one per indicator counted as unable
	for j, ind := range cy.Indicators {
		if r, ok := val(key(ind.Key, fid, y, "headroom_reachable")); ok {
			if r == 0 {
				unreachable++
				unreachClaims = append(unreachClaims, Claimed(Fig(key(ind.Key, fid, y, "headroom_reachable")), OpEqual, Num(0)))
				continue
			}
			p, ok := val(key(ind.Key, fid, y, "headroom_change_pct"))
			if !ok {
				p = math.Inf(1)
			}
			rooms = append(rooms, room{j, math.Abs(p)})
		}
	}
	sort.SliceStable(rooms, func(a, b int) bool { return rooms[a].pct < rooms[b].pct })
	var out []Sentence
	rk := key(figures.CompositeOverall, fid, y, "rank")
	for i, rm := range rooms {
		if i == 2 {
			break
		}
		ind := cy.Indicators[rm.j]
		toK, pctK, hrK := key(ind.Key, fid, y, "headroom_to"), key(ind.Key, fid, y, "headroom_change_pct"), key(ind.Key, fid, y, "headroom_rank")
		to, _ := val(toK)
		hr, _ := val(hrK)
		r0, _ := val(rk)
		dir := "rise"
		if ind.Better == dataset.LowerIsBetter {
			dir = "fall"
		}
		how := fmt.Sprintf("a %s of %s %% in %s", dir, format.Number(rm.pct, 0), c.w.Indicator(ind))
		cites := []figures.Key{toK, pctK, hrK, rk}
		if math.IsInf(rm.pct, 1) || format.Number(rm.pct, 0) == "0" {
			how = fmt.Sprintf("a %s in %s", dir, c.w.Indicator(ind))
			cites = []figures.Key{toK, hrK, rk}
		}
		text := fmt.Sprintf("Holding everything else as it is, %s alone (to %s) would lift its rank from %s to %s", how, format.Value(ind, to), rank(r0), rank(hr))
		if i == 0 {
			text += "; the interval around the rank still applies, so read this as a planning aid, not a forecast"
		} else {
			text = fmt.Sprintf("So would %s alone (to %s)", how, format.Value(ind, to))
			cites = cites[:len(cites)-2]
			cites = append(cites, toK)
		}
		// "would lift its rank": the rank reached is better than the
		// rank held, and the indicator can do it alone.
		reachK := key(ind.Key, fid, y, "headroom_reachable")
		out = append(out, sent(text+".", nil, cites...).claim(Claimed(Fig(hrK), OpLess, Fig(rk)), Claimed(Fig(reachK), OpEqual, Num(1))))
	}
	if unreachable > 0 {
		out = append(out, sent(fmt.Sprintf("%s of the %s %s could not do it alone, even at the best value observed.",
			format.Int(unreachable), format.Int(len(cy.Indicators)), format.Plural(len(cy.Indicators), "indicator", "indicators")), []float64{float64(unreachable), float64(len(cy.Indicators))}).
			claim(unreachClaims...))
	}
	if len(rooms) == 0 && unreachable == 0 {
		return nil
	}
	return out
}

// compositeRenderings are the printed forms of a composite figure that
// Verify accepts.
func compositeRenderings(m *figures.Model, r figures.Row, bands int) []string {
	v := r.Value
	whole := int(math.Round(v))
	switch r.Measure {
	case "rank", "rank_low", "rank_high", "rank_median", "headroom_rank", "headroom_target":
		return []string{format.Rank(whole, bands), format.Ordinal(whole), format.Int(whole)}
	case "n_scored", "n_excluded", "n_imputed", "imputed", "missing", "runs", "n_overlapping":
		return []string{format.Int(whole)}
	case "weight_spread", "weight", "effective_weight", "first_order_weight", "first_order_normalisation", "first_order_imputation":
		return []string{format.Number(100*v, 0)}
	case "headroom_change_pct":
		return []string{format.Number(math.Abs(v), 0)}
	case "headroom_from", "headroom_to", "headroom_change":
		if ind, ok := m.Indicator(r.Indicator); ok {
			return []string{format.Value(ind, v), format.Number(v, ind.Decimals), format.Value(ind, math.Abs(v)), format.Number(math.Abs(v), ind.Decimals)}
		}
	case "movement_start_year", "movement_end_year":
		return []string{strconv.Itoa(whole)}
	case "movement_rank_change":
		return []string{format.Int(int(math.Abs(float64(whole))))}
	}
	return nil
}
