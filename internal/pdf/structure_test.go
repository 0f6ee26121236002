package pdf

import (
	"regexp"
	"strconv"
	"testing"
	"time"

	"peerpack/internal/pdfcheck"
)

// structureDoc has a nested outline, internal and external links on two
// pages (one URL with parentheses and ">>" in it), and no compression so
// the objects can be read back.
func structureDoc(t *testing.T) []byte {
	t.Helper()
	d := New(Options{NoCompression: true, Lang: "en-US", Created: time.Unix(0, 0)})
	d.AddPage()
	target := d.NewLink()
	d.Bookmark("A", 0, 20)
	d.Bookmark("B", 1, 40)
	d.Bookmark("C", 1, 60)
	d.SetFont(Font{Family: Sans, Size: 10})
	d.Text(20, 30, "contents")
	d.LinkArea(20, 25, 40, 6, target)
	d.LinkURL(20, 35, 40, 6, "https://example.org/a(b)?c=>>d")
	d.AddPage()
	d.SetLink(target, 10, 0)
	d.Bookmark("D", 2, 20)
	d.Bookmark("E", 0, 80)
	d.LinkArea(20, 25, 40, 6, target)
	out, err := d.Bytes()
	if err != nil {
		t.Fatal(err)
	}
	return out
}

// ISO 32000-1:2008, 12.3.3, Tables 152-153 (from memory): an open item's
// /Count is its number of visible descendants, the outline dictionary's
// the number of visible items. For the tree A [B, C [D]], E with every
// item open: A 3, C 1, the rest none, the dictionary 5.
func TestOutlineCounts(t *testing.T) {
	out := structureDoc(t)
	if err := pdfcheck.Strict(out); err != nil {
		t.Errorf("%v", err)
	}
	runTool(t, out, "qpdf", "--check")
	want := map[string]int{"A": 3, "B": 0, "C": 1, "D": 0, "E": 0}
	// Titles are UTF-16BE with a byte-order mark: two bytes, then 0 and
	// the letter.
	re := regexp.MustCompile(`(?s)<</Title \(.{2}\x00([A-E])\).*?/Count (\d+)>>`)
	got := map[string]int{}
	for _, m := range re.FindAllSubmatch(out, -1) {
		got[string(m[1])], _ = strconv.Atoi(string(m[2]))
	}
	for k, v := range want {
		if c, ok := got[k]; !ok || c != v {
			t.Errorf("item %s: /Count %d (found %v), want %d", k, c, ok, v)
		}
	}
	if !regexp.MustCompile(`<</Type /Outlines /First \d+ 0 R\s*/Last \d+ 0 R /Count 5>>`).Match(out) {
		t.Errorf("the outline dictionary does not count 5 visible items")
	}
	if !regexp.MustCompile(`/Lang \(en-US\)`).Match(out) {
		t.Errorf("no /Lang (en-US) in the catalog")
	}
}

// ISO 32000-1:2008, 7.7.3.3, Table 30 (from memory): a page's /Annots is
// an array of indirect references: three links, two on page 1.
func TestAnnotationsAreIndirect(t *testing.T) {
	out := structureDoc(t)
	if regexp.MustCompile(`/Annots \[\s*<<`).Match(out) {
		t.Errorf("a direct annotation dictionary is left in /Annots")
	}
	refs := regexp.MustCompile(`/Annots \[((?:\d+ 0 R ?)+)\]`).FindAllSubmatch(out, -1)
	if len(refs) != 2 {
		t.Fatalf("want /Annots on 2 pages, found %d", len(refs))
	}
	if n := len(regexp.MustCompile(`\d+ 0 R`).FindAll(refs[0][1], -1)); n != 2 {
		t.Errorf("page 1 has %d annotation references, want 2", n)
	}
	if err := pdfcheck.Strict(out); err != nil {
		t.Errorf("%v", err)
	}
	if !regexp.MustCompile(`/URI \(https://example.org/a\\?\(b\\?\)\?c=>>d\)`).Match(out) {
		t.Errorf("the URL's dictionary was cut at a parenthesis or >>")
	}
}
