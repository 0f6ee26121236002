package charts

import (
	"testing"

	"peerpack/internal/brief"
)

// TestEsteemPointsByRegion checks the esteem chart against the register:
// every member with both values is one point, in the series of its own
// region, and the series' n add up to the members drawn (each point is
// one institution; common practice, no source).
func TestEsteemPointsByRegion(t *testing.T) {
	m, b := buildModel(t, 30, goldenBody)
	var spec *brief.ChartBlock
	for _, c := range chartBlocks(b) {
		if c.Type == "esteem" {
			spec = c
		}
	}
	ch, err := New(m, spec, Theme{})
	if err != nil {
		t.Fatal(err)
	}
	sc := ch.(*ScatterChart)
	want := map[string]int{}
	seen := map[int]bool{}
	for _, g := range []string{"Kestria national", "Aldmere national"} {
		for _, pr := range m.MemberPairs(g, "intl_staff", "fnci", 2025) {
			if !seen[pr.Institution] {
				seen[pr.Institution] = true
				want[m.Data.Register.Institutions[pr.Institution].Region]++
			}
		}
	}
	if len(sc.Groups) != len(want) {
		t.Fatalf("%d region series, want %d (%v)", len(sc.Groups), len(want), want)
	}
	for _, g := range sc.Groups {
		if g.N != want[g.Label] || len(g.X) != want[g.Label] {
			t.Errorf("region %s: n = %d with %d points, the register gives %d", g.Label, g.N, len(g.X), want[g.Label])
		}
	}
	if sc.Groups[0].Label != "North" || sc.Groups[1].Label != "West" {
		t.Errorf("regions not in name order: %s, %s", sc.Groups[0].Label, sc.Groups[1].Label)
	}
}
