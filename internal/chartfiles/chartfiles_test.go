package chartfiles_test

import (
	"bytes"
	"context"
	"encoding/xml"
	"fmt"
	"image/png"
	"io"
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"peerpack/internal/build"
	"peerpack/internal/chartfiles"
	"peerpack/internal/demo"
	"peerpack/internal/layout"
)

func demoFigures(t *testing.T) ([]layout.Figure, []byte) {
	t.Helper()
	in, err := build.Load(build.Source{FS: demo.FS(), Brief: demo.BriefName, Display: demo.BriefName}, nil)
	if err != nil {
		t.Fatal(err)
	}
	p, err := build.Pack(in, time.Unix(0, 0).UTC(), "test")
	if err != nil {
		t.Fatal(err)
	}
	if len(p.Figures) < 3 {
		t.Fatalf("the demo pack has %d charts; expected several", len(p.Figures))
	}
	return p.Figures, p.PDF
}

// Every chart of the demo is written as an SVG that an XML parser reads
// whole (Extensible Markup Language 1.0, W3C; Go's encoding/xml) with
// the figure's size in points on its root, and as a PNG whose pixel size
// is the figure's size at 300 dpi (millimetres / 25.4 x 300, rounded:
// 25.4 mm to the inch by definition). Each figure number is one the PDF
// captions as "Figure N." (pdftotext, poppler-utils).
func TestDemoChartsAsSVGAndPNG(t *testing.T) {
	figs, pdf := demoFigures(t)
	dir := t.TempDir()
	paths, err := chartfiles.Write(context.Background(), dir, figs)
	if err != nil {
		t.Fatal(err)
	}
	if len(paths) != 2*len(figs) {
		t.Fatalf("%d files for %d figures", len(paths), len(figs))
	}
	for _, f := range figs {
		base := filepath.Join(dir, chartfiles.Name(f))
		svg, err := os.ReadFile(base + ".svg")
		if err != nil {
			t.Fatal(err)
		}
		dec := xml.NewDecoder(bytes.NewReader(svg))
		var root *xml.StartElement
		for {
			tok, err := dec.Token()
			if err == io.EOF {
				break
			}
			if err != nil {
				t.Fatalf("%s.svg is not well-formed XML: %v", base, err)
			}
			if se, ok := tok.(xml.StartElement); ok && root == nil {
				se := se.Copy()
				root = &se
			}
		}
		if root == nil || root.Name.Local != "svg" || root.Name.Space != "http://www.w3.org/2000/svg" {
			t.Fatalf("%s.svg: root element %v, want svg in the SVG namespace", base, root)
		}
		wantW := f.Width * 72 / 25.4
		for _, a := range root.Attr {
			if a.Name.Local == "width" {
				got, err := strconv.ParseFloat(strings.TrimSuffix(a.Value, "pt"), 64)
				if err != nil || math.Abs(got-wantW) > 0.01 {
					t.Errorf("%s.svg: width %q, want %.2fpt", base, a.Value, wantW)
				}
			}
		}
		if !bytes.Contains(svg, []byte("<text")) {
			t.Errorf("%s.svg has no text elements; labels should stay selectable text", base)
		}
		fp, err := os.Open(base + ".png")
		if err != nil {
			t.Fatal(err)
		}
		cfg, err := png.DecodeConfig(fp)
		fp.Close()
		if err != nil {
			t.Fatalf("%s.png: %v", base, err)
		}
		wantPW, wantPH := int(math.Round(f.Width/25.4*300)), int(math.Round(f.Height/25.4*300))
		if abs(cfg.Width-wantPW) > 1 || abs(cfg.Height-wantPH) > 1 {
			t.Errorf("%s.png is %d x %d px, want %d x %d (300 dpi)", base, cfg.Width, cfg.Height, wantPW, wantPH)
		}
	}
	if _, err := exec.LookPath("pdftotext"); err != nil {
		t.Skip("pdftotext not installed (Debian: poppler-utils)")
	}
	pdfPath := filepath.Join(dir, "demo.pdf")
	os.WriteFile(pdfPath, pdf, 0o644)
	txt, err := exec.Command("pdftotext", pdfPath, "-").Output()
	if err != nil {
		t.Fatal(err)
	}
	for _, f := range figs {
		if !bytes.Contains(txt, []byte(fmt.Sprintf("Figure %d.", f.Number))) {
			t.Errorf("figure %d (%s) has no caption in the PDF", f.Number, f.Title)
		}
	}
}

// File names: figure number padded to two digits, then the title in
// lower-case words joined by hyphens, at most 60 bytes, cut between
// characters (common practice, no source).
func TestName(t *testing.T) {
	for _, c := range []struct {
		f    layout.Figure
		want string
	}{
		{layout.Figure{Number: 3, Title: "Research income / academic (PPP$)"}, "figure-03-research-income-academic-ppp"},
		{layout.Figure{Number: 12, Title: "Études à Saint-Éluard"}, "figure-12-études-à-saint-éluard"},
		{layout.Figure{Number: 1, Title: "  "}, "figure-01"},
		{layout.Figure{Number: 2, Title: strings.Repeat("Ørsted ", 20)}, "figure-02-" + strings.Repeat("ørsted-", 7) + "ørs"},
	} {
		got := chartfiles.Name(c.f)
		if got != c.want {
			t.Errorf("Name(%q) = %q, want %q", c.f.Title, got, c.want)
		}
		if len(got) > len("figure-00-")+60 {
			t.Errorf("Name(%q) is %d bytes", c.f.Title, len(got))
		}
	}
}

func abs(n int) int {
	if n < 0 {
		return -n
	}
	return n
}
