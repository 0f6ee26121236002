package narrative

import (
	"testing"

	"peerpack/internal/brief"
)

// The association topic, on a group of twelve: international staff
// 10, 12, ..., 32 and students per academic 30, 29, ..., 19 in the same
// order, so the ranks are exactly reversed and Spearman's rho is -1
// (worked by hand; any rank correlation of a reversed order is -1).
// Student headcount is reported by four members only, under
// figures.MinCorrelationPairs (10, common practice, no source), so its
// pairs are not read (intl and spa are exactly linear, 10 + 2k against
// 30 - k, so rho and r are both -1, worked by hand). The block asks for the
// association topic, so the figures model computes its correlations; the
// scope is set to that topic alone here.
func TestAssociationNeedsEnoughPairs(t *testing.T) {
	s := parseSituation(t, edgeIndicators+`
columns: [intl@2025, spa@2025, size@2025]
institutions:
  F: [Kestria, Arlen University, 10, 30, 1000]
  A: [Kestria, Bexmoor College, 12, 29, 2000]
  B: [Kestria, Corrin Institute, 14, 28, 3000]
  C: [Kestria, Dunmere University, 16, 27, 4000]
  D: [Kestria, Elswick Polytechnic, 18, 26, ~]
  E: [Kestria, Fennick University, 20, 25, ~]
  G: [Kestria, Garrow College, 22, 24, ~]
  H: [Kestria, Harlow Institute, 24, 23, ~]
  I: [Kestria, Ilsworth University, 26, 22, ~]
  J: [Kestria, Jorvale College, 28, 21, ~]
  K: [Kestria, Kelmer Institute, 30, 20, ~]
  L: [Kestria, Lorn University, 32, 19, ~]
groups:
  - {name: Kestria sector, where: {country: Kestria}}
block: {style: detail, topics: [association], indicators: [intl, spa, size]}
`)
	m, b := s.build(t)
	var cb *brief.CommentaryBlock
	for _, blk := range b.Blocks {
		if x, ok := blk.(*brief.CommentaryBlock); ok {
			cb = x
		}
	}
	c := newComposer(m, b, english{})
	sc, err := c.scopeOf(cb, "block-01")
	if err != nil {
		t.Fatal(err)
	}
	sc.topics = map[string]bool{"association": true}
	ps := c.write(sc)
	want := "How indicators move together: " +
		"Across the 12 members of the Kestria sector reporting both in 2025, higher international staff share goes clearly with lower students per academic (Spearman's rank correlation −1.00; Pearson's r −1.00); that is an association, not evidence that one causes the other. " +
		"Only 4 members of the Kestria sector report both international staff share and student headcount in 2025, fewer than the 10 a rank correlation needs, so the pack does not say whether they move together. " +
		"Only 4 members of the Kestria sector report both students per academic and student headcount in 2025, fewer than the 10 a rank correlation needs, so the pack does not say whether they move together.\n"
	if got := render(ps); got != want {
		t.Fatalf("got\n%s\nwant\n%s", got, want)
	}
	com := &Commentary{Sentences: collect(ps), wording: english{}}
	if err := Verify(m, com); err != nil {
		t.Errorf("Verify: %v", err)
	}
}

// The three strengths of association (Cohen 1988: 0.3 medium, 0.5 large,
// from memory) read as written.
func TestAssociationWording(t *testing.T) {
	f := AssociationFact{Group: "the chosen peers", X: "papers per academic", Y: "field-normalised citation impact", N: "40", Year: "2025", Rho: "0.42", Strength: Level}
	cases := []struct {
		strength int
		negative bool
		rho      string
		want     string
	}{
		{Level, false, "0.42", "Across the 40 members of the chosen peers reporting both in 2025, higher papers per academic goes loosely with higher field-normalised citation impact (Spearman's rank correlation 0.42); that is an association, not evidence that one causes the other."},
		{Below, false, "0.12", "Across the 40 members of the chosen peers reporting both in 2025, papers per academic and field-normalised citation impact show little association (Spearman's rank correlation 0.12)."},
	}
	for _, c := range cases {
		f.Strength, f.Negative, f.Rho = c.strength, c.negative, c.rho
		if got := (english{}).Association(f); got != c.want {
			t.Errorf("got\n%s\nwant\n%s", got, c.want)
		}
	}
}
