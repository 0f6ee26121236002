package dataset

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"peerpack/internal/brief"
	"peerpack/internal/yamlx"
)

// population applies the brief's rules. An institution is excluded by any
// rule it fails; the reasons are kept in rule order. A max_value rule
// cannot be checked without a value in the brief's year, so such an
// institution stays in and is counted as unchecked.
//
// The rules are applied as of the brief's year and, unless the brief fixes
// the panel (earlier_years: fixed), as of every other year of the data
// too, each with windows ending that year (see ruleSet.excludes), so an
// earlier year's figures rank the institutions that met the rules then.
func (l *loader) population(d *Dataset) {
	spec := l.b.Population
	if spec == nil {
		return
	}
	b := l.b
	dict := d.Dictionary
	n := d.Register.Len()
	p := &Population{Included: make([]bool, n), Excluded: map[int][]string{}}
	for i := range p.Included {
		p.Included[i] = true
	}
	out := &PopulationOutcome{}
	indicator := func(key string, line, col int) int {
		i := dict.Index(key)
		if i < 0 {
			msg := fmt.Sprintf("population rule names indicator %q, which is not in the dictionary (%s)", key, dict.File)
			if s := yamlx.Nearest(key, dict.Keys()); s != "" {
				msg += fmt.Sprintf("; did you mean %q?", s)
			}
			l.probs.Addf(b.File, line, col, "%s", msg)
		}
		return i
	}
	var rules ruleSet
	for _, r := range spec.MinTotal {
		ind := indicator(r.Indicator, r.Pos.Line, r.Pos.Column)
		if r.Years < 1 {
			l.probs.Addf(b.File, r.Pos.Line, r.Pos.Column, "min_total of %q needs years: 1 or more (the span summed, ending at the brief's year %d)", r.Indicator, b.Year)
			continue
		}
		if math.IsNaN(r.AtLeast) || math.IsInf(r.AtLeast, 0) {
			l.probs.Addf(b.File, r.Pos.Line, r.Pos.Column, "min_total of %q needs at_least: a number (found %v); write the smallest total to keep, e.g. at_least: 600", r.Indicator, r.AtLeast)
			continue
		}
		if ind < 0 {
			continue
		}
		rules = append(rules, popRule{kind: ruleMinTotal, ind: ind, in: dict.Indicators[ind], years: r.Years, limit: r.AtLeast})
	}
	for _, r := range spec.MaxValue {
		ind := indicator(r.Indicator, r.Pos.Line, r.Pos.Column)
		if math.IsNaN(r.AtMost) || math.IsInf(r.AtMost, 0) {
			l.probs.Addf(b.File, r.Pos.Line, r.Pos.Column, "max_value of %q needs at_most: a number (found %v); write the largest value to keep, e.g. at_most: 80", r.Indicator, r.AtMost)
			continue
		}
		if ind < 0 {
			continue
		}
		rules = append(rules, popRule{kind: ruleMaxValue, ind: ind, in: dict.Indicators[ind], limit: r.AtMost})
	}
	for _, attr := range spec.Require {
		if !d.Register.HasAttr(attr) {
			pos := b.PosOf("population.require")
			msg := fmt.Sprintf("population requires register column %q, which %s does not have", attr, d.Register.File)
			if s := yamlx.Nearest(attr, d.Register.AttrNames); s != "" {
				msg += fmt.Sprintf("; did you mean %q?", s)
			} else if len(d.Register.AttrNames) > 0 {
				msg += fmt.Sprintf("; its extra columns are %s", strings.Join(d.Register.AttrNames, ", "))
			} else {
				msg += "; add the column to the register or remove it from require:"
			}
			l.probs.Addf(b.File, pos.Line, pos.Column, "%s", msg)
			continue
		}
		rules = append(rules, popRule{kind: ruleRequire, attr: attr})
	}
	p.Rules = rules.texts(d, b.Year)
	p.RuleExcluded = make([]int, len(rules))
	for ri, r := range rules {
		for inst := 0; inst < n; inst++ {
			why, unchecked := r.excludes(d, inst, b.Year)
			if unchecked {
				out.Unchecked++
			}
			if why == "" {
				continue
			}
			p.Included[inst] = false
			p.Excluded[inst] = append(p.Excluded[inst], why)
			p.RuleExcluded[ri]++
		}
	}
	p.Fixed = spec.EarlierYears == brief.EarlierFixed
	if !p.Fixed && len(rules) > 0 {
		p.ByYear = map[int][]bool{}
		p.YearRules = map[int][]string{}
		for _, y := range d.Years {
			if y == b.Year {
				continue
			}
			in := make([]bool, n)
			for inst := range in {
				in[inst] = true
				for _, r := range rules {
					if why, _ := r.excludes(d, inst, y); why != "" {
						in[inst] = false
						break
					}
				}
			}
			p.ByYear[y] = in
			p.YearRules[y] = rules.texts(d, y)
		}
	}
	d.Population = p
	out.Rules = p.Rules
	for inst, ok := range p.Included {
		if ok {
			out.Included++
			continue
		}
		in := d.Register.Institutions[inst]
		out.Excluded = append(out.Excluded, Exclusion{ID: in.ID, Name: in.Name, Reasons: p.Excluded[inst]})
	}
	if f := d.Register.Index(b.Focus); f >= 0 && !p.Included[f] {
		out.FocusExcluded = true
	}
	l.rep.Population = out
	if out.Included == 0 && n > 0 && len(p.Rules) > 0 {
		// No statistic exists for an empty population: a rank "0th of 0"
		// or a percentile of an empty group would be nonsense.
		pos := b.PosOf("population")
		l.probs.Addf(b.File, pos.Line, pos.Column, "the population rules leave no institution of the %s in the register to rank: %s; loosen a rule or remove it", thousands(n), ruleCounts(p))
	}
}

// Kinds of population rule.
const (
	ruleMinTotal = iota
	ruleMaxValue
	ruleRequire
)

// popRule is one checked population rule of the brief.
type popRule struct {
	kind  int
	ind   int       // dictionary position (min_total, max_value)
	in    Indicator // its entry
	years int       // min_total's window
	limit float64   // at_least or at_most
	attr  string    // require's register column
}

type ruleSet []popRule

// texts describes every rule as of a year, in rule order.
func (rs ruleSet) texts(d *Dataset, year int) []string {
	out := make([]string, len(rs))
	for i, r := range rs {
		out[i] = r.text(d, year)
	}
	return out
}

// window returns the years a min_total rule sums as of a year: the
// window of r.years ending that year, cut to the years the data hold,
// with the threshold scaled to the years kept. A window that reaches back
// before the data (2020 under a three-year rule on data from 2020) would
// otherwise ask one year's output to reach three years' total; the scaled
// threshold asks the same output a year (common practice, no source).
func (r popRule) window(d *Dataset, year int) (first int, held int, atLeast float64) {
	first = year - r.years + 1
	for _, y := range d.Years {
		if y >= first && y <= year {
			held++
		}
	}
	if len(d.Years) > 0 && first < d.Years[0] && held > 0 {
		first = d.Years[0]
		return first, held, r.limit * float64(held) / float64(r.years)
	}
	return first, held, r.limit
}

// text describes the rule as of a year; a scaled window says so.
func (r popRule) text(d *Dataset, year int) string {
	switch r.kind {
	case ruleMinTotal:
		label := runningText(r.in)
		first, held, atLeast := r.window(d, year)
		var s string
		if first == year {
			s = fmt.Sprintf("%s in %d of at least %s", label, year, num(atLeast, r.in.Decimals))
		} else {
			s = fmt.Sprintf("%s summed over %s of at least %s", label, yearRange(first, year), num(atLeast, r.in.Decimals))
		}
		if atLeast != r.limit {
			s += fmt.Sprintf(" (%s over %d years, scaled to the %s the data hold)", num(r.limit, r.in.Decimals), r.years, yearsWord(held))
		}
		return s
	case ruleMaxValue:
		return fmt.Sprintf("%s in %d of at most %s", runningText(r.in), year, num(r.limit, r.in.Decimals))
	}
	return fmt.Sprintf("a value in the register's %s column", r.attr)
}

// excludes says why institution inst fails the rule as of a year ("" when
// it passes); unchecked is set when a max_value rule has no value to
// check, which keeps the institution in.
func (r popRule) excludes(d *Dataset, inst, year int) (why string, unchecked bool) {
	switch r.kind {
	case ruleMinTotal:
		label := runningText(r.in)
		first, _, atLeast := r.window(d, year)
		sum, seen := 0.0, 0
		for y := first; y <= year; y++ {
			if v, ok := d.Value(r.ind, inst, y); ok {
				sum += v
				seen++
			}
		}
		switch {
		case seen == 0:
			return fmt.Sprintf("no value of %s in %s", label, yearRange(first, year)), false
		case sum < atLeast:
			return fmt.Sprintf("%s summed over %s is %s, below %s", label, yearRange(first, year), num(sum, r.in.Decimals), num(atLeast, r.in.Decimals)), false
		}
	case ruleMaxValue:
		v, ok := d.Value(r.ind, inst, year)
		if !ok {
			return "", true
		}
		if v > r.limit {
			label := runningText(r.in)
			return fmt.Sprintf("%s in %d is %s, above %s", label, year, num(v, max(r.in.Decimals, 2)), num(r.limit, max(r.in.Decimals, 2))), false
		}
	case ruleRequire:
		if v, _ := d.Register.Institutions[inst].Attr(r.attr); strings.TrimSpace(v) == "" {
			return fmt.Sprintf("register field %s is empty", r.attr), false
		}
	}
	return "", false
}

// yearsWord says "one year" or "2 years".
func yearsWord(n int) string {
	if n == 1 {
		return "one year"
	}
	return fmt.Sprintf("%d years", n)
}

// ruleCounts says how many each rule left out, in rule order.
func ruleCounts(p *Population) string {
	parts := make([]string, len(p.Rules))
	for i, r := range p.Rules {
		parts[i] = fmt.Sprintf("%q left out %s", r, thousands(p.RuleExcluded[i]))
	}
	s := strings.Join(parts, ", ")
	if len(parts) > 1 {
		s += " (an institution failing several rules counts under each)"
	}
	return s
}

// num prints a rule threshold or total with thousands separators
// ("1,000"), as the pack prints numbers. internal/format, the one place
// numbers are formatted for the pack, imports this package, so rule texts
// use the package's own thousands helper (report.go).
func num(v float64, decimals int) string {
	if math.IsNaN(v) {
		return "missing"
	}
	s := strconv.FormatFloat(v, 'f', decimals, 64)
	if v == math.Trunc(v) && math.Abs(v) < 1e15 {
		s = strconv.FormatFloat(v, 'f', 0, 64)
	}
	whole, frac, hasFrac := strings.Cut(s, ".")
	n, err := strconv.ParseInt(whole, 10, 64)
	if err != nil {
		return s
	}
	out := thousands(int(n))
	if n == 0 && strings.HasPrefix(whole, "-") {
		out = "-0"
	}
	if hasFrac {
		out += "." + frac
	}
	return out
}

// yearRange prints a span of years with an en dash, as running text
// writes ranges ("2021–2025"; common practice, no source).
func yearRange(first, last int) string {
	return strconv.Itoa(first) + "\u2013" + strconv.Itoa(last)
}

// runningText is an indicator's label as running text reads it; see
// Indicator.RunningLabel.
func runningText(ind Indicator) string { return ind.RunningLabel() }
