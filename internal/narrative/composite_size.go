package narrative

import (
	"fmt"

	"peerpack/internal/figures"
	"peerpack/internal/format"
)

// compositeCompany says, beside the composite's movement, when the number
// of institutions scored changed between the two years by more than
// figures.SizeChangeLimit (the population rules apply as of each year, so
// the ranked population can grow or shrink): part of a change of rank is
// then a change of company. The claim compares the two years' n_scored.
func (c *composer) compositeCompany(mv figures.CompositeMovement) (Sentence, bool) {
	k := func(year int) figures.Key {
		return figures.Key{Section: figures.SectionComposite, Indicator: figures.CompositeOverall, Year: year, Measure: "n_scored"}
	}
	r0, ok0 := c.m.Lookup(k(mv.StartYear))
	r1, ok1 := c.m.Lookup(k(mv.EndYear))
	if !ok0 || !ok1 || r0.IsText || r1.IsText {
		return Sentence{}, false
	}
	n0, n1 := int(r0.Value), int(r1.Value)
	if n0 == n1 || !figures.SizeChanged(n0, n1) {
		return Sentence{}, false
	}
	verb, op := "grew", OpGreater
	if n1 < n0 {
		verb, op = "fell", OpLess
	}
	text := fmt.Sprintf("The number of institutions scored %s from %s in %d to %s in %d, so part of any change of rank comes from the change of company rather than from %s own scores.",
		verb, format.Int(n0), mv.StartYear, format.Int(n1), mv.EndYear, possessive(c.focus))
	s := Sentence{Text: text, Cites: []figures.Key{k(mv.StartYear), k(mv.EndYear)}, About: figures.CompositeOverall, Part: "composite"}
	return s.claim(Claimed(Fig(k(mv.EndYear)), op, Fig(k(mv.StartYear)))), true
}
