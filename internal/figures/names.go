package figures

import (
	"strconv"
	"strings"

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
