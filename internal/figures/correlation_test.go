package figures

import (
	"math"
	"testing"

	"peerpack/internal/brief"
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
	// every pair in every group: a block on association with no
	// indicators or groups named
	readAllCorrelations(wb)
	wm, err := Compute(wd, wb)
	if err != nil {
		t.Fatal(err)
	}
	check(wm)
	if c, ok := wm.Correlation("World", "ind03", "ind01"); !ok || c.IndicatorX != "ind03" {
		t.Errorf("Correlation in reverse order: %+v %v", c, ok)
	}
}

// Correlations are computed only where a commentary block on association
// reads them: none without one; with one, every pair of its indicators in
// its groups (an each name standing for all its groups), nothing else.
func TestCorrelationsOnlyWhereRead(t *testing.T) {
	wd, wb := worldFixture(400, 5, 2)
	m, err := Compute(wd, wb)
	if err != nil {
		t.Fatal(err)
	}
	if len(m.Correlations) != 0 {
		t.Fatalf("no block reads correlations, yet %d were computed", len(m.Correlations))
	}
	wd, wb = worldFixture(400, 5, 2)
	wb.Blocks = append(wb.Blocks,
		&brief.CommentaryBlock{Topics: []string{"position"}, Indicators: []string{"ind00", "ind01"}},
		&brief.CommentaryBlock{Topics: []string{TopicAssociation, "position"}, Indicators: []string{"ind03", "ind01", "ind04"}, Groups: []string{"World", "Region"}})
	m, err = Compute(wd, wb)
	if err != nil {
		t.Fatal(err)
	}
	want := map[string]bool{}
	for _, g := range append(m.GroupsOf("World"), m.GroupsOf("Region")...) {
		for _, p := range []string{"ind01~ind03", "ind01~ind04", "ind03~ind04"} {
			want[g.Name+" "+p] = true
		}
	}
	if len(m.GroupsOf("Region")) < 2 {
		t.Fatalf("the fixture should have several regions: %d", len(m.GroupsOf("Region")))
	}
	got := map[string]bool{}
	for _, c := range m.Correlations {
		got[c.Group+" "+PairKey(c.IndicatorX, c.IndicatorY)] = true
	}
	if len(got) != len(want) || len(m.Correlations) != len(want) {
		t.Fatalf("computed %d correlations %v, want %d %v", len(m.Correlations), got, len(want), want)
	}
	for k := range want {
		if !got[k] {
			t.Errorf("missing correlation %s", k)
		}
	}
	if _, ok := m.Correlation(m.GroupsOf("Country")[0].Name, "ind01", "ind03"); ok {
		t.Error("a group no association block names has a correlation")
	}
}

// readAllCorrelations adds to a brief a commentary block on association
// over every indicator and group, so every correlation is computed.
func readAllCorrelations(b *brief.Brief) {
	b.Blocks = append(b.Blocks, &brief.CommentaryBlock{Topics: []string{TopicAssociation}})
}
