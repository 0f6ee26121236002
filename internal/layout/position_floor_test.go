package layout

import (
	"regexp"
	"strings"
	"testing"

	"peerpack/internal/narrative"
)

// A position table over a group below the small-group floor (the four
// chosen peers, floor 10) gives each indicator's rank and median but no
// percentile, quarter or quartile, and says why; a group above the floor
// keeps them (the pack's rule: quarters and percentiles are not printed
// for groups below the floor, common practice, no source).
func TestPositionTableBelowFloor(t *testing.T) {
	body := "# Dashboard\n\n```table\nkind: position\ngroups: [Chosen peers]\ncolumns: [rank, percentile, quarter, median, q1, q3]\n```\n" +
		"\n```table\nkind: position\ngroups: [Valmoria]\ncolumns: [rank, percentile, quarter, median, q1, q3]\n```\n"
	out, err := Render(fixtureInputFrom(t, 60, fixtureBody(t, body)))
	if err != nil {
		t.Fatal(err)
	}
	var rows []string
	for _, line := range strings.Split(runTool(t, out, "pdftotext", "-layout"), "\n") {
		rows = append(rows, strings.Join(strings.Fields(line), " "))
	}
	count := func(re *regexp.Regexp) int {
		n := 0
		for _, r := range rows {
			if re.MatchString(r) {
				n++
			}
		}
		return n
	}
	// The focus is not one of the four chosen peers: it ranks "of 5".
	// Rank, then two dashes, the median, then two dashes.
	small := regexp.MustCompile(`\d(st|nd|rd|th) of 5 – – [0-9][0-9.,%]* – –$`)
	if n := count(small); n != 4 {
		t.Errorf("want 4 rows of rank, –, –, median, –, – for the chosen peers, found %d:\n%s", n, strings.Join(rows, "\n"))
	}
	text := strings.Join(strings.Fields(strings.Join(rows, " ")), " ")
	if !strings.Contains(text, "Where fewer than 10 members report an indicator, the rank and median are given but no percentile, quarter or quartile") {
		t.Errorf("no note on the small group:\n%s", text)
	}
	if strings.Count(text, "Where fewer than 10 members report") != 1 {
		t.Errorf("the note is not given once, for the small group's table only")
	}
	// Valmoria (about 20 members) keeps percentiles and quartiles.
	large := regexp.MustCompile(`\d(st|nd|rd|th) of [12]\d \d+(st|nd|rd|th) (top|second|third|bottom) [0-9][0-9.,%]* [0-9][0-9.,%]* [0-9][0-9.,%]*$`)
	if n := count(large); n != 4 {
		t.Errorf("want 4 full rows for Valmoria, found %d:\n%s", n, strings.Join(rows, "\n"))
	}
}

// The evidence appendix reads a group below the small-group floor as the
// sentences do: a cited percentile prints as the rank "of n" it stands
// for, a cited quarter not at all; groups above the floor keep theirs.
func TestEvidenceBelowFloorByRank(t *testing.T) {
	body := "# Peers\n\n```commentary\ntopics: [peerchoice]\ngroups: [Chosen peers, Valmoria, Northern region]\n```\n"
	in := fixtureInputFrom(t, 60, fixtureBody(t, body))
	com, err := narrative.Compose(in.Model, in.Brief)
	if err != nil {
		t.Fatal(err)
	}
	in.Commentary = com
	in.Brief.Sources = true
	out, err := Render(in)
	if err != nil {
		t.Fatal(err)
	}
	text := flatText(t, out)
	at := strings.Index(text, "Statements of the commentary and their evidence")
	if at < 0 {
		t.Fatalf("no evidence table:\n%s", text)
	}
	ev := text[at:]
	if m := regexp.MustCompile(`Chosen peers, 2025: [^;A-Z]*(percentile|quarter)`).FindString(ev); m != "" {
		t.Errorf("a percentile or quarter of the chosen peers (4 members) is printed: %q", m)
	}
	if !regexp.MustCompile(`Chosen peers, 2025: rank \d+(st|nd|rd|th) of [45]`).MatchString(ev) {
		t.Errorf("no rank of n for the chosen peers in the evidence:\n%s", ev)
	}
	if !regexp.MustCompile(`(Valmoria|Northern region), 2025: [^;A-Z]*\d+(st|nd|rd|th) percentile`).MatchString(ev) {
		t.Errorf("the larger groups lost their percentiles:\n%s", ev)
	}
}
