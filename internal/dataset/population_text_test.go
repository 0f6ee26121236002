package dataset

import "testing"

// Rule texts and exclusion reasons are printed in the pack, so their
// numbers carry thousands separators and their spans an en dash, as the
// pack's tables print them (common practice, no source).
func TestPopulationTextNumbers(t *testing.T) {
	cases := []struct {
		v        float64
		decimals int
		want     string
	}{
		{1000, 0, "1,000"},
		{999, 0, "999"},
		{1234567, 0, "1,234,567"},
		{1234567.25, 2, "1,234,567.25"},
		{0.8, 2, "0.80"},
		{-2500, 0, "-2,500"},
		{-0.5, 1, "-0.5"},
		{12000.5, 1, "12,000.5"},
	}
	for _, c := range cases {
		if got := num(c.v, c.decimals); got != c.want {
			t.Errorf("num(%v, %d) = %q, want %q", c.v, c.decimals, got, c.want)
		}
	}
	if got := yearRange(2021, 2025); got != "2021\u20132025" {
		t.Errorf("yearRange = %q", got)
	}
	for label, want := range map[string]string{
		"Papers":                           "papers",
		"FNCI":                             "FNCI",
		"PhD completions":                  "PhD completions",
		"A-level entrants":                 "A-level entrants",
		"Field-normalised citation impact": "field-normalised citation impact",
	} {
		if got := runningText(Indicator{Key: "k", Label: label}); got != want {
			t.Errorf("runningText(%q) = %q, want %q", label, got, want)
		}
	}
	if got := runningText(Indicator{Key: "raw_key"}); got != "raw_key" {
		t.Errorf("runningText without a label = %q", got)
	}
}
