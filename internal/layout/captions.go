package layout

import (
	"fmt"
	"strconv"
	"strings"
	"unicode"

	"peerpack/charts"
	"peerpack/internal/brief"
	"peerpack/internal/figures"
)

// CaptionWarnings reads the captions and titles a brief writes for its
// charts and tables and returns, positioned, each count they state that
// the block does not show: "the fifteen highest" over fourteen bars and
// the focus, "six systems" over five groups, "the four indicators" over
// two. A written caption is the author's claim; peerpack cannot rewrite
// it, but `check` says where it disagrees with the figures. (Captions
// peerpack writes itself are built from the figures and need no check.)
func CaptionWarnings(b *brief.Brief, m *figures.Model) []string {
	var out []string
	for _, blk := range b.Blocks {
		var texts []string
		var inds, groups []string
		bars := -1
		switch v := blk.(type) {
		case *brief.ChartBlock:
			texts, inds, groups = []string{v.Caption, v.Title}, v.Indicators, v.Groups
			if v.Type == "bars" {
				if c, err := charts.New(m, v, charts.Theme{}); err == nil {
					if bc, ok := c.(*charts.BarsChart); ok {
						bars = 0
						for _, it := range bc.Items {
							if !it.GapBefore {
								bars++
							}
						}
					}
				}
			}
		case *brief.TableBlock:
			texts, inds, groups = []string{v.Caption}, v.Indicators, v.Groups
		default:
			continue
		}
		p := blk.Position()
		for _, t := range texts {
			for _, c := range statedCounts(t) {
				have, what := -1, ""
				switch c.noun {
				case "indicator", "measure":
					have, what = len(inds), "indicators"
				case "group":
					have, what = len(groups), "groups"
				case "system", "country":
					// "six systems" counts the countries the block's
					// groups draw on, one group or several.
					have, what = countriesOf(m, groups), "systems (countries) among its groups' members"
				case "highest", "lowest", "best", "top", "institution", "university", "bar":
					have, what = bars, "ranked bars"
				}
				if have <= 0 || have == c.n {
					continue
				}
				out = append(out, fmt.Sprintf("%s:%d:%d: the caption says %q but the block shows %d %s; say what it shows, or leave the caption out and peerpack writes one from the figures", b.File, p.Line, p.Column, c.phrase, have, what))
			}
		}
	}
	return out
}

type statedCount struct {
	n      int
	noun   string
	phrase string
}

var countWords = map[string]int{"two": 2, "three": 3, "four": 4, "five": 5, "six": 6, "seven": 7, "eight": 8, "nine": 9, "ten": 10,
	"eleven": 11, "twelve": 12, "thirteen": 13, "fourteen": 14, "fifteen": 15, "sixteen": 16, "seventeen": 17, "eighteen": 18, "nineteen": 19, "twenty": 20,
	"twenty-five": 25, "thirty": 30, "forty": 40, "fifty": 50}

// countNouns are the words a stated count is read against, singular.
var countNouns = []string{"indicator", "measure", "system", "group", "country", "highest", "lowest", "best", "top", "institution", "university", "bar"}

// statedCounts finds "<number> [up to two words] <noun>" in a caption:
// "the fifteen highest", "six competitor systems", "4 indicators".
func statedCounts(s string) []statedCount {
	words := strings.FieldsFunc(strings.ToLower(s), func(r rune) bool { return !unicode.IsLetter(r) && !unicode.IsDigit(r) && r != '-' })
	var out []statedCount
	for i, w := range words {
		n, ok := countWords[w]
		if !ok {
			if v, err := strconv.Atoi(w); err == nil && v > 1 && v < 1000 {
				n, ok = v, true
			}
		}
		if !ok {
			continue
		}
		if i+1 < len(words) && words[i+1] == "or" || i > 0 && (words[i-1] == "least" || words[i-1] == "than") {
			continue // "two or more", "at least three", "more than five": a rule, not a count
		}
		for j := i + 1; j < len(words) && j <= i+3; j++ {
			noun := strings.TrimSuffix(strings.TrimSuffix(words[j], "s"), "ie")
			if words[j] == "countries" {
				noun = "country"
			}
			if words[j] == "universities" {
				noun = "university"
			}
			for _, cn := range countNouns {
				if noun == cn {
					out = append(out, statedCount{n: n, noun: cn, phrase: strings.Join(words[i:j+1], " ")})
					j = len(words)
					break
				}
			}
		}
	}
	return out
}

// countriesOf counts the countries among the members of the named groups.
func countriesOf(m *figures.Model, names []string) int {
	seen := map[string]bool{}
	for _, n := range names {
		g, ok := m.Group(n)
		if !ok {
			continue
		}
		for _, i := range g.Members {
			seen[m.Data.Register.Institutions[i].Country] = true
		}
	}
	return len(seen)
}
