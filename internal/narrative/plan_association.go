package narrative

import (
	"math"

	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
)

// Association strengths on Spearman's rank correlation |rho|: Cohen's
// conventions for correlations, 0.1 small, 0.3 medium, 0.5 large (J.
// Cohen, Statistical Power Analysis for the Behavioral Sciences, 2nd ed.,
// 1988, from memory). Below the medium step nothing is said to move
// together.
const (
	AssociationClear = 0.5
	AssociationLoose = 0.3
)

// association writes, for each pair of the scope's indicators, whether
// they move together across the reference group's members in the brief
// year: only with figures.MinCorrelationPairs members reporting both
// (common practice, no source), and always as association, not cause. A
// pair with too few members says so, so a reader knows it was not
// forgotten.
func (c *composer) association(sc *scope) []Sentence {
	g := sc.ref
	if g == nil || sc.year != c.m.Year {
		return nil // correlations are computed for the brief's year only
	}
	dict := c.m.Data.Dictionary
	var out []Sentence
	for i, a := range sc.inds {
		for _, b := range sc.inds[i+1:] {
			x, y := a, b
			if dict.Index(x.Key) > dict.Index(y.Key) {
				x, y = y, x // the figures file keys pairs in dictionary order
			}
			r, ok := c.m.Correlation(g.Name, x.Key, y.Key)
			if !ok {
				continue
			}
			key := func(measure string) figures.Key {
				return figures.Key{Section: figures.SectionCorrelation, Group: g.Name, Indicator: figures.PairKey(x.Key, y.Key), Year: r.Year, Measure: measure}
			}
			f := c.associationFact(g, x, y, r)
			if !r.Enough() {
				f.Threshold = printCount(figures.MinCorrelationPairs)
				s := c.say("", c.w.AssociationTooFew(f), key(mN)).claim(Claimed(Fig(key(mN)), OpLess, Num(figures.MinCorrelationPairs)))
				s.Thresholds = []float64{figures.MinCorrelationPairs}
				out = append(out, s)
				continue
			}
			if math.IsNaN(r.Spearman) {
				// Enough members, but one indicator takes a single value
				// among them: no correlation exists to read.
				f.Constant = true
				out = append(out, c.say("", c.w.AssociationTooFew(f), key(mN)).claim(Claimed(Fig(key(mN)), OpGreaterEq, Num(figures.MinCorrelationPairs))))
				continue
			}
			cites := []figures.Key{key(mN), key(mSpearman)}
			if f.R != "" {
				cites = append(cites, key(mPearson))
			}
			out = append(out, c.say("", c.w.Association(f), cites...).claim(associationClaims(f, Fig(key(mN)), Fig(key(mSpearman)))...))
		}
	}
	return out
}

func (c *composer) associationFact(g *figures.Group, x, y dataset.Indicator, r figures.Correlation) AssociationFact {
	f := AssociationFact{
		Seed: g.Name + "/" + figures.PairKey(x.Key, y.Key), Group: c.phrase(g), X: c.w.Indicator(x), Y: c.w.Indicator(y),
		N: printCount(r.N), Year: printYear(r.Year), Rho: format.Number(r.Spearman, 2),
	}
	if !math.IsNaN(r.Pearson) {
		f.R = format.Number(r.Pearson, 2)
	}
	// Decided on the unrounded rho, the figure the claims check.
	switch a := math.Abs(r.Spearman); {
	case a >= AssociationClear:
		f.Strength = Above
	case a >= AssociationLoose:
		f.Strength = Level
	default:
		f.Strength = Below
	}
	f.Negative = r.Spearman < 0
	return f
}

// associationClaims: enough members report both, and rho lies where the
// wording puts it: "clearly" at |rho| >= AssociationClear, "loosely" at
// >= AssociationLoose, "little association" below, with its sign for
// "higher goes with higher (lower)".
func associationClaims(f AssociationFact, n, rho Operand) []Claim {
	out := []Claim{Claimed(n, OpGreaterEq, Num(figures.MinCorrelationPairs))}
	switch {
	case f.Strength == Below:
		return append(out, Claimed(rho, OpGreater, Num(-AssociationLoose)), Claimed(rho, OpLess, Num(AssociationLoose)))
	case f.Negative && f.Strength == Above:
		return append(out, Claimed(rho, OpLessEq, Num(-AssociationClear)))
	case f.Negative:
		return append(out, Claimed(rho, OpLessEq, Num(-AssociationLoose)), Claimed(rho, OpGreater, Num(-AssociationClear)))
	case f.Strength == Above:
		return append(out, Claimed(rho, OpGreaterEq, Num(AssociationClear)))
	}
	return append(out, Claimed(rho, OpGreaterEq, Num(AssociationLoose)), Claimed(rho, OpLess, Num(AssociationClear)))
}
