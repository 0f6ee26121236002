package figures

import (
	"errors"
	"fmt"
	"strings"
	"testing"

	"peerpack/internal/brief"
	"peerpack/internal/diag"
)

// briefWith parses a brief over the fixture's data with the given front
// matter lines (after the data block) and body.
func briefWith(t *testing.T, front, body string) *brief.Brief {
	t.Helper()
	src := "---\ntitle: T\ndata:\n  register: register.csv\n  values: values.csv\n  dictionary: indicators.yaml\n" + front + "---\n" + body
	b, err := brief.Parse("b.md", []byte(src))
	if err != nil {
		t.Fatalf("brief does not parse: %v\n%s", err, src)
	}
	return b
}

// Each case must fail with every listed fragment, at the stated line.
func TestComputeReportsProblemsAtTheirLines(t *testing.T) {
	d, _ := loadFixture(t)
	cases := []struct {
		name, front, body string
		want              []string
	}{
		{"unknown focus", "focus: KE2\nyear: 2025\n", "",
			[]string{`b.md:7:1: focus "KE2" is not in the register register.csv; did you mean "KE02"?`}},
		{"year without data", "focus: KE02\nyear: 2030\nyears: [2021, 2030]\n", "",
			[]string{`b.md:8:1: year 2030 has no values in the data`}},
		{"unknown member", "focus: KE02\nyear: 2025\ngroups:\n  - name: Peers\n    members: [KE01, AL3]\n", "",
			[]string{`b.md:10:5: group "Peers": member "AL3" is not in the register register.csv; did you mean "AL03"?`}},
		{"unknown field", "focus: KE02\nyear: 2025\ngroups:\n  - name: Home\n    where: {contry: Kestria}\n", "",
			[]string{`b.md:11:13: group "Home": "contry" is not a column of the register register.csv; did you mean "country"?`}},
		{"unknown value", "focus: KE02\nyear: 2025\ngroups:\n  - name: Home\n    where: {country: Kestira}\n", "",
			[]string{`group "Home": no institution in the register has country "Kestira"; did you mean "Kestria"?`}},
		{"unknown each field", "focus: KE02\nyear: 2025\ngroups:\n  - name: Systems\n    each: regoin\n", "",
			[]string{`each "regoin" is not a column`, `did you mean "region"?`}},
		{"nearest unknown indicator", "focus: KE02\nyear: 2025\ngroups:\n  - name: Like us\n    nearest: {count: 3, indicators: [fnci, intl_shar]}\n", "",
			[]string{`group "Like us": nearest: indicator "intl_shar" is not in the dictionary indicators.yaml; did you mean "intl_share"?`}},
		{"block unknown indicator", "focus: KE02\nyear: 2025\ngroups:\n  - name: Home\n    where: {country: Kestria}\n",
			"\n```chart\nkind: box\nindicators: [fncii]\ngroups: [Home]\n```\n",
			[]string{`b.md:14:1: chart block: indicator "fncii" is not in the dictionary indicators.yaml; did you mean "fnci"?`}},
		{"block unknown group", "focus: KE02\nyear: 2025\ngroups:\n  - name: Home sector\n    where: {country: Kestria}\n",
			"\n```table\nindicators: [fnci]\ngroups: [Home sectr]\n```\n",
			[]string{`b.md:14:1: table block: group "Home sectr" is not defined under groups: in the front matter; did you mean "Home sector"?`}},
		{"commentary outside span", "focus: KE02\nyear: 2025\nyears: [2023, 2025]\n",
			"\n```commentary\nyears: [2021, 2025]\n```\n",
			[]string{`commentary block: years [2021, 2025] reach outside the brief's years [2023, 2025]`}},
		{"unknown label", "focus: KE02\nyear: 2025\n",
			"\n```chart\nkind: box\nindicators: [fnci]\nlabel: [OR9]\n```\n",
			[]string{`chart label "OR9" is not in the register`}},
		{"value slot outside each", "focus: KE02\nyear: 2025\ngroups:\n  - name: Home\n    where: {country: Kestria}\n    phrase: the {value} sector\n", "",
			[]string{`b.md:10:5: group "Home": phrase "the {value} sector" uses {value}, which only an each group has; write the words in full`}},
		{"focus lacks nearest indicator", "focus: OR03\nyear: 2025\ngroups:\n  - name: Like us\n    nearest: {count: 3, indicators: [fnci]}\n", "",
			[]string{`b.md:10:5: group "Like us": the focus OR03 has no value in 2025 of any of fnci, so no institution can be measured against it; choose indicators the focus reports`}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			b := briefWith(t, c.front, c.body)
			m, err := Compute(d, b)
			if err == nil {
				t.Fatalf("no error; model with %d groups", len(m.Groups))
			}
			var l *diag.List
			if !errors.As(err, &l) {
				t.Fatalf("error is %T, want *diag.List", err)
			}
			for _, w := range c.want {
				if !strings.Contains(err.Error(), w) {
					t.Errorf("error does not contain %q:\n%v", w, err)
				}
			}
		})
	}
}

func TestComputeCollectsAllProblems(t *testing.T) {
	d, _ := loadFixture(t)
	b := briefWith(t, "focus: KE2\nyear: 2025\ngroups:\n  - name: Peers\n    members: [KE01, AL3]\n",
		"\n```chart\nkind: box\nindicators: [fncii]\n```\n")
	_, err := Compute(d, b)
	var l *diag.List
	if !errors.As(err, &l) || l.Len() != 3 {
		t.Fatalf("want 3 problems in one list, got %v", err)
	}
}

func TestComputeNilInputs(t *testing.T) {
	if _, err := Compute(nil, nil); err == nil {
		t.Fatal("nil inputs must be an error, not a panic")
	}
}

// TestUnknownGroupListIsShort: the groups a wrong name could have meant
// are listed whole when few, and the first ten and a count when many (an
// each group over 120 systems would otherwise list 120 names).
func TestUnknownGroupListIsShort(t *testing.T) {
	var many []string
	for i := 1; i <= 120; i++ {
		many = append(many, fmt.Sprintf("System %03d", i))
	}
	if got := quotedSome(many, 10); !strings.HasSuffix(got, `"System 010" and 110 more`) || strings.Contains(got, "System 011") {
		t.Errorf("120 names: %s", got)
	}
	if got, want := quotedSome(many[:12], 10), quoted(many[:12]); got != want {
		t.Errorf("12 names: %s, want all: %s", got, want)
	}
}
