package pdf

import "testing"

// Which names the pack can set. Script membership follows the Unicode
// Character Database's Scripts.txt (from memory: U+0590-05FF Hebrew,
// U+0600-06FF Arabic, U+0900-097F Devanagari, U+0E00-0E7F Thai, U+4E00
// onwards CJK ideographs); Liberation 2 covers Latin, Greek and Cyrillic
// (its documentation, from memory).
func TestUncovered(t *testing.T) {
	// want -1: every distinct character but the space is refused.
	cases := []struct {
		name string
		want int
	}{
		{"Høgskolen i Vårdø", 0},
		{"Politechnika Źródłowa", 0},
		{"Πανεπιστήμιο Κέστριας", 0},
		{"Кестрийский университет", 0},
		{"Université de Saint-Éluard – «Nord»", 0},
		{"青嵐学院", -1},
		{"青嵐学院 青嵐", 4}, // each character once
		{"מכללת קסטריה", -1},
		{"جامعة كستريا", -1},
		{"केस्ट्रिया विश्वविद्यालय", -1},
		{"มหาวิทยาลัยเคสเตรีย", -1},
	}
	for _, c := range cases {
		want := c.want
		if want < 0 {
			distinct := map[rune]bool{}
			for _, r := range c.name {
				if r != ' ' {
					distinct[r] = true
				}
			}
			want = len(distinct)
		}
		if got := Uncovered(c.name); len(got) != want {
			t.Errorf("Uncovered(%q) = %q (%d), want %d", c.name, string(got), len(got), want)
		}
	}
}
