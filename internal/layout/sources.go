package layout

import (
	"slices"
	"strconv"
	"strings"

	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
)

// sources sets the appendix the brief's `sources: true` asks for: an
// evidence table a client can read, each statement of the commentary once
// with the figures it rests on in words and values ("Papers per academic,
// Lusmaran system, 2025: 95th percentile"). The figures file keys stay the
// machine route to the same numbers; the table names the file's columns
// once, in its note, instead of printing keys.
func (w *writer) sources() {
	if !w.b.Sources || w.com == nil || len(w.com.Sentences) == 0 {
		return
	}
	w.cols = 1
	w.sectionHeading("Sources of the commentary", 1)
	w.plain("Each statement of the commentary appears once below, with the figures it rests on as they are printed in this pack. A statement repeated in the summary and in a section is listed at its first appearance.")
	g := grid{
		head:     []string{"No.", "Statement", "Rests on"},
		align:    []byte{'R', 'L', 'L'},
		caption:  "Statements of the commentary and their evidence",
		maxLines: 40,
	}
	seen := map[string]bool{}
	n := 0
	for _, s := range w.com.Sentences {
		text := strings.TrimSpace(s.Text)
		if text == "" || seen[text] {
			continue
		}
		seen[text] = true
		n++
		// Figures of one subject (indicator, group, institution, year)
		// are read together: "Papers per academic, Lusmaran system,
		// 2025: top quarter, 95th percentile".
		var subjects []string
		vals := map[string][]string{}
		for _, c := range s.Cites {
			subj, val := w.evidence(c)
			if val == "" || slices.Contains(vals[subj], val) {
				continue
			}
			if _, ok := vals[subj]; !ok {
				subjects = append(subjects, subj)
			}
			vals[subj] = append(vals[subj], val)
		}
		ev := make([]string, len(subjects))
		for i, subj := range subjects {
			vals[subj] = rankOfOnce(vals[subj])
			ev[i] = strings.Join(vals[subj], ", ")
			if subj != "" {
				ev[i] = subj + ": " + ev[i]
			}
		}
		rests := strings.Join(ev, "; ")
		if rests == "" {
			rests = "the brief's settings and the dictionary (no figure)"
		}
		g.rows = append(g.rows, []cell{{text: strconv.Itoa(n)}, {text: text}, {text: rests}})
	}
	g.notes = append(g.notes, "Every figure named here is a row of the figures file (peerpack build --figures), under the section, group, indicator, institution, year and measure given in words above.")
	w.setTable(g)
}

// rankOfOnce drops a subject's "rank 4th" and "among 8" where its
// values also read "rank 4th of 8" (a percentile below the small-group
// floor, printed as the rank it stands for).
func rankOfOnce(vals []string) []string {
	drop := map[string]bool{}
	for _, v := range vals {
		if r, of, ok := strings.Cut(v, " of "); ok && strings.HasPrefix(v, "rank ") {
			drop[r], drop["among "+of] = true, true
		}
	}
	if len(drop) == 0 {
		return vals
	}
	return slices.DeleteFunc(vals, func(v string) bool { return drop[v] })
}

// rankBelowFloor reports, for a cited position figure of a group below
// the small-group floor, the rank and group size stored beside it.
func (w *writer) rankBelowFloor(k figures.Key) (rank, of int, ok bool) {
	if k.Section != figures.SectionPosition {
		return 0, 0, false
	}
	d, okd := w.m.Distribution(k.Group, k.Indicator, k.Year)
	if !okd || !w.m.BelowFloor(d) {
		return 0, 0, false
	}
	kr, ko := k, k
	kr.Measure, ko.Measure = "rank", "of"
	r, okr := w.m.Lookup(kr)
	o, oko := w.m.Lookup(ko)
	if !okr || !oko || r.IsText || o.IsText || r.Value < 1 {
		return 0, 0, false
	}
	return int(r.Value), int(o.Value), true
}

// evidence prints one cited figure in words: what it is of, and its
// value as the pack prints it.
func (w *writer) evidence(k figures.Key) (subject, value string) {
	row, ok := w.m.Lookup(k)
	if !ok {
		return "", ""
	}
	var ind dataset.Indicator
	hasInd := false
	if k.Indicator != "" {
		if i, ok := w.m.Data.Dictionary.Lookup(k.Indicator); ok {
			ind, hasInd = i, true
		}
	}
	var parts []string
	if hasInd {
		parts = append(parts, format.Capitalise(ind.RunningLabel()))
	}
	if k.Group != "" {
		parts = append(parts, k.Group)
	}
	if k.Institution != "" && k.Institution != w.m.FocusID {
		parts = append(parts, w.institutionName(k.Institution))
	}
	if k.Year != 0 {
		parts = append(parts, strconv.Itoa(k.Year))
	}
	subject = strings.Join(parts, ", ")
	if row.IsText {
		return subject, row.Text
	}
	v := row.Value
	val := ""
	printed := func(x float64) string {
		if hasInd {
			return format.Value(ind, x)
		}
		return format.Number(x, 2)
	}
	switch k.Measure {
	case "value", "start_value", "end_value", "median", "median_start", "median_end", "q1", "q3", "mean", "min", "max":
		val = measureWords[k.Measure] + printed(v)
	case "gap_better_quartile", "gap_median", "vs_median", "vs_better_quartile", "change", "median_change", "iqr", "sd":
		if hasInd {
			val = measureWords[k.Measure] + format.Difference(ind, v)
		} else {
			val = measureWords[k.Measure] + format.Number(v, 2)
		}
	case "percentile":
		val = format.Percentile(v)
		if r, of, ok := w.rankBelowFloor(k); ok {
			// Below the small-group floor the pack reads the group by
			// rank "of n" only, and so does its evidence.
			val = "rank " + format.Rank(r, w.b.RankBands) + " of " + format.Int(of)
		}
	case "quartile":
		val = quarterShort(int(v)) + " quarter"
		if _, _, ok := w.rankBelowFloor(k); ok {
			return subject, "" // no quarter below the small-group floor
		}
	case "rank":
		val = "rank " + format.Rank(int(v), w.b.RankBands)
	case figures.MeasureTargetRank, "panel_start_rank", "panel_end_rank":
		val = measureWords[k.Measure] + format.Ordinal(int(v))
	case figures.MeasureTargetRankValue:
		val = measureWords[k.Measure] + printed(v)
	case figures.MeasureTargetRankGap, "largest_step":
		if hasInd {
			val = measureWords[k.Measure] + format.Difference(ind, v)
		} else {
			val = measureWords[k.Measure] + format.Number(v, 2)
		}
	case "panel_of", "largest_step_year":
		val = measureWords[k.Measure] + strconv.Itoa(int(v))
	case "n", "n_members", "of", "start_n", "end_n", "start_of", "end_of", "missing", "ties":
		val = measureWords[k.Measure] + format.Int(int(v))
	case "start_year", "end_year", "median_start_year", "median_end_year":
		val = measureWords[k.Measure] + strconv.Itoa(int(v))
	case "change_pct", "median_change_pct", "cagr":
		val = measureWords[k.Measure] + format.SignedPercent(v)
	default:
		val = strings.ReplaceAll(k.Measure, "_", " ") + " " + format.Number(v, 2)
	}
	return subject, strings.TrimSpace(val)
}

// measureWords lead a printed value with what it is, where the value
// alone would not say.
var measureWords = map[string]string{
	"value": "value ", "start_value": "first value ", "end_value": "last value ",
	"median": "median ", "median_start": "median at the start ", "median_end": "median at the end ",
	"q1": "lower quartile ", "q3": "upper quartile ", "mean": "mean ", "min": "lowest ", "max": "highest ",
	"gap_better_quartile": "distance to the better quartile ", "gap_median": "distance to the median ",
	"vs_median": "difference from the median ", "vs_better_quartile": "difference from the better quartile ",
	"change": "change ", "median_change": "change in the median ", "iqr": "interquartile range ", "sd": "standard deviation ",
	"n": "n = ", "n_members": "members: ", "of": "among ", "start_n": "reporting at the start: ", "end_n": "reporting at the end: ",
	"start_of": "ranked at the start: ", "end_of": "ranked at the end: ", "missing": "without a value: ", "ties": "sharing the value: ",
	"start_year": "from ", "end_year": "to ", "median_start_year": "median from ", "median_end_year": "median to ",
	"change_pct": "change ", "median_change_pct": "change in the median ", "cagr": "yearly growth ",
	"target_rank": "rank to reach ", "target_rank_value": "value at that rank ", "target_rank_gap": "still to gain ",
	"panel_start_rank": "rank at the start among those reporting in both years ", "panel_end_rank": "rank at the end among those reporting in both years ",
	"panel_of": "reporting in both years: ", "largest_step": "largest one-year step ", "largest_step_year": "largest step in ",
}

// institutionName names a register id as the pack prints it.
func (w *writer) institutionName(id string) string {
	reg := w.m.Data.Register
	if i := reg.Index(id); i >= 0 {
		return reg.Institutions[i].Name
	}
	return id
}
