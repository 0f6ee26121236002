package layout

import (
	"bytes"
	"encoding/csv"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"testing/fstest"
	"time"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/demo"
	"peerpack/internal/figures"
	"peerpack/internal/format"
	"peerpack/internal/narrative"
	"peerpack/templates"
)

// appendixReference reads testdata/layout/appendix_reference.csv: values
// R 4.2.2 computed from the demo scenario's files, independently of
// peerpack (appendix_reference.R says how to rerun it).
func appendixReference(t *testing.T) map[string]float64 {
	t.Helper()
	f, err := os.Open(filepath.Join(fixtureDir, "appendix_reference.csv"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	recs, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	out := map[string]float64{}
	for _, r := range recs[1:] {
		v, err := strconv.ParseFloat(r[1], 64)
		if err != nil {
			t.Fatalf("reference %s: %v", r[0], err)
		}
		out[r[0]] = v
	}
	return out
}

// refValue is one reference value; a missing key fails the test.
func refValue(t *testing.T, ref map[string]float64, key string) float64 {
	t.Helper()
	v, ok := ref[key]
	if !ok {
		t.Fatalf("appendix_reference.csv has no %s", key)
	}
	return v
}

// loadScenario reads a brief over the demo scenario's files and loads its
// dataset, as a build does.
func loadScenario(t *testing.T, files map[string][]byte) (fstest.MapFS, *brief.Brief, *dataset.Dataset) {
	t.Helper()
	fsys := fstest.MapFS{}
	for k, v := range files {
		fsys[k] = &fstest.MapFile{Data: v}
	}
	b, err := brief.Parse(demo.BriefName, files[demo.BriefName])
	if err != nil {
		t.Fatal(err)
	}
	d, _, err := dataset.Load(fsys, b)
	if err != nil {
		t.Fatal(err)
	}
	return fsys, b, d
}

// scenarioPack lays out a brief over the demo scenario's files through the
// same stages as a build and returns the PDF with its figures model.
func scenarioPack(t *testing.T, files map[string][]byte) ([]byte, *figures.Model) {
	t.Helper()
	fsys, b, d := loadScenario(t, files)
	m, err := figures.Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	com, err := narrative.Compose(m, b)
	if err != nil {
		t.Fatal(err)
	}
	out, err := Render(Input{Brief: b, Model: m, Commentary: com, FS: fsys, Created: time.Date(2026, 3, 1, 9, 0, 0, 0, time.UTC), Version: "test"})
	if err != nil {
		t.Fatal(err)
	}
	return out, m
}

// layoutLine finds the first line of pdftotext -layout output whose
// fields start with the given words, and returns the fields after them.
func layoutLine(text, lead string) ([]string, bool) {
	want := strings.Fields(lead)
	for _, l := range strings.Split(text, "\n") {
		f := strings.Fields(l)
		if len(f) >= len(want) && strings.Join(f[:len(want)], " ") == strings.Join(want, " ") {
			return f[len(want):], true
		}
	}
	return nil, false
}

// The demo's methodology annex states what the brief and the model say:
// the PPP file and what a factor is, every group's definition, the
// population rule with the number it left out and the coverage of each
// indicator, the two counts checked against R.
func TestMethodologyAppendixFromTheBrief(t *testing.T) {
	if testing.Short() {
		t.Skip("lays out the demo pack")
	}
	ref := appendixReference(t)
	out, m := scenarioPack(t, demo.Files())
	flat := bodyText(t, out)
	annex := flat[strings.LastIndex(flat, "This annex is written from the brief"):]
	for _, s := range []string{
		"Indicators and sources", "Comparison groups", "Who is counted", "Money and purchasing-power parity",
		"How the figures are computed", "Coverage by group", "Weights", "Limits of these figures",
		// The PPP file the brief names and what its factors are.
		"The factors are read from ppp.csv", "local currency units per international dollar",
		// The demo builds a composite: its weights are stated as judgements.
		"The composite score weighs 14 indicators in 5 pillars (Research 30 %, Collaboration 10 %, People 20 %, Student outcomes 30 %, Knowledge exchange 10 %)",
		"These weights are value judgements stated in the brief",
		// The dictionary's judgement note, with the indicator.
		"Students per academic. Students divided by academic staff, both full-time equivalent.",
		"Value judgement: Fewer students per academic is read as more staff time per student",
		"Source: Paper records of the scenario (invented).",
	} {
		if !strings.Contains(annex, s) {
			t.Errorf("the methodology annex lacks %q", s)
		}
	}
	for _, g := range m.Groups {
		if !strings.Contains(annex, g.Name+". "+sentence(format.Capitalise(g.Defined))) {
			t.Errorf("group %q: definition %q not in the annex", g.Name, g.Defined)
		}
	}
	// R 4.2.2 (appendix_reference.R): the institutions that fail the rule
	// of at least 600 papers over 2023-2025.
	excluded := int(refValue(t, ref, "population/excluded"))
	rule := strings.TrimSuffix(sentence(format.Capitalise(m.Data.Population.Rules[0])), ".")
	if s := fmt.Sprintf("%s: leaves out %d institutions.", rule, excluded); !strings.Contains(annex, s) {
		t.Errorf("the annex lacks %q", s)
	}
	if s := fmt.Sprintf("holds %d institutions. The population rules below leave out %d, so %d form", m.Data.Register.Len(), excluded, int(refValue(t, ref, "population/ranked"))); !strings.Contains(annex, s) {
		t.Errorf("the annex lacks %q", s)
	}

	// No heading of the annex is left at a page foot (the footer is a
	// page's last line).
	heads := map[string]bool{}
	for _, h := range []string{"Indicators and sources", "Comparison groups", "Who is counted", "Money and purchasing-power parity", "Coverage by group", "Weights", "Limits of these figures", "Publications and influence", "Partnerships", "Staff and students", "Student progress", "Financial footing", "Standing among peers", "Reach beyond academia", "Scale (context only)", "Field mix"} {
		heads[h] = true
	}
	for i, p := range strings.Split(runTool(t, out, "pdftotext", "-layout"), "\f") {
		if lines := pageLines(p); len(lines) >= 3 && heads[lines[len(lines)-2]] {
			t.Errorf("page %d ends with the heading %q", i+1, lines[len(lines)-2])
		}
	}

	// Coverage: the first group's cell for each indicator equals the
	// model's count of members with a value, and R's for three of them.
	text := runTool(t, out, "pdftotext", "-layout")
	text = text[strings.LastIndex(text, "Coverage by group"):]
	members := len(m.Groups[0].Members)
	if want := int(refValue(t, ref, "coverage/Kestrian sector/members")); members != want {
		t.Fatalf("Kestrian sector has %d members, R counts %d", members, want)
	}
	for _, key := range []string{"citation_impact", "intl_staff_share", "intl_student_share"} {
		ind, _ := m.Indicator(key)
		fields, ok := layoutLine(text, ind.Label)
		if !ok || len(fields) < 3 {
			t.Errorf("no coverage row for %s", ind.Label)
			continue
		}
		d, _ := m.Distribution(m.Groups[0].Name, key, m.Year)
		got := strings.Join(fields[:3], " ")
		if want := fmt.Sprintf("%d of %d", d.N, members); got != want {
			t.Errorf("%s: coverage %q, the model has %q", key, got, want)
		}
		if want := fmt.Sprintf("%d of %d", int(refValue(t, ref, "coverage/Kestrian sector/"+key)), members); got != want {
			t.Errorf("%s: coverage %q, R counts %q", key, got, want)
		}
	}
}

// The client report's data appendix prints the values the figures were
// computed from: the client's citation impact, the medians of two groups
// per year and research income per academic at PPP, against R. Every
// indicator's table stands whole on one page.
func TestDataAppendixValues(t *testing.T) {
	if testing.Short() {
		t.Skip("lays out the client report")
	}
	ref := appendixReference(t)
	files, err := templates.Files("client-report")
	if err != nil {
		t.Fatal(err)
	}
	out, m := scenarioPack(t, files)
	text := runTool(t, out, "pdftotext", "-layout")
	start := strings.LastIndex(text, "Data appendix")
	if start < 0 {
		t.Fatal("no data appendix")
	}
	annex := text[start:]
	impact := annex[strings.Index(annex, "Field-normalised citation impact"):]
	for _, row := range []struct{ lead, key string }{
		{"Universidade de Miragança", "value/LU003/citation_impact/%d"},
		{"Median, Lusmaran system", "median/Lusmaran system/citation_impact/%d"},
		{"Median, Agreed peers", "median/Agreed peers/citation_impact/%d"},
	} {
		fields, ok := layoutLine(impact, row.lead)
		if !ok || len(fields) != len(m.Years) {
			t.Errorf("%s: row %q, want %d years", row.lead, fields, len(m.Years))
			continue
		}
		for i, y := range m.Years {
			want, ok := ref[fmt.Sprintf(row.key, y)]
			if !ok {
				// Three-year windows from the paper records: no value
				// before the first window ends.
				if fields[i] != "–" {
					t.Errorf("%s %d: printed %q, R has no value", row.lead, y, fields[i])
				}
				continue
			}
			got, err := strconv.ParseFloat(fields[i], 64)
			// Two decimals as printed: within half a unit of the last.
			if err != nil || math.Abs(got-want) > 0.005+1e-9 {
				t.Errorf("%s %d: printed %q, R %.4f", row.lead, y, fields[i], want)
			}
		}
	}
	income := annex[strings.Index(annex, "Research income per academic (PPP$)"):]
	fields, _ := layoutLine(income, "Universidade de Miragança")
	if len(fields) == len(m.Years) {
		got, _ := strconv.ParseFloat(strings.ReplaceAll(fields[len(fields)-1], ",", ""), 64)
		if want := refValue(t, ref, "value/LU003/research_income_per_academic/2025"); math.Abs(got-want) > 0.5 {
			t.Errorf("research income per academic 2025: printed %q, R %.2f", fields[len(fields)-1], want)
		}
	} else {
		t.Errorf("research income row %q", fields)
	}

	// Each indicator's table: its head (label and years) and its three
	// rows on one page.
	years := regexp.MustCompile(`^\s*(.+?)\s+2020\s+2021\s+2022\s+2023\s+2024\s+2025\s*$`)
	heads := 0
	for _, page := range strings.Split(annex, "\f") {
		lines := pageLines(page)
		for i, l := range lines {
			if years.MatchString(l) && !strings.HasPrefix(l, "Indicator") {
				heads++
				if i+3 >= len(lines) || !strings.HasPrefix(lines[i+1], "Universidade de Miragança") || !strings.HasPrefix(lines[i+3], "Median, Agreed peers") {
					t.Errorf("the table %q is parted from its rows", years.FindStringSubmatch(l)[1])
				}
			}
		}
	}
	if heads != 9 {
		t.Errorf("%d indicator tables, want the 9 the block names", heads)
	}
}

// Unknown names in an appendix block are refused with the block's line:
// by the figures stage, which checks every block, and by layout itself
// when handed a model computed without that block.
func TestAppendixErrorsArePositioned(t *testing.T) {
	body := "# Annex\n\n```appendix\nkind: methodology\nindicators: [fncx]\n```\n"
	src := fixtureBody(t, body)
	line := bytes.Count(src[:bytes.Index(src, []byte("```appendix"))], []byte("\n")) + 1
	cases := []struct{ body, want string }{
		{"indicators: [fncx]", `appendix block: indicator "fncx"`},
		{"groups: [Valmora]", `did you mean "Valmoria"?`},
	}
	for _, c := range cases {
		src := fixtureBody(t, "# Annex\n\n```appendix\nkind: data\n"+c.body+"\n```\n")
		b, err := brief.Parse("brief.md", src)
		if err != nil {
			t.Fatal(err)
		}
		_, err = figures.Compute(fixtureDataset(30), b)
		if err == nil || !strings.Contains(err.Error(), fmt.Sprintf("brief.md:%d:1: ", line)) || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: got %v, want %q at line %d", c.body, err, c.want, line)
		}
		// Layout's own check, on a model computed from the brief without
		// the block.
		in := fixtureInputFrom(t, 30, fixtureBody(t, "# Annex\n"))
		in.Brief = b
		_, err = Render(in)
		if err == nil || !strings.Contains(err.Error(), fmt.Sprintf("brief.md:%d:1: appendix names", line)) {
			t.Errorf("%s: layout gave %v, want a message at line %d", c.body, err, line)
		}
	}
	// The kind is the brief's to check.
	if _, err := brief.Parse("brief.md", fixtureBody(t, "```appendix\nkind: methods\n```\n")); err == nil || !strings.Contains(err.Error(), `unknown appendix kind "methods" (kinds are methodology, data)`) {
		t.Errorf("unknown kind: %v", err)
	}
}

// Both annexes over the 300-institution fixture (no PPP file, no
// population rules) say so, and every word stays inside the margins and
// on the page.
func TestAppendixStaysOnThePage(t *testing.T) {
	body := "# Methodology\n\n```appendix\nkind: methodology\n```\n\n# Data appendix\n\n```appendix\nkind: data\n```\n"
	out, err := Render(fixtureInputFrom(t, 300, fixtureBody(t, body)))
	if err != nil {
		t.Fatal(err)
	}
	flat := flatText(t, out)
	for _, s := range []string{
		"The brief sets no population rules, so every institution is ranked.",
		"No money amount is converted: the brief names no PPP file.",
		"Research income per academic is shown in the currency units of the data as given",
		"Median, Chosen peers", "Høgskolen i Vårdø",
	} {
		if !strings.Contains(flat, s) {
			t.Errorf("the annexes lack %q", s)
		}
	}
	html := runTool(t, out, "pdftotext", "-bbox")
	const left, right, height = 56.69 - 1.5, 595.28 - 56.69 + 1.5, 841.89
	for _, m := range wordBox.FindAllStringSubmatch(html, -1) {
		x0, _ := strconv.ParseFloat(m[1], 64)
		y0, _ := strconv.ParseFloat(m[2], 64)
		x1, _ := strconv.ParseFloat(m[3], 64)
		y1, _ := strconv.ParseFloat(m[4], 64)
		if x0 < left || x1 > right || y0 < 0 || y1 > height {
			t.Errorf("word %q at x %.1f–%.1f, y %.1f–%.1f lies outside the type area", m[5], x0, x1, y0, y1)
		}
	}
}

// ruleExclusions splits the excluded institutions by rule as the dataset
// worded them, for each kind of rule; the counts are taken again here
// straight from the values and the register (common practice, no source:
// each rule is a plain threshold).
func TestRuleExclusions(t *testing.T) {
	files := demo.Files()
	src := string(files[demo.BriefName])
	rules := "population:\n  min_total:\n    - indicator: papers\n      years: 4\n      at_least: 800\n  max_value:\n    - indicator: intl_student_share\n      at_most: 30\n  require: [short_name]\n"
	i, j := strings.Index(src, "population:\n"), strings.Index(src, "named:")
	files[demo.BriefName] = []byte(src[:i] + rules + src[j:])
	_, b, d := loadScenario(t, files)
	got, ok := ruleExclusions(b, d.Population, d.Dictionary)
	if !ok {
		t.Fatalf("reasons not matched to rules: %v", d.Population.Rules)
	}
	want := make([]int, 3)
	papers, intl := d.Dictionary.Index("papers"), d.Dictionary.Index("intl_student_share")
	for inst, in := range d.Register.Institutions {
		sum, seen := 0.0, 0
		for y := 2022; y <= 2025; y++ {
			if v, ok := d.Value(papers, inst, y); ok {
				sum, seen = sum+v, seen+1
			}
		}
		if seen == 0 || sum < 800 {
			want[0]++
		}
		if v, ok := d.Value(intl, inst, 2025); ok && v > 30 {
			want[1]++
		}
		if s, _ := in.Attr("short_name"); strings.TrimSpace(s) == "" {
			want[2]++
		}
	}
	if fmt.Sprint(got) != fmt.Sprint(want) {
		t.Errorf("exclusions by rule %v, counted %v", got, want)
	}
	if want[1] == 0 {
		t.Error("the max_value rule excludes nobody; pick a threshold that tests it")
	}
}

// bodyText is flatText without the running header and footer, so that a
// sentence broken over a page reads whole: each page's first two lines
// (the header's two sides) and its footer, the lines from the one ending
// in a bullet to "Page n of N", are dropped.
func bodyText(t *testing.T, pdf []byte) string {
	var keep []string
	for _, page := range strings.Split(runTool(t, pdf, "pdftotext"), "\f") {
		var lines []string
		for _, l := range strings.Split(page, "\n") {
			if strings.TrimSpace(l) != "" {
				lines = append(lines, l)
			}
		}
		if len(lines) > 2 {
			lines = lines[2:]
		}
		for len(lines) > 0 {
			last := lines[len(lines)-1]
			lines = lines[:len(lines)-1]
			if !strings.HasPrefix(last, "Page ") && !strings.Contains(last, "figures for") && !strings.Contains(last, " · ") {
				// Reached the body: the footer's lines are gone.
				lines = append(lines, last)
				break
			}
		}
		keep = append(keep, lines...)
	}
	return strings.Join(strings.Fields(strings.Join(keep, "\n")), " ")
}
