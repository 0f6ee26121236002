package layout

import (
	"strings"
	"testing"
)

// A written caption that states a count the block does not show is named
// by check, at the block's line (a pack review saw "the fifteen highest"
// over fourteen bars and the focus, and "the four indicators" over two).
// Counts read: number words and digits before a noun, common practice,
// no source.
func TestCaptionWarnings(t *testing.T) {
	body := "# C\n\n```chart\nkind: box\nindicators: [fnci, intl_staff]\ncaption: The four indicators against the region.\n```\n\n" +
		"```chart\nkind: box\nindicators: [fnci, intl_staff]\ncaption: Two indicators against the region.\n```\n\n" +
		"```table\nkind: position\nindicators: [fnci]\ngroups: [Valmoria, Northern region]\ncaption: Standing in six systems.\n```\n"
	in := fixtureInputFrom(t, 60, fixtureBody(t, body))
	ws := CaptionWarnings(in.Brief, in.Model)
	if len(ws) != 2 {
		t.Fatalf("warnings %q; want two (four indicators over two, six systems over the two countries of Valmoria and the northern region)", ws)
	}
	if !strings.Contains(ws[0], `"four indicators"`) || !strings.Contains(ws[0], "shows 2 indicators") {
		t.Errorf("first warning %q", ws[0])
	}
	if !strings.Contains(ws[1], `"six systems"`) || !strings.Contains(ws[1], "systems (countries)") {
		t.Errorf("second warning %q", ws[1])
	}
	if !strings.HasPrefix(ws[0], "brief.md:") {
		t.Errorf("warning not positioned: %q", ws[0])
	}
}

func TestStatedCounts(t *testing.T) {
	for _, c := range []struct {
		in   string
		n    int
		noun string
	}{
		{"The fifteen highest in the sector.", 15, "highest"},
		{"Medians of six competitor systems, 2025.", 6, "system"},
		{"Papers per academic for 12 institutions", 12, "institution"},
		{"Five countries", 5, "country"},
	} {
		got := statedCounts(c.in)
		if len(got) != 1 || got[0].n != c.n || got[0].noun != c.noun {
			t.Errorf("%q: %+v, want %d %s", c.in, got, c.n, c.noun)
		}
	}
	for _, s := range []string{"In 2025, the sector grew.", "Papers with authors in two or more countries", "at least three indicators"} {
		if got := statedCounts(s); len(got) != 0 {
			t.Errorf("%q read as a count: %+v", s, got)
		}
	}
}
