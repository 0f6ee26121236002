package layout

import (
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
	"peerpack/internal/narrative"
	"peerpack/templates"
)

// shippedPacks lays out the packs users see first: the demo and every
// template over the demo scenario, through the same stages as a build.
func shippedPacks(t *testing.T) map[string][]byte {
	t.Helper()
	sets := map[string]map[string][]byte{"demo": demo.Files()}
	for _, name := range templates.Names() {
		files, err := templates.Files(name)
		if err != nil {
			t.Fatal(err)
		}
		sets[name] = files
	}
	out := map[string][]byte{}
	for name, files := range sets {
		fsys := fstest.MapFS{}
		for k, v := range files {
			fsys[k] = &fstest.MapFile{Data: v}
		}
		b, err := brief.Parse(demo.BriefName, files[demo.BriefName])
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		d, _, err := dataset.Load(fsys, b)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		m, err := figures.Compute(d, b)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		com, err := narrative.Compose(m, b)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		pdf, err := Render(Input{Brief: b, Model: m, Commentary: com, FS: fsys, Created: time.Date(2026, 3, 1, 9, 0, 0, 0, time.UTC), Version: "test"})
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		out[name] = pdf
	}
	return out
}

// briefHeadings are the titles of a brief's Markdown headings (ATX style,
// outside fenced blocks), level 1 first among equals.
func briefHeadings(src []byte) (all []string, level1 []string) {
	fence := false
	for _, l := range strings.Split(string(src), "\n") {
		if strings.HasPrefix(l, "```") {
			fence = !fence
			continue
		}
		if fence {
			continue
		}
		if m := regexp.MustCompile(`^(#{1,6}) +(.+?)\s*$`).FindStringSubmatch(l); m != nil {
			all = append(all, m[2])
			if len(m[1]) == 1 {
				level1 = append(level1, m[2])
			}
		}
	}
	return all, level1
}

// pageLines are a page's non-empty lines, trimmed.
func pageLines(page string) []string {
	var out []string
	for _, l := range strings.Split(page, "\n") {
		if s := strings.TrimSpace(l); s != "" {
			out = append(out, s)
		}
	}
	return out
}

// TestShippedPacksReadWell checks, in every shipped pack, the rules a
// reader of a printed pack notices (common practice, no source): no
// heading is left as the last line of a page; the executive summary fills
// exactly the page after the contents; nothing runs into the margins
// (20 mm on A4 = 56.69 pt, 1.5 pt for the ascent box of rotated axis
// titles); and the closing repeats none of the cautions the brief's own
// section makes.
func TestShippedPacksReadWell(t *testing.T) {
	if testing.Short() {
		t.Skip("lays out four packs")
	}
	packs := shippedPacks(t)
	for name, pdf := range packs {
		t.Run(name, func(t *testing.T) {
			files := demo.Files()
			if name != "demo" {
				files, _ = templates.Files(name)
			}
			b, err := brief.Parse(demo.BriefName, files[demo.BriefName])
			if err != nil {
				t.Fatal(err)
			}
			all, level1 := briefHeadings(b.Body)
			all = append(all, "About these figures", "Coverage", "How the figures are computed", "What the figures do not show", "Notes")
			heads := map[string]bool{}
			for _, h := range all {
				heads[h] = true
			}
			text := runTool(t, pdf, "pdftotext", "-layout")
			pages := strings.Split(strings.TrimRight(text, "\f"), "\f")
			first := map[string]int{} // page (1-based) each heading first opens
			for i, p := range pages {
				lines := pageLines(p)
				if len(lines) >= 3 && heads[lines[len(lines)-2]] {
					t.Errorf("page %d ends with the heading %q", i+1, lines[len(lines)-2])
				}
				for k, l := range lines {
					if k > 0 && heads[l] && first[l] == 0 && !strings.Contains(p, "Contents") {
						first[l] = i + 1
					}
				}
			}
			if len(level1) < 2 {
				t.Fatalf("brief has %d level-1 headings", len(level1))
			}
			sum, next := first[level1[0]], first[level1[1]]
			if sum != 3 || next != sum+1 {
				t.Errorf("summary %q on page %d and %q on page %d: want the summary alone on page 3, after the contents", level1[0], sum, level1[1], next)
			}

			html := runTool(t, pdf, "pdftotext", "-bbox")
			const left, right = 56.69 - 1.5, 595.28 - 56.69 + 1.5
			for _, m := range wordBox.FindAllStringSubmatch(html, -1) {
				x0, _ := strconv.ParseFloat(m[1], 64)
				x1, _ := strconv.ParseFloat(m[3], 64)
				if x0 < left || x1 > right {
					t.Errorf("word %q at x %.1f–%.1f runs into the margin", m[5], x0, x1)
				}
			}

			// No runt page: every page but the cover, the contents and the
			// last holds at least a third of the type area (the share fit.go
			// works to; common practice, no source). The type area is read
			// between the running header and footer.
			for i, pg := range pageBoxes.FindAllStringSubmatch(html, -1) {
				n := i + 1
				if n <= 2 || n == len(pages) {
					continue
				}
				h, _ := strconv.ParseFloat(pg[1], 64)
				top, bottom := 0.085*h, 0.91*h
				low := top
				for _, m := range wordBox.FindAllStringSubmatch(pg[2], -1) {
					y0, _ := strconv.ParseFloat(m[2], 64)
					y1, _ := strconv.ParseFloat(m[4], 64)
					if y0 > top && y1 < bottom && y1 > low {
						low = y1
					}
				}
				if fill := (low - top) / (bottom - top); fill < runtShare {
					t.Errorf("page %d is a runt: %.0f %% of the type area used", n, 100*fill)
				}
			}

			flat := strings.Join(strings.Fields(text), " ")
			for _, lead := range []string{"Only what is measured.", "Choices are judgements.", "Uncertainty. Small differences between institutions"} {
				if strings.Contains(flat, lead) {
					t.Errorf("the closing repeats %q, which the brief's own cautions make", lead)
				}
			}
		})
	}
}
