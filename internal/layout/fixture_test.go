package layout

import (
	"fmt"
	"math/rand/v2"
	"os"
	"path/filepath"
	"testing"
	"time"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
)

// The layout fixture is an invented scenario: invented countries
// (Valmoria, Orvesk, Zelmar), invented institutions, values drawn from a
// fixed seed. It exists to exercise the layout, not to be realistic.

const fixtureDir = "../../testdata/layout"

// fixtureNames are the first institutions; more are generated.
var fixtureNames = []struct{ id, name, country, region string }{
	{"VA001", "Université de Saint-Éluard", "Valmoria", "North"},
	{"VA002", "Valmoria Technical University", "Valmoria", "North"},
	{"VA003", "École supérieure de Brévannes", "Valmoria", "South"},
	{"OR002", "Høgskolen i Vårdø", "Orvesk", "North"},
	{"ZE003", "Politechnika Źródłowa", "Zelmar", "North"},
	{"ZE005", "Uniwersytet Łąkowy", "Zelmar", "South"},
}

func fixtureIndicators() []dataset.Indicator {
	return []dataset.Indicator{
		{Key: "fnci", Label: "Field-normalised citation impact", Short: "FNCI", Unit: dataset.UnitIndex, Better: dataset.HigherIsBetter, Decimals: 2, Source: "Invented bibliometric service"},
		{Key: "intl_staff", Label: "International staff share", Short: "Intl staff", Unit: dataset.UnitPercent, Better: dataset.HigherIsBetter, Decimals: 1, Source: "Institutional returns"},
		{Key: "students_per_academic", Label: "Students per academic", Short: "Students/acad.", Unit: dataset.UnitRatio, Better: dataset.LowerIsBetter, Decimals: 1, Source: "Institutional returns",
			Judgement: "Fewer students per academic is read as better here, but a low ratio can also mean small classes that are costly to run."},
		{Key: "income", Label: "Research income per academic", Short: "Income/acad.", Unit: dataset.UnitCurrency, Better: dataset.HigherIsBetter, Decimals: 0, Source: "Institutional returns"},
	}
}

// fixtureDataset builds n institutions (at least the named ones) with
// values for 2021-2025 from a fixed seed.
func fixtureDataset(n int) *dataset.Dataset {
	rng := rand.New(rand.NewPCG(20250301, 7))
	countries := []string{"Valmoria", "Orvesk", "Zelmar"}
	prefix := map[string]string{"Valmoria": "VA", "Orvesk": "OR", "Zelmar": "ZE"}
	var insts []dataset.Institution
	used := map[string]bool{}
	for _, f := range fixtureNames {
		insts = append(insts, dataset.Institution{ID: f.id, Name: f.name, Country: f.country, Region: f.region})
		used[f.id] = true
	}
	for i := 0; len(insts) < n; i++ {
		c := countries[i%3]
		id := fmt.Sprintf("%s%03d", prefix[c], 10+i)
		if used[id] {
			continue
		}
		region := "North"
		if i%2 == 1 {
			region = "South"
		}
		insts = append(insts, dataset.Institution{ID: id, Name: fmt.Sprintf("%s Institute %d", c, 10+i), Country: c, Region: region})
	}
	reg := dataset.NewRegister("register.csv", insts, nil)
	dict := dataset.NewDictionary("indicators.yaml", fixtureIndicators())
	years := []int{2021, 2022, 2023, 2024, 2025}
	d := dataset.New(reg, dict, years)
	for i := range insts {
		base := []float64{0.6 + rng.Float64()*1.2, 5 + rng.Float64()*40, 8 + rng.Float64()*20, 20000 + rng.Float64()*180000}
		drift := []float64{0.02, 0.6, -0.15, 1500}
		for y, year := range years {
			for k := range base {
				if rng.Float64() < 0.03 && i > 5 {
					continue // a few missing values
				}
				noise := 1 + (rng.Float64()-0.5)*0.04
				d.Set(k, i, year, (base[k]+drift[k]*float64(y))*noise)
			}
		}
	}
	return d
}

// fixtureInput parses the fixture brief and computes its figures model
// over n institutions.
func fixtureInput(t testing.TB, n int) Input {
	t.Helper()
	src, err := os.ReadFile(filepath.Join(fixtureDir, "brief.md"))
	if err != nil {
		t.Fatal(err)
	}
	return fixtureInputFrom(t, n, src)
}

// fixtureInputFrom is fixtureInput over a variant of the brief.
func fixtureInputFrom(t testing.TB, n int, src []byte) Input {
	t.Helper()
	b, err := brief.Parse("brief.md", src)
	if err != nil {
		t.Fatalf("fixture brief: %v", err)
	}
	m, err := figures.Compute(fixtureDataset(n), b)
	if err != nil {
		t.Fatalf("fixture figures: %v", err)
	}
	return Input{Brief: b, Model: m, FS: os.DirFS(fixtureDir), Created: time.Date(2025, 3, 1, 9, 30, 0, 0, time.UTC), Version: "test"}
}
