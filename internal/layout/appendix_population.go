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
// The dataset keeps, per excluded institution, one reason for each rule
// it fails, in rule order, as text. With a single rule every exclusion is
// that rule's. With several, each reason is matched to the next rule (in
// order) whose marks it carries: the rule's indicator (key or label) and
// its kind's wording, or the register field of a require rule. When a
// reason matches no rule, ok is false and the annex states only the
// total, rather than a wrong split.
func ruleExclusions(b *brief.Brief, pop *dataset.Population, dict *dataset.Dictionary) (counts []int, ok bool) {
	if b.Population == nil || pop == nil || len(pop.Rules) == 0 {
		return nil, false
	}
	if len(pop.Rules) == 1 {
		return []int{len(pop.Excluded)}, true
	}
	var rules []func(why string) bool
	names := func(key string) []string {
		out := []string{strings.ToLower(key)}
		if ind, ok := dict.Lookup(key); ok {
			out = append(out, strings.ToLower(ind.Label))
		}
		return out
	}
	mentions := func(why string, words []string) bool {
		why = strings.ToLower(why)
		for _, w := range words {
			if w != "" && strings.Contains(why, w) {
				return true
			}
		}
		return false
	}
	for _, r := range b.Population.MinTotal {
		words, first := names(r.Indicator), fmt.Sprint(b.Year-r.Years+1)
		rules = append(rules, func(why string) bool {
			return mentions(why, words) && strings.Contains(why, first) && (strings.HasPrefix(why, "no ") || strings.Contains(why, " over "))
		})
	}
	for _, r := range b.Population.MaxValue {
		words, in := names(r.Indicator), fmt.Sprintf(" in %d is ", b.Year)
		rules = append(rules, func(why string) bool { return mentions(why, words) && strings.Contains(why, in) })
	}
	for _, a := range b.Population.Require {
		field := "register field " + a + " "
		rules = append(rules, func(why string) bool { return strings.Contains(why, field) })
	}
	if len(rules) != len(pop.Rules) {
		return nil, false
	}
	counts = make([]int, len(rules))
	for _, reasons := range pop.Excluded {
		next := 0
		for _, why := range reasons {
			for next < len(rules) && !rules[next](why) {
				next++
			}
			if next == len(rules) {
				return nil, false
			}
			counts[next]++
			next++
		}
	}
	return counts, true
}
