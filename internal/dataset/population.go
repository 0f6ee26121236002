package dataset

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"peerpack/internal/yamlx"
)

// population applies the brief's rules. An institution is excluded by any
// rule it fails; the reasons are kept in rule order. A max_value rule
// cannot be checked without a value in the brief's year, so such an
// institution stays in and is counted as unchecked.
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
	// exclude charges the exclusion to the rule being applied, the last
	// one described in p.Rules.
	exclude := func(inst int, why string) {
		p.Included[inst] = false
		p.Excluded[inst] = append(p.Excluded[inst], why)
		for len(p.RuleExcluded) < len(p.Rules) {
			p.RuleExcluded = append(p.RuleExcluded, 0)
		}
		p.RuleExcluded[len(p.Rules)-1]++
	}
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
		in := dict.Indicators[ind]
		first := b.Year - r.Years + 1
		label := runningText(in)
		rule := fmt.Sprintf("%s summed over %s of at least %s", label, yearRange(first, b.Year), num(r.AtLeast, in.Decimals))
		if r.Years == 1 {
			rule = fmt.Sprintf("%s in %d of at least %s", label, b.Year, num(r.AtLeast, in.Decimals))
		}
		p.Rules = append(p.Rules, rule)
		for inst := 0; inst < n; inst++ {
			sum, seen := 0.0, 0
			for y := first; y <= b.Year; y++ {
				if v, ok := d.Value(ind, inst, y); ok {
					sum += v
					seen++
				}
			}
			switch {
			case seen == 0:
				exclude(inst, fmt.Sprintf("no value of %s in %s", label, yearRange(first, b.Year)))
			case sum < r.AtLeast:
				exclude(inst, fmt.Sprintf("%s summed over %s is %s, below %s", label, yearRange(first, b.Year), num(sum, in.Decimals), num(r.AtLeast, in.Decimals)))
			}
		}
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
		in := dict.Indicators[ind]
		label := runningText(in)
		p.Rules = append(p.Rules, fmt.Sprintf("%s in %d of at most %s", label, b.Year, num(r.AtMost, in.Decimals)))
		for inst := 0; inst < n; inst++ {
			v, ok := d.Value(ind, inst, b.Year)
			if !ok {
				out.Unchecked++
				continue
			}
			if v > r.AtMost {
				exclude(inst, fmt.Sprintf("%s in %d is %s, above %s", label, b.Year, num(v, max(in.Decimals, 2)), num(r.AtMost, max(in.Decimals, 2))))
			}
		}
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
		p.Rules = append(p.Rules, fmt.Sprintf("a value in the register's %s column", attr))
		for inst, in := range d.Register.Institutions {
			if v, _ := in.Attr(attr); strings.TrimSpace(v) == "" {
				exclude(inst, fmt.Sprintf("register field %s is empty", attr))
			}
		}
	}
	for len(p.RuleExcluded) < len(p.Rules) {
		p.RuleExcluded = append(p.RuleExcluded, 0)
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
