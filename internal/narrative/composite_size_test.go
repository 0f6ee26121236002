package narrative_test

import (
	"fmt"
	"strings"
	"testing"

	"peerpack/internal/figures"
	"peerpack/internal/format"
	"peerpack/internal/narrative"
)

// When the number of institutions scored changes by more than
// figures.SizeChangeLimit between the composite's two years (the demo's
// population rule applies as of each year, and its records-based
// indicators start in 2022), the movement paragraph says that part of a
// change of rank is a change of company, citing both counts and claiming
// their order; Verify re-evaluates the claim.
func TestCompositeMovementNamesChangeOfCompany(t *testing.T) {
	m, b := demoComposite(t, "{runs: 50, weights: 0.25, seed: 4}")
	mv, ok := m.CompositeMovement()
	if !ok {
		t.Fatal("no composite movement in the demo")
	}
	n := func(y int) int {
		r, ok := m.Lookup(figures.Key{Section: figures.SectionComposite, Indicator: figures.CompositeOverall, Year: y, Measure: "n_scored"})
		if !ok {
			t.Fatalf("no n_scored for %d", y)
		}
		return int(r.Value)
	}
	n0, n1 := n(mv.StartYear), n(mv.EndYear)
	if !figures.SizeChanged(n0, n1) {
		t.Fatalf("the demo's scored counts %d and %d no longer differ by more than %v; choose years or a fixture where they do", n0, n1, figures.SizeChangeLimit)
	}
	com, err := narrative.Compose(m, b)
	if err != nil {
		t.Fatal(err)
	}
	if err := narrative.Verify(m, com); err != nil {
		t.Fatal(err)
	}
	verb := "grew"
	if n1 < n0 {
		verb = "fell"
	}
	want := fmt.Sprintf("The number of institutions scored %s from %s in %d to %s in %d", verb, format.Int(n0), mv.StartYear, format.Int(n1), mv.EndYear)
	for _, p := range com.Composite {
		for _, s := range p.Sentences {
			if strings.HasPrefix(s.Text, want) {
				if len(s.Claims) != 1 {
					t.Errorf("claims %v, want one comparing the two counts", s.Claims)
				}
				return
			}
		}
	}
	t.Errorf("no sentence starting %q", want)
}
