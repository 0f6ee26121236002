package pdf

import (
	"strings"
	"unicode/utf8"
)

// replacement stands in for characters the PDF fonts cannot carry.
const replacement = '\uFFFD'

// Printable returns s with every character outside Unicode's Basic
// Multilingual Plane (U+10000 and above: emoji, historic scripts) replaced
// by U+FFFD. fpdf's TrueType code maps characters through a 65,536-entry
// table, so such a character would otherwise crash the build; and the
// Liberation fonts have no glyphs there anyway. Invalid UTF-8 is replaced
// too.
func Printable(s string) string {
	clean := true
	for _, r := range s {
		if r > 0xFFFF || r == utf8.RuneError {
			clean = false
			break
		}
	}
	if clean {
		return s
	}
	var b strings.Builder
	b.Grow(len(s))
	for _, r := range s {
		if r > 0xFFFF || r == utf8.RuneError {
			r = replacement
		}
		b.WriteRune(r)
	}
	return b.String()
}
