package layout

import (
	"fmt"
	"strings"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
)

// earlierYearsRule says who is ranked in the span's earlier years: the
// population rules applied as of each year, or the reporting year's
// population throughout (earlier_years: fixed). Empty without population
// rules or without earlier years.
func earlierYearsRule(m *figures.Model) string {
	pop := m.Data.Population
	if pop == nil || len(pop.Rules) == 0 || m.First == m.Last {
		return ""
	}
	if pop.Fixed {
		return fmt.Sprintf("rank the population of %d in every year from %d (a fixed panel, as the brief asks): earlier figures include institutions that did not yet meet the population rules and leave out none that have since stopped meeting them.", m.Year, m.First)
	}
	return "rank, in each year, the institutions that met the population rules as of that year, each window ending that year, so no year's figures are drawn only from today's survivors."
}

// yearCounts lists each span year's ranked population ("430 in 2020"),
// and the scaled rules of the years whose window reaches back before the
// data, as the methodology annex states them.
func yearCounts(m *figures.Model, b *brief.Brief) (counts string, scaled []string) {
	d := m.Data
	var parts []string
	for _, y := range m.Years {
		parts = append(parts, fmt.Sprintf("%s in %d", format.Int(d.RankedIn(y)), y))
	}
	if b.Population != nil && len(d.Years) > 0 {
		for _, y := range m.Years {
			texts := d.Population.YearRules[y]
			for i, r := range b.Population.MinTotal {
				if y-r.Years+1 < d.Years[0] && i < len(texts) {
					scaled = append(scaled, texts[i])
				}
			}
		}
	}
	return strings.Join(parts, ", "), scaled
}

// ruleExclusions returns, for each population rule in the order the
// dataset states them, how many institutions that rule leaves out (an
// institution failing two rules counts under both), as the dataset counted
// them while applying the rules. ok is false when there are no rules.
func ruleExclusions(b *brief.Brief, pop *dataset.Population, dict *dataset.Dictionary) (counts []int, ok bool) {
	if b.Population == nil || pop == nil || len(pop.Rules) == 0 || len(pop.RuleExcluded) != len(pop.Rules) {
		return nil, false
	}
	return pop.RuleExcluded, true
}
