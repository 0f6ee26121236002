package layout

import (
	"fmt"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/pdf"
	"peerpack/internal/yamlx"
)

// appendix lays out an appendix block: a methodology annex or a data
// annex written from the brief and the figures model alone, so that it
// always describes the pack it is printed in and never goes stale.
func (w *writer) appendix(ab *brief.AppendixBlock) {
	sc, ok := w.appendixScope(ab)
	if !ok {
		return
	}
	// An annex is set in one column, below anything set in columns.
	w.setColumns(1)
	switch ab.Type {
	case "data":
		w.dataAppendix(sc)
	default:
		w.methodologyAppendix(sc)
	}
}

// appendixScope is what an appendix block covers: its indicators in
// dictionary order and its groups in brief order.
type appendixScope struct {
	block      *brief.AppendixBlock
	indicators []dataset.Indicator
	groups     []*figures.Group
}

// appendixScope resolves a block's indicators (default: every indicator
// the pack shows, as the closing's coverage table counts them, or the
// whole dictionary when the pack shows none) and groups
// (default: every group of the brief). The figures stage checks the names
// first; layout checks again so that a model built without that check
// still gets a positioned message rather than an empty annex.
func (w *writer) appendixScope(ab *brief.AppendixBlock) (appendixScope, bool) {
	sc := appendixScope{block: ab}
	dict := w.m.Data.Dictionary
	if len(ab.Indicators) > 0 {
		want := map[string]bool{}
		for _, k := range ab.Indicators {
			if _, ok := dict.Lookup(k); !ok {
				msg := fmt.Sprintf("appendix names indicator %q, which the dictionary does not define", k)
				if s := yamlx.Nearest(k, dict.Keys()); s != "" {
					msg += fmt.Sprintf("; did you mean %q?", s)
				}
				w.failAt(ab.At, "%s", msg)
				return sc, false
			}
			want[k] = true
		}
		sc.indicators = inDictionaryOrder(dict, want)
	} else {
		sc.indicators = inDictionaryOrder(dict, w.packIndicators())
	}
	if len(sc.indicators) == 0 {
		// A pack that shows no indicator elsewhere: the annex covers the
		// whole dictionary rather than nothing.
		sc.indicators = dict.Indicators
	}
	if len(ab.Groups) == 0 {
		sc.groups = w.m.Groups
		return sc, true
	}
	seen := map[*figures.Group]bool{}
	for _, name := range ab.Groups {
		gs := w.m.GroupsOf(name)
		if len(gs) == 0 {
			names := make([]string, len(w.m.Groups))
			for i, g := range w.m.Groups {
				names[i] = g.Name
			}
			msg := fmt.Sprintf("appendix names group %q, which the brief does not define", name)
			if s := yamlx.Nearest(name, names); s != "" {
				msg += fmt.Sprintf("; did you mean %q?", s)
			}
			w.failAt(ab.At, "%s", msg)
			return sc, false
		}
		for _, g := range gs {
			if !seen[g] {
				seen[g] = true
				sc.groups = append(sc.groups, g)
			}
		}
	}
	return sc, true
}

// inDictionaryOrder lists the indicators whose keys are in the set, in
// the dictionary's order, so that every annex reads in the same order.
func inDictionaryOrder(dict *dataset.Dictionary, keys map[string]bool) []dataset.Indicator {
	var out []dataset.Indicator
	for _, ind := range dict.Indicators {
		if keys[ind.Key] {
			out = append(out, ind)
		}
	}
	return out
}

// annexHeading sets one part of an annex as a level-2 heading (in the
// contents and the outline), keeping room below it for what follows: the
// start of a table, or three lines of text.
func (w *writer) annexHeading(title string, keep float64) {
	w.keep = keep
	w.sectionHeading(title, 2)
	w.keep = 0
}

// runIn sets a paragraph with a bold run-in lead ("Field-normalised citation
// impact.") followed by plain text, at the given size.
func (w *writer) runIn(lead, text string, size float64) {
	var sp []span
	if lead != "" {
		sp = append(sp, span{text: lead + " ", font: w.st.font(pdf.Bold, size), color: w.st.text})
	}
	sp = append(sp, span{text: text, font: w.st.font(pdf.Regular, size), color: w.st.text})
	w.para(sp, 0, nil, size, paraGap-0.6)
}
