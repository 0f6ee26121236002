package layout

import (
	"encoding/csv"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"peerpack/templates"
)

// councilReference reads testdata/layout/council_reference.csv, written by
// council_reference.py with pandas from the demo files, independently of
// peerpack.
func councilReference(t *testing.T) map[string]float64 {
	t.Helper()
	f, err := os.Open(filepath.Join(fixtureDir, "council_reference.csv"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	out := map[string]float64{}
	for _, r := range rows[1:] {
		v, err := strconv.ParseFloat(r[1], 64)
		if err != nil {
			t.Fatalf("%s: %v", r[0], err)
		}
		out[r[0]] = v
	}
	return out
}

var placeRe = regexp.MustCompile(`(\d+)(?:st|nd|rd|th) of ([\d,]+)(?: \((\d+)(?:st|nd|rd|th)\))?`)

// TestGoverningBodyTablesAgainstPandas lays out the governing-body
// template on the demo data and reads its standing and scale tables back
// with pdftotext: every rank "of n", percentile, size and median printed
// must equal pandas' figures within the printed rounding.
func TestGoverningBodyTablesAgainstPandas(t *testing.T) {
	if testing.Short() {
		t.Skip("lays out the governing-body pack")
	}
	ref := councilReference(t)
	files, err := templates.Files("governing-body")
	if err != nil {
		t.Fatal(err)
	}
	out, m := scenarioPack(t, files)
	text := runTool(t, out, "pdftotext", "-layout")

	// Standing: one row per indicator, the chosen peers then the sector.
	at := strings.Index(text, "Standing among the chosen peers and in the Kestrian sector")
	if at < 0 {
		t.Fatal("no standing table")
	}
	standing := text[at:]
	for ind, label := range map[string]string{"intl_staff_share": "International academic staff", "students_per_academic": "Students per academic", "completion_rate": "Completion within the expected time plus one year"} {
		fields, ok := layoutLine(standing, label)
		if !ok {
			t.Errorf("no standing row %q", label)
			continue
		}
		places := placeRe.FindAllStringSubmatch(strings.Join(fields, " "), -1)
		if len(places) != 2 {
			t.Errorf("%s: %d places in %q, want 2", label, len(places), fields)
			continue
		}
		for i, g := range []string{"Chosen peers", "Kestrian sector"} {
			k := "standing/" + g + "/" + ind + "/"
			rank, _ := strconv.Atoi(places[i][1])
			of, _ := strconv.Atoi(strings.ReplaceAll(places[i][2], ",", ""))
			if float64(rank) != ref[k+"rank"] || float64(of) != ref[k+"of"] {
				t.Errorf("%s in %s: %d of %d, pandas %v of %v", label, g, rank, of, ref[k+"rank"], ref[k+"of"])
			}
			// Percentiles only at or above the small-group floor (the
			// chosen peers have 7 members).
			switch {
			case i == 0 && places[i][3] != "":
				t.Errorf("%s: a percentile printed for the chosen peers, below the floor", label)
			case i == 1:
				p, _ := strconv.Atoi(places[i][3])
				if want := math.Round(ref[k+"percentile"]); float64(p) != want {
					t.Errorf("%s in %s: %d percentile, pandas %v", label, g, p, ref[k+"percentile"])
				}
			}
		}
	}

	// Scale: each institution's size and the chosen peers' median.
	at = strings.Index(text, "Size of the university and its chosen peers")
	if at < 0 {
		t.Fatal("no scale table")
	}
	scale := text[at:]
	inds := []string{"academic_staff", "students", "total_income", "papers"}
	check := func(lead, id string, fields []string) {
		if len(fields) < len(inds) {
			t.Errorf("scale row %q: %q", lead, fields)
			return
		}
		nums := fields[len(fields)-len(inds):]
		for j, ind := range inds {
			got, err := strconv.ParseFloat(strings.ReplaceAll(nums[j], ",", ""), 64)
			want := ref["scale/"+id+"/"+ind]
			// Whole numbers as printed: within half a unit.
			if err != nil || math.Abs(got-want) > 0.5+1e-6 {
				t.Errorf("%s %s: printed %q, pandas %.3f", lead, ind, nums[j], want)
			}
		}
	}
	reg := m.Data.Register
	for _, id := range []string{"KE007", "KE002", "KE004", "AL003", "OR002", "NV001", "WI002", "LU001"} {
		name := reg.Institutions[reg.Index(id)].Name
		fields, ok := layoutLine(scale, name)
		if !ok {
			t.Errorf("no scale row for %s", name)
			continue
		}
		check(name, id, fields)
	}
	fields, ok := layoutLine(scale, "Median, Chosen peers")
	if !ok {
		t.Fatal("no median row")
	}
	check("median", "median", fields)
}

// TestScaleTableKeepsTheFocus: a scale table over a large group shows
// the largest members up to its limit and always the focus, and says so.
func TestScaleTableKeepsTheFocus(t *testing.T) {
	if testing.Short() {
		t.Skip("lays out the governing-body pack")
	}
	files, err := templates.Files("governing-body")
	if err != nil {
		t.Fatal(err)
	}
	src := string(files["brief.md"])
	old := "kind: scale\ngroups: [Chosen peers]\n"
	if !strings.Contains(src, old) {
		t.Fatal("the template's scale block has changed; update this test")
	}
	files["brief.md"] = []byte(strings.Replace(src, old, "kind: scale\ngroups: [Kestrian sector]\nlimit: 5\n", 1))
	out, m := scenarioPack(t, files)
	text := runTool(t, out, "pdftotext", "-layout")
	at := strings.Index(text, "Size of the university and its chosen peers")
	if at < 0 {
		t.Fatal("no scale table")
	}
	table := text[at:]
	table = table[:strings.Index(table, "Median, Kestrian sector")]
	rows := 0
	reg := m.Data.Register
	focusRow := false
	for _, in := range reg.Institutions {
		if in.Country != "Kestria" {
			continue
		}
		if _, ok := layoutLine(table, in.Name); ok {
			rows++
			focusRow = focusRow || in.ID == "KE007"
		}
	}
	if rows != 5 || !focusRow {
		t.Errorf("%d rows (focus among them: %v), want 5 with the focus", rows, focusRow)
	}
	note := strings.Join(strings.Fields(text[at:]), " ")
	if !strings.Contains(note, "Showing the 4 largest of the 121 institutions on Academic staff (full-time equivalent), and University of Wendholm") {
		t.Errorf("no note on the rows left out:\n%s", note[:min(len(note), 2000)])
	}
}
