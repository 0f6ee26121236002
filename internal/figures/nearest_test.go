package figures

import (
	"strings"
	"testing"

	"peerpack/internal/dataset"
)

// A nearest-profile group whose focus lacks one of the indicators is built
// on the others, and its definition says which was left out, so a batch
// over a whole sector does not stop at the first focus with a gap.
func TestNearestLeavesOutWhatTheFocusLacks(t *testing.T) {
	d, _ := loadFixture(t)
	b := briefWith(t, "focus: OR03\nyear: 2025\ngroups:\n  - name: Like us\n    nearest: {count: 3, indicators: [fnci, intl_share]}\n", "")
	m, err := Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	g, ok := m.Group("Like us")
	if !ok || len(g.Members) == 0 {
		t.Fatalf("no group built: %+v", g)
	}
	// The definition is read in the pack: the focus's name and the
	// indicators' labels (lowered as in running text), never ids or keys.
	want := "the 3 institutions nearest Tessaly College on international students in 2025 (standardised Euclidean distance); field-normalised citation impact left out because Tessaly College reports no value of it in 2025"
	if !strings.HasPrefix(g.Defined, want) {
		t.Errorf("definition\n%q\nwant it to open\n%q", g.Defined, want)
	}
}

// Every indicator of the profile is named by its label in running text,
// joined as a list ("a, b and c"), and an abbreviation keeps its capitals.
func TestNearestDefinitionUsesLabels(t *testing.T) {
	cases := []struct {
		label, key, want string
	}{
		{"Field-normalised citation impact", "fnci", "field-normalised citation impact"},
		{"FNCI", "fnci", "FNCI"},
		{"PhD share", "phd", "PhD share"},
		{"A-level entrants", "alevel", "A-level entrants"},
		{"", "raw_key", "raw_key"},
	}
	for _, c := range cases {
		if got := runningLabel(dataset.Indicator{Key: c.key, Label: c.label}); got != c.want {
			t.Errorf("runningLabel(%q) = %q, want %q", c.label, got, c.want)
		}
	}
	if got := listText([]string{"a", "b", "c"}); got != "a, b and c" {
		t.Errorf("listText = %q", got)
	}
	d, _ := loadFixture(t)
	b := briefWith(t, "focus: KE02\nyear: 2025\ngroups:\n  - name: Like us\n    nearest: {count: 4, indicators: [fnci, students_per_academic]}\n", "")
	m, err := Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	g, _ := m.Group("Like us")
	want := "the 4 institutions nearest University of Valmora on field-normalised citation impact and students per academic in 2025 (standardised Euclidean distance)"
	if g == nil || g.Defined != want {
		t.Errorf("definition %q, want %q", g.Defined, want)
	}
}
