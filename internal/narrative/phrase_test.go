package narrative

import (
	"testing"

	"peerpack/internal/figures"
)

// How a group is named in running text when the brief gives no phrase
// (the rule in wording_en_groups.go; common practice, no source).
func TestDefaultGroupPhrase(t *testing.T) {
	cases := []struct{ name, want string }{
		{"Kestrian sector", "the Kestrian sector"},
		{"Chosen peers", "the chosen peers"},
		{"Profile peers", "the profile peers"},
		{"Home sector", "the home sector"},
		{"Nearest profile", "the nearest profile"},
		{"Research universities", "the research universities"},
		{"Kestria", "Kestria"},
		{"Our peers", "our peers"},
		{"All institutions", "all institutions"},
		{"The Kestrian sector", "the Kestrian sector"},
		{"FNCI leaders", "the FNCI leaders"},
		{"  Comparator   set ", "the comparator set"},
	}
	for _, c := range cases {
		if got := defaultGroupPhrase(c.name); got != c.want {
			t.Errorf("defaultGroupPhrase(%q) = %q, want %q", c.name, got, c.want)
		}
	}
	e := english{}
	if got := e.GroupPhrase(&figures.Group{Name: "Systems: Aldmere", Kind: "each", EachValue: "Aldmere"}); got != "Aldmere" {
		t.Errorf("each group without a phrase = %q, want the bare value", got)
	}
	if got := e.GroupPhrase(&figures.Group{Name: "Chosen peers", Phrase: "our chosen peers"}); got != "our chosen peers" {
		t.Errorf("a brief's phrase = %q, want it as written", got)
	}
}

// "among" for a set named by a plural noun, "in" for a sector, system or
// place (common practice, no source).
func TestGroupPreposition(t *testing.T) {
	cases := []struct{ phrase, want string }{
		{"the chosen peers", "among the chosen peers"},
		{"all institutions", "among all institutions"},
		{"our partner universities", "among our partner universities"},
		{"the Kestrian sector", "in the Kestrian sector"},
		{"the Aldmere system", "in the Aldmere system"},
		{"Aldmere", "in Aldmere"},
		{"Lusmaras", "in Lusmaras"},
		{"the comparison class", "in the comparison class"},
		{"the consortium", "in the consortium"},
	}
	for _, c := range cases {
		if got := (english{}).in(c.phrase); got != c.want {
			t.Errorf("in(%q) = %q, want %q", c.phrase, got, c.want)
		}
	}
}

// Brief phrases reach every sentence, an each group's phrase fills in its
// value, and a rank shared by three says how many share it.
func TestPhrasesAndJointRanksInSentences(t *testing.T) {
	got := edge(t, `
columns: [intl@2025]
institutions:
  F: [Kestria, Arlen University, 40]
  A: [Kestria, Bexmoor College, 40]
  B: [Kestria, Corrin Institute, 40]
  C: [Kestria, Dunmere University, 30]
  D: [Kestria, Elswick Polytechnic, 50]
  V1: [Veldra, Vantor University, 50]
  V2: [Veldra, Velle College, 44]
  V3: [Veldra, Varn Institute, 36]
groups:
  - {name: Partners, members: [F, A, B, C, D], phrase: our partner universities}
  - {name: Systems, each: country, where: {country: Veldra}, phrase: "the {value} system"}
block: {style: detail, topics: [position, competition], indicators: [intl]}
`)
	// Partners: sorted 30, 40, 40, 40, 50; rank 1 + 1 better = 2nd, shared
	// by three; percentile 100 x (1 + 3/2) / 5 = 50, so the third quarter
	// (a boundary goes to the less favourable side); median 40 and type-7
	// Q3 = x[4] of 1-based (1 + 4 x 0.75) = 40, so level and reached.
	// Veldra: 36, 44, 50 with 40 placed among them: 3rd of 4, percentile
	// 100 x 1.5 / 4 = 37.5, third quarter, so neither quarter is named;
	// its median 44 is ahead of 40.
	want := "International staff share: Arlen University stands joint 2nd of 5 with two others among our partner universities at 40.0% in 2025, in the third quarter. " +
		"That is level with both the group median and the upper quartile (40.0%).\n" +
		"Competitor systems: Set among the institutions of the Veldra system, Arlen University would sit in the middle half on every indicator here. " +
		"The median of the Veldra system is ahead on international staff share (44.0% against 40.0%).\n"
	if got != want {
		t.Fatalf("got\n%s\nwant\n%s", got, want)
	}
}
