package layout

import (
	"fmt"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"testing/fstest"
	"time"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/demo"
	"peerpack/internal/figures"
	"peerpack/internal/format"
	"peerpack/internal/narrative"
	"peerpack/templates"
)

// compositePack lays out the governing-body template with a composite
// section over indicators the demo dictionary has, and a composite block.
func compositePack(t *testing.T) ([]byte, *figures.Model) {
	t.Helper()
	files, err := templates.Files("governing-body")
	if err != nil {
		t.Fatal(err)
	}
	impact, collab := "citation_impact", "intl_coauthorship"
	section := "composite:\n" +
		"  pillars:\n" +
		"    - {key: research, label: Research, weight: 2, indicators: {" + impact + ": 2, papers_per_academic: 1}}\n" +
		"    - {key: reach, label: Reach, weight: 1, indicators: {" + collab + ": 1}}\n" +
		"    - {key: teaching, label: Teaching, weight: 1, indicators: {students_per_academic: 1}}\n" +
		"  uncertainty: {runs: 300, weights: 0.25, normalise: [zscore, percentile], seed: 5}\n"
	src := strings.Replace(withoutComposite(string(files[demo.BriefName])), "\ngroups:", "\n"+section+"groups:", 1)
	// every part, whatever the template chooses to show
	src = regexp.MustCompile("(```composite\n)show: [^\n]*\n").ReplaceAllString(src, "$1")
	if !strings.Contains(src, "```composite") {
		src += "\n# Composite score\n\n```composite\nneighbours: 4\n```\n"
	}
	src += "\n```appendix\nkind: methodology\n```\n"
	fsys := fstest.MapFS{}
	for k, v := range files {
		fsys[k] = &fstest.MapFile{Data: v}
	}
	b, err := brief.Parse(demo.BriefName, []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	d, _, err := dataset.Load(fsys, b)
	if err != nil {
		t.Fatal(err)
	}
	m, err := figures.Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	com, err := narrative.Compose(m, b)
	if err != nil {
		t.Fatal(err)
	}
	if err := narrative.Verify(m, com); err != nil {
		t.Fatal(err)
	}
	pdf, err := Render(Input{Brief: b, Model: m, Commentary: com, FS: fsys, Created: time.Date(2026, 3, 1, 9, 0, 0, 0, time.UTC), Version: "test"})
	if err != nil {
		t.Fatal(err)
	}
	return pdf, m
}

// The composite section prints the model's rank with its interval, the
// weights as value judgements, its charts and cautions, and the
// methodology annex states the weights; every word stays inside the side
// margins (as TestNothingRunsOffThePage; common practice, no source).
func TestCompositeSection(t *testing.T) {
	if testing.Short() {
		t.Skip("lays out a pack")
	}
	pdf, m := compositePack(t)
	text := runTool(t, pdf, "pdftotext", "-raw")
	flat := strings.Join(strings.Fields(text), " ")
	cy, _ := m.Composite(m.Year)
	a := cy.Of(m.Focus)
	r := cy.Result
	want := []string{
		fmt.Sprintf("ranks %s of %s in %d", format.Ordinal(r.Rank[a]), format.Int(r.NScored()), m.Year),
		fmt.Sprintf("between %s and %s in 90 %%", format.Ordinal(r.RankLow[a]), format.Ordinal(r.RankHigh[a])),
		"Composite rank with its uncertainty",
		"They are value judgements",
		"How the composite is built",
		"Pillar contributions",
		"Reading the composite.",
		"The composite score weighs 4 indicators in 3 pillars (Research 50 %, Reach 25 %, Teaching 25 %)",
	}
	if cy.Target > 0 {
		want = append(want, "Headroom: what one indicator alone would take to reach "+format.Ordinal(cy.Target))
	}
	for _, w := range want {
		if !strings.Contains(flat, w) {
			t.Errorf("pack lacks %q", w)
		}
	}
	html := runTool(t, pdf, "pdftotext", "-bbox")
	box := regexp.MustCompile(`<word xMin="([0-9.]+)" yMin="[0-9.]+" xMax="([0-9.]+)" yMax="[0-9.]+">([^<]*)</word>`)
	const left, right = 56.69 - 1.5, 595.28 - 56.69 + 1.5
	for _, w := range box.FindAllStringSubmatch(html, -1) {
		x0, _ := strconv.ParseFloat(w[1], 64)
		x1, _ := strconv.ParseFloat(w[2], 64)
		if x0 < left || x1 > right {
			t.Errorf("word %q at x %.1f–%.1f lies outside the type area", w[3], x0, x1)
		}
	}
}

// withoutComposite drops a composite: section from a brief's front matter.
func withoutComposite(src string) string {
	var out []string
	skip := false
	for _, l := range strings.Split(src, "\n") {
		if strings.HasPrefix(l, "composite:") {
			skip = true
			continue
		}
		if skip && (strings.HasPrefix(l, " ") || l == "") {
			continue
		}
		skip = false
		out = append(out, l)
	}
	return strings.Join(out, "\n")
}
