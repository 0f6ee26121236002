package figures

import (
	"fmt"
	"math"
	"strings"
	"testing"
	"testing/fstest"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
)

// A hand-worked world for the population over time. Seven institutions,
// all in Kestria; the rule is "papers summed over 2 years of at least
// 100", the span 2022-2024, the reporting year 2024, the data 2021-2024.
//
//	papers 2021..2024   two-year totals ending 2022, 2023, 2024   ranked in
//	P1 60 60 60 60      120 120 120                              2022 2023 2024
//	P2 10 10 80 80       20  90 160                                        2024
//	P3 80 80 10 10      160  90  20                              2022
//	P4 50 50 50 50      100 100 100 (at least: kept)             2022 2023 2024
//	P5 70 70 70 70      140 140 140                              2022 2023 2024
//	P6 40 40 40 40       80  80  80                              never
//	P7  0  0  0 120       0   0 120                                        2024
//
// score (higher is better), 2022, 2023, 2024:
//
//	P1 5 5 5; P2 2 2 2; P3 8 8 8; P4 3 4 5.5; P5 1 1 1; P6 7 7 7; P7 6 6 6
//
// All figures below are computed by hand from these tables.
const popYearsRegister = "id,name,country,region\n" +
	"P1,Alder,Kestria,North\nP2,Birch,Kestria,North\nP3,Cedar,Kestria,North\nP4,Dogwood,Kestria,North\n" +
	"P5,Elder,Kestria,North\nP6,Fir,Kestria,North\nP7,Gorse,Kestria,North\n"

const popYearsDict = `indicators:
  - {key: papers, label: Papers, unit: count, better: higher, decimals: 0}
  - {key: score, label: Score, unit: ratio, better: higher, decimals: 1}
`

func popYearsValues() string {
	papers := map[string][4]float64{
		"P1": {60, 60, 60, 60}, "P2": {10, 10, 80, 80}, "P3": {80, 80, 10, 10}, "P4": {50, 50, 50, 50},
		"P5": {70, 70, 70, 70}, "P6": {40, 40, 40, 40}, "P7": {0, 0, 0, 120},
	}
	score := map[string][3]float64{
		"P1": {5, 5, 5}, "P2": {2, 2, 2}, "P3": {8, 8, 8}, "P4": {3, 4, 5.5}, "P5": {1, 1, 1}, "P6": {7, 7, 7}, "P7": {6, 6, 6},
	}
	var b strings.Builder
	b.WriteString("institution,year,indicator,value\n")
	for _, id := range []string{"P1", "P2", "P3", "P4", "P5", "P6", "P7"} {
		for j, v := range papers[id] {
			fmt.Fprintf(&b, "%s,%d,papers,%v\n", id, 2021+j, v)
		}
		for j, v := range score[id] {
			fmt.Fprintf(&b, "%s,%d,score,%v\n", id, 2022+j, v)
		}
	}
	return b.String()
}

func popYearsModel(t *testing.T, earlier string) *Model {
	t.Helper()
	src := `---
title: T
focus: P1
year: 2024
years: [2022, 2024]
data: {register: reg.csv, values: values.csv, dictionary: dict.yaml}
groups:
  - name: Sector
    where: {country: Kestria}
  - name: Listed
    members: [P1, P2, P3]
named: [P2]
population:
  min_total: [{indicator: papers, years: 2, at_least: 100}]
` + earlier + `---
`
	b, err := brief.Parse("brief.md", []byte(src))
	if err != nil {
		t.Fatalf("brief: %v", err)
	}
	fsys := fstest.MapFS{
		"reg.csv":    {Data: []byte(popYearsRegister)},
		"dict.yaml":  {Data: []byte(popYearsDict)},
		"values.csv": {Data: []byte(popYearsValues())},
	}
	d, _, err := dataset.Load(fsys, b)
	if err != nil {
		t.Fatalf("load: %v", err)
	}
	m, err := Compute(d, b)
	if err != nil {
		t.Fatalf("compute: %v", err)
	}
	return m
}

func idList(m *Model, insts []int) string {
	out := make([]string, len(insts))
	for i, inst := range insts {
		out[i] = m.InstitutionID(inst)
	}
	return strings.Join(out, " ")
}

// TestPopulationAsOfEachYear: by default each year ranks the institutions
// that met the rule as of that year (computed by hand, see the tables
// above).
func TestPopulationAsOfEachYear(t *testing.T) {
	m := popYearsModel(t, "")
	g, _ := m.Group("Sector")
	for year, want := range map[int]string{2022: "P1 P3 P4 P5", 2023: "P1 P4 P5", 2024: "P1 P2 P4 P5 P7"} {
		if got := idList(m, g.MembersIn(year)); got != want {
			t.Errorf("Sector members in %d = %s, want %s", year, got, want)
		}
	}
	if got := idList(m, g.Members); got != "P1 P2 P4 P5 P7" {
		t.Errorf("Sector members (reporting year) = %s", got)
	}
	// A listed group keeps its listed members that pass in each year.
	l, _ := m.Group("Listed")
	for year, want := range map[int]string{2022: "P1 P3", 2023: "P1", 2024: "P1 P2"} {
		if got := idList(m, l.MembersIn(year)); got != want {
			t.Errorf("Listed members in %d = %s, want %s", year, got, want)
		}
	}
	cases := []struct {
		year                 int
		n                    int
		median               float64
		rank, of             int
		percentile           float64
		p2Rank, p2Of         int
		p2Percentile         float64
		p2InGroup, p2Missing bool
	}{
		// 2022: {5, 8, 3, 1}; type 7 median of 1 3 5 8 = 3 + 0.5 x 2 = 4;
		// P1 second, percentile 100 x (2 + 1/2) / 4 = 62.5. P2 (value 2) is
		// outside and placed as one more value: behind 5, 8, 3, so 4th of 5,
		// percentile 100 x (1 + 1/2) / 5 = 30.
		{2022, 4, 4, 2, 4, 62.5, 4, 5, 30, false, false},
		// 2023: {5, 4, 1}; median 4; P1 first, 100 x 2.5 / 3.
		{2023, 3, 4, 1, 3, 250.0 / 3, 3, 4, 100 * 1.5 / 4, false, false},
		// 2024: {5, 2, 5.5, 1, 6}; median of 1 2 5 5.5 6 = 5; P1 third,
		// 100 x 2.5 / 5 = 50; P2 fourth of 5, 100 x 1.5 / 5 = 30.
		{2024, 5, 5, 3, 5, 50, 4, 5, 30, true, false},
	}
	for _, c := range cases {
		d, ok := m.Distribution("Sector", "score", c.year)
		if !ok || d.N != c.n || d.Missing != 0 || math.Abs(d.Median-c.median) > 1e-12 {
			t.Errorf("%d: distribution %+v, want n %d median %v", c.year, d, c.n, c.median)
		}
		p, _ := m.Position("Sector", "score", m.Focus, c.year)
		if p.Rank != c.rank || p.Of != c.of || math.Abs(p.Percentile-c.percentile) > 1e-9 || !p.InGroup {
			t.Errorf("%d: P1 at %d of %d, %v (in %v); want %d of %d, %v", c.year, p.Rank, p.Of, p.Percentile, p.InGroup, c.rank, c.of, c.percentile)
		}
		p2, _ := m.Position("Sector", "score", m.Data.Register.Index("P2"), c.year)
		if p2.Rank != c.p2Rank || p2.Of != c.p2Of || math.Abs(p2.Percentile-c.p2Percentile) > 1e-9 || p2.InGroup != c.p2InGroup {
			t.Errorf("%d: P2 at %d of %d, %v (in %v); want %d of %d, %v (in %v)", c.year, p2.Rank, p2.Of, p2.Percentile, p2.InGroup, c.p2Rank, c.p2Of, c.p2Percentile, c.p2InGroup)
		}
	}
	// The trend: rank 2 -> 3 (rank_change -1), percentile 62.5 -> 50
	// (-12.5); n 4 -> 5 is more than 10 % of 4, so percentiles are
	// preferred. The constant panel is P1, P4, P5 (members in 2022 and
	// 2024): 2022 {5, 3, 1} puts P1 first, 2024 {5, 5.5, 1} second.
	tr, _ := m.Trend("Sector", "score", m.Focus)
	if tr.RankChange != -1 || math.Abs(tr.PercentileChange+12.5) > 1e-9 || !tr.PreferPercentiles || tr.StartOf != 4 || tr.EndOf != 5 {
		t.Errorf("trend %+v", tr)
	}
	if tr.PanelOf != 3 || tr.PanelStartRank != 1 || tr.PanelEndRank != 2 || tr.PanelRankChange != -1 {
		t.Errorf("panel: of %d, %d -> %d (%d); want of 3, 1 -> 2 (-1)", tr.PanelOf, tr.PanelStartRank, tr.PanelEndRank, tr.PanelRankChange)
	}
	// P2 is outside the group in 2022 (member in 2024 only), so it is not
	// in the panel and is placed as one more value at both ends: 2022
	// {5, 3, 1} + 2 -> 3rd of 4; 2024 {5, 5.5, 1} + 2 -> 3rd of 4.
	t2, _ := m.Trend("Sector", "score", m.Data.Register.Index("P2"))
	if t2.PanelOf != 4 || t2.PanelStartRank != 3 || t2.PanelEndRank != 3 || t2.PanelRankChange != 0 {
		t.Errorf("P2 panel: of %d, %d -> %d", t2.PanelOf, t2.PanelStartRank, t2.PanelEndRank)
	}
	// The figures file holds each year's ranked count and the mode.
	for _, c := range []struct {
		k    Key
		want float64
	}{
		{Key{Section: SectionPopulation, Year: 2022, Measure: "n_ranked"}, 4},
		{Key{Section: SectionPopulation, Year: 2023, Measure: "n_ranked"}, 3},
		{Key{Section: SectionPopulation, Year: 2024, Measure: "n_ranked"}, 5},
		{Key{Section: SectionPopulation, Year: 2023, Measure: "n_excluded"}, 4},
		{Key{Section: SectionGroup, Group: "Sector", Year: 2022, Measure: "n_members"}, 4},
		{Key{Section: SectionGroup, Group: "Listed", Year: 2023, Measure: "n_members"}, 1},
		{Key{Section: SectionTrend, Group: "Sector", Indicator: "score", Institution: "P1", Measure: "panel_of"}, 3},
		{Key{Section: SectionTrend, Group: "Sector", Indicator: "score", Institution: "P1", Measure: "panel_rank_change"}, -1},
	} {
		if r, ok := m.Lookup(c.k); !ok || r.Value != c.want {
			t.Errorf("%s = %v (%v), want %v", c.k, r.Value, ok, c.want)
		}
	}
	if r, ok := m.Lookup(Key{Section: SectionPopulation, Measure: "earlier_years"}); !ok || r.Text != "rolling" {
		t.Errorf("earlier_years = %q", r.Text)
	}
	if got := m.Data.Population.YearRules[2022][0]; got != "papers summed over 2021\u20132022 of at least 100" {
		t.Errorf("2022 rule text %q", got)
	}
}

// TestPopulationFixedPanel: earlier_years: fixed ranks the reporting
// year's population in every year (computed by hand from the same
// tables).
func TestPopulationFixedPanel(t *testing.T) {
	m := popYearsModel(t, "  earlier_years: fixed\n")
	g, _ := m.Group("Sector")
	for _, year := range []int{2022, 2023, 2024} {
		if got := idList(m, g.MembersIn(year)); got != "P1 P2 P4 P5 P7" {
			t.Errorf("fixed: members in %d = %s", year, got)
		}
	}
	// 2022: {5, 2, 3, 1, 6}: median 3, P1 second of 5, 100 x 3.5 / 5 = 70.
	d, _ := m.Distribution("Sector", "score", 2022)
	p, _ := m.Position("Sector", "score", m.Focus, 2022)
	if d.N != 5 || d.Median != 3 || p.Rank != 2 || p.Of != 5 || p.Percentile != 70 {
		t.Errorf("fixed 2022: n %d median %v rank %d of %d pct %v", d.N, d.Median, p.Rank, p.Of, p.Percentile)
	}
	// 2022 -> 2024: rank 2 -> 3, percentile 70 -> 50; the panel is the
	// whole group (all five report both years), so its ranks are the
	// group's.
	tr, _ := m.Trend("Sector", "score", m.Focus)
	if tr.RankChange != -1 || tr.PercentileChange != -20 || tr.PreferPercentiles || tr.PanelOf != 5 || tr.PanelStartRank != 2 || tr.PanelEndRank != 3 {
		t.Errorf("fixed trend %+v", tr)
	}
	if r, ok := m.Lookup(Key{Section: SectionPopulation, Measure: "earlier_years"}); !ok || r.Text != "fixed" {
		t.Errorf("earlier_years = %q", r.Text)
	}
	if _, ok := m.Lookup(Key{Section: SectionPopulation, Year: 2022, Measure: "n_ranked"}); ok {
		t.Error("a fixed panel has no per-year counts")
	}
}

// The rows of a model with populations by year stay in key order and each
// is found again by Lookup (the figures file's contract).
func TestPopulationYearsRowsSorted(t *testing.T) {
	m := popYearsModel(t, "")
	var prev *Key
	n := 0
	for r := range m.Rows() {
		if prev != nil && compareKeys(*prev, r.Key) >= 0 {
			t.Fatalf("rows out of order: %s then %s", prev, r.Key)
		}
		k := r.Key
		prev = &k
		if got, ok := m.Lookup(r.Key); !ok || got != r {
			t.Fatalf("Lookup(%s) = %+v, %v; the row is %+v", r.Key, got, ok, r)
		}
		n++
	}
	if n == 0 {
		t.Fatal("no rows")
	}
}
