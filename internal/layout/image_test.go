package layout

import (
	"bytes"
	"image"
	"image/color"
	"image/png"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"testing/fstest"
)

func testPNG(t *testing.T, w, h int) []byte {
	img := image.NewNRGBA(image.Rect(0, 0, w, h))
	for y := 0; y < h; y++ {
		for x := 0; x < w; x++ {
			img.Set(x, y, color.NRGBA{R: uint8(x * 4), G: 80, B: uint8(y * 8), A: 255})
		}
	}
	var b bytes.Buffer
	if err := png.Encode(&b, img); err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

// A logo and a Markdown image are embedded (pdfimages lists them, from
// poppler-utils); raw HTML in the brief is never printed.
func TestImagesAndRawHTML(t *testing.T) {
	src, err := os.ReadFile(filepath.Join(fixtureDir, "brief.md"))
	if err != nil {
		t.Fatal(err)
	}
	src = bytes.Replace(src, []byte("organisation: Université de Saint-Éluard"), []byte("organisation: Université de Saint-Éluard\n  logo: art/logo.png"), 1)
	src = bytes.Replace(src, []byte("## Position in detail"), []byte("![The planning office's seal](art/logo.png)\n\n<script>alert('never shown')</script>\n\nText <b>with inline html</b> here.\n\n## Position in detail"), 1)
	in := fixtureInputFrom(t, 60, src)
	in.FS = fstest.MapFS{"art/logo.png": {Data: testPNG(t, 64, 32)}}
	out, err := Render(in)
	if err != nil {
		t.Fatal(err)
	}
	if dir := os.Getenv("PEERPACK_SAMPLE_DIR"); dir != "" {
		if err := os.WriteFile(filepath.Join(dir, "layout-images.pdf"), out, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	list := runTool(t, out, "pdfimages", "-list")
	if n := len(regexp.MustCompile(`(?m)^\s+\d+\s+\d+\s+image\s+64\s+32`).FindAllString(list, -1)); n != 2 {
		t.Errorf("want the logo drawn twice (cover, body), pdfimages lists %d:\n%s", n, list)
	}
	text := runTool(t, out, "pdftotext", "-layout")
	if strings.Contains(text, "alert") || strings.Contains(text, "<b>") {
		t.Error("raw HTML reached the PDF")
	}
	if !strings.Contains(text, "The planning office's seal") || !strings.Contains(text, "with inline html") {
		t.Error("image caption or the text around inline HTML is missing")
	}
}

func TestIgnoredHTMLPositions(t *testing.T) {
	src, err := os.ReadFile(filepath.Join(fixtureDir, "brief.md"))
	if err != nil {
		t.Fatal(err)
	}
	src = bytes.Replace(src, []byte("Literal braces stay"), []byte("<b>x</b> Literal braces stay"), 1)
	src = bytes.Replace(src, []byte("## Peers"), []byte("<div>\nblock\n</div>\n\n## Peers"), 1)
	in := fixtureInputFrom(t, 60, src)
	got := IgnoredHTML(in.Brief)
	// Positions counted in brief.md (grep -n): "Literal braces stay" opens
	// line 37, so <b> is at 37:1 and </b> at 37:5; the block <div> opens
	// where "## Peers" was, line 88.
	want := []string{"37:1", "37:5", "88:1"}
	if len(got) != len(want) {
		t.Fatalf("got %v, want %v", got, want)
	}
	for i := range want {
		if got[i].String() != want[i] {
			t.Errorf("HTML %d at %v, want %s", i, got[i], want[i])
		}
	}
}
