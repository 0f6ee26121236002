package figures

import (
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

var update = flag.Bool("update", false, "rewrite the golden figures files")

// TestGoldenFixture holds the figures file of the fixture in
// testdata/figures. Update it only with `go test ./internal/figures
// -update` and review the diff.
func TestGoldenFixture(t *testing.T) {
	d, b := loadFixture(t)
	m, err := Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := WriteCSV(&buf, m); err != nil {
		t.Fatal(err)
	}
	golden := filepath.Join(fixtureDir, "figures.golden.csv")
	if *update {
		if err := os.WriteFile(golden, buf.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(golden)
	if err != nil {
		t.Fatalf("%v (run go test ./internal/figures -update to create it)", err)
	}
	if !bytes.Equal(buf.Bytes(), want) {
		got := strings.Split(buf.String(), "\n")
		exp := strings.Split(string(want), "\n")
		for i := 0; i < len(got) || i < len(exp); i++ {
			var g, e string
			if i < len(got) {
				g = got[i]
			}
			if i < len(exp) {
				e = exp[i]
			}
			if g != e {
				t.Fatalf("figures differ from %s at line %d:\n got  %s\n want %s\n(run with -update after reviewing)", golden, i+1, g, e)
			}
		}
	}
	// The same model written twice is byte-identical (map order must not leak).
	var again bytes.Buffer
	m2, _ := Compute(d, b)
	WriteCSV(&again, m2)
	if !bytes.Equal(buf.Bytes(), again.Bytes()) {
		t.Fatal("two computations of the same inputs wrote different figures files")
	}
}

func TestCSVHeaderAndFormat(t *testing.T) {
	d, b := loadFixture(t)
	m, err := Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	WriteCSV(&buf, m)
	first, _, _ := strings.Cut(buf.String(), "\n")
	if first != "section,group,indicator,institution,year,measure,value" {
		t.Fatalf("header %q", first)
	}
	// A value whose shortest form needs 16 digits is written in full.
	if !strings.Contains(buf.String(), "percentile,83.33333333333333\n") {
		t.Error("percentiles must be written unrounded in shortest exact form")
	}
	if strings.Contains(buf.String(), "NaN") || strings.Contains(buf.String(), "Inf") {
		t.Error("undefined values must have no row, not NaN or Inf")
	}
}
