package narrative

import (
	"strings"
	"testing"

	"peerpack/internal/figures"
)

const traceSituation = edgeIndicators + `
years: [2021, 2025]
columns: [intl@2021, intl@2025, spa@2021, spa@2025]
institutions:
  F: [Kestria, Arlen University, 35, 42, 18.0, 14.2]
  A: [Kestria, Bexmoor College, 30, 31, 16, 16]
  B: [Kestria, Corrin Institute, 38, 39, 17, 17]
  C: [Kestria, Dunmere University, 40, 41, 15, 15.5]
  D: [Veldra, Elswick Polytechnic, 45, 46, 12, 12]
  E: [Veldra, Fennick University, 20, 22, 20, 21]
groups:
  - {name: Kestria sector, where: {country: Kestria}}
  - {name: Competitors, each: country}
block: {style: detail}
`

// Verify must catch a number that no cited figure gives.
func TestVerifyCatchesAWrongNumber(t *testing.T) {
	c, m, _ := parseSituation(t, traceSituation).compose(t)
	for i, s := range c.Sentences {
		if !strings.Contains(s.Text, "42.0%") {
			continue
		}
		c.Sentences[i].Text = strings.Replace(s.Text, "42.0%", "42.1%", 1)
		err := Verify(m, c)
		if err == nil || !strings.Contains(err.Error(), `prints "42.1"`) {
			t.Fatalf("Verify = %v, want it to name 42.1", err)
		}
		return
	}
	t.Fatal("no sentence prints 42.0%")
}

// Verify must catch a number printed with other rounding than the
// indicator's declared decimals.
func TestVerifyCatchesOtherRounding(t *testing.T) {
	c, m, _ := parseSituation(t, traceSituation).compose(t)
	for i, s := range c.Sentences {
		if strings.Contains(s.Text, "42.0%") {
			c.Sentences[i].Text = strings.Replace(s.Text, "42.0%", "42%", 1)
			if err := Verify(m, c); err == nil || !strings.Contains(err.Error(), `prints "42"`) {
				t.Fatalf("Verify = %v, want it to reject 42 for a figure declared with one decimal", err)
			}
			return
		}
	}
	t.Fatal("no sentence prints 42.0%")
}

// A sentence citing a figure the model does not have fails, naming both.
func TestCitingAMissingFigureFails(t *testing.T) {
	c, m, _ := parseSituation(t, traceSituation).compose(t)
	bogus := figures.Key{Section: figures.SectionPosition, Group: "Kestria sector", Indicator: "intl", Institution: "F", Year: 2019, Measure: "value"}
	s := Sentence{Text: "Arlen University stood at 12.0% in 2019.", Cites: []figures.Key{bogus}, Part: "block-01"}
	err := checkCites(m, []Sentence{s})
	if err == nil || !strings.Contains(err.Error(), bogus.String()) || !strings.Contains(err.Error(), s.Text) {
		t.Fatalf("checkCites = %v, want it to name the sentence and %s", err, bogus)
	}
	c.Sentences = append(c.Sentences, s)
	if err := Verify(m, c); err == nil || !strings.Contains(err.Error(), bogus.String()) {
		t.Fatalf("Verify = %v, want it to name %s", err, bogus)
	}
}

// Every sentence is a commentary row with its cited keys, and the rows
// are unique so the figures file stays sorted and stable.
func TestCommentaryRows(t *testing.T) {
	c, m, _ := parseSituation(t, traceSituation).compose(t)
	seen := map[figures.Key]bool{}
	sentences, cites := 0, 0
	for r := range m.Rows() {
		if r.Section != figures.SectionCommentary {
			continue
		}
		if seen[r.Key] {
			t.Fatalf("duplicate commentary key %s", r.Key)
		}
		seen[r.Key] = true
		switch {
		case r.Measure == "sentence":
			sentences++
		case strings.HasPrefix(r.Measure, "cites."):
			cites++
			if _, ok := m.Lookup(parseKey(t, r.Text)); !ok {
				t.Errorf("row %s cites %s, which is not in the model", r.Key, r.Text)
			}
		default:
			t.Errorf("unexpected commentary measure %q", r.Measure)
		}
	}
	want := 0
	for _, s := range c.Sentences {
		want += len(s.Cites)
	}
	if sentences != len(c.Sentences) || cites != want {
		t.Fatalf("rows: %d sentences and %d cites, want %d and %d", sentences, cites, len(c.Sentences), want)
	}
	first := c.Sentences[0]
	k := figures.Key{Section: figures.SectionCommentary, Group: "summary", Indicator: first.About, Institution: "#0001", Measure: "sentence"}
	if r, ok := m.Lookup(k); !ok || r.Text != first.Text {
		t.Fatalf("first sentence row %s = %+v, want the text %q", k, r, first.Text)
	}
}

func parseKey(t *testing.T, s string) figures.Key {
	t.Helper()
	p := strings.Split(s, "/")
	if len(p) != 6 {
		t.Fatalf("key %q has %d parts", s, len(p))
	}
	k := figures.Key{Section: p[0], Group: p[1], Indicator: p[2], Institution: p[3], Measure: p[5]}
	if p[4] != "" {
		for _, ch := range p[4] {
			k.Year = k.Year*10 + int(ch-'0')
		}
	}
	return k
}

// Composing twice on one model would write every sentence twice.
func TestComposeTwiceFails(t *testing.T) {
	s := parseSituation(t, traceSituation)
	m, b := s.build(t)
	if _, err := Compose(m, b); err != nil {
		t.Fatal(err)
	}
	if _, err := Compose(m, b); err == nil || !strings.Contains(err.Error(), "already composed") {
		t.Fatalf("second Compose = %v, want an error", err)
	}
}
