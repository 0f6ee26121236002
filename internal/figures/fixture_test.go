package figures

import (
	"encoding/csv"
	"os"
	"path/filepath"
	"strconv"
	"testing"

	"gopkg.in/yaml.v3"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
)

const fixtureDir = "../../testdata/figures"

// loadFixture reads the fixture of testdata/figures with a minimal reader
// (the fixture is well formed; dataset.Load is tested on its own, and
// TestFixtureThroughDatasetLoad checks both readers agree). ZU01 is left
// out of the ranked population, as the brief's rule "require: [mission]"
// does.
func loadFixture(t testing.TB) (*dataset.Dataset, *brief.Brief) {
	t.Helper()
	b, err := brief.Load(filepath.Join(fixtureDir, "brief.md"))
	if err != nil {
		t.Fatalf("brief: %v", err)
	}
	b.File = "brief.md"
	reg := readCSV(t, "register.csv")
	var insts []dataset.Institution
	for _, r := range reg[1:] {
		insts = append(insts, dataset.Institution{ID: r[0], Name: r[1], Country: r[2], Region: r[3], Attrs: map[string]string{"mission": r[4]}})
	}
	var dict struct {
		Indicators []dataset.Indicator `yaml:"indicators"`
	}
	src, err := os.ReadFile(filepath.Join(fixtureDir, "indicators.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	if err := yaml.Unmarshal(src, &dict); err != nil {
		t.Fatal(err)
	}
	inds := dict.Indicators
	register := dataset.NewRegister("register.csv", insts, []string{"mission"})
	dictionary := dataset.NewDictionary("indicators.yaml", inds)
	d := dataset.New(register, dictionary, []int{2021, 2022, 2023, 2024, 2025})
	for _, r := range readCSV(t, "values.csv")[1:] { // institution,year,indicator,value
		y, _ := strconv.Atoi(r[1])
		v, err := strconv.ParseFloat(r[3], 64)
		if err != nil {
			t.Fatal(err)
		}
		d.Set(dictionary.Index(r[2]), register.Index(r[0]), y, v)
	}
	inc := make([]bool, register.Len())
	for i := range inc {
		inc[i] = true
	}
	zu := register.Index("ZU01")
	inc[zu] = false
	d.Population = &dataset.Population{
		Included: inc,
		Excluded: map[int][]string{zu: {"register field mission is empty"}},
		Rules:    []string{"register field mission must be present"},
	}
	return d, b
}

func readCSV(t testing.TB, name string) [][]string {
	t.Helper()
	f, err := os.Open(filepath.Join(fixtureDir, name))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	recs, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	return recs
}
