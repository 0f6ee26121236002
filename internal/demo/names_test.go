package demo

import (
	"strings"
	"testing"
)

// realNames are well-known real universities, university towns and higher
// education systems (from memory; a spot check, not a register). No
// generated name may contain one. The generator's stems and endings are
// invented (names.go), so a hit here means a stem needs changing.
var realNames = []string{
	"Oxford", "Cambridge", "Harvard", "Stanford", "Yale", "Princeton", "Berkeley", "Sorbonne",
	"Heidelberg", "Bologna", "Salamanca", "Coimbra", "Uppsala", "Leiden", "Utrecht", "Delft",
	"Aachen", "Göttingen", "Tübingen", "Kraków", "Krakow", "Warszaw", "Jagiello", "Oslo",
	"Bergen", "Tromsø", "Lund", "Leuven", "Zürich", "Zurich", "Lisboa", "Lisbon", "Porto",
	"Madrid", "Barcelona", "Paris", "Lyon", "Toulouse", "Bordeaux", "Grenoble", "Strasbourg",
	"Montpellier", "Edinburgh", "Glasgow", "Manchester", "London", "Durham", "York", "Bristol",
	"Trondheim", "Aarhus", "Copenhagen", "København", "Helsinki", "Tartu", "Vilnius", "Wrocław",
	"Poznań", "Gdańsk", "Łódź", "Lublin", "Toruń", "Sevilla", "Granada", "Valencia", "Braga",
	"Aveiro", "Minho", "Wien", "Vienna", "Berlin", "München", "Munich", "Hamburg", "Bonn",
	"Freiburg", "Imperial", "Karolinska", "Sciences Po", "Polytechnique", "Humboldt",
	"Stellenbosch", "Melbourne", "Sydney", "Toronto", "McGill", "Tokyo", "Kyoto", "Tsinghua",
	"Peking", "ETH", "EPFL", "MIT", "UCL", "KTH", "NTNU", "Complutense", "Ludwig", "Maximilian",
	"England", "France", "Germany", "Norway", "Poland", "Portugal", "Spain", "Deutschland",
	"Norge", "Polska",
}

func TestNoRealNames(t *testing.T) {
	rows := readCSV(t, RegisterName)
	seen := map[string]string{}
	for _, r := range rows[1:] {
		for _, field := range []string{r[1], r[2], r[3], r[4]} {
			words := " " + strings.NewReplacer(",", " ", "-", " ", "'", " ", ".", " ").Replace(field) + " "
			for _, real := range realNames {
				// Upper-case acronyms must match a whole word; names match
				// anywhere, so "Oxfordshire" would be caught too.
				hit := strings.Contains(strings.ToLower(field), strings.ToLower(real))
				if strings.ToUpper(real) == real {
					hit = strings.Contains(words, " "+real+" ")
				}
				if hit {
					t.Errorf("%s: %q contains the real name %q", r[0], field, real)
				}
			}
		}
		if prev, dup := seen[r[1]]; dup {
			t.Errorf("%s and %s share the name %q", prev, r[0], r[1])
		}
		seen[r[1]] = r[0]
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

func TestShortNamesUnique(t *testing.T) {
	seen := map[string]string{}
	for _, r := range readCSV(t, RegisterName)[1:] {
		key := r[2] + "/" + r[4]
		if prev, dup := seen[key]; dup {
			t.Errorf("%s and %s share the short name %q in %s", prev, r[0], r[4], r[2])
		}
		seen[key] = r[0]
	}
}
