package layout

import (
	"errors"
	"fmt"
	"strings"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/diag"
	"peerpack/internal/figures"
	"peerpack/internal/format"
	"peerpack/internal/yamlx"
)

// CheckPlaceholders finds every inline figure of the brief and resolves it
// against the model, so that `peerpack check` reports an unknown measure,
// indicator, group, institution or year with its line and column before a
// build is attempted.
func CheckPlaceholders(b *brief.Brief, m *figures.Model) error {
	ps, err := brief.Placeholders(b)
	var l diag.List
	l.Add(err)
	// A placeholder the brief already refused (an undefined group) is
	// reported once, by the brief, not again by the model.
	reported := map[brief.Pos]bool{}
	for _, e := range l.Items {
		var pr *diag.Problem
		if errors.As(e, &pr) {
			reported[brief.Pos{Line: pr.Line, Column: pr.Column}] = true
		}
	}
	for _, p := range ps {
		if reported[p.Pos] {
			continue
		}
		if _, e := resolvePlaceholder(b, m, p); e != nil {
			l.Addf(b.File, p.Pos.Line, p.Pos.Column, "%v", e)
		}
	}
	return l.Err()
}

func (w *writer) resolve(p brief.Placeholder) (string, error) {
	return resolvePlaceholder(w.b, w.m, p)
}

// resolvePlaceholder prints the figure a placeholder names, reading it from
// the model and formatting it with package format, so that the text shows
// the same digits as the tables and charts.
func resolvePlaceholder(b *brief.Brief, m *figures.Model, p brief.Placeholder) (string, error) {
	inst := m.Focus
	if p.Institution != "" {
		inst = m.Data.Register.Index(p.Institution)
		if inst < 0 {
			msg := fmt.Sprintf("placeholder %s names institution %q, which is not in the register", p.Raw, p.Institution)
			ids := make([]string, 0, m.Data.Register.Len())
			for _, in := range m.Data.Register.Institutions {
				ids = append(ids, in.ID)
			}
			if s := yamlx.Nearest(p.Institution, ids); s != "" {
				msg += fmt.Sprintf("; did you mean %q?", s)
			}
			return "", fmt.Errorf("%s", msg)
		}
	}
	if p.Measure == "name" {
		return m.Data.Register.Institutions[inst].Name, nil
	}
	g, err := placeholderGroup(m, p)
	if err != nil {
		return "", err
	}
	if p.Measure == "members" {
		return format.Int(len(g.Members)), nil
	}
	ind, ok := m.Indicator(p.Indicator)
	if !ok {
		msg := fmt.Sprintf("placeholder %s names indicator %q, which the dictionary does not define", p.Raw, p.Indicator)
		if s := yamlx.Nearest(p.Indicator, m.Data.Dictionary.Keys()); s != "" {
			msg += fmt.Sprintf("; did you mean %q?", s)
		}
		return "", fmt.Errorf("%s", msg)
	}
	year := p.Year
	if year == 0 {
		year = m.Year
	}
	if m.Data.YearIndex(year) < 0 {
		return "", fmt.Errorf("placeholder %s asks for %d, a year the data does not hold (years %s)", p.Raw, year, yearList(m.Data.Years))
	}
	if err := quarterBelowFloor(m, p, g, ind, year); err != nil {
		return "", err
	}
	switch p.Measure {
	case "value":
		v, _ := m.Data.Value(m.Data.Dictionary.Index(ind.Key), inst, year)
		return format.Value(ind, v), nil
	case "rank", "percentile", "quartile", "z", "gap":
		pos, ok := m.PlaceOf(g.Name, ind.Key, inst, year)
		if !ok || !pos.HasValue {
			return "–", nil
		}
		switch p.Measure {
		case "rank":
			return format.Rank(pos.Rank, b.RankBands) + " of " + format.Int(pos.Of), nil
		case "percentile":
			return format.Percentile(pos.Percentile), nil
		case "quartile":
			return quartileWords(pos.Quartile), nil
		case "z":
			return format.SignedNumber(pos.Z, 2), nil
		default:
			return format.Difference(ind, pos.GapMedian), nil
		}
	case "median", "q1", "q3", "mean", "min", "max", "count":
		d, ok := m.Distribution(g.Name, ind.Key, year)
		if !ok {
			return "–", nil
		}
		switch p.Measure {
		case "median":
			return format.Value(ind, d.Median), nil
		case "q1":
			return format.Value(ind, d.Q1), nil
		case "q3":
			return format.Value(ind, d.Q3), nil
		case "mean":
			return format.Value(ind, d.Mean), nil
		case "min":
			return format.Value(ind, d.Min), nil
		case "max":
			return format.Value(ind, d.Max), nil
		default:
			return format.Int(d.N), nil
		}
	case "change", "change_pct":
		if p.Year != 0 {
			return "", fmt.Errorf("placeholder %s: change runs over the brief's years [%d, %d]; leave out \"for %d\"", p.Raw, m.First, m.Last, p.Year)
		}
		t, ok := m.Trend(g.Name, ind.Key, inst)
		if !ok {
			return "", fmt.Errorf("placeholder %s: change is recorded for the focus and the institutions listed under named; add %s to named", p.Raw, m.InstitutionID(inst))
		}
		if !t.Valid {
			return "–", nil
		}
		if p.Measure == "change" {
			return format.SignedValue(ind, t.Change), nil
		}
		return format.SignedPercent(t.ChangePct), nil
	}
	return "", fmt.Errorf("placeholder %s: measure %q is not available", p.Raw, p.Measure)
}

// quarterMeasures are the inline measures that read a group's quarters:
// below the small-group floor the pack prints ranks only, in text as in
// tables, so these are refused there.
var quarterMeasures = map[string]bool{"percentile": true, "quartile": true, "q1": true, "q3": true}

// quarterBelowFloor refuses a percentile, quarter or quartile of a group
// whose distribution has fewer values than the brief's small-group floor,
// saying what to write instead.
func quarterBelowFloor(m *figures.Model, p brief.Placeholder, g *figures.Group, ind dataset.Indicator, year int) error {
	if !quarterMeasures[p.Measure] {
		return nil
	}
	d, ok := m.Distribution(g.Name, ind.Key, year)
	if !ok || !m.BelowFloor(d) {
		return nil
	}
	// The measure is the placeholder's first word: the suggestions keep
	// the rest as written.
	rank, median := strings.Replace(p.Raw, p.Measure, "rank", 1), strings.Replace(p.Raw, p.Measure, "median", 1)
	instead := rank + " or " + median
	if p.Measure == "q1" || p.Measure == "q3" {
		instead = median + " or " + rank
	}
	return fmt.Errorf("placeholder %s: only %s members of %s report %s in %d, fewer than the small-group floor of %d, where the pack prints ranks only, no quarters or percentiles; write %s instead, or lower small_group in the front matter", p.Raw, format.Int(d.N), g.Name, ind.Key, year, m.Floor, instead)
}

func placeholderGroup(m *figures.Model, p brief.Placeholder) (*figures.Group, error) {
	if p.Group == "" {
		if len(m.Groups) == 0 {
			return nil, fmt.Errorf("placeholder %s needs a comparison group, and the brief defines none", p.Raw)
		}
		return m.Groups[0], nil
	}
	if g, ok := m.Group(p.Group); ok {
		return g, nil
	}
	if gs := m.GroupsOf(p.Group); len(gs) > 0 {
		names := make([]string, len(gs))
		for i, g := range gs {
			names[i] = `"` + g.Name + `"`
		}
		return nil, fmt.Errorf("placeholder %s: %q stands for several groups; name one of %s", p.Raw, p.Group, strings.Join(names, ", "))
	}
	names := make([]string, len(m.Groups))
	for i, g := range m.Groups {
		names[i] = g.Name
	}
	msg := fmt.Sprintf("placeholder %s names group %q, which the brief does not define", p.Raw, p.Group)
	if s := yamlx.Nearest(p.Group, names); s != "" {
		msg += fmt.Sprintf("; did you mean %q?", s)
	}
	return nil, fmt.Errorf("%s", msg)
}

func yearList(ys []int) string {
	if len(ys) == 0 {
		return "none"
	}
	return fmt.Sprintf("%d–%d", ys[0], ys[len(ys)-1])
}
