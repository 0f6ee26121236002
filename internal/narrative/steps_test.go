package narrative

import (
	"strings"
	"testing"
)

// "Driven by one year": the focus's international staff share went 10.0,
// 10.5, 20.0, 20.5 over 2022-2025 (whole change 10.5, the step 2023-2024
// 9.5 of it, a share of 0.905, at least OneYearShare); its academic staff
// share rose steadily 10, 13, 16, 19 (each step a third). Worked by hand.
// Only the first is said to come mostly from one year (and gamma, below).
func TestMovementDrivenByOneYear(t *testing.T) {
	src := `
indicators:
  - {key: intl, label: International staff share, unit: percent, better: higher, decimals: 1}
  - {key: staff, label: Academic staff share, unit: percent, better: higher, decimals: 1}
  - {key: c, label: Gamma share, unit: percent, better: higher, decimals: 1}
small_group: 2
focus: F
year: 2025
years: [2022, 2023, 2024, 2025]
columns: [intl@2022, intl@2023, intl@2024, intl@2025, staff@2022, staff@2023, staff@2024, staff@2025, c@2022, c@2023, c@2024, c@2025]
institutions:
  F: [Kestria, Arlen University, 10, 10.5, 20, 20.5, 10, 13, 16, 19, 20, 15, 14, 25]
  A: [Kestria, Bexmoor College, 12, 12, 12, 12, 12, 12, 12, 12, 12, 12, 12, 12]
  B: [Kestria, Corrin Institute, 14, 14, 14, 14, 14, 14, 14, 14, 14, 14, 14, 14]
  C: [Kestria, Dunmere University, 16, 16, 16, 16, 16, 16, 16, 16, 16, 16, 16, 16]
groups:
  - {name: Kestria sector, where: {country: Kestria}}
block: {style: detail, topics: [change], indicators: [intl, staff, c]}
`
	c, m, b := parseSituation(t, src).compose(t)
	if err := Verify(m, c); err != nil {
		t.Fatal(err)
	}
	text := blockText(c, b)
	want := "Most of that change came in one year, a rise of 9.5 percentage points between 2023 and 2024"
	if !strings.Contains(text, want) {
		t.Errorf("lacks %q:\n%s", want, text)
	}
	// Gamma share: 20, 15, 14, 25, whole change 5, steps -5, -1 and 11:
	// more than all of it in 2024-2025.
	over := "All of that change, and more, came in one year, a rise of 11.0 percentage points between 2024 and 2025; the other years took some of it back"
	if !strings.Contains(text, over) {
		t.Errorf("lacks %q:\n%s", over, text)
	}
	if n := strings.Count(text, "in one year"); n != 2 {
		t.Errorf("\"in one year\" said %d times (the steady rise is a trend):\n%s", n, text)
	}
	for _, s := range c.Sentences {
		if strings.Contains(s.Text, "in one year") && len(s.Claims) != 4 {
			t.Errorf("%d claims on %q, want 4 (points, share at least the rule, year, share against 1)", len(s.Claims), s.Text)
		}
	}

	// The summary's headline movement: international staff share, from the
	// 13th to the 88th percentile (1.5 / 4 and 3.5 / 4, worked by hand), all
	// of it between 2023 and 2024 (13th, 13th, 88th, 88th).
	c, m, _ = parseSituation(t, strings.Replace(src, "style: detail", "style: summary", 1)).compose(t)
	if err := Verify(m, c); err != nil {
		t.Fatal(err)
	}
	if text := allText(c); !strings.Contains(text, "The largest movement between 2022 and 2025 was in international staff share") ||
		!strings.Contains(text, "All of that movement came in one year, between 2023 and 2024") {
		t.Errorf("headline without its one-year step:\n%s", text)
	}
}
