package narrative

import (
	"strings"
	"testing"
)

// Six paragraphs in a row said "Set against the chosen peers, Wendholm
// would rank last of 8". The same place on several indicators is now one
// sentence listing them. Eight institutions; the focus has the lowest
// value on a, b and c (1, 1.5 and 0.5 against 2..8: last of 8, medians
// 4.5) and 4.5 on d (four values above it: 5th of 8, median of 2, 3, 4,
// 4.5, 5, 6, 7, 8 = 4.75), worked by hand. Higher is better throughout.
func TestSharedLastPlaceIsOneSentence(t *testing.T) {
	src := `
indicators:
  - {key: a, label: Alpha share, unit: percent, better: higher, decimals: 1}
  - {key: b, label: Beta share, unit: percent, better: higher, decimals: 1}
  - {key: c, label: Gamma share, unit: percent, better: higher, decimals: 1}
  - {key: d, label: Delta share, unit: percent, better: higher, decimals: 1}
focus: F
year: 2025
columns: [a@2025, b@2025, c@2025, d@2025]
institutions:
  F: [Kestria, Arlen University, 1, 1.5, 0.5, 4.5]
  K2: [Kestria, Kestrel 2, 2, 2, 2, 2]
  K3: [Kestria, Kestrel 3, 3, 3, 3, 3]
  K4: [Kestria, Kestrel 4, 4, 4, 4, 4]
  K5: [Kestria, Kestrel 5, 5, 5, 5, 5]
  K6: [Kestria, Kestrel 6, 6, 6, 6, 6]
  K7: [Kestria, Kestrel 7, 7, 7, 7, 7]
  K8: [Kestria, Kestrel 8, 8, 8, 8, 8]
groups:
  - {name: Kestria sector, where: {country: Kestria}}
block: {style: detail, topics: [position], indicators: [a, b, c, d]}
`
	c, m, b := parseSituation(t, src).compose(t)
	if err := Verify(m, c); err != nil {
		t.Fatal(err)
	}
	text := blockText(c, b)
	want := "In the Kestria sector, Arlen University ranks last of 8 on three of the four indicators here: alpha share, beta share and gamma share."
	if !strings.Contains(text, want) {
		t.Errorf("no shared sentence %q in:\n%s", want, text)
	}
	if n := strings.Count(text, "last of 8"); n != 1 {
		t.Errorf("\"last of 8\" said %d times:\n%s", n, text)
	}
	// Each indicator keeps its value and its distance to the median (4.5).
	for _, s := range []string{"Arlen University's figure is 1.0% in 2025.", "The median of the Kestria sector is 4.5%; Arlen University is 3.5 percentage points below it.",
		"Arlen University's figure is 1.5%.", "Arlen University's figure is 0.5%.", "5th of 8"} {
		if !strings.Contains(text, s) {
			t.Errorf("lacks %q:\n%s", s, text)
		}
	}
	// The shared sentence records a claim per indicator listed and one
	// for the indicator not in that place.
	for _, s := range c.Sentences {
		if strings.Contains(s.Text, "three of the four") && len(s.Claims) != 3*3+1 {
			t.Errorf("%d claims on %q, want 10", len(s.Claims), s.Text)
		}
	}
}
