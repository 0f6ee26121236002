package figures

import (
	"fmt"
	"sort"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/diag"
)

// checkFront resolves the focus, the year and the named institutions
// against the data. It returns the focus position (-1 when unknown) and
// the tracked institutions (focus first, then named ones and chart labels
// in brief order, without repeats).
func checkFront(d *dataset.Dataset, b *brief.Brief, probs *diag.List) (focus int, tracked []int) {
	r := &resolver{d: d, b: b, probs: probs}
	focus = d.Register.Index(b.Focus)
	if focus < 0 {
		p := b.PosOf("focus")
		msg := fmt.Sprintf("focus %q is not in the register %s", b.Focus, d.Register.File)
		if s := r.nearestID(b.Focus); s != "" {
			msg += fmt.Sprintf("; did you mean %q?", s)
		}
		probs.Addf(b.File, p.Line, p.Column, "%s", msg)
	} else {
		tracked = append(tracked, focus)
	}
	if d.YearIndex(b.Year) < 0 {
		p := b.PosOf("year")
		probs.Addf(b.File, p.Line, p.Column, "year %d has no values in the data (years present: %s); choose one of them", b.Year, yearList(d.Years))
	}
	inSpan := 0
	for _, y := range d.Years {
		if y >= b.Years.First && y <= b.Years.Last {
			inSpan++
		}
	}
	if inSpan == 0 && b.Years.First != 0 {
		p := b.PosOf("years")
		probs.Addf(b.File, p.Line, p.Column, "years [%d, %d] contain no year of the data (years present: %s)", b.Years.First, b.Years.Last, yearList(d.Years))
	}
	seen := map[int]bool{focus: true}
	track := func(id string, p brief.Pos, what string) {
		i := d.Register.Index(id)
		if i < 0 {
			msg := fmt.Sprintf("%s %q is not in the register %s", what, id, d.Register.File)
			if s := r.nearestID(id); s != "" {
				msg += fmt.Sprintf("; did you mean %q?", s)
			}
			probs.Addf(b.File, p.Line, p.Column, "%s", msg)
			return
		}
		if !seen[i] {
			seen[i] = true
			tracked = append(tracked, i)
		}
	}
	for _, id := range b.Named {
		track(id, b.PosOf("named"), "named institution")
	}
	for _, blk := range b.Blocks {
		if c, ok := blk.(*brief.ChartBlock); ok {
			for _, id := range c.Label {
				track(id, c.Position(), "chart label")
			}
		}
	}
	return focus, tracked
}

func yearList(ys []int) string {
	if len(ys) == 0 {
		return "none"
	}
	if len(ys) > 3 {
		return fmt.Sprintf("%d to %d", ys[0], ys[len(ys)-1])
	}
	s := ""
	for i, y := range ys {
		if i > 0 {
			s += ", "
		}
		s += fmt.Sprint(y)
	}
	return s
}

// checkBlocks checks every chart, table and commentary block against the
// dictionary, the resolved groups and the span, at the block's line.
func checkBlocks(d *dataset.Dataset, b *brief.Brief, groups []*Group, emptied map[string]string, probs *diag.List) {
	names := map[string]bool{}
	var list []string
	for _, g := range groups {
		if !names[g.Name] {
			names[g.Name] = true
			list = append(list, g.Name)
		}
		if !names[g.Spec] {
			names[g.Spec] = true
			list = append(list, g.Spec)
		}
	}
	// Groups the brief defines but that resolved to nothing are not "unknown".
	for _, s := range b.Groups {
		if s.Name != "" {
			names[s.Name] = true
		}
	}
	sort.Strings(list)
	for _, blk := range b.Blocks {
		var inds, grps []string
		year := 0
		var span *brief.Span
		switch v := blk.(type) {
		case *brief.ChartBlock:
			inds, grps, year = v.Indicators, v.Groups, v.Year
		case *brief.TableBlock:
			inds, grps, year = v.Indicators, v.Groups, v.Year
		case *brief.CommentaryBlock:
			inds, grps, span = v.Indicators, v.Groups, v.Years
		case *brief.AppendixBlock:
			inds, grps = v.Indicators, v.Groups
		default:
			continue
		}
		p := blk.Position()
		what := blk.Kind() + " block"
		for _, key := range inds {
			if d.Dictionary.Index(key) < 0 {
				probs.Addf(b.File, p.Line, p.Column, "%s", unknownIndicator(d, what, key))
			}
		}
		for _, g := range grps {
			if names[g] {
				continue
			}
			if why, ok := emptied[g]; ok {
				probs.Addf(b.File, p.Line, p.Column, "%s: group %q has no members: %s", what, g, why)
				continue
			}
			msg := fmt.Sprintf("%s: group %q is not defined under groups: in the front matter", what, g)
			if s := nearestName(g, list); s != "" {
				msg += fmt.Sprintf("; did you mean %q?", s)
			}
			if len(list) > 0 {
				msg += fmt.Sprintf(" (groups are %s)", quotedSome(list, 10))
			}
			probs.Addf(b.File, p.Line, p.Column, "%s", msg)
		}
		if year != 0 && (year < b.Years.First || year > b.Years.Last || d.YearIndex(year) < 0) {
			probs.Addf(b.File, p.Line, p.Column, "%s: year %d is outside the span years [%d, %d] or has no data; figures are computed for the span only", what, year, b.Years.First, b.Years.Last)
		}
		if span != nil && (span.First < b.Years.First || span.Last > b.Years.Last) {
			probs.Addf(b.File, p.Line, p.Column, "%s: years [%d, %d] reach outside the brief's years [%d, %d]; widen years: in the front matter or narrow the block", what, span.First, span.Last, b.Years.First, b.Years.Last)
		}
	}
}
