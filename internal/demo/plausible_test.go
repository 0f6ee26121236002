package demo

import (
	"bytes"
	"encoding/csv"
	"math"
	"sort"
	"strconv"
	"testing"

	"peerpack/internal/dataset"
	"peerpack/internal/yamlx"
)

// scenarioTable reads the scenario's values back from its files, the way a
// user's tool would, so the checks below test the files and not the
// generator's memory.
type scenarioTable struct {
	country map[string]string                     // id -> country
	mission map[string]string                     // id -> mission
	val     map[string]map[int]map[string]float64 // id -> year -> key
	ppp     map[string]map[int]float64
	dict    map[string]dataset.Indicator
	missing int // empty cells in the wide file and n/a in the long one
}

func readCSV(t *testing.T, name string) [][]string {
	t.Helper()
	rows, err := csv.NewReader(bytes.NewReader(Files()[name])).ReadAll()
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	return rows
}

func parseNum(t *testing.T, file, s string) float64 {
	t.Helper()
	v, err := strconv.ParseFloat(s, 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		t.Fatalf("%s: %q is not a finite number", file, s)
	}
	return v
}

func loadTable(t *testing.T) *scenarioTable {
	t.Helper()
	s := &scenarioTable{country: map[string]string{}, mission: map[string]string{}, val: map[string]map[int]map[string]float64{}, ppp: map[string]map[int]float64{}, dict: map[string]dataset.Indicator{}}
	for _, r := range readCSV(t, RegisterName)[1:] {
		s.country[r[0]], s.mission[r[0]] = r[2], r[6]
	}
	set := func(file, id string, year int, key string, v float64) {
		if _, ok := s.country[id]; !ok {
			t.Fatalf("%s: institution %s is not in the register", file, id)
		}
		if s.val[id] == nil {
			s.val[id] = map[int]map[string]float64{}
		}
		if s.val[id][year] == nil {
			s.val[id][year] = map[string]float64{}
		}
		if _, dup := s.val[id][year][key]; dup {
			t.Fatalf("%s: %s %d %s given twice", file, id, year, key)
		}
		s.val[id][year][key] = v
	}
	for _, r := range readCSV(t, ValuesName)[1:] {
		y, _ := strconv.Atoi(r[1])
		if r[3] == "n/a" {
			s.missing++
			continue
		}
		set(ValuesName, r[0], y, r[2], parseNum(t, ValuesName, r[3]))
	}
	wide := readCSV(t, WideValuesName)
	for _, r := range wide[1:] {
		y, _ := strconv.Atoi(r[1])
		for j, cell := range r[2:] {
			if cell == "" {
				s.missing++
				continue
			}
			set(WideValuesName, r[0], y, wide[0][j+2], parseNum(t, WideValuesName, cell))
		}
	}
	for _, r := range readCSV(t, PPPName)[1:] {
		y, _ := strconv.Atoi(r[1])
		if s.ppp[r[0]] == nil {
			s.ppp[r[0]] = map[int]float64{}
		}
		s.ppp[r[0]][y] = parseNum(t, PPPName, r[2])
	}
	node, err := yamlx.Parse(DictionaryName, Files()[DictionaryName], 0)
	if err != nil {
		t.Fatal(err)
	}
	var d struct {
		Indicators []dataset.Indicator `yaml:"indicators"`
	}
	if err := yamlx.Decode(DictionaryName, node, &d); err != nil {
		t.Fatal(err)
	}
	for _, ind := range d.Indicators {
		s.dict[ind.Key] = ind
	}
	return s
}

// column returns one indicator for every institution with a value in the
// year; per-academic money is converted at PPP as peerpack does.
func (s *scenarioTable) column(year int, key string) (ids []string, vs []float64) {
	var all []string
	for id := range s.val {
		all = append(all, id)
	}
	sort.Strings(all)
	for _, id := range all {
		row := s.val[id][year]
		var v float64
		var ok bool
		switch key {
		case "papers_per_academic":
			v, ok = ratio(row, "papers", "academic_fte")
		case "research_income_per_academic", "industry_income_per_academic":
			v, ok = ratio(row, key[:len(key)-len("_per_academic")], "academic_fte")
			v /= s.ppp[s.country[id]][year]
		default:
			v, ok = row[key]
		}
		if ok && !math.IsNaN(v) {
			ids, vs = append(ids, id), append(vs, v)
		}
	}
	return ids, vs
}

func ratio(row map[string]float64, a, b string) (float64, bool) {
	x, ok1 := row[a]
	y, ok2 := row[b]
	if !ok1 || !ok2 || y == 0 {
		return math.NaN(), false
	}
	return x / y, true
}

func median(v []float64) float64 {
	s := append([]float64(nil), v...)
	sort.Float64s(s)
	n := len(s)
	if n%2 == 1 {
		return s[n/2]
	}
	return (s[n/2-1] + s[n/2]) / 2
}

func mean(v []float64) float64 {
	sum := 0.0
	for _, x := range v {
		sum += x
	}
	return sum / float64(len(v))
}

// pearson is the sample correlation coefficient (textbook definition).
func pearson(x, y []float64) float64 {
	mx, my := mean(x), mean(y)
	var sxy, sxx, syy float64
	for i := range x {
		sxy += (x[i] - mx) * (y[i] - my)
		sxx += (x[i] - mx) * (x[i] - mx)
		syy += (y[i] - my) * (y[i] - my)
	}
	return sxy / math.Sqrt(sxx*syy)
}

func TestScenarioShape(t *testing.T) {
	s := loadTable(t)
	// The brief asks for about 900 institutions in five or six systems.
	if n := len(s.country); n < 850 || n > 950 {
		t.Errorf("%d institutions, want about 900", n)
	}
	systems := map[string]int{}
	for _, c := range s.country {
		systems[c]++
	}
	if len(systems) < 5 || len(systems) > 6 {
		t.Errorf("%d systems, want five or six", len(systems))
	}
	// Every country has a PPP factor for every year (a missing factor is
	// a load error by the dataset contract).
	for c := range systems {
		for y := FirstYear; y <= LastYear; y++ {
			if f := s.ppp[c][y]; f <= 0 {
				t.Errorf("no PPP factor for %s %d", c, y)
			}
		}
	}
	// Young institutions enter later, so the group grows.
	ids20, _ := s.column(FirstYear, "papers")
	ids25, _ := s.column(LastYear, "papers")
	if len(ids25) <= len(ids20) {
		t.Errorf("institutions with papers: %d in %d, %d in %d; young ones should enter later", len(ids20), FirstYear, len(ids25), LastYear)
	}
	if s.missing < 100 {
		t.Errorf("only %d missing values; the demo should show how gaps are handled", s.missing)
	}
	// Every raw key is in the dictionary with the matching unit range.
	for _, k := range append(append([]string(nil), longKeys...), wideKeys...) {
		if _, ok := s.dict[k]; !ok {
			t.Errorf("data key %s is not in the dictionary", k)
		}
	}
	if len(s.dict) < 12 {
		t.Errorf("dictionary has %d indicators, want twelve or more", len(s.dict))
	}
}

func TestBoundsAndSkew(t *testing.T) {
	s := loadTable(t)
	for key, ind := range s.dict {
		if ind.Derive != "" {
			continue
		}
		for y := FirstYear; y <= LastYear; y++ {
			_, vs := s.column(y, key)
			for _, v := range vs {
				switch {
				case ind.Unit == dataset.UnitPercent && (v < 0 || v > 100):
					t.Fatalf("%s %d: percent %v outside 0..100", key, y, v)
				case ind.Unit == dataset.UnitScore && (v < 0 || v > 100):
					t.Fatalf("%s %d: score %v outside 0..100", key, y, v)
				case v < 0:
					t.Fatalf("%s %d: negative value %v", key, y, v)
				}
			}
		}
	}
	// Subject shares of one institution add up to 100 within rounding.
	for id, years := range s.val {
		for y, row := range years {
			sum, n := 0.0, 0
			for _, sub := range subjects {
				if v, ok := row[sub.Key]; ok {
					sum += v
					n++
				}
			}
			if n == len(subjects) && math.Abs(sum-100) > 0.35 {
				t.Fatalf("%s %d: subject shares sum to %v", id, y, sum)
			}
		}
	}
	// Money is right-skewed: the mean lies above the median in every
	// system (a log-normal has mean exp(mu+sigma^2/2) > median exp(mu)).
	for _, key := range []string{"research_income_per_academic", "industry_income_per_academic", "reputation_votes"} {
		_, vs := s.column(LastYear, key)
		if m, md := mean(vs), median(vs); !(m > 1.05*md) {
			t.Errorf("%s: mean %.0f not above median %.0f; incomes and votes should be skewed", key, m, md)
		}
	}
	// Citation impact centres near the world average of 1.
	_, fw := s.column(LastYear, "fwci")
	if md := median(fw); md < 0.6 || md > 1.4 {
		t.Errorf("median FWCI %.2f, want near 1", md)
	}
}

func TestResearchMeasuresCorrelate(t *testing.T) {
	s := loadTable(t)
	pairs := [][2]string{
		{"papers_per_academic", "fwci"},
		{"papers_per_academic", "research_income_per_academic"},
		{"research_income_per_academic", "fwci"},
		{"papers_per_academic", "doctorates"},
	}
	for _, p := range pairs {
		ida, a := s.column(LastYear, p[0])
		idb, b := s.column(LastYear, p[1])
		bv := map[string]float64{}
		for i, id := range idb {
			bv[id] = b[i]
		}
		var x, y []float64
		for i, id := range ida {
			if v, ok := bv[id]; ok && a[i] > 0 && v > 0 {
				// Correlate logs: the measures are multiplicative.
				x, y = append(x, math.Log(a[i])), append(y, math.Log(v))
			}
		}
		if r := pearson(x, y); r < 0.3 {
			t.Errorf("correlation of log %s and log %s is %.2f; research measures should move together", p[0], p[1], r)
		}
	}
}

func TestPopulationRuleSplitsTheRegister(t *testing.T) {
	s := loadTable(t)
	// At least 1,000 papers over the five years to the last year (common
	// practice, no source): the demo needs a population that excludes a
	// real share of small and teaching-led institutions.
	pass, teachingPass, teaching := 0, 0, 0
	for id, years := range s.val {
		total := 0.0
		for y := LastYear - 4; y <= LastYear; y++ {
			total += years[y]["papers"]
		}
		if total >= 1000 {
			pass++
		}
		if s.mission[id] == "teaching" {
			teaching++
			if total >= 1000 {
				teachingPass++
			}
		}
	}
	share := float64(pass) / float64(len(s.val))
	if share < 0.3 || share > 0.75 {
		t.Errorf("%.0f%% pass the population rule; want a population that excludes some but not most", 100*share)
	}
	if float64(teachingPass) > 0.2*float64(teaching) {
		t.Errorf("%d of %d teaching-led institutions pass; they should mostly fall below the papers threshold", teachingPass, teaching)
	}
}

func TestFocusAndPeers(t *testing.T) {
	s := loadTable(t)
	if s.country[FocusID] != "Kestria" || s.mission[FocusID] != "research" {
		t.Fatalf("focus %s is %s/%s, want a Kestrian research university", FocusID, s.country[FocusID], s.mission[FocusID])
	}
	for y := FirstYear; y <= LastYear; y++ {
		for _, k := range append(append([]string(nil), longKeys...), wideKeys...) {
			if _, ok := s.val[FocusID][y][k]; !ok {
				t.Errorf("focus has no %s in %d; the demo's focus should be complete", k, y)
			}
		}
	}
	for _, p := range ChosenPeers {
		if s.mission[p] != "research" {
			t.Errorf("chosen peer %s has mission %q, want research", p, s.mission[p])
		}
	}
	// The story of the demo pack: strong citation impact, falling
	// international student share.
	ids, fw := s.column(LastYear, "fwci")
	var focus float64
	var sector []float64
	for i, id := range ids {
		if s.country[id] == "Kestria" {
			sector = append(sector, fw[i])
		}
		if id == FocusID {
			focus = fw[i]
		}
	}
	if focus <= median(sector) {
		t.Errorf("focus FWCI %.2f not above the Kestrian median %.2f", focus, median(sector))
	}
	if a, b := s.val[FocusID][FirstYear]["intl_students"], s.val[FocusID][LastYear]["intl_students"]; b >= a {
		t.Errorf("focus international students %.1f -> %.1f; the demo should show a decline", a, b)
	}
}

func TestRecordSamples(t *testing.T) {
	s := loadTable(t)
	papers := readCSV(t, PapersName)
	countriesOf := map[string]map[string]bool{}
	for _, r := range papers[1:] {
		if _, ok := s.country[r[5]]; !ok {
			t.Fatalf("papers.csv: institution %s not in the register", r[5])
		}
		if s.country[r[5]] != r[6] {
			t.Fatalf("papers.csv: %s is in %s, not %s", r[5], s.country[r[5]], r[6])
		}
		if c := parseNum(t, PapersName, r[3]); c < 0 || c != math.Trunc(c) {
			t.Fatalf("papers.csv: citations %q", r[3])
		}
		if parseNum(t, PapersName, r[4]) <= 0 {
			t.Fatalf("papers.csv: expected citations %q", r[4])
		}
		if countriesOf[r[0]] == nil {
			countriesOf[r[0]] = map[string]bool{}
		}
		countriesOf[r[0]][r[6]] = true
	}
	intl := 0
	for _, cs := range countriesOf {
		if len(cs) > 1 {
			intl++
		}
	}
	if n := len(countriesOf); n < 1000 || intl < n/5 || intl > 4*n/5 {
		t.Errorf("%d sampled papers, %d international; want thousands with a realistic share abroad", n, intl)
	}
	votes := readCSV(t, VotesName)
	kinds := map[string]int{}
	for _, r := range votes[1:] {
		if _, ok := s.country[r[5]]; !ok {
			t.Fatalf("votes.csv: institution %s not in the register", r[5])
		}
		kinds[r[4]]++
	}
	if len(votes) < 1000 || kinds["research"] == 0 || kinds["teaching"] == 0 || len(kinds) != 2 {
		t.Errorf("votes.csv: %d rows, kinds %v", len(votes), kinds)
	}
}
