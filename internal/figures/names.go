package figures

import (
	"fmt"
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

// quotedSome is quoted for the first max names of a long list, then how
// many more: an each group over a register of 120 countries names 120
// groups, which no message should list whole.
func quotedSome(list []string, max int) string {
	if len(list) <= max+2 {
		return quoted(list)
	}
	return quoted(list[:max]) + fmt.Sprintf(" and %d more", len(list)-max)
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
