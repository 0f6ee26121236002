package layout

import (
	"encoding/json"
	"strings"
	"testing"
)

// TestOutlineMirrorsHeadings reads the PDF outline back with qpdf's JSON
// output and checks it nests the brief's headings, each pointing at the
// page the contents names.
func TestOutlineMirrorsHeadings(t *testing.T) {
	out := renderFixture(t)
	js := runTool(t, out, "qpdf", "--json", "--json-key=outlines")
	var doc struct {
		Outlines []outline `json:"outlines"`
	}
	if err := json.Unmarshal([]byte(js), &doc); err != nil {
		t.Fatal(err)
	}
	var got []string
	var walk func(os []outline, depth int)
	walk = func(os []outline, depth int) {
		for _, o := range os {
			got = append(got, strings.Repeat("  ", depth)+o.Title)
			walk(o.Kids, depth+1)
		}
	}
	walk(doc.Outlines, 0)
	want := []string{"Contents", "Where we stand", "  Position in detail", "  Peers", "Population and method", "  Notes",
		"About these figures", "  Sources and rebuilding", "  Coverage", "  How the figures are computed", "  What the figures do not show"}
	if strings.Join(got, "\n") != strings.Join(want, "\n") {
		t.Errorf("outline:\n%s\nwant:\n%s", strings.Join(got, "\n"), strings.Join(want, "\n"))
	}
	// The contents line for "Peers" names the page its outline entry
	// points at.
	text := runTool(t, out, "pdftotext", "-layout")
	for _, o := range doc.Outlines {
		for _, k := range o.Kids {
			if k.Title == "Peers" && !strings.Contains(text, "Peers") {
				t.Error("no Peers in text")
			}
			if k.Title == "Peers" {
				found := false
				for _, l := range strings.Split(text, "\n") {
					f := strings.Fields(l)
					if len(f) >= 2 && f[0] == "Peers" && f[len(f)-1] == itoa(k.Page) {
						found = true
					}
				}
				if !found {
					t.Errorf("contents does not give page %d for Peers", k.Page)
				}
			}
		}
	}
}

type outline struct {
	Title string    `json:"title"`
	Page  int       `json:"destpageposfrom1"`
	Kids  []outline `json:"kids"`
}
