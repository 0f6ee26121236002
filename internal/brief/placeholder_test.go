package brief

import (
	"strings"
	"testing"
)

// The placeholder syntax is peerpack's own (documented in placeholder.go
// and DEVELOPERS.md); expectations below follow that definition.
func TestFindPlaceholders(t *testing.T) {
	cases := []struct {
		in   string
		want []Placeholder
		errs []string
	}{
		{in: "Impact is {=value fnci}.", want: []Placeholder{{Measure: "value", Indicator: "fnci", Raw: "{=value fnci}", Start: 10, End: 23}}},
		{in: `{=rank fnci in "National peers" of KE004 for 2024}`, want: []Placeholder{{Measure: "rank", Indicator: "fnci", Group: "National peers", Institution: "KE004", Year: 2024, Raw: `{=rank fnci in "National peers" of KE004 for 2024}`, Start: 0, End: 50}}},
		{in: "{=name} and {=members in Kestria} {=value x of focus}", want: []Placeholder{
			{Measure: "name", Raw: "{=name}", Start: 0, End: 7},
			{Measure: "members", Group: "Kestria", Raw: "{=members in Kestria}", Start: 12, End: 33},
			{Measure: "value", Indicator: "x", Raw: "{=value x of focus}", Start: 34, End: 53},
		}},
		{in: `literal {\=value fnci} stays`},
		{in: "no placeholder {here} at all"},
		{in: "{=valeu fnci}", errs: []string{`unknown measure "valeu"; did you mean "value"?`}},
		{in: "{=rank}", errs: []string{`measure "rank" needs an indicator key`}},
		{in: "{=rank fnci for 20x4}", errs: []string{`year "20x4" is not a four-digit year`}},
		{in: "{=rank fnci in}", errs: []string{`clause "in" needs a value`}},
		{in: "{=rank fnci in A in B}", errs: []string{`clause "in" is given twice`}},
		{in: "{=rank fnci at home}", errs: []string{`unexpected "at"`}},
		{in: `{=rank fnci in "open}`, errs: []string{"quoted name is not closed"}},
		{in: "{=value fnci", errs: []string{"is not closed"}},
		{in: "{=}", errs: []string{"name a measure"}},
	}
	for _, c := range cases {
		got, errs := FindPlaceholders(c.in)
		if len(got) != len(c.want) {
			t.Errorf("%q: got %d placeholders %+v, want %d", c.in, len(got), got, len(c.want))
			continue
		}
		for i := range got {
			if got[i] != c.want[i] {
				t.Errorf("%q: got %+v, want %+v", c.in, got[i], c.want[i])
			}
		}
		if len(errs) != len(c.errs) {
			t.Errorf("%q: got errors %v, want %v", c.in, errs, c.errs)
			continue
		}
		for i, e := range errs {
			if !strings.Contains(e.Msg, c.errs[i]) {
				t.Errorf("%q: error %q lacks %q", c.in, e.Msg, c.errs[i])
			}
		}
	}
}

func TestPlaceholdersInBriefArePositioned(t *testing.T) {
	src := strings.Replace(goodBrief, "Some text.", "Some text with {=value fnci in \"Home sector\"}\nand *{=rank papers_per_academic}* here.\n\n| a | b |\n|---|---|\n| {=median fnci} | `{=notplaceholder}` |\n\nBad {=rank fnci in \"Home sectr\"} and {=valeu fnci}.", 1)
	b, err := Parse("brief.md", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	ps, err := Placeholders(b)
	if len(ps) != 4 {
		t.Fatalf("want 4 placeholders, got %+v", ps)
	}
	// "# Where we stand" is on line 29 of goodBrief; the text follows it
	// after a blank line, on line 31 (counted by hand).
	want := []struct {
		raw  string
		line int
		col  int
	}{
		{`{=value fnci in "Home sector"}`, 31, 16},
		{"{=rank papers_per_academic}", 32, 6},
		{"{=median fnci}", 36, 3},
		{`{=rank fnci in "Home sectr"}`, 38, 5},
	}
	for i, w := range want {
		if ps[i].Raw != w.raw || ps[i].Pos.Line != w.line || ps[i].Pos.Column != w.col {
			t.Errorf("placeholder %d: got %q at %v, want %q at %d:%d", i, ps[i].Raw, ps[i].Pos, w.raw, w.line, w.col)
		}
	}
	if err == nil {
		t.Fatal("want errors for the unknown group and measure")
	}
	msg := err.Error()
	for _, w := range []string{`brief.md:38:38: placeholder {=valeu fnci}: unknown measure "valeu"; did you mean "value"?`, `brief.md:38:5: placeholder {=rank fnci in "Home sectr"} names group "Home sectr", which the front matter does not define; did you mean "Home sector"?`} {
		if !strings.Contains(msg, w) {
			t.Errorf("errors lack %q:\n%s", w, msg)
		}
	}
}

func FuzzPlaceholder(f *testing.F) {
	for _, s := range []string{"{=value fnci}", `{=rank fnci in "A b" of X for 2024}`, "{=", "{=}", `{\=x}`, "{=a\"", "{={=value x}}"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		ps, errs := FindPlaceholders(s)
		last := 0
		for _, p := range ps {
			if p.Start < last || p.End <= p.Start || p.End > len(s) || s[p.Start:p.End] != p.Raw {
				t.Fatalf("bad range %+v in %q", p, s)
			}
			last = p.End
			again, errs2 := FindPlaceholders(p.Raw)
			if len(again) != 1 || len(errs2) != 0 || again[0].Measure != p.Measure || again[0].Indicator != p.Indicator || again[0].Group != p.Group || again[0].Year != p.Year {
				t.Fatalf("re-parse of %q differs: %+v %v", p.Raw, again, errs2)
			}
		}
		for _, e := range errs {
			if e.Offset < 0 || e.Offset >= len(s) || e.Msg == "" {
				t.Fatalf("bad error %+v in %q", e, s)
			}
		}
	})
}
