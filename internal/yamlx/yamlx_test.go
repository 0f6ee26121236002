package yamlx

import (
	"strings"
	"testing"
)

// The classic worked example: kitten -> sitting needs 3 edits (Wikipedia's
// "Levenshtein distance" article, from memory); flaw -> lawn needs 2.
func TestLevenshtein(t *testing.T) {
	cases := []struct {
		a, b string
		want int
	}{{"kitten", "sitting", 3}, {"flaw", "lawn", 2}, {"", "abc", 3}, {"same", "same", 0}, {"Éluard", "Eluard", 1}}
	for _, c := range cases {
		if got := Levenshtein(c.a, c.b); got != c.want {
			t.Errorf("Levenshtein(%q, %q) = %d, want %d", c.a, c.b, got, c.want)
		}
	}
}

type sample struct {
	Title  string   `yaml:"title"`
	Year   int      `yaml:"year"`
	Weight float64  `yaml:"weight"`
	Tags   []string `yaml:"tags"`
	Inner  struct {
		Paper string `yaml:"paper"`
	} `yaml:"inner"`
}

func TestDecodeProblems(t *testing.T) {
	cases := []struct {
		name, src, want string
	}{
		{"unknown key", "titel: x\n", `f.yaml:1:1: unknown key "titel"; did you mean "title"?`},
		{"nested unknown", "inner:\n  papr: a4\n", `f.yaml:2:3: unknown key "papr" in inner; did you mean "paper"?`},
		{"wrong int", "year: 20.5\n", `f.yaml:1:7: year: expected a whole number, found "20.5"`},
		{"wrong float", "weight: heavy\n", `f.yaml:1:9: weight: expected a number, found "heavy"`},
		{"list expected", "tags: one\n", `f.yaml:1:7: tags: expected a list, found "one"`},
		{"duplicate", "title: a\ntitle: b\n", `f.yaml:2:1: key "title" appears twice (first at line 1); keep one`},
		{"alias", "title: &t a\nyear: 1\n", `f.yaml:1:8: YAML anchors and aliases (& and *) are not accepted; write the value out in full`},
		{"syntax", "title: [a\n", `f.yaml:1: YAML syntax: did not find expected ',' or ']'`},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			n, err := Parse("f.yaml", []byte(c.src), 0)
			if err == nil {
				var s sample
				err = Decode("f.yaml", n, &s)
			}
			if err == nil || err.Error() != c.want {
				t.Errorf("got  %v\nwant %s", err, c.want)
			}
		})
	}
}

// An alias-expansion bomb ("billion laughs" in YAML form) is refused at
// the first anchor, before anything is expanded.
func TestAliasBombRefused(t *testing.T) {
	src := "a: &a [x, x, x, x, x, x, x, x, x]\nb: &b [*a, *a, *a, *a, *a, *a, *a, *a, *a]\nc: &c [*b, *b, *b, *b, *b, *b, *b, *b, *b]\n"
	_, err := Parse("bomb.yaml", []byte(src), 0)
	if err == nil || !strings.Contains(err.Error(), "anchors and aliases") {
		t.Fatalf("want the bomb refused, got %v", err)
	}
}

func TestLimits(t *testing.T) {
	deep := strings.Repeat("[", MaxDepth+5) + strings.Repeat("]", MaxDepth+5)
	if _, err := Parse("d.yaml", []byte("x: "+deep+"\n"), 0); err == nil || !strings.Contains(err.Error(), "nested deeper") {
		t.Errorf("deep nesting: %v", err)
	}
	huge := "x: " + strings.Repeat("a", MaxScalar+1) + "\n"
	if _, err := Parse("h.yaml", []byte(huge), 0); err == nil || !strings.Contains(err.Error(), "over the limit") {
		t.Errorf("huge scalar: %v", err)
	}
	if _, err := Parse("b.yaml", make([]byte, MaxBytes+1), 0); err == nil {
		t.Error("oversized document accepted")
	}
}

func TestLineOffset(t *testing.T) {
	n, err := Parse("brief.md", []byte("kind: box\n"), 40)
	if err != nil {
		t.Fatal(err)
	}
	if n.Content[0].Line != 41 {
		t.Errorf("line %d, want 41", n.Content[0].Line)
	}
}

func FuzzParse(f *testing.F) {
	f.Add([]byte("title: a\nyear: 2025\ntags: [a, b]\ninner: {paper: a4}\n"))
	f.Add([]byte("a: &x 1\nb: *x\n"))
	f.Fuzz(func(t *testing.T, src []byte) {
		n, err := Parse("f.yaml", src, 3)
		if err == nil {
			var s sample
			Decode("f.yaml", n, &s)
		}
	})
}
