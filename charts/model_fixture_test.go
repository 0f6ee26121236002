package charts

import (
	"fmt"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
)

// The model fixture is an invented scenario: two invented countries,
// invented institutions and values drawn from a fixed seed.

var fixtureIndicators = []dataset.Indicator{
	{Key: "fnci", Label: "Field-normalised citation impact", Short: "Citation impact", Unit: dataset.UnitIndex, Better: dataset.HigherIsBetter, Decimals: 2},
	{Key: "intl_staff", Label: "International academic staff", Short: "International staff", Unit: dataset.UnitPercent, Better: dataset.HigherIsBetter, Decimals: 1},
	{Key: "ssr", Label: "Students per academic", Short: "Students per academic", Unit: dataset.UnitRatio, Better: dataset.LowerIsBetter, Decimals: 1},
	{Key: "income", Label: "Research income per academic", Short: "Research income", Unit: dataset.UnitCurrency, Currency: true, Better: dataset.HigherIsBetter, Decimals: 0},
	// Two more shares, drawn after the others so their values stay as they were.
	{Key: "field_a", Label: "Share of papers in natural sciences", Short: "Natural sciences", Unit: dataset.UnitPercent, Better: dataset.Neutral, Decimals: 1},
	{Key: "field_b", Label: "Share of papers in social sciences", Short: "Social sciences", Unit: dataset.UnitPercent, Better: dataset.Neutral, Decimals: 1},
	// Esteem in three fields (the most voted = 100), drawn after the others.
	{Key: "peer_esteem_natural", Label: "Peer esteem in the natural sciences", Short: "Natural sciences", Unit: dataset.UnitScore, Better: dataset.HigherIsBetter, Decimals: 1},
	{Key: "peer_esteem_health", Label: "Peer esteem in the medical and health sciences", Short: "Medical, health", Unit: dataset.UnitScore, Better: dataset.HigherIsBetter, Decimals: 1},
	{Key: "peer_esteem_social", Label: "Peer esteem in the social sciences", Short: "Social sciences", Unit: dataset.UnitScore, Better: dataset.HigherIsBetter, Decimals: 1},
}

var fixtureYears = []int{2021, 2022, 2023, 2024, 2025}

// fixtureNames are invented names; the first three carry diacritics a
// chart must print.
var fixtureNames = []string{"Høgskolen i Vårdø", "Université de Saint-Éluard", "Politechnika Źródłowa", "Kestria Institute of Technology", "University of Lesser Ostmark", "Ostmark College of Applied Sciences and Maritime Studies"}

// buildModel makes a register of n invented institutions in Kestria and
// Aldmere, values for every indicator and year, and computes the figures
// model of the brief body given.
func buildModel(t testing.TB, n int, body string) (*figures.Model, *brief.Brief) {
	t.Helper()
	r := rand.New(rand.NewPCG(2026, 4))
	insts := make([]dataset.Institution, n)
	for i := range insts {
		country, prefix := "Kestria", "KE"
		if i%2 == 1 {
			country, prefix = "Aldmere", "AL"
		}
		name := fmt.Sprintf("%s University %03d", country, i)
		attrs := map[string]string{"mission": []string{"research", "technical", "teaching"}[i%3], "short_name": ""}
		if i < len(fixtureNames) {
			name = fixtureNames[i]
		}
		if i == 5 {
			attrs["short_name"] = "Ostmark College"
		}
		region := "North"
		if country == "Aldmere" {
			region = "West"
		}
		insts[i] = dataset.Institution{ID: fmt.Sprintf("%s%03d", prefix, i), Name: name, Country: country, Region: region, Attrs: attrs}
	}
	reg := dataset.NewRegister("register.csv", insts, []string{"mission", "short_name"})
	dict := dataset.NewDictionary("indicators.yaml", fixtureIndicators)
	d := dataset.New(reg, dict, fixtureYears)
	means := []float64{1, 18, 16, 90000, 30, 20, 30, 25, 20}
	sds := []float64{0.3, 6, 4, 30000, 8, 6, 15, 12, 10}
	for k := range fixtureIndicators {
		for i := range insts {
			base := means[k] + sds[k]*r.NormFloat64()
			for y, year := range fixtureYears {
				v := math.Max(base*(1+0.03*float64(y))+sds[k]*0.1*r.NormFloat64(), 0.01)
				if i == 7 && k == 1 && year == 2023 {
					continue // one missing value
				}
				d.Set(k, i, year, v)
			}
		}
	}
	src := `---
title: Chart fixture
focus: KE000
year: 2025
years: [2021, 2025]
data:
  register: register.csv
  values: values.csv
  dictionary: indicators.yaml
groups:
  - name: Kestria national
    where: {country: Kestria}
  - name: Aldmere national
    where: {country: Aldmere}
  - name: Research mission
    where: {mission: research}
---
` + body
	b, err := brief.Parse("brief.md", []byte(src))
	if err != nil {
		t.Fatalf("brief: %v", err)
	}
	m, err := figures.Compute(d, b)
	if err != nil {
		t.Fatalf("figures: %v", err)
	}
	return m, b
}

// goldenBody has one chart block of every kind (and some variants).
const goldenBody = "# Charts\n" +
	"\n```chart\nkind: box\nindicators: [fnci]\nlabel: [AL001, KE002]\n```\n" +
	"\n```chart\nkind: box\nindicators: [fnci, ssr]\ngroups: [Kestria national, Aldmere national]\norientation: vertical\n```\n" +
	"\n```chart\nkind: radar\nindicators: [fnci, intl_staff, ssr, income]\ngroups: [Kestria national, Research mission]\n```\n" +
	"\n```chart\nkind: radar\nindicators: [fnci, intl_staff, ssr, income]\ngroups: [Kestria national]\nscale: range\n```\n" +
	"\n```chart\nkind: trend\nindicators: [intl_staff]\ngroups: [Kestria national, Aldmere national]\nlabel: [KE002]\n```\n" +
	"\n```chart\nkind: scatter\nindicators: [intl_staff, fnci]\ngroups: [Kestria national, Aldmere national]\nlabel: [AL001]\nfit: true\n```\n" +
	"\n```chart\nkind: heatmap\nindicators: [fnci, intl_staff, ssr, income]\ngroups: [Kestria national]\nlabel: [KE002]\nlimit: 12\n```\n" +
	"\n```chart\nkind: bars\nindicators: [fnci]\ngroups: [Kestria national]\nlimit: 10\n```\n" +
	"\n```chart\nkind: esteem\nindicators: [intl_staff, fnci]\ngroups: [Kestria national, Aldmere national]\nlabel: [AL001]\n```\n" +
	"\n```chart\nkind: vote-profile\nindicators: [peer_esteem_natural, peer_esteem_health, peer_esteem_social]\ngroups: [Kestria national, Aldmere national]\n```\n"

// chartBlocks returns the brief's chart blocks.
func chartBlocks(b *brief.Brief) []*brief.ChartBlock {
	var out []*brief.ChartBlock
	for _, blk := range b.Blocks {
		if c, ok := blk.(*brief.ChartBlock); ok {
			out = append(out, c)
		}
	}
	return out
}

// blockName names a block for files: kind, plus orientation or scale.
func blockName(c *brief.ChartBlock) string {
	parts := []string{c.Type}
	if c.Orientation != "" {
		parts = append(parts, c.Orientation)
	}
	if c.Scale != "" {
		parts = append(parts, c.Scale)
	}
	return strings.Join(parts, "-")
}
