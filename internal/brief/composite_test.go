package brief

import (
	"strings"
	"testing"
)

const compositeFront = `---
title: T
focus: A1
year: 2025
data: {register: r.csv, values: v.csv, dictionary: d.yaml}
composite:
  normalise: {distance: Peers}
  pillars:
    - key: reach
      label: Reach
      weight: 0.4
      indicators: {intl_staff_share: 1, intl_coauthorship: 2}
    - key: output
      weight: 0.6
      indicators:
        citation_impact: 2
        students_per_academic: 1
  aggregate: arithmetic
  missing: {min_share: 0.5, impute: pillar-mean}
  skew: {treat: winsorise 3}
  uncertainty: {runs: 200, weights: 0.1, normalise: [zscore, percentile], impute: [none, group-median], seed: 9}
  headroom: {places: 3}
---
Body.
`

func TestCompositeSection(t *testing.T) {
	b, err := Parse("brief.md", []byte(compositeFront))
	if err != nil {
		t.Fatal(err)
	}
	c := b.Composite
	if c.Normalise != "distance" || c.DistanceGroup != "Peers" || c.Impute != "pillar-mean" || c.MinShare != 0.5 ||
		c.Skew != "winsorise" || c.SkewValues != 3 || c.Runs != 200 || c.WeightSpread != 0.1 || c.Seed != 9 ||
		c.HeadroomPlaces != 3 || len(c.Normalisations) != 2 || len(c.Imputations) != 2 {
		t.Fatalf("decoded %+v", c)
	}
	if len(c.Pillars) != 2 || c.Pillars[1].Label != "output" || c.Pillars[0].Pos.Line != 9 {
		t.Fatalf("pillars %+v", c.Pillars)
	}
	ind := c.Pillars[1].Indicators[1]
	if ind.Key != "students_per_academic" || ind.Weight != 1 || ind.Pos.Line != 17 || ind.Pos.Column != 9 {
		t.Errorf("indicator %+v", ind)
	}
}

// Each mistake is reported at its line with what to write instead.
func TestCompositeErrors(t *testing.T) {
	cases := []struct{ from, to, want string }{
		{"normalise: {distance: Peers}", "normalise: z-score", "brief.md:7:3: normalisation \"z-score\" is not available; did you mean \"zscore\"?"},
		{"normalise: {distance: Peers}", "normalise: {distance: Peers}\n  weights: 1", "brief.md:8:3: unknown key \"weights\" in composite"},
		{"weight: 0.4", "weight: -1", "brief.md:9:7: pillar reach: weight must be a positive number"},
		{"intl_coauthorship: 2}", "intl_coauthorship: two}", "brief.md:12:60: the weight of intl_coauthorship must be a number"},
		{"students_per_academic: 1", "intl_staff_share: 1", "brief.md:17:9: indicator intl_staff_share is already in pillar reach"},
		{"aggregate: arithmetic", "aggregate: geometric", "brief.md:18:3: geometric aggregation needs positive values, and zscore gives"},
		{"treat: winsorise 3", "treat: trim", "brief.md:20:10: skew treatment \"trim\" is not available"},
		{"runs: 200", "runs: -5", "brief.md:21:17: runs must lie between 0"},
		{"key: reach", "key: overall", "brief.md:9:7: pillar key \"overall\" is taken"},
	}
	for _, c := range cases {
		src := strings.Replace(compositeFront, c.from, c.to, 1)
		if c.to == "aggregate: geometric" {
			src = strings.Replace(src, "normalise: [zscore, percentile]", "normalise: [percentile]", 1)
			src = strings.Replace(src, "normalise: {distance: Peers}", "normalise: zscore", 1)
		}
		_, err := Parse("brief.md", []byte(src))
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: got %v, want %q", c.to, err, c.want)
		}
	}
}
