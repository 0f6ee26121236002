package charts

import (
	"strings"

	"peerpack/internal/figures"
)

// Charts that show every member (bars, heatmap) place them with
// figures.MemberPlaces: the one definition of rank and percentile the
// tables and the stored positions use, so a rank printed on a chart is the
// rank in the tables.

// placeOf finds an institution's placement among placements.
func placeOf(ps []figures.MemberPlace, inst int) (figures.MemberPlace, bool) {
	for _, p := range ps {
		if p.Institution == inst {
			return p, true
		}
	}
	return figures.MemberPlace{}, false
}

// joinAnd lists names as "A", "A and B", "A, B and C".
func joinAnd(xs []string) string {
	if len(xs) < 2 {
		return strings.Join(xs, "")
	}
	return strings.Join(xs[:len(xs)-1], ", ") + " and " + xs[len(xs)-1]
}
