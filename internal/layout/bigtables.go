package layout

import (
	"fmt"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/diag"
	"peerpack/internal/figures"
	"peerpack/internal/format"
)

// Tables too big for a page are split or refused here, so every table a
// pack prints can be read: columns of figures stay wide enough for their
// digits, and a table runs to a few pages at most.
const (
	// MaxGroupColumns is the most groups a groups table sets side by side;
	// more are set as several tables of this many groups each. Six group
	// medians and the focus's value fit an A4 page's width at the normal
	// type size with room for the indicator labels (measured on the demo).
	MaxGroupColumns = 6
	// MaxIndicatorColumns is the most indicators a peers table sets side
	// by side beside the name, country and rank columns; more are set as
	// several tables, each opening with the first indicator, which orders
	// the rows.
	MaxIndicatorColumns = 6
	// MaxTableParts is the most tables one block is split into; a block
	// that would need more is refused with what to change.
	MaxTableParts = 8
	// MaxTableRows is the most rows one table block sets: about fifteen
	// pages of a position table. A longer table is refused with what to
	// change (common practice, no source: no reader follows a table
	// further).
	MaxTableRows = 600
)

// parts cuts n items into consecutive runs of at most size, as evenly as
// possible (7 groups in runs of at most 6 are 4 and 3, not 6 and 1).
func parts(n, size int) [][2]int {
	if n <= 0 {
		return nil
	}
	k := (n + size - 1) / size
	var out [][2]int
	start := 0
	for i := range k {
		end := start + (n-start)/(k-i)
		if (n-start)%(k-i) != 0 {
			end++
		}
		out = append(out, [2]int{start, end})
		start = end
	}
	return out
}

// tableRows is how many rows a table block sets, for the MaxTableRows
// check.
func tableRows(tb *brief.TableBlock, groups []*figures.Group, inds []dataset.Indicator) int {
	switch tb.Type {
	case "groups":
		return len(inds)
	case "peers", "population":
		return 0 // limited by the block's limit
	case "systems":
		if len(tb.Indicators) == 0 {
			return len(groups)
		}
	}
	return len(groups) * len(inds)
}

// tableTooBig refuses a table block whose rows or parts are past reading,
// at the block's line, saying what to change. It reports whether it did.
func (w *writer) tableTooBig(tb *brief.TableBlock, groups []*figures.Group, inds []dataset.Indicator) bool {
	if msg := tableSizeProblem(tb, groups, inds, w.m.Groups); msg != "" {
		w.failAt(tb.At, "%s", msg)
		return true
	}
	return false
}

// tableSizeProblem says what is past reading in a table block, or "".
func tableSizeProblem(tb *brief.TableBlock, groups []*figures.Group, inds []dataset.Indicator, all []*figures.Group) string {
	if (tb.Type == "groups" || tb.Type == "systems") && len(tb.Groups) == 0 {
		groups = all
	}
	if n := tableRows(tb, groups, inds); n > MaxTableRows {
		return fmt.Sprintf("this %s table would set %s rows (%d indicators in %d groups), over the %s a table may have; name fewer groups or indicators in the block, or split it into several blocks",
			tb.Type, format.Int(n), len(inds), len(groups), format.Int(MaxTableRows))
	}
	switch tb.Type {
	case "groups":
		if k := len(parts(len(groups), MaxGroupColumns)); k > MaxTableParts {
			return fmt.Sprintf("a groups table of %d groups would be set as %d tables of %d groups side by side; name at most %d groups in the block's groups:, or use kind: systems, which sets one row per group",
				len(groups), k, MaxGroupColumns, MaxGroupColumns*MaxTableParts)
		}
	case "peers":
		if len(tb.Indicators) == 0 {
			break // the first six of the dictionary (peersTable)
		}
		if k := len(parts(len(inds)-1, MaxIndicatorColumns-1)); k > MaxTableParts {
			return fmt.Sprintf("a peers table of %d indicators would be set as %d tables of %d indicators side by side; name at most %d indicators in the block's indicators:, or split them over several blocks",
				len(inds), k, MaxIndicatorColumns, 1+(MaxIndicatorColumns-1)*MaxTableParts)
		}
	}
	return ""
}

// CheckTableSizes finds, without laying anything out, the table blocks
// that would be refused as past reading (tableSizeProblem), so that
// `peerpack check` reports them at their lines as the build would.
func CheckTableSizes(b *brief.Brief, m *figures.Model) error {
	var l diag.List
	for _, blk := range b.Blocks {
		tb, ok := blk.(*brief.TableBlock)
		if !ok {
			continue
		}
		var groups []*figures.Group
		for _, name := range tb.Groups {
			groups = append(groups, m.GroupsOf(name)...)
		}
		if len(tb.Groups) == 0 && len(m.Groups) > 0 {
			groups = m.Groups[:1]
		}
		inds := m.Data.Dictionary.Indicators
		if len(tb.Indicators) > 0 {
			inds = nil
			for _, k := range tb.Indicators {
				if ind, ok := m.Data.Dictionary.Lookup(k); ok {
					inds = append(inds, ind)
				}
			}
		}
		if msg := tableSizeProblem(tb, groups, inds, m.Groups); msg != "" {
			l.Addf(b.File, tb.At.Line, tb.At.Column, "%s", msg)
		}
	}
	return l.Err()
}

// partCaption is a block's caption (or the default a table kind would
// give) with the part it shows: "(groups 7–12 of 20)".
func partCaption(caption string, what string, p [2]int, n int) string {
	return fmt.Sprintf("%s (%s %d–%d of %d)", caption, what, p[0]+1, p[1], n)
}

// groupsTableParts sets a groups table, in parts of at most
// MaxGroupColumns groups when it has more.
func (w *writer) groupsTableParts(tb *brief.TableBlock, groups []*figures.Group, inds []dataset.Indicator, year int) {
	if len(tb.Groups) == 0 {
		groups = w.m.Groups
	}
	if len(groups) <= MaxGroupColumns {
		w.groupsTable(tb, groups, inds, year)
		return
	}
	caption := tb.Caption
	if caption == "" {
		caption = fmt.Sprintf("Group medians and %s, %d", focusName(w.m), year)
	}
	for _, p := range parts(len(groups), MaxGroupColumns) {
		sub := *tb
		sub.Caption = partCaption(caption, "groups", p, len(groups))
		sub.Groups = nil
		for _, g := range groups[p[0]:p[1]] {
			sub.Groups = append(sub.Groups, g.Name)
		}
		w.groupsTable(&sub, groups[p[0]:p[1]], inds, year)
	}
}

// peersTableParts sets a peers table, in parts of at most
// MaxIndicatorColumns indicators when it has more; every part lists the
// same institutions in the same order (by the block's first indicator).
func (w *writer) peersTableParts(tb *brief.TableBlock, g *figures.Group, inds []dataset.Indicator, year int) {
	if len(tb.Indicators) == 0 || len(inds) <= MaxIndicatorColumns {
		w.peersTable(tb, g, inds, year)
		return
	}
	caption := tb.Caption
	if caption == "" {
		caption = fmt.Sprintf("%s: members by %s, %d", g.Name, indicatorLabel(inds[0], false), year)
	}
	// The first indicator orders every part's rows and opens each part;
	// the others are shared out over the parts.
	rest := inds[1:]
	for _, p := range parts(len(rest), MaxIndicatorColumns-1) {
		sub := *tb
		sub.Caption = fmt.Sprintf("%s (indicators %d–%d of %d)", caption, p[0]+2, p[1]+1, len(inds))
		part := append([]dataset.Indicator{inds[0]}, rest[p[0]:p[1]]...)
		w.peersTable(&sub, g, part, year)
	}
}
