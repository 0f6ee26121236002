package figures

import (
	"fmt"
	"io"
	"math/rand/v2"
	"testing"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
)

// worldFixture builds a world-sized dataset in memory: n institutions in
// 22 countries and 5 regions, nInd indicators (every fifth lower-is-better,
// every seventh neutral), nYears years, about 3% of values missing, and a
// brief with 30 groups (world, one per region, one per country, a chosen
// list and 50 nearest peers) and six tracked institutions.
func worldFixture(n, nInd, nYears int) (*dataset.Dataset, *brief.Brief) {
	rng := rand.New(rand.NewPCG(2025, 21500))
	insts := make([]dataset.Institution, n)
	for i := range insts {
		c := i % 22
		insts[i] = dataset.Institution{
			ID:      fmt.Sprintf("W%05d", i),
			Name:    fmt.Sprintf("Institution %d", i),
			Country: fmt.Sprintf("Country%02d", c),
			Region:  fmt.Sprintf("Region%d", c%5),
		}
	}
	inds := make([]dataset.Indicator, nInd)
	for k := range inds {
		better := dataset.HigherIsBetter
		switch {
		case k%7 == 6:
			better = dataset.Neutral
		case k%5 == 4:
			better = dataset.LowerIsBetter
		}
		inds[k] = dataset.Indicator{Key: fmt.Sprintf("ind%02d", k), Unit: dataset.UnitScore, Better: better, Decimals: 1}
	}
	years := make([]int, nYears)
	for y := range years {
		years[y] = 2016 + y
	}
	reg := dataset.NewRegister("world.csv", insts, nil)
	dict := dataset.NewDictionary("world.yaml", inds)
	d := dataset.New(reg, dict, years)
	for k := range inds {
		for _, y := range years {
			for i := 0; i < n; i++ {
				if rng.IntN(100) < 3 {
					continue
				}
				d.Set(k, i, y, float64(int(rng.NormFloat64()*150+500))/10)
			}
		}
	}
	id := func(i int) string { return fmt.Sprintf("W%05d", i%n) }
	b := &brief.Brief{File: "world.md", Focus: id(7), Year: years[nYears-1],
		Years: brief.Span{First: years[0], Last: years[nYears-1]},
		Named: []string{id(100), id(200), id(300), id(4000), id(21000)}, Quantiles: "type7"}
	b.Groups = append(b.Groups,
		brief.GroupSpec{Name: "World", Where: &brief.Filter{}},
		brief.GroupSpec{Name: "Region", Each: "region"},
		brief.GroupSpec{Name: "Country", Each: "country"},
		brief.GroupSpec{Name: "Chosen", Members: []string{id(1), id(2), id(3), id(10), id(11), id(500), id(9000)}},
		brief.GroupSpec{Name: "Profile", Nearest: &brief.NearestSpec{Count: 50, Indicators: []string{"ind00", "ind01", "ind02"}}},
	)
	return d, b
}

// BenchmarkComputeWorld: 21,500 institutions, 20 indicators, 10 years, 30
// groups; the target is under one second per Compute.
func BenchmarkComputeWorld(b *testing.B) {
	d, br := worldFixture(21500, 20, 10)
	m, err := Compute(d, br)
	if err != nil {
		b.Fatal(err)
	}
	if len(m.Groups) != 30 {
		b.Fatalf("%d groups, want 30", len(m.Groups))
	}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := Compute(d, br); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkComputeScaling runs Compute at growing register sizes, to show
// the cost grows no faster than n log n.
func BenchmarkComputeScaling(b *testing.B) {
	for _, n := range []int{2000, 8000, 32000} {
		d, br := worldFixture(n, 20, 10)
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				if _, err := Compute(d, br); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkWriteCSVWorld writes the world model's figures file.
func BenchmarkWriteCSVWorld(b *testing.B) {
	d, br := worldFixture(21500, 20, 10)
	m, err := Compute(d, br)
	if err != nil {
		b.Fatal(err)
	}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if err := WriteCSV(io.Discard, m); err != nil {
			b.Fatal(err)
		}
	}
	b.StopTimer()
	rows := 0
	for range m.Rows() {
		rows++
	}
	b.ReportMetric(float64(rows), "rows")
}
