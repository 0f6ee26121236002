package layout

import (
	"fmt"
	"strings"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
)

// coverage states how many institutions count and how complete each
// indicator the pack shows is, in the first group the focus belongs to.
func (w *writer) coverage() {
	w.sectionHeading("Coverage", 2)
	d := w.m.Data
	n := d.Register.Len()
	ranked := n
	if d.Population != nil {
		ranked = 0
		for _, ok := range d.Population.Included {
			if ok {
				ranked++
			}
		}
	}
	s := fmt.Sprintf("The register holds %s institutions, of which %s form the ranked population", format.Int(n), format.Int(ranked))
	if d.Population != nil && len(d.Population.Rules) > 0 {
		rules := make([]string, len(d.Population.Rules))
		for i, r := range d.Population.Rules {
			rules[i] = lowerFirst(r)
		}
		s += " under these rules: " + strings.Join(rules, "; ")
	}
	s += fmt.Sprintf(". Positions are for %d", w.m.Year)
	if w.m.First != w.m.Last {
		s += fmt.Sprintf(" and trends run from %d to %d", w.m.First, w.m.Last)
	}
	s += ". An institution without a value for an indicator is left out of that indicator's distribution and ranks, not counted as zero."
	w.plain(s)
	gr := w.coverageGroup()
	if gr == nil {
		return
	}
	shown := w.packIndicators()
	g := grid{
		head:    []string{"Indicator", "Unit", "Better", "Source", "Reporting", "Missing"},
		align:   []byte{'L', 'L', 'L', 'L', 'R', 'R'},
		caption: fmt.Sprintf("Indicators of this pack and their coverage in %s, %d", gr.Name, w.m.Year),
	}
	dict := d.Dictionary
	left := 0
	for _, ind := range dict.Indicators {
		if !shown[ind.Key] {
			left++
			continue
		}
		src := orDash(ind.Source)
		if ind.Derive != "" && strings.TrimSpace(ind.Source) == "" {
			src = "derived: " + deriveWords(ind.Derive, dict)
		}
		row := []cell{{text: indicatorLabel(ind, false)}, {text: string(ind.Unit)}, {text: betterWords(ind.Better)}, {text: src}}
		if dist, ok := w.m.Distribution(gr.Name, ind.Key, w.m.Year); ok {
			row = append(row, cell{text: format.Int(dist.N)}, cell{text: format.Int(dist.Missing)})
		} else {
			row = append(row, cell{text: "–"}, cell{text: "–"})
		}
		g.rows = append(g.rows, row)
	}
	if left > 0 {
		g.notes = append(g.notes, fmt.Sprintf("The dictionary defines %s further %s that this pack does not show.", format.Int(left), format.Plural(left, "indicator", "indicators")))
	}
	if d.PPP != nil && len(d.PPP.Converted) > 0 {
		var labels []string
		for _, k := range d.PPP.Converted {
			if ind, ok := dict.Lookup(k); ok {
				labels = append(labels, lowerFirst(ind.Label))
			} else {
				labels = append(labels, k)
			}
		}
		g.notes = append(g.notes, "Money amounts ("+strings.Join(labels, ", ")+") are converted from local currency to international dollars at purchasing-power parity (PPP$) for each country and year.")
	}
	w.setTable(g)
}

// coverageGroup is the group the coverage table counts in: the first the
// focus belongs to (its home comparison), else the brief's first group.
func (w *writer) coverageGroup() *figures.Group {
	for _, g := range w.m.Groups {
		if g.FocusIn {
			return g
		}
	}
	if len(w.m.Groups) > 0 {
		return w.m.Groups[0]
	}
	return nil
}

// packIndicators are the indicators the pack shows: those its charts,
// tables, commentary, inline figures and nearest-peer groups name. A block
// that names none stands for the dictionary as its kind reads it (a peers
// table its first six, a population table and a systems table without
// indicators none; a commentary block on
// caveats alone writes about no indicator's figures).
func (w *writer) packIndicators() map[string]bool {
	dict := w.m.Data.Dictionary
	out := map[string]bool{}
	all := func(limit int) {
		for i, ind := range dict.Indicators {
			if limit > 0 && i >= limit {
				break
			}
			out[ind.Key] = true
		}
	}
	add := func(keys []string) {
		for _, k := range keys {
			out[k] = true
		}
	}
	for _, blk := range w.b.Blocks {
		switch v := blk.(type) {
		case *brief.ChartBlock:
			add(v.Indicators)
		case *brief.TableBlock:
			switch {
			case v.Type == "population", v.Type == "definitions":
			case v.Type == "systems" && len(v.Indicators) == 0:
				// Counts of institutions only (systemstable.go).
			case len(v.Indicators) > 0:
				add(v.Indicators)
			case v.Type == "peers":
				all(6)
			default:
				all(0)
			}
		case *brief.CommentaryBlock:
			switch {
			case len(v.Indicators) > 0:
				add(v.Indicators)
			case len(v.Topics) == 1 && v.Topics[0] == "caveats":
			default:
				all(0)
			}
		}
	}
	for _, g := range w.b.Groups {
		if g.Nearest != nil {
			add(g.Nearest.Indicators)
		}
	}
	if ps, err := brief.Placeholders(w.b); err == nil {
		for _, p := range ps {
			if p.Indicator != "" {
				out[p.Indicator] = true
			}
		}
	}
	return out
}

// deriveWords reads a derive: expression with the indicators' short
// labels in place of their keys and × for * ("research_income per
// academic_fte" becomes "research income per academic FTE"), so a reader
// of the pack sees what was divided by what.
func deriveWords(expr string, dict *dataset.Dictionary) string {
	var b strings.Builder
	isID := func(c byte) bool {
		return c == '_' || c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c >= '0' && c <= '9'
	}
	for i := 0; i < len(expr); {
		if expr[i] == '*' {
			b.WriteString("×")
			i++
			continue
		}
		if !isID(expr[i]) || expr[i] >= '0' && expr[i] <= '9' {
			j := i + 1
			if expr[i] >= '0' && expr[i] <= '9' {
				for j < len(expr) && (isID(expr[j]) || expr[j] == '.') {
					j++
				}
			}
			b.WriteString(expr[i:j])
			i = j
			continue
		}
		j := i
		for j < len(expr) && isID(expr[j]) {
			j++
		}
		word := expr[i:j]
		if ind, ok := dict.Lookup(word); ok {
			word = lowerFirst(ind.Short)
			if word == "" {
				word = lowerFirst(ind.Label)
			}
		}
		b.WriteString(word)
		i = j
	}
	return strings.Join(strings.Fields(b.String()), " ")
}

// lowerFirst lower-cases a label's first letter for use inside a sentence,
// unless the label starts with an abbreviation ("FNCI", "PhD").
func lowerFirst(s string) string {
	if len(s) < 2 || s[0] < 'A' || s[0] > 'Z' || s[1] < 'a' || s[1] > 'z' {
		return s
	}
	return string(s[0]+'a'-'A') + s[1:]
}
