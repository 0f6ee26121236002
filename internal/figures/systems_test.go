package figures

import (
	"encoding/csv"
	"io/fs"
	"math"
	"os/exec"
	"strconv"
	"strings"
	"testing"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/demo"
)

// systemsBrief is the demo data with one group per country, the demo's
// population rule, students as the size weight and a systems table.
const systemsBrief = "---\ntitle: Systems\nfocus: KE007\nyear: 2025\nyears: [2020, 2025]\n" +
	"data:\n  register: institutions.csv\n  values: [values.csv, values-wide.csv]\n  dictionary: indicators.yaml\n  ppp: ppp.csv\n" +
	"groups:\n  - each: country\n" +
	"population:\n  min_total:\n    - indicator: papers\n      years: 3\n      at_least: 600\n" +
	"size_weight: students\n---\n\n# Systems\n\n" +
	"```table\nkind: systems\nindicators: [intl_staff_share, intl_student_share]\n```\n"

func systemsModel(t *testing.T, src string) (*Model, error) {
	t.Helper()
	b, err := brief.Parse(demo.BriefName, []byte(src))
	if err != nil {
		t.Fatalf("brief: %v", err)
	}
	d, _, err := dataset.Load(demo.FS(), b)
	if err != nil {
		t.Fatalf("data: %v", err)
	}
	return Compute(d, b)
}

// TestSystemFiguresAgainstPandas recomputes the system section of the
// demo with pandas and numpy (testdata/systems/systems_pandas.py, Debian's
// python3-pandas): register and ranked counts per country, and the
// student-weighted medians as numpy.median of each value repeated as many
// times as the institution's students, which needs no weighted-median
// definition at all.
func TestSystemFiguresAgainstPandas(t *testing.T) {
	if testing.Short() {
		t.Skip("runs Python")
	}
	py := "/usr/bin/python3"
	if err := exec.Command(py, "-c", "import pandas, numpy").Run(); err != nil {
		t.Skipf("Debian's python3 with pandas and numpy is not installed: %v", err)
	}
	m, err := systemsModel(t, systemsBrief)
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	if err := demo.Write(dir); err != nil {
		t.Fatal(err)
	}
	out, err := exec.Command(py, "testdata/systems/systems_pandas.py", dir).Output()
	if err != nil {
		t.Fatalf("systems_pandas.py: %v", err)
	}
	rows, err := csv.NewReader(strings.NewReader(string(out))).ReadAll()
	if err != nil || len(rows) < 2 {
		t.Fatalf("reading the reference: %v (%d rows)", err, len(rows))
	}
	checked := 0
	for _, r := range rows[1:] {
		want, _ := strconv.ParseFloat(r[3], 64)
		year := 0
		if r[1] != "" {
			year = 2025
		}
		got, ok := m.SystemFigure(r[0], r[1], year, r[2])
		if !ok {
			t.Errorf("%s %s %s: the model has no figure; pandas says %v", r[0], r[1], r[2], want)
			continue
		}
		if math.Abs(got-want) > 1e-9 {
			t.Errorf("%s %s %s: model %v, pandas %v", r[0], r[1], r[2], got, want)
		}
		checked++
		if r[2] == MeasureRanked {
			g, _ := m.Group(r[0])
			if g == nil || len(g.Members) != int(want) {
				t.Errorf("%s: %d members, but %v pass the rule", r[0], len(g.Members), want)
			}
			def, _ := m.SystemFigure(r[0], "", 0, MeasureDefined)
			share, _ := m.SystemFigure(r[0], "", 0, MeasureShareRanked)
			if math.Abs(share-100*want/def) > 1e-9 {
				t.Errorf("%s: share %v, want 100 x %v / %v", r[0], share, want, def)
			}
		}
	}
	if checked < 6*4 {
		t.Errorf("only %d figures checked", checked)
	}
	// The gap is the weighted median less the plain one, as a figure of
	// its own for claims to use.
	wm, _ := m.SystemFigure("Kestria", "intl_staff_share", 2025, MeasureWeightedMedian)
	gap, _ := m.SystemFigure("Kestria", "intl_staff_share", 2025, MeasureWeightedGap)
	dist, _ := m.Distribution("Kestria", "intl_staff_share", 2025)
	if gap != wm-dist.Median {
		t.Errorf("gap %v, want %v - %v", gap, wm, dist.Median)
	}
	if ind, ok := m.SizeWeight(); !ok || ind.Key != "students" {
		t.Errorf("size weight %v %v, want students", ind.Key, ok)
	}
}

// TestSystemFiguresOnlyWhenAsked: a brief without systems blocks has no
// system rows, so other packs' figures files do not change (the demo
// brief with its one systems table taken out).
func TestSystemFiguresOnlyWhenAsked(t *testing.T) {
	src, err := fs.ReadFile(demo.FS(), demo.BriefName)
	if err != nil {
		t.Fatal(err)
	}
	text := string(src)
	start := strings.Index(text, "```table\nkind: systems")
	if start < 0 {
		t.Fatal("the demo brief has no systems table to take out")
	}
	end := start + strings.Index(text[start+3:], "```") + 6
	text = text[:start] + text[end:]
	if strings.Contains(text, "kind: systems") {
		t.Fatal("a systems block is left")
	}
	m, err := systemsModel(t, text)
	if err != nil {
		t.Fatal(err)
	}
	for r := range m.Rows() {
		if r.Section == SectionSystem {
			t.Fatalf("unexpected system row %s", r.Key)
		}
	}
}

// TestSizeWeightErrors: a size_weight that is no indicator, or no size,
// is refused at its line with what to write instead.
func TestSizeWeightErrors(t *testing.T) {
	cases := []struct{ weight, want string }{
		{"studnets", `brief.md:18:1: size_weight "studnets" is not an indicator of the dictionary (did you mean "students"?); name a size such as students or academic staff`},
		{"intl_staff_share", `brief.md:18:1: size_weight "intl_staff_share" is measured in percent, not a size; name a count (students, academic staff) or an amount of money`},
	}
	for _, c := range cases {
		src := strings.Replace(systemsBrief, "size_weight: students", "size_weight: "+c.weight, 1)
		_, err := systemsModel(t, src)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("size_weight %s: got %v\nwant %s", c.weight, err, c.want)
		}
	}
}
