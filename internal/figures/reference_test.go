package figures

import (
	"bytes"
	"encoding/csv"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"testing"
)

// TestFixtureAgainstR checks the fixture's figures against values computed
// independently by R 4.2.2 (testdata/figures/fixture_check.R: quantile()
// type 7, sd(), rank() with ties "min" and "average", lm(), cor() with
// Pearson and Spearman), found through Lookup as the commentary will find
// them. Agreement to 1e-9 relative.
func TestFixtureAgainstR(t *testing.T) {
	src, err := os.ReadFile(filepath.Join(fixtureDir, "fixture_r.csv"))
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.HasPrefix(src, []byte("# R version: R version 4.2.2")) {
		t.Fatal("fixture_r.csv was not produced by R 4.2.2")
	}
	var body []byte
	for _, line := range bytes.SplitAfter(src, []byte("\n")) {
		if !bytes.HasPrefix(line, []byte("#")) {
			body = append(body, line...)
		}
	}
	recs, err := csv.NewReader(bytes.NewReader(body)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	d, b := loadFixture(t)
	m, err := Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	checked := 0
	for _, r := range recs[1:] {
		k := Key{Section: r[0], Group: r[1], Indicator: r[2], Institution: r[3], Measure: r[5]}
		if r[4] != "" {
			k.Year, _ = strconv.Atoi(r[4])
		}
		want, err := strconv.ParseFloat(r[6], 64)
		if err != nil {
			t.Fatalf("bad reference %v", r)
		}
		got, ok := m.Lookup(k)
		if !ok {
			t.Errorf("%s: no such figure (R gives %v)", k, want)
			continue
		}
		if math.Abs(got.Value-want) > 1e-9*math.Max(1, math.Abs(want)) {
			t.Errorf("%s = %.17g, R gives %.17g", k, got.Value, want)
		}
		checked++
	}
	if checked < 1500 {
		t.Fatalf("only %d figures checked", checked)
	}
}
