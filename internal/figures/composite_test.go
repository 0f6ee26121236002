package figures

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"peerpack/internal/brief"
)

const fixtureComposite = `composite:
  pillars:
    - key: research
      weight: 2
      indicators: {fnci: 1}
    - key: teaching
      weight: 1
      indicators: {students_per_academic: 1, intl_share: 1}
  missing: {min_share: 0.6}
  uncertainty: {runs: 300, weights: 0.2, seed: 3}
`

// withComposite returns the fixture brief with a composite section.
func withComposite(t *testing.T, section string) *brief.Brief {
	t.Helper()
	src, err := os.ReadFile(filepath.Join(fixtureDir, "brief.md"))
	if err != nil {
		t.Fatal(err)
	}
	s := strings.Replace(string(src), "groups:\n", section+"groups:\n", 1)
	b, err := brief.Parse("brief.md", []byte(s))
	if err != nil {
		t.Fatal(err)
	}
	return b
}

// The composite of z-scores is the weighted mean of the focus's z-scores
// in the ranked population ("Everyone"), whose values R 4.2.2 checks in
// TestFixtureAgainstR, lower-is-better ones with their sign turned
// (Nardo et al. 2008, section 1.5: z-scores, then a linear aggregation).
func TestCompositeFromZScores(t *testing.T) {
	d, fb := loadFixture(t)
	b := withComposite(t, fixtureComposite)
	b.Named = fb.Named
	m, err := Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	z := func(ind string) float64 {
		p, ok := m.Position("Everyone", ind, m.Focus, 2025)
		if !ok || !p.HasValue {
			t.Fatalf("no position for %s", ind)
		}
		return p.Z
	}
	want := 2.0/3*z("fnci") + 1.0/3*(0.5*-z("students_per_academic")+0.5*z("intl_share"))
	row, ok := m.Lookup(Key{Section: SectionComposite, Indicator: "overall", Institution: m.FocusID, Year: 2025, Measure: "score"})
	if !ok {
		t.Fatal("no composite score for the focus")
	}
	cy, _ := m.Composite(2025)
	if cy.Result.Skew[0].Treated != "" {
		t.Skip("fixture indicator treated for skew")
	}
	if math.Abs(row.Value-want) > 1e-12 {
		t.Errorf("composite %.15g, weighted z-scores %.15g", row.Value, want)
	}
	for _, measure := range []string{"rank", "rank_low", "rank_median", "rank_high", "imputed", "missing"} {
		if _, ok := m.Lookup(Key{Section: SectionComposite, Indicator: "overall", Institution: m.FocusID, Year: 2025, Measure: measure}); !ok {
			t.Errorf("no %s row", measure)
		}
	}
	for _, k := range []Key{
		{Section: SectionComposite, Indicator: "teaching", Institution: m.FocusID, Year: 2025, Measure: "rank"},
		{Section: SectionComposite, Indicator: "fnci", Year: 2025, Measure: "skew_treatment"},
		{Section: SectionComposite, Indicator: "teaching", Year: 2025, Measure: "weight"},
		{Section: SectionComposite, Indicator: "overall", Year: 2025, Measure: "n_excluded"},
	} {
		if _, ok := m.Lookup(k); !ok {
			t.Errorf("no row %s", k)
		}
	}
	if _, ok := m.CompositeMovement(); !ok {
		t.Error("no movement over the span")
	}
}

// Problems the check reports at the composite's lines.
func TestCompositeCheck(t *testing.T) {
	d, _ := loadFixture(t)
	for _, c := range []struct{ from, to, want string }{
		{"fnci: 1", "size: 1", "composite pillar research: size is neutral"},
		{"fnci: 1", "fcni: 1", "indicator \"fcni\" is not in the dictionary indicators.yaml; did you mean \"fnci\"?"},
		{"  missing:", "  normalise: {distance: Chosen peer}\n  missing:", "the distance group \"Chosen peer\" is not defined under groups:; did you mean \"Chosen peers\"?"},
	} {
		b := withComposite(t, strings.Replace(fixtureComposite, c.from, c.to, 1))
		_, err := Compute(d, b)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: got %v, want %q", c.to, err, c.want)
		}
	}
}
