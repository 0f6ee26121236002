package layout

import (
	"regexp"
	"strconv"
	"strings"
	"testing"
)

var wordBox = regexp.MustCompile(`<word xMin="([0-9.]+)" yMin="([0-9.]+)" xMax="([0-9.]+)" yMax="([0-9.]+)">([^<]*)</word>`)

// pageBoxes splits pdftotext -bbox output into pages: height, then the words.
var pageBoxes = regexp.MustCompile(`(?s)<page width="[0-9.]+" height="([0-9.]+)">(.*?)</page>`)

// TestNothingRunsOffThePage reads every word's box back with poppler's
// pdftotext -bbox and checks that all text of the 30-page pack lies inside
// the side margins (20 mm = 56.69 pt on A4, 595.28 pt wide) and on the
// page: no table or label runs off. The tolerance of 1.5 pt allows for the
// font's ascent box (0.905 em in Liberation Sans) of the rotated axis
// titles, which reaches beyond the glyphs' ink.
func TestNothingRunsOffThePage(t *testing.T) {
	out, err := Render(fixtureInputFrom(t, 300, benchBrief(t)))
	if err != nil {
		t.Fatal(err)
	}
	html := runTool(t, out, "pdftotext", "-bbox")
	const left, right, height = 56.69 - 1.5, 595.28 - 56.69 + 1.5, 841.89
	n := 0
	for _, m := range wordBox.FindAllStringSubmatch(html, -1) {
		x0, _ := strconv.ParseFloat(m[1], 64)
		y0, _ := strconv.ParseFloat(m[2], 64)
		x1, _ := strconv.ParseFloat(m[3], 64)
		y1, _ := strconv.ParseFloat(m[4], 64)
		n++
		if x0 < left || x1 > right || y0 < 0 || y1 > height {
			t.Errorf("word %q at x %.1f–%.1f, y %.1f–%.1f lies outside the type area", m[5], x0, x1, y0, y1)
		}
	}
	if n < 2000 {
		t.Fatalf("only %d words read back; is pdftotext -bbox working?", n)
	}
}

// TestNoHeadingAtPageFoot checks, page by page, that the last line of
// text above the footer is never a heading of the pack.
func TestNoHeadingAtPageFoot(t *testing.T) {
	out, err := Render(fixtureInputFrom(t, 300, benchBrief(t)))
	if err != nil {
		t.Fatal(err)
	}
	text := runTool(t, out, "pdftotext", "-layout")
	heading := regexp.MustCompile(`^\s*(Section \d+|Part \d+\.\d+|About these figures|Coverage|How the figures are computed|What the figures do not show|Closing notes)\s*$`)
	for i, page := range strings.Split(text, "\f") {
		var lines []string
		for _, l := range strings.Split(page, "\n") {
			if strings.TrimSpace(l) != "" {
				lines = append(lines, l)
			}
		}
		if len(lines) < 3 {
			continue
		}
		last := lines[len(lines)-2] // the footer is the last line
		if heading.MatchString(last) {
			t.Errorf("page %d ends with the heading %q", i+1, strings.TrimSpace(last))
		}
	}
}
