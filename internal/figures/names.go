package figures

import (
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"

	"peerpack/internal/dataset"

	"peerpack/internal/yamlx"
)

func nearestName(s string, names []string) string { return yamlx.Nearest(s, names) }

func quoted(list []string) string {
	q := make([]string, len(list))
	for i, s := range list {
		q[i] = strconv.Quote(s)
	}
	return strings.Join(q, ", ")
}

// runningLabel is an indicator's label as running text of a group's
// definition reads it: the first letter lowered unless the first word is an
// abbreviation ("FWCI", "PhD share") or the capital is joined to what
// follows ("A-level"), the key when there is no label. The pack prints
// definitions to readers, who know labels, not keys.
func runningLabel(ind dataset.Indicator) string {
	s := ind.Label
	if s == "" {
		return ind.Key
	}
	r, n := utf8.DecodeRuneInString(s)
	if !unicode.IsUpper(r) {
		return s
	}
	word := s[n:]
	if r2, _ := utf8.DecodeRuneInString(word); word != "" && !unicode.IsLower(r2) {
		return s
	}
	if i := strings.IndexFunc(word, unicode.IsSpace); i >= 0 {
		word = word[:i]
	}
	if strings.IndexFunc(word, unicode.IsUpper) >= 0 {
		return s
	}
	return string(unicode.ToLower(r)) + s[n:]
}

// listText joins items as running text: "a, b and c".
func listText(items []string) string {
	switch len(items) {
	case 0:
		return ""
	case 1:
		return items[0]
	}
	return strings.Join(items[:len(items)-1], ", ") + " and " + items[len(items)-1]
}
