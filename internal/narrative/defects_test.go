package narrative

import (
	"fmt"
	"math"
	"regexp"
	"strings"
	"testing"

	"peerpack/internal/brief"
	"peerpack/internal/figures"
)

// Regression fixtures for defects found by reading packs against their
// own tables. Each is a small invented world of its own (not the demo),
// with the figures worked by hand in the comments; every case also runs
// Verify, so every claim the text records must hold.

// defectIndicators: a share (higher is better) and a ratio (lower is
// better), one decimal each.
const defectIndicators = `
indicators:
  - {key: intl, label: International staff share, unit: percent, better: higher, decimals: 1}
  - {key: staff, label: Academic staff share, unit: percent, better: higher, decimals: 1}
  - {key: spa, label: Students per academic, unit: ratio, better: lower, decimals: 1}
focus: F
year: 2025
`

func allText(c *Commentary) string {
	var b strings.Builder
	for _, s := range c.Sentences {
		b.WriteString(s.Text + "\n")
	}
	return b.String()
}

// "None is ahead on any other indicator here" was printed while one
// system's median led by 17.5 % against 17.3 %, a lead under a twentieth
// of that system's IQR. Now a median ahead is either ahead or, within the
// noise rule, level: never "not ahead".
func TestDefectNoneAheadWhileOneIs(t *testing.T) {
	// intl: every system's median (49, 52, 50) is ahead of 45.0.
	// staff: Brisa 5, 17.5, 40 (median 17.5, IQR 28.75 - 11.25 = 17.5, so
	// 0.2 is under a twentieth of it); the focus's 17.3 placed among them
	// ranks 3rd of 4, percentile 100 x 1.5 / 4 = 37.5, more than 5 points
	// below the middle: ahead. Tarn 10, 12, 14 and Veldra 11, 12, 13: the
	// focus is ahead of both medians.
	c, _, _ := parseSituation(t, defectIndicators+`
columns: [intl@2025, staff@2025, spa@2025]
institutions:
  F: [Kestria, Arlen University, 45, 17.3, 14]
  B1: [Brisa, Bramble University, 47, 5, 14]
  B2: [Brisa, Brook College, 49, 17.5, 14]
  B3: [Brisa, Briar Institute, 70, 40, 14]
  T1: [Tarn, Tallow University, 48, 10, 14]
  T2: [Tarn, Thorn College, 52, 12, 14]
  T3: [Tarn, Teasel Institute, 60, 14, 14]
  V1: [Veldra, Vantor University, 50, 11, 14]
  V2: [Veldra, Velle College, 40, 12, 14]
  V3: [Veldra, Varn Institute, 55, 13, 14]
groups:
  - {name: Systems, each: country, where: {country: [Brisa, Tarn, Veldra]}}
block: {style: detail, topics: [competition], indicators: [intl, staff]}
`).compose(t)
	text := allText(c)
	if strings.Contains(text, "none is ahead on any other indicator") {
		t.Errorf("says no median leads elsewhere although Brisa's leads on staff:\n%s", text)
	}
	if !strings.Contains(text, "academic staff share (17.5% against 17.3%)") {
		t.Errorf("Brisa's lead on academic staff share is not stated:\n%s", text)
	}
	for _, s := range c.Sentences {
		if strings.Contains(s.Text, "Brisa") && strings.Contains(s.Text, "not ahead") {
			t.Errorf("Brisa called not ahead: %q", s.Text)
		}
	}
}

// A world of n institutions in Kestria with values 1..n on intl and staff
// (F at the given rank from the top; spa, where lower is better, holds
// the same values, so its ranks run the other way), then the extra lines.
func rankedWorld(n, focusRank int, extra string) string {
	var b strings.Builder
	b.WriteString(defectIndicators + "columns: [intl@2025, staff@2025, spa@2025]\ninstitutions:\n")
	for i := 1; i <= n; i++ {
		id := fmt.Sprintf("K%03d", i)
		if i == n-focusRank+1 {
			id = "F"
		}
		fmt.Fprintf(&b, "  %s: [Kestria, Kestrel %d, %d, %d, %d]\n", id, i, i, i, i)
	}
	b.WriteString(extra)
	return b.String()
}

// "In the second quarter ... 1.18 above the upper quartile": a focus on
// the 75th percentile with a value above Q3. Ten values 1..10, the focus
// 8 (3rd of 10): percentile 100 x 7.5 / 10 = 75; type-7 Q3 = 7.75, so 8 is
// above it: the top quarter by the one boundary rule, and within the
// noise rule of 75, so "at the edge of the top quarter"; never "second".
func TestDefectSecondQuarterAboveUpperQuartile(t *testing.T) {
	c, m, _ := parseSituation(t, rankedWorld(10, 3, `groups:
  - {name: Kestria sector, where: {country: Kestria}}
block: {style: detail, topics: [position], indicators: [intl]}
`)).compose(t)
	p, _ := m.Position("Kestria sector", "intl", m.Focus, 2025)
	if p.Quartile != 1 || p.Percentile != 75 {
		t.Fatalf("quartile %d, percentile %v; want 1 and 75", p.Quartile, p.Percentile)
	}
	text := allText(c)
	if strings.Contains(text, "second quarter") || !strings.Contains(text, "at the edge of the top quarter") || !strings.Contains(text, "above the upper quartile") {
		t.Errorf("text:\n%s", text)
	}
}

// Joint-best institutions were described as in the middle or third
// quarter. Six share the best value among twelve: rank joint 1st, mid-rank
// percentile 100 x (6 + 6/2) / 12 = 75, which the old percentile rule put
// in the second quarter; the quarter by value (the maximum is never below
// Q3) is the top one in the model, the tables and the text, and 75 is at
// its edge.
func TestDefectJointBestBelowTopQuarter(t *testing.T) {
	src := defectIndicators + "columns: [intl@2025, staff@2025, spa@2025]\ninstitutions:\n"
	for _, id := range []string{"F", "A", "B", "C", "D", "E"} {
		src += fmt.Sprintf("  %s: [Kestria, Kestrel %s, 50, 50, 5]\n", id, id)
	}
	for i := 1; i <= 6; i++ {
		src += fmt.Sprintf("  K%d: [Kestria, Kestrel %d, %d, %d, %d]\n", i, i, 10+i, 10+i, 10+i)
	}
	src += "groups:\n  - {name: Kestria sector, where: {country: Kestria}}\nblock: {style: detail, topics: [position], indicators: [intl, spa]}\n"
	c, m, _ := parseSituation(t, src).compose(t)
	for _, ind := range []string{"intl", "spa"} {
		p, _ := m.Position("Kestria sector", ind, m.Focus, 2025)
		if p.Rank != 1 || p.Ties != 6 || p.Quartile != 1 || p.Percentile != 75 {
			t.Errorf("%s: rank %d, ties %d, quartile %d; want joint 1st in the top quarter", ind, p.Rank, p.Ties, p.Quartile)
		}
	}
	text := allText(c)
	if strings.Contains(text, "third quarter") || strings.Contains(text, "second quarter") || strings.Contains(text, "middle") {
		t.Errorf("a joint best is placed below the top quarter:\n%s", text)
	}
}

// "0th" and "100th" percentiles: the best and worst of 400 have mid-rank
// percentiles 99.875 and 0.125, printed 99th and 1st.
func TestDefectZerothAndHundredthPercentile(t *testing.T) {
	for _, rank := range []int{1, 400} {
		c, _, _ := parseSituation(t, rankedWorld(400, rank, `groups:
  - {name: Kestria sector, where: {country: Kestria}}
block: {style: summary}
`)).compose(t)
		text := allText(c)
		if regexp.MustCompile(`\b(0|100)th\b`).MatchString(text) {
			t.Errorf("rank %d prints 0th or 100th:\n%s", rank, text)
		}
		want := "99th"
		if rank == 400 {
			want = "(1st)"
		}
		if !strings.Contains(text, want) {
			t.Errorf("rank %d: no %q in\n%s", rank, want, text)
		}
	}
}

// "Top quarter" was said of a 76th percentile although the pack's own
// rule puts differences under 5 percentile points inside the noise. 25
// values, the focus 20th from the bottom (6th of 25): percentile
// 100 x 19.5 / 25 = 78, within 5 of 75.
func TestDefectTopQuarterInsideTheNoise(t *testing.T) {
	c, m, _ := parseSituation(t, rankedWorld(25, 6, `groups:
  - {name: Kestria sector, where: {country: Kestria}}
block: {style: summary, topics: [position]}
`)).compose(t)
	p, _ := m.Position("Kestria sector", "intl", m.Focus, 2025)
	if p.Percentile != 78 {
		t.Fatalf("percentile %v, want 78", p.Percentile)
	}
	text := allText(c)
	if strings.Contains(text, "in the top quarter on") || !strings.Contains(text, "at the edge of the top quarter") {
		t.Errorf("text:\n%s", text)
	}
}

// "With no indicator in the bottom quarter" stood above a table with four
// bottom-quarter rows among the client's chosen peers, and the summary
// spoke of the home sector only. Now a summary leads with the chosen peers
// and names (cites) every bottom-quarter position of every group in its
// scope. The focus is near the top of twelve Kestrian institutions and
// near the bottom of twelve chosen peers from elsewhere.
func TestDefectSummaryLeavesOutChosenPeers(t *testing.T) {
	src := defectIndicators + "columns: [intl@2025, staff@2025, spa@2025]\ninstitutions:\n" +
		"  F: [Kestria, Arlen University, 40, 40, 20]\n"
	var peers []string
	for i := 1; i <= 11; i++ {
		src += fmt.Sprintf("  K%02d: [Kestria, Kestrel %d, %d, %d, %d]\n", i, i, 10+i, 10+i, 30-i)
		id := fmt.Sprintf("P%02d", i)
		peers = append(peers, id)
		src += fmt.Sprintf("  %s: [Veldra, Vantor %d, %d, %d, %d]\n", id, i, 40+i, 40+i, 10+i)
	}
	src += "groups:\n  - {name: Kestria sector, where: {country: Kestria}}\n" +
		"  - {name: Chosen peers, members: [F, " + strings.Join(peers, ", ") + "]}\n" +
		"block: {style: summary}\n"
	c, m, b := parseSituation(t, src).compose(t)
	var summary []Sentence
	for _, blk := range b.Blocks {
		if cb, ok := blk.(*brief.CommentaryBlock); ok {
			summary = collect(c.Blocks[cb])
		}
	}
	if len(summary) == 0 || !strings.HasPrefix(summary[0].Text, "Within the chosen peers") {
		t.Fatalf("the summary does not lead with the chosen peers:\n%s", allText(c))
	}
	cited := map[figures.Key]bool{}
	for _, s := range summary {
		for _, k := range s.Cites {
			cited[k] = true
		}
	}
	bottom := 0
	for _, g := range []string{"Kestria sector", "Chosen peers"} {
		for _, ind := range []string{"intl", "staff", "spa"} {
			p, _ := m.Position(g, ind, m.Focus, 2025)
			if p.Quartile != 4 {
				continue
			}
			bottom++
			if !cited[posKey(g, ind, "F", 2025, mQuartile)] {
				t.Errorf("bottom-quarter position %s/%s is not cited in the summary:\n%s", g, ind, allText(c))
			}
		}
	}
	if bottom < 3 {
		t.Fatalf("fixture: only %d bottom-quarter positions", bottom)
	}
	if !strings.Contains(allText(c), "Within the Kestria sector") {
		t.Errorf("the home sector is not covered:\n%s", allText(c))
	}
}

// The competitor paragraph was printed twice in a pack whose brief asked
// for it twice: no paragraph appears twice.
func TestDefectParagraphTwice(t *testing.T) {
	c, _, b := parseSituation(t, defectIndicators+`
columns: [intl@2025, staff@2025, spa@2025]
institutions:
  F: [Kestria, Arlen University, 45, 17.3, 14]
  B1: [Brisa, Bramble University, 47, 5, 14]
  B2: [Brisa, Brook College, 49, 17.5, 14]
  T1: [Tarn, Tallow University, 48, 10, 14]
  T2: [Tarn, Thorn College, 52, 12, 14]
groups:
  - {name: Systems, each: country, where: {country: [Brisa, Tarn]}}
block: {style: detail, topics: [competition]}
repeat: 2
`).compose(t)
	seen := map[string]bool{}
	n := 0
	for _, blk := range b.Blocks {
		cb, ok := blk.(*brief.CommentaryBlock)
		if !ok {
			continue
		}
		n++
		for _, p := range c.Blocks[cb] {
			if seen[p.Heading+p.Text()] {
				t.Errorf("paragraph printed twice: %s: %s", p.Heading, p.Text())
			}
			seen[p.Heading+p.Text()] = true
		}
	}
	if n != 2 || len(seen) == 0 {
		t.Fatalf("fixture: %d blocks, %d paragraphs", n, len(seen))
	}
}

// "The largest movement" must be a movement beyond the noise rule (a guard:
// the claim percentile_move >= noise is recorded whenever it is said). Two
// years, the focus's percentile moving by 4 points at most: no headline.
func TestDefectLargestMovementInsideTheNoise(t *testing.T) {
	src := defectIndicators + "years: [2021, 2025]\ncolumns: [intl@2021, intl@2025, staff@2021, staff@2025, spa@2021, spa@2025]\ninstitutions:\n"
	// 25 institutions valued 1..25 in both years; the focus moves from
	// 13 to 14 (percentile 50 to 54: 4 points).
	for i := 1; i <= 24; i++ {
		v := i
		if i >= 13 {
			v = i + 1
		}
		src += fmt.Sprintf("  K%02d: [Kestria, Kestrel %d, %d, %d, %d, %d, %d, %d]\n", i, i, v, v, v, v, v, v)
	}
	src += "  F: [Kestria, Arlen University, 13, 14.5, 13, 14.5, 13, 11.5]\n"
	src += "groups:\n  - {name: Kestria sector, where: {country: Kestria}}\nblock: {style: summary, topics: [position, change]}\n"
	c, m, _ := parseSituation(t, src).compose(t)
	tr, _ := m.Trend("Kestria sector", "intl", m.Focus)
	if tr.PercentileMove != 4 {
		t.Fatalf("fixture: intl percentile move %v, want 4", tr.PercentileMove)
	}
	if text := allText(c); strings.Contains(text, "largest movement") {
		t.Errorf("a move inside the noise is called the largest movement:\n%s", text)
	}
}

// Z-scores carry a caution where the values are strongly skewed: nine
// values of 1 and one of 50 have adjusted sample skewness
// sqrt(90)/8 x g1 with g1 = 8/3, that is sqrt(10) = 3.16 (worked by hand;
// SciPy skew(bias=False) agrees, from memory), beyond 2; a symmetric
// group gets no caution.
func TestSkewedValuesCaution(t *testing.T) {
	src := defectIndicators + "columns: [intl@2025, staff@2025, spa@2025]\ninstitutions:\n  F: [Kestria, Arlen University, 50, 5, 5]\n"
	for i := 1; i <= 9; i++ {
		src += fmt.Sprintf("  K%d: [Kestria, Kestrel %d, 1, %d, %d]\n", i, i, i, i)
	}
	src += "groups:\n  - {name: Kestria sector, where: {country: Kestria}}\nblock: {style: detail, topics: [position, caveats], indicators: [intl, staff]}\n"
	c, m, _ := parseSituation(t, src).compose(t)
	d, _ := m.Distribution("Kestria sector", "intl", 2025)
	if math.Abs(d.Skewness-math.Sqrt(10)) > 1e-9 {
		t.Fatalf("skewness %v, want sqrt(10)", d.Skewness)
	}
	n := 0
	for _, s := range c.Sentences {
		if strings.Contains(s.Text, "strongly skewed") {
			n++
			if s.About != "intl" || !strings.Contains(s.Text, "(sample skewness 3.2") || len(s.Claims) != 1 {
				t.Errorf("caution %q about %s with %d claims", s.Text, s.About, len(s.Claims))
			}
		}
	}
	if n != 1 {
		t.Errorf("%d skewness cautions, want 1 (intl only):\n%s", n, allText(c))
	}
}

// Profile peers chosen on an indicator are like the focus there by
// construction, and the caveats say so for that indicator only.
func TestProfilePeersByConstruction(t *testing.T) {
	src := defectIndicators + "columns: [intl@2025, staff@2025, spa@2025]\ninstitutions:\n  F: [Kestria, Arlen University, 30, 30, 15]\n"
	for i := 1; i <= 12; i++ {
		src += fmt.Sprintf("  K%02d: [Kestria, Kestrel %d, %d, %d, %d]\n", i, i, 20+i, 40-i, 10+i)
	}
	src += "groups:\n  - {name: Profile peers, nearest: {count: 5, indicators: [intl]}}\nblock: {style: detail, topics: [position, caveats], indicators: [intl, staff]}\n"
	c, _, _ := parseSituation(t, src).compose(t)
	var about []string
	for _, s := range c.Sentences {
		if strings.Contains(s.Text, "by construction") {
			about = append(about, s.About)
		}
	}
	if len(about) != 1 || about[0] != "intl" {
		t.Errorf("by-construction cautions on %v, want [intl]:\n%s", about, allText(c))
	}
}

// A summary says which indicators it leaves out and why: the focus
// reports no value for academic staff share in 2025.
func TestSummarySaysWhatItLeavesOut(t *testing.T) {
	src := defectIndicators + "columns: [intl@2025, staff@2025, spa@2025]\ninstitutions:\n  F: [Kestria, Arlen University, 30, ~, 15]\n"
	for i := 1; i <= 12; i++ {
		src += fmt.Sprintf("  K%02d: [Kestria, Kestrel %d, %d, %d, %d]\n", i, i, 20+i, 40-i, 10+i)
	}
	src += "groups:\n  - {name: Kestria sector, where: {country: Kestria}}\nblock: {style: summary, topics: [position]}\n"
	c, _, _ := parseSituation(t, src).compose(t)
	want := "The positions above leave out academic staff share, for which Arlen University reports no 2025 figure."
	if !strings.Contains(allText(c), want) {
		t.Errorf("want %q in\n%s", want, allText(c))
	}
}

// "Since 2020, Wendholm's figure has risen from 2.7% to 2.7%": two values
// that print alike were called a rise because their unrounded difference
// (2.749 - 2.651 = 0.098) rounds to 0.1. Printed alike, they differ by
// less than one unit of the last decimal, which is what the sentence now
// claims (-0.1 < change < 0.1); no rise or fall is stated.
func TestDefectRiseBetweenValuesPrintedAlike(t *testing.T) {
	c, _, _ := parseSituation(t, defectIndicators+`
columns: [intl@2020, intl@2025, staff@2025, spa@2025]
institutions:
  F: [Kestria, Arlen University, 2.651, 2.749, 10, 14]
  K1: [Kestria, Kestrel College, 1, 1, 11, 14]
  K2: [Kestria, Kestrel Institute, 2, 2, 12, 14]
  K3: [Kestria, Kestrel University, 3, 3, 13, 14]
  K4: [Kestria, Kestrel School, 4, 4, 14, 14]
groups:
  - {name: Kestria sector, where: {country: Kestria}}
block: {style: detail, topics: [change], indicators: [intl]}
years: [2020, 2025]
`).compose(t)
	text := allText(c)
	if strings.Contains(text, "risen from 2.7% to 2.7%") || strings.Contains(text, "fallen from 2.7% to 2.7%") || strings.Contains(text, "rose from 2.7% to 2.7%") || strings.Contains(text, "fell from 2.7% to 2.7%") {
		t.Errorf("a change between values printed alike is called a rise or fall:\n%s", text)
	}
	if !strings.Contains(text, "2.7%") {
		t.Errorf("the change is not spoken of at all:\n%s", text)
	}
}
