package dataset

import (
	"bytes"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"testing/fstest"

	"peerpack/internal/brief"
	"peerpack/internal/limits"
)

// load parses a brief from text and loads it over an in-memory folder.
func load(t *testing.T, briefSrc string, files map[string]string) (*Dataset, *Report, error) {
	t.Helper()
	b, err := brief.Parse("brief.md", []byte(briefSrc))
	if err != nil {
		t.Fatalf("brief: %v", err)
	}
	fsys := fstest.MapFS{}
	for name, body := range files {
		fsys[name] = &fstest.MapFile{Data: []byte(body)}
	}
	return Load(fsys, b)
}

const testRegister = "id,name,country,region,staff_fte,mission\n" +
	"A1,Alder Institute,Kestria,North,100,research\n" +
	"A2,Birch College,Kestria,South,50,\n" +
	"B1,Cedar University,Valdora,East,0,research\n" +
	"B2,Dogwood Academy,Valdora,East,,technical\n"

const testDict = `indicators:
  - {key: papers, label: Papers, unit: count, better: higher, decimals: 0}
  - {key: citations, label: Citations, unit: count, better: higher, decimals: 0}
  - {key: income, label: Research income, unit: currency, currency: true, better: higher, decimals: 0}
  - {key: subject_max, label: Largest subject share, unit: share, better: neutral, decimals: 2}
  - {key: cites_per_paper, label: Citations per paper, unit: ratio, better: higher, decimals: 2, derive: ratio of citations to papers}
  - {key: papers_per_fte, label: Papers per staff FTE, unit: ratio, better: higher, decimals: 2, derive: papers per staff_fte}
  - {key: income_per_paper, label: Income per paper, unit: currency, better: higher, decimals: 0, derive: income / papers}
`

const testBrief = `---
title: T
focus: A1
year: 2024
years: [2022, 2024]
data: {register: reg.csv, values: [long.csv, wide.csv], dictionary: dict.yaml, ppp: ppp.csv}
population:
  min_total:
    - {indicator: papers, years: 3, at_least: 600}
  max_value:
    - {indicator: subject_max, at_most: 0.8}
  require: [mission]
---
`

func testFiles() map[string]string {
	return map[string]string{
		"reg.csv":   testRegister,
		"dict.yaml": testDict,
		"long.csv": "institution,year,indicator,value,note\n" +
			"A1,2022,papers,200,\nA1,2023,papers,200,\nA1,2024,papers,250,first-quarter estimate\n" +
			"A2,2024,papers,900,\nB1,2022,papers,100,\nB1,2023,papers,100,\nB1,2024,papers,100,\n" +
			"B2,2024,papers,0,\n" +
			"A1,2024,income,1000000,\nB1,2024,income,500000,\n",
		"wide.csv": "institution,year,citations,subject_max\n" +
			"A1,2024,1000,0.4\nA2,2024,2700,0.9\nB1,2024,,0.5\nB2,2024,5,\n",
		"ppp.csv": "country,year,factor\nKestria,2024,2.5\nValdora,2024,0.5\n",
	}
}

func TestLoadPipeline(t *testing.T) {
	d, rep, err := load(t, testBrief, testFiles())
	if err != nil {
		t.Fatal(err)
	}
	val := func(key, id string, year int) float64 {
		v, _ := d.Value(d.Dictionary.Index(key), d.Register.Index(id), year)
		return v
	}
	// Expected values worked by hand from the files above.
	checks := []struct {
		key, id string
		year    int
		want    float64
	}{
		{"papers", "A1", 2024, 250},
		{"income", "A1", 2024, 1000000 / 2.5}, // PPP: local / factor
		{"income", "B1", 2024, 500000 / 0.5},
		{"cites_per_paper", "A1", 2024, 4},
		{"cites_per_paper", "A2", 2024, 3},
		{"papers_per_fte", "A1", 2024, 2.5},
		{"papers_per_fte", "A2", 2024, 18},
		{"income_per_paper", "A1", 2024, 400000.0 / 250}, // derived from the converted amount
	}
	for _, c := range checks {
		if got := val(c.key, c.id, c.year); math.Abs(got-c.want) > 1e-9 {
			t.Errorf("%s %s %d = %v, want %v", c.key, c.id, c.year, got, c.want)
		}
	}
	for _, c := range []struct {
		key, id string
		year    int
	}{
		{"cites_per_paper", "B1", 2024}, // citations missing
		{"cites_per_paper", "B2", 2024}, // 5 / 0
		{"papers_per_fte", "B1", 2024},  // staff_fte 0
		{"papers_per_fte", "B2", 2024},  // staff_fte empty
		{"citations", "B1", 2024},       // empty wide cell
	} {
		if got := val(c.key, c.id, c.year); !math.IsNaN(got) {
			t.Errorf("%s %s %d = %v, want missing", c.key, c.id, c.year, got)
		}
	}
	outcome := map[string]DerivedOutcome{}
	for _, o := range rep.Derived {
		outcome[o.Key] = o
	}
	// cites_per_paper over 3 years x 4 institutions: computed A1, A2 in
	// 2024; B2 2024 divides by zero; the other 9 lack an input.
	if o := outcome["cites_per_paper"]; o.Computed != 2 || o.DivideByZero != 1 || o.MissingInput != 9 {
		t.Errorf("cites_per_paper outcome %+v", o)
	}
	if d.DerivedMissing["cites_per_paper"] != 10 {
		t.Errorf("DerivedMissing %v", d.DerivedMissing)
	}
	if d.Notes[CellRef{Indicator: d.Dictionary.Index("papers"), Year: 2024, Institution: 0}] != "first-quarter estimate" {
		t.Errorf("notes %v", d.Notes)
	}
	// Population: A1 passes (650 >= 600, 0.4, mission). A2: 900 passes the
	// total but subject_max 0.9 > 0.8 and mission empty. B1: 300 < 600.
	// B2: 0 < 600 (subject_max missing: unchecked).
	inc := d.Population.Included
	if !inc[0] || inc[1] || inc[2] || inc[3] {
		t.Errorf("included %v", inc)
	}
	if got := strings.Join(d.Population.Excluded[1], "; "); got != "largest subject share in 2024 is 0.90, above 0.80; register field mission is empty" {
		t.Errorf("A2 reasons %q", got)
	}
	if got := strings.Join(d.Population.Excluded[2], "; "); got != "papers summed over 2022–2024 is 300, below 600" {
		t.Errorf("B1 reasons %q", got)
	}
	if rep.Population.Unchecked != 1 {
		t.Errorf("unchecked %d", rep.Population.Unchecked)
	}
	if rep.PPP == nil || rep.PPP.Values != 2 || strings.Join(rep.PPP.Converted, ",") != "income" {
		t.Errorf("PPP summary %+v", rep.PPP)
	}
	var out bytes.Buffer
	rep.Write(&out)
	for _, want := range []string{
		"4 institutions in 2 countries, years 2022-2024, 7 indicators",
		"papers               50%   50%  100%",
		"Purchasing-power parity: income converted to international dollars",
		"cites_per_paper = ratio of citations to papers: 2 computed, 9 missing for want of an input, 1 missing because the divisor is zero",
		"Ranked population: 1 included, 3 excluded",
		"excluded B1 (Cedar University): papers summed over 2022–2024 is 300, below 600",
		// Rule texts read as running text: labels, en dash, "of at least".
		"rule: papers summed over 2022–2024 of at least 600",
		"rule: largest subject share in 2024 of at most 0.80",
		"rule: a value in the register's mission column",
		"No problems found.",
	} {
		if !strings.Contains(out.String(), want) {
			t.Errorf("report lacks %q:\n%s", want, out.String())
		}
	}
}

// TestPPPReference reproduces a published conversion: the World Bank's
// International Comparison Program 2017 put India's PPP conversion factor
// for GDP at 20.65 rupees per international dollar (from memory), so
// 1,000,000 rupees are 48,426.15 international dollars (1e6 / 20.65).
func TestPPPReference(t *testing.T) {
	if got := ToInternational(1e6, 20.65); math.Abs(got-48426.15) > 0.005 {
		t.Errorf("ToInternational = %.4f, want 48426.15", got)
	}
	files := map[string]string{
		"reg.csv":   "id,name,country,region\nX1,Invented Demo Institute,India,South Asia\n",
		"dict.yaml": "indicators:\n  - {key: income, label: Income, unit: currency, currency: true, better: higher, decimals: 2}\n",
		"v.csv":     "institution,year,indicator,value\nX1,2017,income,1000000\n",
		"ppp.csv":   "country,year,factor\nIndia,2017,20.65\n",
	}
	d, _, err := load(t, "---\ntitle: T\nfocus: X1\nyear: 2017\ndata: {register: reg.csv, values: v.csv, dictionary: dict.yaml, ppp: ppp.csv}\n---\n", files)
	if err != nil {
		t.Fatal(err)
	}
	if v, _ := d.Value(0, 0, 2017); math.Abs(v-48426.15) > 0.005 {
		t.Errorf("converted %.4f, want 48426.15", v)
	}
}

// TestXLSXLoadsLikeCSV loads the openpyxl 3.0.9 workbooks of
// testdata/data/xlsx and the same data as CSV through the whole pipeline
// and requires the same register and every value bit for bit.
func TestXLSXLoadsLikeCSV(t *testing.T) {
	dir := filepath.Join("..", "..", "testdata", "data", "xlsx")
	get := func(name string) *Dataset {
		b, err := brief.Load(filepath.Join(dir, name))
		if err != nil {
			t.Fatal(err)
		}
		d, _, err := Load(os.DirFS(dir), b)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		return d
	}
	c, x := get("brief_csv.md"), get("brief_xlsx.md")
	if len(c.Register.Institutions) != 5 || len(x.Register.Institutions) != 5 {
		t.Fatalf("registers %d and %d", len(c.Register.Institutions), len(x.Register.Institutions))
	}
	for i, in := range c.Register.Institutions {
		xi := x.Register.Institutions[i]
		if in.ID != xi.ID || in.Name != xi.Name || in.Country != xi.Country || in.Region != xi.Region {
			t.Errorf("institution %d: %+v vs %+v", i, in, xi)
		}
		for _, a := range c.Register.AttrNames {
			cv, xv := in.Attrs[a], xi.Attrs[a]
			if cv != xv && strings.TrimSuffix(cv, ".0") != xv {
				t.Errorf("%s %s: %q vs %q", in.ID, a, cv, xv)
			}
		}
	}
	if fmt.Sprint(c.Years) != fmt.Sprint(x.Years) {
		t.Fatalf("years %v vs %v", c.Years, x.Years)
	}
	n := 0
	for ind := range c.Dictionary.Indicators {
		for _, y := range c.Years {
			cc, xc := c.Column(ind, y), x.Column(ind, y)
			for i := range cc {
				if math.Float64bits(cc[i]) != math.Float64bits(xc[i]) && !(math.IsNaN(cc[i]) && math.IsNaN(xc[i])) {
					t.Errorf("%s %d %s: %v vs %v", c.Dictionary.Indicators[ind].Key, y, c.Register.Institutions[i].ID, cc[i], xc[i])
				}
				if !math.IsNaN(cc[i]) {
					n++
				}
			}
		}
	}
	if n < 30 {
		t.Errorf("only %d values compared", n)
	}
	if len(c.Notes) != 3 || len(x.Notes) != 3 {
		t.Errorf("notes %v vs %v", c.Notes, x.Notes)
	}
}

func TestSuspicious(t *testing.T) {
	var reg, vals strings.Builder
	reg.WriteString("id,name,country,region\n")
	vals.WriteString("institution,year,indicator,value\n")
	for i := 0; i < 40; i++ {
		id := "I" + string(rune('A'+i/26)) + string(rune('a'+i%26))
		reg.WriteString(id + ",Inst " + id + ",Kestria,North\n")
		for y := 2020; y <= 2024; y++ {
			v := 10 + i%5
			if i == 7 && y == 2024 {
				v = 900 // 10 IQRs and more from the median
			}
			if y == 2022 && i >= 10 {
				continue // 2022 covers 10 of 40, under half the usual 40
			}
			vals.WriteString(id + "," + strconv.Itoa(y) + ",papers," + strconv.Itoa(v) + "\n")
		}
	}
	_, rep, err := load(t, "---\ntitle: T\nfocus: IAa\nyear: 2024\ndata: {register: r.csv, values: v.csv, dictionary: d.yaml}\n---\n",
		map[string]string{"r.csv": reg.String(), "v.csv": vals.String(), "d.yaml": "indicators:\n  - {key: papers, label: Papers, unit: count, better: higher, decimals: 0}\n"})
	if err != nil {
		t.Fatal(err)
	}
	// The 900 is both far from the 2024 median and 53 times its own other
	// years' median (17).
	if rep.SuspiciousCount[SuspectFarOut] != 1 || rep.SuspiciousCount[SuspectLowCoverage] != 1 || rep.SuspiciousCount[SuspectJump] != 1 {
		t.Fatalf("counts %v: %+v", rep.SuspiciousCount, rep.Suspicious)
	}
	var far Suspicion
	for _, s := range rep.Suspicious {
		if s.Kind == SuspectFarOut {
			far = s
		}
	}
	if far.Institution != "IAh" || far.Year != 2024 || !strings.HasPrefix(far.Where, "v.csv:") {
		t.Errorf("far-out finding %+v", far)
	}
}

// TestEveryProblemListed checks that Load reports all problems at once,
// across files, not only the first.
func TestEveryProblemListed(t *testing.T) {
	files := testFiles()
	files["long.csv"] += "ZZ,2024,papers,1,\nA1,2024,paperz,1,\nA2,1800,papers,1,\nA2,2023,papers,\"1,5\",\n"
	files["ppp.csv"] = "country,year,factor\nKestria,2024,2.5\n"
	_, rep, err := load(t, testBrief, files)
	if err == nil {
		t.Fatal("no error")
	}
	msg := err.Error()
	for _, want := range []string{"unknown institution id \"ZZ\"", "unknown indicator key \"paperz\"", "year 1800 is out of range", "\"1,5\" looks like a number with a decimal comma", "no PPP factor for country \"Valdora\" in 2024"} {
		if !strings.Contains(msg, want) {
			t.Errorf("error lacks %q:\n%s", want, msg)
		}
	}
	if rep.Problems != 5 {
		t.Errorf("Problems = %d, want 5:\n%s", rep.Problems, msg)
	}
}

func FuzzDictionary(f *testing.F) {
	f.Add([]byte(testDict))
	f.Add([]byte("indicators:\n  - {key: a, label: A, unit: percent, better: lower, decimals: 7, derive: share of b in c}\n"))
	f.Add([]byte("indicators: []\n"))
	f.Fuzz(func(t *testing.T, src []byte) {
		d, derived, err := ParseDictionary("d.yaml", src)
		if err != nil && err.Error() == "" {
			t.Fatal("empty message")
		}
		if d == nil {
			return
		}
		for k := range derived {
			if d.Index(k) < 0 {
				t.Fatalf("derived %q not in the dictionary", k)
			}
		}
		for _, in := range d.Indicators {
			if in.Short == "" && in.Label != "" {
				t.Fatalf("short not defaulted for %q", in.Key)
			}
		}
	})
}

// FuzzLoad runs arbitrary values, dictionary and PPP files through the
// whole of Load: whatever the input, it must return problems, never panic,
// and never leave an infinity in the data.
func FuzzLoad(f *testing.F) {
	files := testFiles()
	f.Add([]byte(files["long.csv"]), []byte(files["dict.yaml"]), []byte(files["ppp.csv"]), false)
	f.Add([]byte(files["long.csv"]), []byte(files["dict.yaml"]), []byte(files["ppp.csv"]), true)
	f.Add([]byte("institution,year,papers,citations\nA1,2024,1,\"2\"\n"), []byte(testDict), []byte("country,year,factor\n"), false)
	f.Fuzz(func(t *testing.T, values, dict, ppp []byte, tight bool) {
		b, err := brief.Parse("brief.md", []byte(testBrief))
		if err != nil {
			t.Fatal(err)
		}
		fsys := fstest.MapFS{
			"reg.csv":   {Data: []byte(testRegister)},
			"dict.yaml": {Data: dict},
			"long.csv":  {Data: values},
			"wide.csv":  {Data: []byte("institution,year\n")},
			"ppp.csv":   {Data: ppp},
		}
		// Tight limits make every limit reachable by small inputs.
		lim := limits.Default()
		if tight {
			lim = limits.Limits{Rows: 12, Columns: 6, CellBytes: 40, Indicators: 8, Years: 3, Values: 90, YAMLBytes: 1200}.Or()
		}
		d, rep, err := LoadWith(fsys, b, lim)
		if rep == nil {
			t.Fatal("no report")
		}
		var out bytes.Buffer
		rep.Write(&out)
		if err != nil || d == nil {
			return
		}
		for ind := range d.Dictionary.Indicators {
			for _, y := range d.Years {
				for _, v := range d.Column(ind, y) {
					if math.IsInf(v, 0) {
						t.Fatalf("infinity in %s %d", d.Dictionary.Indicators[ind].Key, y)
					}
				}
			}
		}
	})
}
