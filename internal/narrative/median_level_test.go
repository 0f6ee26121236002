package narrative

import (
	"strings"
	"testing"
)

// A group median that printed alike at both ends "stayed at" that value and
// says so with claims that both medians lie within half a unit of the last
// decimal of it; one that moved less than a twentieth of the last year's
// IQR is "broadly unchanged" and claims the group trend's
// median_change_per_iqr. Worked by hand: gamma's members 12, 14, 16 (and
// the focus) give medians 15.0 in 2024 and 15.0 in 2025 (values 14.96 and
// 15.04 in the middle); delta's median moves 30.0 -> 30.2 against an IQR of
// about 10 (0.02 of it).
func TestGroupMedianLevelClaims(t *testing.T) {
	src := `
indicators:
  - {key: g, label: Gamma share, unit: percent, better: higher, decimals: 1}
  - {key: d, label: Delta share, unit: percent, better: higher, decimals: 1}
small_group: 2
focus: F
year: 2025
years: [2024, 2025]
columns: [g@2024, g@2025, d@2024, d@2025]
institutions:
  F: [Kestria, Arlen University, 10, 20, 10, 20]
  A: [Kestria, Bexmoor College, 12, 12, 20, 20]
  B: [Kestria, Corrin Institute, 14.96, 15.04, 30, 30.2]
  C: [Kestria, Dunmere University, 15.04, 14.96, 40, 40]
  D: [Kestria, Elswick Polytechnic, 18, 18, 50, 50]
groups:
  - {name: Kestria sector, where: {country: Kestria}}
block: {style: detail, topics: [change], indicators: [g, d]}
`
	c, m, b := parseSituation(t, src).compose(t)
	if err := Verify(m, c); err != nil {
		t.Fatal(err)
	}
	text := blockText(c, b)
	for _, s := range c.Sentences {
		switch {
		case strings.Contains(s.Text, "stayed at 15.0%"):
			bounds := 0
			for _, cl := range s.Claims {
				if cl.Right.IsNum && (cl.Right.Num > 14.9 && cl.Right.Num < 14.96 || cl.Right.Num > 15.04 && cl.Right.Num < 15.1) {
					bounds++
				}
			}
			if bounds != 4 {
				t.Errorf("%d bound claims on %q, want 4", bounds, s.Text)
			}
		case strings.Contains(s.Text, "broadly unchanged (30.0%, then 30.2%)"):
			found := false
			for _, cl := range s.Claims {
				if cl.Left.Key.Measure == "median_change_per_iqr" && cl.Op == OpLess {
					found = true
				}
			}
			if !found {
				t.Errorf("no median_change_per_iqr claim on %q", s.Text)
			}
		}
	}
	if !strings.Contains(text, "stayed at 15.0%") || !strings.Contains(text, "broadly unchanged (30.0%, then 30.2%)") {
		t.Errorf("the two median sentences are missing:\n%s", text)
	}
}
