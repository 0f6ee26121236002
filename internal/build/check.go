package build

import (
	"fmt"
	"io"
	"math"
	"strings"

	"peerpack/internal/format"
	"peerpack/internal/layout"
)

// WriteCheckReport prints what `peerpack check` shows for loaded inputs:
// the dataset summary, then each comparison group's size and coverage in
// the brief's year, read from the figures model.
func WriteCheckReport(w io.Writer, in *Inputs) {
	in.Report.Write(w)
	m := in.Figures
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
			fmt.Fprintf(w, "    coverage under 70%%: %s\n", strings.Join(low, ", "))
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
	fmt.Fprintf(w, "\nThe brief would build.\n")
}
