package layout

import (
	"math"
	"os"
	"path/filepath"
	"testing"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
)

// A position table's change column names the years its changes run over:
// the focus's first and last years with a value, not the brief's span.
// The fixture's focus VA001 is given no FNCI for 2025 and no
// international staff share for 2021, so (worked by hand) FNCI changes
// over 2021-2024, the staff share over 2022-2025, and the other two
// indicators over the span 2021-2025.
func TestChangeColumnGivesRealYears(t *testing.T) {
	src, err := os.ReadFile(filepath.Join(fixtureDir, "brief.md"))
	if err != nil {
		t.Fatal(err)
	}
	b, err := brief.Parse("brief.md", src)
	if err != nil {
		t.Fatal(err)
	}
	d := fixtureDataset(60)
	focus := d.Register.Index("VA001")
	fnci, staff := d.Dictionary.Index("fnci"), d.Dictionary.Index("intl_staff")
	d.Set(fnci, focus, 2025, math.NaN())
	d.Set(staff, focus, 2021, math.NaN())
	m, err := figures.Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	w := &writer{m: m, b: b}
	g, _ := m.Group("Valmoria")
	groups := []*figures.Group{g}
	all := d.Dictionary.Indicators
	one := func(key string) []dataset.Indicator {
		ind, _ := d.Dictionary.Lookup(key)
		return []dataset.Indicator{ind}
	}
	cases := []struct {
		name        string
		inds        []dataset.Indicator
		first, last int
		mixed       bool
	}{
		// Two rows over 2021-2025, one each over other years: the heading
		// takes the pair most rows share.
		{"all", all, 2021, 2025, true},
		// A table of FNCI alone is headed by FNCI's own years.
		{"fnci", one("fnci"), 2021, 2024, false},
		{"staff", one("intl_staff"), 2022, 2025, false},
		// A tie between two pairs goes to the earliest start.
		{"both", append(one("fnci"), one("intl_staff")...), 2021, 2024, true},
	}
	for _, c := range cases {
		cy := w.changeYears(groups, c.inds)
		if cy.first != c.first || cy.last != c.last || cy.mixed != c.mixed {
			t.Errorf("%s: heading years %d-%d (mixed %v), want %d-%d (mixed %v)", c.name, cy.first, cy.last, cy.mixed, c.first, c.last, c.mixed)
		}
	}
	cy := w.changeYears(groups, all)
	for key, want := range map[string]string{"fnci": " (to 2024)", "intl_staff": " (from 2022)", "income": ""} {
		tr, _ := m.Trend("Valmoria", key, focus)
		if got := cy.otherYears(tr); got != want {
			t.Errorf("%s cell suffix %q, want %q", key, got, want)
		}
	}
	if got := (changeSpan{first: 2021, last: 2025}).otherYears(&figures.Trend{StartYear: 2022, EndYear: 2024}); got != " (2022\u20132024)" {
		t.Errorf("both ends differ: %q", got)
	}
}
