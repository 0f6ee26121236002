package layout

import (
	"peerpack/internal/brief"
	"peerpack/internal/dataset"
)

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
