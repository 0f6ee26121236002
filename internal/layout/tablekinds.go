package layout

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
	"peerpack/internal/yamlx"
)

// tableBlock lays out a table block by its kind. Every number comes from
// the figures model and is printed with package format.
func (w *writer) tableBlock(tb *brief.TableBlock) {
	groups, ok := w.blockGroups(tb)
	if !ok {
		return
	}
	inds, ok := w.blockIndicators(tb, 0)
	if !ok {
		return
	}
	year := tb.Year
	if year == 0 {
		year = w.m.Year
	}
	if w.tableTooBig(tb, groups, inds) {
		return
	}
	switch tb.Type {
	case "peers":
		w.peersTableParts(tb, groups[0], inds, year)
	case "groups":
		w.groupsTableParts(tb, groups, inds, year)
	case "population":
		w.populationTable(tb)
	case "systems":
		w.systemsTable(tb, groups, inds, year)
	case "standing":
		w.standingTable(tb, groups, inds, year)
	case "scale":
		w.scaleTable(tb, groups[0], inds, year)
	case "definitions":
		w.definitionsTable(tb, groups)
	default:
		w.positionTable(tb, groups, inds, year)
	}
}

// blockGroups expands a block's group names ("each" names stand for all
// their groups); none means the brief's first group.
func (w *writer) blockGroups(tb *brief.TableBlock) ([]*figures.Group, bool) {
	if len(w.m.Groups) == 0 {
		w.failAt(tb.At, "a table needs a comparison group; define groups in the front matter")
		return nil, false
	}
	if len(tb.Groups) == 0 {
		return []*figures.Group{w.m.Groups[0]}, true
	}
	var out []*figures.Group
	for _, name := range tb.Groups {
		gs := w.m.GroupsOf(name)
		if len(gs) == 0 {
			names := make([]string, len(w.m.Groups))
			for i, g := range w.m.Groups {
				names[i] = g.Name
			}
			msg := fmt.Sprintf("table names group %q, which the brief does not define", name)
			if s := yamlx.Nearest(name, names); s != "" {
				msg += fmt.Sprintf("; did you mean %q?", s)
			}
			w.failAt(tb.At, "%s", msg)
			return nil, false
		}
		out = append(out, gs...)
	}
	return out, true
}

// blockIndicators looks up a block's indicators; none means the whole
// dictionary (or its first limit entries when limit > 0).
func (w *writer) blockIndicators(tb *brief.TableBlock, limit int) ([]dataset.Indicator, bool) {
	dict := w.m.Data.Dictionary
	if len(tb.Indicators) == 0 {
		all := dict.Indicators
		if limit > 0 && len(all) > limit {
			all = all[:limit]
		}
		return all, true
	}
	var out []dataset.Indicator
	for _, k := range tb.Indicators {
		ind, ok := dict.Lookup(k)
		if !ok {
			msg := fmt.Sprintf("table names indicator %q, which the dictionary does not define", k)
			if s := yamlx.Nearest(k, dict.Keys()); s != "" {
				msg += fmt.Sprintf("; did you mean %q?", s)
			}
			w.failAt(tb.At, "%s", msg)
			return nil, false
		}
		out = append(out, ind)
	}
	return out, true
}

// indicatorLabel names an indicator in a table, with an arrow when lower
// values are better so the reader does not misread the ranks.
func indicatorLabel(ind dataset.Indicator, short bool) string {
	l := ind.Label
	if short && ind.Short != "" {
		l = ind.Short
	}
	if l == "" {
		l = ind.Key
	}
	if ind.Better == dataset.LowerIsBetter {
		l += " ↓"
	}
	return l
}

// inDollars reports whether an indicator is in international dollars,
// as format.Value decides it.
func inDollars(ind dataset.Indicator) bool { return format.InDollars(ind) }

// unitLabel is indicatorLabel with "(PPP$)" for amounts in international
// dollars: a table states the currency once, in the row or column label,
// rather than in every cell, where it would widen every figure column.
func unitLabel(ind dataset.Indicator, short bool) string {
	l := indicatorLabel(ind, short)
	if !inDollars(ind) {
		return l
	}
	if base, ok := strings.CutSuffix(l, " ↓"); ok {
		return base + " (PPP$) ↓"
	}
	return l + " (PPP$)"
}

// tableValue prints a value for a table cell: format.Value's digits and
// unit, without the currency sign that unitLabel has already given.
func tableValue(ind dataset.Indicator, v float64) string {
	if inDollars(ind) {
		return format.Number(v, ind.Decimals)
	}
	return format.Value(ind, v)
}

func hasLower(inds []dataset.Indicator) bool {
	for _, ind := range inds {
		if ind.Better == dataset.LowerIsBetter {
			return true
		}
	}
	return false
}

// positionColumns are the columns of a position table, in order, and the
// keys a block's columns list may choose from.
var positionColumns = []string{"value", "rank", "percentile", "quarter", "median", "q1", "q3", "change"}

func (w *writer) positionTable(tb *brief.TableBlock, groups []*figures.Group, inds []dataset.Indicator, year int) {
	cols := positionColumns
	if len(tb.Columns) > 0 {
		for _, c := range tb.Columns {
			if !contains(positionColumns, c) {
				msg := fmt.Sprintf("position table column %q is not known", c)
				if s := yamlx.Nearest(c, positionColumns); s != "" {
					msg += fmt.Sprintf("; did you mean %q?", s)
				}
				w.failAt(tb.At, "%s (columns are %s)", msg, strings.Join(positionColumns, ", "))
				return
			}
		}
		cols = tb.Columns
	}
	head := []string{"Indicator"}
	align := []byte{'L'}
	multi := len(groups) > 1
	if multi {
		head = append(head, "Group")
		align = append(align, 'L')
	}
	// The change column's heading gives the years its changes run over:
	// the focus's first and last years with a value, which can differ
	// from the brief's span (see changeYears).
	cy := w.changeYears(groups, inds)
	span := fmt.Sprintf("%d–%d", cy.first, cy.last)
	titles := map[string]string{"value": fmt.Sprintf("Value %d", year), "rank": "Rank", "percentile": "Percentile rank", "quarter": "Quarter",
		"median": "Group median", "q1": "Lower quartile", "q3": "Upper quartile", "change": "Change " + span}
	for _, c := range cols {
		head = append(head, titles[c])
		if c == "quarter" {
			align = append(align, 'L')
		} else {
			align = append(align, 'R')
		}
	}
	g := grid{head: head, align: align, legend: contains(cols, "value"), caption: tb.Caption}
	if g.caption == "" {
		names := make([]string, len(groups))
		for i, gr := range groups {
			names[i] = gr.Name
		}
		g.caption = fmt.Sprintf("Position of %s in %s, %d", focusName(w.m), strings.Join(names, ", "), year)
	}
	focus := w.m.Focus
	anySmall := false
	for _, ind := range inds {
		for gi, gr := range groups {
			row := []cell{{text: unitLabel(ind, false)}}
			if multi {
				if gi > 0 {
					row[0] = cell{text: ""}
				}
				row = append(row, cell{text: gr.Name})
			}
			pos, okp := w.m.PlaceOf(gr.Name, ind.Key, focus, year)
			dist, okd := w.m.Distribution(gr.Name, ind.Key, year)
			tr, okt := w.m.Trend(gr.Name, ind.Key, focus)
			has := okp && pos.HasValue
			// Below the brief's small-group floor no quarter or
			// percentile is printed, in tables as in text.
			small := okd && w.m.BelowFloor(dist)
			anySmall = anySmall || small
			for _, c := range cols {
				var cl cell
				switch c {
				case "value":
					cl.text = "–"
					if has {
						cl.text = tableValue(ind, pos.Value)
						if !small {
							cl.shade = pos.Quartile
						}
					}
				case "rank":
					cl.text = "–"
					if has {
						cl.text = format.Rank(pos.Rank, w.b.RankBands) + " of " + format.Int(pos.Of)
					}
				case "percentile":
					cl.text = "–"
					if has && !small {
						cl.text = format.Ordinal(format.PercentileRank(pos.Percentile))
					}
				case "quarter":
					cl.text = "–"
					if has && !small {
						cl.text = quarterShort(pos.Quartile)
					}
				case "median", "q1", "q3":
					cl.text = "–"
					if okd && dist.N > 0 && (c == "median" || !small) {
						v := map[string]float64{"median": dist.Median, "q1": dist.Q1, "q3": dist.Q3}[c]
						cl.text = tableValue(ind, v)
					}
					cl.muted = true
				case "change":
					cl.text = "–"
					if okt && tr.Valid {
						cl.text = format.Signed(ind, tr.Change) + cy.otherYears(tr)
					}
				}
				row = append(row, cl)
			}
			g.rows = append(g.rows, row)
		}
	}
	if contains(cols, "change") && cy.mixed {
		g.notes = append(g.notes, fmt.Sprintf("Changes run from %d to %d except where a cell names other years: each runs from the first to the last year with a value.", cy.first, cy.last))
	}
	g.notes = append(g.notes, w.methodNote())
	if anySmall && (contains(cols, "percentile") || contains(cols, "quarter") || contains(cols, "q1") || contains(cols, "q3")) {
		g.notes = append(g.notes, fmt.Sprintf("Where fewer than %d members report an indicator, the rank and median are given but no percentile, quarter or quartile: those of so few values mean little.", w.m.Floor))
	}
	if hasLower(inds) {
		g.notes = append(g.notes, "↓ marks indicators on which lower values are better; ranks, percentiles and quarters already take this into account.")
	}
	w.setTable(g)
}

// methodNote states the definitions behind ranks, percentiles and
// quartiles, so the table can be read on its own.
func (w *writer) methodNote() string {
	q := map[string]string{
		"type7":  "quartiles by Hyndman and Fan (1996) type 7",
		"type6":  "quartiles by Hyndman and Fan (1996) type 6",
		"hinges": "quartiles as Tukey's (1977) hinges",
	}[w.m.Method.String()]
	return "Rank 1 is best; values equal as printed are ties and share the better rank; percentile rank is 100 × (institutions behind + half the ties) / n; " + q + "."
}

func contains(set []string, s string) bool {
	for _, x := range set {
		if x == s {
			return true
		}
	}
	return false
}

// peersTable lists a group's members against indicators, ordered by the
// first indicator in its better direction, the focus always shown.
func (w *writer) peersTable(tb *brief.TableBlock, gr *figures.Group, inds []dataset.Indicator, year int) {
	if len(tb.Indicators) == 0 && len(inds) > 6 {
		inds = inds[:6]
	}
	limit := tb.Limit
	if limit <= 0 {
		limit = 25
	}
	first := inds[0]
	col := w.m.Data.Column(w.m.Data.Dictionary.Index(first.Key), year)
	members := append([]int(nil), gr.MembersIn(year)...)
	val := func(i int) float64 {
		if col == nil {
			return math.NaN()
		}
		return col[i]
	}
	lower := first.Better == dataset.LowerIsBetter
	sort.SliceStable(members, func(a, b int) bool {
		va, vb := val(members[a]), val(members[b])
		switch {
		case math.IsNaN(va) != math.IsNaN(vb):
			return !math.IsNaN(va)
		case math.IsNaN(va):
			return false
		case lower:
			return va < vb
		}
		return va > vb
	})
	shown := members
	if len(shown) > limit {
		shown = append([]int(nil), members[:limit]...)
	}
	focusShown := false
	for _, i := range shown {
		if i == w.m.Focus {
			focusShown = true
		}
	}
	if !focusShown {
		shown = append(shown, w.m.Focus)
	}
	head := []string{"Institution", "Country", "Rank on " + indicatorLabel(first, true)}
	align := []byte{'L', 'L', 'R'}
	for _, ind := range inds {
		head = append(head, unitLabel(ind, true))
		align = append(align, 'R')
	}
	g := grid{head: head, align: align, legend: true, caption: tb.Caption}
	if g.caption == "" {
		g.caption = fmt.Sprintf("%s: members by %s, %d", gr.Name, indicatorLabel(first, false), year)
	}
	reg := w.m.Data.Register
	for _, i := range shown {
		in := reg.Institutions[i]
		row := []cell{{text: in.Name}, {text: in.Country}}
		rank := "–"
		if p, ok := w.m.PlaceOf(gr.Name, first.Key, i, year); ok && p.HasValue {
			rank = format.Rank(p.Rank, w.b.RankBands)
		}
		row = append(row, cell{text: rank})
		for _, ind := range inds {
			cl := cell{text: "–"}
			if p, ok := w.m.PlaceOf(gr.Name, ind.Key, i, year); ok && p.HasValue {
				cl = cell{text: tableValue(ind, p.Value), shade: p.Quartile}
				if d, ok := w.m.Distribution(gr.Name, ind.Key, year); ok && w.m.BelowFloor(d) {
					cl.shade = 0 // no quarters below the small-group floor
				}
			}
			row = append(row, cl)
		}
		g.rows = append(g.rows, row)
		g.focus = append(g.focus, i == w.m.Focus)
	}
	if len(members) > len(shown) || !focusShown {
		n := fmt.Sprintf("Showing %d of the group's %d members", min(limit, len(members)), len(members))
		if !focusShown {
			n += fmt.Sprintf("; %s is added at the foot", reg.Institutions[w.m.Focus].Name)
			if !gr.HasIn(w.m.Focus, year) {
				n += " and is not a member, its place shown among the members"
			}
		}
		g.notes = append(g.notes, n+".")
	}
	g.notes = append(g.notes, w.methodNote())
	w.setTable(g)
}

// groupsTable sets group medians side by side against the focus's value.
func (w *writer) groupsTable(tb *brief.TableBlock, groups []*figures.Group, inds []dataset.Indicator, year int) {
	if len(tb.Groups) == 0 {
		groups = w.m.Groups
	}
	// Two tables, each read one way: the groups' medians beside the
	// focus's value, unmarked; then where the focus's value would fall in
	// each group, marked by quarter. A quarter mark beside a median would
	// read as the median's own standing.
	name := focusName(w.m)
	head := []string{"Indicator", name}
	align := []byte{'L', 'R'}
	standHead := []string{"Indicator"}
	standAlign := []byte{'L'}
	for _, gr := range groups {
		// No-break spaces keep "(n = 52)" on one line of the header.
		head = append(head, fmt.Sprintf("%s median (n\u00a0=\u00a0%s)", gr.Name, format.Int(len(gr.MembersIn(year)))))
		align = append(align, 'R')
		standHead = append(standHead, gr.Name)
		standAlign = append(standAlign, 'R')
	}
	g := grid{head: head, align: align, caption: tb.Caption}
	if g.caption == "" {
		g.caption = fmt.Sprintf("Group medians and %s, %d", name, year)
	}
	stand := grid{head: standHead, align: standAlign, legend: true,
		caption: fmt.Sprintf("Where %s's value would rank in each group, %d", name, year)}
	for _, ind := range inds {
		v, _ := w.m.Data.Value(w.m.Data.Dictionary.Index(ind.Key), w.m.Focus, year)
		row := []cell{{text: unitLabel(ind, false)}, {text: tableValue(ind, v), bold: true}}
		srow := []cell{{text: unitLabel(ind, false)}}
		for _, gr := range groups {
			cl := cell{text: "–"}
			if d, ok := w.m.Distribution(gr.Name, ind.Key, year); ok && d.N > 0 {
				cl.text = tableValue(ind, d.Median)
			}
			row = append(row, cl)
			sc := cell{text: "–"}
			if p, ok := w.m.PlaceOf(gr.Name, ind.Key, w.m.Focus, year); ok && p.HasValue {
				sc = cell{text: format.Rank(p.Rank, w.b.RankBands) + " of " + format.Int(p.Of), shade: p.Quartile}
				if d, ok := w.m.Distribution(gr.Name, ind.Key, year); ok && w.m.BelowFloor(d) {
					sc.shade = 0 // no quarters below the small-group floor
				}
			}
			srow = append(srow, sc)
		}
		g.rows = append(g.rows, row)
		stand.rows = append(stand.rows, srow)
	}
	g.notes = append(g.notes, "n is the number of members; each median is over the members reporting the indicator. The next table gives "+name+"'s standing in each group.")
	stand.notes = append(stand.notes, "Each cell is the place "+name+"'s value would take among the group's members reporting the indicator, and its mark the quarter of that group it would fall in; it describes "+name+", not the group.")
	w.setTable(g)
	w.setTable(stand)
}

// populationTable shows who passed the population rules and how each
// group was formed.
func (w *writer) populationTable(tb *brief.TableBlock) {
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
	// A group's definition is read in full: nearest-peer groups name
	// every indicator they are drawn on.
	g := grid{head: []string{"Group", "Definition", "Counts", "Members", "Focus a member"}, align: []byte{'L', 'L', 'L', 'R', 'L'}, caption: tb.Caption, maxLines: 8}
	if g.caption == "" {
		g.caption = "Population and comparison groups"
	}
	g.rows = append(g.rows, []cell{{text: "Register", bold: true}, {text: "every institution in the data"}, {text: ""}, {text: format.Int(n)}, {text: ""}})
	g.rows = append(g.rows, []cell{{text: "Ranked population", bold: true}, {text: "those meeting the population rules"}, {text: ""}, {text: format.Int(ranked)}, {text: ""}})
	for _, gr := range w.m.Groups {
		over := "ranked population"
		if gr.Over == "all" {
			over = "all institutions"
		}
		member := "no"
		if gr.FocusIn {
			member = "yes"
		}
		g.rows = append(g.rows, []cell{{text: gr.Name}, {text: gr.Defined}, {text: over}, {text: format.Int(len(gr.Members))}, {text: member}})
	}
	if d.Population != nil {
		for _, r := range d.Population.Rules {
			g.notes = append(g.notes, "Rule: "+format.Capitalise(r)+".")
		}
	} else {
		g.notes = append(g.notes, "The brief sets no population rules: every institution in the register is ranked.")
	}
	w.setTable(g)
	if d.Population == nil || len(d.Population.Excluded) == 0 {
		return
	}
	limit := tb.Limit
	if limit <= 0 {
		limit = 30
	}
	ids := make([]int, 0, len(d.Population.Excluded))
	for i := range d.Population.Excluded {
		ids = append(ids, i)
	}
	sort.Ints(ids)
	ex := grid{head: []string{"Left out of the ranked population", "Country", "Reason"}, align: []byte{'L', 'L', 'L'},
		caption: fmt.Sprintf("Institutions left out by the rules (%s)", format.Int(len(ids)))}
	for k, i := range ids {
		if k >= limit {
			ex.notes = append(ex.notes, fmt.Sprintf("… and %s more; the figures file lists them all.", format.Int(len(ids)-limit)))
			break
		}
		in := d.Register.Institutions[i]
		ex.rows = append(ex.rows, []cell{{text: in.Name}, {text: in.Country}, {text: strings.Join(d.Population.Excluded[i], "; ")}})
	}
	w.setTable(ex)
}

// quarterShort names a quarter in a table's quarter column, whose header
// already says "Quarter".
func quarterShort(q int) string {
	switch q {
	case 1:
		return "top"
	case 2:
		return "second"
	case 3:
		return "third"
	case 4:
		return "bottom"
	}
	return "–"
}

// changeSpan is the years a table's change column runs over: the pair
// most rows share (ties to the earliest start, then the latest end), and
// whether some rows run over other years.
type changeSpan struct {
	first, last int
	mixed       bool
}

// changeYears finds the years the focus's changes run over in a table:
// each change is from the first to the last year of the span with a
// value, so a focus whose last value is earlier than the reporting year
// (or whose first is later than the span's start) has a change over other
// years than the span's, and the heading must say which.
func (w *writer) changeYears(groups []*figures.Group, inds []dataset.Indicator) changeSpan {
	count := map[[2]int]int{}
	var pairs [][2]int
	for _, ind := range inds {
		for _, gr := range groups {
			if tr, ok := w.m.Trend(gr.Name, ind.Key, w.m.Focus); ok && tr.Valid {
				p := [2]int{tr.StartYear, tr.EndYear}
				if count[p] == 0 {
					pairs = append(pairs, p)
				}
				count[p]++
			}
		}
	}
	if len(pairs) == 0 {
		return changeSpan{first: w.m.First, last: w.m.Last}
	}
	sort.SliceStable(pairs, func(a, b int) bool {
		pa, pb := pairs[a], pairs[b]
		switch {
		case count[pa] != count[pb]:
			return count[pa] > count[pb]
		case pa[0] != pb[0]:
			return pa[0] < pb[0]
		}
		return pa[1] > pb[1]
	})
	return changeSpan{first: pairs[0][0], last: pairs[0][1], mixed: len(pairs) > 1}
}

// otherYears is the cell's own years when its change runs over other
// years than the heading's: " (from 2022)", " (to 2024)" or
// " (2022–2024)"; empty otherwise.
func (cs changeSpan) otherYears(tr *figures.Trend) string {
	switch {
	case tr.StartYear == cs.first && tr.EndYear == cs.last:
		return ""
	case tr.EndYear == cs.last:
		return fmt.Sprintf(" (from %d)", tr.StartYear)
	case tr.StartYear == cs.first:
		return fmt.Sprintf(" (to %d)", tr.EndYear)
	}
	return fmt.Sprintf(" (%d–%d)", tr.StartYear, tr.EndYear)
}
