package layout

import (
	"fmt"
	"sort"
	"strconv"
	"strings"

	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
	"peerpack/internal/narrative"
)

// methodologyAppendix writes the methodology annex a consultant's report
// carries, every statement drawn from the brief, the dictionary and the
// figures model: the indicators with their sources and definitions, how
// the groups were formed, who is counted, the PPP conversion, how each
// statistic is computed, coverage, weights and the limits of the figures.
func (w *writer) methodologyAppendix(sc appendixScope) {
	w.annexIndicators(sc)
	w.annexGroups(sc)
	w.annexPopulation()
	w.annexMoney(sc)
	// The one statement of how each figure is computed, shared with the
	// closing notes.
	w.definitions()
	w.annexCoverage(sc)
	w.annexWeights()
	w.annexLimits(sc)
}

// annexSize is the type size of the annex's reference paragraphs: a
// little below the body, as a reference section usually is.
func (w *writer) annexSize() float64 { return w.st.size - 0.5 }

// annexIndicators lists each indicator in scope under its pillar with its
// definition, source, unit, printed decimals, polarity and, where the
// dictionary records one, why its direction is a value judgement.
func (w *writer) annexIndicators(sc appendixScope) {
	dict := w.m.Data.Dictionary
	w.annexHeading("Indicators and sources", keepWithNext)
	w.plain(fmt.Sprintf("The pack uses %s %s of the dictionary %s. Each is listed with its definition and source, its unit, the decimals it is printed with and the direction counted as better; ranks run in that direction, 1 being best, and neutral indicators rank from the highest value with no judgement implied.",
		format.Int(len(sc.indicators)), format.Plural(len(sc.indicators), "indicator", "indicators"), dict.File))
	var pillars []string
	byPillar := map[string][]dataset.Indicator{}
	for _, ind := range sc.indicators {
		p := strings.TrimSpace(ind.Pillar)
		if _, ok := byPillar[p]; !ok {
			pillars = append(pillars, p)
		}
		byPillar[p] = append(byPillar[p], ind)
	}
	// Indicators without a pillar come last, under their own title.
	sort.SliceStable(pillars, func(a, b int) bool { return pillars[a] != "" && pillars[b] == "" })
	for _, p := range pillars {
		if len(pillars) > 1 {
			title := p
			if title == "" {
				title = "Other indicators"
			}
			w.sectionHeading(title, 3)
		}
		for _, ind := range byPillar[p] {
			w.runIn(ind.Label+".", indicatorNote(ind, dict), w.annexSize())
		}
	}
}

// indicatorNote is an indicator's entry in the annex: definition, source
// (or how it is derived), unit and decimals, direction, PPP and judgement.
func indicatorNote(ind dataset.Indicator, dict *dataset.Dictionary) string {
	var parts []string
	if d := strings.TrimSpace(ind.Definition); d != "" {
		parts = append(parts, sentence(d))
	}
	if ind.Derive != "" {
		parts = append(parts, sentence("Computed as "+deriveWords(ind.Derive, dict)))
	}
	if s := strings.TrimSpace(ind.Source); s != "" {
		parts = append(parts, sentence("Source: "+s))
	} else if ind.Derive == "" {
		parts = append(parts, "Source: not stated in the dictionary.")
	}
	unit := fmt.Sprintf("%s, %d %s, %s", format.Capitalise(string(ind.Unit)), ind.Decimals, format.Plural(ind.Decimals, "decimal", "decimals"), polarityNote(ind.Better))
	switch {
	case ind.Currency:
		unit += "; converted from local currency to international dollars (PPP$) before any figure is computed"
	case format.InDollars(ind):
		unit += "; in international dollars (PPP$), computed from converted amounts"
	}
	parts = append(parts, unit+".")
	if j := strings.TrimSpace(ind.Judgement); j != "" {
		parts = append(parts, sentence("Value judgement: "+j))
	}
	parts = append(parts, "Key: "+ind.Key+".")
	return strings.Join(parts, " ")
}

// polarityNote says which direction counts as better (ranks follow it
// through figures.RankDirection).
func polarityNote(p dataset.Polarity) string {
	switch p {
	case dataset.HigherIsBetter:
		return "higher is better"
	case dataset.LowerIsBetter:
		return "lower is better (↓ in tables)"
	}
	return "neutral (no direction is better)"
}

// sentence ends a text with a full stop unless it has one.
func sentence(s string) string {
	s = strings.TrimSpace(s)
	if s == "" || strings.HasSuffix(s, ".") || strings.HasSuffix(s, "?") || strings.HasSuffix(s, "!") {
		return s
	}
	return s + "."
}

// annexGroups states how each group in scope was formed, its size and
// whether the focus belongs to it; chosen and nearest-peer groups list
// their members.
func (w *writer) annexGroups(sc appendixScope) {
	w.annexHeading("Comparison groups", keepWithNext)
	focus := focusName(w.m)
	w.plain(fmt.Sprintf("%s is compared with %s %s. A group draws on the ranked population unless it is marked as drawing on all institutions; an institution outside a group is placed where its value would fall among the members, without changing the group's figures.",
		focus, format.Int(len(sc.groups)), format.Plural(len(sc.groups), "group", "groups")))
	reg := w.m.Data.Register
	nearest := false
	for _, g := range sc.groups {
		var b strings.Builder
		b.WriteString(sentence(format.Capitalise(g.Defined)))
		over := "of the ranked population"
		if g.Over == "all" {
			over = "drawn from all institutions"
		}
		fmt.Fprintf(&b, " %s %s %s; ", format.Int(len(g.Members)), format.Plural(len(g.Members), "member", "members"), over)
		if g.FocusIn {
			b.WriteString(focus + " is a member.")
		} else {
			b.WriteString(focus + " is not a member.")
		}
		switch {
		case len(g.Nearest) > 0:
			nearest = true
			names := make([]string, len(g.Nearest))
			for i, nb := range g.Nearest {
				names[i] = fmt.Sprintf("%s (%s)", reg.Institutions[nb.Institution].Name, format.Number(nb.Distance, 2))
			}
			b.WriteString(" Nearest first, with distances: " + strings.Join(names, ", ") + ".")
		case g.Kind == "members":
			names := make([]string, len(g.Members))
			for i, in := range g.Members {
				names[i] = reg.Institutions[in].Name
			}
			b.WriteString(" Members: " + strings.Join(names, ", ") + ".")
		}
		for _, d := range g.Dropped {
			fmt.Fprintf(&b, " %s is left out: %s.", reg.Institutions[d.Institution].Name, d.Reason)
		}
		w.runIn(g.Name+".", b.String(), w.annexSize())
	}
	if nearest {
		w.runIn("Nearest-profile peers.", fmt.Sprintf("Each indicator named in the group's definition is standardised by the mean and sample standard deviation of the candidates in %d; the distance between two institutions is the Euclidean distance between their standardised values, so that every indicator weighs the same. Candidates lacking any of the indicators are skipped, %s itself is excluded, and equal distances are ordered by register id.", w.m.Year, focus), w.annexSize())
	}
}

// annexPopulation states the population rules and how many institutions
// each left out, from the dataset's population outcome.
func (w *writer) annexPopulation() {
	w.annexHeading("Who is counted", keepWithNext)
	d := w.m.Data
	n := d.Register.Len()
	pop := d.Population
	if pop == nil || len(pop.Rules) == 0 {
		w.plain(fmt.Sprintf("The register %s holds %s institutions. The brief sets no population rules, so every institution is ranked.", d.Register.File, format.Int(n)))
		return
	}
	excluded := len(pop.Excluded)
	w.plain(fmt.Sprintf("The register %s holds %s institutions. The population rules below leave out %s, so %s form the ranked population that the groups draw on. Rules like these keep out institutions whose figures rest on too few papers or staff to compare reliably.",
		d.Register.File, format.Int(n), format.Int(excluded), format.Int(n-excluded)))
	counts, ok := ruleExclusions(w.b, pop, d.Dictionary)
	for i, r := range pop.Rules {
		text := sentence(format.Capitalise(r))
		if ok {
			text = strings.TrimSuffix(text, ".") + fmt.Sprintf(": leaves out %s %s.", format.Int(counts[i]), format.Plural(counts[i], "institution", "institutions"))
		}
		w.bullet("", text)
	}
	if !ok && len(pop.Rules) > 1 {
		w.bullet("", "An institution failing several rules is counted once in the total above.")
	}
	if !d.InPopulation(w.m.Focus) {
		w.bullet("", fmt.Sprintf("%s itself does not meet the rules; it is placed among each group's members by its value: %s.", focusName(w.m), strings.Join(pop.Excluded[w.m.Focus], "; ")))
	}
	w.y += paraGap - listItemGap
	w.annexEarlierYears()
}

// annexEarlierYears says who is ranked in the span's earlier years and,
// when the rules apply as of each year, how many each year ranks and
// which windows were scaled to the data.
func (w *writer) annexEarlierYears() {
	s := earlierYearsRule(w.m)
	if s == "" {
		return
	}
	text := "Figures for earlier years " + s
	if w.m.Data.PopulationByYear() {
		counts, scaled := yearCounts(w.m, w.b)
		text += " The ranked population numbers " + counts + "; a group's members in a year are those of its definition in that year's population (nearest-profile and cluster peers are chosen once, in " + fmt.Sprint(w.m.Year) + ")."
		if len(scaled) > 0 {
			text += fmt.Sprintf(" Where a year's window reaches back before the first year of the data (%d), its threshold is scaled to the years held: %s.", w.m.Data.Years[0], strings.Join(scaled, "; "))
		}
	}
	w.plain(text)
}

// annexMoney states which indicators were converted at purchasing-power
// parity, with what factors and from which file.
func (w *writer) annexMoney(sc appendixScope) {
	w.annexHeading("Money and purchasing-power parity", keepWithNext)
	d := w.m.Data
	dict := d.Dictionary
	var converted, derived, local []string
	if d.PPP != nil {
		for _, k := range d.PPP.Converted {
			if ind, ok := dict.Lookup(k); ok {
				converted = append(converted, lowerFirst(ind.Label))
			}
		}
	}
	// Amounts computed from converted money are named only when this
	// annex covers them; every converted amount is named, as conversion
	// happens before anything else.
	for _, ind := range sc.indicators {
		switch {
		case ind.Unit != dataset.UnitCurrency || ind.Currency && d.PPP != nil:
		case format.InDollars(ind):
			derived = append(derived, lowerFirst(ind.Label))
		default:
			local = append(local, lowerFirst(ind.Label))
		}
	}
	if len(converted) == 0 {
		s := "No money amount is converted: "
		if w.b.Data.PPP != "" {
			s += fmt.Sprintf("the brief names the PPP file %s, but no indicator of the dictionary is a local-currency amount.", w.b.Data.PPP)
		} else {
			s += "the brief names no PPP file."
		}
		if len(local) > 0 {
			s += " " + format.Capitalise(joinAnd(local)) + format.Plural(len(local), " is", " are") + " shown in the currency units of the data as given, comparable only within one currency."
		}
		w.plain(s)
		return
	}
	countries, first, last := pppExtent(d.PPP)
	s := fmt.Sprintf("Money amounts (%s) are converted from local currency to international dollars (PPP$) before any figure is computed: each value is divided by the purchasing-power-parity factor of its country and year, a factor being local currency units per international dollar. The factors are read from %s (%s %s, %d–%d).",
		joinAnd(converted), w.b.Data.PPP, format.Int(countries), format.Plural(countries, "country", "countries"), first, last)
	if len(derived) > 0 {
		s += " " + format.Capitalise(joinAnd(derived)) + format.Plural(len(derived), " is", " are") + " computed from the converted amounts and so in international dollars too."
	}
	s += " PPP factors are estimates and are revised from time to time, so small differences in money indicators between countries deserve less weight than those within one country."
	w.plain(s)
}

// pppExtent counts the countries of a PPP table and its first and last
// years.
func pppExtent(p *dataset.PPPTable) (countries, first, last int) {
	for _, ys := range p.Factors {
		countries++
		for y := range ys {
			if first == 0 || y < first {
				first = y
			}
			if y > last {
				last = y
			}
		}
	}
	return countries, first, last
}

// annexCoverageGroups is how many groups one coverage table sets side by
// side; more groups continue in a second table.
const annexCoverageGroups = 6

// annexCoverage tabulates, for each indicator and group in scope, the
// members with a value in the brief's year out of all members.
func (w *writer) annexCoverage(sc appendixScope) {
	if len(sc.groups) == 0 || len(sc.indicators) == 0 {
		return
	}
	w.annexHeading("Coverage by group", 40)
	w.plain(fmt.Sprintf("Members with a value in %d out of all members of each group. An institution without a value is left out of that indicator's figures, never counted as zero; bold marks coverage under %s%%, where the commentary adds a caution.", w.m.Year, format.Number(narrative.MinCoverage, 0)))
	// Groups are shared out evenly between the tables (8 groups: 4 and 4,
	// not 6 and 2).
	tables := (len(sc.groups) + annexCoverageGroups - 1) / annexCoverageGroups
	per := (len(sc.groups) + tables - 1) / tables
	for start := 0; start < len(sc.groups); start += per {
		gs := sc.groups[start:min(start+per, len(sc.groups))]
		g := grid{head: []string{"Indicator"}, align: []byte{'L'}}
		for _, gr := range gs {
			g.head = append(g.head, gr.Name)
			g.align = append(g.align, 'R')
		}
		for _, ind := range sc.indicators {
			row := []cell{{text: indicatorLabel(ind, false)}}
			for _, gr := range gs {
				row = append(row, coverageCell(w.m, gr, ind.Key, w.m.Year))
			}
			g.rows = append(g.rows, row)
		}
		g.caption = fmt.Sprintf("Coverage: members reporting each indicator, %d", w.m.Year)
		if len(sc.groups) > annexCoverageGroups {
			g.caption += fmt.Sprintf(" (groups %d–%d of %d)", start+1, start+len(gs), len(sc.groups))
		}
		w.setTable(g)
	}
}

// coverageCell prints "n of N" for a group's indicator in a year: the
// distribution's count of members with a value against the group's size.
func coverageCell(m *figures.Model, g *figures.Group, ind string, year int) cell {
	total := len(g.Members)
	d, ok := m.Distribution(g.Name, ind, year)
	if !ok {
		return cell{text: "0 of " + format.Int(total), bold: total > 0}
	}
	return cell{text: format.Int(d.N) + " of " + format.Int(total), bold: lowCoverage(d.N, total)}
}

// lowCoverage applies the commentary's coverage rule (narrative.MinCoverage)
// so the annex and the sentences flag the same cells.
func lowCoverage(n, total int) bool {
	return total > 0 && 100*float64(n)/float64(total) < narrative.MinCoverage
}

// annexWeights states how indicators are combined. Until a composite
// score exists, none is computed, and the annex says so plainly.
func (w *writer) annexWeights() {
	w.annexHeading("Weights", keepWithNext)
	w.plain(compositeStatement(w.m))
}

// compositeStatement is the weights paragraph. It is the hook for
// composite scores: when figures.Compute adds a composite section
// (figures.SectionComposite), its weights and normalisation are to be
// listed here, each weight stated as the value judgement it is.
func compositeStatement(m *figures.Model) string {
	if spec := m.CompositeSpec; spec != nil {
		if cy, ok := m.Composite(m.Year); ok {
			var parts []string
			for q, p := range spec.Pillars {
				parts = append(parts, fmt.Sprintf("%s %s %%", p.Label, format.Number(100*cy.Result.PillarWeight[q], 0)))
			}
			return fmt.Sprintf("The composite score weighs %d indicators in %d pillars (%s); the composite section lists each indicator's weight. These weights are value judgements stated in the brief, not findings, and its ranks move with them, as the intervals show. ", countIndicators(spec), len(spec.Pillars), strings.Join(parts, ", ")) + compositeMethodNote(m, cy)
		}
	}
	return "No composite score is computed in this pack: each indicator is shown on its own, and none is weighted against another. Any composite built from these figures would rest on weights that are value judgements, and its ranks would move with them."
}

// annexLimits sets out the limits of these figures for this pack: the
// least complete figure, the value judgements, noise and small groups,
// and what the indicators leave out; the pack's standing cautions are
// pointed to rather than repeated.
func (w *writer) annexLimits(sc appendixScope) {
	w.annexHeading("Limits of these figures", keepWithNext)
	size := w.annexSize()
	if ind, g, n, total, ok := w.leastCovered(sc); ok {
		w.runIn("Coverage of the data.", fmt.Sprintf("The least complete figure in this annex is %s in %s: %s of %s members report it in %d. Institutions without a value are left out, so a group's median describes those that report, who may differ from those that do not.",
			lowerFirst(ind.Label), g.Name, format.Int(n), format.Int(total), w.m.Year), size)
	}
	judged := 0
	for _, ind := range sc.indicators {
		if strings.TrimSpace(ind.Judgement) != "" {
			judged++
		}
	}
	vj := fmt.Sprintf("The choice of these %s indicators, of the members of each group and of the direction counted as better are value judgements made for this pack; other defensible choices can move positions.", format.Int(len(sc.indicators)))
	if judged > 0 {
		vj += fmt.Sprintf(" For %s %s the dictionary records why the direction itself is a judgement (see above).", format.Int(judged), format.Plural(judged, "indicator", "indicators"))
	}
	w.runIn("Value judgements.", vj, size)
	// The brief's own settings, the ones the commentary applies
	// (brief.NoiseRule, brief.SmallGroupFloor), never the defaults.
	rule := strconv.FormatFloat(w.b.NoiseRule(), 'f', -1, 64)
	floor := w.b.SmallGroupFloor()
	noise := fmt.Sprintf("Differences of a rank or two, or of fewer than %s percentile points (this pack's noise setting), lie within the year-to-year noise of the data and of revisions: such positions read as level, a position that close to a quarter's boundary as at its edge, and such a change as broadly unchanged. Where fewer than %s members report an indicator (this pack's small-group setting), the pack gives ranks “of n” only, with no quarters or percentiles.",
		rule, format.Int(floor))
	if g, ok := smallestGroup(sc.groups); ok {
		noise += fmt.Sprintf(" The smallest group, %s, has %s %s", g.Name, format.Int(len(g.Members)), format.Plural(len(g.Members), "member", "members"))
		if len(g.Members) < floor {
			noise += ", so it is always read by rank"
		}
		noise += "."
	}
	w.runIn("Noise and small groups.", noise, size)
	w.runIn("What is not measured.", w.unmeasured(sc), size)
	if w.own != nil {
		w.plain("The cautions that go with every reading of these figures are set out in “" + w.own.title + "”.")
	} else {
		w.plain("The cautions that go with every reading of these figures close the pack, in “About these figures”.")
	}
}

// leastCovered finds the indicator and group in scope with the smallest
// share of members reporting in the brief's year (ties: the first in
// dictionary and brief order).
func (w *writer) leastCovered(sc appendixScope) (ind dataset.Indicator, g *figures.Group, n, total int, ok bool) {
	best := 2.0
	for _, in := range sc.indicators {
		for _, gr := range sc.groups {
			if len(gr.Members) == 0 {
				continue
			}
			c := 0
			if d, has := w.m.Distribution(gr.Name, in.Key, w.m.Year); has {
				c = d.N
			}
			if share := float64(c) / float64(len(gr.Members)); share < best {
				best, ind, g, n, total, ok = share, in, gr, c, len(gr.Members), true
			}
		}
	}
	return ind, g, n, total, ok
}

// smallestGroup is the group in scope with the fewest members.
func smallestGroup(gs []*figures.Group) (*figures.Group, bool) {
	var out *figures.Group
	for _, g := range gs {
		if out == nil || len(g.Members) < len(out.Members) {
			out = g
		}
	}
	return out, out != nil
}

// unmeasured names the pillars the indicators cover and what such
// indicators leave out.
func (w *writer) unmeasured(sc appendixScope) string {
	var pillars []string
	seen := map[string]bool{}
	for _, ind := range sc.indicators {
		p := strings.TrimSpace(ind.Pillar)
		if p != "" && !seen[p] {
			seen[p] = true
			pillars = append(pillars, lowerFirst(p))
		}
	}
	s := "The indicators count what institutions report and what databases index"
	if len(pillars) > 0 {
		s += ", under " + joinAnd(pillars)
	}
	return s + ". Teaching quality, the student experience, the wider value of research to society and work outside indexed journals are not measured here, and a position on these indicators is no verdict on them."
}

// joinAnd lists words as "a, b and c".
func joinAnd(xs []string) string {
	switch len(xs) {
	case 0:
		return ""
	case 1:
		return xs[0]
	}
	return strings.Join(xs[:len(xs)-1], ", ") + " and " + xs[len(xs)-1]
}
