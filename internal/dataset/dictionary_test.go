package dataset

import (
	"strings"
	"testing"

	"peerpack/internal/brief"
)

func TestDictionaryChecks(t *testing.T) {
	for _, tc := range []struct {
		name, src, want string
	}{
		// Expected messages are our own; columns counted with Python's
		// str.index on each line (1-based).
		{"short defaults to label", "indicators:\n  - {key: a, label: Alpha, unit: count, better: higher, decimals: 0}\n", ""},
		{"currency needs unit", "indicators:\n  - {key: a, label: A, unit: count, currency: true, better: higher, decimals: 0}\n", "d.yaml:2:47: currency: true needs unit: currency"},
		{"reserved key", "indicators:\n  - {key: per, label: A, unit: count, better: higher, decimals: 0}\n", "d.yaml:2:11: key \"per\" is a reserved word"},
		{"column key", "indicators:\n  - {key: year, label: A, unit: count, better: higher, decimals: 0}\n", "d.yaml:2:11: key \"year\" is a reserved word"},
		{"empty missing token", "indicators:\n  - {key: a, label: A, unit: count, better: higher, decimals: 0, missing: [\"\"]}\n", "d.yaml:2:75: an empty entry in missing:"},
		{"no unit", "indicators:\n  - {key: a, label: A, better: higher, decimals: 0}\n", "d.yaml:2:11: indicator \"a\" has no unit"},
		{"no better", "indicators:\n  - {key: a, label: A, unit: count, decimals: 0}\n", "d.yaml:2:11: indicator \"a\" has no better:"},
		{"no key", "indicators:\n  - {label: A, unit: count, better: higher, decimals: 0}\n", "d.yaml:2:5: indicator 1 has no key"},
		{"negative decimals", "indicators:\n  - {key: a, label: A, unit: count, better: higher, decimals: -1}\n", "d.yaml:2:63: decimals -1 is out of range"},
		{"no indicators", "title: x\n", "d.yaml:1:1: unknown key \"title\""},
		{"empty list", "indicators: []\n", "d.yaml:1:1: the dictionary has no indicators"},
		{"derive column in quotes", "indicators:\n  - {key: a, label: A, unit: ratio, better: higher, decimals: 2, derive: \"b / (c\"}\n", "d.yaml:2:81: derive of \"a\": expected \")\""},
		{"derive column plain", "indicators:\n  - key: a\n    label: A\n    unit: ratio\n    better: higher\n    decimals: 2\n    derive: b $ c\n", "d.yaml:7:15: derive of \"a\": unexpected character '$'"},
	} {
		d, _, err := ParseDictionary("d.yaml", []byte(tc.src))
		if tc.want == "" {
			if err != nil {
				t.Errorf("%s: %v", tc.name, err)
				continue
			}
			if d.Indicators[0].Short != "Alpha" {
				t.Errorf("%s: short %q", tc.name, d.Indicators[0].Short)
			}
			continue
		}
		if err == nil || !strings.HasPrefix(err.Error(), tc.want) {
			t.Errorf("%s:\n got %v\nwant %s", tc.name, err, tc.want)
		}
	}
}

func TestCheckPath(t *testing.T) {
	b := &brief.Brief{File: "brief.md", Lines: map[string]brief.Pos{"data.register": {Line: 6, Column: 3}}}
	for _, tc := range []struct{ path, want string }{
		// Our own rules: fs.FS paths (io/fs.ValidPath) inside the folder.
		{"institutions.csv", ""},
		{"data/institutions.csv", ""},
		{"book.xlsx#Register", ""},
		{"../institutions.csv", "brief.md:6:3: data.register \"../institutions.csv\" leaves the brief's folder"},
		{"data/../../x.csv", "leaves the brief's folder"},
		{"/srv/x.csv", "is an absolute path"},
		{"C:/data/x.csv", "is an absolute path"},
		{"data\\x.csv", "uses backslashes"},
		{"https://example.org/x.csv", "is a web address"},
		{"", "is empty"},
	} {
		err := checkPath(b, "data.register", tidyPath(tc.path))
		if tc.want == "" {
			if err != nil {
				t.Errorf("%q: %v", tc.path, err)
			}
			continue
		}
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%q: got %v, want %s", tc.path, err, tc.want)
		}
	}
	if got := tidyPath(".//data/./x.csv#S"); got != "data/x.csv#S" {
		t.Errorf("tidyPath gave %q", got)
	}
}
