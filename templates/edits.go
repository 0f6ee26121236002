package templates

import (
	"strings"
)

// EditNote is one "edit:" comment of a brief: where it is and what it asks.
type EditNote struct {
	Line int // 1-based line of the comment's first line
	Text string
}

// EditNotes lists the "edit:" comments left in a brief, so that `peerpack
// check` can remind the user of what a template still asks them to change.
// In the front matter a note is a "# edit: ..." YAML comment and runs on
// over the comment lines that follow it; in the body it is an HTML comment
// "<!-- edit: ... -->", which may span lines. Text is the note with its
// lines joined by single spaces.
func EditNotes(src []byte) []EditNote {
	lines := strings.Split(strings.ReplaceAll(string(src), "\r\n", "\n"), "\n")
	var out []EditNote
	inFront := len(lines) > 0 && strings.TrimSpace(lines[0]) == "---"
	for i := 0; i < len(lines); i++ {
		l := strings.TrimSpace(lines[i])
		if inFront && i > 0 && l == "---" {
			inFront = false
			continue
		}
		if inFront {
			rest, ok := strings.CutPrefix(l, "# "+EditMarker)
			if !ok {
				continue
			}
			note := EditNote{Line: i + 1, Text: strings.TrimSpace(rest)}
			for i+1 < len(lines) {
				next := strings.TrimSpace(lines[i+1])
				more, ok := strings.CutPrefix(next, "#")
				if !ok || strings.HasPrefix(strings.TrimSpace(more), EditMarker) {
					break
				}
				note.Text += " " + strings.TrimSpace(more)
				i++
			}
			out = append(out, note)
			continue
		}
		rest, ok := strings.CutPrefix(l, "<!-- "+EditMarker)
		if !ok {
			continue
		}
		note := EditNote{Line: i + 1}
		var parts []string
		for {
			if before, _, done := strings.Cut(rest, "-->"); done {
				parts = append(parts, strings.TrimSpace(before))
				break
			}
			parts = append(parts, strings.TrimSpace(rest))
			if i+1 >= len(lines) {
				break
			}
			i++
			rest = lines[i]
		}
		note.Text = strings.Join(nonEmpty(parts), " ")
		out = append(out, note)
	}
	return out
}

func nonEmpty(xs []string) []string {
	out := xs[:0]
	for _, x := range xs {
		if x != "" {
			out = append(out, x)
		}
	}
	return out
}
