package narrative

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"
	"unicode"

	"peerpack/internal/diag"
	"peerpack/internal/figures"
	"peerpack/internal/format"
)

// Verify re-reads every sentence of a commentary against the figures
// model: each cited figure must exist, and every number printed in the
// sentence must be one of its cited figures printed the way package format
// prints it (value with the indicator's decimals and unit, a rank as an
// ordinal or its band, a count, a percentile as an ordinal, a year of a
// cited figure), or one of the method thresholds the sentence declares.
// Digits inside names (groups, institutions, countries, indicator labels,
// judgement notes) are not numbers. Every claim a sentence records must
// hold in the model (claims.go). It returns every problem found.
func Verify(m *figures.Model, c *Commentary) error {
	if m == nil || c == nil {
		return fmt.Errorf("internal error: nothing to verify")
	}
	w := c.wording
	if w == nil {
		w = english{}
	}
	names := verifyNames(m, w)
	var probs diag.List
	for _, s := range c.Sentences {
		text := s.Text
		for _, n := range names {
			text = strings.ReplaceAll(text, n, " ")
		}
		var forms []string
		for _, k := range s.Cites {
			r, ok := m.Lookup(k)
			if !ok {
				probs.Add(fmt.Errorf("commentary (%s): the sentence %q cites %s, which the figures model does not have", s.Part, s.Text, k))
				continue
			}
			forms = append(forms, renderings(m, r, c.rankBands)...)
		}
		for _, t := range s.Thresholds {
			forms = append(forms, format.Number(t, 0))
		}
		sort.SliceStable(forms, func(i, j int) bool { return len(forms[i]) > len(forms[j]) })
		for _, f := range forms {
			text = removeNumber(text, f)
		}
		for _, err := range verifyClaims(m, s) {
			probs.Add(err)
		}
		if n := firstNumber(text); n != "" {
			probs.Add(fmt.Errorf("commentary (%s): the sentence %q prints %q, which none of its cited figures (%s) gives", s.Part, s.Text, n, keyList(s.Cites)))
		}
	}
	return probs.Err()
}

func keyList(ks []figures.Key) string {
	s := make([]string, len(ks))
	for i, k := range ks {
		s[i] = k.String()
	}
	if len(s) == 0 {
		return "none"
	}
	return strings.Join(s, ", ")
}

// verifyNames lists the names a sentence may contain, longest first so a
// name containing another is removed whole.
func verifyNames(m *figures.Model, w Wording) []string {
	set := map[string]bool{}
	add := func(s string) {
		if s = strings.TrimSpace(s); s != "" && strings.IndexFunc(s, unicode.IsDigit) >= 0 {
			set[s] = true
		}
	}
	for _, g := range m.Groups {
		add(g.Name)
		add(g.EachValue)
		add(w.GroupPhrase(g))
	}
	reg := m.Data.Register
	for _, i := range m.Named {
		in := reg.Institutions[i]
		add(in.Name)
		add(in.Country)
		if s, ok := in.Attr("short_name"); ok {
			add(s)
		}
	}
	for _, in := range reg.Institutions {
		add(in.Country)
		// Clusters and nearest profiles name institutions beyond the
		// tracked ones; a digit in a name is not a number.
		add(in.Name)
	}
	if m.CompositeSpec != nil {
		for _, p := range m.CompositeSpec.Pillars {
			add(p.Label)
		}
	}
	for _, ind := range m.Data.Dictionary.Indicators {
		add(ind.Label)
		add(w.Indicator(ind))
		add(ind.Judgement)
		add(lowerFirst(ind.Judgement))
	}
	for ref, note := range m.Data.Notes {
		if ref.Institution == m.Focus {
			add(note)
		}
	}
	out := make([]string, 0, len(set))
	for s := range set {
		out = append(out, s)
	}
	sort.Slice(out, func(i, j int) bool {
		if len(out[i]) != len(out[j]) {
			return len(out[i]) > len(out[j])
		}
		return out[i] < out[j]
	})
	return out
}

// renderings are the ways a sentence may print a figure.
func renderings(m *figures.Model, r figures.Row, bands int) []string {
	if r.IsText {
		return nil
	}
	var out []string
	if r.Year != 0 {
		out = append(out, strconv.Itoa(r.Year))
	}
	if r.Section == figures.SectionComposite {
		return append(out, compositeRenderings(m, r, bands)...)
	}
	if r.Section == figures.SectionPeers {
		return append(out, peersRenderings(m, r)...)
	}
	if r.Section == figures.SectionSystem {
		return append(out, systemRenderings(m, r)...)
	}
	v := r.Value
	ind, hasInd := m.Indicator(r.Indicator)
	whole := int(math.Round(v))
	switch r.Measure {
	case "value", "median", "q1", "q3", "min", "max", "mean", "start_value", "end_value", "median_start", "median_end", figures.MeasureTargetRankValue:
		if hasInd {
			out = append(out, format.Value(ind, v), format.Number(v, ind.Decimals))
		}
	case "gap_median", "gap_better_quartile", "vs_median", "vs_better_quartile", "change", "median_change", "iqr", "sd", figures.MeasureTargetRankGap, figures.MeasureLargestStep:
		if hasInd {
			out = append(out, format.Difference(ind, v), format.Number(math.Abs(v), ind.Decimals), format.Value(ind, math.Abs(v)))
		}
	case "ties":
		// "joint 4th with 2 others": the others, or all who share.
		out = append(out, format.Int(whole-1), format.Int(whole))
	case "skewness":
		out = append(out, format.Number(v, 1), format.Number(math.Abs(v), 1))
	case "pearson", "spearman":
		out = append(out, format.Number(v, 2), format.Number(math.Abs(v), 2))
	case "rank", figures.MeasureTargetRank, "panel_start_rank", "panel_end_rank":
		out = append(out, format.Rank(whole, bands), format.Ordinal(whole), format.Int(whole))
	case "of", "n", "missing", "n_members", "start_of", "end_of", "start_n", "end_n", "panel_of":
		out = append(out, format.Int(whole))
	case "percentile":
		p := format.PercentileRank(v)
		out = append(out, format.Ordinal(p), format.Int(p))
	case "percentile_change", "rank_change":
		out = append(out, format.Int(int(math.Abs(format.Round(v, 0)))))
	case "start_year", "end_year", "median_start_year", "median_end_year":
		out = append(out, strconv.Itoa(whole))
	}
	return out
}

func isDigit(b byte) bool { return b >= '0' && b <= '9' }

// removeNumber blanks every occurrence of a printed number that stands on
// its own: not part of a longer run of digits, decimals or separators.
func removeNumber(text, num string) string {
	if num == "" {
		return text
	}
	var b strings.Builder
	for {
		i := strings.Index(text, num)
		if i < 0 {
			b.WriteString(text)
			return b.String()
		}
		j := i + len(num)
		if boundaryBefore(text, i) && boundaryAfter(text, j) {
			b.WriteString(text[:i])
			b.WriteString(" ")
		} else {
			b.WriteString(text[:i+1])
			j = i + 1
		}
		text = text[j:]
	}
}

func boundaryBefore(s string, i int) bool {
	if i == 0 {
		return true
	}
	if isDigit(s[i-1]) {
		return false
	}
	if (s[i-1] == '.' || s[i-1] == ',') && i >= 2 && isDigit(s[i-2]) {
		return false
	}
	return true
}

func boundaryAfter(s string, j int) bool {
	if j >= len(s) {
		return true
	}
	if isDigit(s[j]) {
		return false
	}
	if (s[j] == '.' || s[j] == ',') && j+1 < len(s) && isDigit(s[j+1]) {
		return false
	}
	return true
}

// firstNumber returns the first run of digits (with separators) left in
// the text, or "".
func firstNumber(text string) string {
	for i := 0; i < len(text); i++ {
		if !isDigit(text[i]) {
			continue
		}
		j := i
		for j < len(text) && (isDigit(text[j]) || ((text[j] == '.' || text[j] == ',') && j+1 < len(text) && isDigit(text[j+1]))) {
			j++
		}
		return text[i:j]
	}
	return ""
}
