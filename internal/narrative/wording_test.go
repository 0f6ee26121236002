package narrative

import (
	"path/filepath"
	"strings"
	"testing"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
)

// The change wording says "a twentieth of the group's interquartile
// range"; it must stay in step with the rule.
func TestNoiseWordsMatchTheRule(t *testing.T) {
	if NoiseIQRShare != 1.0/20 {
		t.Fatalf("NoiseIQRShare is %v but the wording says a twentieth", NoiseIQRShare)
	}
}

// American English: no British spelling is left in any sentence of the
// review set written in en-US, and British English keeps its own.
func TestSpellingByLanguage(t *testing.T) {
	files, _ := filepath.Glob("../../testdata/narrative/review/*.yaml")
	british := []string{"judgement", "favourable", "unfavourable", "analysed"}
	american := []string{"judgment", "favorable", "unfavorable", "analyzed"}
	for _, f := range files {
		for _, lang := range []string{"en-GB", "en-US"} {
			s := loadSituation(t, f)
			s.Language = lang
			c, _, _ := s.compose(t)
			for _, sen := range c.Sentences {
				words := british
				if lang == "en-GB" {
					words = american
				}
				for _, w := range words {
					if strings.Contains(sen.Text, w) {
						t.Errorf("%s in %s: %q contains %q", filepath.Base(f), lang, sen.Text, w)
					}
				}
			}
		}
	}
}

func TestListAndOrdinalsAndPlurals(t *testing.T) {
	gb, us := english{}, english{us: true}
	if got := gb.List([]string{"a", "b", "c"}); got != "a, b and c" {
		t.Errorf("en-GB list = %q", got)
	}
	if got := us.List([]string{"a", "b", "c"}); got != "a, b, and c" {
		t.Errorf("en-US list = %q", got)
	}
	if got := gb.List([]string{"a", "b"}); got != "a and b" {
		t.Errorf("two items = %q", got)
	}
	// Ordinals come from package format; these are the forms the
	// sentences rely on (English ordinal suffixes, from memory).
	for p, want := range map[float64]string{1: "1st", 2: "2nd", 3: "3rd", 11: "11th", 12.4: "12th", 13: "13th", 21: "21st", 22: "22nd", 62.5: "63rd", 99.6: "100th"} {
		if got := printOrdinalPct(p); got != want {
			t.Errorf("ordinal of %v = %q, want %q", p, got, want)
		}
	}
	if pluralMembers("1") != "member" || pluralMembers("2") != "members" || pluralMembers("1,001") != "members" {
		t.Error("member plural")
	}
	for label, want := range map[string]string{"International staff share": "international staff share", "FNCI": "FNCI", "PhD share": "PhD share", "A-level entry": "A-level entry", "Students (FTE)": "students (FTE)"} {
		if got := gb.Indicator(dataset.Indicator{Label: label}); got != want {
			t.Errorf("Indicator(%q) = %q, want %q", label, got, want)
		}
	}
	if possessive("Arlen University") != "Arlen University's" || possessive("Veldra Institutes") != "Veldra Institutes'" {
		t.Error("possessive")
	}
}

// A block naming an indicator, a group or years the model does not have
// fails with the block's position and a suggestion.
func TestBlockErrorsArePositioned(t *testing.T) {
	s := parseSituation(t, traceSituation)
	m, b := s.build(t)
	bad := &brief.CommentaryBlock{Style: "detail", Indicators: []string{"intll"}, Groups: []string{"Kestria sectr"}, Years: &brief.Span{First: 2019, Last: 2025}}
	bad.At = brief.Pos{Line: 42, Column: 1}
	b.Blocks = append(b.Blocks, bad)
	_, err := Compose(m, b)
	if err == nil {
		t.Fatal("Compose accepted a block with unknown names")
	}
	for _, want := range []string{"brief.md:42:1:", `indicator "intll"`, `did you mean "intl"?`, `group "Kestria sectr"`, `did you mean "Kestria sector"?`, "commentary years [2019, 2025]"} {
		if !strings.Contains(err.Error(), want) {
			t.Errorf("error %q lacks %q", err, want)
		}
	}
}

func TestComposeWithoutModel(t *testing.T) {
	if _, err := Compose(nil, &brief.Brief{}); err == nil {
		t.Fatal("Compose(nil) did not fail")
	}
	if err := Verify(nil, nil); err == nil {
		t.Fatal("Verify(nil) did not fail")
	}
}
