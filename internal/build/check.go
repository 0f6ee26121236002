package build

import (
	"bufio"
	"fmt"
	"io"
	"math"
	"strings"
	"time"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
	"peerpack/internal/layout"
)

// CheckBuild proves that loaded inputs would build by building the pack
// in memory (commentary and layout; nothing is written), and meanwhile
// completes the report's data summary (coverage, suspicious values): both
// only read the dataset, so on two processors the summary costs no wall
// time. The error is the pack's problem, or else the summary's.
func CheckBuild(in *Inputs, version string) error {
	done := make(chan error, 1)
	go func() { done <- in.Report.Summarise() }()
	_, err := pack(in, time.Unix(0, 0).UTC(), version, nil, true)
	if serr := <-done; err == nil {
		err = serr
	}
	return err
}

// WriteCheckReport prints what `peerpack check` shows for loaded inputs:
// the dataset summary, then each comparison group's size and coverage in
// the brief's year, read from the figures model.
func WriteCheckReport(out io.Writer, in *Inputs) {
	// Tens of thousands of small writes (a coverage row per group,
	// indicator and year): one system call each on a terminal or pipe
	// without the buffer.
	w := bufio.NewWriterSize(out, 64<<10)
	defer w.Flush()
	m := in.Figures
	in.Report.Groups = groupCoverage(in.Brief, m)
	in.Report.Write(w)
	fmt.Fprintf(w, "\nComparison groups in %d (focus %s):\n", m.Year, m.FocusID)
	for _, g := range m.Groups {
		focus := "focus not a member"
		if g.FocusIn {
			focus = "focus is a member"
		}
		fmt.Fprintf(w, "  %s: %d %s, %s; %s\n", g.Name, len(g.Members), format.Plural(len(g.Members), "member", "members"), g.Defined, focus)
		var low []string
		for _, ind := range m.Data.Dictionary.Indicators {
			d, ok := m.Distribution(g.Name, ind.Key, m.Year)
			if !ok || len(g.Members) == 0 {
				continue
			}
			cov := 100 * float64(d.N) / float64(len(g.Members))
			if cov < 70 || math.IsNaN(cov) {
				low = append(low, fmt.Sprintf("%s %s", ind.Key, format.Percent(cov, 0)))
			}
		}
		if len(low) > 0 {
			fmt.Fprintf(w, "    coverage under 70%% in %d (the commentary cautions on these): %s\n", m.Year, strings.Join(low, ", "))
		}
		if len(g.Members) < 10 {
			fmt.Fprintf(w, "    small group: fewer than 10 members, so quartiles and ranks are fragile (common practice, no source)\n")
		}
	}
	if html := layout.IgnoredHTML(in.Brief); len(html) > 0 {
		fmt.Fprintf(w, "\nRaw HTML in the brief is never passed through to the pack; ignored at:")
		for _, p := range html {
			fmt.Fprintf(w, " %d:%d", p.Line, p.Column)
		}
		fmt.Fprintln(w)
	}
	if ws := layout.CaptionWarnings(in.Brief, m); len(ws) > 0 {
		fmt.Fprintf(w, "\nCaptions that state a count the figures do not show:\n")
		for _, s := range ws {
			fmt.Fprintf(w, "  %s\n", s)
		}
	}
	fmt.Fprintf(w, "\nThe brief would build.\n")
}

// groupCoverage is each group's share of members with a value, per
// indicator the brief's blocks use (every indicator when they name none)
// and year of the span, read from the model's distributions.
func groupCoverage(b *brief.Brief, m *figures.Model) []dataset.GroupCoverage {
	used := map[string]bool{}
	for _, blk := range b.Blocks {
		var inds []string
		switch v := blk.(type) {
		case *brief.ChartBlock:
			inds = v.Indicators
		case *brief.TableBlock:
			inds = v.Indicators
		case *brief.CommentaryBlock:
			inds = v.Indicators
		case *brief.AppendixBlock:
			inds = v.Indicators
		}
		for _, k := range inds {
			used[k] = true
		}
	}
	var out []dataset.GroupCoverage
	for _, g := range m.Groups {
		gc := dataset.GroupCoverage{Name: g.Name, Members: len(g.Members), Years: m.Years}
		for _, ind := range m.Data.Dictionary.Indicators {
			if len(used) > 0 && !used[ind.Key] {
				continue
			}
			row := make([]float64, len(m.Years))
			for j, y := range m.Years {
				row[j] = math.NaN()
				// Members of that year: the population rules may be
				// applied as of each year.
				if d, ok := m.Distribution(g.Name, ind.Key, y); ok && d.N+d.Missing > 0 {
					row[j] = float64(d.N) / float64(d.N+d.Missing)
				}
			}
			gc.Indicators = append(gc.Indicators, ind.Key)
			gc.Coverage = append(gc.Coverage, row)
		}
		out = append(out, gc)
	}
	return out
}
