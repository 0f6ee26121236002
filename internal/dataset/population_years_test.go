package dataset

import (
	"strings"
	"testing"
)

// TestPopulationWindowsByYear: the rules as of each earlier year, on the
// files of TestLoadPipeline (data 2022-2024; papers summed over 3 years
// of at least 600). Worked by hand: the window ending 2022 holds one year
// of data, so its threshold is 600 x 1/3 = 200; ending 2023, two years,
// 400. A1 (200, 200, 250) passes both; B1 (100 a year) fails both; A2
// and B2 report papers in 2024 only and have no value in the windows; A2
// also lacks a mission.
func TestPopulationWindowsByYear(t *testing.T) {
	d, _, err := load(t, testBrief, testFiles())
	if err != nil {
		t.Fatal(err)
	}
	p := d.Population
	if p.Fixed || !d.PopulationByYear() {
		t.Fatalf("default should apply the rules as of each year: fixed %v, by year %v", p.Fixed, d.PopulationByYear())
	}
	for year, want := range map[int][]bool{2022: {true, false, false, false}, 2023: {true, false, false, false}} {
		for inst, w := range want {
			if got := d.InPopulationIn(inst, year); got != w {
				t.Errorf("%s in %d: %v, want %v", d.Register.Institutions[inst].ID, year, got, w)
			}
		}
	}
	if got := d.RankedIn(2024); got != 1 {
		t.Errorf("ranked in 2024 = %d, want 1 (A1)", got)
	}
	wantRule := map[int]string{
		2022: "papers in 2022 of at least 200 (600 over 3 years, scaled to the one year the data hold)",
		2023: "papers summed over 2022\u20132023 of at least 400 (600 over 3 years, scaled to the 2 years the data hold)",
	}
	for year, want := range wantRule {
		if got := p.YearRules[year][0]; got != want {
			t.Errorf("rule as of %d = %q, want %q", year, got, want)
		}
	}
	if got := p.Rules[0]; got != "papers summed over 2022\u20132024 of at least 600" {
		t.Errorf("reporting year's rule = %q", got)
	}
	if len(p.YearRules[2022]) != len(p.Rules) || !strings.Contains(p.YearRules[2022][1], "in 2022 of at most") {
		t.Errorf("every rule is restated as of each year: %q", p.YearRules[2022])
	}
}

// TestPopulationFixedPanel: earlier_years: fixed keeps the reporting
// year's population in every year.
func TestPopulationFixedPanel(t *testing.T) {
	src := strings.Replace(testBrief, "  require: [mission]\n", "  require: [mission]\n  earlier_years: fixed\n", 1)
	d, _, err := load(t, src, testFiles())
	if err != nil {
		t.Fatal(err)
	}
	if !d.Population.Fixed || d.PopulationByYear() {
		t.Fatal("fixed panel not set")
	}
	for inst := range d.Register.Institutions {
		if d.InPopulationIn(inst, 2022) != d.InPopulation(inst) {
			t.Errorf("inst %d differs in 2022 under a fixed panel", inst)
		}
	}
}
