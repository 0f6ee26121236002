package figures

import (
	"math"
	"testing"

	"peerpack/internal/stats"
)

// The fast pairwise path must agree with stats.Pearson and stats.Spearman
// (themselves checked against R 4.2.2 and gonum/stat) on the members with
// both values, for every pair and group of the fixture and of a generated
// world with ties and missing values.
func TestCorrelationsAgreeWithStats(t *testing.T) {
	d, b := loadFixture(t)
	check := func(m *Model) {
		t.Helper()
		if len(m.Correlations) == 0 {
			t.Fatal("no correlations computed")
		}
		for _, c := range m.Correlations {
			g, _ := m.Group(c.Group)
			cx := m.Data.Column(m.Data.Dictionary.Index(c.IndicatorX), c.Year)
			cy := m.Data.Column(m.Data.Dictionary.Index(c.IndicatorY), c.Year)
			var xs, ys []float64
			for _, i := range g.Members {
				if !math.IsNaN(cx[i]) && !math.IsNaN(cy[i]) {
					xs = append(xs, cx[i])
					ys = append(ys, cy[i])
				}
			}
			if c.N != len(xs) {
				t.Fatalf("%s %s~%s: n=%d want %d", c.Group, c.IndicatorX, c.IndicatorY, c.N, len(xs))
			}
			for _, pair := range [][2]float64{{c.Pearson, stats.Pearson(xs, ys)}, {c.Spearman, stats.Spearman(xs, ys)}} {
				if math.IsNaN(pair[0]) != math.IsNaN(pair[1]) || math.Abs(pair[0]-pair[1]) > 1e-12 {
					t.Fatalf("%s %s~%s: got %v want %v", c.Group, c.IndicatorX, c.IndicatorY, pair[0], pair[1])
				}
			}
		}
	}
	m, err := Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	check(m)
	wd, wb := worldFixture(600, 5, 2)
	wm, err := Compute(wd, wb)
	if err != nil {
		t.Fatal(err)
	}
	check(wm)
	if c, ok := wm.Correlation("World", "ind03", "ind01"); !ok || c.IndicatorX != "ind03" {
		t.Errorf("Correlation in reverse order: %+v %v", c, ok)
	}
}
