package templates

import (
	"bytes"
	"context"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"testing/fstest"
	"time"

	"peerpack/internal/build"
	"peerpack/internal/demo"
	"peerpack/internal/layout"
)

// pageObject matches a page object of the PDF (not the /Pages tree).
var pageObject = regexp.MustCompile(`/Type\s*/Page[^s]`)

// pageBounds are the page counts each template should build to with the
// demo data, cover and closing notes included.
var pageBounds = map[string][2]int{
	"governing-body":      {8, 12},
	"country-competition": {8, 18},
	"client-report":       {10, 22},
}

// TestEveryTemplateBuilds runs the whole pipeline on what `peerpack new`
// writes for each template: the template must build a PDF from the demo
// data with no edits at all.
func TestEveryTemplateBuilds(t *testing.T) {
	if testing.Short() {
		t.Skip("builds three packs")
	}
	for _, name := range Names() {
		t.Run(name, func(t *testing.T) {
			files, err := Files(name)
			if err != nil {
				t.Fatal(err)
			}
			fsys := fstest.MapFS{}
			for n, b := range files {
				fsys[n] = &fstest.MapFile{Data: b}
			}
			src := build.Source{FS: fsys, Brief: demo.BriefName, Display: name + "/" + demo.BriefName}
			dir := t.TempDir()
			opt := build.Options{
				Output:  filepath.Join(dir, "pack.pdf"),
				Figures: filepath.Join(dir, "figures.csv"),
				Created: time.Date(2026, 3, 1, 0, 0, 0, 0, time.UTC),
				Version: "test",
			}
			res, err := build.Build(context.Background(), src, opt)
			if err != nil {
				t.Fatalf("building:\n%v", err)
			}
			pdf, _ := os.ReadFile(opt.Output)
			figs, _ := os.ReadFile(opt.Figures)
			if !bytes.HasPrefix(pdf, []byte("%PDF-")) || len(pdf) < 10000 {
				t.Errorf("not a PDF of any size: %d bytes", len(pdf))
			}
			if !bytes.Contains(figs, []byte(res.Inputs.Brief.Focus)) {
				t.Errorf("the figures file never mentions the focus %s", res.Inputs.Brief.Focus)
			}
			checkText(t, name, opt.Output)
			// No written caption states a count its block does not show.
			if ws := layout.CaptionWarnings(res.Inputs.Brief, res.Inputs.Figures); len(ws) > 0 {
				t.Errorf("captions disagree with their blocks:\n%s", strings.Join(ws, "\n"))
			}
			// A governing body gets 6-10 pages of content; the pack adds a
			// cover, the contents and the closing notes on the figures.
			pages := len(pageObject.FindAll(pdf, -1))
			if lo, hi := pageBounds[name][0], pageBounds[name][1]; pages < lo || pages > hi {
				t.Errorf("%d pages, want %d to %d", pages, lo, hi)
			}
		})
	}
}

// wantText are headings each template's pack must show.
var wantText = map[string][]string{
	"governing-body":      {"The answer in brief", "Overall position", "Strengths and risks", "What changed beyond noise", "Questions for the council", "Scale for context", "Who we compare with", "Appendix: method"},
	"country-competition": {"The six systems at a glance", "How the systems move", "Medians counted two ways", "Weighted by students", "Staff, students and partners from abroad", "Where we would stand in each system", "Who is compared in each system", "Share that pass", "Who is counted in each."},
	"client-report":       {"Summary for the rectorate", "Methodology", "Data appendix", "Brightmere Higher Education Advisory"},
}

// checkText reads the pack's text with pdftotext (poppler-utils) and
// checks that the sections are there and that no "edit:" note leaked
// from the template's comments into the pack.
func checkText(t *testing.T, name, pdfPath string) {
	t.Helper()
	tool, err := exec.LookPath("pdftotext")
	if err != nil {
		t.Log("pdftotext not installed; text checks skipped")
		return
	}
	out, err := exec.Command(tool, "-enc", "UTF-8", pdfPath, "-").Output()
	if err != nil {
		t.Fatalf("pdftotext: %v", err)
	}
	text := strings.Join(strings.Fields(string(out)), " ")
	for _, w := range wantText[name] {
		if !strings.Contains(text, w) {
			t.Errorf("the pack lacks %q", w)
		}
	}
	if strings.Contains(text, EditMarker) || strings.Contains(text, "<!--") {
		t.Errorf("a template comment leaked into the pack")
	}
}
