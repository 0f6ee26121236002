package figures

import (
	"strconv"
	"strings"

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

// runningLabel is an indicator's label as a definition reads it (the
// pack prints definitions to readers, who know labels, not keys).
func runningLabel(ind dataset.Indicator) string { return ind.RunningLabel() }

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
