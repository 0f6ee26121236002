package figures

import (
	"bytes"
	"io/fs"
	"math"
	"testing"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/demo"
	"peerpack/internal/format"
)

// TestDemoInvariants computes the demo scenario's figures and checks
// properties every model must have, whatever the data (definitions in
// DEVELOPERS.md): n + missing = the year's members; min <= drawn low whisker <= q1
// <= median <= q3 <= drawn high whisker <= max; 1 <= rank <= of; 0 < percentile <
// 100; the quartile agrees with the value's place among the group's
// quartile values, both as printed at the indicator's declared decimals
// (a value on a quartile in the better quarter; ties share
// one quarter, so a joint-best value is in the top quarter); a member's of
// equals the
// group's n, an outsider's n + 1. (The demo's golden file comes with the
// demo's own tests.)
func TestDemoInvariants(t *testing.T) {
	fsys := demo.FS()
	src, err := fs.ReadFile(fsys, demo.BriefName)
	if err != nil {
		t.Fatal(err)
	}
	b, err := brief.Parse(demo.BriefName, src)
	if err != nil {
		t.Fatalf("demo brief: %v", err)
	}
	d, _, err := dataset.Load(fsys, b)
	if err != nil {
		t.Fatalf("demo data: %v", err)
	}
	m, err := Compute(d, b)
	if err != nil {
		t.Fatalf("demo figures: %v", err)
	}
	checkInvariants(t, m)
}

// checkInvariants checks the properties listed at TestDemoInvariants.
func checkInvariants(t *testing.T, m *Model) {
	t.Helper()
	if len(m.Groups) == 0 || len(m.dist) == 0 || len(m.pos) == 0 {
		t.Fatal("the demo model is empty")
	}
	for _, dist := range m.dist {
		g, _ := m.Group(dist.Group)
		if dist.N+dist.Missing != len(g.MembersIn(dist.Year)) {
			t.Fatalf("%s %s %d: n %d + missing %d != %d members", dist.Group, dist.Indicator, dist.Year, dist.N, dist.Missing, len(g.MembersIn(dist.Year)))
		}
		if dist.N == 0 {
			continue
		}
		lo, hi := dist.DrawnWhiskers()
		chain := []float64{dist.Min, lo, dist.Q1, dist.Median, dist.Q3, hi, dist.Max}
		for i := 1; i < len(chain); i++ {
			if chain[i] < chain[i-1] {
				t.Fatalf("%s %s %d: box out of order %v", dist.Group, dist.Indicator, dist.Year, chain)
			}
		}
	}
	for _, p := range m.pos {
		if !p.HasValue || p.Rank == 0 {
			continue
		}
		dist, _ := m.Distribution(p.Group, p.Indicator, p.Year)
		wantOf := dist.N
		if !p.InGroup {
			wantOf++
		}
		if p.Rank < 1 || p.Rank > p.Of || p.Of != wantOf || !(p.Percentile > 0 && p.Percentile < 100) {
			t.Fatalf("position out of range: %+v (n=%d)", p, dist.N)
		}
		ind, _ := m.Indicator(p.Indicator)
		// compared as printed: value and quartiles at the declared decimals
		pr := func(x float64) float64 { return format.Round(x, ind.Decimals) }
		hi, lo := pr(dist.Q3), pr(dist.Q1)
		if ind.Better == dataset.LowerIsBetter {
			hi, lo = -pr(dist.Q1), -pr(dist.Q3)
		}
		v := pr(p.Value)
		if ind.Better == dataset.LowerIsBetter {
			v = -v
		}
		med := pr(dist.Median)
		if ind.Better == dataset.LowerIsBetter {
			med = -med
		}
		want := 4
		switch {
		case v >= hi:
			want = 1
		case v >= med:
			want = 2
		case v >= lo:
			want = 3
		}
		if p.Quartile != want {
			t.Fatalf("quartile %d for %v against quartiles %v, %v, %v (%s)", p.Quartile, p.Value, dist.Q1, dist.Median, dist.Q3, ind.Better)
		}
		if p.Rank == 1 && p.Quartile != 1 {
			t.Fatalf("a (joint) best value outside the top quarter: %+v", p)
		}
	}
}

// TestEdgeCaseData: constant columns, a column with no values, heavy ties
// and many missing values must give a model (no panic, no error) with the
// invariants intact and undefined statistics left out, not invented.
func TestEdgeCaseData(t *testing.T) {
	d, b := worldFixture(300, 5, 3)
	readAllCorrelations(b)
	for _, y := range d.Years {
		for i := 0; i < d.Register.Len(); i++ {
			d.Set(0, i, y, 7)            // constant
			d.Set(1, i, y, math.NaN())   // no values at all
			d.Set(2, i, y, float64(i%3)) // three values, heavy ties
			if i%2 == 0 {
				d.Set(3, i, y, math.NaN()) // half missing
			}
		}
	}
	b.Groups[4].Nearest.Indicators = []string{"ind02", "ind04"} // ind01 has no values now
	m, err := Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	checkInvariants(t, m)
	dist, _ := m.Distribution("World", "ind00", d.Years[0])
	if dist.SD != 0 || dist.IQR != 0 || len(dist.Outliers) != 0 {
		t.Errorf("constant column: %+v", dist)
	}
	if c, ok := m.Correlation("World", "ind00", "ind02"); !ok || !math.IsNaN(c.Pearson) || !math.IsNaN(c.Spearman) {
		t.Errorf("correlation with a constant must be undefined: %+v", c)
	}
	p, _ := m.Position("World", "ind00", m.Focus, d.Years[0])
	if !math.IsNaN(p.Z) || p.Rank != 1 || p.Percentile != 50 {
		t.Errorf("all tied: rank %d percentile %v z %v; want 1, 50, undefined", p.Rank, p.Percentile, p.Z)
	}
	if empty, _ := m.Distribution("World", "ind01", d.Years[0]); empty.N != 0 || empty.Missing != len(m.Groups[0].Members) {
		t.Errorf("empty column: %+v", empty)
	}
	var buf bytes.Buffer
	if err := WriteCSV(&buf, m); err != nil {
		t.Fatal(err)
	}
	if bytes.Contains(buf.Bytes(), []byte("NaN")) {
		t.Error("NaN written to the figures file")
	}
}
