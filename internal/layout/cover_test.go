package layout

import (
	"bytes"
	"strconv"
	"strings"
	"testing"
)

// withTitle replaces the fixture brief's title line.
func withTitle(t *testing.T, title string) []byte {
	t.Helper()
	src := fixtureBody(t, "# Body\n\nText.\n")
	old := []byte("title: International position of Université de Saint-Éluard")
	if !bytes.Contains(src, old) {
		t.Fatal("fixture title line not found")
	}
	return bytes.Replace(src, old, []byte("title: "+title), 1)
}

// A long title steps down in size rather than pushing the focus, years
// and date off the cover; one too long even at the smallest size is
// refused at the title's line with what to change (a pack review saw a
// 40-word title run off the cover).
func TestCoverTitleShrinksOrIsRefused(t *testing.T) {
	words := strings.Fields(strings.Repeat("International position of the university against its national and regional peers in research staff and students ", 4))
	long := strings.Join(words[:22], " ")
	out, err := Render(fixtureInputFrom(t, 60, withTitle(t, long)))
	if err != nil {
		t.Fatalf("a 22-word title: %v", err)
	}
	page1 := strings.Split(runTool(t, out, "pdftotext", "-layout"), "\f")[0]
	for _, want := range []string{"FOCUS INSTITUTION", "DATE"} {
		if !strings.Contains(page1, want) {
			t.Errorf("cover lost %q under a 22-word title", want)
		}
	}
	html := runTool(t, out, "pdftotext", "-f", "1", "-l", "1", "-bbox")
	for _, m := range wordBox.FindAllStringSubmatch(html, -1) {
		if y1, _ := strconv.ParseFloat(m[4], 64); y1 > 842 {
			t.Errorf("word %q below the page foot at %.0f pt", m[5], y1)
		}
	}

	tooLong := strings.Join(append(words, words...), " ")
	_, err = Render(fixtureInputFrom(t, 60, withTitle(t, tooLong)))
	if err == nil {
		t.Fatalf("a %d-word title was accepted", 2*len(words))
	}
	if !strings.Contains(err.Error(), "brief.md:2:") || !strings.Contains(err.Error(), "shorten it") {
		t.Errorf("message %q does not point at the title line and say what to do", err)
	}
}
