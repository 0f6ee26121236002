package build

import (
	"fmt"
	"strings"

	"peerpack/internal/diag"
	"peerpack/internal/figures"
	"peerpack/internal/pdf"
)

// maxNameProblems caps the names listed; the rest are counted.
const maxNameProblems = 10

// checkNames refuses institution names the pack cannot set (pdf.Uncovered:
// characters the embedded fonts lack, or scripts written right to left or
// shaped), for every institution the pack may name: the focus, the named
// institutions and every group member. Printed as they are, they would be
// empty boxes or reversed letters with no warning.
func checkNames(m *figures.Model) error {
	reg := m.Data.Register
	seen := map[int]bool{}
	var order []int
	add := func(i int) {
		if i >= 0 && !seen[i] {
			seen[i] = true
			order = append(order, i)
		}
	}
	add(m.Focus)
	for _, i := range m.Named {
		add(i)
	}
	for _, g := range m.Groups {
		for _, i := range g.Members {
			add(i)
		}
	}
	var l diag.List
	bad := 0
	for _, i := range order {
		in := reg.Institutions[i]
		for _, field := range []string{"name", "short_name"} {
			text, _ := in.Attr(field)
			miss := pdf.Uncovered(text)
			if len(miss) == 0 {
				continue
			}
			bad++
			if bad > maxNameProblems {
				continue
			}
			shown := make([]string, 0, 4)
			for k, r := range miss {
				if k == 4 {
					shown = append(shown, "…")
					break
				}
				shown = append(shown, fmt.Sprintf("%c (U+%04X)", r, r))
			}
			l.Addf(reg.File, in.Line, 0, "the %s of %s, %q, has characters the pack cannot set: %s; its fonts cover Latin, Greek and Cyrillic letters, not Chinese, Japanese or Korean, and right-to-left or joined scripts (Arabic, Hebrew, Devanagari, Thai, ...) would print wrongly; write the %s in Latin letters (a transliteration) and keep the original in a column of its own", strings.ReplaceAll(field, "_", " "), in.ID, text, strings.Join(shown, ", "), field)
		}
	}
	if bad > maxNameProblems {
		l.Addf(reg.File, 0, 0, "and %d more names the pack cannot set", bad-maxNameProblems)
	}
	return l.Err()
}
