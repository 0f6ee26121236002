package layout

import (
	"bytes"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
)

// fixtureBody returns the fixture brief's front matter with another body.
func fixtureBody(t testing.TB, body string) []byte {
	t.Helper()
	src, err := os.ReadFile(filepath.Join(fixtureDir, "brief.md"))
	if err != nil {
		t.Fatal(err)
	}
	end := bytes.Index(src[4:], []byte("\n---\n")) + 4 + 5
	return append(append([]byte(nil), src[:end]...), body...)
}

// flatText is the pack's text with every run of white space one space, so
// that phrases broken over lines can be counted.
func flatText(t *testing.T, pdf []byte) string {
	return strings.Join(strings.Fields(runTool(t, pdf, "pdftotext")), " ")
}

// ownSection is a brief's own cautions section that makes four of the five
// standard cautions (not the one on decisions) and discusses the
// fixture's judgement on students per academic.
const ownSection = `
# Reading these figures

**Coverage.** Some institutions did not return data; figures count only those with a value.

**Choices are value judgements.** Reading fewer students per academic as better is itself a judgement.

**Uncertainty.** Neighbouring ranks are separated by less than the noise of the data.

**What the figures do not measure.** Teaching quality and the student experience are not measured.
`

// Detection of the brief's own cautions (common practice, no source: a
// section is credited with a caution only when it plainly makes it).
func TestFindOwnCautions(t *testing.T) {
	cases := []struct {
		name, body string
		title      string // "" for none found
		covered    []caution
	}{
		{"none", "# Results\n\nImpact rose.\n", "", nil},
		{"own section", "# Results\n\nImpact rose.\n" + ownSection, "Reading these figures",
			[]caution{cautionCoverage, cautionJudgement, cautionUncertainty, cautionMeasured}},
		{"one caution under a cautions title is not enough", "# Limits\n\nThe data are missing for some.\n", "", nil},
		{"two cues in an ordinary section are not enough", "# Results\n\nSome values are missing; differences are within the noise.\n", "", nil},
		{"two under a cautions title", "## Caveats\n\nSome values are missing; differences are within the noise.\n", "Caveats",
			[]caution{cautionCoverage, cautionUncertainty}},
		{"three anywhere", "# Notes\n\nValues are missing for some. Weights are a judgement. Ranks carry noise.\n", "Notes",
			[]caution{cautionCoverage, cautionJudgement, cautionUncertainty}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			in := fixtureInputFrom(t, 30, fixtureBody(t, c.body))
			w := &writer{in: in, b: in.Brief, m: in.Model, src: in.Brief.Body}
			w.indexBlocks()
			got := w.findOwnCautions()
			if c.title == "" {
				if got != nil {
					t.Fatalf("found %q, want none", got.title)
				}
				return
			}
			if got == nil || got.title != c.title {
				t.Fatalf("found %+v, want %q", got, c.title)
			}
			want := map[caution]bool{}
			for _, k := range c.covered {
				want[k] = true
			}
			for k := caution(0); k < cautionCount; k++ {
				if got.covered[k] != want[k] {
					t.Errorf("caution %d covered = %v, want %v", k, got.covered[k], want[k])
				}
			}
		})
	}
}

// Each standard caution is stated exactly once: in the closing when the
// brief has no cautions of its own, else in the brief's section, with the
// closing adding only what that section leaves out.
func TestStandardCautionsOnce(t *testing.T) {
	leads := []string{"Only what is measured.", "Choices are judgements.", "Uncertainty.", "Coverage.", "Use with care."}
	judgement := "Fewer students per academic is read as better here"
	body := "# Results\n\nImpact is {=value fnci}.\n"

	out, err := Render(fixtureInputFrom(t, 60, fixtureBody(t, body)))
	if err != nil {
		t.Fatal(err)
	}
	text := flatText(t, out)
	for _, l := range append(leads, judgement) {
		if n := strings.Count(text, l); n != 1 {
			t.Errorf("without own cautions: %q appears %d times, want once", l, n)
		}
	}
	if n := strings.Count(text, "What the figures do not show"); n != 2 {
		t.Errorf("without own cautions: want the closing's limits in the contents and as a heading, found %d", n)
	}
	if strings.Contains(text, "Keep in mind as well") {
		t.Error("without own cautions the closing should not point to them")
	}

	out, err = Render(fixtureInputFrom(t, 60, fixtureBody(t, body+ownSection)))
	if err != nil {
		t.Fatal(err)
	}
	text = flatText(t, out)
	want := map[string]int{
		"Only what is measured.": 0, "Choices are judgements.": 0, "Use with care.": 1,
		"Uncertainty.":                 1, // the brief's own
		judgement:                      0, // the brief discusses students per academic
		"What the figures do not show": 0,
		"set out in “Reading these figures” above. Keep in mind as well: • Use with care.": 1,
		"Read them with “Reading these figures” and the notes in “About these figures”":    1, // the cover
	}
	for phrase, n := range want {
		if got := strings.Count(text, phrase); got != n {
			t.Errorf("with own cautions: %q appears %d times, want %d", phrase, got, n)
		}
	}
}

// A table too wide for the frame at the normal size steps down a size
// rather than shortening its figures: every rank prints whole. Twelve rows
// (four indicators in three groups) of ten columns, the widest table the
// position kind makes.
func TestWideTableKeepsFiguresWhole(t *testing.T) {
	body := "# Dashboard\n\n```table\nkind: position\ngroups: [Valmoria, Northern region, Chosen peers]\n```\n"
	// Margins of 30 mm leave a 150 mm frame, too narrow for the table at
	// the normal size.
	src := bytes.Replace(fixtureBody(t, body), []byte("theme:\n"), []byte("theme:\n  margins: {left: 30, right: 30}\n"), 1)
	out, err := Render(fixtureInputFrom(t, 300, src))
	if err != nil {
		t.Fatal(err)
	}
	text := runTool(t, out, "pdftotext", "-layout")
	var page string
	for _, p := range strings.Split(text, "\f") {
		if strings.Contains(p, "Dashboard") && !strings.Contains(p, "Contents") {
			page = p
		}
	}
	if strings.Contains(page, "…") {
		t.Errorf("a table cell was shortened:\n%s", page)
	}
	if n := len(regexp.MustCompile(`\d+(st|nd|rd|th) of \d+`).FindAllString(page, -1)); n != 12 {
		t.Errorf("want 12 whole ranks, found %d:\n%s", n, page)
	}
	for _, g := range []string{"Valmoria", "Northern region", "Chosen peers"} {
		if !strings.Contains(page, g) {
			t.Errorf("group %q not printed on one line", g)
		}
	}
}

// A chart's title is printed above it, its numbered caption below.
func TestChartTitleAboveCaption(t *testing.T) {
	body := "# Impact\n\n```chart\nkind: box\nindicators: [fnci]\ngroups: [Valmoria]\ntitle: Impact across the national sector\ncaption: Valmoria, 2025.\n```\n"
	out, err := Render(fixtureInputFrom(t, 60, fixtureBody(t, body)))
	if err != nil {
		t.Fatal(err)
	}
	text := flatText(t, out)
	ti, ci := strings.Index(text, "Impact across the national sector"), strings.Index(text, "Figure 1. Valmoria, 2025.")
	if ti < 0 || ci < 0 || ti > ci {
		t.Errorf("title at %d, caption at %d: want both, the title first", ti, ci)
	}
}
