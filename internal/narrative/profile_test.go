package narrative

import (
	"fmt"
	"strings"
	"testing"
)

// The profile a radar draws, in words: five members, medians worked by
// hand. alpha: 20, 22, 24, 26 and the focus's 30, median 24, 6.0 higher;
// beta: 12, 14, 16, 18 and 10, median 14, 4.0 lower; gamma: 13, 15, 17,
// 15 and 15, median 15, level; delta: the focus has no value; students per
// academic (lower is better): 10, 12, 14, 16 and 20, median 14, 6.0 higher.
func TestProfileAgainstTheMedian(t *testing.T) {
	src := `
indicators:
  - {key: a, label: Alpha share, unit: percent, better: neutral, decimals: 1}
  - {key: b, label: Beta share, unit: percent, better: neutral, decimals: 1}
  - {key: c, label: Gamma share, unit: percent, better: neutral, decimals: 1}
  - {key: d, label: Delta share, unit: percent, better: neutral, decimals: 1}
  - {key: spa, label: Students per academic, unit: ratio, better: lower, decimals: 1}
small_group: 2
focus: F
year: 2025
columns: [a@2025, b@2025, c@2025, d@2025, spa@2025]
institutions:
  F: [Kestria, Arlen University, 30, 10, 15, ~, 20]
  K1: [Kestria, Kestrel 1, 20, 12, 13, 5, 10]
  K2: [Kestria, Kestrel 2, 22, 14, 15, 6, 12]
  K3: [Kestria, Kestrel 3, 24, 16, 17, 7, 14]
  K4: [Kestria, Kestrel 4, 26, 18, 15, 8, 16]
groups:
  - {name: Kestria sector, where: {country: Kestria}}
block: {style: detail, topics: [profile], indicators: [a, b, c, d, spa]}
`
	c, m, b := parseSituation(t, src).compose(t)
	if err := Verify(m, c); err != nil {
		t.Fatal(err)
	}
	want := "Profile against the median: Against the median of the Kestria sector in 2025, Arlen University stands higher on alpha share (30.0% against 24.0%, 6.0 percentage points more) and students per academic (20.0 against 14.0, 6.0 more; lower is better here); lower on beta share (10.0% against 14.0%, 4.0 percentage points less); and level with the median on gamma share (15.0%). Delta share is left out, as Arlen University reports no value there for 2025 or the group has none."
	if got := strings.TrimSpace(blockText(c, b)); got != want {
		t.Errorf("got\n%s\nwant\n%s", got, want)
	}
	// The other styles write the same sentence.
	for _, style := range []string{"summary", "bullets"} {
		c, m, b := parseSituation(t, strings.Replace(src, "style: detail", "style: "+style, 1)).compose(t)
		if err := Verify(m, c); err != nil {
			t.Fatal(err)
		}
		if text := blockText(c, b); !strings.Contains(text, strings.TrimPrefix(want, "Profile against the median: ")) {
			t.Errorf("%s: no profile sentence:\n%s", style, text)
		}
	}
	// One claim per spoke placed: above (1), below (1), level (2: the
	// difference within one unit of the last decimal either way).
	for _, s := range c.Sentences {
		if strings.Contains(s.Text, "Against the median") && len(s.Claims) != 1+1+2+1 {
			t.Errorf("%d claims, want 5: %v", len(s.Claims), s.Claims)
		}
	}
}

// Twelve members report both, but every one has the same students per
// academic: enough pairs, no correlation to read (rho is undefined), and
// the sentence must not say there were too few.
func TestAssociationWithAConstantIndicator(t *testing.T) {
	src := `
indicators:
  - {key: intl, label: International staff share, unit: percent, better: higher, decimals: 1}
  - {key: spa, label: Students per academic, unit: ratio, better: lower, decimals: 1}
focus: F
year: 2025
columns: [intl@2025, spa@2025]
institutions:
  F: [Kestria, Arlen University, 30, 10]
` + constantRows(11) + `groups:
  - {name: Kestria sector, where: {country: Kestria}}
block: {style: detail, topics: [association], indicators: [intl, spa]}
`
	c, m, b := parseSituation(t, src).compose(t)
	if err := Verify(m, c); err != nil {
		t.Fatal(err)
	}
	want := "How indicators move together: Across the 12 members of the Kestria sector reporting both international staff share and students per academic in 2025, one of the two takes a single value, so no correlation can be read."
	if got := strings.TrimSpace(blockText(c, b)); got != want {
		t.Errorf("got\n%s\nwant\n%s", got, want)
	}
}

// constantRows: n institutions with international staff 10, 11, ... and
// students per academic 10 each.
func constantRows(n int) string {
	var b strings.Builder
	for i := 0; i < n; i++ {
		fmt.Fprintf(&b, "  K%02d: [Kestria, Kestrel %d, %d, 10]\n", i, i, 10+i)
	}
	return b.String()
}
