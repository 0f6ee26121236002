package layout

import (
	"fmt"
	"strings"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
)

// ruleExclusions counts, for each population rule in the order the
// dataset states them (min_total, then max_value, then require, each in
// brief order), how many institutions that rule leaves out. An
// institution failing two rules counts under both.
//
// The dataset keeps each excluded institution's reasons as text, in rule
// order; the reasons are matched here to the rule that wrote them. When a
// reason matches no rule (the dataset's wording changed), ok is false and
// the annex states only the total, rather than a wrong split.
func ruleExclusions(b *brief.Brief, pop *dataset.Population) (counts []int, ok bool) {
	if b.Population == nil || pop == nil {
		return nil, false
	}
	var prefixes [][]string // per rule, the reason prefixes it writes
	for _, r := range b.Population.MinTotal {
		first := b.Year - r.Years + 1
		prefixes = append(prefixes, []string{
			fmt.Sprintf("no %s values in %d-%d", r.Indicator, first, b.Year),
			fmt.Sprintf("%s over %d-%d is ", r.Indicator, first, b.Year),
		})
	}
	for _, r := range b.Population.MaxValue {
		prefixes = append(prefixes, []string{fmt.Sprintf("%s in %d is ", r.Indicator, b.Year)})
	}
	for _, a := range b.Population.Require {
		prefixes = append(prefixes, []string{fmt.Sprintf("register field %s is empty", a)})
	}
	if len(prefixes) != len(pop.Rules) {
		return nil, false
	}
	counts = make([]int, len(prefixes))
	for _, reasons := range pop.Excluded {
		hit := make([]bool, len(prefixes))
		for _, why := range reasons {
			found := false
			for i, ps := range prefixes {
				for _, p := range ps {
					if strings.HasPrefix(why, p) {
						hit[i], found = true, true
					}
				}
			}
			if !found {
				return nil, false
			}
		}
		for i, h := range hit {
			if h {
				counts[i]++
			}
		}
	}
	return counts, true
}
