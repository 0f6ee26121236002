package brief

import (
	"strings"
	"testing"
)

const goodBrief = `---
title: International position 2025
subtitle: Université de Saint-Éluard against its peers
focus: KE001
year: 2025
years: [2021, 2025]
data:
  register: institutions.csv
  values: [values.csv, more.csv]
  dictionary: indicators.yaml
  ppp: ppp.csv
groups:
  - name: Home sector
    where: {country: Kestria}
  - name: Competitor systems
    each: country
    where: {country: [Aldmere, Orvanne], mission: {not: teaching}}
  - name: Chosen peers
    members: [KE007, AL022]
  - name: Profile peers
    nearest: {count: 15, indicators: [fnci, papers_per_academic]}
population:
  min_total:
    - {indicator: papers, years: 3, at_least: 600}
theme:
  paper: letter
  accent: "#1f4e79"
---
# Where we stand

Some text.

` + "```chart" + `
kind: box
indicators: [intl_staff_share, fnci]
groups: [Home sector]
caption: International staff
` + "```" + `

` + "```commentary" + `
style: summary
` + "```" + `

` + "```go" + `
fmt.Println("an ordinary code sample is left alone")
` + "```" + `
`

func TestParseGoodBrief(t *testing.T) {
	b, err := Parse("brief.md", []byte(goodBrief))
	if err != nil {
		t.Fatalf("unexpected error: %v", err)
	}
	if b.Title != "International position 2025" || b.Focus != "KE001" || b.Year != 2025 {
		t.Errorf("front matter: %+v", b)
	}
	if b.Years != (Span{2021, 2025}) {
		t.Errorf("years %+v", b.Years)
	}
	if got := strings.Join(b.Data.Values, ","); got != "values.csv,more.csv" {
		t.Errorf("values %q", got)
	}
	if len(b.Groups) != 4 || b.Groups[1].Each != "country" || b.Groups[2].Members[1] != "AL022" || b.Groups[3].Nearest.Count != 15 {
		t.Errorf("groups %+v", b.Groups)
	}
	w := b.Groups[1].Where
	if w == nil || len(w.Conds) != 2 || !w.Conds[1].Not || w.Conds[0].Values[1] != "Orvanne" {
		t.Errorf("where %+v", w)
	}
	if b.Groups[0].Pos.Line != 13 {
		t.Errorf("group position %v, want line 13", b.Groups[0].Pos)
	}
	if b.Population == nil || b.Population.MinTotal[0].AtLeast != 600 {
		t.Errorf("population %+v", b.Population)
	}
	if b.Theme.Paper != "letter" || b.Language != "en-GB" || b.Quantiles != "type7" {
		t.Errorf("defaults: paper %q language %q quantiles %q", b.Theme.Paper, b.Language, b.Quantiles)
	}
	if len(b.Blocks) != 2 {
		t.Fatalf("want 2 peerpack blocks (the go sample is not one), got %d", len(b.Blocks))
	}
	c, ok := b.Blocks[0].(*ChartBlock)
	if !ok || c.Type != "box" || c.Size != "full" || len(c.Indicators) != 2 {
		t.Errorf("chart block %+v", b.Blocks[0])
	}
	if c.Position().Line != 33 {
		t.Errorf("chart fence at line %d, want 33", c.Position().Line)
	}
	if cm, ok := b.Blocks[1].(*CommentaryBlock); !ok || cm.Style != "summary" {
		t.Errorf("commentary block %+v", b.Blocks[1])
	}
}

func TestParseAllProblemsListed(t *testing.T) {
	src := strings.Replace(goodBrief, "kind: box", "kind: bxo", 1)
	src = strings.Replace(src, "style: summary", "style: sumary", 1)
	_, err := Parse("brief.md", []byte(src))
	if err == nil {
		t.Fatal("expected problems")
	}
	lines := strings.Split(err.Error(), "\n")
	if len(lines) != 2 {
		t.Fatalf("want both problems listed, got %q", err)
	}
	want0 := `brief.md:33:1: unknown chart kind "bxo"; did you mean "box"? (kinds are box, radar, trend, scatter, heatmap, bars, esteem, vote-profile)`
	if lines[0] != want0 {
		t.Errorf("got  %s\nwant %s", lines[0], want0)
	}
}

func TestCRLFAndBOM(t *testing.T) {
	src := "\xef\xbb\xbf" + strings.ReplaceAll(goodBrief, "\n", "\r\n")
	b, err := Parse("brief.md", []byte(src))
	if err != nil {
		t.Fatalf("a brief saved with a byte-order mark and CRLF line ends must load: %v", err)
	}
	if len(b.Blocks) != 2 {
		t.Errorf("blocks %d", len(b.Blocks))
	}
}

// FuzzFrontMatter feeds arbitrary briefs to the parser: it must return a
// brief or an error, never panic.
func FuzzFrontMatter(f *testing.F) {
	f.Add([]byte(goodBrief))
	f.Add([]byte("---\n---\n"))
	f.Add([]byte("---\ngroups: [{name: a, where: {x: {not: [1, 2]}}}]\n---\n"))
	f.Add([]byte("---\nyears: [1]\n---\n"))
	f.Add([]byte(compositeFront))
	f.Fuzz(func(t *testing.T, src []byte) {
		Parse("brief.md", src)
	})
}

// FuzzBlockYAML feeds arbitrary YAML to each block decoder.
func FuzzBlockYAML(f *testing.F) {
	f.Add("chart", []byte("kind: box\nindicators: [a]\n"))
	f.Add("table", []byte("kind: peers\nlimit: 10\n"))
	f.Add("commentary", []byte("style: bullets\nyears: [2020, 2024]\n"))
	f.Add("columns", []byte("count: 2\n"))
	f.Add("composite", []byte("neighbours: 4\nshow: [text, flow]\n"))
	f.Fuzz(func(t *testing.T, kind string, src []byte) {
		DecodeBlock("brief.md", kind, src, 10)
	})
}

// The noise and small_group settings default to 5 percentile points and
// 10 members (common practice, no source), read back what the brief
// writes, and are refused with the key's position outside their range.
func TestNoiseAndSmallGroupSettings(t *testing.T) {
	b, err := Parse("brief.md", []byte(goodBrief))
	if err != nil {
		t.Fatal(err)
	}
	if b.NoiseRule() != 5 || b.SmallGroupFloor() != 10 {
		t.Errorf("defaults: noise %v, small_group %v; want 5 and 10", b.NoiseRule(), b.SmallGroupFloor())
	}
	src := strings.Replace(goodBrief, "focus: KE001\n", "focus: KE001\nnoise: 2.5\nsmall_group: 6\n", 1)
	if b, err = Parse("brief.md", []byte(src)); err != nil || b.NoiseRule() != 2.5 || b.SmallGroupFloor() != 6 {
		t.Fatalf("set: %v, noise %v, small_group %v", err, b.NoiseRule(), b.SmallGroupFloor())
	}
	for _, bad := range []string{"noise: 30\n", "noise: -1\n", "small_group: 1\n"} {
		src := strings.Replace(goodBrief, "focus: KE001\n", "focus: KE001\n"+bad, 1)
		_, err := Parse("brief.md", []byte(src))
		if err == nil || !strings.Contains(err.Error(), "brief.md:") || !strings.Contains(err.Error(), strings.SplitN(bad, ":", 2)[0]) {
			t.Errorf("%q: %v, want a positioned error naming the key", bad, err)
		}
	}
}
