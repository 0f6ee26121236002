package narrative

import (
	"strings"
	"testing"
)

// Below the small-group floor the pack gives no quarters, so a gap must
// not speak of one: it names the rank to reach. Eight institutions with
// values 1..8 on intl and staff, the focus last with 1 (8th of 8). The
// target is the last place of the best quarter of places, rounded up:
// 8 / 4 = 2nd of 8; the 2nd best of the other seven (2..8) is 7, so the
// gap is 7 - 1 = 6 (worked by hand). The position's distance speaks of
// the median only, never of a quartile. On spa, where lower is better, the
// focus's 1 is the best: no gap.
func TestSmallGroupGapsSpeakOfRanks(t *testing.T) {
	for _, style := range []string{"summary", "detail", "bullets"} {
		topics := "[position, gaps]"
		if style == "summary" {
			topics = "[position, strengths, gaps]"
		}
		c, m, _ := parseSituation(t, rankedWorld(8, 8, `groups:
  - {name: Kestria sector, where: {country: Kestria}}
block: {style: `+style+`, topics: `+topics+`, indicators: [intl, staff, spa]}
`)).compose(t)
		if err := Verify(m, c); err != nil {
			t.Fatalf("%s: %v", style, err)
		}
		for _, s := range c.Sentences {
			if style != "summary" && s.Part != "summary" && (strings.Contains(s.Text, "quartile") || strings.Contains(s.Text, "quarter")) {
				t.Errorf("%s: a group below the floor is measured against a quartile: %q", style, s.Text)
			}
		}
		var gaps []string
		for _, s := range c.Sentences {
			if strings.Contains(s.Text, "would take") || strings.Contains(s.Text, "would need") {
				gaps = append(gaps, s.Text)
			}
		}
		if len(gaps) == 0 {
			t.Fatalf("%s: no gap sentence:\n%s", style, allText(c))
		}
		for _, g := range gaps {
			if strings.Contains(g, "quarter") || strings.Contains(g, "quartile") {
				t.Errorf("%s: a gap in a group below the floor speaks of quarters: %q", style, g)
			}
			if !strings.Contains(g, "2nd of 8") || !strings.Contains(g, "6.0 percentage points") || !strings.Contains(g, "7.0%") {
				t.Errorf("%s: the gap does not name 2nd of 8, 6.0 points and 7.0%%: %q", style, g)
			}
			if strings.Contains(g, "tudents per academic") {
				t.Errorf("%s: a gap on students per academic, where the focus is best: %q", style, g)
			}
		}
	}
}

// The small-group caveat says what the pack does below the floor: ranks,
// not quarters (eight members, default floor 10); with the floor lowered
// to 5 quarters are printed and the caveat only warns.
func TestSmallGroupCaveatSaysRanksOnly(t *testing.T) {
	for _, tc := range []struct{ extra, want string }{
		{"", "fewer than the 10 that common practice asks for before quartiles are read as stable, so the pack gives ranks only there, and they are indicative."},
		{"small_group: 5\n", "fewer than the 10 that common practice asks for before quartiles are read as stable, so those ranks are indicative only."},
	} {
		c, m, _ := parseSituation(t, rankedWorld(8, 4, tc.extra+`groups:
  - {name: Kestria sector, where: {country: Kestria}}
block: {style: detail, topics: [caveats], indicators: [intl]}
`)).compose(t)
		if err := Verify(m, c); err != nil {
			t.Fatal(err)
		}
		if text := allText(c); !strings.Contains(text, tc.want) {
			t.Errorf("%q: lacks %q:\n%s", tc.extra, tc.want, text)
		}
	}
}
