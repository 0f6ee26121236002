package charts

import (
	"strings"
	"unicode/utf8"

	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"

	"peerpack/internal/dataset"
)

// shortNameAttr is the register column that holds an institution's short
// name, used when the full name does not fit.
const shortNameAttr = "short_name"

// fitName returns the institution's name when it fits in width, else its
// register short name, else the longer of the two shortened with an
// ellipsis at a character (never a byte) boundary.
func fitName(in dataset.Institution, sty text.Style, width vg.Length) string {
	if sty.Width(in.Name) <= width {
		return in.Name
	}
	if s, ok := in.Attr(shortNameAttr); ok && strings.TrimSpace(s) != "" {
		return fitText(strings.TrimSpace(s), sty, width)
	}
	return fitText(in.Name, sty, width)
}

// fitText shortens s with a trailing ellipsis until it fits in width.
func fitText(s string, sty text.Style, width vg.Length) string {
	if sty.Width(s) <= width {
		return s
	}
	r := []rune(s)
	// Binary search the longest prefix that fits with the ellipsis.
	lo, hi := 0, len(r)
	for lo < hi {
		mid := (lo + hi + 1) / 2
		if sty.Width(strings.TrimRight(string(r[:mid]), " ,")+"…") <= width {
			lo = mid
		} else {
			hi = mid - 1
		}
	}
	if lo == 0 {
		return "…"
	}
	out := strings.TrimRight(string(r[:lo]), " ,") + "…"
	if !utf8.ValidString(out) {
		return "…"
	}
	return out
}
