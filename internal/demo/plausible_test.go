package demo

import (
	"bytes"
	"encoding/csv"
	"math"
	"sort"
	"strconv"
	"strings"
	"testing"

	"peerpack/internal/dataset"
	"peerpack/internal/limits"
	"peerpack/internal/records"
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
	// The record indicators, computed from the records as the demo brief
	// asks (rolling three-year windows from the papers, the reporting year
	// from the votes).
	places := map[string]records.Place{}
	for _, r := range readCSV(t, RegisterName)[1:] {
		places[r[0]] = records.Place{Country: r[2], Region: r[3]}
	}
	pr, err := records.Papers(records.OpenFile(FS(), PapersName, limits.Default()), records.PaperOptions{Window: 3})
	if err != nil {
		t.Fatal(err)
	}
	tg, err := records.ReadTargets(records.OpenFile(FS(), TargetsName, limits.Default()))
	if err != nil {
		t.Fatal(err)
	}
	vr, err := records.Votes(records.OpenFile(FS(), VotesName, limits.Default()), tg, records.VoteOptions{Year: LastYear, Institutions: places})
	if err != nil {
		t.Fatal(err)
	}
	for _, v := range append(pr.Values, vr.Values...) {
		for _, k := range recordKeys {
			if v.Indicator == k {
				set(v.Indicator, v.Institution, v.Year, k, v.Value)
			}
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
			v, ok = ratio(row, "papers", "academic_staff")
		case "research_income_per_academic", "exchange_income_per_academic":
			v, ok = ratio(row, key[:len(key)-len("_per_academic")], "academic_staff")
			v /= s.ppp[s.country[id]][year]
		case "income_per_student":
			v, ok = ratio(row, "total_income", "students")
			v /= s.ppp[s.country[id]][year]
		case "research_income_share":
			v, ok = ratio(row, "research_income", "total_income")
			v *= 100
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
	// Field shares of one institution add up to 100 within rounding.
	for id, years := range s.val {
		for y, row := range years {
			sum, n := 0.0, 0
			for _, fd := range fields {
				if v, ok := row[fd.Key]; ok {
					sum += v
					n++
				}
			}
			if n == len(fields) && math.Abs(sum-100) > 0.35 {
				t.Fatalf("%s %d: field shares sum to %v", id, y, sum)
			}
		}
	}
	// Money and esteem are right-skewed: the mean lies above the median
	// (a log-normal has mean exp(mu+sigma^2/2) > median exp(mu)).
	for _, key := range []string{"research_income_per_academic", "exchange_income_per_academic", "income_per_student", "peer_esteem", "total_income"} {
		_, vs := s.column(LastYear, key)
		if m, md := mean(vs), median(vs); !(m > 1.05*md) {
			t.Errorf("%s: mean %.0f not above median %.0f; incomes and esteem should be skewed", key, m, md)
		}
	}
	// Citation impact centres near the world average of 1, and the share
	// of papers among the 10 % most cited near 10 % (both by definition
	// of the measures: Waltman et al. 2011; Waltman and Schreiber 2013).
	_, ci := s.column(LastYear, "citation_impact")
	if md := median(ci); md < 0.6 || md > 1.4 {
		t.Errorf("median citation impact %.2f, want near 1", md)
	}
	_, top := s.column(LastYear, "top10_share")
	if md := median(top); md < 5 || md > 15 {
		t.Errorf("median top 10%% share %.1f, want near 10", md)
	}
	// Student progress rates sit where published sector figures do
	// (continuation around nine in ten, completion lower; common
	// practice, no source), and each is bounded away from 0 and 100.
	for key, band := range map[string][2]float64{"continuation_rate": {80, 96}, "completion_rate": {60, 85}, "graduate_outcomes": {75, 93}, "operating_surplus": {1, 8}} {
		_, vs := s.column(LastYear, key)
		if md := median(vs); md < band[0] || md > band[1] {
			t.Errorf("median %s %.1f outside %v", key, md, band)
		}
	}
}

func TestResearchMeasuresCorrelate(t *testing.T) {
	s := loadTable(t)
	pairs := [][2]string{
		{"papers_per_academic", "citation_impact"},
		{"papers_per_academic", "research_income_per_academic"},
		{"research_income_per_academic", "citation_impact"},
		{"citation_impact", "top10_share"},
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
	// The demo brief's rule, at least 600 papers over the three years to
	// the last year, is the scenario's own: the demo needs a population
	// that excludes a real share of small and teaching-led institutions.
	pass, teachingPass, teaching := 0, 0, 0
	for id, years := range s.val {
		total := 0.0
		for y := LastYear - 2; y <= LastYear; y++ {
			total += years[y]["papers"]
		}
		if total >= 600 {
			pass++
		}
		if s.mission[id] == "teaching" {
			teaching++
			if total >= 600 {
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
	ids, fw := s.column(LastYear, "citation_impact")
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
		t.Errorf("focus citation impact %.2f not above the Kestrian median %.2f", focus, median(sector))
	}
	if a, b := s.val[FocusID][FirstYear]["intl_student_share"], s.val[FocusID][LastYear]["intl_student_share"]; b >= a {
		t.Errorf("focus international students %.1f -> %.1f; the demo should show a decline", a, b)
	}
}

func TestRecordSamples(t *testing.T) {
	s := loadTable(t)
	papers := readCSV(t, PapersName)
	led := map[string]int{}
	type agg struct{ n, intl, industry float64 }
	byInst := map[string]*agg{}
	for _, r := range papers[1:] {
		year, _ := strconv.Atoi(r[1])
		if year < FirstYear || year > LastYear {
			t.Fatalf("papers.csv: year %q", r[1])
		}
		if c := parseNum(t, PapersName, r[4]); c < 0 || c != math.Trunc(c) {
			t.Fatalf("papers.csv: citations %q", r[4])
		}
		for _, f := range strings.Split(r[3], ";") {
			// Frascati Manual 2015 second-level codes: 1.1 to 6.5.
			if len(f) < 3 || f[0] < '1' || f[0] > '6' || f[1] != '.' {
				t.Fatalf("papers.csv: field %q is not a Frascati code", f)
			}
		}
		ids, cs := strings.Split(r[5], ";"), strings.Split(r[6], ";")
		want := map[string]bool{}
		for _, id := range ids {
			c, ok := s.country[id]
			if !ok {
				t.Fatalf("papers.csv: institution %s not in the register", id)
			}
			want[c] = true
		}
		if len(cs) != len(want) {
			t.Fatalf("papers.csv: %s lists countries %v for institutions %v", r[0], cs, ids)
		}
		for _, c := range cs {
			if !want[c] {
				t.Fatalf("papers.csv: %s lists %s, no institution of it", r[0], c)
			}
		}
		led[ids[0]]++
		a := byInst[ids[0]]
		if a == nil {
			a = &agg{}
			byInst[ids[0]] = a
		}
		a.n++
		if len(cs) > 1 {
			a.intl++
		}
		if strings.Contains(r[7], "industry") {
			a.industry++
		}
	}
	// Every institution leads papers in the sample.
	for id := range s.country {
		if led[id] == 0 {
			t.Errorf("papers.csv: %s leads no sampled paper", id)
		}
	}
	// The sampled shares follow the values file: across institutions, the
	// international share of sampled papers correlates with the values'
	// international co-authorship.
	var x, y []float64
	for id, a := range byInst {
		if v, ok := s.val[id][LastYear]["intl_coauthorship"]; ok && a.n >= 10 {
			x, y = append(x, v), append(y, 100*a.intl/a.n)
		}
	}
	if r := pearson(x, y); r < 0.4 {
		t.Errorf("sampled international share against intl_coauthorship: r = %.2f over %d institutions", r, len(x))
	}
	votes := readCSV(t, VotesName)
	named := map[string]float64{}
	for _, r := range votes[1:] {
		if _, ok := s.country[r[3]]; !ok {
			t.Fatalf("votes.csv: institution %s not in the register", r[3])
		}
		if _, ok := s.dict["field_"+r[2]]; !ok {
			t.Fatalf("votes.csv: field %q is not a broad field", r[2])
		}
		named[r[3]]++
	}
	// The vote sample covers every institution of the register, so the
	// baselines computed from it are baselines of the whole world (issue
	// requirement; common practice, no source).
	for id := range s.country {
		if named[id] == 0 {
			t.Errorf("votes.csv: institution %s receives no vote", id)
		}
	}
	if len(votes) < 5000 {
		t.Errorf("votes.csv: only %d nominations", len(votes)-1)
	}
	// Nominations follow peer esteem (rank correlation on the
	// institutions named at least once).
	x, y = nil, nil
	for id, n := range named {
		if v, ok := s.val[id][LastYear]["peer_esteem"]; ok {
			x, y = append(x, math.Log(v+1)), append(y, math.Log(n))
		}
	}
	if r := pearson(x, y); r < 0.5 {
		t.Errorf("nominations against peer_esteem: r = %.2f", r)
	}
	sum := 0.0
	target := map[string]float64{}
	for _, r := range readCSV(t, TargetsName)[1:] {
		target[r[0]] = parseNum(t, TargetsName, r[1])
		sum += target[r[0]]
	}
	if math.Abs(sum-1) > 0.001 {
		t.Errorf("survey target shares sum to %v", sum)
	}
	// The last year's peer_esteem is the vote records post-stratified on
	// the respondent's country (weight = target share / sample share;
	// Kalton and Flores-Cervantes 2003, from memory), most-nominated = 100.
	respondents := map[string]string{}
	for _, r := range votes[1:] {
		respondents[r[0]] = r[1]
	}
	sample := map[string]float64{}
	for _, c := range respondents {
		sample[c]++
	}
	weighted := map[string]float64{}
	top := 0.0
	for _, r := range votes[1:] {
		c := r[1]
		weighted[r[3]] += target[c] / (sample[c] / float64(len(respondents)))
		top = math.Max(top, weighted[r[3]])
	}
	for id := range s.country {
		v, ok := s.val[id][LastYear]["peer_esteem"]
		if !ok {
			continue
		}
		// The targets are written to four decimals and the scores to one.
		if want := 100 * weighted[id] / top; math.Abs(v-want) > 0.05+0.01*want {
			t.Errorf("%s: peer_esteem %.1f, the vote records give %.2f", id, v, want)
		}
	}
}

// TestRecordsGiveTheCitationImpact computes field-normalised citation
// impact from the paper records as the published method does (each
// paper's citations over the mean of all sampled papers of the same broad
// field, year and type; an institution's value the mean over the papers it
// leads: the item-oriented mean normalised citation score of Waltman et
// al. 2011, from memory) and checks that it follows the values file.
func TestRecordsGiveTheCitationImpact(t *testing.T) {
	s := loadTable(t)
	type paper struct {
		lead, class string
		cites       float64
	}
	var ps []paper
	sum, n := map[string]float64{}, map[string]float64{}
	for _, r := range readCSV(t, PapersName)[1:] {
		class := r[1] + "/" + r[2] + "/" + r[3][:1]
		c := parseNum(t, PapersName, r[4])
		ps = append(ps, paper{strings.Split(r[5], ";")[0], class, c})
		sum[class] += c
		n[class]++
	}
	score, count := map[string]float64{}, map[string]float64{}
	for _, p := range ps {
		if mean := sum[p.class] / n[p.class]; mean > 0 {
			score[p.lead] += p.cites / mean
			count[p.lead]++
		}
	}
	var x, y []float64
	for id, c := range count {
		if c < 40 {
			continue
		}
		var vals []float64
		for yr := FirstYear; yr <= LastYear; yr++ {
			if v, ok := s.val[id][yr]["citation_impact"]; ok {
				vals = append(vals, v)
			}
		}
		x, y = append(x, mean(vals)), append(y, score[id]/c)
	}
	if len(x) < 20 {
		t.Fatalf("only %d institutions lead 40 sampled papers", len(x))
	}
	r := pearson(x, y)
	t.Logf("citation impact from the records against the values file: r = %.2f over %d institutions", r, len(x))
	if r < 0.5 {
		t.Errorf("citation impact from the records against the values file: r = %.2f over %d institutions", r, len(x))
	}
}
