package layout

import (
	"fmt"
	"regexp"
	"strings"
	"testing"
)

// pdfPages counts the page objects of a PDF (fpdf writes "/Type /Page"
// once per page and "/Type /Pages" once for the tree).
func pdfPages(pdf []byte) int {
	return len(regexp.MustCompile(`/Type /Page[^s]`).FindAll(pdf, -1))
}

// A section whose last page would hold only a few lines is set a little
// tighter (its trend and scatter charts shorter) so that the lines move
// back and the page is saved; tightening never costs a page. The body
// grows a paragraph at a time until the section first spills onto a runt
// page, which must then be pulled back.
func TestRuntPageIsPulledBack(t *testing.T) {
	para := "Impact and international staff moved together over the span in most of the national sector, with a few exceptions in the north.\n\n"
	saved := false
	for n := 1; n <= 40 && !saved; n++ {
		body := "# Trends\n\n```chart\nkind: trend\nindicators: [fnci, intl_staff]\ngroups: [Valmoria]\ncaption: Trends.\n```\n\n" +
			"```chart\nkind: scatter\nindicators: [fnci, intl_staff]\ngroups: [Northern region]\ncaption: Impact and staff.\n```\n\n" +
			strings.Repeat(para, n) + "# Next\n\nThe next section opens a page.\n"
		in := fixtureInputFrom(t, 120, fixtureBody(t, body))
		loose, err := pass(in, nil, nil)
		if err != nil {
			t.Fatal(err)
		}
		out, err := Render(in)
		if err != nil {
			t.Fatalf("%d paragraphs: %v", n, err)
		}
		got, was := pdfPages(out), loose.doc.PageNo()
		if got > was {
			t.Fatalf("%d paragraphs: tightening cost a page (%d, loose %d)", n, got, was)
		}
		// Section 1 is "Trends" (the contents is section 0).
		if plan := loose.runtPlan(); plan == nil || plan.chartScale(1) == 1 {
			continue
		}
		// The closing section may also move up onto the short "Next"
		// page (TestRuntWithNothingToTightenTakesTheNextSection), so
		// the pack can be shorter still.
		if got >= was {
			t.Fatalf("%d paragraphs: the runt page stayed (%d pages, loose %d)", n, got, was)
		}
		saved = true
		text := runTool(t, out, "pdftotext", "-layout")
		if !strings.Contains(text, fmt.Sprintf("Page %d of %d", got, got)) {
			t.Errorf("footer total does not match the %d pages", got)
		}
	}
	if !saved {
		t.Fatal("no paragraph count made the section end on a runt page; the test no longer exercises the rule")
	}
}

// A section of plain text that spills a few lines onto a page has nothing
// a typesetter could tighten; the next section then opens on that page,
// below a gap, instead of leaving it nearly empty. No page of the pack but
// the cover, the contents and the last is under a third full.
func TestRuntWithNothingToTightenTakesTheNextSection(t *testing.T) {
	para := "Each institution reports its own staff and student numbers, checked against the national return where one exists, and the office compares them with the previous year before they are used.\n\n"
	joined := false
	for n := 8; n <= 60 && !joined; n++ {
		body := "# Sources\n\n" + strings.Repeat(para, n) + "# Next\n\nThe next section.\n\n# Last\n\n" + strings.Repeat(para, 12)
		in := fixtureInputFrom(t, 120, fixtureBody(t, body))
		loose, err := pass(in, nil, nil)
		if err != nil {
			t.Fatal(err)
		}
		ends := loose.runtEnds()
		if len(ends) == 0 {
			continue
		}
		out, err := Render(in)
		if err != nil {
			t.Fatalf("%d paragraphs: %v", n, err)
		}
		if got, was := pdfPages(out), loose.doc.PageNo(); got >= was {
			t.Fatalf("%d paragraphs: the runt page stayed (%d pages, loose %d)", n, got, was)
		}
		text := runTool(t, out, "pdftotext", "-layout")
		pages := strings.Split(text, "\f")
		for _, pg := range pages {
			if strings.Contains(pg, "Next") && strings.Contains(pg, "The next section.") && strings.Contains(pg, "checked against the national return") {
				joined = true
			}
		}
		if !joined {
			t.Fatalf("%d paragraphs: the next section did not open on the runt page", n)
		}
	}
	if !joined {
		t.Fatal("no paragraph count made the section end on a runt page; the test no longer exercises the rule")
	}
}
